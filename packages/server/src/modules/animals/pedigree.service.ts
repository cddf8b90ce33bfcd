import { ForbiddenError } from '@casl/ability';
import type { Transaction } from 'sequelize';
import {
  relationshipInWords,
  ancestorDepths, combineBreedMakeup, defineAbilityFor, pedigreeCompleteness, sharedAncestors, subjectOf, type BreedMakeup, type CoopPedigree,
  type PedigreeCardDto, type PedigreeCardListDto, type PedigreeCardQuery, type PedigreeTreeDto, type Sex, type TrialMatingDto,
  type TrialMatingInput,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { presentContextFor } from './animal-context';
import { query, selectAncestorIds, selectAnimalById, selectAnimals, selectAnimalsByIds, type AnimalRow } from './animal-queries';
import type { FieldMessages } from '../farms/farm-access';
import { labelOf, presentCard, presentMakeup } from './animals.presenter';
import { coopPedigreeOf } from './coop-pedigree-cache';

/** Pedigree cards are open to every member of the co-op (brief); another co-op's are simply not there. */
function assertCanReadCards(actor: SessionUser) {
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('read', subjectOf('PedigreeCard', { coopId: actor.coopId }));
}

/** One animal's pedigree card, whichever farm keeps it. */
export async function getPedigreeCard(actor: SessionUser, animalId: string): Promise<PedigreeCardDto> {
  assertCanReadCards(actor);
  return withTenant(actor, async (tx) => {
    const row = await selectAnimalById(tx, actor.coopId, animalId);
    if (!row) throw AppError.notFound('That animal');
    return presentCard(row, await presentContextFor(actor, tx));
  });
}

/** Cards across the co-op, for choosing a sire, a dam or bucks to try (search by name, tattoo, registration). */
export async function listPedigreeCards(actor: SessionUser, q: PedigreeCardQuery): Promise<PedigreeCardListDto> {
  assertCanReadCards(actor);
  return withTenant(actor, async (tx) => {
    const ctx = await presentContextFor(actor, tx);
    const bind: unknown[] = [];
    const where = ['true'];
    const param = (value: unknown) => {
      bind.push(value);
      return `$${bind.length + 1}`;
    };
    if (q.search) {
      const p = param(`%${q.search.replace(/[\\%_]/g, '\\$&')}%`);
      where.push(`(a.name ILIKE ${p} OR a.tattoo ILIKE ${p} OR a.registration_number ILIKE ${p})`);
    }
    if (q.sex) where.push(`a.sex = ${param(q.sex)}`);
    if (q.farmId) where.push(`a.keeping_farm_id = ${param(q.farmId)} AND a.disposition = 'on_farm'`);
    if (q.onFarm) where.push(`NOT a.is_outside AND a.disposition = 'on_farm'`);
    if (q.breeding) where.push(`a.lifecycle = 'breeding'`);
    const clause = where.join(' AND ');
    const [{ count }] = (await query<{ count: string }>(
      tx,
      `SELECT count(*) FROM animals a LEFT JOIN animal_breed_makeups m ON m.animal_id = a.id
       WHERE a.coop_id = $1 AND a.deleted_at IS NULL AND (${clause})`,
      [actor.coopId, ...bind],
    )) as [{ count: string }];
    // A typed tattoo, name or registration that matches whole comes first ("HR-2" above "HR-25"), then those it begins.
    const rankBind = q.search ? [q.search.toLowerCase(), `${q.search.toLowerCase().replace(/[\\%_]/g, '\\$&')}%`] : [];
    const exact = `$${bind.length + 2}`;
    const prefix = `$${bind.length + 3}`;
    const rank = q.search
      ? `CASE WHEN lower(a.tattoo) = ${exact} OR lower(a.name) = ${exact} OR lower(a.registration_number) = ${exact} THEN 0
              WHEN lower(a.tattoo) LIKE ${prefix} OR lower(a.name) LIKE ${prefix} OR lower(a.registration_number) LIKE ${prefix} THEN 1 ELSE 2 END, `
      : '';
    const rows = await selectAnimals(tx, actor.coopId, clause, [...bind, ...rankBind], {
      orderBy: `${rank}a.is_outside, (a.name = ''), lower(a.name), a.tattoo, a.id`,
      limit: q.pageSize,
      offset: (q.page - 1) * q.pageSize,
    });
    return { items: rows.map((row) => presentCard(row, ctx)), total: Number(count), page: q.page, pageSize: q.pageSize };
  });
}

/** The pedigree picture of any animal of the co-op: its ancestors as cards, `generations` back. */
export async function getPedigreeTree(actor: SessionUser, animalId: string, generations: number): Promise<PedigreeTreeDto> {
  assertCanReadCards(actor);
  return withTenant(actor, async (tx) => {
    const ctx = await presentContextFor(actor, tx);
    const ids = await selectAncestorIds(tx, actor.coopId, animalId, generations);
    const rows = await selectAnimalsByIds(tx, actor.coopId, ids);
    if (!rows.some((r) => r.id === animalId)) throw AppError.notFound('That animal');
    const cards: Record<string, PedigreeCardDto> = {};
    for (const row of rows) cards[row.id] = presentCard(row, ctx);
    const slots: (string | null)[] = new Array(2 ** (generations + 1)).fill(null);
    slots[1] = animalId;
    for (let k = 1; k < 2 ** generations; k++) {
      const card = slots[k] ? cards[slots[k]!] : undefined;
      slots[2 * k] = card?.sireId ?? null;
      slots[2 * k + 1] = card?.damId ?? null;
    }
    const completeness = pedigreeCompleteness(
      rows.map((r) => ({ id: r.id, sireId: r.sire_id, damId: r.dam_id })),
      animalId,
      generations,
    );
    return { rootId: animalId, generations, slots, cards, completeness };
  });
}

/** The stored breed make-up of an animal (computed with the pedigree, in the same transaction). */
function storedMakeup(row: AnimalRow): BreedMakeup | null {
  if (!row.makeup_breeds || row.makeup_unknown === null || !row.purity) return null;
  return { breeds: row.makeup_breeds, unknown: row.makeup_unknown, purity: row.purity };
}

/**
 * Trial matings: this doe with each of these bucks (own or other farms'). For each litter, its COI
 * (the kinship of the parents, over the whole co-op's pedigree, kept in memory: see
 * coop-pedigree-cache.ts), its breed make-up (half each parent's stored make-up), and the nearest
 * ancestors the two parents share.
 */
export async function trialMatings(actor: SessionUser, input: TrialMatingInput): Promise<TrialMatingDto> {
  assertCanReadCards(actor);
  return withTenant(actor, async (tx) => {
    const ctx = await presentContextFor(actor, tx);
    const sireIds = [...new Set(input.sireIds)];
    const rows = new Map((await selectAnimalsByIds(tx, actor.coopId, [input.damId, ...sireIds])).map((r) => [r.id, r]));
    const errors: FieldMessages = {};
    const dam = rows.get(input.damId);
    if (!dam) errors.damId = ["That doe is not in the co-op's records: choose one from the list"];
    else if (dam.sex !== 'doe') errors.damId = [`${labelOf(dam)} is a buck; choose a doe`];
    input.sireIds.forEach((id, i) => {
      const sire = rows.get(id);
      if (!sire) errors[`sireIds.${i}`] = ["That buck is not in the co-op's records: choose one from the list"];
      else if (sire.sex !== 'buck') errors[`sireIds.${i}`] = [`${labelOf(sire)} is a doe; choose a buck`];
    });
    if (Object.keys(errors).length > 0 || !dam) throw AppError.validation(errors);

    const pedigree = await coopPedigreeOf(actor.coopId, tx);
    const coi = pedigree.offspringInbreedingMany(dam.id, sireIds);
    const damMakeup = storedMakeup(dam);
    const damAncestors = ancestorDepths(pedigree, dam.id, 5);
    const names = new Map<string, { name: string; tattoo: string | null }>();
    const commonOf = (sireId: string) => sharedAncestors(pedigree, damAncestors, sireId, 5, 6);
    const litters = sireIds.map((sireId) => ({ sireId, common: commonOf(sireId) }));
    const commonIds = [...new Set(litters.flatMap((l) => l.common))];
    for (const row of await selectAnimalsByIds(tx, actor.coopId, commonIds)) names.set(row.id, { name: row.name, tattoo: row.tattoo });

    return {
      dam: presentCard(dam, ctx),
      litters: litters.map(({ sireId, common }) => {
        const makeup = combineBreedMakeup(storedMakeup(rows.get(sireId)!), damMakeup);
        return {
          sire: presentCard(rows.get(sireId)!, ctx),
          coi: Math.min(1, Math.max(0, coi.get(sireId) ?? 0)),
          breedMakeup: presentMakeup({ makeup_breeds: makeup.breeds, makeup_unknown: makeup.unknown, purity: makeup.purity }, ctx),
          commonAncestors: common.map((id) => ({ id, name: names.get(id)?.name ?? '', tattoo: names.get(id)?.tattoo ?? null })),
          relationship: relationshipInWords((id) => pedigree.parentsOf(id), dam.id, sireId),
        };
      }),
    };
  });
}

/** An animal's pedigree card with the facts other modules decide on (who owns and keeps it, its make-up). */
export interface PedigreeCardFacts {
  card: PedigreeCardDto;
  sex: Sex;
  owningFarmId: string | null;
  keepingFarmId: string | null;
  onFarm: boolean;
  makeup: BreedMakeup | null;
  label: string;
}

/** Pedigree cards of animals of the co-op by id, inside the caller's transaction (absent ids are left out). */
export async function pedigreeCardsIn(tx: Transaction, actor: SessionUser, ids: string[]): Promise<Map<string, PedigreeCardFacts>> {
  const unique = [...new Set(ids)];
  if (unique.length === 0) return new Map();
  const ctx = await presentContextFor(actor, tx);
  const rows = await selectAnimalsByIds(tx, actor.coopId, unique);
  return new Map(rows.map((row) => [row.id, {
    card: presentCard(row, ctx), sex: row.sex, owningFarmId: row.owning_farm_id, keepingFarmId: row.keeping_farm_id,
    onFarm: !row.is_outside && row.disposition === 'on_farm', makeup: storedMakeup(row), label: labelOf(row),
  }]));
}

/** The co-op's pedigree kept in memory (see coop-pedigree-cache.ts), as of the caller's transaction. */
export async function coopPedigreeIn(tx: Transaction, coopId: string): Promise<CoopPedigree> {
  return coopPedigreeOf(coopId, tx);
}

/** Presents breed make-ups (a litter's, computed) with the co-op's breed names, inside the caller's transaction. */
export async function makeupPresenterIn(tx: Transaction, actor: SessionUser): Promise<(makeup: BreedMakeup) => PedigreeCardDto['breedMakeup']> {
  const ctx = await presentContextFor(actor, tx);
  return (makeup) => presentMakeup({ makeup_breeds: makeup.breeds, makeup_unknown: makeup.unknown, purity: makeup.purity }, ctx);
}
