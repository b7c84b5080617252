import { queryOptions, useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { failedJob, notificationRecord, outboxResponse } from '../../contracts/jobs';
import { api } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

export const outboxQuery = queryOptions({
  queryKey: ['outbox'],
  queryFn: ({ signal }) => api.get('/notifications', { schema: outboxResponse, signal }),
  refetchInterval: 5_000,
});

export const failedJobsQuery = queryOptions({
  queryKey: ['jobs', 'failed'],
  queryFn: async ({ signal }) => (await api.get('/jobs', { schema: z.object({ jobs: z.array(failedJob) }), signal })).jobs,
  refetchInterval: 10_000,
});

export function useRetryNotification() {
  return useMutation({
    mutationFn: (id: number) => api.post(`/notifications/${id}/retry`, {}, { schema: z.object({ notification: notificationRecord }) }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: outboxQuery.queryKey }),
  });
}

export function useRetryJob() {
  return useMutation({
    mutationFn: (id: string) => api.post(`/jobs/${encodeURIComponent(id)}/retry`, {}),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: failedJobsQuery.queryKey }),
  });
}
