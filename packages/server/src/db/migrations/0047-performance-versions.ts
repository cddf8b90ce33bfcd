import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * One counter per co-op, bumped by every transaction that changes a record the performance tables are
 * worked out from. Each server instance keeps a farm's computed tables in memory labelled with the
 * counter they were read under and reuses them while it has not moved, so a change committed through
 * any instance is seen on the next request everywhere.
 *
 * The bump is a deferred constraint trigger: it runs at commit, once per transaction (a transaction-local
 * setting remembers it), so a write holds the counter's row lock only while it commits and takes no lock
 * in the middle of its work that another transaction could be waiting on. Global breeds (no co-op) are
 * changed by migrations only, which come with a restart.
 */
const inputTables = [
  'services', 'litters', 'litter_events', 'grow_out_groups', 'grow_out_group_litters', 'feed_uses', 'feed_use_shares',
  'processing_records', 'farm_cycle_settings', 'animals', 'animal_breed_makeups', 'breeds',
];

export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE performance_versions (
      coop_id uuid PRIMARY KEY REFERENCES cooperatives(id),
      version bigint NOT NULL DEFAULT 0
    );
    ${tenantIsolation('performance_versions')}
    GRANT SELECT, INSERT, UPDATE ON performance_versions TO ${appRole};

    CREATE FUNCTION bump_performance_version() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE coop uuid;
    BEGIN
      coop := CASE WHEN TG_OP = 'DELETE' THEN OLD.coop_id ELSE NEW.coop_id END;
      IF coop IS NULL OR current_setting('burrowline.performance_bumped', true) = coop::text THEN
        RETURN NULL;
      END IF;
      INSERT INTO performance_versions (coop_id, version) VALUES (coop, 1)
        ON CONFLICT (coop_id) DO UPDATE SET version = performance_versions.version + 1;
      PERFORM set_config('burrowline.performance_bumped', coop::text, true);
      RETURN NULL;
    END $$;
  `);
  for (const table of inputTables) {
    await sql(`
      CREATE CONSTRAINT TRIGGER ${table}_bump_performance AFTER INSERT OR UPDATE OR DELETE ON ${table}
        DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION bump_performance_version();
    `);
  }
  // Only a grow-out group's weigh-ins are read by the tables; an animal's (the many) leave the counter alone.
  await sql(`
    CREATE CONSTRAINT TRIGGER weigh_ins_bump_performance_insert AFTER INSERT ON weigh_ins DEFERRABLE INITIALLY DEFERRED
      FOR EACH ROW WHEN (NEW.group_id IS NOT NULL) EXECUTE FUNCTION bump_performance_version();
    CREATE CONSTRAINT TRIGGER weigh_ins_bump_performance_update AFTER UPDATE ON weigh_ins DEFERRABLE INITIALLY DEFERRED
      FOR EACH ROW WHEN (NEW.group_id IS NOT NULL OR OLD.group_id IS NOT NULL) EXECUTE FUNCTION bump_performance_version();
    CREATE CONSTRAINT TRIGGER weigh_ins_bump_performance_delete AFTER DELETE ON weigh_ins DEFERRABLE INITIALLY DEFERRED
      FOR EACH ROW WHEN (OLD.group_id IS NOT NULL) EXECUTE FUNCTION bump_performance_version();
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  for (const table of inputTables) await sql(`DROP TRIGGER IF EXISTS ${table}_bump_performance ON ${table}`);
  for (const op of ['insert', 'update', 'delete']) await sql(`DROP TRIGGER IF EXISTS weigh_ins_bump_performance_${op} ON weigh_ins`);
  await sql(`
    DROP FUNCTION IF EXISTS bump_performance_version();
    DROP TABLE IF EXISTS performance_versions;
  `);
};
