// The yardstick: a bare node:http + pg endpoint that runs the very SELECT the API sent for the herd
// list (captured from the API, with its parameters, prepared when the API prepares it), in the same
// tenant transaction the API opens, and answers the rows as JSON. No session, no presenting: what the
// API costs on top is the difference.
import http from 'node:http';
import fs from 'node:fs';
import pg from 'pg';

const [portText, queryFile] = process.argv.slice(2);
const { sql, bind, coopId, name } = JSON.parse(fs.readFileSync(queryFile!, 'utf8')) as { sql: string; bind: unknown[]; coopId: string; name?: string };
const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: Number(process.env.DATABASE_POOL_MAX ?? 10) });

const server = http.createServer((req, res) => {
  void (async () => {
    const client = await pool.connect();
    try {
      await client.query('BEGIN');
      await client.query(`SELECT set_config('app.coop_id', $1, true)`, [coopId]);
      // Prepared under the same name when the API prepares it, so both pay the same parse and plan.
      const result = await client.query({ text: sql, values: bind, ...(name ? { name } : {}) });
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
