/**
 * The real server as `npm start` runs it, in a child process, on a PostgreSQL cluster of its own that is
 * migrated and seeded with the demo co-op: for tests that restart the database, stop the mail server or
 * kill the server, which must not disturb the other test files.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { root, runTs, startCluster, type LocalCluster } from '../../scripts/lib/bootstrap.mjs';

/** Polls `check` until it holds; a check that throws counts as not yet. */
export async function waitUntil(check: () => Promise<boolean>, what: string, timeoutMs = 30_000, everyMs = 50) {
  const started = Date.now();
  while (Date.now() - started < timeoutMs) {
    if (await check().catch(() => false)) return;
    await new Promise((r) => setTimeout(r, everyMs));
  }
  throw new Error(`${what} within ${timeoutMs} ms`);
}

/** Stops a child process and waits until it has exited. */
export async function stopChild(child: ChildProcess | null, signal: NodeJS.Signals = 'SIGTERM') {
  if (!child || child.exitCode !== null) return;
  await new Promise<void>((resolve) => {
    child.once('exit', () => resolve());
    child.kill(signal);
  });
}

export interface OwnServerOptions {
  cluster: string;
  /**
   * Below 32768: these clusters start while the suite runs, and a port in Linux's range for outgoing
   * connections (32768–60999) may at that moment be the local end of one of the suite's own connections
   * ("address already in use").
   */
  pgPort: number;
  appPort: number;
  /** Settings of this server beyond the database, port and URL (session secret, SMTP, …). */
  env: Record<string, string>;
}

export function ownServer(options: OwnServerOptions) {
  const url = `http://127.0.0.1:${options.appPort}`;
  let cluster: LocalCluster | null = null;
  let child: ChildProcess | null = null;
  let env: Record<string, string> = {};

  const answers = async () => (await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(5000) })).ok;

  return {
    url,
    get process() {
      return child;
    },
    /** Creates, migrates and seeds the cluster, then starts the server. */
    async setUp() {
      cluster = await startCluster({ name: options.cluster, port: options.pgPort, fresh: true, fast: true });
      env = {
        NODE_ENV: 'test',
        PG_CLUSTER_NAME: options.cluster,
        DATABASE_URL: cluster.appUrl,
        DATABASE_OWNER_URL: cluster.ownerUrl,
        PORT: String(options.appPort),
        APP_URL: url,
        LOG_LEVEL: 'silent',
        // A server of its own sends its own mail (test processes leave theirs to the run's one worker).
        MAIL_WORKER: 'true',
        ...options.env,
      };
      runTs('packages/server/src/db/migrate-cli.ts', ['up'], env);
      // The seed runs without the server: whatever it queues waits for the server's workers.
      runTs('seed/load.ts', [], env);
      await this.start();
    },
    async start(overrides: Record<string, string> = {}) {
      child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'packages/server/src/server.ts')], {
        cwd: root,
        env: { ...process.env, ...env, ...overrides },
        stdio: ['ignore', 'ignore', 'inherit'],
      });
      // Loading the server through tsx takes seconds on a quiet machine and far longer on a busy one.
      await waitUntil(answers, 'the server did not answer', 90_000);
    },
    async stop(signal: NodeJS.Signals = 'SIGTERM') {
      const stopping = child;
      child = null;
      await stopChild(stopping, signal);
    },
    async tearDown() {
      await this.stop();
      await cluster?.stop();
      fs.rmSync(path.join(root, '.data', options.cluster), { recursive: true, force: true });
    },
    dataDir: () => path.join(root, '.data', options.cluster),
    /** The cluster's superuser over its socket: row-level security does not hide rows from it. */
    async superuserQuery<T = Record<string, unknown>>(sql: string, params: unknown[] = []): Promise<T[]> {
      const client = new pg.Client({ host: path.join(root, '.data', `${options.cluster}-socket`), port: options.pgPort, user: 'postgres', database: 'burrowline' });
      await client.connect();
      try {
        return (await client.query(sql, params)).rows as T[];
      } finally {
        await client.end();
      }
    },
  };
}
