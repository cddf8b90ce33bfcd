import { authorize, ensureCan } from '../farms/farm-access';
import { animalRecord } from './animal-access';
import { ForbiddenError } from '@casl/ability';
import { Op, type Transaction } from 'sequelize';
import {
  defineAbilityFor, ErrorCode, subjectOf, type AnimalNoteCreateInput, type AnimalNoteDto, type EntryReviewInput, type ReviewState, type WeighInCreateInput, type WeighInDto, type WeighInListQuery, weighInListQuerySchema,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordChanges } from '../audit/audit.service';
import { mentorIdOf, namesOf } from '../users/users.service';
import { announceAfterCommit, presentContextFor } from './animal-context';
import { AnimalNote } from './animal-note.model';
import { Animal } from './animal.model';
import { WeighIn } from './weigh-in.model';
import { privateRecordFarmsOf } from './animal-facts.service';
import { presentNote } from './animals.presenter';
import { query } from './animal-queries';

/** An apprentice's entry waits for the mentor's review; a member's stands as entered. */
function initialReviewState(actor: SessionUser): ReviewState {
  return actor.role === 'apprentice' ? 'pending' : 'accepted';
}

function presentWeighIn(w: WeighIn, names: Map<string, string>): WeighInDto {
  return {
    id: w.id,
    farmId: w.farmId,
    animalId: w.animalId,
    groupLabel: w.groupLabel,
    totalGrams: w.totalGrams,
    headCount: w.headCount,
    gramsPerHead: Math.round(w.totalGrams / w.headCount),
    weighedOn: w.weighedOn,
    note: w.note,
    enteredBy: { id: w.enteredBy, name: names.get(w.enteredBy) ?? 'Someone' },
    reviewState: w.reviewState,
    reviewComment: w.reviewComment,
    version: w.version,
  };
}

/**
 * The animal an entry is about, readable by the actor and kept on their farm (the farm where it is
 * weighed or watched). Another co-op's is 404; another farm's 403.
 */
async function animalOnActorsFarm(actor: SessionUser, animalId: string, tx: Transaction): Promise<Animal> {
  const animal = await Animal.findOne({ where: { id: animalId, coopId: actor.coopId, isOutside: false }, transaction: tx });
  if (!animal) throw AppError.notFound('That animal');
  authorize(actor, 'read', animalRecord(animal), 'You may not do that');
  if (animal.keepingFarmId !== actor.farmId) {
    throw new AppError(ErrorCode.forbidden, 403, 'Only the farm keeping the animal can record this');
  }
  return animal;
}

/** Records a weigh-in of an animal or a group on the actor's farm. */
export async function createWeighIn(actor: SessionUser, input: WeighInCreateInput): Promise<WeighInDto> {
  return withTenant(actor, (tx) => createWeighInIn(tx, actor, input));
}

/** A weigh-in inside the caller's transaction (an apprentice's chore entry carries one); the same checks. */
export async function createWeighInIn(tx: Transaction, actor: SessionUser, input: WeighInCreateInput): Promise<WeighInDto> {
  {
    if (input.id) {
      const existing = await WeighIn.findOne({ where: { id: input.id }, paranoid: false, transaction: tx });
      if (existing && existing.farmId === actor.farmId && existing.enteredBy === actor.id) {
        return presentWeighIn(existing, await namesOf([existing.enteredBy], tx));
      }
      if (existing) throw AppError.idTaken();
    }
    const animal = input.animalId ? await animalOnActorsFarm(actor, input.animalId, tx) : null;
    const farmId = animal?.keepingFarmId ?? actor.farmId;
    if (!farmId) throw new AppError(ErrorCode.forbidden, 403, 'Only a member of a farm can record weights');
    ensureCan(actor, 'create', 'WeighIn', { farmId, enteredBy: actor.id }, 'That farm', 'You may not do that');

    const ctx = await presentContextFor(actor, tx);
    if (input.weighedOn > ctx.today) throw AppError.validation({ weighedOn: ['A weigh-in cannot be dated in the future'] });
    if (animal?.birthDate && input.weighedOn < animal.birthDate) throw AppError.validation({ weighedOn: ['That is before the animal was born'] });

    const weighIn = await WeighIn.create(
      {
        ...(input.id ? { id: input.id } : {}),
        coopId: actor.coopId,
        farmId,
        animalId: input.animalId ?? null,
        groupLabel: input.groupLabel ?? null,
        totalGrams: input.totalGrams,
        headCount: input.headCount,
        weighedOn: input.weighedOn,
        note: input.note,
        enteredBy: actor.id,
        reviewState: initialReviewState(actor),
      },
      { transaction: tx },
    );
    announceAfterCommit(tx, actor.coopId, { farmIds: [farmId], animalId: weighIn.animalId, figuresChanged: 0 });
    return presentWeighIn(weighIn, await namesOf([actor.id], tx));
  }
}

