import type { MigrationFn } from '../migrator';

/**
 * Each litter keeps the kits still on its doe (born alive, plus fostered in, less every kit that left,
 * counting the entries that are not deleted or returned in review), so the litters list counts and filters
 * nursing and weaned litters from the litters alone instead of adding up every litter's entries on each
 * request. Triggers keep it: a litter's own count is worked out when it is written or its born alive
 * changes, and any written entry works its litter's count out again from all its entries (never by
 * adding to it, so copies and corrections cannot drift).
 */

/**
 * The litters an entry statement touched, each once, joined by key, by index only: a transition table has
 * no statistics, and in a bulk load in one transaction the litters' still say empty, so the planner would
 * scan every litter once per touched litter (a load of 100,000 entries ran for many minutes).
 */
const followEventsFunction = `CREATE OR REPLACE FUNCTION litter_kits_on_doe_follow_events() RETURNS trigger LANGUAGE plpgsql SET enable_seqscan = off AS $$
    BEGIN
      IF TG_OP = 'INSERT' THEN
        UPDATE litters l SET kits_on_doe = 0 FROM (SELECT DISTINCT litter_id FROM new_events) e WHERE l.id = e.litter_id;
      ELSIF TG_OP = 'DELETE' THEN
        UPDATE litters l SET kits_on_doe = 0 FROM (SELECT DISTINCT litter_id FROM old_events) e WHERE l.id = e.litter_id;
      ELSE
        UPDATE litters l SET kits_on_doe = 0
        FROM (SELECT litter_id FROM new_events UNION SELECT litter_id FROM old_events) e WHERE l.id = e.litter_id;
      END IF;
      RETURN NULL;
    END $$;`;

export const up: MigrationFn = async ({ context: { sql, rows } }) => {
  await sql(`
    ALTER TABLE litters ADD COLUMN kits_on_doe integer NOT NULL DEFAULT 0;

    -- Index scans only: loaded in bulk in one transaction (statistics still say empty), the planner would
    -- read every entry once per litter.
    CREATE FUNCTION litter_kits_moved(p_litter_id uuid) RETURNS integer LANGUAGE sql STABLE SET enable_seqscan = off AS $$
      SELECT COALESCE(sum(CASE e.kind WHEN 'fostered_in' THEN e.kit_count ELSE -e.kit_count END), 0)::integer
      FROM litter_events e
      WHERE e.litter_id = p_litter_id AND e.deleted_at IS NULL AND e.review_state <> 'returned'
    $$;

    CREATE FUNCTION litter_kits_on_doe_of_row() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      NEW.kits_on_doe := NEW.born_alive + litter_kits_moved(NEW.id);
      RETURN NEW;
    END $$;
    CREATE TRIGGER litters_kits_on_doe BEFORE INSERT OR UPDATE OF born_alive, kits_on_doe ON litters
      FOR EACH ROW EXECUTE FUNCTION litter_kits_on_doe_of_row();

    ${followEventsFunction}
    CREATE TRIGGER litter_events_insert_kits_on_doe AFTER INSERT ON litter_events
      REFERENCING NEW TABLE AS new_events FOR EACH STATEMENT EXECUTE FUNCTION litter_kits_on_doe_follow_events();
    CREATE TRIGGER litter_events_update_kits_on_doe AFTER UPDATE ON litter_events
      REFERENCING OLD TABLE AS old_events NEW TABLE AS new_events FOR EACH STATEMENT EXECUTE FUNCTION litter_kits_on_doe_follow_events();
    CREATE TRIGGER litter_events_delete_kits_on_doe AFTER DELETE ON litter_events
      REFERENCING OLD TABLE AS old_events FOR EACH STATEMENT EXECUTE FUNCTION litter_kits_on_doe_follow_events();
  `);
  // Row-level security binds the owner too: each co-op's litters are worked out as that co-op (the
  // litters' trigger sets the count from the entries).
  for (const { id: coopId } of await rows<{ id: string }>('SELECT id FROM cooperatives', [])) {
    await rows("SELECT set_config('app.coop_id', $1, true)", [coopId]);
    await rows('UPDATE litters SET kits_on_doe = 0 WHERE coop_id = $1 RETURNING NULL', [coopId]);
  }
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP TRIGGER litter_events_insert_kits_on_doe ON litter_events;
    DROP TRIGGER litter_events_update_kits_on_doe ON litter_events;
    DROP TRIGGER litter_events_delete_kits_on_doe ON litter_events;
    DROP FUNCTION litter_kits_on_doe_follow_events();
    DROP TRIGGER litters_kits_on_doe ON litters;
    DROP FUNCTION litter_kits_on_doe_of_row();
    DROP FUNCTION litter_kits_moved(uuid);
    ALTER TABLE litters DROP COLUMN kits_on_doe;
  `);
};
