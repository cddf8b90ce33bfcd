import type { MigrationFn } from '../migrator';

/**
 * Where a doe stands is read from her latest service and latest litter on the farm that keeps her, for
 * every doe of a herd-list page and of the doe board: each is then one step down an index in that order,
 * instead of her services or litters filtered by farm and sorted per doe.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE INDEX services_doe_latest_idx ON services (doe_id, farm_id, serviced_on DESC, created_at DESC) WHERE deleted_at IS NULL;
    CREATE INDEX litters_dam_latest_idx ON litters (dam_id, farm_id, kindled_on DESC, created_at DESC) WHERE deleted_at IS NULL;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX IF EXISTS services_doe_latest_idx, litters_dam_latest_idx`);
};
