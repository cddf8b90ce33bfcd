import { randomUUID } from 'node:crypto';
import { choreEntrySchema } from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { decideReviewItem } from '../../packages/server/src/modules/mentorship/mentorship-review.service';
import { logChore } from '../../packages/server/src/modules/mentorship/mentorship.service';
import { breedingPair, daysAgo, farmToday, serviceAs } from './almanac';
import { asTenant } from './db';
import type { TestCoop } from './factories';
import { actorOf } from './herd';

/**
 * Mentorship objects, fresh for every cell that may change them: the apprentice's pending or returned chore
 * entry, her pending palpation of a doe of her mentor's (its id stands in for the entry's), the apprentice.
 */
export interface MentorshipIds {
  choreId?: string;
  kind?: string;
  apprenticeId?: string;
  skillKey?: string;
}

export async function mentorshipTarget(coop: TestCoop, target: string): Promise<MentorshipIds> {
  if (target === 'apprenticeA') return { apprenticeId: coop.apprentice.id, skillKey: 'handling' };
  if (target === 'palpationChoreA') {
    connectDatabase(process.env.DATABASE_URL!);
    const { doe, buck } = await breedingPair(coop.member, { doe: `Matrix doe ${randomUUID().slice(0, 6)}` });
    await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(12) });
    const entry = await logChore(actorOf(coop.apprentice), choreEntrySchema.parse({ kind: 'palpation', minutes: 5, animalId: doe.id, palpation: { result: 'negative' } }));
    return { choreId: entry.palpation!.palpationId, kind: 'palpation', apprenticeId: coop.apprentice.id };
  }
  if (target !== 'choreA' && target !== 'returnedChoreA') return {};
  connectDatabase(process.env.DATABASE_URL!);
  const entry = await logChore(actorOf(coop.apprentice), choreEntrySchema.parse({ kind: 'feeding', minutes: 15, notes: `Matrix ${randomUUID().slice(0, 6)}` }));
  if (target === 'returnedChoreA') {
    await decideReviewItem(actorOf(coop.member), 'chore', entry.id, { decision: 'returned', comment: 'Checked by the authorization matrix' });
  }
  return { choreId: entry.id, kind: 'chore', apprenticeId: coop.apprentice.id };
}

export async function mentorshipBody(body: string | undefined, ids: MentorshipIds, personaCoopId: string): Promise<object | undefined> {
  switch (body) {
    case 'chore':
      return { kind: 'watering', minutes: 5 };
    case 'choreResubmit': {
      const row = ids.choreId ? (await asTenant(personaCoopId, (c) => c.query('SELECT version FROM chore_entries WHERE id = $1', [ids.choreId]))).rows[0] : null;
      return { doneOn: farmToday(), minutes: 20, notes: 'Corrected', version: row?.version ?? 1 };
    }
    case 'reviewAccept':
      return { decision: 'accepted' };
    case 'acceptMany':
      return { items: [{ kind: ids.kind ?? 'chore', id: ids.choreId }] };
    case 'skillMark':
      return { state: 'practising', comment: 'Checked by the authorization matrix' };
    case 'mentorshipSettings': {
      const res = await asTenant(personaCoopId, (c) => c.query('SELECT version FROM mentorship_settings WHERE coop_id = $1', [personaCoopId]));
      return {
        choreKinds: [{ key: 'feeding', label: 'Feeding' }, { key: 'watering', label: 'Watering' }, { key: 'palpation', label: 'Palpation' }],
        skills: [{ key: 'handling', name: 'Handling and carrying', area: 'Care', signedOffMeans: 'Carries a rabbit safely', dangerous: false }],
        requireDangerousSignOff: true,
        version: res.rows[0]?.version ?? 0,
      };
    }
    default:
      return undefined;
  }
}

/** What a refused mentorship call must leave as it was: entries and their states, skill marks, the settings. */
export async function mentorshipStateOf(coopId: string) {
  return asTenant(coopId, async (c) => ({
    chores: (await c.query(`SELECT string_agg(id || '=' || review_state || '/' || version, ',' ORDER BY id) AS s FROM chore_entries`)).rows[0].s,
    palpations: (await c.query(`SELECT string_agg(id || '=' || review_state || '/' || version, ',' ORDER BY id) AS s FROM palpations`)).rows[0].s,
    marks: (await c.query('SELECT count(*)::int AS n FROM skill_events')).rows[0].n,
    settings: (await c.query('SELECT version FROM mentorship_settings')).rows[0]?.version ?? 0,
  }));
}
