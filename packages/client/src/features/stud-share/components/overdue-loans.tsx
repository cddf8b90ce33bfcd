import { Alert } from '../../../components/ui/alert';
import { TextLink } from '../../../components/ui/text-link';
import { formatDate } from '../../../lib/days';
import { useSession } from '../../../lib/session';
import { useLoans } from '../api/get-loans';
import { sideOf } from '../stud-share-labels';

/** On Commons and the Almanac: a buck past his loan's last day, seen by both farms until his return is recorded. */
export function OverdueLoans() {
  const me = useSession();
  const enabled = Boolean(me.user.farmId);
  const lent = useLoans({ side: 'offers', state: 'handed_over', pageSize: 50 }, enabled);
  const borrowed = useLoans({ side: 'requests', state: 'handed_over', pageSize: 50 }, enabled);
  const overdue = [...(lent.data?.items ?? []), ...(borrowed.data?.items ?? [])].filter((l) => l.overdue);
  if (overdue.length === 0) return null;
  return (
    <Alert tone="error" title={overdue.length === 1 ? 'A stud loan is overdue' : `${overdue.length} stud loans are overdue`}>
      <ul className="space-y-1">
        {overdue.map((l) => {
          const buck = l.buck.name || l.buck.tattoo;
          const text = sideOf(l, me.user.farmId) === 'owner' ? `${buck} was due home from ${l.requestingFarm.name} on ${formatDate(l.endOn)}` : `${buck} was due back at ${l.owningFarm.name} on ${formatDate(l.endOn)}`;
          return (
            <li key={l.id}>
              <TextLink to={`/stud-share/loans/${l.id}`}>{text}</TextLink>
            </li>
          );
        })}
      </ul>
    </Alert>
  );
}
