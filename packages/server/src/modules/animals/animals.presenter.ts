import type { AnimalNote } from './animal-note.model';
import {
  ageClassOf, daysBetween, type AppAbility, subjectOf, seniorRangeFor, weightAgainstStandard, type AnimalDto, type BreedDto, type BreedMakeupDto,
  type AnimalListItemDto, type AnimalNoteDto, type CustodyStatus, type FarmRefDto, type PedigreeCardDto, type WeightUnit,
} from '@burrowline/shared';
import type { AnimalRow, HerdListRow } from './animal-queries';

function animalRowSubject(row: AnimalRow) {
  return subjectOf('Animal', { coopId: row.coop_id, owningFarmId: row.owning_farm_id, keepingFarmId: row.keeping_farm_id });
}

export interface FarmInfo {
  id: string;
  name: string;
  timeZone: string;
  weightUnit: WeightUnit;
}

/** What presenting needs besides the row: the breeds and farms of the co-op, who is looking, and their today. */
export interface PresentContext {
  breeds: Map<string, BreedDto>;
  farms: Map<string, FarmInfo>;
  viewerFarmId: string | null;
  /** The viewer's ability, for the owner-only fields of a full record (none without it). */
  ability: AppAbility | null;
  today: string;
}

function farmRef(ctx: PresentContext, farmId: string | null): FarmRefDto | null {
  if (!farmId) return null;
  const farm = ctx.farms.get(farmId);
  return { id: farmId, name: farm?.name ?? 'A former member farm' };
}

export function presentMakeup(row: Pick<AnimalRow, 'makeup_breeds' | 'makeup_unknown' | 'purity'>, ctx: Pick<PresentContext, 'breeds'>): BreedMakeupDto {
  if (!row.makeup_breeds || row.purity === null) return { breeds: [], unknown: 1, purity: 'unknown' };
  const breeds = Object.entries(row.makeup_breeds)
    .map(([breedId, fraction]) => ({ breedId, name: ctx.breeds.get(breedId)?.name ?? 'A removed breed', fraction }))
    .sort((a, b) => b.fraction - a.fraction || a.name.localeCompare(b.name));
  return { breeds, unknown: row.makeup_unknown ?? 0, purity: row.purity };
}

type BreedFacts = Pick<AnimalRow, 'purity' | 'makeup_breeds' | 'breed_id'>;

/** The breed whose class rule and standard apply: the breed of a purebred, else the declared one. */
export function standardBreedOf(row: BreedFacts, ctx: Pick<PresentContext, 'breeds'>): BreedDto | null {
  if (row.purity === 'purebred' && row.makeup_breeds) {
    const [only] = Object.keys(row.makeup_breeds);
    if (only) return ctx.breeds.get(only) ?? null;
  }
  return row.breed_id ? (ctx.breeds.get(row.breed_id) ?? null) : null;
}

/** The class rule of a cross follows its largest share; unknown ancestry uses four classes. */
function classRuleOf(row: BreedFacts, ctx: Pick<PresentContext, 'breeds'>): 4 | 6 {
  const standard = standardBreedOf(row, ctx);
  if (standard) return standard.showClassCount;
  const largest = Object.entries(row.makeup_breeds ?? {}).sort((a, b) => b[1] - a[1])[0];
  return (largest && ctx.breeds.get(largest[0])?.showClassCount) || 4;
}

export function ageClassOfRow(row: BreedFacts & Pick<AnimalRow, 'birth_date'>, ctx: Pick<PresentContext, 'breeds' | 'today'>) {
  return row.birth_date ? ageClassOf(row.birth_date, ctx.today, classRuleOf(row, ctx)) : null;
}

export function isOnFarm(row: Pick<AnimalRow, 'is_outside' | 'disposition'>): boolean {
  return !row.is_outside && row.disposition === 'on_farm';
}

/** The pedigree card: what every member of the co-op sees. Nothing farm-private goes in here. */
export function presentCard(row: AnimalRow, ctx: PresentContext): PedigreeCardDto {
  const onFarm = isOnFarm(row);
  return {
    id: row.id,
    isOutside: row.is_outside,
    name: row.name,
    tattoo: row.tattoo,
    sex: row.sex,
    birthDate: row.birth_date,
    colour: row.colour,
    registrationNumber: row.registration_number,
    breedMakeup: presentMakeup(row, ctx),
    breedingFarm: farmRef(ctx, row.breeding_farm_id),
    breederName: row.breeder_name,
    currentFarm: onFarm ? farmRef(ctx, row.keeping_farm_id) : null,
    onFarm,
    coi: Math.min(1, Math.max(0, row.coi ?? 0)),
    sireId: row.sire_id,
    damId: row.dam_id,
  };
}

