import { placeByWrittenHutch } from './animal-edits.service';
import { authorize } from '../farms/farm-access';
import { animalRecord } from './animal-access';
import type { CreationAttributes, Transaction } from 'sequelize';
import {
  ErrorCode, findPedigreeCycle, type Disposition, type HerdRecordForImport, type ImportPlan, type Lifecycle, type Sex,
} from '@burrowline/shared';
import { insertMany, type ColumnType } from '../../db/bulk-insert';
import { database } from '../../db/sequelize';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordChangesMany } from '../audit/audit.service';
import { announceAfterCommit } from './animal-context';
import { AnimalStatusEvent } from './animal-status-event.model';
import { Animal } from './animal.model';
import { query } from './animal-queries';
import { CustodyEvent } from './custody-event.model';
import { bumpPedigreeVersion, lockCoopPedigree, recomputePedigreeFigures } from './pedigree-figures';

const animalColumns: Record<string, ColumnType> = {
  id: 'uuid', coopId: 'uuid', isOutside: 'boolean', breedingFarmId: 'uuid', breederName: 'text', owningFarmId: 'uuid', keepingFarmId: 'uuid',
  tattoo: 'text', name: 'text', sex: 'text', breedId: 'uuid', colour: 'text', birthDate: 'date', sireId: 'uuid', damId: 'uuid',
  registrationNumber: 'text', notes: 'text', hutch: 'text', lifecycle: 'text', disposition: 'text', dispositionCause: 'text', createdBy: 'uuid',
};
const statusColumns: Record<string, ColumnType> = {
  coopId: 'uuid', animalId: 'uuid', farmId: 'uuid', kind: 'text', value: 'text', cause: 'text', effectiveOn: 'date', recordedBy: 'uuid',
};
const custodyColumns: Record<string, ColumnType> = {
  coopId: 'uuid', animalId: 'uuid', kind: 'text', fromFarmId: 'uuid', toFarmId: 'uuid', owningFarmId: 'uuid', keepingFarmId: 'uuid',
  movedOn: 'date', note: 'text', recordedBy: 'uuid',
};

/** One animal of a bulk load (the demo herds; later, a spreadsheet import). */
export interface ImportedAnimal {
  id: string;
  /** Null for an outside animal known from papers. */
  farmId: string | null;
  /** The farm that bred it, when that was a co-op farm (differs from `farmId` when it moved). */
  breedingFarmId: string | null;
  breederName?: string;
  tattoo: string | null;
  name: string;
  sex: Sex;
  breedId: string | null;
  colour?: string;
  birthDate: string | null;
  sireId: string | null;
  damId: string | null;
  registrationNumber?: string | null;
  hutch?: string;
  notes?: string;
  lifecycle?: Lifecycle;
  disposition?: Disposition;
  dispositionCause?: string | null;
  /** When the disposition (other than on farm) took effect. */
  dispositionOn?: string;
  /** Arrived from outside the co-op on this date (else born on `breedingFarmId`). */
  arrivedOn?: string;
  /** Moved here from its breeding farm (a transfer between co-op farms) on this date. */
  transferredOn?: string;
}

export interface ImportedWeighIn {
  farmId: string;
  animalId: string;
  totalGrams: number;
  weighedOn: string;
  enteredBy: string;
  reviewState: 'pending' | 'accepted';
}

/**
 * Loads many animals at once inside the caller's tenant transaction, with the same rules a single
 * entry obeys (parents of the right sex and born first, tattoos unique among a farm's kept animals,
 * no cycle), their status and custody histories, and one recomputation of the pedigree figures.
 * Throws on the first broken rule, naming the animal, so the whole load rolls back.
 */
