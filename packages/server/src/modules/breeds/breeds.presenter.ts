import type { BreedDto } from '@burrowline/shared';
import type { Breed } from './breed.model';

export function presentBreed(breed: Breed): BreedDto {
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