/**
 * The weigh-ins of an animal the viewer's farm may read (its own, not a lender's or borrower's), a page by
 * weighing date (pending ones included, marked as such), with how many there are.
 */
export async function listAnimalWeighIns(
  actor: SessionUser,
  animalId: string,
  q: WeighInListQuery = weighInListQuerySchema.parse({}),
): Promise<{ weighIns: WeighInDto[]; total: number; page: number; pageSize: number }> {
  return withTenant(actor, async (tx) => {
    const animal = await Animal.findOne({ where: { id: animalId, coopId: actor.coopId, isOutside: false }, transaction: tx });
    if (!animal) throw AppError.notFound('That animal');
    authorize(actor, 'read', animalRecord(animal), 'You may not do that');
    const farms = await privateRecordFarmsOf(actor, animal, 'WeighIn', tx);
    const where = { animalId, farmId: { [Op.in]: farms } };
    const dir = q.dir === 'desc' ? 'DESC' : 'ASC';
    const offset = (q.page - 1) * q.pageSize;
    const rows = await WeighIn.findAll({ where, order: [['weighedOn', dir], ['createdAt', dir], ['id', dir]], limit: q.pageSize, offset, transaction: tx });
    // A short page that is not past the end tells the total without counting.
    const total = rows.length < q.pageSize && (rows.length > 0 || offset === 0) ? offset + rows.length : await WeighIn.count({ where, transaction: tx });
    const names = await namesOf(rows.map((r) => r.enteredBy), tx);
    return { weighIns: rows.map((r) => presentWeighIn(r, names)), total, page: q.page, pageSize: q.pageSize };
  });
}

async function review<T extends WeighIn | AnimalNote>(
  actor: SessionUser,
  tx: Transaction,
  entry: T | null,
  subjectName: 'WeighIn' | 'AnimalNote',
  input: EntryReviewInput,
): Promise<T> {
  if (!entry) throw AppError.notFound('That entry');
  const mentorId = await mentorIdOf(entry.enteredBy, tx);
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('review', subjectOf(subjectName, { coopId: entry.coopId, farmId: entry.farmId, enteredBy: entry.enteredBy, mentorId }));
  if (entry.version !== input.version) throw AppError.staleVersion();
  if (entry.reviewState !== 'pending') throw new AppError(ErrorCode.conflict, 409, 'That entry was already reviewed');
  if (entry.enteredBy === actor.id) throw new AppError(ErrorCode.forbidden, 403, 'Someone else reviews your own entries');
  entry.reviewState = input.decision;
  entry.reviewedBy = actor.id;
  entry.reviewedAt = new Date();
  entry.reviewComment = input.comment ?? null;
  await entry.save({ transaction: tx });
  await recordChanges(
    {
      coopId: actor.coopId,
      tableName: subjectName === 'WeighIn' ? 'weigh_ins' : 'animal_notes',
      recordId: entry.id,
      actorUserId: actor.id,
      changes: { reviewState: ['pending', input.decision] },
    },
    tx,
  );
  announceAfterCommit(tx, actor.coopId, { farmIds: [entry.farmId], animalId: entry.animalId, figuresChanged: 0 });
  return entry;
}

/** The mentor (a member of the farm) accepts or returns an apprentice's weigh-in. */
export async function reviewWeighIn(actor: SessionUser, weighInId: string, input: EntryReviewInput): Promise<WeighInDto> {
  return withTenant(actor, (tx) => reviewWeighInIn(tx, actor, weighInId, input));
}

