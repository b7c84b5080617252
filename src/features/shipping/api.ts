/**
 * The shipping feature's API hooks (TanStack Query over the one API client). Shapes are the
 * contract's types (src/contracts/shipments.ts); the server is the judge of every rule.
 */
import { keepPreviousData, queryOptions, useMutation } from '@tanstack/react-query';
import type { CreateShipmentRequest, ReadyToShip, ShipmentDocumentKind, ShipmentRecord, ShipmentSummary } from '../../contracts/shipments';
import { api } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

/** How often a shipment whose documents are still being drawn is asked again, ms. */
export const DOCUMENT_POLL_MS = 1_000;

export const readyQuery = queryOptions({
  queryKey: ['shipping', 'ready'],
  queryFn: ({ signal }) => api.get('/shipping/ready', { signal }) as Promise<ReadyToShip>,
});

/** The server-side narrowing of the shipment list (customer and text are narrowed in the table). */
export type ShipmentListFilter = { from?: string; to?: string };

function listPath(f: ShipmentListFilter): string {
  const q = new URLSearchParams();
  if (f.from) q.set('from', f.from);
  if (f.to) q.set('to', f.to);
  const s = q.toString();
  return s ? `/shipments?${s}` : '/shipments';
}

export const shipmentsQuery = (f: ShipmentListFilter = {}) =>
  queryOptions({
    queryKey: ['shipments', 'list', f],
    queryFn: async ({ signal }) => ((await api.get(listPath(f), { signal })) as { shipments: ShipmentSummary[] }).shipments,
    placeholderData: keepPreviousData,
  });

const documentsPending = (s: ShipmentRecord | undefined) => Boolean(s?.documents.some((d) => d.state === 'pending'));

/** One shipment; asked again every second while a document is still being drawn. */
export const shipmentQuery = (id: number) =>
  queryOptions({
    queryKey: ['shipments', 'one', id],
    queryFn: ({ signal }) => api.get(`/shipments/${id}`, { signal }) as Promise<ShipmentRecord>,
    refetchInterval: (q) => (documentsPending(q.state.data) ? DOCUMENT_POLL_MS : q.state.data?.notification?.status === 'pending' ? 5 * DOCUMENT_POLL_MS : false),
  });

export function useCreateShipment() {
  return useMutation({
    mutationFn: (req: CreateShipmentRequest) => api.post('/shipments', req) as Promise<ShipmentRecord>,
    onSuccess: (s) => {
      queryClient.setQueryData(shipmentQuery(s.id).queryKey, s);
      void queryClient.invalidateQueries({ queryKey: readyQuery.queryKey });
      void queryClient.invalidateQueries({ queryKey: ['shipments', 'list'] });
      void queryClient.invalidateQueries({ queryKey: ['orders'] });
    },
  });
}

/** Draws both documents again (after a correction to a test record, say). */
export function useRedrawDocuments(id: number) {
  return useMutation({
    mutationFn: () => api.post(`/shipments/${id}/documents`) as Promise<{ jobId: string }>,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: shipmentQuery(id).queryKey }),
  });
}

/** Where the browser downloads a shipment's document (the server checks who asks). */
export const documentHref = (shipmentId: number, kind: ShipmentDocumentKind) => `/api/shipments/${shipmentId}/documents/${kind}`;
