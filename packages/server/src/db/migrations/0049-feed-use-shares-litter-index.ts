import type { MigrationFn } from '../migrator';

/**
 * The feed charged to a nursing litter, found by the litter: the performance tables of a period read the
 * feed of the litters kindled in it, not every share of the farm's feed book.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`CREATE INDEX feed_use_shares_litter_idx ON feed_use_shares (litter_id) WHERE litter_id IS NOT NULL`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX IF EXISTS feed_use_shares_litter_idx`);
};
