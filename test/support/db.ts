import pg from 'pg';
import { afterAll } from 'vitest';

// A test file opens thousands of these (the authorization matrix reads state before and after every call):
// pooled, each is a checkout instead of a new server process and a password exchange.
const pools = new Map<string, pg.Pool>();
afterAll(async () => {
  await Promise.all([...pools.values()].map((pool) => pool.end()));
  pools.clear();
});

function poolFor(url: string): pg.Pool {
  let pool = pools.get(url);
  if (!pool) {
    pool = new pg.Pool({ connectionString: url, max: 5, idleTimeoutMillis: 1000, allowExitOnIdle: true });
    pools.set(url, pool);
  }
  return pool;
}

/** Direct connections for checking database state and the RLS wall from outside the app. */
export async function withClient<T>(url: string, work: (client: pg.PoolClient) => Promise<T>): Promise<T> {
  const client = await poolFor(url).connect();
  try {
    const result = await work(client);
    client.release();
    return result;
  } catch (error) {
    // It may be left inside a transaction: it goes, rather than back to the next caller.
    client.release(true);
    throw error;
  }
}

export const appDb = <T>(work: (client: pg.PoolClient) => Promise<T>) => withClient(process.env.DATABASE_URL!, work);
export const ownerDb = <T>(work: (client: pg.PoolClient) => Promise<T>) => withClient(process.env.DATABASE_OWNER_URL!, work);

/**
 * Works as the app role inside one co-op, the way the app's tenant helper does; rolls back unless
 * `commit` is set (for arranging state a test then exercises through the API).
 */
export async function asTenant<T>(coopId: string, work: (client: pg.PoolClient) => Promise<T>, opts: { commit?: boolean } = {}): Promise<T> {
  return appDb(async (client) => {
    await client.query('BEGIN');
    try {
      await client.query(`SELECT set_config('app.coop_id', $1, true)`, [coopId]);
      const result = await work(client);
      await client.query(opts.commit ? 'COMMIT' : 'ROLLBACK');
      return result;
    } catch (error) {
      await client.query('ROLLBACK');
      throw error;
    }
  });
}
