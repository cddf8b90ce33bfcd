import type { MigrationFn } from '../migrator';

/**
 * The services list pages in SQL by service date with the query's tie-breaks (entry time, id): one index for
 * the whole list and one led by the state, for the open services the Almanac shows.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE INDEX services_list_idx ON services (farm_id, serviced_on, created_at, id) WHERE deleted_at IS NULL;
    CREATE INDEX services_list_by_status_idx ON services (farm_id, status, serviced_on, created_at, id) WHERE deleted_at IS NULL;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX IF EXISTS services_list_idx, services_list_by_status_idx`);
};
