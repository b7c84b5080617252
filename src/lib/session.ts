/**
 * Who is signed in. The session lives in the query cache under SESSION_KEY: the router's guards
 * read it before a screen loads, components read it with `useCurrentUser()`.
 */
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { useRouteLoaderData } from 'react-router';
import { sessionResponse, type SessionUser } from '../contracts/auth';
import type { Role } from '../contracts/roles';
import type { UpdatePreferencesRequest } from '../contracts/users';
import { api, isApiError } from './api';
import { queryClient } from './queryClient';
import { unitFormatters } from './units';

export const SESSION_KEY = ['session'] as const;

/** Route id of the signed-in area; its loader (the sign-in guard) returns the user it let in. */
export const SIGNED_IN_ROUTE_ID = 'signed-in';

/** GET /api/auth/me; a 401 is an answer here: nobody is signed in (null). */
export async function fetchSessionUser(): Promise<SessionUser | null> {
  try {
    const { user } = await api.get('/auth/me', { schema: sessionResponse });
    return user;
  } catch (e) {
    if (isApiError(e) && e.status === 401) return null;
    throw e;
  }
}

export const sessionQuery = queryOptions({
  queryKey: SESSION_KEY,
  queryFn: fetchSessionUser,
  staleTime: 5 * 60_000,
});

export const loadSessionUser = () => queryClient.ensureQueryData(sessionQuery);

export function setSessionUser(user: SessionUser | null) {
  queryClient.setQueryData(SESSION_KEY, user);
}

/**
 * The signed-in user. Only for screens behind the sign-in guard.
 *
 * Normally the live session from the cache (so a preference change shows at once). When the
 * signed-in area is being left — sign-out, or a 401 from an expired session — the cache says
 * "nobody" (null) first, so that the sign-in page's loader does not send the person straight
 * back, and the navigation to /sign-in then runs as a React transition: until it commits, the
 * layout and the screen stay mounted and are rendered again (the router's "loading" state, the
 * cache change). Those renders get the user the guard let in (the signed-in route's loader data),
 * never a throw, which in a concurrent render surfaces as React error #520.
 */
export function useCurrentUser(): SessionUser {
  const { data } = useQuery(sessionQuery);
  const admitted = useRouteLoaderData(SIGNED_IN_ROUTE_ID) as SessionUser | undefined;
  const user = data ?? admitted;
  if (!user) throw new Error('useCurrentUser used outside the signed-in area');
  return user;
}

export function useHasRole(...roles: Role[]): boolean {
  return roles.includes(useCurrentUser().role);
}

/** Unit formatters for the signed-in user's preferences. */
export function useUnits() {
  const user = useCurrentUser();
  return useMemo(
    () => unitFormatters({ lengthUnit: user.lengthUnit, temperatureUnit: user.temperatureUnit }),
    [user.lengthUnit, user.temperatureUnit],
  );
}

/**
 * PATCH /api/me: saves the signed-in user's display units. The choice shows at once (optimistic);
 * the server's answer then replaces it, or the old choice comes back when saving fails.
 */
export function useUpdatePreferences() {
  return useMutation({
    mutationFn: (prefs: UpdatePreferencesRequest) => api.patch('/me', prefs, { schema: sessionResponse }),
    onMutate: (prefs) => {
      const before = queryClient.getQueryData<SessionUser | null>(SESSION_KEY);
      if (before) setSessionUser({ ...before, ...prefs });
      return { before };
    },
    onError: (_e, _prefs, ctx) => {
      if (ctx?.before) setSessionUser(ctx.before);
    },
    onSuccess: ({ user }) => setSessionUser(user),
  });
}
