import type { Transaction } from 'sequelize';
import { database } from './sequelize';

/**
 * Serializes writers of one thing (a farm's feed book, a co-op's pedigree…) for the rest of the
 * transaction: a PostgreSQL advisory lock on the key, released at commit or rollback. For checks that
 * read several rows and then write ("kits left", "stock left") where a row lock has no single row.
 */
export async function lockUntilCommit(tx: Transaction, key: string): Promise<void> {
  await database().query('SELECT pg_advisory_xact_lock(hashtextextended($1, 0))', { bind: [key], transaction: tx });
}
