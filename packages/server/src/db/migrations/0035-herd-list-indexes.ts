import type { MigrationFn } from '../migrator';

/**
 * The herd list pages in SQL: one index per sort it offers on `animals`, led by the owning farm and the
 * disposition (the list shows the animals on the farm by default), then the sort key, the tattoo and the id
 * as tie-breaks, so a page is read in order and stops at its last row. Tattoos, names and hutches sort as
 * people read them (HR-2 before HR-10, case aside) with an ICU collation.
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
  await sql(`CREATE COLLATION IF NOT EXISTS natural_order (provider = icu, locale = 'en-u-kn-true')`);
  for (const [name, key] of Object.entries(herdKeys)) {
    await sql(`
      CREATE INDEX animals_herd_by_${name}_idx ON animals (owning_farm_id, disposition, ${key} tattoo COLLATE natural_order, id)
      WHERE deleted_at IS NULL AND NOT is_outside`);
  }
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  for (const name of Object.keys(herdKeys)) await sql(`DROP INDEX IF EXISTS animals_herd_by_${name}_idx`);
  await sql(`DROP COLLATION IF EXISTS natural_order`);
};
