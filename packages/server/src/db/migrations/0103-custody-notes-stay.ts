import type { MigrationFn } from '../migrator';

/**
 * A sale through the Swap Board hands over the animal's pedigree, weights and photos but not the
 * seller's private notes: the transfer says so, and the buyer's reading of former owners' notes skips it.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`ALTER TABLE animal_custody_events ADD COLUMN notes_travel boolean NOT NULL DEFAULT true`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`ALTER TABLE animal_custody_events DROP COLUMN notes_travel`);
};
