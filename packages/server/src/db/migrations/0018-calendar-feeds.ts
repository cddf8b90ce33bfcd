import type { MigrationFn } from '../migrator';

/**
 * The per-farm iCalendar feed's secret. A phone calendar fetches the feed with no session,
 * before the tenant is known, so this table stays outside row-level security on purpose, like
 * one_time_tokens (listed with it in migration 0002): only the SHA-256 of the token is stored, and the
 * feed route looks it up by that hash alone. Renewing revokes the old token; one live token per farm.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE calendar_feed_tokens (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      created_by uuid NOT NULL REFERENCES users(id),
      token_hash text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      last_used_at timestamptz,
      revoked_at timestamptz
    );
    CREATE UNIQUE INDEX calendar_feed_tokens_hash_unique ON calendar_feed_tokens (token_hash);
    CREATE UNIQUE INDEX calendar_feed_tokens_live_per_farm ON calendar_feed_tokens (farm_id) WHERE revoked_at IS NULL;

    GRANT SELECT, INSERT, UPDATE ON calendar_feed_tokens TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS calendar_feed_tokens`);
};
