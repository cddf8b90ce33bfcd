import type { Transaction } from 'sequelize';
import { knowDirectoryVersion } from './coop-directory';
import { isLostConnection, isSerializationFailure, isUniqueViolation } from './database-errors';
import { database } from './sequelize';
import { tenantTransactionOptions } from './tenant-opening';

export interface TenantActor {
  coopId: string;
  /** The co-op's directory version as the request read it with its session, when it did. */
  directoryVersion?: string;
}

/** Runs of one transaction at most: a clash with a concurrent commit settles on the second run. */
export const MAX_TRANSACTION_RUNS = 3;

/**
 * Whether a failed transaction is worth running again from the start. Nothing of it was kept: the
 * transaction rolled back, and `afterCommit` hooks (events, file clean-up) never ran.
 * - a serialization failure or deadlock: PostgreSQL asks for exactly that;
 * - a unique clash: a concurrent request committed the same key first, and the second run sees its row, so the
 *   service answers as it would have one moment later (the original for a repeated client id, its own 409 else);
 * - a lost connection while the work ran: nothing was committed. Not once the work is done, since the commit's
 *   fate is unknown then; that answers 503 and the client retries with its id.
 */
function worthRunningAgain(error: unknown, workFinished: boolean): boolean {
  if (isSerializationFailure(error) || isUniqueViolation(error)) return true;
  return !workFinished && isLostConnection(error);
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * The one way to read or write tenant data: opens a transaction, sets the co-op for row-level
 * security for this transaction only, and runs `work` with it. Pass `{ transaction: tx }` to every
 * query; publish realtime events with `tx.afterCommit` so nothing is announced that was rolled back,
 * and queue e-mails with `queueMail(tx, …)` so they are kept with the change. `work` may run more than
 * once (see worthRunningAgain), so it keeps every effect outside the database in `tx.afterCommit`.
 */
export async function withTenant<T>(actor: TenantActor, work: (tx: Transaction) => Promise<T>): Promise<T> {
  for (let run = 1; ; run++) {
    let workFinished = false;
    try {
      // The transaction opens with its first statement, the co-op set for it alone (see tenant-opening.ts).
      return await database().transaction(tenantTransactionOptions(actor.coopId), async (tx) => {
        if (actor.directoryVersion) knowDirectoryVersion(tx, actor.coopId, actor.directoryVersion);
        const result = await work(tx);
        workFinished = true;
        return result;
      });
    } catch (error) {
      if (run >= MAX_TRANSACTION_RUNS || !worthRunningAgain(error, workFinished)) throw error;
      // A short, jittered pause so that racing requests do not collide again in step.
      await pause(10 * run + Math.random() * 20);
    }
  }
}