export async function importHerd(
  coopId: string,
  animals: ImportedAnimal[],
  recordedBy: string | null,
  tx: Transaction,
  opts: { recompute?: boolean } = {},
): Promise<void> {
  await lockCoopPedigree(coopId, tx);
  const byId = new Map<string, Pick<ImportedAnimal, 'name' | 'sex' | 'birthDate'>>(animals.map((a) => [a.id, a]));
  // A spreadsheet names animals already on record as parents: those are checked from the records.
  const onRecord = [...new Set(animals.flatMap((a) => [a.sireId, a.damId]))].filter((id): id is string => id !== null && !byId.has(id));
  if (onRecord.length > 0) {
    const rows = await query<{ id: string; name: string; sex: Sex; birth_date: string | null }>(
      tx,
      'SELECT id, name, sex, birth_date::text AS birth_date FROM animals WHERE coop_id = $1 AND deleted_at IS NULL AND id = ANY($2::uuid[])',
      [coopId, onRecord],
    );
    for (const row of rows) byId.set(row.id, { name: row.name, sex: row.sex, birthDate: row.birth_date });
  }
  const kept = new Set<string>();
  for (const a of animals) {
    for (const [role, parentId, sex] of [['sire', a.sireId, 'buck'], ['dam', a.damId, 'doe']] as const) {
      if (!parentId) continue;
      const parent = byId.get(parentId);
      if (!parent) throw new Error(`${a.name || a.tattoo}: its ${role} is neither in the load nor on record`);
      if (parent.sex !== sex) throw new Error(`${a.name || a.tattoo}: its ${role} ${parent.name} is a ${parent.sex}`);
      if (parent.birthDate && a.birthDate && parent.birthDate >= a.birthDate) throw new Error(`${a.name || a.tattoo}: its ${role} was born after it`);
    }
    if (a.farmId && (a.disposition ?? 'on_farm') === 'on_farm') {
      const key = `${a.farmId}:${a.tattoo!.toLowerCase()}`;
      if (kept.has(key)) throw new Error(`Tattoo ${a.tattoo} is kept twice on one farm`);
      kept.add(key);
    }
  }
  const cycle = findPedigreeCycle(animals);
  if (cycle) throw new Error(`Pedigree cycle through ${cycle.join(' → ')}`);

  // One statement per table (see db/bulk-insert.ts): a spreadsheet of 10,000 animals loads in seconds.
  await insertMany(
    tx,
    'animals',
    animalColumns,
    animals.map((a) => ({
      id: a.id,
      coopId,
      isOutside: a.farmId === null,
      breedingFarmId: a.farmId === null ? null : a.breedingFarmId,
      breederName: a.breederName ?? '',
      owningFarmId: a.farmId,
      keepingFarmId: a.farmId,
      tattoo: a.tattoo,
      name: a.name,
      sex: a.sex,
      breedId: a.breedId,
      colour: a.colour ?? '',
      birthDate: a.birthDate,
      sireId: a.sireId,
      damId: a.damId,
      registrationNumber: a.registrationNumber ?? null,
      notes: a.notes ?? '',
      hutch: a.hutch ?? '',
      lifecycle: a.lifecycle ?? 'breeding',
      disposition: a.disposition ?? 'on_farm',
      dispositionCause: a.dispositionCause ?? null,
      createdBy: recordedBy,
    })),
  );

  const statusRows: CreationAttributes<AnimalStatusEvent>[] = [];
  const custodyRows: CreationAttributes<CustodyEvent>[] = [];
  for (const a of animals) {
    if (a.farmId === null) continue;
    const home = a.breedingFarmId ?? a.farmId;
    const startsOn = a.arrivedOn ?? a.birthDate!;
    const startFarm = a.arrivedOn ? a.farmId : home;
    custodyRows.push({
      coopId, animalId: a.id, kind: a.arrivedOn ? 'arrived' : 'born', fromFarmId: null, toFarmId: startFarm,
      owningFarmId: startFarm, keepingFarmId: startFarm, movedOn: startsOn, note: a.arrivedOn && a.breederName ? `From ${a.breederName}` : '', recordedBy,
    });
    statusRows.push({ coopId, animalId: a.id, farmId: startFarm, kind: 'disposition', value: 'on_farm', cause: null, effectiveOn: startsOn, recordedBy });
    statusRows.push({ coopId, animalId: a.id, farmId: startFarm, kind: 'lifecycle', value: a.arrivedOn ? (a.lifecycle ?? 'breeding') : 'kit', cause: null, effectiveOn: startsOn, recordedBy });
    if (a.transferredOn && home !== a.farmId) {
      custodyRows.push({
        coopId, animalId: a.id, kind: 'transferred', fromFarmId: home, toFarmId: a.farmId, owningFarmId: a.farmId, keepingFarmId: a.farmId,
        movedOn: a.transferredOn, note: '', recordedBy,
      });
      statusRows.push({ coopId, animalId: a.id, farmId: home, kind: 'disposition', value: 'transferred', cause: null, effectiveOn: a.transferredOn, recordedBy });
      statusRows.push({ coopId, animalId: a.id, farmId: a.farmId, kind: 'disposition', value: 'on_farm', cause: null, effectiveOn: a.transferredOn, recordedBy });
    }
    if (!a.arrivedOn && a.lifecycle && a.lifecycle !== 'kit' && a.birthDate) {
      // Kits become juniors at weaning (8 weeks here) and breeders later; the load dates the stage it reports.
      const weaned = new Date(Date.parse(a.birthDate) + 56 * 86_400_000).toISOString().slice(0, 10);
      statusRows.push({ coopId, animalId: a.id, farmId: a.farmId, kind: 'lifecycle', value: a.lifecycle === 'junior' ? 'junior' : a.lifecycle, cause: null, effectiveOn: weaned, recordedBy });
    }
    if (a.disposition && a.disposition !== 'on_farm') {
      statusRows.push({
        coopId, animalId: a.id, farmId: a.farmId, kind: 'disposition', value: a.disposition, cause: a.dispositionCause ?? null,
        effectiveOn: a.dispositionOn ?? startsOn, recordedBy,
      });
    }
  }
  await insertMany(tx, 'animal_status_events', statusColumns, statusRows);
  await insertMany(tx, 'animal_custody_events', custodyColumns, custodyRows);
  // A written hutch is where the animal lives: the farm's hutch of that name, made when new.
  await placeByWrittenHutch(tx, coopId, animals.filter((a) => a.farmId && a.hutch?.trim()).map((a) => a.id));
  // A caller that writes more in the same transaction recomputes once at the end instead.
  const ids = animals.map((a) => a.id);
  if (opts.recompute !== false) await recomputePedigreeFigures(coopId, tx, ids);
  else await bumpPedigreeVersion(coopId, tx, ids);
}

