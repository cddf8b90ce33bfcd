import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { LinkButton } from '../../components/ui/link-button';
import { isApiError } from '../../lib/api-client';
import { ProblemPage } from '../errors/problem-page';
import { RouteError } from '../errors/route-error';

/** A missing application or member names what is missing; anything else is the usual error screen. */
export function AdminRouteError() {
  const error = useRouteError();
  const notFound = (isRouteErrorResponse(error) && error.status === 404) || (isApiError(error) && error.status === 404);
  if (!notFound) return <RouteError />;
  const what = isRouteErrorResponse(error) && typeof error.data === 'string' ? error.data : isApiError(error) ? error.message : 'That page was not found';
  return (
    <ProblemPage title={what} actions={<LinkButton to="/admin/applications" variant="primary">Back to the admin pages</LinkButton>}>
      <p>The link may be mistyped, or the application or member was removed.</p>
    </ProblemPage>
  );
}
