import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import pg from 'pg';
import { createTestCoop } from '../support/factories';

/** The test cluster's superuser over its socket: RLS is forced even for the owner, so dumps need it. */
function superuserUrl(database = 'burrowline') {
  const port = new URL(process.env.DATABASE_URL!).port;
  const socketDir = path.resolve('.data', process.env.PG_CLUSTER_NAME ?? 'pg-test') + '-socket';
  return `postgres://postgres@localhost:${port}/${database}?host=${socketDir}`;
}

async function countAs(url: string, sql: string) {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return (await client.query(sql)).rows[0].n as number;
  } finally {
    await client.end();
  }
}

describe('backup and restore', () => {
  it('when the database is dumped and restored into a fresh database, then every co-op, farm and person comes back', async () => {
    const coop = await createTestCoop();
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'burrowline-backup-')), 'test.dump');
    const database = `restore_check_${Date.now()}`;
    const env = { ...process.env, BACKUP_DATABASE_URL: superuserUrl() };
    const tables = ['cooperatives', 'farms', 'users', 'schema_migrations'];
    const countsIn = async (url: string) => {
      const counts: Record<string, number> = {};
      for (const table of tables) counts[table] = await countAs(url, `SELECT count(*)::int AS n FROM ${table}`);
      return counts;
    };
    // Other test files add co-ops while this one runs: the dump holds what was there when it began.
    const beforeDump = await countsIn(superuserUrl());
    execFileSync(process.execPath, ['scripts/backup.mjs', 'backup', file], { env, stdio: 'pipe' });
    const afterDump = await countsIn(superuserUrl());
    expect(fs.statSync(file).size).toBeGreaterThan(1000);
    execFileSync(process.execPath, ['scripts/backup.mjs', 'restore', file, database], { env, stdio: 'pipe' });

    const restored = await countsIn(superuserUrl(database));
    for (const table of tables) {
      expect(restored[table], table).toBeGreaterThanOrEqual(beforeDump[table]!);
      expect(restored[table], table).toBeLessThanOrEqual(afterDump[table]!);
    }
    const found = await countAs(superuserUrl(database), `SELECT count(*)::int AS n FROM farms WHERE coop_id = '${coop.id}'`);
    expect(found).toBe(2);
    // Row-level security survives the restore.
    const forced = await countAs(superuserUrl(database), `SELECT count(*)::int AS n FROM pg_class WHERE relname = 'farms' AND relforcerowsecurity`);
    expect(forced).toBe(1);
    await countAs(superuserUrl(), `SELECT 1 AS n FROM (SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = '${database}') t LIMIT 1`).catch(() => 0);
    const cleanup = new pg.Client({ connectionString: superuserUrl() });
    await cleanup.connect();
    await cleanup.query(`DROP DATABASE ${database}`);
    await cleanup.end();
  }, 90_000); // the dump holds every co-op the run has made so far
});