/** Bulk weigh-ins for animals already loaded (demo growth records). */
export async function importWeighIns(coopId: string, rows: ImportedWeighIn[], tx: Transaction): Promise<void> {
  if (rows.length === 0) return;
  await insertMany(
    tx,
    'weigh_ins',
    { coopId: 'uuid', farmId: 'uuid', animalId: 'uuid', totalGrams: 'integer', headCount: 'integer', weighedOn: 'date', enteredBy: 'uuid', reviewState: 'text' },
    rows.map((r) => ({ coopId, farmId: r.farmId, animalId: r.animalId, totalGrams: r.totalGrams, headCount: 1, weighedOn: r.weighedOn, enteredBy: r.enteredBy, reviewState: r.reviewState })),
  );
}

/** Whether the co-op has any animal yet (the demo loader fills an older, herd-less demo co-op once). */
export async function coopHasAnimals(coopId: string, tx: Transaction): Promise<boolean> {
  return (await Animal.count({ where: { coopId }, paranoid: false, transaction: tx })) > 0;
}

// ---------------------------------------------------------------------------------------------
// Spreadsheet import: the herd as the check sees it, and the confirmed plan written at once
// ---------------------------------------------------------------------------------------------

/**
 * The farm's records for checking a spreadsheet: every animal it owns or keeps, present or gone, with
 * its parents' tattoos and its latest weight (inside the caller's transaction).
 */
