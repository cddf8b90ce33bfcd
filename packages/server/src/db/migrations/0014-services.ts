import type { MigrationFn } from '../migrator';

/**
 * Services (a doe bred to a buck on a date), their palpations, and the treatments checked before a
 * service is saved. A service stays open until it is kindled, palpated empty or closed as
 * missed; the partial unique index makes "one open service per doe" a database fact, so two members
 * saving at once cannot give her two. Services are referred to by litters and tasks: never deleted.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE services (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      -- The farm keeping the doe when she was bred: its Almanac plans from this service.
      farm_id uuid NOT NULL REFERENCES farms(id),
      doe_id uuid NOT NULL,
      buck_id uuid NOT NULL,
      serviced_on date NOT NULL,
      notes text NOT NULL DEFAULT '',
      status text NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'kindled', 'empty', 'missed')),
      closed_on date,
      close_reason text,
      -- The litter it gave (set by the kindling; litters refer back with service_id).
      litter_id uuid,
      -- The warnings shown and confirmed when it was saved (a young doe, a doe under treatment).
      warnings jsonb NOT NULL DEFAULT '[]',
      recorded_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT services_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT services_doe FOREIGN KEY (coop_id, doe_id) REFERENCES animals (coop_id, id),
      CONSTRAINT services_buck FOREIGN KEY (coop_id, buck_id) REFERENCES animals (coop_id, id),
      CONSTRAINT services_two_animals CHECK (doe_id <> buck_id),
      CONSTRAINT services_closed_when CHECK ((status = 'open') = (closed_on IS NULL)),
      CONSTRAINT services_closed_after CHECK (closed_on IS NULL OR closed_on >= serviced_on),
      CONSTRAINT services_kindled_litter CHECK ((status = 'kindled') = (litter_id IS NOT NULL))
    );
    CREATE UNIQUE INDEX services_one_open_per_doe ON services (doe_id) WHERE status = 'open' AND deleted_at IS NULL;
    CREATE INDEX services_farm_idx ON services (farm_id, serviced_on DESC) WHERE deleted_at IS NULL;
    CREATE INDEX services_doe_idx ON services (doe_id, serviced_on DESC) WHERE deleted_at IS NULL;

    CREATE TABLE palpations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      service_id uuid NOT NULL,
      palpated_on date NOT NULL,
      result text NOT NULL CHECK (result IN ('positive', 'negative')),
      notes text NOT NULL DEFAULT '',
      recorded_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT palpations_service FOREIGN KEY (coop_id, service_id) REFERENCES services (coop_id, id)
    );
    CREATE INDEX palpations_service_idx ON palpations (service_id, palpated_on);

    -- Extralabel treatment under a veterinarian, who sets the withdrawal time (no drugs are approved for
    -- rabbits in the US). A doe under treatment is flagged before she is bred.
    CREATE TABLE treatments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      animal_id uuid NOT NULL,
      started_on date NOT NULL,
      ends_on date NOT NULL,
      treatment text NOT NULL CHECK (length(treatment) BETWEEN 1 AND 200),
      veterinarian text NOT NULL DEFAULT '',
      notes text NOT NULL DEFAULT '',
      recorded_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT treatments_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id),
      CONSTRAINT treatments_order CHECK (ends_on >= started_on)
    );
    CREATE INDEX treatments_animal_idx ON treatments (animal_id, ends_on) WHERE deleted_at IS NULL;
  `);
  for (const table of ['services', 'palpations', 'treatments']) {
    await sql(`
      ALTER TABLE ${table} ENABLE ROW LEVEL SECURITY;
      ALTER TABLE ${table} FORCE ROW LEVEL SECURITY;
      CREATE POLICY ${table}_tenant ON ${table} USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());
    `);
  }
  // Never hard-deleted: no DELETE grant.
  await sql(`
    GRANT SELECT, INSERT, UPDATE ON services, treatments TO ${appRole};
    GRANT SELECT, INSERT ON palpations TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS treatments, palpations, services CASCADE`);
};
