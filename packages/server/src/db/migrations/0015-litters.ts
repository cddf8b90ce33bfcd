import type { MigrationFn } from '../migrator';

/**
 * Litters and the dated events that change their kit count. The count is never stored: it
 * follows from born alive and the events (fostered in or out naming the other litter, lost with a cause,
 * culled, weaned). Sire and dam are the service's, fixed at the kindling; fostering never changes them.
 * A fostering between two litters is two events sharing a `pair_id`, one on each litter (and farm).
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE litters (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      service_id uuid NOT NULL,
      dam_id uuid NOT NULL,
      sire_id uuid NOT NULL,
      kindled_on date NOT NULL,
      born_alive integer NOT NULL CHECK (born_alive BETWEEN 0 AND 30),
      born_dead integer NOT NULL CHECK (born_dead BETWEEN 0 AND 30),
      notes text NOT NULL DEFAULT '',
      recorded_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT litters_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT litters_service FOREIGN KEY (coop_id, service_id) REFERENCES services (coop_id, id),
      CONSTRAINT litters_dam FOREIGN KEY (coop_id, dam_id) REFERENCES animals (coop_id, id),
      CONSTRAINT litters_sire FOREIGN KEY (coop_id, sire_id) REFERENCES animals (coop_id, id)
    );
    -- One litter per service.
    CREATE UNIQUE INDEX litters_service_unique ON litters (service_id) WHERE deleted_at IS NULL;
    CREATE INDEX litters_farm_idx ON litters (farm_id, kindled_on DESC) WHERE deleted_at IS NULL;
    CREATE INDEX litters_parents_idx ON litters (dam_id, sire_id, kindled_on);

    ALTER TABLE services ADD CONSTRAINT services_litter FOREIGN KEY (coop_id, litter_id) REFERENCES litters (coop_id, id);

    CREATE TABLE litter_events (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      litter_id uuid NOT NULL,
      kind text NOT NULL CHECK (kind IN ('fostered_in', 'fostered_out', 'lost', 'culled', 'weaned')),
      occurred_on date NOT NULL,
      kit_count integer NOT NULL CHECK (kit_count BETWEEN 1 AND 30),
      cause text,
      other_litter_id uuid,
      pair_id uuid,
      entered_by uuid REFERENCES users(id),
      review_state text NOT NULL DEFAULT 'accepted' CHECK (review_state IN ('pending', 'accepted', 'returned')),
      reviewed_by uuid REFERENCES users(id),
      reviewed_at timestamptz,
      review_comment text,
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT litter_events_litter FOREIGN KEY (coop_id, litter_id) REFERENCES litters (coop_id, id),
      CONSTRAINT litter_events_other FOREIGN KEY (coop_id, other_litter_id) REFERENCES litters (coop_id, id),
      CONSTRAINT litter_events_foster_names_other CHECK (
        (kind IN ('fostered_in', 'fostered_out')) = (other_litter_id IS NOT NULL AND pair_id IS NOT NULL)
      ),
      CONSTRAINT litter_events_not_itself CHECK (other_litter_id IS DISTINCT FROM litter_id),
      CONSTRAINT litter_events_loss_cause CHECK (kind <> 'lost' OR (cause IS NOT NULL AND length(trim(cause)) > 0))
    );
    CREATE INDEX litter_events_litter_idx ON litter_events (litter_id, occurred_on) WHERE deleted_at IS NULL;
    CREATE INDEX litter_events_review_idx ON litter_events (farm_id, review_state) WHERE deleted_at IS NULL;
    CREATE UNIQUE INDEX litter_events_pair_side_unique ON litter_events (pair_id, litter_id) WHERE pair_id IS NOT NULL;
  `);
  for (const table of ['litters', 'litter_events']) {
    await sql(`
      ALTER TABLE ${table} ENABLE ROW LEVEL SECURITY;
      ALTER TABLE ${table} FORCE ROW LEVEL SECURITY;
      CREATE POLICY ${table}_tenant ON ${table} USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());
      GRANT SELECT, INSERT, UPDATE ON ${table} TO ${appRole};
    `);
  }
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE services DROP CONSTRAINT IF EXISTS services_litter;
    DROP TABLE IF EXISTS litter_events, litters CASCADE;
  `);
};
