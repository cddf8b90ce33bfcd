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

/** What is missing, in the words the loader or the server used ("That litter was not found"). */
function missingTitle(error: unknown): string | undefined {
  if (isRouteErrorResponse(error) && typeof error.data === 'string' && error.data.trim()) return error.data;
  if (isApiError(error)) return error.message;
  return undefined;
}

export function RouteError({ standalone = false }: { standalone?: boolean }) {
  const error = useRouteError();

  // The session-lost handler is already on its way to sign-in; don't flash an error first.
  if (isApiError(error, ErrorCode.unauthenticated)) return <Navigate to="/sign-in" replace />;
  if (isNotFound(error)) return <NotFoundContent standalone={standalone} title={missingTitle(error)} />;

  const commons = (
    <LinkButton to="/" variant="secondary">
      Go to Commons
    </LinkButton>
  );
  // Reloading cannot change a refusal: say who can help instead.
  if (isApiError(error, ErrorCode.forbidden)) {
    return (
      <ProblemPage title="Not open to you" standalone={standalone} actions={commons}>
        <p>{error.message}</p>
        <p>If you need it for your work, ask your co-op's coordinator to change your role.</p>
      </ProblemPage>
    );
  }

  const offline = isApiError(error, 'network_error');
  const title = offline ? 'No connection' : isStaleChunk(error) ? 'Burrowline was updated' : 'This screen could not be shown';
  const message = offline
    ? "Burrowline could not be reached. Check the barn's Wi-Fi or your phone's signal, then try again; nothing you saved is lost."
    : isStaleChunk(error)
      ? 'A new version came out while this page was open. Load it to carry on.'
      : isApiError(error)
        ? (error as Error).message
        : "Trying again usually helps. If it keeps happening, tell your co-op's coordinator what you were doing.";

  return (
    <ProblemPage
      title={title}
      standalone={standalone}
      actions={
        <>
          <Button onClick={() => window.location.reload()}>{isStaleChunk(error) ? 'Load the new version' : 'Try again'}</Button>
          {commons}
        </>
      }
    >
      <p>{message}</p>
    </ProblemPage>
  );
}
