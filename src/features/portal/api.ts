/**
 * The customer's read-only view (GET /api/portal/…): their own company's orders and shipments.
 * The server answers only the signed-in customer's company, with nothing internal.
 */
import { queryOptions } from '@tanstack/react-query';
import type { PortalOrder, PortalOrderDetail, PortalShipment } from '../../contracts/shipments';
import { api } from '../../lib/api';

/** A shipment document not drawn yet has no download address; ask again until it has. */
const POLL_MS = 2_000;
const undrawn = (shipments: PortalShipment[] | undefined) => Boolean(shipments?.some((s) => s.documents.some((d) => d.downloadUrl === null)));

export const portalOrdersQuery = queryOptions({
  queryKey: ['portal', 'orders'],
  queryFn: async ({ signal }) => ((await api.get('/portal/orders', { signal })) as { orders: PortalOrder[] }).orders,
});

export const portalOrderQuery = (id: number) =>
  queryOptions({
    queryKey: ['portal', 'orders', id],
    queryFn: ({ signal }) => api.get(`/portal/orders/${id}`, { signal }) as Promise<PortalOrderDetail>,
    refetchInterval: (q) => (undrawn(q.state.data?.shipments) ? POLL_MS : false),
  });

export const portalShipmentsQuery = queryOptions({
  queryKey: ['portal', 'shipments'],
  queryFn: async ({ signal }) => ((await api.get('/portal/shipments', { signal })) as { shipments: PortalShipment[] }).shipments,
  refetchInterval: (q) => (undrawn(q.state.data) ? POLL_MS : false),
});
