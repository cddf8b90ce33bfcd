import type { MigrationFn } from '../migrator';

/**
 * The herd list pages in SQL: one index per sort it offers on `animals`, led by the owning farm and the
 * disposition (the list shows the animals on the farm by default), then the sort key, the tattoo and the id
 * as tie-breaks, so a page is read in order and stops at its last row; with the co-op included (row-level
 * security checks it) the page's ids come from the index alone. Animals lent to a farm are few and have an
 * index of their own, on an expression only it serves (the planner then counts them from its statistics
 * instead of guessing at "owning farm <> keeping farm"). Tattoos, names and hutches sort as people read them (HR-2 before HR-10; case and accents aside, as the screens compare them).
 */
const herdKeys: Record<string, string> = {
  tattoo: '',
  name: 'name COLLATE natural_order,',
  sex: 'sex,',
  birth_date: 'birth_date,',
  lifecycle: `(CASE lifecycle WHEN 'kit' THEN 0 WHEN 'junior' THEN 1 WHEN 'breeding' THEN 2 ELSE 3 END),`,
  hutch: 'hutch COLLATE natural_order,',
};

export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`CREATE COLLATION IF NOT EXISTS natural_order (provider = icu, locale = 'en-u-kn-true-ks-level1', deterministic = false)`);
  for (const [name, key] of Object.entries(herdKeys)) {
    await sql(`
      CREATE INDEX animals_herd_by_${name}_idx ON animals (owning_farm_id, disposition, ${key} tattoo COLLATE natural_order, id)
      INCLUDE (coop_id) WHERE deleted_at IS NULL AND NOT is_outside`);
  }
  await sql(`
    CREATE INDEX animals_lent_in_idx ON animals ((CASE WHEN owning_farm_id <> keeping_farm_id THEN keeping_farm_id END))
    WHERE deleted_at IS NULL AND NOT is_outside`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP INDEX IF EXISTS animals_lent_in_idx`);
  for (const name of Object.keys(herdKeys)) await sql(`DROP INDEX IF EXISTS animals_herd_by_${name}_idx`);
  await sql(`DROP COLLATION IF EXISTS natural_order`);
};
