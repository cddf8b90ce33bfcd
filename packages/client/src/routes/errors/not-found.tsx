import { useLocation } from 'react-router-dom';
import { LinkButton } from '../../components/ui/link-button';
import { ProblemPage } from './problem-page';

/** The area an address belongs to, so a missing record sends the breeder back to its list. */
const areas: { prefix: string; to: string; label: string }[] = [
  { prefix: '/herd', to: '/herd', label: 'Back to the Herd' },
  { prefix: '/almanac', to: '/almanac', label: 'Back to the Almanac' },
  { prefix: '/litters', to: '/litters', label: 'Back to the litters' },
  { prefix: '/grow-out', to: '/grow-out', label: 'Back to Grow-out' },
  { prefix: '/admin', to: '/admin/applications', label: 'Back to the admin pages' },
];

/**
 * Something the address names is not there for this person: it may be mistyped, removed, or another
 * farm's (which is never told apart, so another farm's records stay private).
 */
export function NotFoundContent({ standalone = false, title = 'That page was not found' }: { standalone?: boolean; title?: string }) {
  const { pathname } = useLocation();
  const area = standalone ? undefined : areas.find((a) => pathname.startsWith(a.prefix));
  return (
    <ProblemPage
      title={title}
      standalone={standalone}
      actions={
        <>
          {area && (
            <LinkButton to={area.to} variant="primary">
              {area.label}
            </LinkButton>
          )}
          <LinkButton to="/" variant={area ? 'secondary' : 'primary'}>
            Go to Commons
          </LinkButton>
        </>
      }
    >
      <p>
        The link may be mistyped, or what it pointed to was removed. Records of another farm stay with that farm: if
        you were sent this link, ask its sender to share the record another way.
      </p>
    </ProblemPage>
  );
}

/** The catch-all route for addresses the app does not know. */
export function NotFoundPage() {
  return <NotFoundContent standalone />;
}
