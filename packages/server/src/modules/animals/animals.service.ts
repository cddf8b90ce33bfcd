import { ForbiddenError } from '@casl/ability';
import type { Transaction } from 'sequelize';
import {
  daysBetween, defineAbilityFor, ErrorCode, pedigreeCompleteness, subjectOf, type Action, type AnimalCreateInput,
  type AnimalDetailDto, type AnimalListDto, type AnimalListQuery, type AnimalUpdateInput, type CustodyMoveInput,
  type Disposition, type Lifecycle, type Sex, type StatusEventInput,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../http/passport';
import { AppError } from '../../lib/app-error';
import { recordChanges } from '../audit/audit.service';
import { namesOf } from '../users/users.service';
import { planArrivalQuarantine } from '../almanac/quarantine.service';
import { announceAfterCommit, presentContextFor } from './animal-context';
import { AnimalNote } from './animal-note.model';
import { AnimalStatusEvent } from './animal-status-event.model';
import { Animal } from './animal.model';
import { query, selectAncestorIds, selectAnimalById, selectAnimals, type AnimalRow } from './animal-queries';
import { checkPedigree, tattooClash, tattooClashMessage, type FieldMessages } from './animal-validation';
import { presentAnimal, presentCard, standardBreedOf, type PresentContext } from './animals.presenter';
import { CustodyEvent } from './custody-event.model';
import { findOrCreateOutside } from './outside-animals.service';
import { loadPedigreeRows, lockCoopPedigree, recomputePedigreeFigures } from './pedigree-figures';

/** The subject CASL checks for an animal: the owning farm has rights on it, the keeping farm reads it. */
export function animalSubject(row: { coopId: string; owningFarmId: string | null; keepingFarmId: string | null }) {
  return subjectOf('Animal', { coopId: row.coopId, owningFarmId: row.owningFarmId, keepingFarmId: row.keepingFarmId });
}

function subjectOfRow(row: AnimalRow) {
  return animalSubject({ coopId: row.coop_id, owningFarmId: row.owning_farm_id, keepingFarmId: row.keeping_farm_id });
}

function hasMessages(messages: FieldMessages): boolean {
  return Object.keys(messages).length > 0;
}

function mergeMessages(into: FieldMessages, from: FieldMessages) {
  for (const [key, list] of Object.entries(from)) (into[key] ??= []).push(...list);
}

/** Errors refuse the whole write (400, nothing saved); warnings ask for `confirm: true` (422). */
function refuseOrConfirm(errors: FieldMessages, warnings: FieldMessages, confirmed: boolean | undefined) {
  if (hasMessages(errors)) throw AppError.validation(errors);
  if (hasMessages(warnings) && !confirmed) {
    throw new AppError(
      ErrorCode.confirmationRequired,
      422,
      'Please check the warnings; save again with confirmation if they are right',
      warnings,
    );
  }
}

/** Loads an animal for a change; another co-op's (or a missing) animal is 404, someone else's farm 403. */
async function animalForChange(actor: SessionUser, animalId: string, action: Action, tx: Transaction): Promise<Animal> {
  const animal = await Animal.findOne({ where: { id: animalId, coopId: actor.coopId, isOutside: false }, transaction: tx, lock: tx.LOCK.UPDATE });
  if (!animal) throw AppError.notFound('That animal');
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan(action, animalSubject(animal));
  return animal;
}

// ---------------------------------------------------------------------------------------------
// Reading
// ---------------------------------------------------------------------------------------------

const lifecycleOrder: Record<Lifecycle, number> = { kit: 0, junior: 1, breeding: 2, retired: 3 };
const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/** The actor's own herd (the animals their farm owns or keeps), filtered, sorted and paged. */
export async function listHerd(actor: SessionUser, q: AnimalListQuery): Promise<AnimalListDto> {
  return withTenant(actor, async (tx) => {
    const farmId = actor.farmId;
    if (!farmId) return { items: [], total: 0, page: q.page, pageSize: q.pageSize };
    const ability = defineAbilityFor(actor);
    const ctx = await presentContextFor(actor, tx);
    const bind: unknown[] = [farmId];
    const where = ['NOT a.is_outside', '(a.owning_farm_id = $2 OR a.keeping_farm_id = $2)'];
    const param = (value: unknown) => {
      bind.push(value);
      return `$${bind.length + 1}`;
    };
    if (q.status === 'current') where.push(`a.disposition = 'on_farm'`);
    else if (q.status === 'gone') where.push(`a.disposition <> 'on_farm'`);
    else if (q.status !== 'all') where.push(`a.disposition = 'on_farm' AND a.lifecycle = ${param(q.status)}`);
    if (q.sex) where.push(`a.sex = ${param(q.sex)}`);
    if (q.purity) where.push(`m.purity = ${param(q.purity)}`);
    if (q.breedId) where.push(`(m.breeds -> ${param(q.breedId)}::text) IS NOT NULL`);
    if (q.search) {
      const p = param(`%${q.search.replace(/[\\%_]/g, '\\$&')}%`);
      where.push(`(a.name ILIKE ${p} OR a.tattoo ILIKE ${p} OR a.hutch ILIKE ${p} OR a.colour ILIKE ${p} OR a.registration_number ILIKE ${p})`);
    }
    const rows = (await selectAnimals(tx, actor.coopId, where.join(' AND '), bind, { withWeights: true }))
      // The SQL scope and the ability must agree row by row (architecture, "Permissions").
      .filter((row) => ability.can('read', subjectOfRow(row)));
    let items = rows.map((row) => presentAnimal(row, ctx));
    if (q.ageClass) items = items.filter((a) => a.ageClass === q.ageClass);

    const breedKey = (a: (typeof items)[number]) => a.breedMakeup.breeds[0]?.name ?? '\uffff';
    const compare: Record<AnimalListQuery['sort'], (a: (typeof items)[number], b: (typeof items)[number]) => number> = {
      tattoo: (a, b) => collator.compare(a.tattoo ?? '', b.tattoo ?? ''),
      name: (a, b) => collator.compare(a.name, b.name),
      sex: (a, b) => a.sex.localeCompare(b.sex),
      breed: (a, b) => collator.compare(breedKey(a), breedKey(b)),
      birthDate: (a, b) => (a.birthDate ?? '').localeCompare(b.birthDate ?? ''),
      lifecycle: (a, b) => lifecycleOrder[a.lifecycle] - lifecycleOrder[b.lifecycle],
      hutch: (a, b) => collator.compare(a.hutch, b.hutch),
      coi: (a, b) => a.coi - b.coi,
    };
    const direction = q.dir === 'desc' ? -1 : 1;
    items.sort((a, b) => direction * compare[q.sort](a, b) || collator.compare(a.tattoo ?? '', b.tattoo ?? ''));
    const start = (q.page - 1) * q.pageSize;
    return { items: items.slice(start, start + q.pageSize), total: items.length, page: q.page, pageSize: q.pageSize };
  });
}

async function detailOf(tx: Transaction, actor: SessionUser, ctx: PresentContext, animalId: string): Promise<AnimalDetailDto> {
  const row = await selectAnimalById(tx, actor.coopId, animalId, { withWeights: true });
  if (!row) throw AppError.notFound('That animal');
  const [statusEvents, custodyEvents, offspringRows, parentRows, ancestorIds, notes] = [
    await AnimalStatusEvent.findAll({ where: { animalId }, order: [['effectiveOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx }),
    await CustodyEvent.findAll({ where: { animalId }, order: [['movedOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx }),
    await selectAnimals(tx, actor.coopId, 'a.sire_id = $2 OR a.dam_id = $2', [animalId], { orderBy: 'a.birth_date DESC, a.tattoo' }),
    await selectAnimals(tx, actor.coopId, 'a.id = ANY($2::uuid[])', [[row.sire_id, row.dam_id].filter(Boolean)]),
    await selectAncestorIds(tx, actor.coopId, animalId, 4),
    await AnimalNote.findAll({ where: { animalId }, order: [['notedOn', 'DESC'], ['createdAt', 'DESC']], transaction: tx }),
  ];
  const ancestry = await query<{ id: string; sire_id: string | null; dam_id: string | null }>(
    tx,
    'SELECT id, sire_id, dam_id FROM animals WHERE coop_id = $1 AND id = ANY($2::uuid[])',
    [actor.coopId, ancestorIds],
  );
  const names = await namesOf([...statusEvents.map((e) => e.recordedBy), ...notes.map((n) => n.enteredBy)], tx);
  const farm = (id: string | null) => (id ? { id, name: ctx.farms.get(id)?.name ?? 'A former member farm' } : null);
  const card = (id: string | null) => {
    const parent = parentRows.find((p) => p.id === id);
    return parent ? presentCard(parent, ctx) : null;
  };
  return {
    ...presentAnimal(row, ctx),
    breed: standardBreedOf(row, ctx),
    statusHistory: statusEvents.map((e) => ({
      id: e.id,
      kind: e.kind,
      value: e.value,
      cause: e.cause,
      effectiveOn: e.effectiveOn,
      farm: farm(e.farmId),
      recordedBy: e.recordedBy ? { id: e.recordedBy, name: names.get(e.recordedBy) ?? 'Someone' } : null,
    })),
    custodyHistory: custodyEvents.map((e) => ({
      id: e.id,
      kind: e.kind,
      fromFarm: farm(e.fromFarmId),
      toFarm: farm(e.toFarmId),
      owningFarm: farm(e.owningFarmId),
      keepingFarm: farm(e.keepingFarmId),
      movedOn: e.movedOn,
      tattooBefore: e.tattooBefore,
      tattooAfter: e.tattooAfter,
      note: e.note,
    })),
    offspring: offspringRows.map((o) => presentCard(o, ctx)),
    sire: card(row.sire_id),
    dam: card(row.dam_id),
    completeness: pedigreeCompleteness(
      ancestry.map((a) => ({ id: a.id, sireId: a.sire_id, damId: a.dam_id })),
      animalId,
      4,
    ),
    noteLog: notes.map((n) => ({
      id: n.id,
      animalId: n.animalId,
      body: n.body,
      notedOn: n.notedOn,
      enteredBy: { id: n.enteredBy, name: names.get(n.enteredBy) ?? 'Someone' },
      reviewState: n.reviewState,
      reviewComment: n.reviewComment,
      version: n.version,
    })),
  };
}

/**
 * One animal's full record with its histories, for its own farm (and that farm's apprentices).
 * Another farm's animal answers 403: its pedigree card is open at /api/pedigree-cards/:id instead.
 */
export async function getAnimal(actor: SessionUser, animalId: string): Promise<AnimalDetailDto> {
  return withTenant(actor, async (tx) => {
    const row = await selectAnimalById(tx, actor.coopId, animalId);
    if (!row || row.is_outside) throw AppError.notFound('That animal');
    if (!defineAbilityFor(actor).can('read', subjectOfRow(row))) {
      throw new AppError(ErrorCode.forbidden, 403, "Only the animal's own farm sees its full record; its pedigree card is open to the co-op");
    }
    return detailOf(tx, actor, await presentContextFor(actor, tx), animalId);
  });
}

// ---------------------------------------------------------------------------------------------
// Creating and editing
// ---------------------------------------------------------------------------------------------

function defaultLifecycle(sex: Sex, birthDate: string, today: string, firstBreeding: { doe: number; buck: number } | null): Lifecycle {
  const age = daysBetween(birthDate, today);
  // Kits stay with the doe to weaning, 4–8 weeks (Texas Extension; Rabbit Production).
  if (age < 56) return 'kit';
  const grown = firstBreeding ? (sex === 'doe' ? firstBreeding.doe : firstBreeding.buck) : sex === 'doe' ? 137 : 167;
  return age < grown ? 'junior' : 'breeding';
}

async function resolvePapersParent(
  tx: Transaction,
  actor: SessionUser,
  ctx: PresentContext,
  papers: AnimalCreateInput['sireFromPapers'],
  sex: Sex,
  field: string,
  errors: FieldMessages,
): Promise<string | null> {
  if (!papers) return null;
  const result = await findOrCreateOutside(tx, actor, { ...papers, sex, sireId: null, damId: null }, ctx, field);
  mergeMessages(errors, result.errors);
  return result.animalId;
}

/**
 * Adds an animal to the actor's farm, born here or arrived, with its parents (co-op animals,
 * outside animals, or new ones from papers). Refuses with field errors and writes nothing on bad
 * input; asks for confirmation when a parent was younger than its breed's first-breeding age.
 * Recomputes the co-op's pedigree figures in the same transaction.
 */
export async function createAnimal(actor: SessionUser, input: AnimalCreateInput): Promise<AnimalDetailDto> {
  const farmId = actor.farmId;
  if (!farmId) throw new AppError(ErrorCode.forbidden, 403, 'Only a member of a farm can add animals');
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('create', animalSubject({ coopId: actor.coopId, owningFarmId: farmId, keepingFarmId: farmId }));

  return withTenant(actor, async (tx) => {
    await lockCoopPedigree(actor.coopId, tx);
    const ctx = await presentContextFor(actor, tx);
    if (input.id) {
      const existing = await Animal.findOne({ where: { id: input.id }, paranoid: false, transaction: tx });
      if (existing && existing.owningFarmId === farmId && !existing.deletedAt) return detailOf(tx, actor, ctx, existing.id);
      if (existing) throw new AppError(ErrorCode.conflict, 409, 'That id is already taken; reload and try again');
    }

    const errors: FieldMessages = {};
    const sireId = input.sireId ?? (await resolvePapersParent(tx, actor, ctx, input.sireFromPapers, 'buck', 'sireFromPapers', errors));
    const damId = input.damId ?? (await resolvePapersParent(tx, actor, ctx, input.damFromPapers, 'doe', 'damFromPapers', errors));

    const clash = await tattooClash(tx, actor.coopId, farmId, input.tattoo, null);
    if (clash) {
      const suffixFrom = input.origin === 'arrived' ? input.breederName || 'Arrival' : null;
      (errors.tattoo ??= []).push(tattooClashMessage(input.tattoo, clash, 'in your herd', suffixFrom));
    }
    if (input.arrivedOn && input.arrivedOn > ctx.today) (errors.arrivedOn ??= []).push('An arrival date cannot be in the future');

    const check = await checkPedigree(
      tx,
      actor.coopId,
      { id: null, sex: input.sex, birthDate: input.birthDate, breedId: input.breedId, sireId, damId },
      {
        ctx,
        today: ctx.today,
        fieldFor: { sire: input.sireFromPapers ? 'sireFromPapers' : 'sireId', dam: input.damFromPapers ? 'damFromPapers' : 'damId' },
      },
    );
    mergeMessages(errors, check.errors);
    refuseOrConfirm(errors, check.warnings, input.confirm);

    const breed = input.breedId ? ctx.breeds.get(input.breedId) : undefined;
    const firstBreeding = breed ? { doe: breed.firstBreedingDays.doe.min, buck: breed.firstBreedingDays.buck.min } : null;
    const lifecycle = input.lifecycle ?? defaultLifecycle(input.sex, input.birthDate, ctx.today, firstBreeding);
    const arrived = input.origin === 'arrived';
    const startsOn = arrived ? input.arrivedOn! : input.birthDate;
    // A kit is a kit from birth; an older animal entered now is recorded at its stage from today.
    const stageFrom = arrived ? startsOn : lifecycle === 'kit' ? input.birthDate : ctx.today;

    const animal = await Animal.create(
      {
        ...(input.id ? { id: input.id } : {}),
        coopId: actor.coopId,
        isOutside: false,
        breedingFarmId: arrived ? null : farmId,
        breederName: arrived ? input.breederName : '',
        owningFarmId: farmId,
        keepingFarmId: farmId,
        tattoo: input.tattoo,
        name: input.name,
        sex: input.sex,
        breedId: input.breedId,
        colour: input.colour,
        birthDate: input.birthDate,
        sireId,
        damId,
        registrationNumber: input.registrationNumber,
        notes: input.notes,
        hutch: input.hutch,
        lifecycle,
        disposition: 'on_farm',
        createdBy: actor.id,
      },
      { transaction: tx },
    );
    await AnimalStatusEvent.bulkCreate(
      [
        { coopId: actor.coopId, animalId: animal.id, farmId, kind: 'lifecycle', value: lifecycle, cause: null, effectiveOn: stageFrom, recordedBy: actor.id },
        { coopId: actor.coopId, animalId: animal.id, farmId, kind: 'disposition', value: 'on_farm', cause: null, effectiveOn: startsOn, recordedBy: actor.id },
      ],
      { transaction: tx },
    );
    await CustodyEvent.create(
      {
        coopId: actor.coopId,
        animalId: animal.id,
        kind: arrived ? 'arrived' : 'born',
        fromFarmId: null,
        toFarmId: farmId,
        owningFarmId: farmId,
        keepingFarmId: farmId,
        movedOn: startsOn,
        note: arrived && input.breederName ? `From ${input.breederName}` : '',
        recordedBy: actor.id,
      },
      { transaction: tx },
    );
    // An arrival is isolated under the co-op's quarantine rule: the Almanac plans its quarantine.
    if (arrived) await planArrivalQuarantine(tx, { coopId: actor.coopId, farmId, animalId: animal.id, arrivedOn: startsOn });
    await recordChanges(
      { coopId: actor.coopId, tableName: 'animals', recordId: animal.id, actorUserId: actor.id, changes: { created: [null, arrived ? 'arrived' : 'born here'] } },
      tx,
    );
    const changed = await recomputePedigreeFigures(actor.coopId, tx);
    announceAfterCommit(tx, actor.coopId, { farmIds: [farmId], animalId: animal.id, figuresChanged: changed });
    return detailOf(tx, actor, ctx, animal.id);
  });
}

const editableFields = ['tattoo', 'name', 'sex', 'breedId', 'colour', 'birthDate', 'sireId', 'damId', 'registrationNumber', 'hutch', 'notes'] as const;
type EditableField = (typeof editableFields)[number];

/**
 * Edits an animal of the actor's farm from the version it was read at (else 409). A changed parent,
 * sex or birth date is checked against the whole pedigree (no cycle, no doe as sire, no parent born
 * after its offspring, no offspring born before its parent); a changed sire, dam or declared breed
 * recomputes the co-op's COI and breed make-up in the same transaction. Kept in the edit history.
 */
export async function updateAnimal(actor: SessionUser, animalId: string, input: AnimalUpdateInput): Promise<AnimalDetailDto> {
  return withTenant(actor, async (tx) => {
    await lockCoopPedigree(actor.coopId, tx);
    const animal = await animalForChange(actor, animalId, 'update', tx);
    if (animal.version !== input.version) throw AppError.staleVersion();
    const ctx = await presentContextFor(actor, tx);
    const errors: FieldMessages = {};

    const proposed: Partial<Record<EditableField, unknown>> = {};
    for (const field of editableFields) if (input[field] !== undefined) proposed[field] = input[field];
    if (input.sireFromPapers) proposed.sireId = await resolvePapersParent(tx, actor, ctx, input.sireFromPapers, 'buck', 'sireFromPapers', errors);
    if (input.damFromPapers) proposed.damId = await resolvePapersParent(tx, actor, ctx, input.damFromPapers, 'doe', 'damFromPapers', errors);

    const changes: Record<string, [unknown, unknown]> = {};
    for (const [field, value] of Object.entries(proposed) as [EditableField, unknown][]) {
      const before = animal.get(field);
      if (before !== value) changes[field] = [before, value];
    }
    const next = <K extends EditableField>(field: K) => (field in changes ? changes[field]![1] : animal.get(field)) as Animal[K];

    if (changes.tattoo && animal.disposition === 'on_farm' && animal.keepingFarmId) {
      const clash = await tattooClash(tx, actor.coopId, animal.keepingFarmId, next('tattoo')!, animal.id);
      if (clash) (errors.tattoo ??= []).push(tattooClashMessage(next('tattoo')!, clash, 'in your herd', null));
    }
    if (changes.sex) {
      const role = animal.sex === 'buck' ? 'sire' : 'dam';
      const [{ count }] = (await query<{ count: string }>(tx, `SELECT count(*) FROM animals WHERE coop_id = $1 AND deleted_at IS NULL AND ${role}_id = $2`, [actor.coopId, animal.id])) as [{ count: string }];
      if (Number(count) > 0) (errors.sex ??= []).push(`This animal is recorded as the ${role} of ${count} animal(s); its sex cannot change`);
    }
    if (changes.birthDate) {
      const [early] = await query<{ name: string; tattoo: string | null; birth_date: string }>(
        tx,
        `SELECT name, tattoo, birth_date::text AS birth_date FROM animals
         WHERE coop_id = $1 AND deleted_at IS NULL AND (sire_id = $2 OR dam_id = $2) AND birth_date <= $3::date
         ORDER BY birth_date LIMIT 1`,
        [actor.coopId, animal.id, next('birthDate')],
      );
      if (early) (errors.birthDate ??= []).push(`${early.name || early.tattoo} was born on ${early.birth_date}, before this date; a parent is born first`);
    }

    let warnings: FieldMessages = {};
    const pedigreeTouched = ['sireId', 'damId', 'breedId', 'birthDate', 'sex'].some((f) => f in changes);
    if (pedigreeTouched) {
      const check = await checkPedigree(
        tx,
        actor.coopId,
        { id: animal.id, sex: next('sex'), birthDate: next('birthDate'), breedId: next('breedId'), sireId: next('sireId'), damId: next('damId') },
        {
          ctx,
          today: ctx.today,
          pedigree: await loadPedigreeRows(actor.coopId, tx),
          fieldFor: { sire: input.sireFromPapers ? 'sireFromPapers' : 'sireId', dam: input.damFromPapers ? 'damFromPapers' : 'damId' },
        },
      );
      // Only parents that changed (or whose relation to a changed date changed) are warned about again.
      mergeMessages(errors, check.errors);
      warnings = check.warnings;
      if (!('sireId' in changes) && !('birthDate' in changes)) delete warnings.sireId;
      if (!('damId' in changes) && !('birthDate' in changes)) delete warnings.damId;
    }
    refuseOrConfirm(errors, warnings, input.confirm);

    if (Object.keys(changes).length > 0) {
      animal.set(Object.fromEntries(Object.entries(changes).map(([k, [, v]]) => [k, v])));
      await animal.save({ transaction: tx });
      await recordChanges({ coopId: actor.coopId, tableName: 'animals', recordId: animal.id, actorUserId: actor.id, changes }, tx);
    }
    const figuresChanged = ['sireId', 'damId', 'breedId'].some((f) => f in changes) ? await recomputePedigreeFigures(actor.coopId, tx) : 0;
    if (Object.keys(changes).length > 0) {
      announceAfterCommit(tx, actor.coopId, { farmIds: [animal.owningFarmId, animal.keepingFarmId], animalId: animal.id, figuresChanged });
    }
    return detailOf(tx, actor, ctx, animal.id);
  });
}

// ---------------------------------------------------------------------------------------------
// Status and custody
// ---------------------------------------------------------------------------------------------

/** Records a dated lifecycle or disposition change (with a cause for a cull) on the owning farm. */
export async function recordStatus(actor: SessionUser, animalId: string, input: StatusEventInput): Promise<AnimalDetailDto> {
  return withTenant(actor, async (tx) => {
    const ctx = await applyStatusEvent(tx, actor, animalId, input);
    return detailOf(tx, actor, ctx, animalId);
  });
}

/**
 * A lifecycle or disposition change inside the caller's transaction (a processing record sets
 * 'processed', issue 7): the same checks and history as recordStatus; throws AppError when refused.
 */
export async function applyStatusEvent(tx: Transaction, actor: SessionUser, animalId: string, input: StatusEventInput) {
  {
    const animal = await animalForChange(actor, animalId, 'update', tx);
    const ctx = await presentContextFor(actor, tx);
    const errors: FieldMessages = {};
    if (input.effectiveOn > ctx.today) errors.effectiveOn = ['A status change cannot be dated in the future'];
    if (animal.birthDate && input.effectiveOn < animal.birthDate) errors.effectiveOn = ['That is before the animal was born'];
    const current = input.kind === 'lifecycle' ? animal.lifecycle : animal.disposition;
    if (current === input.value) (errors.value ??= []).push('That is already its status');
    if (input.kind === 'lifecycle' && animal.disposition !== 'on_farm') (errors.value ??= []).push('It is no longer on a farm');
    if (input.kind === 'disposition' && input.value === 'on_farm' && animal.keepingFarmId && animal.tattoo) {
      const clash = await tattooClash(tx, actor.coopId, animal.keepingFarmId, animal.tattoo, animal.id);
      if (clash) errors.value = [`${tattooClashMessage(animal.tattoo, clash, 'in your herd', null)} Change its tattoo first.`];
    }
    if (hasMessages(errors)) throw AppError.validation(errors);

    const changes: Record<string, [unknown, unknown]> = {};
    if (input.kind === 'lifecycle') {
      changes.lifecycle = [animal.lifecycle, input.value];
      animal.lifecycle = input.value as Lifecycle;
    } else {
      changes.disposition = [animal.disposition, input.value];
      changes.dispositionCause = [animal.dispositionCause, input.cause ?? null];
      animal.disposition = input.value as Disposition;
      animal.dispositionCause = input.value === 'on_farm' ? null : (input.cause ?? null);
    }
    await animal.save({ transaction: tx });
    await AnimalStatusEvent.create(
      {
        coopId: actor.coopId,
        animalId,
        farmId: animal.owningFarmId,
        kind: input.kind,
        value: input.value,
        cause: input.cause ?? null,
        effectiveOn: input.effectiveOn,
        recordedBy: actor.id,
      },
      { transaction: tx },
    );
    if (input.kind === 'disposition' && input.value === 'sold') {
      await CustodyEvent.create(
        {
          coopId: actor.coopId, animalId, kind: 'left', fromFarmId: animal.keepingFarmId, toFarmId: null,
          owningFarmId: animal.owningFarmId, keepingFarmId: animal.keepingFarmId, movedOn: input.effectiveOn,
          note: input.cause ?? 'Sold outside the co-op', recordedBy: actor.id,
        },
        { transaction: tx },
      );
    }
    await recordChanges({ coopId: actor.coopId, tableName: 'animals', recordId: animal.id, actorUserId: actor.id, changes }, tx);
    // Leaving or returning changes the card's "on farm" and current farm for everyone.
    announceAfterCommit(tx, actor.coopId, {
      farmIds: [animal.owningFarmId, animal.keepingFarmId],
      animalId,
      figuresChanged: input.kind === 'disposition' ? 1 : 0,
    });
    return ctx;
  }
}

/**
 * Moves an animal between farms of the co-op and keeps the move in its custody history: a transfer
 * of ownership, a loan out, or its return home. An arrival whose tattoo clashes with one the
 * destination already keeps is refused with a prompt to re-tattoo or add a farm suffix
 * (`newTattoo`). Later issues (loans, trades) build on `applyCustodyMove`.
 */
export async function moveAnimal(actor: SessionUser, animalId: string, input: CustodyMoveInput): Promise<AnimalDetailDto> {
  return withTenant(actor, async (tx) => {
    const action: Action = input.kind === 'transferred' ? 'trade' : input.kind === 'lent' ? 'lend' : 'update';
    const animal = await animalForChange(actor, animalId, action, tx);
    const ctx = await presentContextFor(actor, tx);
    await applyCustodyMove(tx, actor, animal, input, ctx);
    return detailOf(tx, actor, ctx, animalId);
  });
}

export async function applyCustodyMove(tx: Transaction, actor: SessionUser, animal: Animal, input: CustodyMoveInput, ctx: PresentContext): Promise<void> {
  const errors: FieldMessages = {};
  const from = animal.keepingFarmId!;
  const to = input.kind === 'returned' ? animal.owningFarmId! : input.toFarmId!;
  if (animal.disposition !== 'on_farm') errors.kind = ['It is no longer on a farm'];
  if (input.kind !== 'returned' && !ctx.farms.has(to)) errors.toFarmId = ['No such farm in the co-op'];
  if (input.kind !== 'returned' && to === animal.owningFarmId) errors.toFarmId = ['It already belongs to that farm'];
  if (input.kind !== 'returned' && animal.keepingFarmId !== animal.owningFarmId) errors.kind = ['It is on loan elsewhere; record its return first'];
  if (input.kind === 'returned' && animal.keepingFarmId === animal.owningFarmId) errors.kind = ['It is already at home'];
  if (input.movedOn > ctx.today) errors.movedOn = ['A move cannot be dated in the future'];
  const [last] = await query<{ moved_on: string }>(tx, 'SELECT max(moved_on)::text AS moved_on FROM animal_custody_events WHERE animal_id = $1', [animal.id]);
  if (last?.moved_on && input.movedOn < last.moved_on) errors.movedOn = [`Its last move was on ${last.moved_on}; a new one cannot be earlier`];

  const tattoo = input.newTattoo ?? animal.tattoo!;
  if (!errors.toFarmId && ctx.farms.has(to)) {
    const clash = await tattooClash(tx, actor.coopId, to, tattoo, animal.id);
    if (clash) {
      const destination = ctx.farms.get(to)!.name;
      const message = tattooClashMessage(tattoo, clash, `at ${destination}`, ctx.farms.get(from)?.name ?? 'Farm');
      (errors[input.newTattoo ? 'newTattoo' : 'tattoo'] ??= []).push(input.newTattoo ? message : `${message} Give the new tattoo as newTattoo.`);
    }
  }
  if (hasMessages(errors)) throw AppError.validation(errors);

  const before = { owningFarmId: animal.owningFarmId, keepingFarmId: animal.keepingFarmId, tattoo: animal.tattoo, hutch: animal.hutch };
  // A hutch number means something only on the farm that assigned it.
  if (input.kind === 'transferred') animal.set({ owningFarmId: to, keepingFarmId: to, hutch: '' });
  else animal.set({ keepingFarmId: to, hutch: input.kind === 'lent' ? '' : animal.hutch });
  animal.tattoo = tattoo;
  await animal.save({ transaction: tx });

  await CustodyEvent.create(
    {
      coopId: actor.coopId,
      animalId: animal.id,
      kind: input.kind,
      fromFarmId: from,
      toFarmId: to,
      owningFarmId: animal.owningFarmId,
      keepingFarmId: animal.keepingFarmId,
      movedOn: input.movedOn,
      tattooBefore: tattoo !== before.tattoo ? before.tattoo : null,
      tattooAfter: tattoo !== before.tattoo ? tattoo : null,
      note: input.note,
      recordedBy: actor.id,
    },
    { transaction: tx },
  );
  // Arriving at a farm (traded, lent to it, back home from a loan): the Almanac plans its quarantine there.
  await planArrivalQuarantine(tx, { coopId: actor.coopId, farmId: to, animalId: animal.id, arrivedOn: input.movedOn });
  if (input.kind === 'transferred') {
    await AnimalStatusEvent.bulkCreate(
      [
        { coopId: actor.coopId, animalId: animal.id, farmId: from, kind: 'disposition', value: 'transferred', cause: `To ${ctx.farms.get(to)?.name}`, effectiveOn: input.movedOn, recordedBy: actor.id },
        { coopId: actor.coopId, animalId: animal.id, farmId: to, kind: 'disposition', value: 'on_farm', cause: null, effectiveOn: input.movedOn, recordedBy: actor.id },
      ],
      { transaction: tx },
    );
  }
  const changes: Record<string, [unknown, unknown]> = {};
  for (const key of ['owningFarmId', 'keepingFarmId', 'tattoo', 'hutch'] as const) {
    if (before[key] !== animal.get(key)) changes[key] = [before[key], animal.get(key)];
  }
  await recordChanges({ coopId: actor.coopId, tableName: 'animals', recordId: animal.id, actorUserId: actor.id, changes }, tx);
  announceAfterCommit(tx, actor.coopId, { farmIds: [from, to, before.owningFarmId], animalId: animal.id, figuresChanged: 1 });
}

/** The full-record subject of an animal row (for other services of this module). */
export function canReadAnimalRow(actor: SessionUser, row: AnimalRow): boolean {
  return defineAbilityFor(actor).can('read', subjectOfRow(row));
}


// ---------------------------------------------------------------------------------------------
// For other domains (the Almanac, litters, housing: issue 6), inside the caller's transaction
// ---------------------------------------------------------------------------------------------

/** What the Almanac and litters need to know of an animal. */
export interface AnimalFacts {
  id: string;
  coopId: string;
  isOutside: boolean;
  name: string;
  tattoo: string | null;
  sex: Sex;
  birthDate: string | null;
  breedId: string | null;
  breedName: string | null;
  /**
   * The breed as a cross is named by: the recorded breed, else the one breed its whole known pedigree is
   * of (a home-bred kit of two recorded New Zealands is a New Zealand); null when neither says.
   */
  lineBreedName: string | null;
  /** The breed's earliest usual first-breeding ages, days (null: breed unknown). */
  firstBreedingMinDays: { doe: number; buck: number } | null;
  breedingFarmId: string | null;
  owningFarmId: string | null;
  keepingFarmId: string | null;
  lifecycle: Lifecycle;
  disposition: Disposition;
  sireId: string | null;
  damId: string | null;
}

function wholeBreedOf(row: AnimalRow, breeds: Map<string, { name: string }>): string | null {
  if (row.purity !== 'purebred' || !row.makeup_breeds) return null;
  const [only, ...others] = Object.keys(row.makeup_breeds);
  return only && others.length === 0 ? breeds.get(only)?.name ?? null : null;
}

async function factsOfRows(tx: Transaction, coopId: string, rows: AnimalRow[]): Promise<AnimalFacts[]> {
  if (rows.length === 0) return [];
  const { breeds } = await presentContextFor({ coopId, farmId: null }, tx);
  return rows.map((row) => {
    const breed = row.breed_id ? breeds.get(row.breed_id) : undefined;
    return {
      id: row.id,
      coopId: row.coop_id,
      isOutside: row.is_outside,
      name: row.name,
      tattoo: row.tattoo,
      sex: row.sex,
      birthDate: row.birth_date,
      breedId: row.breed_id,
      breedName: breed?.name ?? null,
      lineBreedName: breed?.name ?? wholeBreedOf(row, breeds),
      firstBreedingMinDays: breed ? { doe: breed.firstBreedingDays.doe.min, buck: breed.firstBreedingDays.buck.min } : null,
      breedingFarmId: row.breeding_farm_id,
      owningFarmId: row.owning_farm_id,
      keepingFarmId: row.keeping_farm_id,
      lifecycle: row.lifecycle,
      disposition: row.disposition,
      sireId: row.sire_id,
      damId: row.dam_id,
    };
  });
}

/** Facts of the co-op's animals by id (missing ids, e.g. another co-op's, are simply absent). */
export async function animalFactsOf(tx: Transaction, coopId: string, ids: string[]): Promise<Map<string, AnimalFacts>> {
  const unique = [...new Set(ids)];
  const facts = await factsOfRows(tx, coopId, await selectAnimals(tx, coopId, 'a.id = ANY($2::uuid[])', [unique]));
  return new Map(facts.map((f) => [f.id, f]));
}

/** The animals a farm keeps today that are old enough to be more than kits (its breeding stock and juniors). */
export async function farmBreedingStockOf(tx: Transaction, coopId: string, farmId: string): Promise<AnimalFacts[]> {
  const rows = await selectAnimals(
    tx, coopId,
    `NOT a.is_outside AND a.keeping_farm_id = $2 AND a.disposition = 'on_farm' AND a.lifecycle IN ('junior', 'breeding')`,
    [farmId], { orderBy: 'a.sex, a.name, a.tattoo' },
  );
  return factsOfRows(tx, coopId, rows);
}

/** Animals born of these parents on these dates (a litter's kits that were given their own records). */
export async function animalsBornOf(tx: Transaction, coopId: string, litters: { sireId: string; damId: string; birthDate: string }[]): Promise<AnimalFacts[]> {
  if (litters.length === 0) return [];
  const rows = await selectAnimals(
    tx, coopId,
    `NOT a.is_outside AND (a.sire_id, a.dam_id, a.birth_date) IN (
       SELECT * FROM unnest($2::uuid[], $3::uuid[], $4::date[]))`,
    [litters.map((l) => l.sireId), litters.map((l) => l.damId), litters.map((l) => l.birthDate)],
    { orderBy: 'a.tattoo' },
  );
  return factsOfRows(tx, coopId, rows);
}

/** What a viewer may do with an animal's farm-private record (its photos, its papers). */
export interface AnimalAccess {
  id: string;
  tattoo: string | null;
  name: string;
  owningFarmId: string | null;
  keepingFarmId: string | null;
  /** Its owning and keeping farm, and their apprentices; the rest of the co-op sees only its pedigree card. */
  canRead: boolean;
  /** Its owning farm. */
  canUpdate: boolean;
}

/**
 * May this viewer see (and change) this animal's farm-private record? Null when it is not a farm
 * animal of the viewer's co-op (another co-op's, an outside one from papers, or no such id), inside
 * the caller's transaction (for the photos and herd-files domains).
 */
export async function animalAccess(actor: SessionUser, animalId: string, tx: Transaction): Promise<AnimalAccess | null> {
  const animal = await Animal.findOne({
    where: { id: animalId, coopId: actor.coopId, isOutside: false },
    attributes: ['id', 'coopId', 'tattoo', 'name', 'owningFarmId', 'keepingFarmId'],
    transaction: tx,
  });
  if (!animal) return null;
  const ability = defineAbilityFor(actor);
  const subject = animalSubject(animal);
  return {
    id: animal.id,
    tattoo: animal.tattoo,
    name: animal.name,
    owningFarmId: animal.owningFarmId,
    keepingFarmId: animal.keepingFarmId,
    canRead: ability.can('read', subject),
    canUpdate: ability.can('update', subject),
  };
}

/** Every co-op animal (not the outside ones from papers), for loading a breeding history. */
export async function coopAnimalFactsOf(tx: Transaction, coopId: string): Promise<AnimalFacts[]> {
  return factsOfRows(tx, coopId, await selectAnimals(tx, coopId, 'NOT a.is_outside', [], { orderBy: 'a.birth_date, a.tattoo' }));
}
