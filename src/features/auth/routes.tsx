/** Route module for /sign-in (lazy-loaded by the router). */
import { redirect, type LoaderFunctionArgs } from 'react-router';
import { safeNext } from '../../lib/api';
import { loadSessionUser } from '../../lib/session';
import { SignInPage } from './SignInPage';

/** Already signed in: go straight on. */
export async function loader({ request }: LoaderFunctionArgs) {
  const user = await loadSessionUser();
  if (user) throw redirect(safeNext(new URL(request.url).searchParams.get('next')));
  return null;
}

export { SignInPage as Component };
