/** /portal/shipments: every shipment to the customer's company, newest first. */
import { useQuery } from '@tanstack/react-query';
import { Alert } from '../../components/Alert';
import { Loading, PageHeader } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { portalShipmentsQuery } from './api';
import { ShipmentCard } from './ShipmentCard';

export function PortalShipmentsPage() {
  const shipments = useQuery(portalShipmentsQuery);
  return (
    <div>
      <PageHeader title="Your shipments" lead="What the shop has sent your company, with tracking numbers, packing lists and certificates of conformance." />
      {shipments.isPending ? (
        <Loading what="Loading your shipments" />
      ) : shipments.isError ? (
        <Alert kind="fault" title="Could not load your shipments">
          {errorMessage(shipments.error)}
        </Alert>
      ) : shipments.data.length === 0 ? (
        <Alert kind="idle" title="Nothing has shipped to your company yet." />
      ) : (
        <div className="flex flex-col gap-3">
          {[...shipments.data]
            .sort((a, b) => b.shipDate.localeCompare(a.shipDate) || b.id - a.id)
            .map((s) => (
              <ShipmentCard key={s.id} shipment={s} showOrders />
            ))}
        </div>
      )}
    </div>
  );
}
