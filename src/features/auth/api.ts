import { useMutation } from '@tanstack/react-query';
import { sessionResponse, type LoginRequest } from '../../contracts/auth';
import type { ChangePasswordRequest } from '../../contracts/users';
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

/** POST /api/auth/password: the signed-in user chooses a new password; the session then shows the user without the forced change. */
export function useChangePassword() {
  return useMutation({
    mutationFn: (input: ChangePasswordRequest) => api.post('/auth/password', input, { schema: sessionResponse }),
    onSuccess: ({ user }) => {
      setSessionUser(user);
      void queryClient.invalidateQueries({ predicate: (q) => q.queryKey[0] !== 'session' });
    },
  });
}
