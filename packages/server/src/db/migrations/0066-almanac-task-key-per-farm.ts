import type { MigrationFn } from '../migrator';

/**
 * A task is the same task again only on the same farm: a lent buck handed over and brought home on one day
 * arrives at two farms, and each needs its own quarantine. Before, the second arrival's task was taken
 * for a duplicate of the first and never planned.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE UNIQUE INDEX almanac_tasks_farm_source_key_unique ON almanac_tasks (coop_id, farm_id, source_id, key, anchor_date);
    DROP INDEX almanac_tasks_source_key_unique;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE UNIQUE INDEX almanac_tasks_source_key_unique ON almanac_tasks (coop_id, source_id, key, anchor_date);
    DROP INDEX almanac_tasks_farm_source_key_unique;
  `);
};
