import type { MigrationFn } from '../migrator';

/**
 * Litter weight at weaning: the total live weight of the kits weaned, optional, on a 'weaned'
 * litter event only. Grams; the sanity of the weight for the kits' age is checked by the service with
 * the shared growth plausibility rules, the table only refuses what no litter can weigh.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE litter_events ADD COLUMN weaning_weight_grams integer;
    ALTER TABLE litter_events ADD CONSTRAINT litter_events_weaning_weight CHECK (
      weaning_weight_grams IS NULL OR (kind = 'weaned' AND weaning_weight_grams BETWEEN 1 AND 600000)
    );
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE litter_events DROP CONSTRAINT IF EXISTS litter_events_weaning_weight;
    ALTER TABLE litter_events DROP COLUMN IF EXISTS weaning_weight_grams;
  `);
};
