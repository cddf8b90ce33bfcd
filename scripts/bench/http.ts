// HTTP benchmark at co-op scale: a co-op of 50 farms and 50,000 animals (`--200k`: 200,000) built on
// demand into a cluster of its own under .data (kept, so reruns reuse it), the real API and a bare
// node:http + pg endpoint running the API's own herd-list SELECT, loaded with autocannon round by
// round, alternating the two. Prints p50, p99, req/s, the API/bare ratio, the CPU a request costs the
// server and the database (which a busy machine changes far less than latency), the load average, the SQL
// statements a request sends (pg_stat_statements), the other heavy reads at 10 connections and the
// plans of the heavy queries. Prints figures; never a timed test.
// Run: `npm run bench http` (or `npm run bench http -- --200k`, `-- --5k`). BENCH_PG_PORT (default 54380; 5k 54381, 200k 54382),
// BENCH_API_PORT / BENCH_BARE_PORT (default 0: any free port), BENCH_HTTP_SECONDS (8 a round), BENCH_HTTP_ROUNDS (3).
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createRequire } from 'node:module';
import { CSRF_HEADER } from '@burrowline/shared';
import { root, runTs, startCluster } from '../lib/bootstrap.mjs';
import type { BuiltCoop } from './http-bench/build-coop';

interface AutocannonResult {
  latency: { p50: number; p99: number };
  requests: { average: number; total: number };
  duration: number;
  non2xx: number;
  errors: number;
  timeouts: number;
}
type Autocannon = (opts: Record<string, unknown>) => Promise<AutocannonResult>;
const autocannon = createRequire(import.meta.url)('autocannon') as Autocannon;

// `--200k` and `--5k` build (once) and load co-ops of those sizes, to show the herd list's cost follows the page, not the co-op.
const ANIMALS = process.argv.includes('--200k') ? 200_000 : process.argv.includes('--5k') ? 5_000 : Number(process.env.BENCH_HTTP_ANIMALS ?? 50_000);
// Each size in a cluster of its own, on a port of its own, so they can run side by side.
const PG_PORT = Number(process.env.BENCH_PG_PORT ?? ({ 5000: 54381, 200000: 54382 } as Record<number, number>)[ANIMALS] ?? 54380);
const API_PORT = Number(process.env.BENCH_API_PORT ?? 0);
const BARE_PORT = Number(process.env.BENCH_BARE_PORT ?? 0);
const SECONDS = Number(process.env.BENCH_HTTP_SECONDS ?? 8);
const ROUNDS = Number(process.env.BENCH_HTTP_ROUNDS ?? 3);
const name = `bench-http-${ANIMALS / 1000}k`;
const dataFile = path.join(root, '.data', `${name}.json`);
const queryFile = path.join(root, '.data', `${name}-herd-query.json`);
const sockDir = path.join(root, '.data', `${name}-socket`);

/** psql as the cluster's superuser over its socket (pg_stat_statements and settings need it). */
function psql(sql: string): string {
  const result = spawnSync('psql', ['-h', sockDir, '-p', String(PG_PORT), '-U', 'postgres', '-d', 'burrowline', '-v', 'ON_ERROR_STOP=1', '-qAt', '-c', sql], { encoding: 'utf8' });
  if (result.status !== 0) throw new Error(`psql: ${result.stderr}`);
  return result.stdout.trim();
}

let cluster = await startCluster({ name, port: PG_PORT, fast: true });
if (psql('SHOW shared_preload_libraries') !== 'pg_stat_statements') {
  psql(`ALTER SYSTEM SET shared_preload_libraries = 'pg_stat_statements'`);
  await cluster.stop();
  cluster = await startCluster({ name, port: PG_PORT, fast: true });
}
psql('CREATE EXTENSION IF NOT EXISTS pg_stat_statements');
const env = { DATABASE_URL: cluster.appUrl, DATABASE_OWNER_URL: cluster.ownerUrl, SESSION_SECRET: 'bench-secret-bench-secret-bench-secret-0', LOG_LEVEL: 'warn', NODE_ENV: 'development' };
Object.assign(process.env, env);
runTs('packages/server/src/db/migrate-cli.ts', ['up'], env);

const { connectDatabase, closeDatabase, database } = await import('../../packages/server/src/composition/database');
connectDatabase(cluster.appUrl);

