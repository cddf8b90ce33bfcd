import type { MigrationFn } from '../migrator';

/**
 * Photos: several per animal, one per farm profile. The files live in the storage module
 * (outside the web root) under server-made keys; this table says whose they are. An animal's photos
 * follow the animal (who may see them is decided by the animal's farm at the time of viewing);
 * `farm_id` is the farm that uploaded them. Removed photos keep their row (`deleted_at`), their files
 * are deleted.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE photos (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      subject text NOT NULL CHECK (subject IN ('animal', 'farm')),
      animal_id uuid,
      storage_key text NOT NULL,
      thumbnail_key text NOT NULL,
      content_type text NOT NULL CHECK (content_type IN ('image/jpeg', 'image/png', 'image/webp')),
      byte_size integer NOT NULL CHECK (byte_size > 0),
      thumbnail_byte_size integer NOT NULL CHECK (thumbnail_byte_size > 0),
      width integer NOT NULL CHECK (width > 0),
      height integer NOT NULL CHECK (height > 0),
      -- SHA-256 of the stored file, hex.
      checksum text NOT NULL,
      caption text NOT NULL DEFAULT '' CHECK (length(caption) <= 200),
      uploaded_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT photos_animal_same_coop FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id),
      CONSTRAINT photos_subject_shape CHECK ((subject = 'animal') = (animal_id IS NOT NULL)),
      CONSTRAINT photos_storage_key_unique UNIQUE (storage_key)
    );
    CREATE INDEX photos_animal_idx ON photos (animal_id, created_at) WHERE deleted_at IS NULL;
    CREATE INDEX photos_coop_idx ON photos (coop_id);
    -- One profile photo per farm.
    CREATE UNIQUE INDEX photos_one_per_farm_profile ON photos (farm_id) WHERE subject = 'farm' AND deleted_at IS NULL;

    ALTER TABLE photos ENABLE ROW LEVEL SECURITY;
    ALTER TABLE photos FORCE ROW LEVEL SECURITY;
    CREATE POLICY photos_tenant ON photos USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());
    GRANT SELECT, INSERT, UPDATE ON photos TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS photos`);
};
