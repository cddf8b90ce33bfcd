export { PedigreeCycleError, PedigreeDuplicateError, findPedigreeCycle, type PedigreeAnimal } from './pedigree-index';
export {
  inbreedingCoefficients, kinship, offspringInbreeding, offspringInbreedingMany, recomputeInbreeding, type InbreedingById,
} from './inbreeding';
export { pedigreeCompleteness, pedigreeCompletenessAll } from './completeness';
export {
  asDyadicFraction, breedMakeup, breedMakeupAll, combineBreedMakeup, offspringBreedMakeup, offspringBreedMakeupMany,
  type BreedAnimal, type BreedMakeup, type BreedPurity,
} from './breed-makeup';
export { CoopPedigree } from './coop-pedigree';
export { relationshipInWords, type ParentsOf } from './relationship';
export {
  ancestorDepths, litterMakeupClass, rankStuds, sharedAncestors, STUD_ORDER_EXPLAINED, type LitterMakeupClassOf, type RankedStud, type StudCandidate,
} from './stud-ranking';
