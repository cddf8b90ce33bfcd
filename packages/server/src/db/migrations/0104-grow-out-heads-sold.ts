import type { MigrationFn } from '../migrator';

/**
 * Heads that left a grow-out group alive (sold through the Swap Board), by day: they count against the
 * group's heads like processed ones. Kept on the group's row, so reading a group costs no statement more.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE grow_out_groups ADD COLUMN heads_sold jsonb NOT NULL DEFAULT '[]'
      CONSTRAINT grow_out_groups_heads_sold_list CHECK (jsonb_typeof(heads_sold) = 'array')
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql('ALTER TABLE grow_out_groups DROP COLUMN heads_sold');
};
