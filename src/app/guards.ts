import { data, redirect, type LoaderFunctionArgs } from 'react-router';
import type { SessionUser } from '../contracts/auth';
import { signInHref } from '../lib/api';
import { loadSessionUser } from '../lib/session';
import { canOpen, screen, type ScreenId } from './screens';

function here(request: Request): string {
  const url = new URL(request.url);
  return `${url.pathname}${url.search}${url.hash}`;
}

/** Loader of the signed-in area: nobody signed in → the sign-in page, remembering where they were. */
export async function requireSignedIn({ request }: LoaderFunctionArgs): Promise<SessionUser> {
  const user = await loadSessionUser();
  if (!user) throw redirect(signInHref(here(request)));
  return user;
}

/** Loader of one screen: the role must be among the screen's roles, else a 403 page. */
export function requireScreen(id: ScreenId) {
  return async (args: LoaderFunctionArgs) => {
    const user = await requireSignedIn(args);
    if (!canOpen(user.role, id)) {
      throw data({ message: `${screen(id).label} is not part of your role's work.` }, { status: 403 });
    }
    return null;
  };
}
