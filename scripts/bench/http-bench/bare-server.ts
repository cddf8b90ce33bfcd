// The yardstick: a bare node:http + pg endpoint that runs the very SELECT the API sent for the herd
// list (captured from the API: prepared once per connection as the API prepares it, then the same
// EXECUTE with the same values), in a tenant transaction as the API's, and answers the rows as JSON. No
// session, no presenting: what the API costs on top is the difference.
import http from 'node:http';
import fs from 'node:fs';
import pg from 'pg';

const [portText, queryFile] = process.argv.slice(2);
const { prepare, execute, coopId } = JSON.parse(fs.readFileSync(queryFile!, 'utf8')) as { prepare: string; execute: string; coopId: string };
const preparedOn = new WeakSet<pg.PoolClient>();
const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: Number(process.env.DATABASE_POOL_MAX ?? 10) });

const server = http.createServer((req, res) => {
  void (async () => {
    const client = await pool.connect();
    try {
      if (!preparedOn.has(client)) {
        await client.query(prepare);
        preparedOn.add(client);
      }
      await client.query('BEGIN');
      await client.query(`SELECT set_config('app.coop_id', $1, true), set_config('plan_cache_mode', 'force_generic_plan', true)`, [coopId]);
      const result = await client.query(execute);
      await client.query('COMMIT');
      res.writeHead(200, { 'content-type': 'application/json' });
      res.end(JSON.stringify({ items: result.rows }));
    } catch (error) {
      await client.query('ROLLBACK').catch(() => undefined);
      res.writeHead(500);
      res.end(String(error));
    } finally {
      client.release();
    }
  })();
});
server.listen(Number(portText), '127.0.0.1', () => console.log(`ready ${(server.address() as { port: number }).port}`));
process.on('SIGTERM', () => process.exit(0));
// The benchmark holds our stdin open: when it goes (even killed), so do we.
process.stdin.on('end', () => process.exit(0));
process.stdin.resume();
