import { Link } from 'react-router-dom';
import type { ApprenticeSummaryDto } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { hoursText } from './chore-card';

/** Apprentices as cards: waiting and returned entries, skills signed off, hours in the last four weeks. */
export function ApprenticeList({ items }: { items: ApprenticeSummaryDto[] }) {
  if (items.length === 0) return <p className="rounded-xl border border-dashed border-grey-300 p-6 text-center text-grey-600">No apprentices yet. Invite one from the members' page.</p>;
  return (
    <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
      {items.map((a) => (
        <li key={a.id}>
          <Link to={`/mentorship/apprentices/${a.id}`} className="block min-h-11 space-y-2 rounded-xl border border-grey-200 bg-white p-4 hover:border-moss">
            <h3 className="font-bold text-bark">{a.name}</h3>
            <p className="text-sm text-grey-600">{a.farm?.name}{a.mentor ? ` · mentor ${a.mentor.name}` : ''}</p>
            <p className="flex flex-wrap gap-2">
              {a.waiting > 0 && <Badge tone="straw">{a.waiting} waiting</Badge>}
              {a.returned > 0 && <Badge tone="clay">{a.returned} returned</Badge>}
              <Badge tone="moss">{a.signedOff} of {a.skillCount} skills</Badge>
              <Badge>{hoursText(a.minutesLast28Days)} in 4 weeks</Badge>
            </p>
          </Link>
        </li>
      ))}
    </ul>
  );
}
