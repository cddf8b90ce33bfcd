import type { MigrationFn } from '../migrator';

/**
 * The Almanac's tasks: rows with stable ids (the calendar feed's UIDs), each a calendar date
 * on the farm's clock, planned from a service, a negative palpation, a kindling or an arrival under the
 * farm's cycle settings (or the co-op's quarantine rule), and linked to what it came from. A task is
 * open, done, moved (to a date the breeder chose; re-planning leaves it there) or skipped with a reason.
 * (source_id, key, anchor_date) is unique, so planning the same record twice never doubles a task.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE almanac_tasks (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      kind text NOT NULL CHECK (kind IN (
        'palpation', 'nest_box_in', 'kindling_due', 'kindling_overdue', 'rebreed', 'nest_box_out',
        'weigh_in', 'weaning', 'breed_back', 'quarantine_end'
      )),
      key text NOT NULL,
      anchor text NOT NULL CHECK (anchor IN ('service', 'palpation', 'kindling', 'arrival')),
      anchor_date date NOT NULL,
      -- The service, litter or arriving animal the task came from (a negative palpation's rebreed
      -- belongs to its service).
      source_id uuid NOT NULL,
      service_id uuid,
      litter_id uuid,
      animal_id uuid,
      due_on date NOT NULL,
      window_start date,
      window_end date,
      age_days integer,
      state text NOT NULL DEFAULT 'open' CHECK (state IN ('open', 'done', 'moved', 'skipped')),
      state_reason text,
      moved_from date,
      done_on date,
      done_by uuid REFERENCES users(id),
      note text NOT NULL DEFAULT '',
      -- An apprentice's tick waits for the mentor's review (pending → accepted, or returned and open again).
      completion_review text NOT NULL DEFAULT 'accepted' CHECK (completion_review IN ('pending', 'accepted', 'returned')),
      reviewed_by uuid REFERENCES users(id),
      reviewed_at timestamptz,
      review_comment text,
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT almanac_tasks_service FOREIGN KEY (coop_id, service_id) REFERENCES services (coop_id, id),
      CONSTRAINT almanac_tasks_litter FOREIGN KEY (coop_id, litter_id) REFERENCES litters (coop_id, id),
      CONSTRAINT almanac_tasks_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id),
      CONSTRAINT almanac_tasks_done_when CHECK ((state = 'done') = (done_on IS NOT NULL)),
      CONSTRAINT almanac_tasks_skip_reason CHECK (state <> 'skipped' OR state_reason IS NOT NULL),
      CONSTRAINT almanac_tasks_moved_from CHECK (state <> 'moved' OR moved_from IS NOT NULL),
      CONSTRAINT almanac_tasks_window CHECK ((window_start IS NULL) = (window_end IS NULL) AND (window_start IS NULL OR window_start <= window_end))
    );
    CREATE UNIQUE INDEX almanac_tasks_source_key_unique ON almanac_tasks (coop_id, source_id, key, anchor_date);
    CREATE INDEX almanac_tasks_farm_due_idx ON almanac_tasks (farm_id, due_on);
    CREATE INDEX almanac_tasks_open_idx ON almanac_tasks (farm_id, due_on) WHERE state IN ('open', 'moved');
    CREATE INDEX almanac_tasks_service_idx ON almanac_tasks (service_id) WHERE service_id IS NOT NULL;
    CREATE INDEX almanac_tasks_litter_idx ON almanac_tasks (litter_id) WHERE litter_id IS NOT NULL;
    CREATE INDEX almanac_tasks_animal_idx ON almanac_tasks (animal_id) WHERE animal_id IS NOT NULL;

    ALTER TABLE almanac_tasks ENABLE ROW LEVEL SECURITY;
    ALTER TABLE almanac_tasks FORCE ROW LEVEL SECURITY;
    CREATE POLICY almanac_tasks_tenant ON almanac_tasks USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());

    -- Tasks are never deleted (a skipped one says why); no DELETE grant.
    GRANT SELECT, INSERT, UPDATE ON almanac_tasks TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS almanac_tasks`);
};
