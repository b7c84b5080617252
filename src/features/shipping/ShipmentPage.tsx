/**
 * One shipment, as recorded: what shipped against which order lines, where to, how, in which
 * packages (in the user's units), its packing list and certificate (asked again every second
 * until both are drawn), and the customer's shipment notice.
 */
import { useQuery } from '@tanstack/react-query';
import { Link, useLocation, useParams } from 'react-router';
import type { ShipmentRecord } from '../../contracts/shipments';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { Loading, Panel } from '../../components/Panel';
import { errorMessage, isApiError } from '../../lib/api';
import { formatDateTime, formatDay, pieces, plural } from '../../lib/format';
import { LineName } from '../../components/LineName';
import { useCurrentUser, useUnits } from '../../lib/session';
import { formatNumber, fromMetres, type LengthUnit } from '../../lib/units';
import { AddressBlock } from '../customers';
import { shipmentQuery, useRedrawDocuments } from './api';
import { Serials } from '../../components/Serials';
import { DocumentList, Fact, NoticeStatus } from './parts';

/** A package's outside size, L × W × H, in the user's length unit (mm whole, inches to 0.1). */
export function packageSize(p: { length: number; width: number; height: number }, unit: LengthUnit) {
  const digits = unit === 'mm' ? 0 : 1;
  const n = (mm: number) => formatNumber(fromMetres(mm / 1000, unit), digits);
  return `${n(p.length)} × ${n(p.width)} × ${n(p.height)}\u00a0${unit}`;
}

