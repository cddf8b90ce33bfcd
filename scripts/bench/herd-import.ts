// Herd spreadsheet import benchmark: a 10,000-row invented herd (generations of a line, parents
// earlier in the file, a weight on every tenth row) from upload to confirmed, through the real HTTP
// API of an app it starts itself on a free port, against the database it is given.
//
// Needs a migrated database: DATABASE_URL (the app role), e.g. `source .data/<name>.env` after
// `node scripts/test-infra.mjs <name> …`, or the test cluster. Without DATABASE_URL it says so and
// skips (exit 0). Each run adds its own co-op ("Bench co-op …", one farm, one member) to that
// database and leaves it there: use a throwaway database, not the one you keep.
// Run: `npm run bench herd-import` (BENCH_IMPORT_ROWS=20000 for a larger file, BENCH_IMPORT_RUNS=3).
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { CSRF_HEADER } from '@burrowline/shared';
import { generatedHerdCsv } from '../../test/support/herd-csv';

const ROWS = Number(process.env.BENCH_IMPORT_ROWS ?? 10_000);
const RUNS = Number(process.env.BENCH_IMPORT_RUNS ?? 2);

if (!process.env.DATABASE_URL) {
  console.log('herd-import: skipped — set DATABASE_URL to a migrated, throwaway database (e.g. `source .data/<name>.env`) to run it');
  process.exit(0);
}
process.env.SESSION_SECRET ??= `bench-${randomUUID()}-${randomUUID()}`;
process.env.LOG_LEVEL ??= 'warn';

const { createApp } = await import('../../packages/server/src/app');
const { closeDatabase, connectDatabase } = await import('../../packages/server/src/composition/database');
const { hashPassword } = await import('../../packages/server/src/lib/passwords');
const { createCooperative } = await import('../../packages/server/src/modules/coops/coops.service');
const { createFarm } = await import('../../packages/server/src/modules/farms/farms.service');
const { createUser } = await import('../../packages/server/src/modules/users/users.service');

const password = `bench-${randomUUID()}`;
connectDatabase(process.env.DATABASE_URL);
const passwordHash = await hashPassword(password);

const server = http.createServer();
await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
const handle = createApp({ appUrl: url, uploads: { ...(await import('../../packages/server/src/config/env')).loadConfig().uploads, importMaxRows: Math.max(ROWS, 20_000), importMaxBytes: 50 * 1024 * 1024 } });
server.on('request', handle.app);

/** A fresh co-op with one farm and its member, signed in over HTTP. */
async function signedInMember(run: number): Promise<(path: string, init?: RequestInit) => Promise<Response>> {
  const tag = randomUUID().slice(0, 8);
  const email = `bench-${tag}@example.test`;
  await createCooperative({ name: `Bench co-op ${tag}`, slug: `bench-${tag}` }, async (coop, tx) => {
    const farm = await createFarm(
      coop.id,
      { name: `Bench Farm ${run}`, location: 'Tamsin County', timeZone: 'America/Chicago', weightUnit: 'lb_oz', temperatureUnit: 'F', breedsKept: [], description: '' },
      tx,
    );
    await createUser({ coopId: coop.id, farmId: farm.id, email, name: 'Bench Member', role: 'member', passwordHash }, tx);
  });
  const signIn = await fetch(`${url}/api/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', [CSRF_HEADER]: '1' },
    body: JSON.stringify({ email, password }),
  });
  if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status}`);
  const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  return (path, init = {}) => fetch(`${url}${path}`, { ...init, headers: { ...(init.headers as Record<string, string>), cookie, [CSRF_HEADER]: '1' } });
}

const seconds = (ms: number) => `${(ms / 1000).toFixed(2)} s`;
const file = generatedHerdCsv(ROWS, 'BN');
console.log(`herd import: ${ROWS.toLocaleString('en-US')} rows, ${(Buffer.byteLength(file) / 1024).toFixed(0)} kB, ${RUNS} run(s), each into a fresh farm`);
const totals: number[] = [];
try {
  for (let run = 1; run <= RUNS; run++) {
    const api = await signedInMember(run);
    const form = new FormData();
    form.append('file', new Blob([file], { type: 'text/csv' }), 'bench-herd.csv');
    const t0 = performance.now();
    const staged = await api('/api/herd-imports', { method: 'POST', body: form });
    const preview = (await staged.json()) as { id: string; summary: { rows: number; create: number; withErrors: number } };
    const t1 = performance.now();
    if (staged.status !== 201 || preview.summary.withErrors > 0) throw new Error(`staging failed: ${staged.status} ${JSON.stringify(preview).slice(0, 300)}`);
    const confirmed = await api(`/api/herd-imports/${preview.id}/confirmation`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ idempotencyKey: randomUUID() }),
    });
    const result = (await confirmed.json()) as { result: { created: number; weighIns: number; figuresChanged: number } };
    const t2 = performance.now();
    if (confirmed.status !== 200) throw new Error(`confirm failed: ${confirmed.status} ${JSON.stringify(result).slice(0, 300)}`);
    totals.push(t2 - t1 + (t1 - t0));
    console.log(
      `  run ${run}: upload + check ${seconds(t1 - t0)}, confirm ${seconds(t2 - t1)} (${result.result.created} animals, ${result.result.weighIns} weigh-ins, ` +
        `${result.result.figuresChanged} pedigree figures), upload to confirmed ${seconds(t2 - t0)}`,
    );
  }
  const best = Math.min(...totals);
  console.log(`  best: ${seconds(best)} from upload to confirmed (${Math.round(ROWS / (best / 1000)).toLocaleString('en-US')} rows/s)`);
} finally {
  server.closeAllConnections();
  await new Promise<void>((resolve) => server.close(() => resolve()));
  await handle.close();
  await closeDatabase();
}
