import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * One counter per co-op, bumped in the same transaction as any change to the co-op's pedigree (an
 * animal added, a sire or dam corrected, a duplicate merged). Every server instance keeps the co-op's
 * pedigree in memory and compares this counter before using it, so a change made through another
 * instance is seen on the next request. `changed_ids` names the animals of the latest change (NULL when
 * it is not known, e.g. a merge), so an instance one version behind reads only those rows.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE pedigree_versions (
      coop_id uuid PRIMARY KEY REFERENCES cooperatives(id),
      version bigint NOT NULL DEFAULT 0,
      changed_ids uuid[],
      changed_at timestamptz NOT NULL DEFAULT now()
    );
    ${tenantIsolation('pedigree_versions')}
    GRANT SELECT, INSERT, UPDATE ON pedigree_versions TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS pedigree_versions`);
};
