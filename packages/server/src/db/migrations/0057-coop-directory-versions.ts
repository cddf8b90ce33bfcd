import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * One counter per co-op, bumped by triggers in the same transaction as any change to the co-op's breeds or
 * to what the directory shows of its farms (name, clock, units, removal). Every server instance keeps the
 * co-op's breeds and farms in memory; each request reads this counter in the statement that reads its
 * session (through `coop_directory_version`, before the co-op is set, like the identity look-ups of 0002),
 * so a change made through any instance is seen by the next request. The catalogue's shared breeds (no
 * co-op) change only by migration, which restarts the instances.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE coop_directory_versions (
      coop_id uuid PRIMARY KEY REFERENCES cooperatives(id),
      version bigint NOT NULL DEFAULT 0
    );
    ${tenantIsolation('coop_directory_versions')}
    GRANT SELECT, INSERT, UPDATE ON coop_directory_versions TO ${appRole};
    DO $$ BEGIN
      EXECUTE format('CREATE POLICY coop_directory_versions_lookup ON coop_directory_versions FOR SELECT TO %I USING (true)', current_user);
    END $$;
    CREATE FUNCTION coop_directory_version(p_coop uuid) RETURNS text
      LANGUAGE sql STABLE SECURITY DEFINER SET search_path = public AS $$
        SELECT coalesce((SELECT version FROM coop_directory_versions WHERE coop_id = p_coop), 0)::text
      $$;
    REVOKE ALL ON FUNCTION coop_directory_version(uuid) FROM PUBLIC;
    GRANT EXECUTE ON FUNCTION coop_directory_version(uuid) TO ${appRole};

    CREATE FUNCTION bump_coop_directory_version() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      coop uuid := CASE WHEN TG_OP = 'DELETE' THEN OLD.coop_id ELSE NEW.coop_id END;
    BEGIN
      IF coop IS NOT NULL THEN
        INSERT INTO coop_directory_versions AS v (coop_id, version) VALUES (coop, 1)
        ON CONFLICT (coop_id) DO UPDATE SET version = v.version + 1;
      END IF;
      RETURN NULL;
    END $$;
    CREATE TRIGGER breeds_directory_version AFTER INSERT OR UPDATE OR DELETE ON breeds
      FOR EACH ROW EXECUTE FUNCTION bump_coop_directory_version();
    CREATE TRIGGER farms_directory_version AFTER INSERT OR DELETE OR UPDATE OF name, time_zone, weight_unit, deleted_at ON farms
      FOR EACH ROW EXECUTE FUNCTION bump_coop_directory_version();
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP TRIGGER IF EXISTS breeds_directory_version ON breeds;
    DROP TRIGGER IF EXISTS farms_directory_version ON farms;
    DROP FUNCTION IF EXISTS bump_coop_directory_version();
    DROP FUNCTION IF EXISTS coop_directory_version(uuid);
    DROP TABLE IF EXISTS coop_directory_versions;
  `);
};
