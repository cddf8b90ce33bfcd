import { HeartHandshake } from 'lucide-react';
import { Card } from '../../../components/ui/card';
import { LinkButton } from '../../../components/ui/link-button';
import { useSession } from '../../../lib/session';
import { useLoans } from '../api/get-loans';
import { sideOf, stateText } from '../stud-share-labels';

/**
 * Stud Share on the Co-op hub: the next thing the person's farm has to do about a loan (answer a
 * request, confirm a hand-over, a buck due home), or what is under way.
 */
export function StudShareSummary() {
  const me = useSession();
  const farmId = me.user.farmId;
  const asked = useLoans({ side: 'offers', open: true, pageSize: 50 }, Boolean(farmId));
  const mine = useLoans({ side: 'requests', open: true, pageSize: 50 }, Boolean(farmId));
  const open = [...(asked.data?.items ?? []), ...(mine.data?.items ?? [])];
  const todo = open.filter((l) => l.actions.length > 0 || l.overdue).sort((a, b) => Number(b.overdue) - Number(a.overdue) || a.startOn.localeCompare(b.startOn));
  const next = todo[0] ?? open[0];
  const buckName = (l: (typeof open)[number]) => l.buck.name || l.buck.tattoo;
  return (
    <Card className="space-y-3" data-testid="stud-share-summary">
      <div className="flex items-center gap-2">
        <HeartHandshake className="size-6 text-moss" aria-hidden="true" />
        <h2 className="text-xl font-bold">Stud Share</h2>
      </div>
      {asked.isPending && mine.isPending && farmId ? (
        <p className="text-grey-600">Reading your loans…</p>
      ) : next ? (
        <div className="space-y-1">
          <p className="font-semibold">
            {next.overdue ? `${buckName(next)} is overdue home` : `${buckName(next)}: ${stateText(next.state, sideOf(next, farmId), next.kind).toLowerCase()}`}
          </p>
          <p className="text-sm text-grey-600">
            {todo.length > 1 ? `${todo.length} loans need you.` : todo.length === 1 ? 'One loan needs you.' : `${open.length} loan${open.length === 1 ? '' : 's'} under way.`}
          </p>
          <LinkButton to={`/stud-share/loans/${next.id}`} variant="primary" className="mt-2">
            Open it
          </LinkButton>
        </div>
      ) : (
        <p className="text-grey-600">No loans under way. Find a buck for one of your does, or offer one of yours.</p>
      )}
      <LinkButton to="/stud-share" variant="secondary">
        Buck cards
      </LinkButton>
    </Card>
  );
}
