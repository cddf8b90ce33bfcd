import type { Transaction } from 'sequelize';
import { selectPrepared } from './prepared';
import { forgetInTransaction, onceInTransaction } from './transaction-memo';

/*
 * The co-op's breeds and farms: nearly every request presents with one or both (a farm's name, its clock
 * and units, an animal's breed). Each instance keeps them in memory per co-op, labelled with the co-op's
 * directory version (bumped by triggers with every change to them, migration 0057); a request reads that
 * version with its session, so what is kept serves it only while current, whichever instance made the
 * change. Otherwise (a stale version, or work without a session) both come in one statement, once per
 * transaction.
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

export interface CoopDirectory {
  breeds: DirectoryBreedRow[];
  farms: DirectoryFarmRow[];
}

const directoryKey = (coopId: string) => `coop-directory:${coopId}`;

/** Co-ops kept at most; the least recently used is dropped beyond (it is read again when asked). */
const MAX_COOPS = 64;
const kept = new Map<string, { version: bigint; directory: CoopDirectory }>();
/** The directory version each transaction's request read (before the transaction began). */
const versionOfTransaction = new WeakMap<Transaction, { coopId: string; version: bigint }>();
/** Transactions that changed a directory: they read their own change, and keep nothing (it may roll back). */
const changedIn = new WeakSet<Transaction>();

/** The request's directory version, for the transaction that serves it (withTenant). */
export function knowDirectoryVersion(tx: Transaction, coopId: string, version: string): void {
  if (/^\d+$/.test(version)) versionOfTransaction.set(tx, { coopId, version: BigInt(version) });
}

function keep(coopId: string, version: bigint, directory: CoopDirectory): void {
  const have = kept.get(coopId);
  if (have && have.version > version) return;
  kept.delete(coopId);
  kept.set(coopId, { version, directory });
  while (kept.size > MAX_COOPS) kept.delete(kept.keys().next().value!);
}

/**
 * The co-op's breeds and farms as the request knows them. Shared with other requests while current: callers
 * never change what they are given.
 */
export function coopDirectoryOf(tx: Transaction, coopId: string): Promise<CoopDirectory> {
  return onceInTransaction(tx, directoryKey(coopId), async () => {
    const known = versionOfTransaction.get(tx);
    const version = known?.coopId === coopId && !changedIn.has(tx) ? known.version : undefined;
    const have = kept.get(coopId);
    if (version !== undefined && have?.version === version) {
      keep(coopId, version, have.directory);
      return have.directory;
    }
    const directory = (await selectPrepared<CoopDirectory>(tx, directorySql, [coopId]))[0]!;
    // Read after the version, so never older than its label.
    if (version !== undefined) keep(coopId, version, directory);
    return directory;
  });
}

/** After a write to the co-op's breeds or farms in the transaction: the next read goes to the database. */
export function forgetCoopDirectory(tx: Transaction, coopId: string): void {
  forgetInTransaction(tx, directoryKey(coopId));
  changedIn.add(tx);
  kept.delete(coopId);
}
