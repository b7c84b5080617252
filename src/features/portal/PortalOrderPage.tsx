/** /portal/orders/:id: one of the customer's orders, its lines' progress and its shipments. */
import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router';
import { Alert } from '../../components/Alert';
import { Loading } from '../../components/Panel';
import { errorMessage, isApiError } from '../../lib/api';
import { OrderStatusText } from '../orders';
import { portalOrderQuery } from './api';
import { OrderFacts } from './OrdersList';
import { LineProgress, ProgressLegend } from './Progress';
import { ShipmentCard } from './ShipmentCard';

export function PortalOrderPage() {
  const id = Number(useParams().id);
  const order = useQuery({ ...portalOrderQuery(id), enabled: Number.isInteger(id) && id > 0 });
  if (order.isPending) return <Loading what="Loading the order" />;
  if (order.isError) {
    const missing = isApiError(order.error) && order.error.status === 404;
    return (
      <Alert kind="fault" title={missing ? 'No such order' : 'Could not load the order'}>
        {missing ? 'There is no order of your company at this address.' : errorMessage(order.error)}{' '}
        <Link to="/portal/orders" className="underline">
          Back to your orders
        </Link>
      </Alert>
    );
  }
  const o = order.data;
  const shipments = [...o.shipments].sort((a, b) => b.shipDate.localeCompare(a.shipDate) || b.id - a.id);
  return (
    <div className="flex flex-col gap-4" data-order={o.number}>
      <nav aria-label="Breadcrumb" className="text-sm text-graphite-600">
        <Link to="/portal/orders" className="underline-offset-2 hover:underline">
          Your orders
        </Link>{' '}
        / {o.number}
      </nav>
      <header className="rounded-lg border border-graphite-200 bg-white px-5 py-4 shadow-[inset_4px_0_0_#b8632e]">
        <div className="flex flex-wrap items-center gap-2">
          <h1 className="text-2xl font-bold tracking-tight text-graphite-950">Order {o.number}</h1>
          <OrderStatusText status={o.statusCode} />
        </div>
        <div className="mt-3">
          <OrderFacts order={o} />
        </div>
      </header>

      <section aria-labelledby="lines-h" className="rounded-lg border border-graphite-200 bg-white px-4 py-3">
        <div className="flex flex-wrap items-end justify-between gap-2">
          <h2 id="lines-h" className="text-lg font-semibold text-graphite-900">
            Where each line stands
          </h2>
          <ProgressLegend />
        </div>
        <ol className="divide-y divide-graphite-100">
          {o.lines.map((l) => (
            <LineProgress key={l.id} line={l} />
          ))}
        </ol>
      </section>

      <section aria-labelledby="shipments-h" className="flex flex-col gap-3">
        <h2 id="shipments-h" className="text-lg font-semibold text-graphite-900">
          Shipments
        </h2>
        {shipments.length === 0 ? (
          <p className="text-graphite-600">Nothing of this order has shipped yet.</p>
        ) : (
          shipments.map((s) => <ShipmentCard key={s.id} shipment={s} />)
        )}
      </section>
      <p className="text-sm text-graphite-600">
        To change an order — quantities, dates, a revised drawing — contact the shop’s office the way you placed the order.
      </p>
    </div>
  );
}
