import type { MigrationFn } from '../migrator';

/**
 * One notion of where an animal lives: the free-text hutch an animal carried becomes a hutch of its
 * keeping farm (one per name, matched without case) and a current placement in it, unless the animal was
 * already placed somewhere; from now on the animal's hutch field mirrors its current placement. The
 * owner moves rows of every co-op here, so row security is lifted for this transaction only.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE animals NO FORCE ROW LEVEL SECURITY;
    ALTER TABLE housing_units NO FORCE ROW LEVEL SECURITY;
    ALTER TABLE housing_placements NO FORCE ROW LEVEL SECURITY;

    INSERT INTO housing_units (coop_id, farm_id, name, kind, notes)
    SELECT DISTINCT ON (a.keeping_farm_id, lower(left(btrim(a.hutch), 40)))
           a.coop_id, a.keeping_farm_id, left(btrim(a.hutch), 40), 'hutch', ''
      FROM animals a
     WHERE btrim(a.hutch) <> '' AND a.keeping_farm_id IS NOT NULL AND NOT a.is_outside AND a.deleted_at IS NULL
       AND a.disposition = 'on_farm'
       AND NOT EXISTS (
         SELECT 1 FROM housing_units u
          WHERE u.farm_id = a.keeping_farm_id AND lower(u.name) = lower(left(btrim(a.hutch), 40)) AND u.deleted_at IS NULL)
     ORDER BY a.keeping_farm_id, lower(left(btrim(a.hutch), 40)), a.created_at;

    INSERT INTO housing_placements (coop_id, farm_id, unit_id, animal_id, placed_on, note)
    SELECT a.coop_id, a.keeping_farm_id, u.id, a.id, LEAST(a.created_at::date, current_date), 'From the hutch written on its record'
      FROM animals a
      JOIN housing_units u ON u.farm_id = a.keeping_farm_id AND lower(u.name) = lower(left(btrim(a.hutch), 40)) AND u.deleted_at IS NULL
     WHERE btrim(a.hutch) <> '' AND NOT a.is_outside AND a.deleted_at IS NULL AND a.disposition = 'on_farm'
       AND NOT EXISTS (SELECT 1 FROM housing_placements p WHERE p.animal_id = a.id AND p.ended_on IS NULL);

    UPDATE animals a SET hutch = u.name
      FROM housing_placements p JOIN housing_units u ON u.id = p.unit_id
     WHERE p.animal_id = a.id AND p.ended_on IS NULL AND a.hutch IS DISTINCT FROM u.name;

    ALTER TABLE animals FORCE ROW LEVEL SECURITY;
    ALTER TABLE housing_units FORCE ROW LEVEL SECURITY;
    ALTER TABLE housing_placements FORCE ROW LEVEL SECURITY;
  `);
};

/** The hutches and placements stay: they are the farm's records now, and the hutch field still reads as before. */
export const down: MigrationFn = async () => {};
