import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Marks for processing: an animal or a grow-out group set aside for a planned processing
 * date. An animal or group under a veterinarian's withdrawal cannot be marked until the withdrawal is
 * over (checked by the service). A mark is done when the processing record is saved, or cancelled.
 * One planned mark per animal and per group.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE processing_marks (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      animal_id uuid,
      group_id uuid,
      planned_on date NOT NULL,
      status text NOT NULL DEFAULT 'planned' CHECK (status IN ('planned', 'done', 'cancelled')),
      notes text NOT NULL DEFAULT '' CHECK (length(notes) <= 500),
      marked_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT processing_marks_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id),
      CONSTRAINT processing_marks_group FOREIGN KEY (coop_id, group_id) REFERENCES grow_out_groups (coop_id, id),
      CONSTRAINT processing_marks_one_subject CHECK ((animal_id IS NULL) <> (group_id IS NULL))
    );
    CREATE UNIQUE INDEX processing_marks_one_per_animal ON processing_marks (animal_id) WHERE status = 'planned' AND deleted_at IS NULL AND animal_id IS NOT NULL;
    CREATE UNIQUE INDEX processing_marks_one_per_group ON processing_marks (group_id) WHERE status = 'planned' AND deleted_at IS NULL AND group_id IS NOT NULL;
    CREATE INDEX processing_marks_farm_idx ON processing_marks (farm_id, planned_on) WHERE deleted_at IS NULL;
    ${tenantIsolation('processing_marks')}
    GRANT SELECT, INSERT, UPDATE ON processing_marks TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS processing_marks`);
};
