import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link, useSearchParams } from 'react-router';
import { ORDER_STATUS_LABELS, type OrderSummary } from '../../contracts/orders';
import { Alert } from '../../components/Alert';
import { Button, buttonClass } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Loading, PageHeader } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { addDaysIso, formatDay, pieces, todayIso } from '../../lib/format';
import { useCurrentUser } from '../../lib/session';
import { ordersQuery, type OrderListFilter } from './api';
import { LateBadge, OrderStatusBadge } from './status';

const col = createColumnHelper<OrderSummary>();
const dateInput =
  'h-9 rounded-md border border-graphite-300 bg-white px-2 text-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200';
const isDate = (s: string | null) => (s && /^\d{4}-\d{2}-\d{2}$/.test(s) ? s : undefined);

export function OrdersPage() {
  const user = useCurrentUser();
  const isCustomer = user.role === 'customer';
  const canWrite = user.role === 'office' || user.role === 'admin';
  const [params, setParams] = useSearchParams();
  const filter: OrderListFilter = {
    dueFrom: isDate(params.get('dueFrom')),
    dueTo: isDate(params.get('dueTo')),
    late: params.get('late') === '1' || undefined,
  };
  const badRange = Boolean(filter.dueFrom && filter.dueTo && filter.dueTo < filter.dueFrom);
  const orders = useQuery({ ...ordersQuery(filter), enabled: !badRange });

  const set = (changes: Record<string, string | undefined>) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(changes)) {
      if (v) next.set(k, v);
      else next.delete(k);
    }
    setParams(next, { replace: true });
  };
  const today = todayIso();

  const columns = useMemo(
    () => [
      col.accessor('number', {
        header: 'Order',
        cell: (c) => (
          <Link to={`/orders/${c.row.original.id}`} className="font-semibold whitespace-nowrap text-copper-700 underline-offset-2 hover:underline">
            {c.getValue()}
          </Link>
        ),
      }),
      ...(isCustomer ? [] : [col.accessor((o) => o.customer.name, { id: 'customer', header: 'Customer', meta: { filter: 'select' as const } })]),
      col.accessor('purchaseOrder', { header: 'Purchase order' }),
      col.accessor((o) => ORDER_STATUS_LABELS[o.status], {
        id: 'status',
        header: 'Status',
        meta: { filter: 'select' },
        cell: (c) => <OrderStatusBadge status={c.row.original.status} />,
      }),
      col.accessor('orderDate', { header: 'Ordered', cell: (c) => <span className="whitespace-nowrap">{formatDay(c.getValue())}</span> }),
      col.accessor('dueDate', {
        header: 'Ship by',
        cell: (c) => <span className={`whitespace-nowrap ${c.row.original.late ? 'font-semibold text-fault' : ''}`}>{formatDay(c.getValue())}</span>,
      }),
      col.accessor((o) => (o.late ? 'Late' : ''), {
        id: 'late',
        header: 'Timing',
        meta: { label: 'Late', csv: (o) => (o.late ? 'late' : '') },
        cell: (c) => (c.row.original.late ? <LateBadge /> : null),
      }),
      col.accessor('lineCount', { header: 'Lines', meta: { align: 'right' } }),
      col.accessor('unitCount', {
        header: 'Units',
        meta: { align: 'right', label: 'Units (pcs)' },
        cell: (c) => <span className="whitespace-nowrap">{pieces(c.getValue())}</span>,
      }),
    ],
    [isCustomer],
  );

  const lateCount = orders.data?.filter((o) => o.late).length ?? 0;

  return (
    <div>
      <PageHeader
        title={isCustomer ? 'Your orders' : 'Orders'}
        lead={
          isCustomer
            ? 'Everything your company has ordered from the shop, and how far each order has come.'
            : 'Every customer order. Late orders — past their requested ship date and not yet shipped — are marked.'
        }
        actions={
          canWrite && (
            <Link to="/orders/new" className={buttonClass('primary')}>
              New order
            </Link>
          )
        }
      />
      <fieldset className="mb-3 flex flex-wrap items-end gap-x-3 gap-y-2 rounded-md border border-graphite-200 bg-white px-3 py-2">
        <legend className="px-1 text-sm font-semibold text-graphite-800">Requested ship date</legend>
        <label className="flex flex-col gap-1 text-sm font-semibold text-graphite-800">
          From
          <input type="date" className={dateInput} value={filter.dueFrom ?? ''} onChange={(e) => set({ dueFrom: e.target.value || undefined })} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-graphite-800">
          To
          <input type="date" className={dateInput} value={filter.dueTo ?? ''} onChange={(e) => set({ dueTo: e.target.value || undefined })} />
        </label>
        <div className="flex gap-1">
          <Button size="sm" className="h-9" onClick={() => set({ dueFrom: today, dueTo: addDaysIso(today, 7) })}>
            Next 7 days
          </Button>
          <Button size="sm" className="h-9" onClick={() => set({ dueFrom: today, dueTo: addDaysIso(today, 30) })}>
            Next 30 days
          </Button>
        </div>
        <label className="flex h-9 items-center gap-2 rounded-md border border-graphite-300 px-2.5 text-sm font-semibold text-graphite-800 has-[:checked]:border-fault/60 has-[:checked]:bg-fault-soft has-[:checked]:text-fault">
          <input type="checkbox" className="size-4 accent-[#a8261f]" checked={Boolean(filter.late)} onChange={(e) => set({ late: e.target.checked ? '1' : undefined })} />
          Late only
        </label>
        {(filter.dueFrom || filter.dueTo || filter.late) && (
          <Button size="sm" variant="quiet" className="h-9" onClick={() => set({ dueFrom: undefined, dueTo: undefined, late: undefined })}>
            Any date
          </Button>
        )}
        {badRange && <p className="w-full text-sm font-medium text-fault" role="alert">“To” is before “From”.</p>}
        {!badRange && orders.data && lateCount > 0 && !filter.late && (
          <p className="ml-auto self-center text-sm text-graphite-700">
            <LateBadge /> <span className="ml-1 font-semibold">{lateCount}</span> of these {lateCount === 1 ? 'is' : 'are'} late
          </p>
        )}
      </fieldset>
      {orders.isPending && !badRange ? (
        <Loading what="Loading orders" />
      ) : orders.isError ? (
        <Alert kind="fault" title="Could not load the orders">
          {errorMessage(orders.error)}
        </Alert>
      ) : (
        <DataTable
          data={orders.data ?? []}
          columns={columns}
          noun="order"
          csvName="spoolwright-orders"
          caption="Orders"
          getRowId={(o) => String(o.id)}
          initialSorting={[{ id: 'number', desc: true }]}
          rowClassName={(o) => (o.late ? 'shadow-[inset_4px_0_0_#a8261f]' : '')}
          empty={isCustomer ? 'Your company has no orders yet.' : 'No orders yet.'}
        />
      )}
    </div>
  );
}
