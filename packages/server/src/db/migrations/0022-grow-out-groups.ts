import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Grow-out groups: kits of one or more litters raised together after weaning toward a target
 * live weight. The group's make-up (which litters, how many heads each) is fixed at forming; later head
 * changes (losses, animals processed) come from the group's weigh-ins and processing records. Group
 * weigh-ins live in weigh_ins (group_id), which now refers here. Never hard-deleted: feed uses,
 * treatments and processing records refer to a group.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE grow_out_groups (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 60),
      formed_on date NOT NULL,
      -- The live weight per head the group is raised to (grams).
      target_grams integer NOT NULL CHECK (target_grams BETWEEN 500 AND 8000),
      -- A pen the group lives in, for feed given by pen.
      housing_unit_id uuid,
      status text NOT NULL DEFAULT 'growing' CHECK (status IN ('growing', 'closed')),
      closed_on date,
      notes text NOT NULL DEFAULT '',
      created_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT grow_out_groups_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT grow_out_groups_unit FOREIGN KEY (coop_id, housing_unit_id) REFERENCES housing_units (coop_id, id),
      CONSTRAINT grow_out_groups_closed CHECK ((status = 'closed') = (closed_on IS NOT NULL))
    );
    CREATE INDEX grow_out_groups_farm_idx ON grow_out_groups (farm_id, status, formed_on DESC) WHERE deleted_at IS NULL;

    CREATE TABLE grow_out_group_litters (
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      group_id uuid NOT NULL,
      litter_id uuid NOT NULL,
      heads integer NOT NULL CHECK (heads BETWEEN 1 AND 30),
      PRIMARY KEY (group_id, litter_id),
      CONSTRAINT grow_out_group_litters_group FOREIGN KEY (coop_id, group_id) REFERENCES grow_out_groups (coop_id, id),
      CONSTRAINT grow_out_group_litters_litter FOREIGN KEY (coop_id, litter_id) REFERENCES litters (coop_id, id)
    );
    CREATE INDEX grow_out_group_litters_litter_idx ON grow_out_group_litters (litter_id);

    ALTER TABLE weigh_ins ADD CONSTRAINT weigh_ins_coop_id_unique UNIQUE (coop_id, id);
    ALTER TABLE weigh_ins ADD CONSTRAINT weigh_ins_group FOREIGN KEY (coop_id, group_id) REFERENCES grow_out_groups (coop_id, id);
    CREATE INDEX weigh_ins_group_idx ON weigh_ins (group_id, weighed_on) WHERE deleted_at IS NULL AND group_id IS NOT NULL;
  `);
  await sql(['grow_out_groups', 'grow_out_group_litters'].map(tenantIsolation).join('\n'));
  await sql(`
    GRANT SELECT, INSERT, UPDATE ON grow_out_groups TO ${appRole};
    GRANT SELECT, INSERT ON grow_out_group_litters TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE weigh_ins DROP CONSTRAINT IF EXISTS weigh_ins_group;
    ALTER TABLE weigh_ins DROP CONSTRAINT IF EXISTS weigh_ins_coop_id_unique;
    DROP INDEX IF EXISTS weigh_ins_group_idx;
    DROP TABLE IF EXISTS grow_out_group_litters;
    DROP TABLE IF EXISTS grow_out_groups;
  `);
};
