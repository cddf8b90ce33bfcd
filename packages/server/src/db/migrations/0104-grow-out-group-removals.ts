import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Heads that left a grow-out group alive (sold through the Swap Board): they count against the group's
 * heads like processed ones. One removal per source record, so a retried sale removes the heads once.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE grow_out_group_removals (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      group_id uuid NOT NULL REFERENCES grow_out_groups(id),
      removed_on date NOT NULL,
      head_count integer NOT NULL CHECK (head_count > 0),
      reason text NOT NULL DEFAULT '',
      source_type text NOT NULL,
      source_id uuid NOT NULL,
      created_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT grow_out_group_removals_once UNIQUE (source_type, source_id, group_id)
    );
    CREATE INDEX grow_out_group_removals_group_idx ON grow_out_group_removals (group_id, removed_on);
    ${tenantIsolation('grow_out_group_removals')}
    GRANT SELECT, INSERT ON grow_out_group_removals TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql('DROP TABLE IF EXISTS grow_out_group_removals');
};
