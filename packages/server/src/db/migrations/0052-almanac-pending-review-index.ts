import type { MigrationFn } from '../migrator';

/**
 * The agenda and the week's cards show how many ticks wait for review on the farm: few rows among the
 * farm's years of tasks, so an index of only the waiting ones answers without reading the others.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`CREATE INDEX almanac_tasks_pending_review_idx ON almanac_tasks (farm_id) WHERE completion_review = 'pending'`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX almanac_tasks_pending_review_idx`);
};
