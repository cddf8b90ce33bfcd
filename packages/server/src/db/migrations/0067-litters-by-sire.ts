import type { MigrationFn } from '../migrator';

/** A sire's litters (his get's record on buck cards and in the Stud Share finder) are found by his id. */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`CREATE INDEX litters_sire_idx ON litters (sire_id, kindled_on) WHERE deleted_at IS NULL`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX IF EXISTS litters_sire_idx`);
};
