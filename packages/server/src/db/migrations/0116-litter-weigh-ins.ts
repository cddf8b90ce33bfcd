import type { MigrationFn } from '../migrator';

/**
 * A litter weighed kit by kit before its kits go into a grow-out group: the weigh-in names the litter
 * (as a grow-out weigh-in names its group), so its last weight can be read back.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE weigh_ins ADD COLUMN litter_id uuid;
    ALTER TABLE weigh_ins ADD CONSTRAINT weigh_ins_litter FOREIGN KEY (coop_id, litter_id) REFERENCES litters (coop_id, id);
    CREATE INDEX weigh_ins_litter_idx ON weigh_ins (litter_id, weighed_on) WHERE deleted_at IS NULL AND litter_id IS NOT NULL;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP INDEX IF EXISTS weigh_ins_litter_idx;
    ALTER TABLE weigh_ins DROP CONSTRAINT IF EXISTS weigh_ins_litter;
    ALTER TABLE weigh_ins DROP COLUMN IF EXISTS litter_id;
  `);
};
