/** One shipment as the customer sees it: carrier, tracking, what was in it, and its documents. */
import { Link } from 'react-router';
import type { PortalShipment } from '../../contracts/shipments';
import { formatDay, pieces, plural } from '../../lib/format';
import { LineName } from '../../components/LineName';
import { Serials } from '../../components/Serials';
import { AddressBlock } from '../customers';

export function ShipmentDocuments({ shipment }: { shipment: PortalShipment }) {
  return (
    <ul className="flex flex-wrap gap-2" aria-label={`Documents of shipment ${shipment.number}`}>
      {shipment.documents.map((d) => (
        <li key={d.kind} data-document={d.kind}>
          {d.downloadUrl ? (
            <a
              href={d.downloadUrl}
              download
              className="inline-flex items-center gap-1.5 rounded-md border border-graphite-300 bg-white px-3 py-1.5 text-sm font-semibold text-copper-700 hover:bg-graphite-50"
            >
              <svg viewBox="0 0 16 16" className="size-4" aria-hidden>
                <path d="M8 2v8m0 0L5 7m3 3 3-3M3 12.5h10" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
              </svg>
              {d.label} (PDF)
            </a>
          ) : (
            <span className="inline-flex items-center gap-1.5 rounded-md border border-dashed border-graphite-300 px-3 py-1.5 text-sm text-graphite-600" role="status">
              <span aria-hidden className="size-3.5 animate-spin rounded-full border-2 border-copper-500 border-r-transparent" />
              {d.label}: being prepared
            </span>
          )}
        </li>
      ))}
    </ul>
  );
}

export function ShipmentCard({ shipment, showOrders = false }: { shipment: PortalShipment; showOrders?: boolean }) {
  const units = shipment.items.reduce((n, i) => n + i.quantity, 0);
  return (
    <article className="rounded-lg border border-graphite-200 bg-white" data-shipment={shipment.number} aria-labelledby={`sh-${shipment.id}`}>
      <header className="flex flex-wrap items-baseline justify-between gap-2 border-b border-graphite-200 px-4 py-2.5">
        <h3 id={`sh-${shipment.id}`} className="font-bold text-graphite-950">
          Shipment {shipment.number}
        </h3>
        <p className="text-sm text-graphite-700">
          Shipped {formatDay(shipment.shipDate)} · {plural(units, 'unit')} in {plural(shipment.packages, 'package')}
        </p>
      </header>
      <div className="flex flex-col gap-3 px-4 py-3">
        <dl className="grid grid-cols-1 gap-x-6 gap-y-2 text-sm sm:grid-cols-3">
          <div>
            <dt className="text-graphite-500">Carrier</dt>
            <dd className="font-semibold text-graphite-900">
              {shipment.carrier}
              {shipment.service && <span className="font-normal text-graphite-700"> · {shipment.service}</span>}
            </dd>
          </div>
          <div>
            <dt className="text-graphite-500">Tracking number</dt>
            <dd className="tabular text-base font-bold break-all text-graphite-950" data-testid="tracking-number">
              {shipment.trackingNumber || 'No tracking (delivered by the shop or collected)'}
            </dd>
          </div>
          <div>
            <dt className="text-graphite-500">Shipped to</dt>
            <dd>
              <AddressBlock address={shipment.shipTo} empty="—" />
            </dd>
          </div>
        </dl>
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">What shipment {shipment.number} carried</caption>
            <thead className="bg-graphite-100 text-left text-graphite-700">
              <tr>
                {showOrders && (
                  <th scope="col" className="px-2 py-1 font-semibold">
                    Order
                  </th>
                )}
                <th scope="col" className="px-2 py-1 font-semibold">
                  Line
                </th>
                <th scope="col" className="px-2 py-1 text-right font-semibold">
                  Quantity
                </th>
                <th scope="col" className="px-2 py-1 font-semibold">
                  Serials
                </th>
              </tr>
            </thead>
            <tbody>
              {shipment.items.map((i, n) => (
                <tr key={`${i.orderId}-${i.lineNo}-${n}`} className="border-b border-graphite-100 align-top last:border-0">
                  {showOrders && (
                    <td className="px-2 py-1">
                      <Link to={`/portal/orders/${i.orderId}`} className="whitespace-nowrap text-copper-700 underline-offset-2 hover:underline">
                        {i.orderNumber}
                      </Link>
                      <span className="block text-xs text-graphite-600">PO {i.purchaseOrder}</span>
                    </td>
                  )}
                  <td className="px-2 py-1">
                    <LineName line={i} />
                  </td>
                  <td className="tabular px-2 py-1 text-right font-semibold whitespace-nowrap">{pieces(i.quantity)}</td>
                  <td className="px-2 py-1">
                    <Serials serials={i.serials} show={4} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <ShipmentDocuments shipment={shipment} />
      </div>
    </article>
  );
}
