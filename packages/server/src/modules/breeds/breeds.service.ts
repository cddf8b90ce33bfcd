import { ForbiddenError } from '@casl/ability';
import { Op, type Transaction } from 'sequelize';
import { defineAbilityFor, ErrorCode, poundsToGrams, subjectOf, type BreedCreateInput, type BreedDto, type SizeClass } from '@burrowline/shared';
import { lockUntilCommit } from '../../db/advisory-lock';
import { withTenant } from '../../db/tenant';
import { coopDirectoryOf, forgetCoopDirectory } from '../../db/coop-directory';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { Breed } from './breed.model';
import { presentBreed, type BreedRow } from './breeds.presenter';

/** UF/IFAS Florida 4-H (pub): an ideal weight of 9 lb or more shows in six classes. */
const SIX_CLASS_FROM_GRAMS = poundsToGrams(9);

/**
 * First-breeding ages when the admin gives none: Rabbit Production, 9th ed. (pub for medium breeds:
 * does 4½ months, bucks a month later; small and giant breeds from memory, as in the catalogue).
 */
const defaultFirstBreeding: Record<SizeClass, { doe: number; buck: number; confidence: 'pub' | 'mem' }> = {
  small: { doe: 122, buck: 152, confidence: 'mem' },
  medium: { doe: 137, buck: 167, confidence: 'pub' },
  large: { doe: 137, buck: 167, confidence: 'mem' },
  giant: { doe: 274, buck: 304, confidence: 'mem' },
};

function visibleTo(coopId: string) {
  return { [Op.or]: [{ coopId: null }, { coopId }] };
}

/** The catalogue plus the breeds this co-op added, by name. */
export async function listBreeds(actor: SessionUser): Promise<BreedDto[]> {
  return withTenant(actor, async (tx) => (await breedsOf(actor.coopId, tx)).sort((a, b) => a.name.localeCompare(b.name)));
}

/** Every breed the co-op may use, inside the caller's transaction (for other domains). */
export async function breedsOf(coopId: string, tx: Transaction): Promise<BreedDto[]> {
  // Read once per transaction with the farms, as plain rows; each caller gets its own array to sort or filter.
  return (await coopDirectoryOf(tx, coopId)).breeds.map((b) => presentBreed(b as BreedRow));
}

export async function breedMapOf(coopId: string, tx: Transaction): Promise<Map<string, BreedDto>> {
  return new Map((await breedsOf(coopId, tx)).map((b) => [b.id, b]));
}

/** An admin adds a breed for their own co-op; a name the co-op can already use is refused. */
export async function createBreed(actor: SessionUser, input: BreedCreateInput): Promise<BreedDto> {
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('create', subjectOf('Breed', { coopId: actor.coopId }));
  return withTenant(actor, async (tx) => {
    // One new breed at a time per co-op, so a repeated name meets the clash check below, not the unique index.
    await lockUntilCommit(tx, `breeds:${actor.coopId}`);
    const clash = await Breed.findOne({
      where: { [Op.and]: [visibleTo(actor.coopId), { name: { [Op.iLike]: input.name.replace(/[\\%_]/g, '\\$&') } }] },
      transaction: tx,
    });
    if (clash) {
      throw new AppError(ErrorCode.conflict, 409, 'That breed is already in the list', {
        name: [`${clash.name} is already in the breed list`],
      });
    }
    const buckRange = [input.seniorBuckMinGrams, input.seniorBuckMaxGrams].filter((g): g is number => g !== null);
    const doeRange = [input.seniorDoeMinGrams, input.seniorDoeMaxGrams].filter((g): g is number => g !== null);
    const basis = buckRange.length ? buckRange : doeRange;
    const ideal = basis.length ? Math.round(basis.reduce((a, b) => a + b, 0) / basis.length) : null;
    const showClassCount: 4 | 6 =
      ideal !== null ? (ideal >= SIX_CLASS_FROM_GRAMS ? 6 : 4) : input.sizeClass === 'small' ? 4 : 6;
    const defaults = defaultFirstBreeding[input.sizeClass];
    const doeMin = input.doeFirstBreedingMinDays ?? defaults.doe;
    const buckMin = input.buckFirstBreedingMinDays ?? defaults.buck;
    const given = { source: input.source, confidence: 'mem' as const };
    forgetCoopDirectory(tx, actor.coopId);
    const breed = await Breed.create(
      {
        coopId: actor.coopId,
        name: input.name,
        seniorBuckMinGrams: input.seniorBuckMinGrams,
        seniorBuckMaxGrams: input.seniorBuckMaxGrams,
        seniorDoeMinGrams: input.seniorDoeMinGrams,
        seniorDoeMaxGrams: input.seniorDoeMaxGrams,
        idealWeightGrams: ideal,
        showClassCount,
        bodyType: input.bodyType,
        sizeClass: input.sizeClass,
        doeFirstBreedingMinDays: doeMin,
        doeFirstBreedingMaxDays: doeMin + 30,
        buckFirstBreedingMinDays: buckMin,
        buckFirstBreedingMaxDays: buckMin + 30,
        slowGrowing: input.slowGrowing,
        heavyBoned: input.heavyBoned,
        meatNotes: input.meatNotes,
        createdBy: actor.id,
        sources: {
          buckWeight: given,
          doeWeight: given,
          idealWeight: { source: 'Middle of the senior buck range entered', confidence: 'derived' },
          showClassCount: { source: 'UF/IFAS Florida 4-H rule applied to the ideal weight', confidence: 'derived' },
          bodyType: input.bodyType ? given : null,
          sizeClass: given,
          firstBreeding:
            input.doeFirstBreedingMinDays || input.buckFirstBreedingMinDays
              ? given
              : { source: `Rabbit Production, 9th ed., ${input.sizeClass} breeds`, confidence: defaults.confidence },
        },
      },
      { transaction: tx },
    );
    return presentBreed(breed);
  });
}
