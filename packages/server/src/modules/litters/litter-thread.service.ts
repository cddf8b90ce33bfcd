import type { SessionUser } from '../../lib/session-user';
import { subjectFromRows } from '../chat/chat-subjects.service';
import { ensureCan } from '../farms/farm-access';

interface LitterRow {
  id: string;
  farm_id: string;
  kindled_on: string;
  dam_name: string;
}

const littersSql = (ids: string) =>
  `SELECT l.id, l.farm_id, l.kindled_on::text AS kindled_on, coalesce(nullif(a.name, ''), a.tattoo, 'the doe') AS dam_name
     FROM litters l LEFT JOIN animals a ON a.id = l.dam_id
    WHERE l.id = ANY(${ids})`;

function mayReadLitter(actor: SessionUser, farmId: string): boolean {
  try {
    ensureCan(actor, 'read', 'Litter', { farmId }, 'That litter');
    return true;
  } catch {
    return false;
  }
}

/** A litter's thread: only its farm's people talk about it (a litter is farm-private). */
export const litterThreadSubject = subjectFromRows<LitterRow>({
  rowsSql: littersSql,
  mayRead: (actor, litter) => mayReadLitter(actor, litter.farm_id),
  participants: (_tx, litter) => ({ farmIds: [litter.farm_id], userIds: [] }),
  title: (litter) => (litter ? `Litter of ${litter.dam_name}, kindled ${litter.kindled_on}` : 'A litter'),
  link: (subjectId) => `/litters/${subjectId}`,
});