/** The same review inside the caller's transaction (the mentor's queue decides many at once). */
export async function reviewWeighInIn(tx: Transaction, actor: SessionUser, weighInId: string, input: EntryReviewInput): Promise<WeighInDto> {
  const entry = await WeighIn.findOne({ where: { id: weighInId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
  const reviewed = await review(actor, tx, entry, 'WeighIn', input);
  return presentWeighIn(reviewed, await namesOf([reviewed.enteredBy], tx));
}

/** Weigh-ins by id as the mentor's queue and the apprentice's log show them (weights and whom they weigh). */
export async function weighInFactsOf(
  tx: Transaction, coopId: string, ids: string[],
): Promise<Map<string, { id: string; totalGrams: number; headCount: number; animalId: string | null; groupId: string | null; reviewState: ReviewState; version: number }>> {
  if (ids.length === 0) return new Map();
  const rows = await WeighIn.findAll({
    where: { coopId, id: { [Op.in]: [...new Set(ids)] } }, attributes: ['id', 'totalGrams', 'headCount', 'animalId', 'groupId', 'reviewState', 'version'], paranoid: false, transaction: tx, raw: true,
  });
  return new Map(rows.map((r) => [r.id, { id: r.id, totalGrams: r.totalGrams, headCount: r.headCount, animalId: r.animalId ?? null, groupId: r.groupId ?? null, reviewState: r.reviewState, version: r.version }]));
}

/** A dated note about an animal on the actor's farm; an apprentice's waits for review. */
export async function createAnimalNote(actor: SessionUser, animalId: string, input: AnimalNoteCreateInput): Promise<AnimalNoteDto> {
  return withTenant(actor, async (tx) => {
    const animal = await animalOnActorsFarm(actor, animalId, tx);
    const farmId = animal.keepingFarmId!;
    ensureCan(actor, 'create', 'AnimalNote', { farmId, enteredBy: actor.id }, 'That farm', 'You may not do that');
    const ctx = await presentContextFor(actor, tx);
    if (input.notedOn > ctx.today) throw AppError.validation({ notedOn: ['A note cannot be dated in the future'] });
    const note = await AnimalNote.create(
      { coopId: actor.coopId, farmId, animalId, body: input.body, notedOn: input.notedOn, enteredBy: actor.id, reviewState: initialReviewState(actor) },
      { transaction: tx },
    );
    announceAfterCommit(tx, actor.coopId, { farmIds: [farmId], animalId, figuresChanged: 0 });
    return presentNote(note, await namesOf([actor.id], tx));
  });
}

export async function reviewAnimalNote(actor: SessionUser, noteId: string, input: EntryReviewInput): Promise<AnimalNoteDto> {
  return withTenant(actor, (tx) => reviewAnimalNoteIn(tx, actor, noteId, input));
}

/** The same review inside the caller's transaction (the mentor's queue). */
export async function reviewAnimalNoteIn(tx: Transaction, actor: SessionUser, noteId: string, input: EntryReviewInput): Promise<AnimalNoteDto> {
  const entry = await AnimalNote.findOne({ where: { id: noteId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
  const reviewed = await review(actor, tx, entry, 'AnimalNote', input);
  return presentNote(reviewed, await namesOf([reviewed.enteredBy], tx));
}

// ---------------------------------------------------------------------------------------------------
// Weighing rounds: many weights saved in one transaction by modules/weighing-rounds.

/** The latest weight per head of each animal or litter on a farm (returned entries left out; pending ones are the latest word). */
export async function latestWeightsOf(
  tx: Transaction, coopId: string, farmId: string, column: 'animal_id' | 'litter_id', ids: string[],
): Promise<Map<string, { gramsPerHead: number; weighedOn: string }>> {
  if (ids.length === 0) return new Map();
  const rows = await query<{ subject_id: string; total_grams: number; head_count: number; weighed_on: string }>(
    tx,
    `SELECT DISTINCT ON (${column}) ${column} AS subject_id, total_grams, head_count, weighed_on::text AS weighed_on
       FROM weigh_ins
      WHERE coop_id = $1 AND farm_id = $2 AND ${column} = ANY($3::uuid[]) AND deleted_at IS NULL AND review_state <> 'returned'
      ORDER BY ${column}, weighed_on DESC, created_at DESC`,
    [coopId, farmId, [...new Set(ids)]],
  );
  return new Map(rows.map((r) => [r.subject_id, { gramsPerHead: Math.round(r.total_grams / r.head_count), weighedOn: r.weighed_on }]));
}

/** Writes a round's weigh-ins of animals and litters at once (the caller has checked each). */
export async function insertRoundWeighIns(
  tx: Transaction,
  rows: { coopId: string; farmId: string; roundId: string; animalId: string | null; litterId: string | null; groupLabel: string | null;
    totalGrams: number; headCount: number; kitWeights: { label: string | null; grams: number }[] | null; weighedOn: string; enteredBy: string; reviewState: ReviewState }[],
): Promise<void> {
  if (rows.length === 0) return;
  await WeighIn.bulkCreate(rows.map((r) => ({ ...r, note: '' })), { transaction: tx });
}

/** Marks weigh-ins another module wrote (a grow-out group's) as part of a round. */
export async function attachWeighInsToRound(tx: Transaction, weighInIds: string[], roundId: string): Promise<void> {
  if (weighInIds.length === 0) return;
  await WeighIn.update({ roundId }, { where: { id: { [Op.in]: weighInIds } }, transaction: tx });
}

/** The weigh-ins a round saved, in the order they were written. */
export async function roundWeighInsOf(tx: Transaction, roundId: string): Promise<{ id: string; animalId: string | null; groupId: string | null; litterId: string | null; totalGrams: number; headCount: number; reviewState: ReviewState }[]> {
  const rows = await WeighIn.findAll({ where: { roundId }, attributes: ['id', 'animalId', 'groupId', 'litterId', 'totalGrams', 'headCount', 'reviewState', 'createdAt'], order: [['createdAt', 'ASC'], ['id', 'ASC']], transaction: tx, raw: true });
  return rows.map((r) => ({ id: r.id, animalId: r.animalId ?? null, groupId: r.groupId ?? null, litterId: r.litterId ?? null, totalGrams: r.totalGrams, headCount: r.headCount, reviewState: r.reviewState }));
}
