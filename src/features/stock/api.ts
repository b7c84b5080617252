/** Wire stock: spools of magnet wire, and receiving a new one. */
import { queryOptions, useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { spoolListResponse, spoolRecord, type ReceiveSpoolBody } from '../../contracts/stock';
import { api } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

export const spoolsQuery = queryOptions({
  queryKey: ['stock', 'spools'],
  queryFn: async ({ signal }) => (await api.get('/spools', { schema: spoolListResponse, signal })).spools,
});

export function useReceiveSpool() {
  return useMutation({
    mutationFn: async (body: ReceiveSpoolBody) => (await api.post('/spools', body, { schema: z.object({ spool: spoolRecord }) })).spool,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['stock'] }),
  });
}
