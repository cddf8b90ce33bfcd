import type { MigrationFn } from '../migrator';

/**
 * Treatments in full: the dose, the route, the last day of treatment and the withdrawal the
 * veterinarian set, and a treated grow-out group as well as a single animal. No drugs are approved for
 * rabbits in the US: treatment is extralabel and the veterinarian sets the withdrawal time before
 * slaughter (Sundlof et al., JAVMA 1991; FARAD). `ends_on` stays what it was, the last day under
 * withdrawal, so rows written before this migration stay valid (their dose, route and last day of
 * treatment are unknown: empty/null).
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE treatments
      ADD COLUMN dose text NOT NULL DEFAULT '' CHECK (length(dose) <= 200),
      ADD COLUMN route text CHECK (route IN ('oral', 'injection', 'topical', 'in_water', 'in_feed', 'other')),
      ADD COLUMN last_dose_on date,
      ADD COLUMN withdrawal_days integer CHECK (withdrawal_days BETWEEN 0 AND 3650),
      ADD COLUMN group_id uuid,
      ALTER COLUMN animal_id DROP NOT NULL,
      ADD CONSTRAINT treatments_group FOREIGN KEY (coop_id, group_id) REFERENCES grow_out_groups (coop_id, id),
      ADD CONSTRAINT treatments_one_subject CHECK ((animal_id IS NULL) <> (group_id IS NULL)),
      ADD CONSTRAINT treatments_last_dose CHECK (last_dose_on IS NULL OR (last_dose_on >= started_on AND ends_on >= last_dose_on)),
      ADD CONSTRAINT treatments_withdrawal_days_match CHECK (withdrawal_days IS NULL OR (last_dose_on IS NOT NULL AND ends_on = last_dose_on + withdrawal_days));
    COMMENT ON COLUMN treatments.ends_on IS 'The last day under withdrawal (the veterinarian''s); processing is allowed from the next day';
    COMMENT ON COLUMN treatments.withdrawal_days IS 'Days of withdrawal after the last dose; 0 = no withdrawal, set explicitly';
    CREATE INDEX treatments_group_idx ON treatments (group_id, ends_on) WHERE deleted_at IS NULL AND group_id IS NOT NULL;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DELETE FROM treatments WHERE group_id IS NOT NULL;
    DROP INDEX IF EXISTS treatments_group_idx;
    ALTER TABLE treatments
      DROP CONSTRAINT IF EXISTS treatments_withdrawal_days_match,
      DROP CONSTRAINT IF EXISTS treatments_last_dose,
      DROP CONSTRAINT IF EXISTS treatments_one_subject,
      DROP CONSTRAINT IF EXISTS treatments_group,
      DROP COLUMN group_id,
      DROP COLUMN withdrawal_days,
      DROP COLUMN last_dose_on,
      DROP COLUMN route,
      DROP COLUMN dose,
      ALTER COLUMN animal_id SET NOT NULL;
  `);
};
