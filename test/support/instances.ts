/**
 * Several real app instances (`server.ts` in child processes) on one database of their own, with the local
 * S3 fake, as `npm run start:cluster` runs them: for tests of what crosses instances (live events, sessions,
 * jobs, files) and of an instance dying. The database is a scratch one on the run's cluster, so the run's own
 * mail worker and other files never touch it, and it is dropped at the end.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { fakeS3Env, root, runTs } from '../../scripts/lib/bootstrap.mjs';
import { stopChild, waitUntil } from './own-server';

/**
 * Ports of the instances and the S3 fake: `SEVERAL_INSTANCES_PORTS=appA,appB,s3` (a helper's own runs);
 * the defaults are `npm test`'s, clear of every other service it starts.
 */
export function instancePorts(): { a: number; b: number; s3: number } {
  const [a, b, s3] = (process.env.SEVERAL_INSTANCES_PORTS ?? '3971,3972,4511').split(',').map(Number);
  if (!a || !b || !s3) throw new Error('SEVERAL_INSTANCES_PORTS wants three ports: appA,appB,s3');
  return { a, b, s3 };
}

function superuser(database: string) {
  const cluster = process.env.PG_CLUSTER_NAME ?? 'pg-test';
  const port = Number(new URL(process.env.DATABASE_URL!).port);
  return new pg.Client({ host: path.join(root, '.data', `${cluster}-socket`), port, user: 'postgres', database });
}

async function asSuperuser<T>(database: string, work: (c: pg.Client) => Promise<T>): Promise<T> {
  const client = superuser(database);
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

/** A fresh database on the run's cluster, set up like the main one (owner, app role's grants) and migrated. */
export async function scratchDatabase() {
  const name = `burrowline_instances_${randomUUID().slice(0, 8)}`;
  const withDatabase = (url: string) => Object.assign(new URL(url), { pathname: `/${name}` }).toString();
  const appUrl = withDatabase(process.env.DATABASE_URL!);
  const ownerUrl = withDatabase(process.env.DATABASE_OWNER_URL!);
  const owner = decodeURIComponent(new URL(ownerUrl).username);
  const app = decodeURIComponent(new URL(appUrl).username);
  await asSuperuser('postgres', (c) => c.query(`CREATE DATABASE ${name} OWNER ${owner} ENCODING 'UTF8'`));
  await asSuperuser(name, (c) =>
    c.query(`REVOKE ALL ON DATABASE ${name} FROM PUBLIC; GRANT CONNECT ON DATABASE ${name} TO ${app};
             REVOKE CREATE ON SCHEMA public FROM PUBLIC; ALTER SCHEMA public OWNER TO ${owner}; GRANT USAGE ON SCHEMA public TO ${app}`),
  );
  runTs('packages/server/src/db/migrate-cli.ts', ['up'], { DATABASE_URL: appUrl, DATABASE_OWNER_URL: ownerUrl, LOG_LEVEL: 'warn' });
  return {
    name,
    appUrl,
    ownerUrl,
    /** As the superuser: row-level security hides nothing. */
    query: <T extends pg.QueryResultRow = Record<string, unknown>>(sql: string, params: unknown[] = []) =>
      asSuperuser(name, async (c) => (await c.query<T>(sql, params)).rows),
    async drop() {
      await asSuperuser('postgres', async (c) => {
        await c.query('SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = $1 AND pid <> pg_backend_pid()', [name]);
        await c.query(`DROP DATABASE IF EXISTS ${name}`);
      });
    },
  };
}

/** The S3 fake (scripts/lib/fake-s3.mjs) on `port` with a data folder of its own. */
export async function fakeS3(port: number) {
  const dir = path.join(root, '.data', `s3-instances-${randomUUID().slice(0, 8)}`);
  const child = spawn(process.execPath, [path.join(root, 'scripts/lib/fake-s3.mjs'), '--port', String(port), '--dir', dir, '--silent'], {
    cwd: root,
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  await waitUntil(async () => (await fetch(`http://127.0.0.1:${port}/`)).status < 500, 'the S3 fake did not answer');
  return {
    dir,
    env: fakeS3Env(port),
    async stop() {
      await stopChild(child);
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

export interface Instance {
  url: string;
  port: number;
  readonly process: ChildProcess | null;
  /** Ends the instance at once with `signal` (SIGKILL: a crash, nothing flushed). */
  kill(signal?: NodeJS.Signals): Promise<void>;
}

/** One app instance as `npm start` runs it (tsx, server.ts) with `env`, once it answers its health check. */
export async function startInstance(port: number, env: Record<string, string>): Promise<Instance> {
  const url = `http://127.0.0.1:${port}`;
  let child: ChildProcess | null = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'packages/server/src/server.ts')], {
    cwd: root,
    env: { ...process.env, LOG_LEVEL: 'silent', ...env, PORT: String(port), APP_URL: url },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const exited = child;
  // Loading the server through tsx takes seconds on a quiet machine and far longer on a busy one.
  const exitedEarly = new Promise<never>((_resolve, reject) => exited.once('exit', (code) => reject(new Error(`the instance on :${port} exited with ${code}`))));
  exitedEarly.catch(() => undefined);
  await Promise.race([
    waitUntil(async () => (await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(5000) })).ok, `the instance on :${port} did not answer`, 90_000),
    exitedEarly,
  ]);
  return {
    url,
    port,
    get process() {
      return child;
    },
    async kill(signal: NodeJS.Signals = 'SIGTERM') {
      const stopping = child;
      child = null;
      await stopChild(stopping, signal);
    },
  };
}
