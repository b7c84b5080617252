import { isRouteErrorResponse, useRouteError } from 'react-router';
import { isApiError } from '../lib/api';
import { NotFound, ProblemPage } from './NotFound';

/** What a screen shows when its loader or render fails: a role refusal, a missing page, or a fault. */
export function RouteError() {
  const error = useRouteError();
  if (isRouteErrorResponse(error)) {
    if (error.status === 404) return <NotFound />;
    if (error.status === 403) {
      const message = (error.data as { message?: string } | undefined)?.message ?? 'Your role does not open this page.';
      return <ProblemPage code="403" title="Not for your role" text={message} />;
    }
    return <ProblemPage code={String(error.status)} title="This page could not load" text={error.statusText || 'Try again in a moment.'} />;
  }
  if (isApiError(error) && error.status === 403) {
    return <ProblemPage code="403" title="Not for your role" text={error.message} />;
  }
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  // Probably a new version was deployed while this tab was open; its old script files are gone.
  const stale = /dynamically imported module|Importing a module script failed/i.test(message);
  return (
    <ProblemPage
      code="Error"
      title={stale ? 'Spoolwright was updated' : 'This page could not load'}
      text={stale ? 'Reload the page to get the new version.' : message}
    />
  );
}

export { RouteError as Component };
