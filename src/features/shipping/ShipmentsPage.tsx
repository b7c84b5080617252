/**
 * Every shipment: ship dates narrowed on the server (the range stays in the address), customer and
 * text narrowed in the table; sort any column, export what is shown as CSV.
 */
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link, useSearchParams } from 'react-router';
import type { ShipmentSummary } from '../../contracts/shipments';
import { Alert } from '../../components/Alert';
import { Button, buttonClass } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Loading, PageHeader } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { addDaysIso, formatDay, pieces, todayIso } from '../../lib/format';
import { useCurrentUser } from '../../lib/session';
import { shipmentsQuery, type ShipmentListFilter } from './api';

const col = createColumnHelper<ShipmentSummary>();
const dateInput =
  'h-9 rounded-md border border-graphite-300 bg-white px-2 text-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200';
const isDate = (s: string | null) => (s && /^\d{4}-\d{2}-\d{2}$/.test(s) ? s : undefined);
const orderText = (s: ShipmentSummary) => s.orders.map((o) => `${o.number} (PO ${o.purchaseOrder})`).join(', ');

export function ShipmentsPage() {
  const user = useCurrentUser();
  const canShip = user.role === 'shipping' || user.role === 'admin';
  const [params, setParams] = useSearchParams();
  const filter: ShipmentListFilter = { from: isDate(params.get('from')), to: isDate(params.get('to')) };
  const badRange = Boolean(filter.from && filter.to && filter.to < filter.from);
  const shipments = useQuery({ ...shipmentsQuery(filter), enabled: !badRange });
  const today = todayIso();

  const set = (changes: Record<string, string | undefined>) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(changes)) {
      if (v) next.set(k, v);
      else next.delete(k);
    }
    setParams(next, { replace: true });
  };

  const columns = useMemo(
    () => [
      col.accessor('number', {
        header: 'Shipment',
        cell: (c) => (
          <Link to={`/shipments/${c.row.original.id}`} className="font-semibold whitespace-nowrap text-copper-700 underline-offset-2 hover:underline">
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor('shipDate', { header: 'Ship date', cell: (c) => <span className="whitespace-nowrap">{formatDay(c.getValue())}</span> }),
      col.accessor((s) => s.customer.name, { id: 'customer', header: 'Customer', meta: { filter: 'select' } }),
      col.accessor(orderText, { id: 'orders', header: 'Orders' }),
      col.accessor('carrier', { header: 'Carrier', meta: { filter: 'select' } }),
      col.accessor('service', { header: 'Service' }),
      col.accessor('trackingNumber', { header: 'Tracking number', cell: (c) => <span className="tabular">{c.getValue() || '—'}</span> }),
      col.accessor('units', {
        header: 'Units',
        meta: { align: 'right', label: 'Units (pcs)' },
        cell: (c) => <span className="whitespace-nowrap">{pieces(c.getValue())}</span>,
      }),
      col.accessor('packages', { header: 'Packages', meta: { align: 'right' } }),
    ],
    [],
  );

  return (
    <div>
      <PageHeader
        title="Shipments"
        lead="Everything that has left the shop, newest first. Open one for its packing list and certificate."
        actions={
          canShip && (
            <Link to="/shipping" className={buttonClass('primary')}>
              Ready to ship
            </Link>
          )
        }
      />
      <fieldset className="mb-3 flex flex-wrap items-end gap-x-3 gap-y-2 rounded-md border border-graphite-200 bg-white px-3 py-2">
        <legend className="px-1 text-sm font-semibold text-graphite-800">Ship date</legend>
        <label className="flex flex-col gap-1 text-sm font-semibold text-graphite-800">
          From
          <input type="date" className={dateInput} value={filter.from ?? ''} onChange={(e) => set({ from: e.target.value || undefined })} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-graphite-800">
          To
          <input type="date" className={dateInput} value={filter.to ?? ''} onChange={(e) => set({ to: e.target.value || undefined })} />
        </label>
        <div className="flex gap-1">
          <Button size="sm" className="h-9" onClick={() => set({ from: addDaysIso(today, -7), to: today })}>
            Last 7 days
          </Button>
          <Button size="sm" className="h-9" onClick={() => set({ from: addDaysIso(today, -30), to: today })}>
            Last 30 days
          </Button>
        </div>
        {(filter.from || filter.to) && (
          <Button size="sm" variant="quiet" className="h-9" onClick={() => set({ from: undefined, to: undefined })}>
            Any date
          </Button>
        )}
        {badRange && (
          <p className="w-full text-sm font-medium text-fault" role="alert">
            “To” is before “From”.
          </p>
        )}
      </fieldset>
      {shipments.isPending && !badRange ? (
        <Loading what="Loading shipments" />
      ) : shipments.isError ? (
        <Alert kind="fault" title="Could not load the shipments">
          {errorMessage(shipments.error)}
        </Alert>
      ) : (
        <DataTable
          data={shipments.data ?? []}
          columns={columns}
          noun="shipment"
          csvName="spoolwright-shipments"
          caption="Shipments"
          getRowId={(s) => String(s.id)}
          initialSorting={[{ id: 'shipDate', desc: true }]}
          empty="No shipments yet."
        />
      )}
    </div>
  );
}
