import type { Transaction } from 'sequelize';

const memos = new WeakMap<Transaction, Map<string, Promise<unknown>>>();

/**
 * Reads that many parts of one request need (the co-op's farms and their clocks, the breeds) run once per
 * transaction: later callers in the same transaction share the first answer. Each run of a transaction
 * is a new one, so nothing outlives it; a write to what was read forgets it (`forgetInTransaction`).
 */
export function onceInTransaction<T>(tx: Transaction, key: string, read: () => Promise<T>): Promise<T> {
  let memo = memos.get(tx);
  if (!memo) {
    memo = new Map();
    memos.set(tx, memo);
  }
  let answer = memo.get(key) as Promise<T> | undefined;
  if (!answer) {
    answer = read();
    memo.set(key, answer);
    // A failed read is not kept (the transaction is aborted anyway, but a caller may catch and go on).
    answer.catch(() => memo.delete(key));
  }
  return answer;
}

/** After a write in the transaction, the next read of `key` goes to the database again. */
export function forgetInTransaction(tx: Transaction, key: string): void {
  memos.get(tx)?.delete(key);
}
