// Socket.IO fan-out: one event to every connected member of a co-op (500 by default), from a request to the
// moment each socket hears it, with real server processes (server.ts, as `npm start` runs it):
//   1. one instance, events kept in the process (what `npm start` does);
//   2. one instance with Socket.IO's PostgreSQL adapter (what every instance of a cluster does);
//   3. two instances with the adapter, the clients split between them (the event crosses PostgreSQL's NOTIFY).
// The event is `farm:updated`, sent to the co-op's room when the admin edits the farm's description. Each
// delivery is timed from the moment the request is sent (so it includes the request: its own time is printed
// beside) and from the moment the first socket heard it (the fan-out alone). The 500 clients live in this one
// process, so their decoding is part of the figure. Needs DATABASE_URL and DATABASE_OWNER_URL of a migrated throwaway database (e.g. `source
// .data/<name>.env` after `node scripts/test-infra.mjs <name> …`); adds a co-op "Bench fan-out …" and leaves it.
// Run: `npm run bench fan-out` (BENCH_FANOUT_CLIENTS=500, BENCH_FANOUT_ROUNDS=30, BENCH_FANOUT_PORTS=3981,3982).
import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import argon2 from 'argon2';
import { io as connect, type Socket } from 'socket.io-client';
import { CSRF_HEADER, RealtimeEvent } from '@burrowline/shared';
import { closeDatabase, connectDatabase } from '../../packages/server/src/composition/database';
import { createCooperative } from '../../packages/server/src/modules/coops/coops.service';
import { createFarm } from '../../packages/server/src/modules/farms/farms.service';
import { createUser } from '../../packages/server/src/modules/users/users.service';
import { root } from '../lib/bootstrap.mjs';

const CLIENTS = Number(process.env.BENCH_FANOUT_CLIENTS ?? 500);
const ROUNDS = Number(process.env.BENCH_FANOUT_ROUNDS ?? 30);
const PORTS = (process.env.BENCH_FANOUT_PORTS ?? '3981,3982').split(',').map(Number) as [number, number];
const PASSWORD = 'bench-fan-out-password-1';

const url = process.env.DATABASE_URL;
if (!url || !process.env.DATABASE_OWNER_URL) {
  console.log('DATABASE_URL and DATABASE_OWNER_URL are not set: the fan-out bench needs a migrated throwaway database (see the comment at the top).');
  process.exit(0);
}
connectDatabase(url, 4);

/** A co-op of one farm with an admin and CLIENTS members; the cheapest Argon2id keeps 500 sign-ins quick. */
async function buildCoop() {
  const passwordHash = await argon2.hash(PASSWORD, { type: argon2.argon2id, memoryCost: 8, timeCost: 1, parallelism: 1 });
  const tag = randomUUID().slice(0, 8);
  return createCooperative({ name: `Bench fan-out ${tag}`, slug: `bench-fan-out-${tag}` }, async (coop, tx) => {
    const farm = await createFarm(
      coop.id,
      { name: `Fan-out Farm ${tag}`, location: 'Bench County', timeZone: 'America/Chicago', weightUnit: 'lb_oz', temperatureUnit: 'F', breedsKept: [], description: '' },
      tx,
    );
    const email = (label: string) => `${label}-${tag}@bench.test`;
    await createUser({ coopId: coop.id, farmId: farm.id, mentorId: null, email: email('admin'), name: 'Bench Admin', role: 'admin', passwordHash }, tx);
    const members: string[] = [];
    for (let i = 0; i < CLIENTS; i += 1) {
      await createUser({ coopId: coop.id, farmId: farm.id, mentorId: null, email: email(`member${i}`), name: `Bench Member ${i}`, role: 'member', passwordHash }, tx);
      members.push(email(`member${i}`));
    }
    return { farmId: farm.id, admin: email('admin'), members };
  });
}

interface Instance {
  url: string;
  child: ChildProcess;
}

async function startInstance(port: number, acrossInstances: boolean): Promise<Instance> {
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'packages/server/src/server.ts')], {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: 'test',
      PORT: String(port),
      APP_URL: `http://127.0.0.1:${port}`,
      REALTIME_ACROSS_INSTANCES: String(acrossInstances),
      MAIL_WORKER: 'false',
      MORNING_EMAIL_JOBS: 'false',
      SIGNIN_MAX_PER_IP: '1000000',
      LOG_LEVEL: 'silent',
      AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
    },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const instanceUrl = `http://127.0.0.1:${port}`;
  const started = Date.now();
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the instance on :${port} exited with ${child.exitCode}`);
    if (await fetch(`${instanceUrl}/api/health`).then((r) => r.ok, () => false)) break;
    if (Date.now() - started > 120_000) throw new Error(`the instance on :${port} did not answer`);
    await new Promise((r) => setTimeout(r, 200));
  }
  return { url: instanceUrl, child };
}

async function stopInstance(instance: Instance) {
  if (instance.child.exitCode !== null) return;
  await new Promise<void>((resolve) => {
    instance.child.once('exit', () => resolve());
    instance.child.kill('SIGTERM');
  });
}

async function signIn(base: string, email: string): Promise<string> {
  const res = await fetch(`${base}/api/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', [CSRF_HEADER]: '1' },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status}`);
  const cookie = res.headers.getSetCookie().find((c) => c.startsWith('burrowline.sid='));
  if (!cookie) throw new Error('no session cookie');
  return cookie.split(';')[0]!;
}

