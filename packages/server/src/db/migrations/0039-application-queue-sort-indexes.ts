import type { MigrationFn } from '../migrator';

/**
 * The admin's queue pages in SQL by the date sent (applications_queue_idx) or by applicant, farm or herd
 * size: an index for each of those sorts within a status, with the date sent as the tie-break.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE INDEX applications_queue_by_applicant_idx ON applications (coop_id, status, applicant_name, created_at);
    CREATE INDEX applications_queue_by_farm_idx ON applications (coop_id, status, farm_name, created_at);
    CREATE INDEX applications_queue_by_herd_idx ON applications (coop_id, status, (does + bucks), created_at);
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX IF EXISTS applications_queue_by_applicant_idx, applications_queue_by_farm_idx, applications_queue_by_herd_idx`);
};
