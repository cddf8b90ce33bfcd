import { afterAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { database } from '../../packages/server/src/composition/database';
import pg from 'pg';
import { selectPrepared, selectRows } from '../../packages/server/src/db/prepared';
import { withTenant } from '../../packages/server/src/db/tenant';
import { SESSION_TOUCH_SHARE } from '../../packages/server/src/http/session';
import { appDb, asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { countingAgentFor } from '../support/statement-counter';
import { testApp } from '../support/test-app';

afterAll(() => testApp().close());

/** The stored expiry of the person's one session, in ms. */
async function storedExpiry(userId: string): Promise<number[]> {
  return appDb(async (c) => {
    const { rows } = await c.query<{ ms: number }>(
      `SELECT extract(epoch FROM expire::timestamptz)::float8 * 1000 AS ms FROM user_sessions WHERE sess->'passport'->>'user' = $1`,
      [userId],
    );
    return rows.map((r) => r.ms);
  });
}

describe('the session on each request', () => {
  it('when a person makes requests soon after one another, then their session and person are read in one statement and its expiry is not written again', async () => {
    const coop = await createTestCoop();
    const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
    const before = await storedExpiry(coop.member.id);
    expect(before).toHaveLength(1);
    for (let i = 0; i < 3; i++) {
      const { res, fixed, statements } = await counting.count((agent) => agent.get('/api/me'));
      expect(res.status).toBe(200);
      expect(res.body.user?.id ?? res.body.id).toBe(coop.member.id);
      expect(statements.filter((sql) => /user_sessions/.test(sql))).toHaveLength(1);
      expect(statements.some((sql) => /auth_user_by_id/.test(sql) && !/user_sessions/.test(sql))).toBe(false);
      expect(fixed.length).toBeLessThanOrEqual(2);
      expect(statements.filter((sql) => /^\s*UPDATE "user_sessions"/.test(sql))).toEqual([]);
    }
    expect(await storedExpiry(coop.member.id)).toEqual(before);
  });

  it(`when more than ${SESSION_TOUCH_SHARE * 100} % of the idle window has passed since the expiry was written, then the next request moves it on`, async () => {
    const coop = await createTestCoop();
    const idleMs = testApp().config.sessionIdleSeconds * 1000;
    const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
    // As if written a fifth of the window ago.
    await appDb((c) =>
      c.query(`UPDATE user_sessions SET expire = expire - make_interval(secs => $2) WHERE sess->'passport'->>'user' = $1`, [coop.member.id, (idleMs * 0.2) / 1000]),
    );
    const [aged] = await storedExpiry(coop.member.id);
    const asked = Date.now();
    const { res, statements } = await counting.count((agent) => agent.get('/api/me'));
    expect(res.status).toBe(200);
    expect(statements.filter((sql) => /^\s*UPDATE "user_sessions" SET expire/.test(sql))).toHaveLength(1);
    const [moved] = await storedExpiry(coop.member.id);
    expect(moved!).toBeGreaterThan(aged!);
    expect(moved!).toBeGreaterThanOrEqual(asked + idleMs - 1000);
  });

  it('when several requests of one session overlap after a good part of the idle window, then its expiry is written once between them', async () => {
    const coop = await createTestCoop();
    const idleMs = testApp().config.sessionIdleSeconds * 1000;
    const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
    await appDb((c) =>
      c.query(`UPDATE user_sessions SET expire = expire - make_interval(secs => $2) WHERE sess->'passport'->>'user' = $1`, [coop.member.id, (idleMs * 0.2) / 1000]),
    );
    const [aged] = await storedExpiry(coop.member.id);
    const requests = await counting.countEach((agent) => Promise.all(Array.from({ length: 6 }, () => agent.get('/api/animals').expect(200))));
    expect(requests).toHaveLength(6);
    const writes = requests.flatMap((r) => r.statements.filter((sql) => /^\s*UPDATE "user_sessions" SET expire/.test(sql)));
    expect(writes).toHaveLength(1);
    const [moved] = await storedExpiry(coop.member.id);
    expect(moved!).toBeGreaterThan(aged!);
  });

  it('when the person is disabled between two requests, then the second is refused although the expiry was not written in between', async () => {
    const coop = await createTestCoop();
    const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
    expect((await counting.count((agent) => agent.get('/api/animals'))).res.status).toBe(200);
    await asTenant(coop.id, (c) => c.query(`UPDATE users SET disabled_at = now(), sessions_valid_after = now() WHERE id = $1`, [coop.member.id]), { commit: true });
    expect((await counting.count((agent) => agent.get('/api/animals'))).res.status).toBe(401);
  });

  it('when an admin turns a member into an apprentice between two requests, then the second already acts with the new role', async () => {
    const coop = await createTestCoop();
    const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
    const me = async () => (await counting.count((agent) => agent.get('/api/me'))).res.body;
    expect(JSON.stringify(await me())).toContain('"role":"member"');
    await asTenant(coop.id, (c) => c.query(`UPDATE users SET role = 'apprentice', mentor_id = $2 WHERE id = $1`, [coop.member.id, coop.admin.id]), { commit: true });
    expect(JSON.stringify(await me())).toContain('"role":"apprentice"');
  });
});

describe('the tenant transaction', () => {
  const settingIn = (coopId: string, sql: string, bind: unknown[]) =>
    withTenant({ coopId }, async (tx) => {
      const [row] = await database().query<{ coop: string }>(sql, { bind, transaction: tx, type: QueryTypes.SELECT });
      return row!.coop;
    });

  it('when its first statement is plain, carries values, or carries a value that cannot be inlined, then the co-op is set before it runs', async () => {
    const coop = await createTestCoop();
    testApp();
    expect(await settingIn(coop.id, `SELECT current_setting('app.coop_id', true) AS coop`, [])).toBe(coop.id);
    expect(await settingIn(coop.id, `SELECT current_setting($1, true) AS coop`, ['app.coop_id'])).toBe(coop.id);
    expect(await settingIn(coop.id, `SELECT current_setting('app.coop_id', true) AS coop, $1::timestamptz AS at`, [new Date()])).toBe(coop.id);
    expect(await settingIn(coop.id, `SELECT current_setting('app.coop_id', true) AS coop, $1::bytea AS data`, [Buffer.from('kits')])).toBe(coop.id);
    // Row-level security sees the co-op in the first statement: its own co-op row and no other.
    const seen = await withTenant({ coopId: coop.id }, (tx) => database().query<{ id: string }>('SELECT id FROM cooperatives', { transaction: tx, type: QueryTypes.SELECT }));
    expect(seen.map((r) => r.id)).toEqual([coop.id]);
  });

  it('when a tenant transaction has ended, then the pooled connections carry no co-op into statements outside one', async () => {
    const coop = await createTestCoop();
    testApp();
    await Promise.all(Array.from({ length: 12 }, () => settingIn(coop.id, `SELECT current_setting('app.coop_id', true) AS coop`, [])));
    const outside = await Promise.all(
      Array.from({ length: 12 }, () => database().query<{ coop: string | null }>(`SELECT current_setting('app.coop_id', true) AS coop`, { type: QueryTypes.SELECT })),
    );
    for (const [row] of outside) expect(row!.coop ?? '').toBe('');
  });

  it('when a transaction sends nothing, or its first statement fails, then it ends cleanly and the next one works', async () => {
    const coop = await createTestCoop();
    testApp();
    expect(await withTenant({ coopId: coop.id }, async () => 'nothing sent')).toBe('nothing sent');
    await expect(withTenant({ coopId: coop.id }, (tx) => database().query('SELECT * FROM no_such_table', { transaction: tx }))).rejects.toThrow(/no_such_table/);
    expect(await settingIn(coop.id, `SELECT current_setting('app.coop_id', true) AS coop`, [])).toBe(coop.id);
  });

  it('when a tenant transaction writes with its first statement and then fails, then nothing of it is kept', async () => {
    const coop = await createTestCoop();
    testApp();
    const name = `Renamed ${Date.now()}`;
    await expect(
      withTenant({ coopId: coop.id }, async (tx) => {
        await database().query('UPDATE cooperatives SET name = $1 WHERE id = $2', { bind: [name, coop.id], transaction: tx });
        throw new Error('changed my mind');
      }),
    ).rejects.toThrow('changed my mind');
    const [row] = await asTenant(coop.id, async (c) => (await c.query<{ name: string }>('SELECT name FROM cooperatives WHERE id = $1', [coop.id])).rows);
    expect(row!.name).toBe(coop.name);
  });

  it('when a prepared read is the first statement, then it travels with the opening and is prepared once per connection, the same rows as a plain read', async () => {
    const coop = await createTestCoop();
    const handle = testApp();
    const sql = `SELECT id, name, current_setting('app.coop_id', true) AS coop FROM cooperatives WHERE id = $1 AND length(name) > $2`;
    const sent: string[] = [];
    const original = pg.Client.prototype.query;
    pg.Client.prototype.query = function logged(this: pg.Client, ...args: unknown[]) {
      if (typeof args[0] === 'string' && args[0].includes('length(name) >')) sent.push(args[0]);
      return (original as (...a: unknown[]) => unknown).apply(this, args);
    } as typeof original;
    try {
      for (let i = 0; i < 3 * handle.config.databasePoolMax; i++) {
        const rows = await withTenant({ coopId: coop.id }, (tx) => selectPrepared<{ id: string; name: string; coop: string }>(tx, sql, [coop.id, 0]));
        expect(rows).toEqual([{ id: coop.id, name: coop.name, coop: coop.id }]);
      }
    } finally {
      pg.Client.prototype.query = original;
    }
    expect(sent.every((text) => /^\s*START TRANSACTION;/.test(text))).toBe(true);
    const prepares = sent.filter((text) => /\bPREPARE "p_/.test(text));
    expect(prepares.length).toBeGreaterThan(0);
    expect(prepares.length).toBeLessThanOrEqual(handle.config.databasePoolMax);
  });

  it('when a prepared first statement fails after it was prepared, then the next runs of it on every connection still answer', async () => {
    const coop = await createTestCoop();
    const handle = testApp();
    const sql = `SELECT 100 / $1::int AS share, current_setting('app.coop_id', true) AS coop`;
    const run = (divisor: number) => withTenant({ coopId: coop.id }, (tx) => selectPrepared<{ share: number; coop: string }>(tx, sql, [divisor]));
    for (let i = 0; i < handle.config.databasePoolMax; i++) await expect(run(0)).rejects.toThrow(/division by zero/);
    for (let i = 0; i < 3 * handle.config.databasePoolMax; i++) {
      expect(await run(4)).toEqual([{ share: 25, coop: coop.id }]);
      // Also as a later statement of a transaction (the extended protocol's own prepared statement).
      expect(
        await withTenant({ coopId: coop.id }, async (tx) => {
          await selectRows(tx, 'SELECT 1');
          return selectPrepared<{ share: number }>(tx, sql, [5]);
        }),
      ).toEqual([{ share: 20, coop: coop.id }]);
    }
  });

  it('when a list is read in one statement, then the opening, the read and the COMMIT go in one round trip; a statement after it opens anew, with the co-op set', async () => {
    const coop = await createTestCoop();
    testApp();
    const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
    await counting.agent.get('/api/animals').expect(200);
    const { res, statements } = await counting.count((agent) => agent.get('/api/animals'));
    expect(res.status).toBe(200);
    expect(statements).toHaveLength(2);
    expect(statements[1]).toMatch(/^\s*START TRANSACTION;[\s\S]*\n; COMMIT$/);

    const sql = `SELECT current_setting('app.coop_id', true) AS coop, $1::int AS n`;
    const [first, second] = await withTenant({ coopId: coop.id }, async (tx) => [
      await selectPrepared<{ coop: string; n: number }>(tx, sql, [1], { onlyStatement: true }),
      await selectRows<{ coop: string; n: number }>(tx, sql, [2]),
    ]);
    expect(first).toEqual([{ coop: coop.id, n: 1 }]);
    expect(second).toEqual([{ coop: coop.id, n: 2 }]);
    // And the pooled connections carry nothing on.
    const [outside] = await database().query<{ coop: string | null }>(`SELECT current_setting('app.coop_id', true) AS coop`, { type: QueryTypes.SELECT });
    expect(outside!.coop ?? '').toBe('');
  });

  it('when the one-statement read fails, then the transaction rolls back as any other and the connection serves the next', async () => {
    const coop = await createTestCoop();
    const handle = testApp();
    const sql = `SELECT 100 / $1::int AS share`;
    for (let i = 0; i < handle.config.databasePoolMax; i++) {
      await expect(withTenant({ coopId: coop.id }, (tx) => selectPrepared(tx, sql, [0], { onlyStatement: true }))).rejects.toThrow(/division by zero/);
      expect(await withTenant({ coopId: coop.id }, (tx) => selectPrepared(tx, sql, [4], { onlyStatement: true }))).toEqual([{ share: 25 }]);
    }
  });
});

