import type { MigrationFn } from '../migrator';

/**
 * The roster pages in SQL and shows each person's last sign-in: an index on successful sign-ins by person
 * makes that a look-up per row of the page instead of a scan of the co-op's whole audit log.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`CREATE INDEX audit_events_sign_ins_idx ON audit_events (actor_user_id, created_at) WHERE action = 'sign_in.succeeded'`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX IF EXISTS audit_events_sign_ins_idx`);
};
