import type { Transaction } from 'sequelize';
import type { PerformanceTables } from '@burrowline/shared';
import { selectPrepared } from '../../db/prepared';

/**
 * A farm's computed performance tables kept in this process's memory, labelled with the co-op's
 * `performance_versions` counter they were read under. Every transaction that changes a record the tables
 * are worked out from bumps the counter as it commits (migration 0047's triggers), so a kept answer is
 * reused only while nothing it rests on has changed, through whichever instance. The counter is read
 * before the records: what is kept is never older than its label (at worst newer, and the next change
 * replaces it). The farm's today is part of the key, since a service turns missed with the calendar.
 */
interface Kept {
  version: string;
  tables: PerformanceTables;
}

const kept = new Map<string, Kept>();
/** Answers kept at most; the least recently used one is dropped beyond. */
const MAX_KEPT = 64;

export const COUNTER_SQL = 'SELECT version::text AS version FROM performance_versions WHERE coop_id = $1';

/** The co-op's counter, in the caller's transaction (0 before any change was counted). */
export async function performanceVersionOf(tx: Transaction, coopId: string): Promise<string> {
  const [row] = await selectPrepared<{ version: string }>(tx, COUNTER_SQL, [coopId]);
  return row?.version ?? '0';
}

/**
 * The tables for `key` as of `version`: the kept ones when they were read under it, else worked out by
 * `work` and kept. Requests that ask for the same while it is being worked out wait for that answer
 * instead of working it out again each (after a change, every open screen asks at once); should that
 * work fail, each works it out on its own.
 */
export function keptOrWorkedOut(key: string, version: string, work: () => Promise<PerformanceTables>): Promise<PerformanceTables> {
  const entry = kept.get(key);
  if (entry && entry.version === version) {
    kept.delete(key);
    kept.set(key, entry);
    return Promise.resolve(entry.tables);
  }
  const runKey = `${key}|${version}`;
  const running = working.get(runKey);
  if (running) return running.catch(() => work());
  const answer = work().then((tables) => {
    keep(key, version, tables);
    return tables;
  });
  working.set(runKey, answer);
  const done = () => working.delete(runKey);
  answer.then(done, done);
  return answer;
}

const working = new Map<string, Promise<PerformanceTables>>();

function keep(key: string, version: string, tables: PerformanceTables): void {
  // An answer worked out under an older counter than the one kept (a slower request) is not kept.
  const current = kept.get(key);
  if (current && BigInt(current.version) > BigInt(version)) return;
  kept.delete(key);
  kept.set(key, { version, tables });
  while (kept.size > MAX_KEPT) kept.delete(kept.keys().next().value!);
}
