import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Processing records: one animal from the Herd, or a batch of a grow-out group's heads, with
 * the live and carcass weights (totals of the record's heads), the age, and what was computed when it
 * was saved: the dress-out (hot and chilled), the USDA class (USDA FSIS, "Rabbit from Farm to Table")
 * and the flags for figures outside the usual range. Later shared processing days fill these in; the
 * performance tables read them. Never hard-deleted.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE processing_records (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      processed_on date NOT NULL,
      animal_id uuid,
      group_id uuid,
      head_count integer NOT NULL CHECK (head_count BETWEEN 1 AND 500),
      age_days integer CHECK (age_days >= 0),
      live_grams integer NOT NULL CHECK (live_grams > 0),
      hot_carcass_grams integer NOT NULL CHECK (hot_carcass_grams > 0),
      chilled_carcass_grams integer CHECK (chilled_carcass_grams > 0),
      hot_dress_out_percent numeric(5,2) NOT NULL,
      chilled_dress_out_percent numeric(5,2),
      usda_class text NOT NULL CHECK (usda_class IN ('fryer', 'roaster', 'unclassed')),
      usda_class_reason text NOT NULL DEFAULT '',
      usda_class_note text,
      flags jsonb NOT NULL DEFAULT '[]',
      notes text NOT NULL DEFAULT '' CHECK (length(notes) <= 1000),
      recorded_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT processing_records_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT processing_records_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id),
      CONSTRAINT processing_records_group FOREIGN KEY (coop_id, group_id) REFERENCES grow_out_groups (coop_id, id),
      CONSTRAINT processing_records_one_subject CHECK ((animal_id IS NULL) <> (group_id IS NULL)),
      CONSTRAINT processing_records_one_head CHECK (animal_id IS NULL OR head_count = 1),
      CONSTRAINT processing_records_carcass CHECK (hot_carcass_grams <= live_grams),
      CONSTRAINT processing_records_chilled CHECK (chilled_carcass_grams IS NULL OR chilled_carcass_grams <= hot_carcass_grams)
    );
    CREATE UNIQUE INDEX processing_records_one_per_animal ON processing_records (animal_id) WHERE deleted_at IS NULL AND animal_id IS NOT NULL;
    CREATE INDEX processing_records_farm_idx ON processing_records (farm_id, processed_on DESC) WHERE deleted_at IS NULL;
    CREATE INDEX processing_records_group_idx ON processing_records (group_id) WHERE deleted_at IS NULL AND group_id IS NOT NULL;
    ${tenantIsolation('processing_records')}
    GRANT SELECT, INSERT, UPDATE ON processing_records TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS processing_records`);
};
