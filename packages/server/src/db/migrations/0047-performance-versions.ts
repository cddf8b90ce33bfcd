import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * One counter per co-op, bumped by every transaction that changes a record the performance tables are
 * worked out from. Each server instance keeps a farm's computed tables in memory labelled with the
 * counter they were read under and reuses them while it has not moved, so a change committed through
 * any instance is seen on the next request everywhere.
 *
 * Two steps, so that no write waits on another's counter while it works: a plain row trigger on each
 * source table notes the change once per transaction (an insert into `performance_changes`, which never
 * waits), and a deferred trigger on that note bumps the counter as the transaction commits (holding its
 * row lock only while committing). The source tables themselves carry no deferred events, so a data
 * migration may still alter them after writing to them. A write made with no tenant set (a data migration
 * with row-level security lifted on its table) is counted under the row's co-op. Global breeds (no co-op)
 * are changed by migrations only, which come with a restart.
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

    CREATE TABLE performance_changes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id)
    );
    ${tenantIsolation('performance_changes')}
    GRANT SELECT, INSERT, DELETE ON performance_changes TO ${appRole};

    CREATE FUNCTION note_performance_change() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE coop uuid; tenant text;
    BEGIN
      coop := CASE WHEN TG_OP = 'DELETE' THEN OLD.coop_id ELSE NEW.coop_id END;
      IF coop IS NULL OR current_setting('burrowline.performance_changed', true) = coop::text THEN
        RETURN NULL;
      END IF;
      tenant := current_setting('app.coop_id', true);
      IF tenant IS DISTINCT FROM coop::text THEN PERFORM set_config('app.coop_id', coop::text, true); END IF;
      INSERT INTO performance_changes (coop_id) VALUES (coop);
      IF tenant IS DISTINCT FROM coop::text THEN PERFORM set_config('app.coop_id', coalesce(tenant, ''), true); END IF;
      PERFORM set_config('burrowline.performance_changed', coop::text, true);
      RETURN NULL;
    END $$;

    CREATE FUNCTION bump_performance_version() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE tenant text;
    BEGIN
      tenant := current_setting('app.coop_id', true);
      IF tenant IS DISTINCT FROM NEW.coop_id::text THEN PERFORM set_config('app.coop_id', NEW.coop_id::text, true); END IF;
      INSERT INTO performance_versions (coop_id, version) VALUES (NEW.coop_id, 1)
        ON CONFLICT (coop_id) DO UPDATE SET version = performance_versions.version + 1;
      DELETE FROM performance_changes WHERE id = NEW.id;
      IF tenant IS DISTINCT FROM NEW.coop_id::text THEN PERFORM set_config('app.coop_id', coalesce(tenant, ''), true); END IF;
      RETURN NULL;
    END $$;

    CREATE CONSTRAINT TRIGGER performance_changes_bump_version AFTER INSERT ON performance_changes
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION bump_performance_version();
  `);
  for (const table of inputTables) {
    await sql(`
      CREATE TRIGGER ${table}_note_performance_change AFTER INSERT OR UPDATE OR DELETE ON ${table}
        FOR EACH ROW EXECUTE FUNCTION note_performance_change();
    `);
  }
  // Only a grow-out group's weigh-ins are read by the tables; an animal's (the many) leave the counter alone.
  await sql(`
    CREATE TRIGGER weigh_ins_note_performance_change_insert AFTER INSERT ON weigh_ins
      FOR EACH ROW WHEN (NEW.group_id IS NOT NULL) EXECUTE FUNCTION note_performance_change();
    CREATE TRIGGER weigh_ins_note_performance_change_update AFTER UPDATE ON weigh_ins
      FOR EACH ROW WHEN (NEW.group_id IS NOT NULL OR OLD.group_id IS NOT NULL) EXECUTE FUNCTION note_performance_change();
    CREATE TRIGGER weigh_ins_note_performance_change_delete AFTER DELETE ON weigh_ins
      FOR EACH ROW WHEN (OLD.group_id IS NOT NULL) EXECUTE FUNCTION note_performance_change();
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  for (const table of inputTables) await sql(`DROP TRIGGER IF EXISTS ${table}_note_performance_change ON ${table}`);
  for (const op of ['insert', 'update', 'delete']) await sql(`DROP TRIGGER IF EXISTS weigh_ins_note_performance_change_${op} ON weigh_ins`);
  await sql(`
    DROP TABLE IF EXISTS performance_changes;
    DROP TABLE IF EXISTS performance_versions;
    DROP FUNCTION IF EXISTS note_performance_change();
    DROP FUNCTION IF EXISTS bump_performance_version();
  `);
};
