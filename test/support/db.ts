import pg from 'pg';

/** Direct connections for checking database state and the RLS wall from outside the app. */
export async function withClient<T>(url: string, work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

export const appDb = <T>(work: (client: pg.Client) => Promise<T>) => withClient(process.env.DATABASE_URL!, work);
export const ownerDb = <T>(work: (client: pg.Client) => Promise<T>) => withClient(process.env.DATABASE_OWNER_URL!, work);

/**
 * Works as the app role inside one co-op, the way the app's tenant helper does; rolls back unless
 * `commit` is set (for arranging state a test then exercises through the API).
 */
export async function asTenant<T>(coopId: string, work: (client: pg.Client) => Promise<T>, opts: { commit?: boolean } = {}): Promise<T> {
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
