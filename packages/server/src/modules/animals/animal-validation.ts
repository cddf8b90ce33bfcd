import type { Transaction } from 'sequelize';
import { countOf, findPedigreeCycle, kitBirthDateProblem, youngParentAt, type BreedDto, type Sex } from '@burrowline/shared';
import { port } from '../../lib/port';
import { query, selectAnimalsByIds, type AnimalRow } from './animal-queries';
import { labelOf, standardBreedOf, type PresentContext } from './animals.presenter';
import type { PedigreeRow } from './pedigree-figures';
import { addMessage, type FieldMessages } from '../farms/farm-access';

export interface PedigreeCandidate {
  /** Null for a new animal (it has no descendants yet). */
  id: string | null;
  sex: Sex;
  birthDate: string | null;
  breedId: string | null;
  sireId: string | null;
  damId: string | null;
}

/**
 * The days each dam kindled on a farm's record. Litters build on the herd, so the composition root
 * plugs the litters' reading in here.
 */
export const damKindlingDays = port<(tx: Transaction, coopId: string, farmId: string, damIds: string[]) => Promise<Map<string, string[]>>>('damKindlingDays');

interface CheckOptions {
  ctx: PresentContext;
  /** The co-op's pedigree, for the cycle check of an existing animal. */
  pedigree?: PedigreeRow[];
  /** Which fields to name in messages (an inline parent from papers reports under its own key). */
  fieldFor?: { sire?: string; dam?: string };
  today: string;
  /** The farm whose litters the kit's birth date must match (left out when neither dam nor date changed). */
  kitOfFarm?: string;
}

/**
 * Checks a proposed pedigree entry: an unknown breed, a parent that does not exist, a buck as dam or
 * a doe as sire, a parent born on or after its offspring, a cycle — errors; a parent younger than its
 * breed's first-breeding age at the birth — a warning the breeder may override.
 */
export async function checkPedigree(
  tx: Transaction,
  coopId: string,
  candidate: PedigreeCandidate,
  { ctx, pedigree, fieldFor = {}, today, kitOfFarm }: CheckOptions,
): Promise<{ errors: FieldMessages; warnings: FieldMessages }> {
  const errors: FieldMessages = {};
  const warnings: FieldMessages = {};

  if (candidate.breedId && !ctx.breeds.has(candidate.breedId)) {
    addMessage(errors, 'breedId', 'Unknown breed: choose one from the list (your co-op admin can add a missing breed)');
  }
  if (candidate.birthDate && candidate.birthDate > today) addMessage(errors, 'birthDate', 'A birth date cannot be in the future');

  const parentIds = [candidate.sireId, candidate.damId].filter((id): id is string => Boolean(id));
  const parents = new Map((await selectAnimalsByIds(tx, coopId, parentIds)).map((row) => [row.id, row]));

  for (const role of ['sire', 'dam'] as const) {
    const parentId = role === 'sire' ? candidate.sireId : candidate.damId;
    if (!parentId) continue;
    const field = fieldFor[role] ?? `${role}Id`;
    const parent = parents.get(parentId);
    if (!parent) {
      addMessage(errors, field, `That ${role} is not in the co-op's records: choose one from the list, or enter it from papers`);
      continue;
    }
    if (parentId === candidate.id) {
      addMessage(errors, field, `An animal cannot be its own ${role}`);
      continue;
    }
    const wanted: Sex = role === 'sire' ? 'buck' : 'doe';
    if (parent.sex !== wanted) {
      addMessage(errors, field, `${labelOf(parent)} is a ${parent.sex}; a ${role} must be a ${wanted}`);
    }
    if (candidate.birthDate && parent.birth_date && parent.birth_date >= candidate.birthDate) {
      addMessage(errors, field, `${labelOf(parent)} was born on ${parent.birth_date}, not before this animal (${candidate.birthDate})`);
    } else if (candidate.birthDate && parent.sex === wanted) {
      const young = youngParentAt({ sex: parent.sex, birthDate: parent.birth_date }, candidate.birthDate, firstBreedingOf(parent, ctx));
      if (young) {
        addMessage(
          warnings,
          field,
          `${labelOf(parent)} was ${countOf(young.ageDays, 'day')} old at this birth, younger than the usual first-breeding age of ` +
            `${young.minimumDays} days for its breed. Save anyway if that is right.`,
        );
      }
    }
  }

  const dam = candidate.damId ? parents.get(candidate.damId) : undefined;
  const damField = fieldFor.dam ?? 'damId';
  if (kitOfFarm && dam && dam.sex === 'doe' && candidate.birthDate && !errors[damField] && !errors.birthDate) {
    const kindledOn = (await damKindlingDays(tx, coopId, kitOfFarm, [dam.id])).get(dam.id) ?? [];
    const problem = kitBirthDateProblem(candidate.birthDate, { label: labelOf(dam), kindledOn });
    if (problem) addMessage(errors, 'birthDate', problem);
  }

  if (candidate.id && pedigree && parentIds.length > 0 && !errors.sireId && !errors.damId) {
    const proposed = pedigree.map((row) => (row.id === candidate.id ? { ...row, sireId: candidate.sireId, damId: candidate.damId } : row));
    const cycle = findPedigreeCycle(proposed);
    if (cycle) {
      for (const role of ['sire', 'dam'] as const) {
        const parentId = role === 'sire' ? candidate.sireId : candidate.damId;
        if (parentId && cycle.includes(parentId)) {
          const parent = parents.get(parentId)!;
          addMessage(errors, fieldFor[role] ?? `${role}Id`, `${labelOf(parent)} descends from this animal, so it cannot also be its ${role} (a cycle in the pedigree)`);
        }
      }
    }
  }
  return { errors, warnings };
}

