import type { Transaction } from 'sequelize';
import { selectPrepared } from './prepared';
import { forgetInTransaction, onceInTransaction } from './transaction-memo';

/*
 * The co-op's breeds and farms: nearly every request presents with one or both (a farm's name, its clock
 * and units, an animal's breed), so both come in one statement, once per transaction.
 */

export interface DirectoryBreedRow {
  id: string; coopId: string | null; name: string;
  seniorBuckMinGrams: number | null; seniorBuckMaxGrams: number | null; seniorDoeMinGrams: number | null; seniorDoeMaxGrams: number | null;
  idealWeightGrams: number | null; showClassCount: number; bodyType: string; sizeClass: string;
  doeFirstBreedingMinDays: number; doeFirstBreedingMaxDays: number; buckFirstBreedingMinDays: number; buckFirstBreedingMaxDays: number;
  slowGrowing: boolean; heavyBoned: boolean; meatNotes: string; sources: unknown;
}
export interface DirectoryFarmRow { id: string; name: string; timeZone: string; weightUnit: string }

const directorySql = `SELECT
  (SELECT coalesce(json_agg(b), '[]') FROM (
    SELECT id, coop_id AS "coopId", name, senior_buck_min_grams AS "seniorBuckMinGrams",
      senior_buck_max_grams AS "seniorBuckMaxGrams", senior_doe_min_grams AS "seniorDoeMinGrams", senior_doe_max_grams AS "seniorDoeMaxGrams",
      ideal_weight_grams AS "idealWeightGrams", show_class_count AS "showClassCount", body_type AS "bodyType", size_class AS "sizeClass",
      doe_first_breeding_min_days AS "doeFirstBreedingMinDays", doe_first_breeding_max_days AS "doeFirstBreedingMaxDays",
      buck_first_breeding_min_days AS "buckFirstBreedingMinDays", buck_first_breeding_max_days AS "buckFirstBreedingMaxDays",
      slow_growing AS "slowGrowing", heavy_boned AS "heavyBoned", meat_notes AS "meatNotes", sources
    FROM breeds WHERE (coop_id IS NULL OR coop_id = $1) AND deleted_at IS NULL) b) AS breeds,
  (SELECT coalesce(json_agg(f), '[]') FROM (
    SELECT id, name, time_zone AS "timeZone", weight_unit AS "weightUnit" FROM farms WHERE coop_id = $1 AND deleted_at IS NULL) f) AS farms`;

const directoryKey = (coopId: string) => `coop-directory:${coopId}`;

export function coopDirectoryOf(tx: Transaction, coopId: string): Promise<{ breeds: DirectoryBreedRow[]; farms: DirectoryFarmRow[] }> {
  return onceInTransaction(tx, directoryKey(coopId), async () => (await selectPrepared<{ breeds: DirectoryBreedRow[]; farms: DirectoryFarmRow[] }>(tx, directorySql, [coopId]))[0]!);
}

/** After a write to the co-op's breeds or farms in the transaction: the next read goes to the database. */
export function forgetCoopDirectory(tx: Transaction, coopId: string): void {
  forgetInTransaction(tx, directoryKey(coopId));
}
