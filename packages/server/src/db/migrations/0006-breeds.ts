import { poundsToGrams } from '@burrowline/shared';
import type { MigrationFn } from '../migrator';

/**
 * The breed catalogue: reference data the Herd cannot run without (architecture, "Data"). Catalogue
 * rows have no co-op and are readable by every co-op; an admin may add a breed for their own co-op.
 * Every value carries the publication it comes from and a confidence (pub: read in it; sec: quoted
 * second-hand; mem: remembered, to verify; derived; common practice), so nobody mistakes a remembered
 * figure for a published one.
 */

type Confidence = 'pub' | 'sec' | 'mem' | 'derived' | 'common_practice';
interface Sourced {
  source: string;
  confidence: Confidence;
}

const ARBA_SEC = 'Senior weights as quoted from the ARBA Standard of Perfection (verify against the current edition)';
const SHOW_RULE: Sourced = {
  source: 'UF/IFAS Florida 4-H: ideal weight ≥ 9 lb → six classes, lighter → four; ideal taken as the middle of the senior buck range',
  confidence: 'derived',
};
const MEDIUM_FIRST_BREEDING: Sourced = {
  source: 'McNitt et al., Rabbit Production, 9th ed., CABI 2013: medium breeds, does 4½–5½ months, bucks about a month later',
  confidence: 'pub',
};
const DAYS_PER_MONTH = 30.4375;
const months = (m: number) => Math.round(m * DAYS_PER_MONTH);

interface CatalogueBreed {
  name: string;
  buck: [number, number | null];
  doe: [number, number | null];
  weightSource: Sourced;
  bodyType: 'commercial' | 'semi_arch' | 'full_arch' | 'compact' | 'cylindrical';
  sizeClass: 'small' | 'medium' | 'large' | 'giant';
  /** Does' and bucks' usual first-breeding age in months, [earliest, latest]. */
  firstBreeding: { doe: [number, number]; buck: [number, number]; source: Sourced };
  slowGrowing?: boolean;
  heavyBoned?: boolean;
  meatNotes?: string;
}

const sec: Sourced = { source: ARBA_SEC, confidence: 'sec' };
const mem: Sourced = { source: `${ARBA_SEC}; remembered figures`, confidence: 'mem' };
const commercialBody: Sourced = { source: 'ARBA body type as remembered; verify against the Standard', confidence: 'mem' };
const mediumSize: Sourced = { source: 'Rabbit Production, 9th ed.: the medium meat breeds (8–12 lb seniors)', confidence: 'common_practice' };
const medium = { doe: [4.5, 5.5] as [number, number], buck: [5.5, 6.5] as [number, number], source: MEDIUM_FIRST_BREEDING };

export const catalogue: CatalogueBreed[] = [
  { name: 'New Zealand', buck: [9, 11], doe: [10, 12], weightSource: sec, bodyType: 'commercial', sizeClass: 'medium', firstBreeding: medium },
  { name: 'Californian', buck: [8, 10], doe: [8.5, 10.5], weightSource: sec, bodyType: 'commercial', sizeClass: 'medium', firstBreeding: medium },
  { name: 'Silver Fox', buck: [9, 11], doe: [10, 12], weightSource: sec, bodyType: 'commercial', sizeClass: 'medium', firstBreeding: medium },
  { name: 'Palomino', buck: [8, 10], doe: [9, 11], weightSource: sec, bodyType: 'commercial', sizeClass: 'medium', firstBreeding: medium },
  { name: 'Rex', buck: [7.5, 9.5], doe: [8, 10.5], weightSource: sec, bodyType: 'commercial', sizeClass: 'medium', firstBreeding: medium },
  {
    name: 'Florida White',
    buck: [4, 6],
    doe: [4, 6],
    weightSource: sec,
    bodyType: 'commercial',
    sizeClass: 'small',
    firstBreeding: {
      doe: [4, 5],
      buck: [5, 6],
      source: { source: 'Rabbit Production, 9th ed.: small breeds earlier than medium ones (4–5 months); bucks a month later', confidence: 'mem' },
    },
  },
  { name: "Champagne d'Argent", buck: [9, 11], doe: [9.5, 12], weightSource: mem, bodyType: 'commercial', sizeClass: 'medium', firstBreeding: medium },
  { name: 'Satin', buck: [8.5, 10.5], doe: [9, 11], weightSource: mem, bodyType: 'commercial', sizeClass: 'medium', firstBreeding: medium },
  { name: 'American Chinchilla', buck: [9, 11], doe: [10, 12], weightSource: mem, bodyType: 'commercial', sizeClass: 'medium', firstBreeding: medium },
  {
    name: 'Flemish Giant',
    buck: [13, null],
    doe: [14, null],
    weightSource: { source: 'ARBA Standard minimum senior weights, no maximum (remembered)', confidence: 'mem' },
    bodyType: 'semi_arch',
    sizeClass: 'giant',
    firstBreeding: {
      doe: [9, 12],
      buck: [10, 13],
      source: { source: 'Rabbit Production, 9th ed.: giant breeds bred at 9–12 months; bucks a month later', confidence: 'mem' },
    },
    slowGrowing: true,
    heavyBoned: true,
    meatNotes: 'Grows slowly and carries heavy bone: poor dress-out for a fryer program; kept for size or crossing.',
  },
];

