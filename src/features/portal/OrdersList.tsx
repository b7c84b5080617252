/**
 * The customer's orders, newest first: purchase order, dates, status in words, and each line's
 * progress as a bar with its summary. Used on the customer's home and on /portal/orders.
 */
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import type { PortalOrder } from '../../contracts/shipments';
import { Alert } from '../../components/Alert';
import { Loading } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { formatDay, plural, todayIso } from '../../lib/format';
import { OrderStatusText } from '../orders';
import { portalOrdersQuery } from './api';
import { LineProgress, ProgressLegend } from './Progress';

/** Orders the shop is done with: shown after the open ones. */
const FINISHED = ['shipped', 'closed', 'cancelled'];

export function OrderFacts({ order }: { order: PortalOrder }) {
  return (
    <dl className="grid grid-cols-2 gap-x-6 gap-y-1.5 text-sm sm:grid-cols-4">
      <div>
        <dt className="text-graphite-500">Your purchase order</dt>
        <dd className="font-semibold text-graphite-900">{order.purchaseOrder}</dd>
      </div>
      <div>
        <dt className="text-graphite-500">Ordered</dt>
        <dd className="font-semibold text-graphite-900">{formatDay(order.orderDate)}</dd>
      </div>
      <div>
        <dt className="text-graphite-500">{order.schedule === 'on_schedule' ? 'On schedule to ship by' : 'Requested ship date'}</dt>
        <dd className="font-semibold text-graphite-900" data-schedule={order.schedule}>
          {formatDay(order.dueDate)}
          {order.schedule === 'behind' && (
            <span className="mt-0.5 flex items-center gap-1 text-sm font-semibold text-fault">
              <svg aria-hidden viewBox="0 0 12 12" className="size-3">
                <path d="M6 1 11 10H1z" fill="currentColor" />
              </svg>
              Behind schedule: ask the shop for the new date
            </span>
          )}
        </dd>
      </div>
      <div>
        <dt className="text-graphite-500">Shipments</dt>
        <dd className="font-semibold text-graphite-900">{order.shipmentCount === 0 ? 'None yet' : order.shipmentCount}</dd>
      </div>
    </dl>
  );
}

export function OrderCard({ order }: { order: PortalOrder }) {
  return (
    <article className="rounded-lg border border-graphite-200 bg-white" data-order={order.number} aria-labelledby={`po-${order.id}`}>
      <header className="flex flex-wrap items-center justify-between gap-2 border-b border-graphite-200 px-4 py-2.5">
        <h3 id={`po-${order.id}`} className="text-lg font-bold text-graphite-950">
          <Link to={`/portal/orders/${order.id}`} className="text-copper-700 underline-offset-2 hover:underline">
            Order {order.number}
          </Link>
        </h3>
        <span title={order.status}>
          <OrderStatusText status={order.statusCode} />
        </span>
      </header>
      <div className="flex flex-col gap-1 px-4 py-2.5">
        <OrderFacts order={order} />
        <ol className="mt-1 divide-y divide-graphite-100" aria-label={`Lines of order ${order.number}`}>
          {order.lines.map((l) => (
            <LineProgress key={l.id} line={l} />
          ))}
        </ol>
      </div>
    </article>
  );
}

export function PortalOrdersList() {
  const orders = useQuery(portalOrdersQuery);
  if (orders.isPending) return <Loading what="Loading your orders" />;
  if (orders.isError)
    return (
      <Alert kind="fault" title="Could not load your orders">
        {errorMessage(orders.error)}
      </Alert>
    );
  if (orders.data.length === 0) return <Alert kind="idle" title="Your company has no orders with the shop yet." />;
  const open = orders.data.filter((o) => !FINISHED.includes(o.statusCode));
  const finished = orders.data.filter((o) => FINISHED.includes(o.statusCode));
  return (
    <section aria-labelledby="portal-orders-h" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end justify-between gap-2">
        <h2 id="portal-orders-h" className="text-xl font-bold text-graphite-950">
          Your orders <span className="text-base font-normal text-graphite-600">({plural(open.length, 'open order')}, {finished.length} finished)</span>
        </h2>
        <ProgressLegend />
      </div>
      {[...open, ...finished].map((o) => (
        <OrderCard key={o.id} order={o} />
      ))}
    </section>
  );
}