export async function herdRecordsForImport(coopId: string, farmId: string, tx: Transaction): Promise<HerdRecordForImport[]> {
  const rows = await query<{
    id: string; tattoo: string; name: string; sex: Sex; birth_date: string; breed_id: string | null; colour: string;
    registration_number: string | null; hutch: string; notes: string; sire_id: string | null; dam_id: string | null;
    sire_tattoo: string | null; dam_tattoo: string | null; on_farm_here: boolean; owned_here: boolean; disposition: Disposition;
    version: number; latest_grams: number | null; latest_weighed_on: string | null;
  }>(
    tx,
    `SELECT a.id, a.tattoo, a.name, a.sex, a.birth_date::text AS birth_date, a.breed_id, a.colour, a.registration_number,
            a.hutch, a.notes, a.sire_id, a.dam_id, s.tattoo AS sire_tattoo, d.tattoo AS dam_tattoo,
            (a.keeping_farm_id = $2 AND a.disposition = 'on_farm') AS on_farm_here, (a.owning_farm_id = $2) AS owned_here,
            a.disposition, a.version, w.total_grams AS latest_grams, w.weighed_on::text AS latest_weighed_on
     FROM animals a
     LEFT JOIN animals s ON s.id = a.sire_id
     LEFT JOIN animals d ON d.id = a.dam_id
     LEFT JOIN LATERAL (
       SELECT wi.total_grams, wi.weighed_on FROM weigh_ins wi
       WHERE wi.animal_id = a.id AND wi.deleted_at IS NULL AND wi.review_state <> 'returned' AND wi.head_count = 1
       ORDER BY wi.weighed_on DESC, wi.created_at DESC LIMIT 1
     ) w ON true
     WHERE a.coop_id = $1 AND a.deleted_at IS NULL AND NOT a.is_outside AND (a.owning_farm_id = $2 OR a.keeping_farm_id = $2)`,
    [coopId, farmId],
  );
  return rows.map((r) => ({
    id: r.id, tattoo: r.tattoo, name: r.name, sex: r.sex, birthDate: r.birth_date, breedId: r.breed_id, colour: r.colour,
    registrationNumber: r.registration_number, hutch: r.hutch, notes: r.notes, sireId: r.sire_id, damId: r.dam_id,
    sireTattoo: r.sire_tattoo, damTattoo: r.dam_tattoo, onFarmHere: r.on_farm_here, ownedHere: r.owned_here,
    disposition: r.disposition, version: r.version,
    latestWeight: r.latest_grams !== null && r.latest_weighed_on ? { grams: r.latest_grams, weighedOn: r.latest_weighed_on } : null,
  }));
}

export interface SpreadsheetImportResult {
  created: number;
  updated: number;
  weighIns: number;
  figuresChanged: number;
}

const updatableColumns = {
  name: 'text', colour: 'text', registrationNumber: 'text', hutch: 'text', notes: 'text', breedId: 'uuid', sireId: 'uuid', damId: 'uuid',
} as const;
const columnOf: Record<keyof typeof updatableColumns, string> = {
  name: 'name', colour: 'colour', registrationNumber: 'registration_number', hutch: 'hutch', notes: 'notes', breedId: 'breed_id', sireId: 'sire_id', damId: 'dam_id',
};

/**
 * Writes a checked spreadsheet into the actor's farm inside the caller's transaction: the new animals
 * with the ids the preview gave them (and their histories), the field changes of animals already in
 * the herd (each from the version the preview read, else 409, kept in the edit history), the weigh-ins,
 * then ONE recomputation of the co-op's COI and breed make-up. Announced live after commit.
 */
