import PgBoss from 'pg-boss';
import type { MigrationFn } from '../migrator';

const DIGEST_QUEUE = 'almanac-morning-digest';
const BOSS_SCHEMA = 'pgboss';

/**
 * The opt-in morning e-mail. Who asked for it and at what hour of their farm's clock; one
 * delivery row per person and farm day, unique, so the e-mail goes once however many app instances
 * run the job; and the job queue itself (pg-boss, in its own schema), installed here by the owner so
 * the app role needs no right to create schemas or tables.
 *
 * Outside row-level security on purpose (listed with the others in migration 0002): the pg-boss schema
 * (job rows carry no tenant data, only the tick's time), and the SECURITY DEFINER look-up
 * almanac_digest_recipients(), which the scheduled job runs before it knows any tenant; the job then
 * reads each recipient's Almanac inside that co-op's tenant transaction.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE almanac_digest_subscriptions (
      user_id uuid PRIMARY KEY REFERENCES users(id),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      enabled boolean NOT NULL DEFAULT true,
      -- The hour of the farm's clock from which the e-mail goes out (3–11 am).
      hour integer NOT NULL DEFAULT 6 CHECK (hour BETWEEN 3 AND 11),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE almanac_digest_deliveries (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      user_id uuid NOT NULL REFERENCES users(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      -- The farm's date the e-mail is for.
      local_date date NOT NULL,
      task_count integer NOT NULL,
      overdue_count integer NOT NULL,
      sent_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX almanac_digest_deliveries_once ON almanac_digest_deliveries (user_id, local_date);
  `);
  for (const table of ['almanac_digest_subscriptions', 'almanac_digest_deliveries']) {
    await sql(`
      ALTER TABLE ${table} ENABLE ROW LEVEL SECURITY;
      ALTER TABLE ${table} FORCE ROW LEVEL SECURITY;
      CREATE POLICY ${table}_tenant ON ${table} USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());
    `);
  }
  await sql(`
    DO $$ BEGIN
      EXECUTE format('CREATE POLICY almanac_digest_subscriptions_lookup ON almanac_digest_subscriptions FOR SELECT TO %I USING (true)', current_user);
      EXECUTE format('CREATE POLICY farms_digest_lookup ON farms FOR SELECT TO %I USING (true)', current_user);
    END $$;

    CREATE FUNCTION almanac_digest_recipients()
      RETURNS TABLE (user_id uuid, coop_id uuid, farm_id uuid, email text, name text, time_zone text, hour integer)
      LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public AS $$
        SELECT s.user_id, s.coop_id, u.farm_id, u.email, u.name, f.time_zone, s.hour
        FROM almanac_digest_subscriptions s
        JOIN users u ON u.id = s.user_id AND u.coop_id = s.coop_id
        JOIN farms f ON f.id = u.farm_id AND f.coop_id = s.coop_id
        WHERE s.enabled AND u.disabled_at IS NULL AND u.password_hash IS NOT NULL AND f.deleted_at IS NULL
      $$;
    REVOKE ALL ON FUNCTION almanac_digest_recipients() FROM PUBLIC;

    GRANT SELECT, INSERT, UPDATE ON almanac_digest_subscriptions TO ${appRole};
    GRANT SELECT, INSERT ON almanac_digest_deliveries TO ${appRole};
    GRANT EXECUTE ON FUNCTION almanac_digest_recipients() TO ${appRole};
  `);

  // pg-boss's own tables, as its construction plan writes them; its BEGIN/COMMIT are dropped because
  // this migration already runs in one transaction.
  const plan = PgBoss.getConstructionPlans(BOSS_SCHEMA).replace(/^\s*(BEGIN|COMMIT);\s*$/gm, '');
  await sql(plan);
  await sql(`SELECT ${BOSS_SCHEMA}.create_queue('${DIGEST_QUEUE}', '{"policy":"standard","retryLimit":3,"retryDelay":60,"expireInSeconds":900}'::json)`);
  await sql(`
    GRANT USAGE ON SCHEMA ${BOSS_SCHEMA} TO ${appRole};
    GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};
    GRANT USAGE ON ALL SEQUENCES IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};
    GRANT EXECUTE ON ALL FUNCTIONS IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP SCHEMA IF EXISTS ${BOSS_SCHEMA} CASCADE;
    DROP FUNCTION IF EXISTS almanac_digest_recipients();
    DROP POLICY IF EXISTS farms_digest_lookup ON farms;
    DROP TABLE IF EXISTS almanac_digest_deliveries, almanac_digest_subscriptions;
  `);
};