function firstBreedingOf(parent: AnimalRow, ctx: PresentContext): { doe: number; buck: number } | null {
  const breed: BreedDto | null = standardBreedOf(parent, ctx);
  return breed ? { doe: breed.firstBreedingDays.doe.min, buck: breed.firstBreedingDays.buck.min } : null;
}

/** Another animal the farm currently keeps with this tattoo, if any (ignoring case). */
export async function tattooClash(
  tx: Transaction,
  coopId: string,
  farmId: string,
  tattoo: string,
  exceptId: string | null,
): Promise<{ id: string; name: string; tattoo: string } | null> {
  const [row] = await query<{ id: string; name: string; tattoo: string }>(
    tx,
    `SELECT id, name, tattoo FROM animals
     WHERE coop_id = $1 AND keeping_farm_id = $2 AND lower(tattoo) = lower($3) AND disposition = 'on_farm'
       AND deleted_at IS NULL AND NOT is_outside AND ($4::uuid IS NULL OR id <> $4::uuid)
     LIMIT 1`,
    [coopId, farmId, tattoo, exceptId],
  );
  return row ?? null;
}

/** A farm's short suffix for a clashing tattoo: its initials, e.g. "Hazelrun Rabbitry" → "HR". */
export function farmSuffix(farmName: string): string {
  const initials = farmName
    .split(/\s+/)
    .filter((w) => /^[A-Za-z]/.test(w))
    .map((w) => w[0]!.toUpperCase())
    .join('')
    .slice(0, 3);
  return initials || 'F';
}

/**
 * The clear prompt for a clashing tattoo: an animal arriving (from outside, or from another farm) is
 * re-tattooed or given the suffix of the farm it came from (`suffixFrom`), e.g. "HR-14" arriving
 * where an "HR-14" already lives becomes "HR-14-QF"; one born here simply needs a tattoo of its own.
 */
export function tattooClashMessage(
  tattoo: string,
  holder: { name: string; tattoo: string },
  where: string,
  suffixFrom: string | null,
): string {
  const taken = `${holder.tattoo} is already the tattoo of ${holder.name || 'another animal'} ${where}.`;
  if (suffixFrom === null) return `${taken} Give this animal a tattoo of its own.`;
  return `${taken} Re-tattoo this animal, or add a farm suffix (e.g. ${tattoo}-${farmSuffix(suffixFrom)}).`;
}
