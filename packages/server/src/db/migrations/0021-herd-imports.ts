import type { MigrationFn } from '../migrator';

/**
 * Spreadsheets staged for import into a farm's herd. The file is kept as uploaded (with its
 * checksum) so the confirm checks exactly what the preview showed against the herd as it is then;
 * `rows` holds the checked rows (and the ids new animals will get), `summary` the counts. A confirm
 * carries an idempotency key, unique in the co-op, so a double click imports once. Previews that were
 * never confirmed are deleted after a day; confirmed ones stay as the record of the import.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE herd_imports (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      uploaded_by uuid NOT NULL REFERENCES users(id),
      file_name text NOT NULL CHECK (length(file_name) <= 200),
      byte_size integer NOT NULL CHECK (byte_size > 0),
      checksum text NOT NULL CHECK (checksum ~ '^[0-9a-f]{64}$'),
      had_bom boolean NOT NULL DEFAULT false,
      content bytea NOT NULL,
      status text NOT NULL DEFAULT 'ready' CHECK (status IN ('ready', 'confirmed')),
      summary jsonb NOT NULL,
      rows jsonb NOT NULL,
      idempotency_key uuid,
      result jsonb,
      confirmed_by uuid REFERENCES users(id),
      confirmed_at timestamptz,
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT herd_imports_confirmed_shape CHECK (
        (status = 'confirmed') = (idempotency_key IS NOT NULL AND confirmed_at IS NOT NULL AND result IS NOT NULL)
      )
    );
    CREATE UNIQUE INDEX herd_imports_idempotency_unique ON herd_imports (coop_id, idempotency_key) WHERE idempotency_key IS NOT NULL;
    CREATE INDEX herd_imports_farm_idx ON herd_imports (farm_id, created_at);

    ALTER TABLE herd_imports ENABLE ROW LEVEL SECURITY;
    ALTER TABLE herd_imports FORCE ROW LEVEL SECURITY;
    CREATE POLICY herd_imports_tenant ON herd_imports USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());
    -- Unconfirmed previews are cleared after a day (nothing refers to them).
    GRANT SELECT, INSERT, UPDATE, DELETE ON herd_imports TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS herd_imports`);
};