async function coopExists(built: BuiltCoop): Promise<boolean> {
  const rows = await database().query(`SELECT 1 FROM public_coop_by_slug($1)`, { bind: [built.slug], type: 'SELECT' as never }).catch(() => []);
  return (rows as unknown[]).length > 0;
}
let coop: BuiltCoop | null = fs.existsSync(dataFile) ? (JSON.parse(fs.readFileSync(dataFile, 'utf8')) as BuiltCoop) : null;
if (!coop || !(await coopExists(coop))) {
  console.log(`building the co-op (${ANIMALS.toLocaleString('en-US')} animals) into .data/${name}…`);
  const { buildCoop } = await import('./http-bench/build-coop');
  coop = await buildCoop({ animals: ANIMALS, slug: `bench-http-${ANIMALS / 1000}k`, password: `bench-${Date.now()}` });
  // As the superuser: the app role owns no table, so its ANALYZE would skip them all and the first rounds
  // would run on plans made without statistics (until autovacuum caught up). VACUUM also fills the
  // visibility map the index-only scans rely on.
  const vacuumed = Date.now();
  psql('VACUUM (ANALYZE)');
  console.log(`  vacuumed and analyzed in ${Math.round((Date.now() - vacuumed) / 1000)} s`);
  fs.writeFileSync(dataFile, JSON.stringify(coop, null, 2));
  console.log(`  built in ${coop.builtInSeconds} s`);
} else {
  console.log(`reusing the co-op in .data/${name} (built in ${coop.builtInSeconds} s)`);
}
console.log(`co-op: ${Object.entries(coop.counts).map(([k, v]) => `${k} ${v.toLocaleString('en-US')}`).join(', ')}`);

interface CapturedRead { prepare: string; execute: string }

/**
 * The SELECT a one-statement read sends, captured from an in-process app: each is its transaction's first
 * statement, so it travels with the opening as SQL `PREPARE` (once per connection) and `EXECUTE` with its
 * values written in. Taken where every statement goes out, on pg's client, from the second request of each
 * route (the first also reads the co-op's breeds and farms, which are then kept). The bare endpoint prepares
 * the herd list's once per connection too and sends the same EXECUTE; every one is explained below.
 */
async function captureReads(routes: string[]): Promise<Map<string, CapturedRead>> {
  const http = await import('node:http');
  const { createApp } = await import('../../packages/server/src/app');
  const server = http.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const url = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
  const handle = createApp({ appUrl: url });
  server.on('request', handle.app);
  const cookie = await signIn(url);
  const named = new Map<string, string>();
  let firstExecute: { name: string; text: string } | null = null;
  const pg = (await import('pg')).default;
  const send = pg.Client.prototype.query;
  pg.Client.prototype.query = function capture(this: unknown, ...args: unknown[]) {
    const [first] = args as [string | { text?: string; name?: string }];
    if (typeof first === 'object' && first?.name && first.text) named.set(first.name, first.text);
    if (typeof first === 'string') {
      const inline = /PREPARE "(p_[^"]+)" AS ([\s\S]*?)\n; EXECUTE "\1"/.exec(first);
      if (inline) named.set(inline[1]!, inline[2]!);
      const executed = /^\s*START TRANSACTION;[\s\S]*?(EXECUTE "(p_[^"]+)"(?:\((?:'(?:[^']|'')*'|[^'()])*\))?)/.exec(first);
      if (executed && !firstExecute) firstExecute = { name: executed[2]!, text: executed[1]! };
    }
    return (send as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof send;
  const captured = new Map<string, CapturedRead>();
  try {
    for (const route of routes) {
      await (await fetch(`${url}${route}`, { headers: { cookie } })).arrayBuffer();
      firstExecute = null;
      const res = await fetch(`${url}${route}`, { headers: { cookie } });
      await res.arrayBuffer();
      const sent = firstExecute as { name: string; text: string } | null;
      const sql = sent ? named.get(sent.name) : undefined;
      if (res.ok && sent && sql) captured.set(route, { prepare: `PREPARE "${sent.name}" AS ${sql}`, execute: sent.text });
    }
  } finally {
    pg.Client.prototype.query = send;
    server.closeAllConnections();
    await new Promise<void>((resolve) => server.close(() => resolve()));
  }
  return captured;
}

