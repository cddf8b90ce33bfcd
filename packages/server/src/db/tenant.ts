import type { Transaction } from 'sequelize';
import { database } from './sequelize';

export interface TenantActor {
  coopId: string;
}

/**
 * The one way to read or write tenant data: opens a transaction, sets the co-op for row-level
 * security for this transaction only, and runs `work` with it. Pass `{ transaction: tx }` to every
 * query; publish realtime events with `tx.afterCommit` so nothing is announced that was rolled back,
 * and queue e-mails with `queueMail(tx, …)` so they are kept with the change.
 */
export async function withTenant<T>(actor: TenantActor, work: (tx: Transaction) => Promise<T>): Promise<T> {
  return database().transaction(async (tx) => {
    await database().query(`SELECT set_config('app.coop_id', $1, true)`, { bind: [actor.coopId], transaction: tx });
    return work(tx);
  });
}
