/**
 * Reliability (security checklist, "Reliability"): the real server as `npm start` runs it, in its own
 * process, on its own PostgreSQL cluster, so the database can be restarted and the server killed
 * without disturbing the other test files.
 */
import { spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER } from '@burrowline/shared';
import { postgresBinDir } from '../../scripts/lib/bootstrap.mjs';
import { generatedHerdCsv, stageFile } from '../support/herd-files';
import { ownServer, waitUntil } from '../support/own-server';

const DEMO = { email: 'member@demo.test', password: 'burrowline-demo' };
const server = ownServer({
  cluster: 'pg-reliability',
  pgPort: 25461,
  appPort: 3961,
  env: {
    SESSION_SECRET: 'reliability-secret-reliability-secret-0123',
    SMTP_HOST: process.env.SMTP_HOST ?? '127.0.0.1',
    SMTP_PORT: process.env.SMTP_PORT ?? '1026',
  },
});

async function signedIn() {
  const agent = supertest.agent(server.url).set(CSRF_HEADER, '1');
  const res = await agent.post('/api/session').send(DEMO);
  expect(res.status).toBe(200);
  return agent;
}

// A cluster of its own, migrated and seeded: it can take minutes while the whole suite shares two cores.
beforeAll(() => server.setUp(), 300_000);
afterAll(() => server.tearDown());

describe('reliability of the running server', () => {
  it('when PostgreSQL restarts under load, then the server reconnects by itself, sessions survive and new writes are kept', async () => {
    const agent = await signedIn();
    const herd = await agent.get('/api/animals');
    expect(herd.status).toBe(200);
    const animalId = (herd.body.items as { id: string }[])[0]!.id;

    // Load: a steady stream of reads while the database goes down and comes back.
    let stop = false;
    const statuses: number[] = [];
    const load = (async () => {
      while (!stop) {
        const res = await agent.get('/api/animals').timeout(5000).catch(() => null);
        statuses.push(res?.status ?? 0);
      }
    })();
    // Counted in answers, not milliseconds: on a busy machine 300 ms may hold none.
    const answered = (from = 0) => statuses.slice(from).filter((s) => s === 200).length;
    await waitUntil(async () => answered() >= 3, 'the herd did not load before the restart');
    const pgCtl = path.join(postgresBinDir(), 'pg_ctl');
    const dataDir = server.dataDir();
    const args = ['-D', dataDir, '-l', path.join(dataDir, 'server.log'), '-m', 'fast', '-w', '-t', '30', 'restart'];
    // stdio ignored: the restarted postgres would otherwise hold the pipe open and spawnSync would never return.
    const options = { stdio: 'ignore' as const };
    const restart = process.getuid?.() === 0 ? spawnSync('runuser', ['-u', 'postgres', '--', pgCtl, ...args], options) : spawnSync(pgCtl, args, options);
    expect(restart.status).toBe(0);
    // Without restarting the server, answers come back (the pools drop dead connections and open new ones).
    await waitUntil(async () => (await agent.get('/api/animals').timeout(5000)).status === 200, 'the herd did not load again after the restart');
    const restarted = statuses.length;
    await waitUntil(async () => answered(restarted) >= 3, 'the reads under load did not recover after the restart');
    stop = true;
    await load;
    expect(statuses.filter((s) => s === 200).length).toBeGreaterThan(5);
    // A request that met the lost connection is told to retry (503), never a 500.
    expect(statuses.filter((s) => s >= 500 && s !== 503)).toEqual([]);
    // While it was down the server answered (an error), it did not hang or crash.
    expect(server.process?.exitCode).toBeNull();

    // The session kept in PostgreSQL is still good, and a write after the restart is kept.
    const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
    const weighed = await agent.post('/api/weigh-ins').send({ animalId, totalGrams: 4321, weighedOn: yesterday });
    expect(weighed.status).toBe(201);
    const rows = await server.superuserQuery<{ n: number }>(`SELECT count(*)::int AS n FROM weigh_ins WHERE animal_id = $1 AND total_grams = 4321`, [animalId]);
    expect(rows[0]!.n).toBe(1);
  }, 90_000);

  it('when the server is killed in the middle of confirming an import, then nothing of it is written, and the retried confirmation writes all of it once', async () => {
    const rowsInFile = 3000;
    const agent = await signedIn();
    const staged = await stageFile(agent, generatedHerdCsv(rowsInFile, 'RK'), 'reliability.csv');
    expect(staged.status).toBe(201);
    const idempotencyKey = randomUUID();
    const countImported = async () =>
      (await server.superuserQuery<{ n: number }>(`SELECT count(*)::int AS n FROM animals WHERE tattoo LIKE 'RK%'`))[0]!.n;

    // Fire the confirmation, then kill -9 the server as soon as its transaction is writing animals.
    const confirming = agent.post(`/api/herd-imports/${staged.body.id}/confirmation`).send({ idempotencyKey }).catch((e: Error) => e);
    await waitUntil(
      async () =>
        (await server.superuserQuery(`SELECT 1 FROM pg_stat_activity WHERE usename = 'burrowline_app' AND state <> 'idle' AND query ILIKE '%animals%' AND xact_start IS NOT NULL`)).length > 0,
      'the confirmation never started writing',
      20_000,
    );
    await server.stop('SIGKILL');
    const answer = await confirming;
    expect(answer).toBeInstanceOf(Error); // the connection dropped: nothing was acknowledged
    // PostgreSQL rolls the dead connection's transaction back: no animal of the file is in the herd.
    await waitUntil(
      async () => (await server.superuserQuery(`SELECT 1 FROM pg_stat_activity WHERE usename = 'burrowline_app' AND state <> 'idle'`)).length === 0,
      'the killed server\'s transaction did not end',
    );
    expect(await countImported()).toBe(0);
    const importState = await server.superuserQuery<{ status: string }>(`SELECT status FROM herd_imports WHERE id = $1`, [staged.body.id]);
    expect(importState[0]!.status).not.toBe('confirmed');

    // Back up, the same confirmation (same key) is done once, completely.
    await server.start();
    const again = await signedIn();
    const retried = await again.post(`/api/herd-imports/${staged.body.id}/confirmation`).send({ idempotencyKey });
    expect(retried.status).toBe(200);
    expect(retried.body.result).toMatchObject({ created: rowsInFile });
    const twice = await again.post(`/api/herd-imports/${staged.body.id}/confirmation`).send({ idempotencyKey });
    expect(twice.status).toBe(200);
    expect(await countImported()).toBe(rowsInFile);
  }, 120_000);
});
