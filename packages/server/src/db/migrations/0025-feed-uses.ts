import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Feed given: grams of one feed on a day (or over a period ending that day) to a grow-out group, a pen,
 * a doe with her litter, or the whole farm. Feed to a pen or the farm is split, when given, over the
 * groups and nursing litters there by the rule chosen (head-days or live weight); the split is kept in
 * feed_use_shares so later weigh-ins never move feed already given. Money is worked at read time, first
 * bought first used.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE feed_uses (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      given_on date NOT NULL,
      from_on date NOT NULL,
      grams integer NOT NULL CHECK (grams > 0),
      -- The feed drawn on (lower-cased product name); the purchase when one was named.
      feed_key text NOT NULL,
      purchase_id uuid,
      target text NOT NULL CHECK (target IN ('group', 'pen', 'doe', 'farm')),
      group_id uuid,
      housing_unit_id uuid,
      doe_id uuid,
      allocation text CHECK (allocation IN ('head_days', 'live_weight')),
      note text NOT NULL DEFAULT '',
      entered_by uuid NOT NULL REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT feed_uses_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT feed_uses_period CHECK (from_on <= given_on),
      CONSTRAINT feed_uses_purchase FOREIGN KEY (coop_id, purchase_id) REFERENCES feed_purchases (coop_id, id),
      CONSTRAINT feed_uses_group FOREIGN KEY (coop_id, group_id) REFERENCES grow_out_groups (coop_id, id),
      CONSTRAINT feed_uses_unit FOREIGN KEY (coop_id, housing_unit_id) REFERENCES housing_units (coop_id, id),
      CONSTRAINT feed_uses_doe FOREIGN KEY (coop_id, doe_id) REFERENCES animals (coop_id, id),
      CONSTRAINT feed_uses_target CHECK (
        (target = 'group' AND group_id IS NOT NULL)
        OR (target = 'pen' AND housing_unit_id IS NOT NULL AND allocation IS NOT NULL)
        OR (target = 'doe' AND doe_id IS NOT NULL)
        OR (target = 'farm' AND allocation IS NOT NULL)
      )
    );
    CREATE INDEX feed_uses_farm_idx ON feed_uses (farm_id, given_on) WHERE deleted_at IS NULL;

    CREATE TABLE feed_use_shares (
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      feed_use_id uuid NOT NULL,
      group_id uuid,
      litter_id uuid,
      grams integer NOT NULL CHECK (grams >= 0),
      CONSTRAINT feed_use_shares_use FOREIGN KEY (coop_id, feed_use_id) REFERENCES feed_uses (coop_id, id),
      CONSTRAINT feed_use_shares_group FOREIGN KEY (coop_id, group_id) REFERENCES grow_out_groups (coop_id, id),
      CONSTRAINT feed_use_shares_litter FOREIGN KEY (coop_id, litter_id) REFERENCES litters (coop_id, id),
      CONSTRAINT feed_use_shares_one CHECK ((group_id IS NULL) <> (litter_id IS NULL))
    );
    CREATE INDEX feed_use_shares_use_idx ON feed_use_shares (feed_use_id);
    CREATE INDEX feed_use_shares_group_idx ON feed_use_shares (group_id) WHERE group_id IS NOT NULL;
  `);
  await sql(['feed_uses', 'feed_use_shares'].map(tenantIsolation).join('\n'));
  await sql(`
    GRANT SELECT, INSERT, UPDATE ON feed_uses TO ${appRole};
    GRANT SELECT, INSERT ON feed_use_shares TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP TABLE IF EXISTS feed_use_shares;
    DROP TABLE IF EXISTS feed_uses;
  `);
};
