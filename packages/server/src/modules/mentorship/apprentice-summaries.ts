import type { Transaction } from 'sequelize';
import type { ApprenticeSummaryDto } from '@burrowline/shared';
import { apprenticesOf, pendingOf, select, skillEventsOf, type PersonRow } from './mentorship-queries';
import type { Settings } from './mentorship-settings';

/** Each skill's current state for each apprentice: the latest mark wins. */
export function latestStates(events: { apprentice_id: string; skill_key: string; state: string }[]): Map<string, Map<string, string>> {
  const out = new Map<string, Map<string, string>>();
  for (const e of events) {
    const m = out.get(e.apprentice_id) ?? new Map<string, string>();
    m.set(e.skill_key, e.state);
    out.set(e.apprentice_id, m);
  }
  return out;
}

/** Summaries of apprentices (one mentor's, or the co-op's for `mentorId` null), a few queries for all of them. */
export async function apprenticeSummariesOf(
  tx: Transaction, coopId: string, mentorId: string | null, settings: Settings, only?: PersonRow[], knownEvents?: Awaited<ReturnType<typeof skillEventsOf>>,
): Promise<ApprenticeSummaryDto[]> {
  const people = only ?? (await apprenticesOf(tx, coopId, mentorId));
  const ids = people.map((p) => p.id);
  if (ids.length === 0) return [];
  // One after another: the queries share the transaction's one connection.
  const since = new Date(Date.now() - 28 * 86_400_000).toISOString().slice(0, 10);
  const pending = await pendingOf(tx, coopId, ids);
  // What came back and the hours of the last four weeks, in one pass over the entries.
  const figures = await select<{ apprentice_id: string; returned: number; minutes: number }>(
    tx,
    `SELECT apprentice_id, count(*) FILTER (WHERE review_state = 'returned')::int AS returned,
            coalesce(sum(minutes) FILTER (WHERE review_state = 'accepted' AND date_trunc('week', done_on)::date >= $3::date), 0)::int AS minutes
       FROM chore_entries WHERE coop_id = $1 AND apprentice_id = ANY($2::uuid[]) AND deleted_at IS NULL GROUP BY apprentice_id`,
    [coopId, ids, since],
  );
  // An apprentice's page has read her skill marks already.
  const events = knownEvents ?? (await skillEventsOf(tx, coopId, ids));
  const states = latestStates(events);
  const keys = new Set(settings.skills.map((s) => s.key));
  return people.map((p) => ({
    id: p.id,
    name: p.name,
    farm: p.farm_id ? { id: p.farm_id, name: p.farm_name ?? 'Farm' } : null,
    mentor: p.mentor_id ? { id: p.mentor_id, name: p.mentor_name ?? 'Mentor' } : null,
    waiting: pending.filter((q) => q.apprentice_id === p.id).length,
    returned: figures.find((f) => f.apprentice_id === p.id)?.returned ?? 0,
    signedOff: [...(states.get(p.id) ?? new Map<string, string>()).entries()].filter(([k, v]) => keys.has(k) && v === 'signed-off').length,
    skillCount: settings.skills.length,
    minutesLast28Days: figures.find((f) => f.apprentice_id === p.id)?.minutes ?? 0,
  }));
}
