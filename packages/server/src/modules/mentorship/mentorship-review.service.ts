import { createHash } from 'node:crypto';
import type { Transaction } from 'sequelize';
import {
  defineAbilityFor, ErrorCode, RealtimeEvent, rooms, subjectOf,
  type AcceptManyInput, type ReviewDecisionInput, type ReviewItemDto, type ReviewItemKind, type ReviewQueueDto, type ReviewQueueQuery,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import type { SessionUser } from '../../lib/session-user';
import { recordChanges } from '../audit/audit.service';
import { reviewAnimalNoteIn, reviewWeighInIn, weighInFactsOf } from '../animals/weigh-ins.service';
import { reviewPalpationIn } from '../almanac/breeding.service';
import { reviewTaskIn } from '../almanac/tasks.service';
import { reviewLitterEventIn } from '../litters/litters.service';
import { notify } from '../notifications/notifications.service';
import { announceMentorship, presentChores } from './mentorship.service';
import { apprenticesOf, choreById, choresWhere, pendingOf, personOf, run, select, type ChoreRow, type QueueRow } from './mentorship-queries';
import { kindLabel, settingsOf } from './mentorship-settings';

const kindNames: Record<ReviewItemKind, string> = { chore: 'chore entry', palpation: 'palpation', 'weigh-in': 'weigh-in', note: 'note', 'litter-event': 'litter count', task: 'task tick' };

function refuseApprentice(actor: SessionUser) {
  if (actor.role === 'apprentice') throw new AppError(ErrorCode.forbidden, 403, 'Your mentor reviews your work');
}

/**
 * One queue of everything the actor's apprentices sent for review (the admin's: every apprentice of the
 * co-op, to read), oldest first, by apprentice and kind.
 */
export async function reviewQueue(actor: SessionUser, q: ReviewQueueQuery): Promise<ReviewQueueDto> {
  refuseApprentice(actor);
  return withTenant(actor, async (tx) => {
    const readsAll = defineAbilityFor(actor).can('read', subjectOf('ChoreLog', { coopId: actor.coopId, farmId: null, mentorId: null }));
    const apprentices = await apprenticesOf(tx, actor.coopId, readsAll ? null : actor.id);
    const ids = apprentices.map((a) => a.id).filter((id) => !q.apprenticeId || id === q.apprenticeId);
    const rows = ids.length > 0 ? await pendingOf(tx, actor.coopId, ids, { kind: q.kind }) : [];
    const settings = await settingsOf(tx, actor.coopId);
    const choreRows = await choresWhere(
      tx, 'c.coop_id = $1 AND (c.id = ANY($2::uuid[]) OR c.palpation_id = ANY($3::uuid[]))',
      [actor.coopId, rows.filter((r) => r.kind === 'chore').map((r) => r.id), rows.filter((r) => r.kind === 'palpation').map((r) => r.id)], '',
    );
    const presented = await presentChores(tx, actor.coopId, choreRows, settings);
    const chores = new Map([...presented.map((c) => [c.id, c] as const), ...presented.filter((c) => c.palpation).map((c) => [c.palpation!.palpationId, c] as const)]);
    const names = new Map(apprentices.map((a) => [a.id, a.name]));
    const items: ReviewItemDto[] = rows.map((r) => ({
      kind: r.kind,
      id: r.id,
      apprentice: { id: r.apprentice_id, name: names.get(r.apprentice_id) ?? 'Apprentice' },
      submittedAt: new Date(r.submitted_at).toISOString(),
      on: r.on,
      title: r.kind === 'chore' ? kindLabel(settings, r.title) : r.title,
      detail: r.detail,
      version: r.version,
      chore: chores.get(r.id) ?? null,
    }));
    return {
      items,
      apprentices: apprentices.map((a) => ({ id: a.id, name: a.name })),
      canReview: apprentices.some((a) => a.mentor_id === actor.id),
    };
  });
}

interface Decided {
  row: QueueRow;
  apprenticeId: string;
  title: string;
}

/**
 * Decides one item inside the transaction: the actor must be the apprentice's mentor. A chore entry's
 * weight, litter count or palpation is decided with it, so an accepted figure counts from this commit on.
 */
async function decideIn(tx: Transaction, actor: SessionUser, kind: ReviewItemKind, id: string, input: ReviewDecisionInput): Promise<Decided> {
  const [row] = await pendingAnyOf(tx, actor, kind, id);
  if (!row) throw AppError.notFound(`That ${kindNames[kind]}`);
  const apprentice = await personOf(tx, actor.coopId, row.apprentice_id);
  if (!apprentice || apprentice.role !== 'apprentice') throw AppError.notFound(`That ${kindNames[kind]}`);
  const ability = defineAbilityFor(actor);
  const record = { coopId: actor.coopId, farmId: row.farm_id, authorId: apprentice.id, mentorId: apprentice.mentor_id };
  // Another farm's apprentice is not the actor's to know of; a farm-mate's (or the admin reading) is refused.
  if (!ability.can('read', subjectOf('ChoreLog', record)) && row.farm_id !== actor.farmId) throw AppError.notFound(`That ${kindNames[kind]}`);
  if (!ability.can('review', subjectOf('ChoreLog', record))) {
    throw new AppError(ErrorCode.forbidden, 403, `Only ${apprentice.name}'s mentor reviews her work`);
  }
  const decision = { decision: input.decision, comment: input.comment || undefined };
  let title = row.title;
  if (kind === 'chore') {
    const entry = (await choreById(tx, actor.coopId, id, true))!;
    if (entry.review_state !== 'pending') throw new AppError(ErrorCode.conflict, 409, 'That entry was already reviewed');
    await decideChoreIn(tx, actor, entry, input);
    title = kindLabel(await settingsOf(tx, actor.coopId), entry.kind);
  } else if (kind === 'palpation') {
    const [carrier] = await select<{ id: string }>(tx, 'SELECT id FROM chore_entries WHERE coop_id = $1 AND palpation_id = $2', [actor.coopId, id]);
    const entry = (await choreById(tx, actor.coopId, carrier!.id, true))!;
    if (entry.review_state !== 'pending') throw new AppError(ErrorCode.conflict, 409, 'That palpation was already reviewed');
    await decideChoreIn(tx, actor, entry, input);
  } else if (kind === 'weigh-in') {
    const w = (await weighInFactsOf(tx, actor.coopId, [id])).get(id);
    await reviewWeighInIn(tx, actor, id, { ...decision, version: row.version });
    if (w?.groupId) {
      const farmId = row.farm_id;
      tx.afterCommit(() => publish(rooms.farm(farmId), RealtimeEvent.growOutChanged, { farmId, groupId: w.groupId }));
    }
  } else if (kind === 'note') {
    await reviewAnimalNoteIn(tx, actor, id, { ...decision, version: row.version });
  } else if (kind === 'litter-event') {
    await reviewLitterEventIn(tx, actor, id, { ...decision, version: row.version });
  } else {
    await reviewTaskIn(tx, actor, id, { ...decision, version: row.version });
  }
  announceMentorship(tx, apprentice.id, apprentice.mentor_id, 'reviewed');
  return { row, apprenticeId: apprentice.id, title };
}

/**
 * A chore entry decided with the figure it carries (weight, litter count, palpation): accepted, the figure
 * counts from this commit on; returned, it stays out and the apprentice corrects the entry.
 */
async function decideChoreIn(tx: Transaction, actor: SessionUser, entry: ChoreRow, input: ReviewDecisionInput) {
  const decision = { decision: input.decision, comment: input.comment || undefined };
  if (entry.weigh_in_id) {
    const w = (await weighInFactsOf(tx, actor.coopId, [entry.weigh_in_id])).get(entry.weigh_in_id);
    if (w?.reviewState === 'pending') await reviewWeighInIn(tx, actor, entry.weigh_in_id, { ...decision, version: w.version });
    if (w?.groupId) {
      const farmId = entry.farm_id;
      tx.afterCommit(() => publish(rooms.farm(farmId), RealtimeEvent.growOutChanged, { farmId, groupId: w.groupId }));
    }
  }
  if (entry.litter_event_id && entry.litter_event_version !== null) {
    await reviewLitterEventIn(tx, actor, entry.litter_event_id, { ...decision, version: entry.litter_event_version });
  }
  if (entry.palpation_id) await reviewPalpationIn(tx, actor, entry.palpation_id, decision);
  await run(
    tx,
    `UPDATE chore_entries SET review_state = $3, reviewed_by = $4, reviewed_at = now(), review_comment = $5, version = version + 1, updated_at = now()
      WHERE id = $1 AND coop_id = $2`,
    [entry.id, actor.coopId, input.decision, actor.id, input.comment || null],
  );
  await recordChanges({ coopId: actor.coopId, tableName: 'chore_entries', recordId: entry.id, actorUserId: actor.id, changes: { reviewState: ['pending', input.decision] } }, tx);
}

/** The pending item among all the co-op's apprentices' (whoever's it is; `decideIn` checks the mentor). */
async function pendingAnyOf(tx: Transaction, actor: SessionUser, kind: ReviewItemKind, id: string): Promise<QueueRow[]> {
  const everyone = (await apprenticesOf(tx, actor.coopId, null)).map((a) => a.id);
  const rows = await pendingOf(tx, actor.coopId, everyone, { kind, id });
  if (rows.length > 0 || (kind !== 'chore' && kind !== 'palpation')) return rows;
  // A chore entry (or the palpation it carries) already decided is a conflict, not a stranger.
  const [carrier] = kind === 'palpation' ? await select<{ id: string }>(tx, 'SELECT id FROM chore_entries WHERE coop_id = $1 AND palpation_id = $2', [actor.coopId, id]) : [{ id }];
  const entry = carrier ? await choreById(tx, actor.coopId, carrier.id) : null;
  if (entry && entry.review_state !== 'pending' && everyone.includes(entry.apprentice_id)) {
    const record = { coopId: actor.coopId, farmId: entry.farm_id, authorId: entry.apprentice_id, mentorId: entry.mentor_id };
    if (defineAbilityFor(actor).can('review', subjectOf('ChoreLog', record))) throw new AppError(ErrorCode.conflict, 409, 'That entry was already reviewed');
  }
  return rows;
}

async function tellApprentice(tx: Transaction, actor: SessionUser, d: Decided, input: ReviewDecisionInput) {
  const returned = input.decision === 'returned';
  await notify(tx, {
    coopId: actor.coopId,
    userIds: [d.apprenticeId],
    exceptUserId: actor.id,
    kind: 'mentor.entry-reviewed',
    title: returned
      ? `${actor.name} returned your ${d.title.toLowerCase()} of ${d.row.on}: ${input.comment}`.slice(0, 300)
      : `${actor.name} accepted your ${d.title.toLowerCase()} of ${d.row.on}`,
    link: returned ? '/mentorship/log?state=returned' : '/mentorship/log',
    mail: returned
      ? { subject: `${actor.name} returned an entry for you to correct`, text: `${actor.name} returned your ${d.title.toLowerCase()} of ${d.row.on}:\n\n${input.comment}\n\nCorrect it and send it again in Mentorship.` }
      : { subject: `${actor.name} accepted your entry`, text: `${actor.name} accepted your ${d.title.toLowerCase()} of ${d.row.on}.` },
    key: `review:${d.row.kind}:${d.row.id}:${d.row.version}`,
  });
}

/** The mentor accepts one item, or returns it with a comment; the apprentice is told at once. */
export async function decideReviewItem(actor: SessionUser, kind: ReviewItemKind, id: string, input: ReviewDecisionInput): Promise<{ kind: ReviewItemKind; id: string; decision: string }> {
  refuseApprentice(actor);
  return withTenant(actor, async (tx) => {
    const decided = await decideIn(tx, actor, kind, id, input);
    await tellApprentice(tx, actor, decided, input);
    return { kind, id, decision: input.decision };
  });
}

/** Accepts many items at once, all or none; each apprentice is told once. */
export async function acceptMany(actor: SessionUser, input: AcceptManyInput): Promise<{ accepted: number }> {
  refuseApprentice(actor);
  return withTenant(actor, async (tx) => {
    const byApprentice = new Map<string, Decided[]>();
    const seen = new Set<string>();
    for (const item of input.items) {
      if (seen.has(`${item.kind}:${item.id}`)) continue;
      seen.add(`${item.kind}:${item.id}`);
      const d = await decideIn(tx, actor, item.kind, item.id, { decision: 'accepted', comment: '' });
      byApprentice.set(d.apprenticeId, [...(byApprentice.get(d.apprenticeId) ?? []), d]);
    }
    for (const [apprenticeId, decided] of byApprentice) {
      if (decided.length === 1) {
        await tellApprentice(tx, actor, decided[0]!, { decision: 'accepted', comment: '' });
        continue;
      }
      const key = createHash('sha256').update(decided.map((d) => `${d.row.kind}:${d.row.id}:${d.row.version}`).sort().join(',')).digest('hex');
      await notify(tx, {
        coopId: actor.coopId, userIds: [apprenticeId], exceptUserId: actor.id, kind: 'mentor.entry-reviewed',
        title: `${actor.name} accepted ${decided.length} of your entries`, link: '/mentorship/log',
        mail: { subject: `${actor.name} accepted ${decided.length} of your entries`, text: decided.map((d) => `${d.title} of ${d.row.on}`).join('\n') },
        key: `review-many:${key}`,
      });
    }
    return { accepted: seen.size };
  });
}