async function inBatches<T, R>(items: T[], size: number, work: (item: T) => Promise<R>): Promise<R[]> {
  const out: R[] = [];
  for (let i = 0; i < items.length; i += size) out.push(...(await Promise.all(items.slice(i, i + size).map(work))));
  return out;
}

function percentile(sorted: number[], p: number) {
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

async function scenario(label: string, instances: Instance[], cookies: string[], adminCookie: string, farmId: string) {
  const sockets: Socket[] = await inBatches(cookies.map((cookie, i) => ({ cookie, instance: instances[i % instances.length]! })), 50, ({ cookie, instance }) => {
    const socket = connect(instance.url, { transports: ['websocket'], extraHeaders: { cookie }, reconnection: false, forceNew: true });
    return new Promise<Socket>((resolve, reject) => {
      socket.once('connect', () => resolve(socket));
      socket.once('connect_error', reject);
    });
  });
  const admin = instances[0]!.url;
  const farm = await (await fetch(`${admin}/api/farms/${farmId}`, { headers: { cookie: adminCookie } })).json() as Record<string, unknown>;
  let version = farm.version as number;
  const delivery: number[] = [];
  const spread: number[] = [];
  const requestTimes: number[] = [];
  for (let round = 0; round < ROUNDS + 3; round += 1) {
    let t0 = 0;
    const heard = sockets.map((socket) => new Promise<number>((resolve) => socket.once(RealtimeEvent.farmUpdated, () => resolve(performance.now() - t0))));
    t0 = performance.now();
    const res = await fetch(`${admin}/api/farms/${farmId}`, {
      method: 'PATCH',
      headers: { 'content-type': 'application/json', cookie: adminCookie, [CSRF_HEADER]: '1' },
      body: JSON.stringify({
        name: farm.name, location: farm.location, timeZone: farm.timeZone, weightUnit: farm.weightUnit, temperatureUnit: farm.temperatureUnit,
        breedsKept: farm.breedsKept, description: `Round ${round} ${randomUUID()}`, version,
      }),
    });
    const answeredIn = performance.now() - t0;
    if (res.status !== 200) throw new Error(`the farm edit answered ${res.status}: ${await res.text()}`);
    version = ((await res.json()) as { version: number }).version;
    const times = await Promise.all(heard);
    // The first rounds warm the processes up (JIT, pools) and are left out.
    if (round >= 3) {
      delivery.push(...times);
      const first = Math.min(...times);
      spread.push(...times.map((t) => t - first));
      requestTimes.push(answeredIn);
    }
  }
  for (const socket of sockets) socket.close();
  for (const list of [delivery, spread, requestTimes]) list.sort((x, y) => x - y);
  const ms = (n: number) => n.toFixed(1).padStart(8);
  console.log(
    `${label.padEnd(50)} ${ms(percentile(delivery, 50))} ${ms(percentile(delivery, 95))} ${ms(delivery.at(-1)!)} ${ms(percentile(spread, 95))} ${ms(percentile(requestTimes, 50))}`,
  );
}

const coop = await buildCoop();
console.log(`${CLIENTS} clients, ${ROUNDS} events each (after 3 warm-up rounds), in milliseconds: delivery from sending the request`);
console.log('(p50, p95, max), p95 after the first socket heard it (the fan-out itself), and the request\'s own answer time (p50)');
console.log(`${'set-up'.padEnd(50)} ${['p50', 'p95', 'max', 'spread95', 'request'].map((h) => h.padStart(8)).join(' ')}`);

let instances = [await startInstance(PORTS[0], false)];
const cookies = await inBatches(coop.members, 25, (email) => signIn(instances[0]!.url, email));
const adminCookie = await signIn(instances[0]!.url, coop.admin);
try {
  await scenario('one instance, events in the process', instances, cookies, adminCookie, coop.farmId);
  await Promise.all(instances.map(stopInstance));
  instances = [await startInstance(PORTS[0], true)];
  await scenario('one instance, PostgreSQL adapter', instances, cookies, adminCookie, coop.farmId);
  instances.push(await startInstance(PORTS[1], true));
  await scenario('two instances, PostgreSQL adapter, clients split', instances, cookies, adminCookie, coop.farmId);
} finally {
  await Promise.all(instances.map(stopInstance));
  await closeDatabase();
}
