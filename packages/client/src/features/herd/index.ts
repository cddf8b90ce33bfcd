/** What this feature offers other features; everything else in the folder is private to it. */
export { herdKeys } from './api/herd-keys';
export { herdQueryOptions } from './api/get-herd';
export { useTrialMatings } from './api/run-trial-matings';
// Pedigree figures other features show beside their own (Stud Share's buck cards and finder).
export { BreedMakeupBar, breedMakeupText, PurityBadge } from './components/breed-makeup';
export { CoiValue } from './components/coi-badge';
export { coiLevel, formatCoi, purityLabels } from './herd-labels';
export { breedsQueryOptions } from './api/get-breeds';
export { useWeightUnit } from './hooks/use-weight-unit';
// The pedigree picture of an animal, for the Swap Board's listing page.
export { PedigreeTree } from './components/pedigree-tree';
export { pedigreeQueryOptions } from './api/get-pedigree';
