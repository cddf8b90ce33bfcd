import type { BreedDto } from '@burrowline/shared';
import type { Breed } from './breed.model';

/** What presenting reads of a breed: a model instance, or a row read with the same names. */
export type BreedRow = Pick<
  Breed,
  | 'id' | 'coopId' | 'name' | 'seniorBuckMinGrams' | 'seniorBuckMaxGrams' | 'seniorDoeMinGrams' | 'seniorDoeMaxGrams' | 'idealWeightGrams'
  | 'showClassCount' | 'bodyType' | 'sizeClass' | 'doeFirstBreedingMinDays' | 'doeFirstBreedingMaxDays' | 'buckFirstBreedingMinDays'
  | 'buckFirstBreedingMaxDays' | 'slowGrowing' | 'heavyBoned' | 'meatNotes' | 'sources'
>;

export function presentBreed(breed: BreedRow): BreedDto {
  return {
    id: breed.id,
    name: breed.name,
    isCatalogue: breed.coopId === null,
    seniorBuckGrams: { minGrams: breed.seniorBuckMinGrams, maxGrams: breed.seniorBuckMaxGrams },
    seniorDoeGrams: { minGrams: breed.seniorDoeMinGrams, maxGrams: breed.seniorDoeMaxGrams },
    idealWeightGrams: breed.idealWeightGrams,
    showClassCount: breed.showClassCount === 6 ? 6 : 4,
    bodyType: breed.bodyType,
    sizeClass: breed.sizeClass,
    firstBreedingDays: {
      doe: { min: breed.doeFirstBreedingMinDays, max: breed.doeFirstBreedingMaxDays },
      buck: { min: breed.buckFirstBreedingMinDays, max: breed.buckFirstBreedingMaxDays },
    },
    slowGrowing: breed.slowGrowing,
    heavyBoned: breed.heavyBoned,
    meatNotes: breed.meatNotes,
    sources: breed.sources,
  };
}
