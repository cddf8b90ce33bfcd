import type { Transaction } from 'sequelize';
import { database } from './sequelize';

export type ColumnType = 'uuid' | 'text' | 'date' | 'integer' | 'boolean' | 'jsonb' | 'float8';

const IDENTIFIER = /^[a-z_][a-z0-9_]*$/;
const ROWS_PER_STATEMENT = 20_000;

function snake(name: string): string {
  return name.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`);
}

/**
 * Inserts many rows in few statements (INSERT … SELECT FROM unnest, one array per column): for
 * thousands of rows far faster than a model instance per row. `columns` names the attributes to
 * write (camelCase, as the models name them) with their SQL types; the others take their defaults.
 * Runs in the caller's transaction, so row-level security and the tenant apply as for any write.
 */
export async function insertMany(
  tx: Transaction,
  table: string,
  columns: Record<string, ColumnType>,
  rows: readonly Record<string, unknown>[],
): Promise<void> {
  const names = Object.keys(columns);
  const sqlNames = names.map(snake);
  if (![table, ...sqlNames].every((name) => IDENTIFIER.test(name))) throw new Error(`insertMany: not an identifier in ${table}(${sqlNames.join(', ')})`);
  const arrays = names.map((name, i) => `$${i + 1}::${columns[name]}[]`).join(', ');
  const sql = `INSERT INTO ${table} (${sqlNames.join(', ')}) SELECT * FROM unnest(${arrays})`;
  for (let start = 0; start < rows.length; start += ROWS_PER_STATEMENT) {
    const slice = rows.slice(start, start + ROWS_PER_STATEMENT);
    const bind = names.map((name) =>
      slice.map((row) => {
        const value = row[name];
        if (value === undefined || value === null) return null;
        return columns[name] === 'jsonb' ? JSON.stringify(value) : value;
      }),
    );
    await database().query(sql, { bind, transaction: tx });
  }
}
