import { keepPreviousData, queryOptions, useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import {
  attachmentCreated,
  orderDetail,
  orderListResponse,
  type CreateOrderRequest,
  type UpdateOrderRequest,
} from '../../contracts/orders';
import { api, apiUpload } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

/** The server-side narrowing of the order list (status and customer are narrowed in the table). */
export type OrderListFilter = { dueFrom?: string; dueTo?: string; late?: boolean };

function listPath(f: OrderListFilter): string {
  const q = new URLSearchParams();
  if (f.dueFrom) q.set('dueFrom', f.dueFrom);
  if (f.dueTo) q.set('dueTo', f.dueTo);
  if (f.late) q.set('late', 'true');
  const s = q.toString();
  return s ? `/orders?${s}` : '/orders';
}

export const ordersQuery = (f: OrderListFilter = {}) =>
  queryOptions({
    queryKey: ['orders', 'list', f],
    queryFn: async ({ signal }) => (await api.get(listPath(f), { schema: orderListResponse, signal })).orders,
    placeholderData: keepPreviousData,
  });

const detailResponse = z.object({ order: orderDetail });

export const orderQuery = (id: number) =>
  queryOptions({
    queryKey: ['orders', 'one', id],
    queryFn: async ({ signal }) => (await api.get(`/orders/${id}`, { schema: detailResponse, signal })).order,
  });

/** After any write: the order's own cache entry is fresh; lists and companies' order lists are not. */
function afterWrite(order: z.infer<typeof orderDetail>) {
  queryClient.setQueryData(orderQuery(order.id).queryKey, order);
  void queryClient.invalidateQueries({ queryKey: ['orders', 'list'] });
  void queryClient.invalidateQueries({ queryKey: ['customers'] });
}

export function useCreateOrder() {
  return useMutation({
    mutationFn: async (input: CreateOrderRequest) => (await api.post('/orders', input, { schema: detailResponse })).order,
    onSuccess: afterWrite,
  });
}

export function useUpdateOrder() {
  return useMutation({
    mutationFn: async ({ id, change }: { id: number; change: UpdateOrderRequest }) =>
      (await api.patch(`/orders/${id}`, change, { schema: detailResponse })).order,
    onSuccess: afterWrite,
  });
}

const notificationSummary = z.object({
  id: z.number().int(),
  status: z.string(),
  recipients: z.array(z.object({ name: z.string(), email: z.string() })),
  reason: z.string().nullable(),
});
const acknowledgeResponse = z.object({ order: orderDetail, notification: notificationSummary });
export type AcknowledgeResult = z.infer<typeof acknowledgeResponse>;

export function useAcknowledgeOrder() {
  return useMutation({
    mutationFn: (id: number) => api.post(`/orders/${id}/acknowledge`, undefined, { schema: acknowledgeResponse }),
    onSuccess: (r) => afterWrite(r.order),
  });
}

export function useCancelOrder() {
  return useMutation({
    mutationFn: async ({ id, reason }: { id: number; reason: string }) =>
      (await api.post(`/orders/${id}/cancel`, { reason }, { schema: detailResponse })).order,
    onSuccess: afterWrite,
  });
}

/** POST /api/orders/:id/attachments (multipart `file`, optional `lineId`), with progress. */
export function uploadAttachment(orderId: number, file: File, lineId: number | null, onProgress?: (fraction: number) => void, signal?: AbortSignal) {
  const form = new FormData();
  if (lineId !== null) form.append('lineId', String(lineId));
  form.append('file', file, file.name);
  return apiUpload(`/orders/${orderId}/attachments`, form, {
    schema: attachmentCreated,
    signal,
    onProgress: onProgress && ((sent, total) => onProgress(total > 0 ? Math.min(1, sent / total) : 0)),
  });
}

export function useDeleteAttachment(orderId: number) {
  return useMutation({
    mutationFn: (attachmentId: number) => api.delete(`/attachments/${attachmentId}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: orderQuery(orderId).queryKey }),
  });
}

/** Where the browser downloads an attachment (the API streams it with the order's access checks). */
export const attachmentHref = (id: number, inline = false) => `/api/attachments/${id}${inline ? '?inline=1' : ''}`;