const grams = (lb: number | null) => (lb === null ? 'NULL' : String(Math.round(poundsToGrams(lb))));
const text = (value: string) => `'${value.replace(/'/g, "''")}'`;
const json = (value: unknown) => `${text(JSON.stringify(value))}::jsonb`;

function catalogueRow(breed: CatalogueBreed): string {
  const idealLb = breed.buck[1] === null ? breed.buck[0] : (breed.buck[0] + breed.buck[1]) / 2;
  const showClassCount = idealLb >= 9 ? 6 : 4;
  const sources = {
    buckWeight: breed.weightSource,
    doeWeight: breed.weightSource,
    idealWeight: { source: 'Middle of the senior buck range (minimum where there is no maximum)', confidence: 'derived' },
    showClassCount: SHOW_RULE,
    bodyType: commercialBody,
    sizeClass: breed.sizeClass === 'medium' ? mediumSize : { source: 'Common practice from the senior weights', confidence: 'common_practice' },
    firstBreeding: breed.firstBreeding.source,
    meat: breed.slowGrowing
      ? { source: 'Giant breeds grow slower and carry heavier bone: poor dress-out for meat', confidence: 'common_practice' }
      : null,
    gramsConversion: { source: 'NIST Handbook 44, App. C: 1 lb = 453.59237 g, rounded to the gram', confidence: 'pub' },
  };
  return `(${[
    text(breed.name),
    grams(breed.buck[0]),
    grams(breed.buck[1]),
    grams(breed.doe[0]),
    grams(breed.doe[1]),
    grams(idealLb),
    String(showClassCount),
    text(breed.bodyType),
    text(breed.sizeClass),
    String(months(breed.firstBreeding.doe[0])),
    String(months(breed.firstBreeding.doe[1])),
    String(months(breed.firstBreeding.buck[0])),
    String(months(breed.firstBreeding.buck[1])),
    String(breed.slowGrowing ?? false),
    String(breed.heavyBoned ?? false),
    text(breed.meatNotes ?? ''),
    json(sources),
  ].join(', ')})`;
}

export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE breeds (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      -- NULL: the catalogue every co-op reads; otherwise a breed one co-op added for itself.
      coop_id uuid REFERENCES cooperatives(id),
      name text NOT NULL CHECK (length(name) BETWEEN 2 AND 60),
      senior_buck_min_grams integer CHECK (senior_buck_min_grams > 0),
      senior_buck_max_grams integer CHECK (senior_buck_max_grams >= senior_buck_min_grams),
      senior_doe_min_grams integer CHECK (senior_doe_min_grams > 0),
      senior_doe_max_grams integer CHECK (senior_doe_max_grams >= senior_doe_min_grams),
      ideal_weight_grams integer CHECK (ideal_weight_grams > 0),
      show_class_count integer NOT NULL CHECK (show_class_count IN (4, 6)),
      body_type text CHECK (body_type IN ('commercial', 'semi_arch', 'full_arch', 'compact', 'cylindrical')),
      size_class text NOT NULL CHECK (size_class IN ('small', 'medium', 'large', 'giant')),
      doe_first_breeding_min_days integer NOT NULL CHECK (doe_first_breeding_min_days > 0),
      doe_first_breeding_max_days integer NOT NULL CHECK (doe_first_breeding_max_days >= doe_first_breeding_min_days),
      buck_first_breeding_min_days integer NOT NULL CHECK (buck_first_breeding_min_days > 0),
      buck_first_breeding_max_days integer NOT NULL CHECK (buck_first_breeding_max_days >= buck_first_breeding_min_days),
      slow_growing boolean NOT NULL DEFAULT false,
      heavy_boned boolean NOT NULL DEFAULT false,
      meat_notes text NOT NULL DEFAULT '',
      -- Per value: { source, confidence }.
      sources jsonb NOT NULL DEFAULT '{}',
      created_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz
    );
    -- One name per co-op, and a co-op's own breed never shadows a catalogue one (checked in the service too).
    CREATE UNIQUE INDEX breeds_catalogue_name_unique ON breeds (lower(name)) WHERE coop_id IS NULL AND deleted_at IS NULL;
    CREATE UNIQUE INDEX breeds_coop_name_unique ON breeds (coop_id, lower(name)) WHERE coop_id IS NOT NULL AND deleted_at IS NULL;

    -- The catalogue goes in before row-level security is forced (it applies to the owner too).
    INSERT INTO breeds (name, senior_buck_min_grams, senior_buck_max_grams, senior_doe_min_grams, senior_doe_max_grams,
      ideal_weight_grams, show_class_count, body_type, size_class, doe_first_breeding_min_days, doe_first_breeding_max_days,
      buck_first_breeding_min_days, buck_first_breeding_max_days, slow_growing, heavy_boned, meat_notes, sources)
    VALUES ${catalogue.map(catalogueRow).join(',\n')};

    ALTER TABLE breeds ENABLE ROW LEVEL SECURITY;
    ALTER TABLE breeds FORCE ROW LEVEL SECURITY;
    CREATE POLICY breeds_tenant ON breeds
      USING (coop_id IS NULL OR coop_id = current_coop_id())
      WITH CHECK (coop_id = current_coop_id());

    GRANT SELECT, INSERT ON breeds TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS breeds CASCADE`);
};
