import { isRouteErrorResponse, Navigate, useRouteError } from 'react-router-dom';
import { ErrorCode } from '@burrowline/shared';
import { Button } from '../../components/ui/button';
import { LinkButton } from '../../components/ui/link-button';
import { isApiError } from '../../lib/api-client';
import { NotFoundContent } from './not-found';
import { ProblemPage } from './problem-page';

function isNotFound(error: unknown): boolean {
  return (isRouteErrorResponse(error) && error.status === 404) || (isApiError(error) && error.status === 404);
}

/** A code-split chunk from a previous release is gone after a deploy; a reload fetches the new one. */
function isStaleChunk(error: unknown): boolean {
  return error instanceof TypeError && /dynamically imported module|Importing a module script failed/i.test(error.message);
}

export function RouteError({ standalone = false }: { standalone?: boolean }) {
  const error = useRouteError();

  // The session-lost handler is already on its way to sign-in; don't flash an error first.
  if (isApiError(error, ErrorCode.unauthenticated)) return <Navigate to="/sign-in" replace />;
  if (isNotFound(error)) return <NotFoundContent standalone={standalone} what={standalone ? 'page' : 'farm'} />;

  const forbidden = isApiError(error, ErrorCode.forbidden);
  const offline = isApiError(error, 'network_error');
  const title = forbidden ? 'Not yours to see' : offline ? 'No connection' : 'Something went wrong';
  const message = forbidden
    ? 'This belongs to another farm or needs a role you do not have.'
    : offline || isApiError(error)
      ? (error as Error).message
      : isStaleChunk(error)
        ? 'Burrowline was updated while this page was open. Reload to get the new version.'
        : 'This screen could not be shown. Reloading usually helps; if it keeps happening, tell your co-op coordinator.';

  return (
    <ProblemPage
      title={title}
      standalone={standalone}
      actions={
        <>
          <Button onClick={() => window.location.reload()}>Reload</Button>
          <LinkButton to="/">Go to Commons</LinkButton>
        </>
      }
    >
      <p>{message}</p>
    </ProblemPage>
  );
}
