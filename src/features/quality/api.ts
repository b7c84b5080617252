/**
 * The test-records feature's server calls: instruments, a work order's tests, serials, recording
 * a unit, dispositions and approvals, the quality summary and the design feedback with the
 * heat-transfer adoption. Contracts: src/contracts/test-records.ts and src/contracts/settings.ts.
 * The server judges every reading; these calls only carry what was entered.
 */
import { queryOptions, useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { heatTransferDefault, type AdoptHeatTransferRequest } from '../../contracts/settings';
import type { DesignFeedback, DispositionRequest, InstrumentRecord, Nonconformance, QualitySummary, RecordTestRequest, TestRecord, WorkOrderTests } from '../../contracts/test-records';
import { workOrderDetail, workOrderListResponse } from '../../contracts/work-orders';
import { api } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

const KEY = 'test-records';

/** The answers are typed by the contract's types (the contract gives no schemas for them). */
const typed = <T,>() => z.custom<T>((v) => typeof v === 'object' && v !== null);

export const instrumentsQuery = () =>
  queryOptions({
    queryKey: [KEY, 'instruments'],
    queryFn: async ({ signal }) => (await api.get('/instruments', { schema: z.object({ instruments: z.array(typed<InstrumentRecord>()) }), signal })).instruments,
    staleTime: 60_000,
  });

/** Work orders a bench can test: in testing, in rework (retests) and in inspection. */
export const BENCH_STAGES = ['testing', 'rework', 'inspection'] as const;

export const benchWorkOrdersQuery = () =>
  queryOptions({
    queryKey: [KEY, 'bench-work-orders'],
    queryFn: async ({ signal }) => (await api.get(`/work-orders?stage=${BENCH_STAGES.join(',')}`, { schema: workOrderListResponse, signal })).workOrders,
  });

/** A work order by its exact number (scan or typed), or null. */
export async function findWorkOrderByNumber(number: string, signal?: AbortSignal) {
  const found = (await api.get(`/work-orders?number=${encodeURIComponent(number)}`, { schema: workOrderListResponse, signal })).workOrders;
  return found.length === 1 ? found[0]! : null;
}

export const workOrderTestsQuery = (id: number) =>
  queryOptions({
    queryKey: [KEY, 'work-order', id],
    queryFn: ({ signal }) => api.get(`/work-orders/${id}/test-records`, { schema: typed<WorkOrderTests>(), signal }),
  });

export const qualitySummaryQuery = () =>
  queryOptions({ queryKey: [KEY, 'summary'], queryFn: ({ signal }) => api.get('/quality/summary', { schema: typed<QualitySummary>(), signal }) });

export const designFeedbackQuery = () =>
  queryOptions({ queryKey: [KEY, 'design-feedback'], queryFn: ({ signal }) => api.get('/quality/design-feedback', { schema: typed<DesignFeedback>(), signal }) });

/** After any write: every test view (and the work orders, whose gate and stage may change) is stale. */
function afterChange() {
  void queryClient.invalidateQueries({ queryKey: [KEY] });
  void queryClient.invalidateQueries({ queryKey: ['work-orders'] });
  void queryClient.invalidateQueries({ queryKey: ['floor'] });
}

export function useGenerateSerials() {
  return useMutation({
    mutationFn: async ({ workOrderId, count }: { workOrderId: number; count: number }) =>
      (await api.post(`/work-orders/${workOrderId}/serials`, { count }, { schema: z.object({ serials: z.array(z.string()) }) })).serials,
  });
}

export function useRecordTest() {
  return useMutation({
    mutationFn: ({ workOrderId, body }: { workOrderId: number; body: RecordTestRequest }) =>
      api.post(`/work-orders/${workOrderId}/test-records`, body, { schema: typed<TestRecord>() }),
    onSuccess: afterChange,
  });
}

export function useDisposition() {
  return useMutation({
    mutationFn: ({ id, body }: { id: number; body: DispositionRequest }) => api.post(`/nonconformances/${id}/disposition`, body, { schema: typed<Nonconformance>() }),
    onSuccess: afterChange,
    onError: afterChange,
  });
}

export function useApprove() {
  return useMutation({
    mutationFn: ({ id, note }: { id: number; note?: string }) => api.post(`/nonconformances/${id}/approve`, note ? { note } : {}, { schema: typed<Nonconformance>() }),
    onSuccess: afterChange,
    onError: afterChange,
  });
}

export function useAdoptHeatTransfer() {
  return useMutation({
    mutationFn: (body: AdoptHeatTransferRequest) => api.post('/quality/design-feedback/adopt', body, { schema: heatTransferDefault }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: [KEY, 'design-feedback'] });
      void queryClient.invalidateQueries({ queryKey: ['settings'] });
    },
  });
}

/** One work order with its build sheet's essentials (nominal R20, tolerance, turns). */
export const benchWorkOrderQuery = (id: number) =>
  queryOptions({
    queryKey: [KEY, 'wo', id],
    queryFn: ({ signal }) => api.get(`/work-orders/${id}`, { schema: workOrderDetail, signal }),
  });