async function signIn(url: string): Promise<string> {
  const res = await fetch(`${url}/api/session`, {
    method: 'POST', headers: { 'content-type': 'application/json', [CSRF_HEADER]: '1' }, body: JSON.stringify({ email: coop!.email, password: coop!.password }),
  });
  if (!res.ok) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`);
  return res.headers.getSetCookie().map((x) => x.split(';')[0]).join('; ');
}

/** Starts a server script; resolves with the process and the port it listens on (0 = any free port). */
function startChild(script: string, args: string[]): Promise<{ child: ChildProcess; port: number }> {
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(import.meta.dirname, 'http-bench', script), ...args], {
    cwd: root, env: { ...process.env, ...env }, stdio: ['pipe', 'pipe', 'inherit'],
  });
  return new Promise((resolve, reject) => {
    child.stdout!.on('data', (chunk: Buffer) => {
      const ready = /ready (\d+)/.exec(chunk.toString());
      if (ready) resolve({ child, port: Number(ready[1]) });
    });
    child.on('exit', (code) => reject(new Error(`${script} exited with ${code}`)));
  });
}

const ms = (value: number) => `${value.toFixed(0)} ms`.padStart(8);

// CPU time (user + system) a process has used, and the database's backends together, from /proc: the cost of
// a request in CPU holds on a busy machine, where latency and throughput mostly tell how busy it is.
const ticksPerSecond = Number(spawnSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).stdout.trim()) || 100;
function cpuMsOf(pid: number): number {
  try {
    const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').replace(/^.*\) /, '').split(' ');
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / ticksPerSecond;
  } catch {
    return 0;
  }
}
const postmasterPid = Number(fs.readFileSync(path.join(root, '.data', name, 'postmaster.pid'), 'utf8').split('\n')[0]);
/** CPU milliseconds of each backend of the benchmark's cluster, by process id. */
function databaseCpuMs(): Map<number, number> {
  const backends = new Map<number, number>();
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const ppid = Number(fs.readFileSync(`/proc/${entry}/stat`, 'utf8').replace(/^.*\) /, '').split(' ')[1]);
      if (ppid === postmasterPid) backends.set(Number(entry), cpuMsOf(Number(entry)));
    } catch {
      // the process ended meanwhile
    }
  }
  return backends;
}
/** What the backends used between two readings (one that ended meanwhile is left out; one that started counts whole). */
function databaseCpuSince(before: Map<number, number>): number {
  let total = 0;
  for (const [pid, now] of databaseCpuMs()) total += now - (before.get(pid) ?? 0);
  return total;
}
/** Runs `work` and answers the CPU milliseconds a request cost the server process and the database. */
async function cpuPerRequest<T extends { requests: number }>(serverPid: number, work: () => Promise<T>): Promise<T & { nodeMs: number; databaseMs: number }> {
  const [node0, db0] = [cpuMsOf(serverPid), databaseCpuMs()];
  const result = await work();
  const n = Math.max(result.requests, 1);
  return { ...result, nodeMs: (cpuMsOf(serverPid) - node0) / n, databaseMs: databaseCpuSince(db0) / n };
}
async function load(url: string, connections: number, init: { method?: string; body?: string; headers?: Record<string, string> } = {}, seconds = SECONDS) {
  // A generous timeout: on a busy machine a slow answer is a figure, not an error.
  const result = await autocannon({ url, connections, duration: seconds, timeout: 60, method: init.method ?? 'GET', body: init.body, headers: init.headers });
  const bad = result.non2xx + result.errors + result.timeouts;
  return { p50: result.latency.p50, p99: result.latency.p99, rps: result.requests.total / result.duration, bad, requests: result.requests.total };
}

/** The median time of `n` requests sent one after another on one connection. */
async function medianAlone(url: string, init: RequestInit, n = 15): Promise<number> {
  const times: number[] = [];
  for (let i = 0; i < n; i++) {
    const t = performance.now();
    await (await fetch(url, init)).arrayBuffer();
    times.push(performance.now() - t);
  }
  return times.sort((x, y) => x - y)[Math.floor(n / 2)]!;
}

/** SQL statements per request: pg_stat_statements around `n` sequential requests of the API. */
async function statementsPerRequest(send: () => Promise<Response>, n = 20): Promise<number> {
  await send();
  psql('SELECT pg_stat_statements_reset()');
  for (let i = 0; i < n; i++) {
    const res = await send();
    await res.arrayBuffer();
  }
  const calls = Number(psql(`SELECT coalesce(sum(calls), 0) FROM pg_stat_statements s JOIN pg_roles r ON r.oid = s.userid WHERE r.rolname = 'burrowline_app'`));
  return calls / n;
}

const explainedRoutes: [string, string][] = [
  ['herd list', '/api/animals'],
  ['litters list', '/api/litters'],
  ['Almanac agenda (next 7 days)', '/api/almanac/tasks?days=7&include=open'],
  ['feed book', '/api/feed'],
  ['doe board', '/api/almanac/doe-board'],
];
const capturedReads = await captureReads(explainedRoutes.map(([, route]) => route));
const herdRead = capturedReads.get('/api/animals');
if (!herdRead) throw new Error('the herd list sent no page SELECT as its first statement');
fs.writeFileSync(queryFile, JSON.stringify({ ...herdRead, coopId: coop.coopId }));
console.log(`captured the one-statement reads of: ${explainedRoutes.filter(([, r]) => capturedReads.has(r)).map(([label]) => label).join(', ')}`);
const apiServer = await startChild('api-server.ts', [String(API_PORT)]);
const bareServer = await startChild('bare-server.ts', [String(BARE_PORT), queryFile]);
const apiUrl = `http://127.0.0.1:${apiServer.port}`;
const bareUrl = `http://127.0.0.1:${bareServer.port}`;
const stop = () => [apiServer.child, bareServer.child].forEach((child) => child.kill('SIGTERM'));
process.on('exit', stop);
try {
  const cookie = await signIn(apiUrl);
  const headers = { cookie };
  console.log(`machine: ${process.version}, ${os.cpus().length} cores; autocannon ${SECONDS} s a round after a 2 s warm-up`);
  console.log('');

  // The herd list: API and bare, alternated round by round.
  for (const connections of [50, 10]) {
    await load(`${apiUrl}/api/animals`, connections, { headers }, 2);
    await load(bareUrl, connections, {}, 2);
    const api: Awaited<ReturnType<typeof cpuPerRequest<Awaited<ReturnType<typeof load>>>>>[] = [];
    const bare: typeof api = [];
    for (let round = 0; round < (connections === 50 ? ROUNDS : 1); round++) {
      api.push(await cpuPerRequest(apiServer.child.pid!, () => load(`${apiUrl}/api/animals`, connections, { headers })));
      bare.push(await cpuPerRequest(bareServer.child.pid!, () => load(bareUrl, connections)));
    }
    const avg = (list: typeof api, key: 'p50' | 'p99' | 'rps' | 'nodeMs' | 'databaseMs') => list.reduce((sum, r) => sum + r[key], 0) / list.length;
    const cpu = (list: typeof api) => `CPU a request: server ${avg(list, 'nodeMs').toFixed(2)} ms + database ${avg(list, 'databaseMs').toFixed(2)} ms`;
    const [load1] = os.loadavg();
    console.log(`herd list, ${connections} connections, ${api.length} round(s) each (load average ${load1!.toFixed(2)}):`);
    console.log(`  API   p50 ${ms(avg(api, 'p50'))}  p99 ${ms(avg(api, 'p99'))}  ${avg(api, 'rps').toFixed(1).padStart(6)} req/s;  ${cpu(api)}${api.some((r) => r.bad) ? `  (${api.reduce((s, r) => s + r.bad, 0)} failed)` : ''}`);
    console.log(`  bare  p50 ${ms(avg(bare, 'p50'))}  p99 ${ms(avg(bare, 'p99'))}  ${avg(bare, 'rps').toFixed(1).padStart(6)} req/s;  ${cpu(bare)}`);
    const cpuRatio = (avg(bare, 'nodeMs') + avg(bare, 'databaseMs')) / (avg(api, 'nodeMs') + avg(api, 'databaseMs'));
    console.log(`  API / bare throughput ${(avg(api, 'rps') / avg(bare, 'rps')).toFixed(2)}; by CPU a request (what a quiet machine would give) ${cpuRatio.toFixed(2)}`);
    if (connections === 10) {
      // One connection, one request after another: what a co-op's size changes of one answer.
      const alone = await medianAlone(`${apiUrl}/api/animals`, { headers });
      console.log(`  API 1 connection: median ${ms(alone)} (compare the co-ops of 5,000, 50,000 and 200,000 animals: \`--5k\`, \`--200k\`)`);
    }
  }

  // The other heavy reads, at 10 connections.
  const trialBody = JSON.stringify({ damId: coop.doeId, sireIds: coop.buckIds });
  const post = { method: 'POST', body: trialBody, headers: { ...headers, 'content-type': 'application/json', [CSRF_HEADER]: '1' } };
  const reads: [string, string, typeof post | { headers: Record<string, string> }][] = [
    [`comparing a doe with ${coop.buckIds.length} bucks`, '/api/trial-matings', post],
    ['litters list', '/api/litters', { headers }],
    ['performance tables (all years)', '/api/performance?period=all', { headers }],
    ['Almanac agenda (next 7 days)', '/api/almanac/tasks?days=7&include=open', { headers }],
    ['feed book (first page)', '/api/feed', { headers }],
    ['doe board', '/api/almanac/doe-board', { headers }],
  ];
  console.log('');
  console.log('other reads, 10 connections:');
  for (const [label, route, init] of reads) {
    const first = await fetch(`${apiUrl}${route}`, init as RequestInit);
    if (!first.ok) throw new Error(`${route}: ${first.status} ${(await first.text()).slice(0, 300)}`);
    await load(`${apiUrl}${route}`, 10, init, 2);
    const r = await cpuPerRequest(apiServer.child.pid!, () => load(`${apiUrl}${route}`, 10, init));
    const statements = await statementsPerRequest(() => fetch(`${apiUrl}${route}`, init as RequestInit), 10);
    // One connection, one request after another: the cost of one answer (and a figure even when none
    // of the loaded requests finished within a round).
    const alone = await medianAlone(`${apiUrl}${route}`, init as RequestInit);
    console.log(`  ${label.padEnd(34)} p50 ${ms(r.p50)}  p99 ${ms(r.p99)}  ${r.rps.toFixed(1).padStart(6)} req/s${r.bad ? ` (${r.bad} failed)` : ''};  `
      + `1 connection: median ${ms(alone)};  ${statements.toFixed(1)} statements a request;  CPU a request: server ${r.nodeMs.toFixed(1)} ms + database ${r.databaseMs.toFixed(1)} ms`);
  }
  const herdStatements = await statementsPerRequest(() => fetch(`${apiUrl}/api/animals`, { headers }));
  console.log(`  herd list: ${herdStatements.toFixed(1)} statements a request (session and transaction included)`);

  // Plans of the heavy queries, as the app role under the co-op's tenant.
  const explain = async (label: string, sql: string, bind: unknown[], prepare?: string) => {
    const plan = await database().transaction(async (tx) => {
      await database().query(`SELECT set_config('app.coop_id', $1, true), set_config('plan_cache_mode', 'force_generic_plan', true)`, { bind: [coop!.coopId], transaction: tx });
      const name = prepare ? /^PREPARE "([^"]+)"/.exec(prepare)![1]! : null;
      const known = name ? await database().query('SELECT 1 FROM pg_prepared_statements WHERE name = $1', { bind: [name], transaction: tx, type: 'SELECT' as never }) : [];
      if (prepare && (known as unknown[]).length === 0) await database().query(prepare, { transaction: tx });
      return database().query(`EXPLAIN (ANALYZE, BUFFERS) ${sql}`, { bind, transaction: tx, type: 'SELECT' as never });
    });
    console.log(`\n--- EXPLAIN (ANALYZE, BUFFERS): ${label}`);
    for (const row of plan as unknown as { 'QUERY PLAN': string }[]) console.log(row['QUERY PLAN']);
  };
  for (const [label, route] of explainedRoutes) {
    const read = capturedReads.get(route);
    if (read) await explain(`${label} (the API's SELECT)`, read.execute, [], read.prepare);
  }
  await explain('the co-op\'s whole pedigree (read per comparison before the shared index)', 'SELECT id, sire_id, dam_id, breed_id FROM animals WHERE coop_id = $1 AND deleted_at IS NULL', [coop.coopId]);
  const slowest = psql(`SELECT round(mean_exec_time::numeric, 1) || ' ms  ' || calls || ' calls  ' || left(regexp_replace(query, '\\s+', ' ', 'g'), 160)
    FROM pg_stat_statements s JOIN pg_roles r ON r.oid = s.userid WHERE r.rolname = 'burrowline_app' ORDER BY mean_exec_time DESC LIMIT 8`);
  console.log('\n--- slowest statements of the last measured read (mean):');
  console.log(slowest);
} finally {
  stop();
  await closeDatabase().catch(() => undefined);
}
process.exit(0);
