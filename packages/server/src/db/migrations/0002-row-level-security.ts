import type { MigrationFn } from '../migrator';

/**
 * The second wall behind the app's own scoping: every tenant table answers only the co-op set for the
 * current transaction. NULLIF keeps a reused pooled connection (setting reads '') matching nothing
 * instead of raising a cast error.
 *
 * Outside RLS on purpose (what runs before the tenant is known): user_sessions, one_time_tokens
 * (hashed), and the two identity look-ups and the public co-op directory below, which are
 * SECURITY DEFINER functions owned by the owner role. Added later, for the same reason:
 * calendar_feed_tokens (hashed; a phone calendar fetches the feed with no session, 0018), and for the
 * morning e-mail job (0019) the pg-boss schema and the SECURITY DEFINER almanac_digest_recipients().
 */
const tenantTables = ['farms', 'users', 'audit_events', 'record_changes'];
const TENANT = `NULLIF(current_setting('app.coop_id', true), '')::uuid`;

export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE FUNCTION current_coop_id() RETURNS uuid LANGUAGE sql STABLE AS $$ SELECT ${TENANT} $$;

    ALTER TABLE cooperatives ENABLE ROW LEVEL SECURITY;
    ALTER TABLE cooperatives FORCE ROW LEVEL SECURITY;
    CREATE POLICY cooperatives_tenant ON cooperatives USING (id = current_coop_id()) WITH CHECK (id = current_coop_id());
  `);
  for (const table of tenantTables) {
    await sql(`
      ALTER TABLE ${table} ENABLE ROW LEVEL SECURITY;
      ALTER TABLE ${table} FORCE ROW LEVEL SECURITY;
      CREATE POLICY ${table}_tenant ON ${table} USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());
    `);
  }
  // Sign-in failures for an unknown e-mail belong to no co-op.
  await sql(`
    CREATE POLICY audit_events_no_tenant_insert ON audit_events FOR INSERT WITH CHECK (coop_id IS NULL);
  `);
  // The identity look-ups run as the owner (SECURITY DEFINER); this policy is the owner's alone.
  await sql(`
    DO $$ BEGIN
      EXECUTE format('CREATE POLICY users_identity_lookup ON users FOR SELECT TO %I USING (true)', current_user);
      EXECUTE format('CREATE POLICY cooperatives_directory ON cooperatives FOR SELECT TO %I USING (true)', current_user);
    END $$;

    CREATE FUNCTION auth_user_by_email(p_email text)
      RETURNS TABLE (id uuid, coop_id uuid, password_hash text, disabled_at timestamptz)
      LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public AS $$
        SELECT id, coop_id, password_hash, disabled_at FROM users WHERE lower(email) = lower(p_email)
      $$;

    CREATE FUNCTION auth_user_by_id(p_id uuid)
      RETURNS TABLE (id uuid, coop_id uuid, farm_id uuid, mentor_id uuid, email text, name text, role text,
                     disabled_at timestamptz, sessions_valid_after timestamptz)
      LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public AS $$
        SELECT id, coop_id, farm_id, mentor_id, email, name, role, disabled_at, sessions_valid_after
        FROM users WHERE id = p_id
      $$;

    CREATE FUNCTION public_coop_by_slug(p_slug text)
      RETURNS TABLE (id uuid, name text, slug text, rules_text text)
      LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public AS $$
        SELECT id, name, slug, rules_text FROM cooperatives WHERE slug = p_slug
      $$;

    REVOKE ALL ON FUNCTION auth_user_by_email(text), auth_user_by_id(uuid), public_coop_by_slug(text) FROM PUBLIC;
  `);
  await sql(`
    GRANT SELECT, INSERT, UPDATE ON cooperatives, farms, users TO ${appRole};
    GRANT SELECT, INSERT ON audit_events, record_changes TO ${appRole};
    GRANT SELECT, INSERT, UPDATE, DELETE ON user_sessions TO ${appRole};
    GRANT SELECT, INSERT, UPDATE ON one_time_tokens TO ${appRole};
    GRANT EXECUTE ON FUNCTION current_coop_id(), auth_user_by_email(text), auth_user_by_id(uuid), public_coop_by_slug(text) TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP FUNCTION IF EXISTS auth_user_by_email(text), auth_user_by_id(uuid), public_coop_by_slug(text);
    DROP POLICY IF EXISTS users_identity_lookup ON users;
    DROP POLICY IF EXISTS cooperatives_directory ON cooperatives;
    DROP POLICY IF EXISTS audit_events_no_tenant_insert ON audit_events;
    DROP POLICY IF EXISTS cooperatives_tenant ON cooperatives;
    ALTER TABLE cooperatives NO FORCE ROW LEVEL SECURITY;
    ALTER TABLE cooperatives DISABLE ROW LEVEL SECURITY;
  `);
  for (const table of tenantTables) {
    await sql(`
      DROP POLICY IF EXISTS ${table}_tenant ON ${table};
      ALTER TABLE ${table} NO FORCE ROW LEVEL SECURITY;
      ALTER TABLE ${table} DISABLE ROW LEVEL SECURITY;
    `);
  }
  await sql(`DROP FUNCTION IF EXISTS current_coop_id()`);
};
