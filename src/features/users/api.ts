import { queryOptions, useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { customerOption, userRecord, type CreateUserRequest, type UpdateUserRequest } from '../../contracts/users';
import { api } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

const usersResponse = z.object({ users: z.array(userRecord) });
const userResponse = z.object({ user: userRecord });
const customerOptionsResponse = z.object({ customers: z.array(customerOption) });

export const usersQuery = queryOptions({
  queryKey: ['users'],
  queryFn: async ({ signal }) => (await api.get('/users', { schema: usersResponse, signal })).users,
});

export const customerOptionsQuery = queryOptions({
  queryKey: ['users', 'customer-options'],
  queryFn: async ({ signal }) => (await api.get('/users/customer-options', { schema: customerOptionsResponse, signal })).customers,
  staleTime: 5 * 60_000,
});

export function useCreateUser() {
  return useMutation({
    mutationFn: async (input: CreateUserRequest) => (await api.post('/users', input, { schema: userResponse })).user,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: usersQuery.queryKey }),
  });
}

export function useUpdateUser() {
  return useMutation({
    mutationFn: async ({ id, change }: { id: number; change: UpdateUserRequest }) =>
      (await api.patch(`/users/${id}`, change, { schema: userResponse })).user,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: usersQuery.queryKey }),
  });
}
