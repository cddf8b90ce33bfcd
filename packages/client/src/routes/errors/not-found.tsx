import { LinkButton } from '../../components/ui/link-button';
import { ProblemPage } from './problem-page';

export function NotFoundContent({ standalone = false, what = 'page' }: { standalone?: boolean; what?: string }) {
  return (
    <ProblemPage
      title={`No such ${what}`}
      standalone={standalone}
      actions={
        <LinkButton to="/" variant="primary">
          Go to Commons
        </LinkButton>
      }
    >
      <p>There is nothing at this address. The link may be mistyped, or what it pointed to has moved.</p>
    </ProblemPage>
  );
}

/** The catch-all route for addresses the app does not know. */
export function NotFoundPage() {
  return <NotFoundContent standalone />;
}
