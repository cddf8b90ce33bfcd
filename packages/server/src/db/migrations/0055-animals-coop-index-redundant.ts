import type { MigrationFn } from '../migrator';

/**
 * `animals (coop_id)` is a prefix of the unique `animals (coop_id, id)`, which serves every look-up by
 * co-op as well. Kept, it was a trap: the foreign keys naming an animal of the same co-op check
 * `coop_id = $1 AND id = $2`, and while the table's statistics still said "empty" (a large herd loaded in
 * one transaction) the check's plan walked every animal of the co-op through this index and filtered on
 * the id — one full walk per row loaded, so a 100,000-animal load never finished. With it gone the only
 * index for that check is the unique one, whatever the statistics say.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX IF EXISTS animals_coop_idx`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`CREATE INDEX IF NOT EXISTS animals_coop_idx ON animals (coop_id)`);
};
