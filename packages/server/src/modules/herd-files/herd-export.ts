import { exportWeightColumn, gramsPerWeightUnit, requiredImportColumns, type AnimalDto, type WeightUnit } from '@burrowline/shared';
import { csvFile } from '../../lib/csv-file';

function percent(fraction: number): string {
  return `${Number((fraction * 100).toFixed(2))}%`;
}

function makeupText(animal: AnimalDto): string {
  const parts = animal.breedMakeup.breeds.map((b) => `${b.name} ${percent(b.fraction)}`);
  if (animal.breedMakeup.unknown > 0 && parts.length > 0) parts.push(`unknown ${percent(animal.breedMakeup.unknown)}`);
  return parts.length > 0 ? parts.join('; ') : 'unknown';
}

/** The breed column as the import reads it: the declared breed, else `cross` with parents, else `unknown`. */
function breedCell(animal: AnimalDto): string {
  if (animal.breedName) return animal.breedName;
  return animal.sireId || animal.damId ? 'cross' : 'unknown';
}

/**
 * The herd as CSV: the import's columns (so the file can be imported again), then what Burrowline
 * computes, written by the one CSV writer (which makes every text cell safe from formulas).
 */
export function herdCsv(animals: AnimalDto[], opts: { unit: WeightUnit; parents: Map<string, { sire: string | null; dam: string | null }> }): string {
  const weightColumn = exportWeightColumn(opts.unit);
  const decimals = weightColumn === 'weight_kg' ? 3 : 2;
  const header = [...requiredImportColumns, 'colour', 'registration', 'hutch', 'bred_by', weightColumn, 'weighed', 'status', 'coi_percent', 'breed_makeup', 'age_class'];
  const rows = animals.map((a) => {
    const parents = opts.parents.get(a.id);
    const weight = a.latestWeight && a.latestWeight.reviewState !== 'returned' ? a.latestWeight : null;
    return [
      a.tattoo ?? '',
      a.name,
      a.sex,
      breedCell(a),
      a.birthDate ?? '',
      parents?.sire ?? '',
      parents?.dam ?? '',
      a.colour,
      a.registrationNumber ?? '',
      a.hutch,
      a.breedingFarm?.name ?? a.breederName,
      weight ? (weight.grams / gramsPerWeightUnit[weightColumn]).toFixed(decimals) : '',
      weight?.weighedOn ?? '',
      a.disposition === 'on_farm' ? a.lifecycle : a.disposition,
      (a.coi * 100).toFixed(2),
      makeupText(a),
      a.ageClass ?? '',
    ];
  });
  return csvFile([header, ...rows]);
}
