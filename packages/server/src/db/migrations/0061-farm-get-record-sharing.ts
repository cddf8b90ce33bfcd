import type { MigrationFn } from '../migrator';

/**
 * Whether a farm lets the co-op count its litters in a sire's get's record (the Stud Share finder and
 * buck cards). On by default: the co-op shares its records to choose sires; a farm may opt out.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`ALTER TABLE farms ADD COLUMN shares_get_records boolean NOT NULL DEFAULT true`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`ALTER TABLE farms DROP COLUMN IF EXISTS shares_get_records`);
};
