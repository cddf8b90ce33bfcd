import type { MigrationFn } from '../migrator';

/**
 * The feed book counts a farm's feed given on every page (years of entries are thousands): an index of the
 * farm and the co-op (what row-level security checks) answers the count without reading the entries.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`CREATE INDEX feed_uses_farm_count_idx ON feed_uses (farm_id, coop_id) WHERE deleted_at IS NULL`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX feed_uses_farm_count_idx`);
};
