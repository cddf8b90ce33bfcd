import type { MigrationFn } from '../migrator';

/**
 * Why kits died, from a fixed list (chilled, trampled, not nursed…) beside the free words of a loss, so a
 * doe's record can count her losses by cause. Losses recorded before the list get the cause their words
 * name, else "other"; the list is the shared one (breeding/breeding-record.ts). A loss saved without a
 * listed cause (an import) is counted as "other".
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE litter_events ADD COLUMN death_cause text;
    -- Every co-op's rows: the owner is held to the tenant policy too (FORCE), so it steps out of it for the update only.
    ALTER TABLE litter_events NO FORCE ROW LEVEL SECURITY;
    UPDATE litter_events SET death_cause = CASE
      WHEN cause ILIKE '%chill%' OR cause ILIKE '%cold%' THEN 'chilled'
      WHEN cause ILIKE '%trampl%' OR cause ILIKE '%crush%' OR cause ILIKE '%smother%' THEN 'trampled'
      WHEN cause ILIKE '%weak%' THEN 'born_weak'
      WHEN cause ILIKE '%not nurs%' OR cause ILIKE '%starv%' OR cause ILIKE '%milk%' THEN 'not_nursed'
      WHEN cause ILIKE '%unknown%' THEN 'unknown'
      ELSE 'other' END
    WHERE kind = 'lost';
    ALTER TABLE litter_events FORCE ROW LEVEL SECURITY;
    ALTER TABLE litter_events ADD CONSTRAINT litter_events_death_cause CHECK (
      death_cause IS NULL
      OR (kind = 'lost' AND death_cause IN ('chilled', 'trampled', 'not_nursed', 'born_weak', 'illness', 'predator', 'unknown', 'other'))
    );
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE litter_events DROP CONSTRAINT IF EXISTS litter_events_death_cause;
    ALTER TABLE litter_events DROP COLUMN IF EXISTS death_cause;
  `);
};
