import type { MigrationFn } from '../migrator';

/**
 * A grow-out group weighed kit by kit: the single weights (each with an optional label, an ear mark or a
 * tag, so one kit's gain can be followed across weigh-ins) are kept beside the total and head count the
 * gain is worked from. A JSON array of { "label": text | null, "grams": integer }.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE weigh_ins ADD COLUMN kit_weights jsonb;
    ALTER TABLE weigh_ins ADD CONSTRAINT weigh_ins_kit_weights_array CHECK (
      kit_weights IS NULL OR (jsonb_typeof(kit_weights) = 'array' AND jsonb_array_length(kit_weights) = head_count)
    );
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE weigh_ins DROP CONSTRAINT IF EXISTS weigh_ins_kit_weights_array;
    ALTER TABLE weigh_ins DROP COLUMN IF EXISTS kit_weights;
  `);
};
