import type { MigrationFn } from '../migrator';

/**
 * Each farm's own breeding cycle: the days from service and kindling to each job of the
 * Almanac. No row means the published defaults (packages/shared breeding/cycle-settings, with their
 * sources); the first edit stores the whole set. Two members of a farm may edit at once: `version`.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE farm_cycle_settings (
      farm_id uuid PRIMARY KEY REFERENCES farms(id),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      -- The whole set as the shared cycleSettingsSchema checks it (days and grams).
      settings jsonb NOT NULL CHECK (jsonb_typeof(settings) = 'object'),
      updated_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX farm_cycle_settings_coop_idx ON farm_cycle_settings (coop_id);

    ALTER TABLE farm_cycle_settings ENABLE ROW LEVEL SECURITY;
    ALTER TABLE farm_cycle_settings FORCE ROW LEVEL SECURITY;
    CREATE POLICY farm_cycle_settings_tenant ON farm_cycle_settings
      USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());

    GRANT SELECT, INSERT, UPDATE ON farm_cycle_settings TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS farm_cycle_settings`);
};
