import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * A weighing round: many weights taken in a row and saved at once. Its id is the client's idempotency
 * key, so a save retried after a lost answer finds the round instead of writing its weights twice; each
 * weigh-in of the round points back at it.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE weighing_rounds (
      id uuid PRIMARY KEY,
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      weighed_on date NOT NULL,
      entered_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT weighing_rounds_coop_id_unique UNIQUE (coop_id, id)
    );
    ${tenantIsolation('weighing_rounds')}
    GRANT SELECT, INSERT ON weighing_rounds TO ${appRole};

    ALTER TABLE weigh_ins ADD COLUMN round_id uuid;
    ALTER TABLE weigh_ins ADD CONSTRAINT weigh_ins_round FOREIGN KEY (coop_id, round_id) REFERENCES weighing_rounds (coop_id, id);
    CREATE INDEX weigh_ins_round_idx ON weigh_ins (round_id) WHERE round_id IS NOT NULL;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP INDEX IF EXISTS weigh_ins_round_idx;
    ALTER TABLE weigh_ins DROP CONSTRAINT IF EXISTS weigh_ins_round;
    ALTER TABLE weigh_ins DROP COLUMN IF EXISTS round_id;
    DROP TABLE IF EXISTS weighing_rounds;
  `);
};