function custodyFor(row: Pick<AnimalRow, 'owning_farm_id' | 'keeping_farm_id'>, viewerFarmId: string | null): CustodyStatus {
  if (row.owning_farm_id === row.keeping_farm_id) return 'at_home';
  return viewerFarmId !== null && viewerFarmId === row.keeping_farm_id ? 'on_loan_here' : 'lent_out';
}

function latestWeightOf(row: Pick<AnimalRow, 'latest_grams' | 'latest_weighed_on' | 'latest_review_state'>) {
  return row.latest_grams !== null && row.latest_weighed_on && row.latest_review_state
    ? { grams: row.latest_grams, weighedOn: row.latest_weighed_on, reviewState: row.latest_review_state }
    : null;
}

/** One row of the herd list, straight from its SQL row. */
/** A row of the herd list; a doe's place in her cycle is the Almanac's, added by the service (null here). */
export function presentListItem(row: HerdListRow, ctx: Pick<PresentContext, 'breeds' | 'today' | 'viewerFarmId'>, cycle: AnimalListItemDto['cycle'] = null): AnimalListItemDto {
  return {
    id: row.id,
    tattoo: row.tattoo,
    name: row.name,
    sex: row.sex,
    birthDate: row.birth_date,
    breedMakeup: presentMakeup(row, ctx),
    coi: Math.min(1, Math.max(0, row.coi ?? 0)),
    ageClass: ageClassOfRow(row, ctx),
    lifecycle: row.lifecycle,
    disposition: row.disposition,
    hutch: row.hutch,
    custody: custodyFor(row, ctx.viewerFarmId),
    latestWeight: latestWeightOf(row),
    cycle,
  };
}

/** The full record, for the farm that owns or keeps the animal. */
export function presentAnimal(row: AnimalRow, ctx: PresentContext): AnimalDto {
  const ageClass = ageClassOfRow(row, ctx);
  const standard = standardBreedOf(row, ctx);
  const latestWeight = latestWeightOf(row);
  const judged = latestWeight && latestWeight.reviewState === 'accepted' && ageClass === 'senior';
  return {
    ...presentCard(row, ctx),
    owningFarm: farmRef(ctx, row.owning_farm_id),
    keepingFarm: farmRef(ctx, row.keeping_farm_id),
    custody: custodyFor(row, ctx.viewerFarmId),
    breedId: row.breed_id,
    breedName: row.breed_id ? (ctx.breeds.get(row.breed_id)?.name ?? null) : null,
    hutch: row.hutch,
    // The owning farm's own notes: a farm keeping the animal on loan never reads them.
    notes: ctx.ability?.can('read', animalRowSubject(row), 'notes') ? row.notes : '',
    lifecycle: row.lifecycle,
    disposition: row.disposition,
    dispositionCause: row.disposition_cause,
    ageClass,
    ageDays: row.birth_date ? daysBetween(row.birth_date, ctx.today) : null,
    latestWeight,
    weightAgainstStandard: judged ? weightAgainstStandard(latestWeight.grams, seniorRangeFor(row.sex, standard)) : null,
    version: row.version,
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

/** "Thistle (HR-14)", or the tattoo alone, for messages that name an animal. */
export function labelOf(row: Pick<AnimalRow, 'name' | 'tattoo'>): string {
  if (row.name && row.tattoo) return `${row.name} (${row.tattoo})`;
  return row.name || row.tattoo || 'That animal';
}

/** A note in the animal's log, with who entered it and its review state. */
export function presentNote(
  n: Pick<AnimalNote, 'id' | 'animalId' | 'body' | 'notedOn' | 'enteredBy' | 'reviewState' | 'reviewComment' | 'version'>,
  names: Map<string, string>,
): AnimalNoteDto {
  return {
    id: n.id,
    animalId: n.animalId,
    body: n.body,
    notedOn: n.notedOn,
    enteredBy: { id: n.enteredBy, name: names.get(n.enteredBy) ?? 'Someone' },
    reviewState: n.reviewState,
    reviewComment: n.reviewComment,
    version: n.version,
  };
}
