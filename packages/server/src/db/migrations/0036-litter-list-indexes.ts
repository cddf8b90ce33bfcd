import type { MigrationFn } from '../migrator';

/**
 * The litters list pages in SQL, by kindling date (the default, latest first) or by kits born alive; each
 * sort has an index led by the farm with the tie-breaks of the query (kindling date, entry time, id).
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE INDEX litters_list_by_kindled_on_idx ON litters (farm_id, kindled_on, created_at, id) WHERE deleted_at IS NULL;
    CREATE INDEX litters_list_by_born_alive_idx ON litters (farm_id, born_alive, kindled_on, created_at, id) WHERE deleted_at IS NULL;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX IF EXISTS litters_list_by_kindled_on_idx, litters_list_by_born_alive_idx`);
};
