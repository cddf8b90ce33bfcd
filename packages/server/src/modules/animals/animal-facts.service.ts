import type { Transaction } from 'sequelize';
import { defineAbilityFor, subjectOf, type AnimalRefDto, type Disposition, type Lifecycle, type Sex } from '@burrowline/shared';
import { animalRef } from '../../lib/animal-ref';
import type { SessionUser } from '../../lib/session-user';
import { presentContextFor } from './animal-context';
import { Animal } from './animal.model';
import { query, selectAnimals, type AnimalRow } from './animal-queries';
import { animalSubject } from './animal-access';

/*
 * The herd's published reads for other modules (the Almanac, litters, grow-out, feed, processing,
 * photos, herd files), inside the caller's transaction. Other modules never read the animal model.
 */

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
  if (unique.length === 0) return new Map();
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

/** The young animals (kits and juniors) a farm keeps today, for a weighing round of growing stock. */
export async function farmGrowingAnimalsOf(tx: Transaction, coopId: string, farmId: string): Promise<AnimalFacts[]> {
  const rows = await selectAnimals(
    tx, coopId,
    `NOT a.is_outside AND a.keeping_farm_id = $2 AND a.disposition = 'on_farm' AND a.lifecycle IN ('kit', 'junior')`,
    [farmId], { orderBy: 'a.birth_date, a.tattoo, a.name' },
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
  /** Its owning farm's papers (the pedigree certificate it issues): not a farm that borrows it. */
  canReadPapers: boolean;
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
    canReadPapers: ability.can('read', subject, 'certificate'),
  };
}

/** The kinds of an animal's private records that are listed by the farm that recorded them. */
export type PrivateRecordKind = 'WeighIn' | 'AnimalNote' | 'Photo';

/**
 * The one scope of an animal's private records (weigh-ins, notes, photos): the farms whose records of it
 * the viewer reads, as the ability decides. Those are the farm's own records, plus, on an animal the farm
 * owns, those of farms that owned it before; never those of a farm that borrowed it or lent it. List
 * queries filter on `farm_id IN (…)` with this, inside the caller's transaction.
 */
export async function privateRecordFarmsOf(
  actor: SessionUser,
  animal: { id: string; owningFarmId: string | null },
  kind: PrivateRecordKind,
  tx: Transaction,
): Promise<string[]> {
  if (!actor.farmId) return [];
  const custody = await query<CustodyOwnership>(
    tx,
    `SELECT owning_farm_id AS "owningFarmId", from_farm_id AS "fromFarmId", kind, notes_travel AS "notesTravel"
       FROM animal_custody_events WHERE animal_id = $1`,
    [animal.id],
  );
  return privateRecordFarmsGiven(actor, animal, kind, custody);
}

/** Whether the farm sold the animal through the Swap Board (a transfer that kept its notes at home). */
export async function soldThroughSwapBoard(tx: Transaction, animalId: string, farmId: string | null): Promise<boolean> {
  if (!farmId) return false;
  const found = await query<{ id: string }>(
    tx,
    `SELECT id FROM animal_custody_events WHERE animal_id = $1 AND from_farm_id = $2 AND kind = 'transferred' AND NOT notes_travel LIMIT 1`,
    [animalId, farmId],
  );
  return found.length > 0;
}

/** What of an animal's custody history decides whose private records of it a viewer reads. */
export interface CustodyOwnership { owningFarmId: string | null; fromFarmId: string | null; kind: string; notesTravel: boolean }

/** privateRecordFarmsOf when the caller already read the animal's custody history. */
export function privateRecordFarmsGiven(
  actor: SessionUser,
  animal: { owningFarmId: string | null },
  kind: PrivateRecordKind,
  custody: CustodyOwnership[],
): string[] {
  if (!actor.farmId) return [];
  // A farm that sold the animal through the Swap Board keeps its notes: the buyer reads its weights and photos only.
  const notesStay = (farmId: string) => custody.some((e) => e.fromFarmId === farmId && e.kind === 'transferred' && !e.notesTravel);
  const formerOwners = [...new Set(custody.map((e) => e.owningFarmId).filter((f): f is string => Boolean(f)))]
    .filter((farmId) => !(kind === 'AnimalNote' && farmId !== animal.owningFarmId && notesStay(farmId)));
  const ownerFarms = new Set([...formerOwners, ...(animal.owningFarmId ? [animal.owningFarmId] : [])]);
  const ability = defineAbilityFor(actor);
  return [...new Set([actor.farmId, ...ownerFarms])].filter((farmId) =>
    ability.can('read', subjectOf(kind, { coopId: actor.coopId, farmId, animalOwningFarmId: animal.owningFarmId, byAnOwner: ownerFarms.has(farmId) })),
  );
}

/** Every co-op animal (not the outside ones from papers), for loading a breeding history. */
export async function coopAnimalFactsOf(tx: Transaction, coopId: string): Promise<AnimalFacts[]> {
  return factsOfRows(tx, coopId, await selectAnimals(tx, coopId, 'NOT a.is_outside', [], { orderBy: 'a.birth_date, a.tattoo' }));
}

/** How a screen names an animal: its name and tattoo, or whichever it has. */
export function animalLabel(animal: Pick<AnimalFacts, 'name' | 'tattoo'> | undefined): string {
  if (!animal) return 'An animal';
  if (animal.name && animal.tattoo) return `${animal.name} (${animal.tattoo})`;
  return animal.name || animal.tattoo || 'An animal';
}

/** The short reference to an animal other modules' screens show: name, tattoo, sex and the farm keeping it. */
export function presentAnimalRef(id: string, ctx: { animals: Map<string, AnimalFacts>; farms: Map<string, { id: string; name: string }> }): AnimalRefDto {
  return animalRef(id, ctx.animals.get(id), ctx.farms);
}
