import { QueryClient } from '@tanstack/react-query';
import { isApiError } from './api';

/** The app's one query cache. Client errors (4xx) are not retried; the server already said no. */
export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      staleTime: 30_000,
      refetchOnWindowFocus: false,
      retry: (count, e) => !(isApiError(e) && e.status >= 400 && e.status < 500) && count < 2,
    },
    mutations: { retry: false },
  },
});
