import type { MigrationFn } from '../migrator';

/**
 * Optional coordinates of a farm (WGS84 degrees), so the Stud Share finder can tell how far a buck
 * would travel; both or neither, and no map service is needed to use them.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE farms
      ADD COLUMN latitude double precision CHECK (latitude BETWEEN -90 AND 90),
      ADD COLUMN longitude double precision CHECK (longitude BETWEEN -180 AND 180),
      ADD CONSTRAINT farms_coordinates_both CHECK ((latitude IS NULL) = (longitude IS NULL));
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`ALTER TABLE farms DROP CONSTRAINT IF EXISTS farms_coordinates_both, DROP COLUMN IF EXISTS latitude, DROP COLUMN IF EXISTS longitude`);
};
