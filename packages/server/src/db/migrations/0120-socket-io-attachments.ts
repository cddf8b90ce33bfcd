import type { MigrationFn } from '../migrator';

/**
 * Socket.IO's PostgreSQL adapter carries live events between app instances with NOTIFY; a payload over
 * NOTIFY's 8,000-byte limit (or with binary data) is written here and only its id is notified. Rows live
 * for seconds (the adapter deletes them after its cleanup interval) and belong to no co-op: they are read
 * by every instance before any socket's tenant is known, so the table stays outside row-level security on
 * purpose, like the sessions listed in migration 0002. The app role only adds, reads and removes rows.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE socket_io_attachments (
      id bigserial UNIQUE,
      created_at timestamptz NOT NULL DEFAULT now(),
      payload bytea
    );
    CREATE INDEX socket_io_attachments_created_at ON socket_io_attachments (created_at);
    GRANT SELECT, INSERT, DELETE ON socket_io_attachments TO ${appRole};
    GRANT USAGE ON SEQUENCE socket_io_attachments_id_seq TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS socket_io_attachments`);
};
