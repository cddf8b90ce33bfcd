import type { MigrationFn } from '../migrator';

/**
 * An animal's latest weigh-in is read in the order (weighed_on, created_at), newest first: with both keys
 * in the index the read stops at the first row instead of sorting every weigh-in of the animal (the herd
 * list does this for each animal of its page). It serves whatever the old (animal_id, weighed_on) index did.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE INDEX weigh_ins_animal_latest_idx ON weigh_ins (animal_id, weighed_on, created_at) WHERE deleted_at IS NULL;
    DROP INDEX weigh_ins_animal_idx;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE INDEX weigh_ins_animal_idx ON weigh_ins (animal_id, weighed_on) WHERE deleted_at IS NULL;
    DROP INDEX weigh_ins_animal_latest_idx;
  `);
};
