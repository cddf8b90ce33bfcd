import type { MigrationFn } from '../migrator';

/**
 * The litters list counts a farm's (or one dam's) litters by state on every request: an index holding the
 * farm, the co-op (what row-level security checks), the kits on the doe and the dam answers the count
 * without reading the litters themselves.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`CREATE INDEX litters_state_count_idx ON litters (farm_id, coop_id, kits_on_doe, dam_id) WHERE deleted_at IS NULL`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX litters_state_count_idx`);
};
