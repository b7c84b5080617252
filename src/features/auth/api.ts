import { useMutation } from '@tanstack/react-query';
import { sessionResponse, type LoginRequest } from '../../contracts/auth';
import { api } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';
import { setSessionUser } from '../../lib/session';

export function useSignIn() {
  return useMutation({
    mutationFn: (input: LoginRequest) => api.post('/auth/login', input, { schema: sessionResponse }),
    onSuccess: ({ user }) => {
      // A fresh session: nothing cached for a previous person may show.
      queryClient.clear();
      setSessionUser(user);
    },
  });
}

export function useSignOut() {
  return useMutation({
    mutationFn: () => api.post('/auth/logout'),
    onSettled: () => {
      queryClient.clear();
      setSessionUser(null);
    },
  });
}
