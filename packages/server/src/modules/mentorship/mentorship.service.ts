import { randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import {
  defineAbilityFor, ErrorCode, RealtimeEvent, rooms, subjectOf,
  type ChoreEntryDto, type ChoreEntryInput, type ChoreLogDto, type ChoreLogQuery, type ChoreResubmitInput, type MentorshipHomeDto,
  type MentorshipSettingsDto, type MentorshipSettingsInput, type PhotoDto,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { forgetInTransaction } from '../../db/transaction-memo';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import type { SessionUser } from '../../lib/session-user';
import { animalAccess } from '../animals/animal-facts.service';
import { createWeighInIn } from '../animals/weigh-ins.service';
import { recordPendingPalpationIn } from '../almanac/breeding.service';
import { ensureCan } from '../farms/farm-access';
import { farmTodayOf } from '../farms/farm-clock';
import { groupOfFarm } from '../grow-out/grow-out-facts.service';
import { weighGroupIn } from '../grow-out/grow-out.service';
import { litterFactsOf } from '../litters/litter-facts.service';
import { recordLitterEventIn } from '../litters/litters.service';
import { notify } from '../notifications/notifications.service';
import { addChorePhotos, chorePhotoIdsOf, type PhotoLimits, type UploadedFile } from '../photos/photos.service';
import { apprenticeSummariesOf } from './apprentice-summaries';
import { choreById, choresWhere, pendingOf, run, select, type ChoreRow } from './mentorship-queries';
import { presentChore, weeksOf } from './mentorship.presenter';
import { kindLabel, presentSettings, settingsOf, type Settings } from './mentorship-settings';

/** Tells the apprentice's and the mentor's screens that her log changed (after commit; a hint to refetch). */
export function announceMentorship(tx: Transaction, apprenticeId: string, mentorId: string | null, what: 'submitted' | 'reviewed' | 'skill') {
  tx.afterCommit(() => {
    for (const userId of new Set([apprenticeId, mentorId].filter((id): id is string => Boolean(id)))) {
      publish(rooms.user(userId), RealtimeEvent.mentorshipChanged, { apprenticeId, what });
    }
  });
}

export async function presentChores(tx: Transaction, coopId: string, rows: ChoreRow[], settings?: Settings): Promise<ChoreEntryDto[]> {
  const s = settings ?? (await settingsOf(tx, coopId));
  const photos = await chorePhotoIdsOf(tx, coopId, rows.map((r) => r.id));
  return rows.map((r) => presentChore(r, s, photos));
}

function apprenticeFarmOf(actor: SessionUser): string {
  if (actor.role !== 'apprentice' || !actor.farmId) throw new AppError(ErrorCode.forbidden, 403, 'Only an apprentice logs chores for review');
  return actor.farmId;
}

/** What the entry is about, checked against the mentor's farm: the animal kept there, its litter, its group. */
async function checkTargets(tx: Transaction, actor: SessionUser, farmId: string, input: { animalId?: string; litterId?: string; groupId?: string }) {
  if (input.animalId) {
    const access = await animalAccess(actor, input.animalId, tx);
    if (!access || !access.canRead) throw AppError.validation({ animalId: ['Choose an animal of your mentor\'s farm'] });
    if (access.keepingFarmId !== farmId) throw AppError.validation({ animalId: ['That animal is not kept on your mentor\'s farm'] });
  }
  if (input.litterId) {
    const litter = (await litterFactsOf(tx, actor.coopId, [input.litterId])).get(input.litterId);
    if (!litter || litter.farmId !== farmId) throw AppError.validation({ litterId: ['Choose a litter of your mentor\'s farm'] });
  }
  if (input.groupId) {
    const group = await groupOfFarm(tx, actor.coopId, farmId, input.groupId);
    if (!group) throw AppError.validation({ groupId: ['Choose a grow-out group of your mentor\'s farm'] });
  }
}

/** Writes the figure a chore carries into its own record (pending review); answers the record's ids. */
async function recordFigures(
  tx: Transaction, actor: SessionUser, target: { animalId?: string | null; litterId?: string | null; groupId?: string | null }, doneOn: string, notes: string,
  input: Pick<ChoreEntryInput, 'weighing' | 'litterCount' | 'palpation'>,
): Promise<{ weighInId: string | null; litterEventId: string | null; palpationId: string | null }> {
  let weighInId: string | null = null;
  let litterEventId: string | null = null;
  let palpationId: string | null = null;
  const note = notes.slice(0, 500);
  if (input.weighing && target.animalId) {
    weighInId = randomUUID();
    await createWeighInIn(tx, actor, { id: weighInId, animalId: target.animalId, totalGrams: input.weighing.totalGrams, headCount: 1, weighedOn: doneOn, note });
  } else if (input.weighing && target.groupId) {
    weighInId = randomUUID();
    await weighGroupIn(tx, actor, target.groupId, { id: weighInId, weighedOn: doneOn, totalGrams: input.weighing.totalGrams, headCount: input.weighing.headCount, note });
  } else if (input.weighing) {
    throw AppError.validation({ weighing: ['Weigh an animal or a group'] });
  }
  if (input.litterCount && target.litterId) {
    litterEventId = randomUUID();
    await recordLitterEventIn(tx, actor, target.litterId, { id: litterEventId, kind: input.litterCount.kind, on: doneOn, count: input.litterCount.count, cause: input.litterCount.cause });
  } else if (input.litterCount) {
    throw AppError.validation({ litterCount: ['Choose the litter'] });
  }
  if (input.palpation && target.animalId) {
    palpationId = await recordPendingPalpationIn(tx, actor, { farmId: actor.farmId!, doeId: target.animalId, palpatedOn: doneOn, result: input.palpation.result, notes: note });
  } else if (input.palpation) {
    throw AppError.validation({ palpation: ['Choose the doe you palpated'] });
  }
  return { weighInId, litterEventId, palpationId };
}

async function tellMentor(tx: Transaction, actor: SessionUser, entry: { id: string; kind: string; version: number; doneOn: string }, settings: Settings, again: boolean) {
  if (!actor.mentorId) return;
  const label = kindLabel(settings, entry.kind);
  await notify(tx, {
    coopId: actor.coopId,
    userIds: [actor.mentorId],
    exceptUserId: actor.id,
    kind: 'mentor.entry-submitted',
    title: `${actor.name} ${again ? 'corrected' : 'logged'} ${label.toLowerCase()} on ${entry.doneOn} for your review`,
    link: `/mentorship/review?apprenticeId=${actor.id}`,
    mail: {
      subject: `${actor.name} ${again ? 'sent a corrected entry' : 'logged a chore'} for your review`,
      text: `${actor.name} ${again ? 'corrected' : 'logged'} ${label.toLowerCase()} on ${entry.doneOn}. Accept it or return it with a comment in Mentorship.`,
    },
    key: `chore:${entry.id}:submitted:${entry.version}`,
  });
  announceMentorship(tx, actor.id, actor.mentorId, 'submitted');
}

/**
 * The apprentice logs a chore on her mentor's farm: dated the farm's today unless she says, about the
 * mentor's animal, litter or group; a weight, a litter count or a palpation goes into its own record, pending
 * like the entry, so it counts only once the mentor accepts it. The mentor is told.
 */
export async function logChore(actor: SessionUser, input: ChoreEntryInput): Promise<ChoreEntryDto> {
  const farmId = apprenticeFarmOf(actor);
  return withTenant(actor, async (tx) => {
    ensureCan(actor, 'create', 'ChoreLog', { farmId, authorId: actor.id }, 'That farm', 'Only an apprentice logs chores for review');
    if (input.id) {
      const existing = await choreById(tx, actor.coopId, input.id);
      if (existing && existing.apprentice_id === actor.id) return (await presentChores(tx, actor.coopId, [existing]))[0]!;
      const [taken] = await select<{ id: string }>(tx, 'SELECT id FROM chore_entries WHERE id = $1', [input.id]);
      if (existing || taken) throw AppError.idTaken();
    }
    const settings = await settingsOf(tx, actor.coopId);
    if (!settings.choreKinds.some((k) => k.key === input.kind)) throw AppError.validation({ kind: ['Choose a chore from the co-op\'s list'] });
    const today = await farmTodayOf(tx, actor.coopId, farmId);
    const doneOn = input.doneOn ?? today;
    if (doneOn > today) throw AppError.validation({ doneOn: ['A chore cannot be dated after today on the farm'] });
    await checkTargets(tx, actor, farmId, input);
    const figures = await recordFigures(tx, actor, input, doneOn, input.notes, input);
    const id = input.id ?? randomUUID();
    await run(
      tx,
      `INSERT INTO chore_entries (id, coop_id, farm_id, apprentice_id, kind, done_on, minutes, animal_id, litter_id, group_id, notes, weigh_in_id, litter_event_id, palpation_id, review_state)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, 'pending')`,
      [id, actor.coopId, farmId, actor.id, input.kind, doneOn, input.minutes, input.animalId ?? null, input.litterId ?? null, input.groupId ?? null, input.notes,
        figures.weighInId, figures.litterEventId, figures.palpationId],
    );
    await tellMentor(tx, actor, { id, kind: input.kind, version: 0, doneOn }, settings, false);
    return (await presentChores(tx, actor.coopId, [(await choreById(tx, actor.coopId, id))!], settings))[0]!;
  });
}

/**
 * The apprentice corrects a returned entry and sends it again. A corrected weight or count is a new
 * record (pending); the returned one stays as it was, out of the figures.
 */
export async function resubmitChore(actor: SessionUser, choreId: string, input: ChoreResubmitInput): Promise<ChoreEntryDto> {
  const farmId = apprenticeFarmOf(actor);
  return withTenant(actor, async (tx) => {
    const entry = await choreById(tx, actor.coopId, choreId, true);
    if (!entry || entry.apprentice_id !== actor.id) throw AppError.notFound('That entry');
    ensureCan(actor, 'update', 'ChoreLog', { farmId: entry.farm_id, authorId: entry.apprentice_id }, 'That entry');
    if (entry.version !== input.version) throw AppError.staleVersion();
    if (entry.review_state !== 'returned') throw new AppError(ErrorCode.conflict, 409, 'Only a returned entry is corrected and sent again');
    const today = await farmTodayOf(tx, actor.coopId, farmId);
    if (input.doneOn > today) throw AppError.validation({ doneOn: ['A chore cannot be dated after today on the farm'] });
    if (entry.weigh_in_id && !input.weighing) throw AppError.validation({ weighing: ['Enter the corrected weight'] });
    if (entry.litter_event_id && !input.litterCount) throw AppError.validation({ litterCount: ['Enter the corrected count'] });
    if (entry.palpation_id && !input.palpation) throw AppError.validation({ palpation: ['Enter the palpation again'] });
    const figures = await recordFigures(
      tx, actor, { animalId: entry.animal_id, litterId: entry.litter_id, groupId: entry.group_id }, input.doneOn, input.notes,
      { weighing: input.weighing, litterCount: input.litterCount, palpation: input.palpation },
    );
    await run(
      tx,
      `UPDATE chore_entries SET done_on = $3, minutes = $4, notes = $5, weigh_in_id = coalesce($6, weigh_in_id), litter_event_id = coalesce($7, litter_event_id),
         palpation_id = coalesce($8, palpation_id), review_state = 'pending', submitted_at = now(), version = version + 1, updated_at = now()
       WHERE id = $1 AND coop_id = $2`,
      [choreId, actor.coopId, input.doneOn, input.minutes, input.notes, figures.weighInId, figures.litterEventId, figures.palpationId],
    );
    const settings = await settingsOf(tx, actor.coopId);
    await tellMentor(tx, actor, { id: choreId, kind: entry.kind, version: entry.version + 1, doneOn: input.doneOn }, settings, true);
    return (await presentChores(tx, actor.coopId, [(await choreById(tx, actor.coopId, choreId))!], settings))[0]!;
  });
}

/** The apprentice's own log: newest first, with what waits, what came back, and her hours per week. */
export async function myChoreLog(actor: SessionUser, q: ChoreLogQuery): Promise<ChoreLogDto> {
  apprenticeFarmOf(actor);
  return withTenant(actor, async (tx) => {
    const rows = await choresWhere(
      tx, `c.coop_id = $1 AND c.apprentice_id = $2 AND ($3 = 'all' OR c.review_state = $3)`, [actor.coopId, actor.id, q.state],
      'ORDER BY c.done_on DESC, c.submitted_at DESC, c.id LIMIT 200',
    );
    const counts = await select<{ review_state: string; n: number }>(
      tx, 'SELECT review_state, count(*)::int AS n FROM chore_entries WHERE coop_id = $1 AND apprentice_id = $2 AND deleted_at IS NULL GROUP BY review_state', [actor.coopId, actor.id],
    );
    const weeks = await select<{ week_of: string; minutes: number }>(
      tx,
      `SELECT date_trunc('week', done_on)::date::text AS week_of, sum(minutes)::int AS minutes FROM chore_entries
        WHERE coop_id = $1 AND apprentice_id = $2 AND deleted_at IS NULL AND review_state <> 'returned' GROUP BY week_of`,
      [actor.coopId, actor.id],
    );
    const n = (state: string) => counts.find((c) => c.review_state === state)?.n ?? 0;
    return { items: await presentChores(tx, actor.coopId, rows), weeks: weeksOf(weeks), counts: { pending: n('pending'), returned: n('returned'), accepted: n('accepted') } };
  });
}

/** Photos for the apprentice's own entry while it waits or after it came back (not once accepted). */
export async function addPhotosToChore(actor: SessionUser, choreId: string, input: { files: UploadedFile[]; caption: string }, limits: PhotoLimits): Promise<PhotoDto[]> {
  apprenticeFarmOf(actor);
  return addChorePhotos(actor, async (tx) => {
    const target = await photoTargetOf(tx, actor, choreId);
    // The mentor's open queue shows the photo as it arrives.
    announceMentorship(tx, actor.id, actor.mentorId, 'submitted');
    return target;
  }, input, limits);
}

async function photoTargetOf(tx: Transaction, actor: SessionUser, choreId: string): Promise<{ id: string; farmId: string }> {
  const entry = await choreById(tx, actor.coopId, choreId, true);
  if (!entry || entry.apprentice_id !== actor.id) throw AppError.notFound('That entry');
  ensureCan(actor, 'update', 'ChoreLog', { farmId: entry.farm_id, authorId: entry.apprentice_id }, 'That entry');
  if (entry.review_state === 'accepted') throw new AppError(ErrorCode.conflict, 409, 'That entry was already accepted');
  return { id: entry.id, farmId: entry.farm_id };
}

/** Settles before the upload is read who may add photos to the entry. */
export async function assertCanAddChorePhotos(actor: SessionUser, choreId: string): Promise<void> {
  apprenticeFarmOf(actor);
  await withTenant(actor, (tx) => photoTargetOf(tx, actor, choreId));
}

/** Where the signed-in person starts in Mentorship: her role there, the chore kinds, her farm's today, the apprentices. */
export async function mentorshipHome(actor: SessionUser): Promise<MentorshipHomeDto> {
  return withTenant(actor, async (tx) => {
    const settings = await settingsOf(tx, actor.coopId);
    const today = actor.farmId ? await farmTodayOf(tx, actor.coopId, actor.farmId) : null;
    if (actor.role === 'apprentice') {
      const counts = await select<{ review_state: string; n: number }>(
        tx, 'SELECT review_state, count(*)::int AS n FROM chore_entries WHERE coop_id = $1 AND apprentice_id = $2 AND deleted_at IS NULL GROUP BY review_state', [actor.coopId, actor.id],
      );
      const n = (state: string) => counts.find((c) => c.review_state === state)?.n ?? 0;
      return { role: 'apprentice', today, choreKinds: settings.choreKinds, apprentices: [], waiting: n('pending'), returned: n('returned') };
    }
    const all = actor.role === 'admin';
    const apprentices = await apprenticeSummariesOf(tx, actor.coopId, all ? null : actor.id, settings);
    const mine = apprentices.filter((a) => a.mentor?.id === actor.id);
    const role = mine.length > 0 ? 'mentor' : all ? 'admin' : 'none';
    const pending = mine.length > 0 ? await pendingOf(tx, actor.coopId, mine.map((a) => a.id)) : [];
    return {
      role, today, choreKinds: settings.choreKinds, apprentices, waiting: pending.length,
      returned: apprentices.reduce((n, a) => n + a.returned, 0),
    };
  });
}

/** The co-op's chore kinds, skills checklist and roster rule (everyone in the co-op reads them). */
export async function getMentorshipSettings(actor: SessionUser): Promise<MentorshipSettingsDto> {
  return withTenant(actor, async (tx) => presentSettings(await settingsOf(tx, actor.coopId)));
}

/**
 * The admin edits the chore kinds and the checklist. A skill left out is retired (its sign-offs stay in
 * the apprentices' history); its key is kept, so bringing it back restores them.
 */
export async function updateMentorshipSettings(actor: SessionUser, input: MentorshipSettingsInput): Promise<MentorshipSettingsDto> {
  if (!defineAbilityFor(actor).can('manage', subjectOf('MentorshipSettings', { coopId: actor.coopId }))) {
    throw new AppError(ErrorCode.forbidden, 403, "Only the co-op's admin edits the mentorship checklist");
  }
  return withTenant(actor, async (tx) => {
    const [current] = await select<{ version: number }>(tx, 'SELECT version FROM mentorship_settings WHERE coop_id = $1 FOR UPDATE', [actor.coopId]);
    if ((current?.version ?? 0) !== input.version) throw AppError.staleVersion();
    await run(
      tx,
      `INSERT INTO mentorship_settings (coop_id, chore_kinds, require_dangerous_sign_off, version) VALUES ($1, $2::jsonb, $3, 1)
       ON CONFLICT (coop_id) DO UPDATE SET chore_kinds = excluded.chore_kinds, require_dangerous_sign_off = excluded.require_dangerous_sign_off,
         version = mentorship_settings.version + 1, updated_at = now()`,
      [actor.coopId, JSON.stringify(input.choreKinds), input.requireDangerousSignOff],
    );
    for (const [position, skill] of input.skills.entries()) {
      await run(
        tx,
        `INSERT INTO skills (coop_id, key, name, area, signed_off_means, dangerous, position) VALUES ($1, $2, $3, $4, $5, $6, $7)
         ON CONFLICT (coop_id, key) DO UPDATE SET name = excluded.name, area = excluded.area, signed_off_means = excluded.signed_off_means,
           dangerous = excluded.dangerous, position = excluded.position, retired_at = NULL, updated_at = now()`,
        [actor.coopId, skill.key, skill.name, skill.area, skill.signedOffMeans, skill.dangerous, position],
      );
    }
    await run(tx, 'UPDATE skills SET retired_at = now() WHERE coop_id = $1 AND retired_at IS NULL AND NOT (key = ANY($2::text[]))', [actor.coopId, input.skills.map((s) => s.key)]);
    forgetInTransaction(tx, `mentorship-settings:${actor.coopId}`);
    return presentSettings(await settingsOf(tx, actor.coopId));
  });
}

/**
 * What a chore can be about on the actor's farm (her mentor's for an apprentice): animals kept there, litters
 * still with their doe or weaned lately, growing groups. Labels only; the full records stay in their areas.
 */
export async function choreChoices(actor: SessionUser): Promise<{ animals: { id: string; label: string }[]; litters: { id: string; label: string }[]; groups: { id: string; label: string }[] }> {
  const farmId = actor.farmId;
  if (!farmId) return { animals: [], litters: [], groups: [] };
  return withTenant(actor, async (tx) => {
    ensureCan(actor, 'read', 'Animal', { owningFarmId: farmId, keepingFarmId: farmId }, 'That farm');
    const animals = await select<{ id: string; label: string }>(
      tx,
      `SELECT id, concat_ws(' ', tattoo, nullif(name, '')) AS label FROM animals
        WHERE coop_id = $1 AND keeping_farm_id = $2 AND deleted_at IS NULL AND NOT is_outside AND disposition = 'on_farm'
        ORDER BY lower(coalesce(nullif(name, ''), tattoo)), id LIMIT 500`,
      [actor.coopId, farmId],
    );
    const litters = await select<{ id: string; label: string }>(
      tx,
      `SELECT l.id, concat('Litter of ', coalesce(nullif(d.name, ''), d.tattoo), ', ', l.kindled_on::text) AS label
         FROM litters l JOIN animals d ON d.id = l.dam_id
        WHERE l.coop_id = $1 AND l.farm_id = $2 AND l.deleted_at IS NULL AND l.kindled_on > current_date - 120
        ORDER BY l.kindled_on DESC, l.id LIMIT 100`,
      [actor.coopId, farmId],
    );
    const groups = await select<{ id: string; label: string }>(
      tx, `SELECT id, name AS label FROM grow_out_groups WHERE coop_id = $1 AND farm_id = $2 AND deleted_at IS NULL AND status = 'growing' ORDER BY formed_on DESC, id LIMIT 100`,
      [actor.coopId, farmId],
    );
    return { animals, litters, groups };
  });
}

/** Has the co-op any chore entries yet (the demo loader adds its history once). */
export async function coopHasChoreEntries(tx: Transaction, coopId: string): Promise<boolean> {
  return (await select<{ n: number }>(tx, 'SELECT count(*)::int AS n FROM chore_entries WHERE coop_id = $1', [coopId]))[0]!.n > 0;
}

/**
 * Writes past entries and skill marks as they were decided (the demo co-op's weeks of apprenticeship),
 * inside the caller's transaction. Entries without a figure only: weights go through their own records.
 */
export async function recordPastMentorshipIn(
  tx: Transaction,
  coopId: string,
  input: {
    entries: { apprenticeId: string; farmId: string; kind: string; doneOn: string; minutes: number; notes: string; state: 'pending' | 'accepted' | 'returned'; mentorId: string; comment?: string; submittedAt: Date }[];
    marks: { apprenticeId: string; skillKey: string; state: 'practising' | 'signed-off' | 'withdrawn'; on: string; comment: string; mentorId: string; at: Date }[];
  },
): Promise<void> {
  for (const e of input.entries) {
    await run(
      tx,
      `INSERT INTO chore_entries (coop_id, farm_id, apprentice_id, kind, done_on, minutes, notes, review_state, reviewed_by, reviewed_at, review_comment, submitted_at, version, created_at)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $12)`,
      [coopId, e.farmId, e.apprenticeId, e.kind, e.doneOn, e.minutes, e.notes, e.state, e.state === 'pending' ? null : e.mentorId,
        e.state === 'pending' ? null : new Date(e.submittedAt.getTime() + 6 * 3_600_000), e.comment ?? null, e.submittedAt, e.state === 'pending' ? 0 : 1],
    );
  }
  for (const m of input.marks) {
    await run(
      tx,
      'INSERT INTO skill_events (coop_id, apprentice_id, skill_key, state, on_date, comment, mentor_id, created_at) VALUES ($1, $2, $3, $4, $5, $6, $7, $8)',
      [coopId, m.apprenticeId, m.skillKey, m.state, m.on, m.comment, m.mentorId, m.at],
    );
  }
}
