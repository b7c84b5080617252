import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link, useLocation, useParams } from 'react-router';
import type { Address, CustomerDetail } from '../../contracts/customers';
import { ORDER_DONE_STATUSES, ORDER_STATUS_LABELS, type OrderStatus } from '../../contracts/orders';
import { Alert } from '../../components/Alert';
import { buttonClass } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { errorMessage, isApiError } from '../../lib/api';
import { formatDateTime, formatDay, plural } from '../../lib/format';
import { useHasRole } from '../../lib/session';
import { LateBadge, OrderStatusText } from '../orders';
import { customerQuery } from './api';

type OrderRow = CustomerDetail['orders'][number];
const col = createColumnHelper<OrderRow>();

export function AddressBlock({ address, empty }: { address: Address | null; empty: string }) {
  const parts = address ? [address.line1, address.line2, [address.postalCode, address.city].filter(Boolean).join(' '), address.region, address.country].filter(Boolean) : [];
  if (!parts.length) return <p className="text-graphite-500">{empty}</p>;
  return (
    <address className="not-italic leading-snug text-graphite-900">
      {parts.map((p) => (
        <span key={p} className="block">
          {p}
        </span>
      ))}
    </address>
  );
}

function Notice({ on, children }: { on: boolean; children: string }) {
  return on ? (
    <span className="inline-flex items-center gap-1 rounded border border-copper-300 bg-copper-50 px-1.5 text-xs font-semibold text-copper-800">
      <svg viewBox="0 0 12 12" className="size-3" aria-hidden>
        <path d="M2.5 6.2 5 8.5l4.5-5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
      {children}
    </span>
  ) : null;
}

export function CustomerPage() {
  const id = Number(useParams().id);
  const customer = useQuery({ ...customerQuery(id), enabled: Number.isInteger(id) && id > 0 });
  const canWrite = useHasRole('office', 'admin');
  const saved = (useLocation().state as { saved?: string } | null)?.saved;

  const columns = useMemo(
    () => [
      col.accessor('number', {
        header: 'Order',
        cell: (c) => (
          <Link to={`/orders/${c.row.original.id}`} className="font-semibold text-copper-700 underline-offset-2 hover:underline">
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor('purchaseOrder', { header: 'Purchase order' }),
      col.accessor((o) => ORDER_STATUS_LABELS[o.status as OrderStatus] ?? o.status, {
        id: 'status',
        header: 'Status',
        meta: { filter: 'select' },
        cell: (c) => <OrderStatusText status={c.row.original.status} />,
      }),
      col.accessor('orderDate', { header: 'Ordered', cell: (c) => <span className="whitespace-nowrap">{formatDay(c.getValue())}</span> }),
      col.accessor('dueDate', {
        header: 'Ship by',
        cell: (c) => (
          <span className="inline-flex items-center gap-2 whitespace-nowrap">
            {formatDay(c.getValue())}
            {c.row.original.late && <LateBadge />}
          </span>
        ),
      }),
    ],
    [],
  );

  if (customer.isPending) return <Loading what="Loading the customer" />;
  if (customer.isError) {
    return (
      <Alert kind="fault" title={isApiError(customer.error) && customer.error.status === 404 ? 'No such customer' : 'Could not load the customer'}>
        {errorMessage(customer.error)} <Link to="/customers" className="underline">Back to the customers</Link>
      </Alert>
    );
  }
  const c = customer.data;
  const open = c.orders.filter((o) => !ORDER_DONE_STATUSES.includes(o.status as OrderStatus)).length;
  const late = c.orders.filter((o) => o.late).length;

  return (
    <div className="flex flex-col gap-4">
      <nav aria-label="Breadcrumb" className="text-sm text-graphite-600">
        <Link to="/customers" className="underline-offset-2 hover:underline">
          Customers
        </Link>{' '}
        / {c.name}
      </nav>
      <PageHeader
        title={c.name}
        lead={`${plural(c.orders.length, 'order')}, ${open} open${late ? `, ${late} late` : ''}. Customer since ${formatDay(c.createdAt.slice(0, 10))}.`}
        actions={
          canWrite && (
            <>
              <Link to={`/customers/${c.id}/edit`} className={buttonClass('secondary')}>
                Edit customer
              </Link>
              <Link to={`/orders/new?customer=${c.id}`} className={buttonClass('primary')}>
                New order
              </Link>
            </>
          )
        }
      />
      {saved && <Alert kind="good" title={saved} />}

      <div className="grid gap-4 lg:grid-cols-[1fr_1fr_1.4fr]">
        <Panel title="Billing address">
          <AddressBlock address={c.billingAddress} empty="No billing address yet." />
        </Panel>
        <Panel title="Shipping address">
          {c.shippingAddress ? <AddressBlock address={c.shippingAddress} empty="—" /> : <p className="text-graphite-600">Same as the billing address.</p>}
        </Panel>
        {c.notes !== undefined && (
          <Panel title="Internal notes">
            {c.notes ? <p className="whitespace-pre-line text-graphite-800">{c.notes}</p> : <p className="text-graphite-500">No notes.</p>}
            <p className="mt-2 text-xs text-graphite-500">Never shown to the customer. Last changed {formatDateTime(c.updatedAt)}.</p>
          </Panel>
        )}
      </div>

      <Panel title={`Contacts (${c.contacts.length})`}>
        {c.contacts.length === 0 ? (
          <p className="text-graphite-500">No contacts yet. Acknowledgements and shipment notices need a contact with an e-mail address.</p>
        ) : (
          <table className="w-full text-sm">
            <caption className="sr-only">Contacts</caption>
            <thead className="text-left text-graphite-600">
              <tr className="border-b border-graphite-200">
                <th className="py-1 pr-3 font-semibold">Name</th>
                <th className="py-1 pr-3 font-semibold">E-mail</th>
                <th className="py-1 pr-3 font-semibold">Phone</th>
                <th className="py-1 font-semibold">Receives</th>
              </tr>
            </thead>
            <tbody>
              {c.contacts.map((p) => (
                <tr key={p.id} className="border-b border-graphite-100 last:border-0">
                  <td className="py-1.5 pr-3 font-semibold text-graphite-900">{p.name}</td>
                  <td className="py-1.5 pr-3">{p.email ? <a href={`mailto:${p.email}`} className="text-copper-700 hover:underline">{p.email}</a> : <span className="text-graphite-400">—</span>}</td>
                  <td className="py-1.5 pr-3 whitespace-nowrap">{p.phone || <span className="text-graphite-400">—</span>}</td>
                  <td className="py-1.5">
                    <span className="flex flex-wrap gap-1">
                      <Notice on={p.notifyOrders}>Order notices</Notice>
                      <Notice on={p.notifyShipping}>Shipping notices</Notice>
                      {!p.notifyOrders && !p.notifyShipping && <span className="text-graphite-400">—</span>}
                    </span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Panel>

      <section aria-labelledby="customer-orders">
        <h2 id="customer-orders" className="mb-2 text-lg font-semibold text-graphite-900">
          Orders
        </h2>
        <DataTable
          data={c.orders}
          columns={columns}
          noun="order"
          csvName={`spoolwright-orders-${c.name.toLowerCase().replace(/[^a-z0-9]+/g, '-')}`}
          caption={`Orders of ${c.name}`}
          getRowId={(o) => String(o.id)}
          initialSorting={[{ id: 'dueDate', desc: true }]}
          empty="This customer has no orders yet."
        />
      </section>
    </div>
  );
}