export async function importSpreadsheet(
  actor: SessionUser,
  plan: ImportPlan & { source: string },
  tx: Transaction,
): Promise<SpreadsheetImportResult> {
  const farmId = actor.farmId;
  if (!farmId) throw new AppError(ErrorCode.forbidden, 403, 'Only a member of a farm can import animals');
  authorize(actor, 'create', animalRecord({ owningFarmId: farmId, keepingFarmId: farmId }), 'You may not do that');
  await lockCoopPedigree(actor.coopId, tx);

  const updates = plan.updates;
  if (updates.length > 0) {
    const current = new Map(
      (
        await query<{ id: string; version: number; owning_farm_id: string | null }>(
          tx,
          'SELECT id, version, owning_farm_id FROM animals WHERE coop_id = $1 AND deleted_at IS NULL AND id = ANY($2::uuid[]) FOR UPDATE',
          [actor.coopId, updates.map((u) => u.animalId)],
        )
      ).map((r) => [r.id, r]),
    );
    for (const update of updates) {
      const row = current.get(update.animalId);
      if (!row || row.owning_farm_id !== farmId) throw AppError.notFound('An animal of the file');
      if (row.version !== update.version) throw AppError.staleVersion();
    }
  }

  await importHerd(
    actor.coopId,
    plan.creates.map((a) => ({
      id: a.id,
      farmId,
      breedingFarmId: a.breederName ? null : farmId,
      breederName: a.breederName,
      tattoo: a.tattoo,
      name: a.name,
      sex: a.sex,
      breedId: a.breedId,
      colour: a.colour,
      birthDate: a.birthDate,
      sireId: a.sireId,
      damId: a.damId,
      registrationNumber: a.registrationNumber,
      hutch: a.hutch,
      notes: a.notes,
      lifecycle: a.lifecycle,
      ...(a.arrivedOn ? { arrivedOn: a.arrivedOn } : {}),
    })),
    actor.id,
    tx,
    { recompute: false },
  );

  const history: Parameters<typeof recordChangesMany>[0] = plan.creates.map((a) => ({
    coopId: actor.coopId, tableName: 'animals', recordId: a.id, actorUserId: actor.id,
    changes: { created: [null, `imported from ${plan.source}, line ${a.line}`] },
  }));
  if (updates.length > 0) {
    const before = new Map(
      (await query<Record<string, unknown> & { id: string }>(
        tx,
        `SELECT id, ${Object.values(columnOf).join(', ')} FROM animals WHERE id = ANY($1::uuid[])`,
        [updates.map((u) => u.animalId)],
      )).map((r) => [r.id, r]),
    );
    const fields = Object.keys(updatableColumns) as (keyof typeof updatableColumns)[];
    // One statement for every changed animal: per column, whether it changes and its new value.
    const bind: unknown[] = [updates.map((u) => u.animalId)];
    const arrays = ['$1::uuid[]'];
    const columns = ['id'];
    const sets: string[] = [];
    for (const field of fields) {
      const column = columnOf[field];
      bind.push(updates.map((u) => field in u.changes));
      arrays.push(`$${bind.length}::boolean[]`);
      bind.push(updates.map((u) => (field in u.changes ? (u.changes[field] ?? null) : null)));
      arrays.push(`$${bind.length}::${updatableColumns[field]}[]`);
      columns.push(`set_${column}`, `v_${column}`);
      sets.push(`${column} = CASE WHEN u.set_${column} THEN u.v_${column} ELSE a.${column} END`);
    }
    await database().query(
      `UPDATE animals a SET ${sets.join(', ')}, version = a.version + 1, updated_at = now()
       FROM unnest(${arrays.join(', ')}) AS u(${columns.join(', ')})
       WHERE a.id = u.id AND a.coop_id = $${bind.length + 1}`,
      { bind: [...bind, actor.coopId], transaction: tx },
    );
    for (const update of updates) {
      const old: Record<string, unknown> = before.get(update.animalId) ?? {};
      const changes: Record<string, [unknown, unknown]> = {};
      for (const [field, value] of Object.entries(update.changes)) changes[field] = [old[columnOf[field as keyof typeof columnOf]] ?? null, value];
      changes.source = [null, `${plan.source}, line ${update.line}`];
      history.push({ coopId: actor.coopId, tableName: 'animals', recordId: update.animalId, actorUserId: actor.id, changes });
    }
  }
  await recordChangesMany(history, tx);
  await placeByWrittenHutch(tx, actor.coopId, updates.filter((u) => typeof u.changes.hutch === 'string' && u.changes.hutch.trim() !== '').map((u) => u.animalId));
  await importWeighIns(
    actor.coopId,
    plan.weighIns.map((w) => ({ farmId, animalId: w.animalId, totalGrams: w.grams, weighedOn: w.weighedOn, enteredBy: actor.id, reviewState: 'accepted' as const })),
    tx,
  );
  const figuresChanged = await recomputePedigreeFigures(actor.coopId, tx);
  announceAfterCommit(tx, actor.coopId, { farmIds: [farmId], animalId: null, figuresChanged });
  return { created: plan.creates.length, updated: updates.length, weighIns: plan.weighIns.length, figuresChanged };
}

/**
 * Takes the co-op's pedigree lock before a spreadsheet is checked for its confirm, so nothing can
 * change the herd between that check and the write (the lock is held to commit).
 */
export async function lockHerdForImport(coopId: string, tx: Transaction): Promise<void> {
  await lockCoopPedigree(coopId, tx);
}
