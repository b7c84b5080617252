import { queryOptions, useMutation } from '@tanstack/react-query';
import { jobStateResponse } from '../../contracts/jobs';
import { travelerBatchResult, travelerInfo, travelerJobAccepted, type TravelerBatchRequest } from '../../contracts/travelers';
import { api } from '../../lib/api';

export function usePrintBatch() {
  return useMutation({
    mutationFn: (req: TravelerBatchRequest) => api.post('/travelers/batch', req, { schema: travelerJobAccepted }),
  });
}

export function usePrintOne() {
  return useMutation({
    mutationFn: (workOrderId: number) => api.post(`/work-orders/${workOrderId}/traveler`, {}, { schema: travelerJobAccepted }),
  });
}

/** A job's state, polled while it runs (and no longer once it has finished). */
export const jobQuery = (jobId: string) =>
  queryOptions({
    queryKey: ['jobs', jobId],
    queryFn: ({ signal }) => api.get(`/jobs/${encodeURIComponent(jobId)}`, { schema: jobStateResponse, signal }),
    refetchInterval: (q) => (q.state.data && ['completed', 'failed'].includes(q.state.data.state) ? false : 700),
  });

export const travelerInfoQuery = (workOrderId: number) =>
  queryOptions({
    queryKey: ['work-orders', workOrderId, 'traveler'],
    queryFn: ({ signal }) => api.get(`/work-orders/${workOrderId}/traveler`, { schema: travelerInfo, signal }),
  });

export const batchResult = (result: unknown) => travelerBatchResult.safeParse(result);