function Items({ s }: { s: ShipmentRecord }) {
  return (
    <Panel title={`What shipped (${plural(s.units, 'unit')})`}>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">Items of shipment {s.number}</caption>
          <thead className="bg-graphite-100 text-left text-graphite-700">
            <tr>
              {['Work order', 'Order', 'Purchase order', 'Line', 'Quantity', 'Serials'].map((h) => (
                <th key={h} scope="col" className={`px-2.5 py-1.5 font-semibold whitespace-nowrap ${h === 'Quantity' ? 'text-right' : ''}`}>
                  {h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {s.items.map((i) => (
              <tr key={i.workOrderId} className="border-b border-graphite-100 align-top last:border-0" data-item={i.workOrderNumber}>
                <td className="px-2.5 py-1.5">
                  <Link to={`/work-orders/${i.workOrderId}`} className="font-semibold whitespace-nowrap text-copper-700 underline-offset-2 hover:underline">
                    {i.workOrderNumber}
                  </Link>
                </td>
                <td className="px-2.5 py-1.5">
                  <Link to={`/orders/${i.orderId}`} className="whitespace-nowrap text-copper-700 underline-offset-2 hover:underline">
                    {i.orderNumber}
                  </Link>
                </td>
                <td className="px-2.5 py-1.5">{i.purchaseOrder}</td>
                <td className="px-2.5 py-1.5">
                  <LineName line={i} />
                </td>
                <td className="tabular px-2.5 py-1.5 text-right font-semibold whitespace-nowrap">{pieces(i.quantity)}</td>
                <td className="px-2.5 py-1.5">
                  <Serials serials={i.serials} show={10} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </Panel>
  );
}

function Packages({ s }: { s: ShipmentRecord }) {
  const u = useUnits();
  return (
    <Panel title={`Packages (${s.packageList.length})`}>
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Packages of shipment {s.number}</caption>
        <thead className="text-left text-graphite-600">
          <tr>
            <th scope="col" className="py-1 pr-3 font-semibold">
              Package
            </th>
            <th scope="col" className="py-1 pr-3 text-right font-semibold">
              Weight
            </th>
            <th scope="col" className="py-1 text-right font-semibold">
              Length × width × height
            </th>
          </tr>
        </thead>
        <tbody>
          {s.packageList.map((p, i) => (
            <tr key={i} className="tabular border-t border-graphite-100">
              <td className="py-1 pr-3">#{i + 1}</td>
              <td className="py-1 pr-3 text-right">{u.mass(p.weight)}</td>
              <td className="py-1 text-right">{packageSize(p, u.prefs.lengthUnit)}</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr className="border-t-2 border-graphite-300 font-semibold">
            <td className="py-1 pr-3">Total</td>
            <td className="tabular py-1 pr-3 text-right" data-testid="total-weight">
              {u.mass(s.totalWeight)}
            </td>
            <td />
          </tr>
        </tfoot>
      </table>
    </Panel>
  );
}

export function ShipmentPage() {
  const id = Number(useParams().id);
  const user = useCurrentUser();
  const location = useLocation();
  const created = (location.state as { created?: string } | null)?.created;
  const canRedraw = user.role === 'shipping' || user.role === 'admin';
  const shipment = useQuery({ ...shipmentQuery(id), enabled: Number.isInteger(id) && id > 0 });
  const redraw = useRedrawDocuments(id);

  if (shipment.isPending) return <Loading what="Loading the shipment" />;
  if (shipment.isError) {
    const missing = isApiError(shipment.error) && shipment.error.status === 404;
    return (
      <Alert kind="fault" title={missing ? 'No such shipment' : 'Could not load the shipment'}>
        {missing ? 'There is no shipment at this address.' : errorMessage(shipment.error)}{' '}
        <Link to="/shipments" className="underline">
          Back to the shipments
        </Link>
      </Alert>
    );
  }
  const s = shipment.data;
  const pending = s.documents.some((d) => d.state === 'pending');
  return (
    <div className="flex flex-col gap-4" data-shipment={s.number}>
      <nav aria-label="Breadcrumb" className="text-sm text-graphite-600">
        <Link to="/shipments" className="underline-offset-2 hover:underline">
          Shipments
        </Link>{' '}
        / {s.number}
      </nav>
      <header className="rounded-lg border border-graphite-200 bg-white px-5 py-4 shadow-[inset_4px_0_0_#2d6e4a]">
        <h1 className="text-2xl font-bold tracking-tight text-graphite-950">Shipment {s.number}</h1>
        <p className="mt-0.5 text-graphite-700">
          <Link to={`/customers/${s.customer.id}`} className="font-semibold text-copper-700 underline-offset-2 hover:underline">
            {s.customer.name}
          </Link>{' '}
          · orders{' '}
          {s.orders.map((o, i) => (
            <span key={o.id}>
              {i > 0 && ', '}
              <Link to={`/orders/${o.id}`} className="text-copper-700 underline-offset-2 hover:underline">
                {o.number}
              </Link>{' '}
              (PO {o.purchaseOrder})
            </span>
          ))}
        </p>
        <dl className="mt-3 grid grid-cols-2 gap-x-6 gap-y-2 sm:grid-cols-3 lg:grid-cols-6">
          <Fact label="Ship date">{formatDay(s.shipDate)}</Fact>
          <Fact label="Carrier">{s.carrier}</Fact>
          <Fact label="Service">{s.service || '—'}</Fact>
          <Fact label="Tracking number">
            <span className="tabular break-all" data-testid="tracking-number">
              {s.trackingNumber || 'none'}
            </span>
          </Fact>
          <Fact label="Units">{pieces(s.units)}</Fact>
          <Fact label="Recorded">{`${formatDateTime(s.createdAt)}${s.createdBy ? ` by ${s.createdBy.name}` : ''}`}</Fact>
        </dl>
      </header>

      {created && <Alert kind="good" title={created}>Its work orders are shipped; the documents and the customer’s notice follow below.</Alert>}

      <div className="grid gap-4 lg:grid-cols-[1fr_1fr]">
        <Panel
          title="Documents"
          actions={
            canRedraw && (
              <Button size="sm" onClick={() => redraw.mutate()} busy={redraw.isPending} disabled={pending}>
                Draw again
              </Button>
            )
          }
        >
          <DocumentList shipmentId={s.id} documents={s.documents} />
          {redraw.isError && <p className="mt-2 text-sm text-fault">{errorMessage(redraw.error)}</p>}
        </Panel>
        <Panel title="Customer notice">
          {s.notification ? (
            <div className="flex flex-col gap-1.5" data-notice={s.notification.status}>
              <NoticeStatus status={s.notification.status} />
              <p className="text-sm text-graphite-700">
                {s.notification.recipients > 0
                  ? `To ${plural(s.notification.recipients, 'shipping contact')}, with the certificate attached.`
                  : 'The customer has no shipping contact with an e-mail address.'}
                {s.notification.sentAt && ` Sent ${formatDateTime(s.notification.sentAt)}.`}
              </p>
            </div>
          ) : (
            <p className="text-graphite-600">No notice was written for this shipment.</p>
          )}
        </Panel>
      </div>

      <Items s={s} />

      <div className="grid gap-4 lg:grid-cols-2">
        <Panel title="Ship to">
          <AddressBlock address={s.shipTo} empty="No address recorded" />
          {s.attention && <p className="mt-2 text-sm text-graphite-700">Attention: {s.attention}</p>}
          {s.packingNote && (
            <div className="mt-3">
              <p className="text-xs font-semibold tracking-wide text-graphite-500 uppercase">Packing note</p>
              <p className="whitespace-pre-line text-graphite-800">{s.packingNote}</p>
            </div>
          )}
        </Panel>
        <Packages s={s} />
      </div>
    </div>
  );
}
