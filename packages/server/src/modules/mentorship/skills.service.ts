import type { Transaction } from 'sequelize';
import {
  dangerousSkillCaution, ErrorCode,
  type ApprenticeDetailDto, type ApprenticeSummaryDto, type SkillMarkInput, type SkillProgressDto,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import type { SessionUser } from '../../lib/session-user';
import { farmTodayOf } from '../farms/farm-clock';
import { notify } from '../notifications/notifications.service';
import { apprenticeFor } from './mentorship-access';
import { apprenticeSummariesOf } from './apprentice-summaries';
import { acceptedMinutesOf, choresWhere, run, select, skillEventsOf, type PersonRow, type SkillEventRow } from './mentorship-queries';
import { announceMentorship, presentChores } from './mentorship.service';
import { weeksOf } from './mentorship.presenter';
import { kindLabel, settingsOf, type Settings } from './mentorship-settings';
import { renderRecordOfSkills } from './record-of-skills';

function progressOf(settings: Settings, events: SkillEventRow[]): SkillProgressDto[] {
  return settings.skills.map((skill) => {
    const mine = events.filter((e) => e.skill_key === skill.key);
    const latest = mine.at(-1);
    return {
      ...skill,
      state: latest?.state ?? 'not-started',
      on: latest?.on_date ?? null,
      comment: latest?.comment ?? '',
      by: latest ? { id: latest.mentor_id, name: latest.mentor_name } : null,
      entryIds: latest?.entry_ids ?? [],
      history: mine.map((e) => ({ state: e.state, on: e.on_date, comment: e.comment, by: { id: e.mentor_id, name: e.mentor_name } })),
    };
  });
}

async function minutesByKindOf(tx: Transaction, coopId: string, apprenticeId: string, settings: Settings) {
  const rows = await acceptedMinutesOf(tx, coopId, [apprenticeId]);
  const byKind = new Map<string, number>();
  for (const r of rows) byKind.set(r.kind, (byKind.get(r.kind) ?? 0) + r.minutes);
  return {
    minutesByKind: [...byKind.entries()].map(([kind, minutes]) => ({ kind, label: kindLabel(settings, kind), minutes })).sort((a, b) => b.minutes - a.minutes),
    weeks: weeksOf(rows),
  };
}

async function detailOf(tx: Transaction, actor: SessionUser, person: PersonRow): Promise<ApprenticeDetailDto & { entries: Awaited<ReturnType<typeof presentChores>> }> {
  const settings = await settingsOf(tx, actor.coopId);
  const events = await skillEventsOf(tx, actor.coopId, [person.id]);
  const [summary] = await apprenticeSummariesOf(tx, actor.coopId, null, settings, [person], events);
  const hours = await minutesByKindOf(tx, actor.coopId, person.id, settings);
  const rows = await choresWhere(tx, 'c.coop_id = $1 AND c.apprentice_id = $2', [actor.coopId, person.id], 'ORDER BY c.done_on DESC, c.submitted_at DESC, c.id LIMIT 60');
  return {
    ...summary!,
    skills: progressOf(settings, events),
    ...hours,
    canReview: person.mentor_id === actor.id,
    entries: await presentChores(tx, actor.coopId, rows, settings),
  };
}

/** The apprentices the actor helps: a mentor's own, or all of the co-op's for the admin. */
export async function listApprentices(actor: SessionUser): Promise<{ items: ApprenticeSummaryDto[] }> {
  if (actor.role === 'apprentice') throw new AppError(ErrorCode.forbidden, 403, 'Your mentor and the admin see the apprentices');
  return withTenant(actor, async (tx) => ({ items: await apprenticeSummariesOf(tx, actor.coopId, actor.role === 'admin' ? null : actor.id, await settingsOf(tx, actor.coopId)) }));
}

/** An apprentice's page: skills and their history, hours by kind and week, recent entries. */
export async function getApprentice(actor: SessionUser, apprenticeId: string) {
  return withTenant(actor, async (tx) => detailOf(tx, actor, await apprenticeFor(tx, actor, apprenticeId, 'read')));
}

/**
 * The mentor marks a skill practising, signs it off (with the date, a comment and the accepted entries
 * that show it) or withdraws a sign-off with the reason. Every mark is kept; the latest is the skill's state.
 */
export async function markSkill(actor: SessionUser, apprenticeId: string, skillKey: string, input: SkillMarkInput) {
  return withTenant(actor, async (tx) => {
    const person = await apprenticeFor(tx, actor, apprenticeId, 'review');
    const settings = await settingsOf(tx, actor.coopId);
    const skill = settings.skills.find((s) => s.key === skillKey);
    if (!skill) throw AppError.notFound('That skill');
    // One mark at a time per apprentice, so two tabs cannot sign off and withdraw in the wrong order.
    await run(tx, 'SELECT 1 FROM users WHERE id = $1 FOR UPDATE', [person.id]);
    const current = (await skillEventsOf(tx, actor.coopId, [person.id])).filter((e) => e.skill_key === skillKey).at(-1)?.state ?? 'not-started';
    if (input.state === 'withdrawn' && current !== 'signed-off') throw new AppError(ErrorCode.conflict, 409, 'Only a signed-off skill can be withdrawn');
    if (input.state === current) throw new AppError(ErrorCode.conflict, 409, `That skill is already ${current === 'signed-off' ? 'signed off' : current}`);
    const today = await farmTodayOf(tx, actor.coopId, person.farm_id!);
    const on = input.on ?? today;
    if (on > today) throw AppError.validation({ on: ['A sign-off cannot be dated after today on the farm'] });
    if (input.entryIds.length > 0) {
      const found = await select<{ id: string }>(
        tx, `SELECT id FROM chore_entries WHERE coop_id = $1 AND apprentice_id = $2 AND review_state = 'accepted' AND deleted_at IS NULL AND id = ANY($3::uuid[])`,
        [actor.coopId, person.id, input.entryIds],
      );
      if (found.length !== new Set(input.entryIds).size) throw AppError.validation({ entryIds: ['Choose accepted entries of this apprentice'] });
    }
    const [mark] = await select<{ id: string }>(
      tx,
      `INSERT INTO skill_events (coop_id, apprentice_id, skill_key, state, on_date, comment, entry_ids, mentor_id) VALUES ($1, $2, $3, $4, $5, $6, $7::uuid[], $8) RETURNING id`,
      [actor.coopId, person.id, skillKey, input.state, on, input.comment, [...new Set(input.entryIds)], actor.id],
    );
    if (input.state !== 'practising') {
      const signed = input.state === 'signed-off';
      await notify(tx, {
        coopId: actor.coopId, userIds: [person.id], exceptUserId: actor.id, kind: 'mentor.skill-signed-off',
        title: signed ? `${actor.name} signed off ${skill.name.toLowerCase()}` : `${actor.name} withdrew the sign-off of ${skill.name.toLowerCase()}: ${input.comment}`.slice(0, 300),
        link: '/mentorship/skills',
        mail: {
          subject: signed ? `Signed off: ${skill.name}` : `Sign-off withdrawn: ${skill.name}`,
          text: signed ? `${actor.name} signed off ${skill.name} on ${on}.${input.comment ? `\n\n${input.comment}` : ''}` : `${actor.name} withdrew the sign-off of ${skill.name}:\n\n${input.comment}`,
        },
        key: `skill-mark:${mark!.id}`,
      });
    }
    announceMentorship(tx, person.id, person.mentor_id, 'skill');
    return detailOf(tx, actor, person);
  });
}

/**
 * Whether the apprentice may take a station that needs this skill on a processing day's roster: always,
 * unless the co-op requires a sign-off for dangerous skills and this one is dangerous and not signed off.
 * Runs in the caller's transaction (the processing days module calls it while it builds the roster).
 */
export async function mayTakeStation(tx: Transaction, coopId: string, apprenticeId: string, skillKey: string): Promise<{ allowed: boolean; reason: string | null }> {
  const settings = await settingsOf(tx, coopId);
  const skill = settings.skills.find((s) => s.key === skillKey);
  if (!skill || !skill.dangerous || !settings.requireDangerousSignOff) return { allowed: true, reason: null };
  const latest = (await skillEventsOf(tx, coopId, [apprenticeId])).filter((e) => e.skill_key === skillKey).at(-1);
  if (latest?.state === 'signed-off') return { allowed: true, reason: null };
  return { allowed: false, reason: `${skill.name} must be signed off by the mentor before an apprentice takes this station. ${dangerousSkillCaution}` };
}

/** The apprentice's record of skills as a PDF (hers, her mentor's or the admin's to print). */
export async function recordOfSkillsPdf(actor: SessionUser, apprenticeId: string): Promise<{ fileName: string; body: Buffer }> {
  const data = await withTenant(actor, async (tx) => {
    const person = await apprenticeFor(tx, actor, apprenticeId, 'read');
    const detail = await detailOf(tx, actor, person);
    return { person, detail, today: person.farm_id ? await farmTodayOf(tx, actor.coopId, person.farm_id) : new Date().toISOString().slice(0, 10) };
  });
  const { person, detail } = data;
  const body = await renderRecordOfSkills({
    apprentice: person.name,
    farm: person.farm_name ?? '',
    mentor: person.mentor_name ?? '',
    printedOn: data.today,
    signedOff: detail.skills.filter((s) => s.state === 'signed-off').map((s) => ({ name: s.name, area: s.area, on: s.on!, by: s.by?.name ?? '', comment: s.comment, dangerous: s.dangerous })),
    practising: detail.skills.filter((s) => s.state === 'practising').map((s) => ({ name: s.name, since: s.on! })),
    minutesByKind: detail.minutesByKind,
    caution: dangerousSkillCaution,
  });
  return { fileName: `record-of-skills-${person.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'apprentice'}.pdf`, body };
}
