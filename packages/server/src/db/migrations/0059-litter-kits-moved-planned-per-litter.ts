import type { MigrationFn } from '../migrator';

/**
 * A litter's kits moved by its entries, planned for each litter it is asked for. As a SQL function its
 * plan was made once per transaction, at the first call — in a bulk load, while the entries' table was
 * still empty and its statistics said so — and that plan (every entry read and filtered by litter) was
 * then kept for each of the tens of thousands of litters that followed. Planned per call, the index on
 * the litter is used as soon as there is anything to read. A litter just inserted has no entries yet
 * (they name it by foreign key), so its count is its born alive without asking.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE OR REPLACE FUNCTION litter_kits_moved(p_litter_id uuid) RETURNS integer LANGUAGE plpgsql STABLE AS $$
    DECLARE moved integer;
    BEGIN
      EXECUTE 'SELECT COALESCE(sum(CASE e.kind WHEN ''fostered_in'' THEN e.kit_count ELSE -e.kit_count END), 0)::integer
               FROM litter_events e
               WHERE e.litter_id = $1 AND e.deleted_at IS NULL AND e.review_state <> ''returned'''
        INTO moved USING p_litter_id;
      RETURN moved;
    END $$;
    CREATE OR REPLACE FUNCTION litter_kits_on_doe_of_row() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      NEW.kits_on_doe := NEW.born_alive + CASE WHEN TG_OP = 'INSERT' THEN 0 ELSE litter_kits_moved(NEW.id) END;
      RETURN NEW;
    END $$;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE OR REPLACE FUNCTION litter_kits_moved(p_litter_id uuid) RETURNS integer LANGUAGE sql STABLE SET enable_seqscan = off AS $$
      SELECT COALESCE(sum(CASE e.kind WHEN 'fostered_in' THEN e.kit_count ELSE -e.kit_count END), 0)::integer
      FROM litter_events e
      WHERE e.litter_id = p_litter_id AND e.deleted_at IS NULL AND e.review_state <> 'returned'
    $$;
    CREATE OR REPLACE FUNCTION litter_kits_on_doe_of_row() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      NEW.kits_on_doe := NEW.born_alive + litter_kits_moved(NEW.id);
      RETURN NEW;
    END $$;
  `);
};
