import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router';
import type { CustomerSummary } from '../../contracts/customers';
import { Alert } from '../../components/Alert';
import { buttonClass } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Loading, PageHeader } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { useHasRole } from '../../lib/session';
import { customersQuery } from './api';

const col = createColumnHelper<CustomerSummary>();

export function CustomersPage() {
  const customers = useQuery(customersQuery);
  const canWrite = useHasRole('office', 'admin');

  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Company',
        cell: (c) => (
          <Link to={`/customers/${c.row.original.id}`} className="font-semibold text-copper-700 underline-offset-2 hover:underline">
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor('city', { header: 'Town', cell: (c) => c.getValue() || <span className="text-graphite-400">—</span> }),
      col.accessor('country', { header: 'Country', meta: { filter: 'select' }, cell: (c) => c.getValue() || <span className="text-graphite-400">—</span> }),
      col.accessor('contactCount', { header: 'Contacts', meta: { align: 'right' } }),
      col.accessor('openOrderCount', {
        header: 'Open orders',
        meta: { align: 'right' },
        cell: (c) => <span className={c.getValue() > 0 ? 'font-semibold text-graphite-900' : 'text-graphite-500'}>{c.getValue()}</span>,
      }),
      col.accessor('orderCount', { header: 'All orders', meta: { align: 'right' } }),
    ],
    [],
  );

  return (
    <div>
      <PageHeader
        title="Customers"
        lead="The companies the shop builds for, with their contacts and orders."
        actions={
          canWrite && (
            <Link to="/customers/new" className={buttonClass('primary')}>
              New customer
            </Link>
          )
        }
      />
      {customers.isPending ? (
        <Loading what="Loading customers" />
      ) : customers.isError ? (
        <Alert kind="fault" title="Could not load the customers">
          {errorMessage(customers.error)}
        </Alert>
      ) : (
        <DataTable
          data={customers.data}
          columns={columns}
          noun="customer"
          csvName="spoolwright-customers"
          caption="Customers"
          getRowId={(c) => String(c.id)}
          initialSorting={[{ id: 'name', desc: false }]}
        />
      )}
    </div>
  );
}
