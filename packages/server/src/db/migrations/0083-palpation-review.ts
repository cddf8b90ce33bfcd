import type { MigrationFn } from '../migrator';

/**
 * A palpation an apprentice logs as a chore waits for her mentor, like her weigh-ins: pending, then
 * accepted or returned. Only an accepted one is a fact the Almanac plans from; existing palpations were
 * recorded by the farm's members and stand as accepted. "Unsure" is what a learner honestly feels at
 * first; it closes nothing. A palpation is still never deleted: the review only updates its state.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    ALTER TABLE palpations DROP CONSTRAINT palpations_result_check;
    ALTER TABLE palpations ADD CONSTRAINT palpations_result_check CHECK (result IN ('positive', 'negative', 'unsure'));
    ALTER TABLE palpations
      ADD COLUMN review_state text NOT NULL DEFAULT 'accepted' CHECK (review_state IN ('pending', 'accepted', 'returned')),
      ADD COLUMN reviewed_by uuid REFERENCES users(id),
      ADD COLUMN reviewed_at timestamptz,
      ADD COLUMN review_comment text CHECK (length(review_comment) <= 500),
      ADD COLUMN version integer NOT NULL DEFAULT 0;
    CREATE INDEX palpations_pending_idx ON palpations (recorded_by) WHERE review_state = 'pending';
    GRANT UPDATE (review_state, reviewed_by, reviewed_at, review_comment, version) ON palpations TO ${appRole};

    ALTER TABLE chore_entries ADD COLUMN palpation_id uuid REFERENCES palpations(id);
  `);
};

export const down: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    ALTER TABLE chore_entries DROP COLUMN palpation_id;
    REVOKE UPDATE ON palpations FROM ${appRole};
    DELETE FROM palpations WHERE review_state <> 'accepted' OR result = 'unsure';
    DROP INDEX IF EXISTS palpations_pending_idx;
    ALTER TABLE palpations DROP COLUMN version, DROP COLUMN review_comment, DROP COLUMN reviewed_at, DROP COLUMN reviewed_by, DROP COLUMN review_state;
    ALTER TABLE palpations DROP CONSTRAINT palpations_result_check;
    ALTER TABLE palpations ADD CONSTRAINT palpations_result_check CHECK (result IN ('positive', 'negative'));
  `);
};
