import { queryOptions, useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import {
  customerDetail,
  customerSummary,
  type CreateCustomerRequest,
  type UpdateCustomerRequest,
} from '../../contracts/customers';
import { api } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

const listResponse = z.object({ customers: z.array(customerSummary) });
const detailResponse = z.object({ customer: customerDetail });

export const customersQuery = queryOptions({
  queryKey: ['customers'],
  queryFn: async ({ signal }) => (await api.get('/customers', { schema: listResponse, signal })).customers,
});

export const customerQuery = (id: number) =>
  queryOptions({
    queryKey: ['customers', id],
    queryFn: async ({ signal }) => (await api.get(`/customers/${id}`, { schema: detailResponse, signal })).customer,
  });

export function useCreateCustomer() {
  return useMutation({
    mutationFn: async (input: CreateCustomerRequest) => (await api.post('/customers', input, { schema: detailResponse })).customer,
    onSuccess: (c) => {
      queryClient.setQueryData(customerQuery(c.id).queryKey, c);
      return queryClient.invalidateQueries({ queryKey: customersQuery.queryKey, exact: true });
    },
  });
}

export function useUpdateCustomer() {
  return useMutation({
    mutationFn: async ({ id, change }: { id: number; change: UpdateCustomerRequest }) =>
      (await api.patch(`/customers/${id}`, change, { schema: detailResponse })).customer,
    onSuccess: (c) => {
      queryClient.setQueryData(customerQuery(c.id).queryKey, c);
      return queryClient.invalidateQueries({ queryKey: customersQuery.queryKey, exact: true });
    },
  });
}
