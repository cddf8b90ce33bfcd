import { describe, expect, it } from 'vitest';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { linkIn, mailsTo, queuedMailTo, waitForMail } from '../support/mail';
import { agentFor, ROOMY_SIGN_IN, sessionCookieOf, signedInAgent, testApp } from '../support/test-app';
import { asTenant, ownerDb } from '../support/db';
import supertest from 'supertest';
import { CSRF_HEADER } from '@burrowline/shared';

describe('sign-in and sign-out', () => {
  it('when the password is right, then the session knows the person and /api/me answers with role and co-op', async () => {
    const coop = await createTestCoop();
    const agent = agentFor();
    const res = await agent.post('/api/session').send({ email: coop.member.email.toUpperCase(), password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ id: coop.member.id, role: 'member', farmId: coop.member.farmId });
    expect(res.body.coop).toMatchObject({ id: coop.id, slug: coop.slug });
    expect(res.headers['set-cookie']?.[0]).toMatch(/HttpOnly/);
    expect(res.headers['set-cookie']?.[0]).toMatch(/SameSite=Lax/);
    const me = await agent.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(coop.member.email);
    expect(me.body.rules.length).toBeGreaterThan(0);
    const audit = await asTenant(coop.id, (c) => c.query(`SELECT action FROM audit_events WHERE actor_user_id = $1`, [coop.member.id]));
    expect(audit.rows.map((r) => r.action)).toContain('sign_in.succeeded');
  });

  it('when the e-mail is unknown or the password wrong, then both get the same refusal', async () => {
    const coop = await createTestCoop();
    const wrong = await agentFor().post('/api/session').send({ email: coop.member.email, password: 'not-the-password' });
    const unknown = await agentFor().post('/api/session').send({ email: 'nobody-here@example.test', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('invalid_credentials');
    const audit = await asTenant(coop.id, (c) => c.query(`SELECT action FROM audit_events WHERE actor_user_id = $1`, [coop.member.id]));
    expect(audit.rows.map((r) => r.action)).toContain('sign_in.failed');
  });

  it('when signing in again, then the session id changes and the old cookie no longer works', async () => {
    const coop = await createTestCoop();
    const app = testApp().app;
    const first = await supertest(app).post('/api/session').set(CSRF_HEADER, '1').send({ email: coop.member.email, password: TEST_PASSWORD });
    const firstCookie = sessionCookieOf(first);
    const second = await supertest(app)
      .post('/api/session')
      .set(CSRF_HEADER, '1')
      .set('Cookie', firstCookie)
      .send({ email: coop.member.email, password: TEST_PASSWORD });
    const secondCookie = sessionCookieOf(second);
    expect(secondCookie).not.toBe(firstCookie);
    expect((await supertest(app).get('/api/me').set('Cookie', firstCookie)).status).toBe(401);
    expect((await supertest(app).get('/api/me').set('Cookie', secondCookie)).status).toBe(200);
  });

  it('when signing out, then the session is destroyed on the server and a replayed cookie is refused', async () => {
    const coop = await createTestCoop();
    const app = testApp().app;
    const res = await supertest(app).post('/api/session').set(CSRF_HEADER, '1').send({ email: coop.member.email, password: TEST_PASSWORD });
    const cookie = sessionCookieOf(res);
    const sid = decodeURIComponent(cookie.split('=')[1]!).slice(2).split('.')[0]!;
    expect((await ownerDb((c) => c.query('SELECT 1 FROM user_sessions WHERE sid = $1', [sid]))).rowCount).toBe(1);
    const out = await supertest(app).delete('/api/session').set(CSRF_HEADER, '1').set('Cookie', cookie);
    expect(out.status).toBe(204);
    expect((await ownerDb((c) => c.query('SELECT 1 FROM user_sessions WHERE sid = $1', [sid]))).rowCount).toBe(0);
    expect((await supertest(app).get('/api/me').set('Cookie', cookie)).status).toBe(401);
  });

  it('when an account is disabled, then it cannot sign in and its open sessions end', async () => {
    const coop = await createTestCoop();
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
    await asTenant(coop.id, (c) => c.query(`UPDATE users SET disabled_at = now(), sessions_valid_after = now() WHERE id = $1`, [coop.member.id]), { commit: true });
    expect((await agent.get('/api/me')).status).toBe(401);
    const again = await agentFor().post('/api/session').send({ email: coop.member.email, password: TEST_PASSWORD });
    expect(again.status).toBe(401);
    expect(again.body.error.code).toBe('invalid_credentials');
  });
});

describe('session lifetimes', () => {
  it('when the person is idle longer than the idle timeout, then the session has ended', async () => {
    const coop = await createTestCoop();
    const handle = testApp({ sessionIdleSeconds: 1 });
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
    expect((await agent.get('/api/me')).status).toBe(200);
    await new Promise((r) => setTimeout(r, 1600));
    expect((await agent.get('/api/me')).status).toBe(401);
    await handle.close();
  });

  it('when the session is older than the absolute lifetime, then it ends even while in use', async () => {
    const coop = await createTestCoop();
    const handle = testApp({ sessionIdleSeconds: 60, sessionAbsoluteSeconds: 3 });
    const signingIn = Date.now();
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
    const signedIn = Date.now(); // the session began between the two
    // In use every half second through its first half; then past its lifetime, however slow the machine.
    do {
      await new Promise((r) => setTimeout(r, 500));
      expect((await agent.get('/api/me')).status).toBe(200);
    } while (Date.now() - signingIn < 1500);
    await new Promise((r) => setTimeout(r, Math.max(0, signedIn + 3200 - Date.now())));
    expect((await agent.get('/api/me')).status).toBe(401);
    await handle.close();
  });
});

describe('sign-in rate limit', () => {
  it('when an account collects too many failures, then further tries are refused while another account still signs in', async () => {
    const coop = await createTestCoop();
    const handle = testApp({ signIn: { windowSeconds: 60, maxPerIp: 100, maxFailuresPerAccount: 3, maxFailuresPerAccountAllAddresses: 100, maxResetsPerIp: 10 } });
    for (let i = 0; i < 3; i++) {
      const res = await agentFor(handle).post('/api/session').send({ email: coop.member.email, password: `wrong-${i}-password` });
      expect(res.status).toBe(401);
    }
    const blocked = await agentFor(handle).post('/api/session').send({ email: coop.member.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('rate_limited');
    const other = await agentFor(handle).post('/api/session').send({ email: coop.otherFarmMember.email, password: TEST_PASSWORD });
    expect(other.status).toBe(200);
    await handle.close();
  });

  it('when one address sends too many sign-ins, then it is refused', async () => {
    const coop = await createTestCoop();
    const handle = testApp({ signIn: { windowSeconds: 60, maxPerIp: 2, maxFailuresPerAccount: 50, maxFailuresPerAccountAllAddresses: 500, maxResetsPerIp: 10 } });
    expect((await agentFor(handle).post('/api/session').send({ email: coop.member.email, password: TEST_PASSWORD })).status).toBe(200);
    expect((await agentFor(handle).post('/api/session').send({ email: coop.admin.email, password: TEST_PASSWORD })).status).toBe(200);
    expect((await agentFor(handle).post('/api/session').send({ email: coop.admin.email, password: TEST_PASSWORD })).status).toBe(429);
    await handle.close();
  });
});

describe('CSRF', () => {
  it('when a state-changing request lacks the header or comes from another origin, then it is refused and nothing changes', async () => {
    const coop = await createTestCoop();
    const app = testApp().app;
    const noHeader = await supertest(app).post('/api/session').send({ email: coop.member.email, password: TEST_PASSWORD });
    expect(noHeader.status).toBe(403);
    expect(noHeader.body.error.code).toBe('csrf_rejected');
    expect(noHeader.headers['set-cookie']).toBeUndefined();

    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const farm = (await agent.get(`/api/farms/${coop.member.farmId}`)).body;
    const crossSite = await agent
      .patch(`/api/farms/${coop.member.farmId}`)
      .set('Origin', 'https://evil.example')
      .send({ ...farm, members: undefined, id: undefined, updatedAt: undefined, name: 'Hijacked' });
    expect(crossSite.status).toBe(403);
    const after = await agent.get(`/api/farms/${coop.member.farmId}`);
    expect(after.body.name).toBe(farm.name);
  });
});

/** Waits until every queued reset request for the address has been handled by the job worker. */
async function resetRequestHandled(email: string) {
  await expect
    .poll(
      () =>
        ownerDb(async (c) =>
          (
            await c.query(
              `SELECT state FROM pgboss.job WHERE name = 'password-reset-requests' AND data->>'email' = $1
               UNION ALL SELECT state FROM pgboss.archive WHERE name = 'password-reset-requests' AND data->>'email' = $1`,
              [email],
            )
          ).rows.map((r) => r.state),
        ),
      { timeout: 10_000, interval: 100 },
    )
    .toEqual(['completed']);
}

describe('password reset', () => {
  it('when a reset is requested, then the e-mailed single-use link sets a new password and ends other sessions', async () => {
    const coop = await createTestCoop();
    const oldSession = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const req = await agentFor().post('/api/password-resets').send({ email: coop.member.email });
    expect(req.status).toBe(202);
    const mail = await waitForMail(coop.member.email, { subject: /reset/i });
    expect(mail.html).toContain('Choose a new password');
    const token = linkIn(mail, '/set-password?token=').searchParams.get('token')!;
    const stored = await ownerDb((c) => c.query('SELECT token_hash FROM one_time_tokens WHERE user_id = $1', [coop.member.id]));
    expect(stored.rowCount).toBe(1);
    expect(stored.rows[0].token_hash).not.toBe(token); // only the hash is kept

    const common = await agentFor().post('/api/passwords').send({ token, password: 'password123' });
    expect(common.status).toBe(400);
    expect(common.body.error.details.password).toBeDefined();

    const set = await agentFor().post('/api/passwords').send({ token, password: 'straw-bale-lantern-42' });
    expect(set.status).toBe(200);
    expect((await oldSession.get('/api/me')).status).toBe(401);
    expect((await agentFor().post('/api/session').send({ email: coop.member.email, password: TEST_PASSWORD })).status).toBe(401);
    expect((await agentFor().post('/api/session').send({ email: coop.member.email, password: 'straw-bale-lantern-42' })).status).toBe(200);

    const reuse = await agentFor().post('/api/passwords').send({ token, password: 'another-fine-pass-77' });
    expect(reuse.status).toBe(400);
    expect(reuse.body.error.code).toBe('invalid_token');
  });

  it('when the e-mail has no account, then the answer is the same as for a real account and no mail is sent', async () => {
    const coop = await createTestCoop();
    const email = `nobody-${Date.now()}@example.test`;
    const res = await agentFor().post('/api/password-resets').send({ email });
    const known = await agentFor().post('/api/password-resets').send({ email: coop.otherFarmMember.email });
    expect(res.status).toBe(202);
    expect({ status: res.status, body: res.body }).toEqual({ status: known.status, body: known.body });
    // The job that handles the request has finished; e-mail is queued in its transaction, so none will ever go.
    await resetRequestHandled(email);
    await resetRequestHandled(coop.otherFarmMember.email);
    expect(await queuedMailTo(email)).toEqual([]);
    expect(await mailsTo(email)).toHaveLength(0);
    expect((await queuedMailTo(coop.otherFarmMember.email)).map((m) => m.subject)).toHaveLength(1);
  });

  it('when resets are asked for known and unknown addresses in turn, then the answers take the same time (20 pairs, median difference)', async () => {
    const handle = testApp({ signIn: ROOMY_SIGN_IN });
    try {
      const coop = await createTestCoop();
      const ask = async (email: string) => {
        const started = process.hrtime.bigint();
        const res = await agentFor(handle).post('/api/password-resets').send({ email });
        expect(res.status).toBe(202);
        return Number(process.hrtime.bigint() - started) / 1e6;
      };
      await ask(coop.member.email);
      await ask(`warm-up-${Date.now()}@example.test`);
      const known: number[] = [];
      const unknown: number[] = [];
      for (let i = 0; i < 20; i += 1) {
        // Alternate which goes first, so a drift in the machine's load falls on both sides.
        if (i % 2 === 0) {
          known.push(await ask(coop.member.email));
          unknown.push(await ask(`nobody-${i}-${Date.now()}@example.test`));
        } else {
          unknown.push(await ask(`nobody-${i}-${Date.now()}@example.test`));
          known.push(await ask(coop.member.email));
        }
      }
      const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
      const differences = known.map((k, i) => k - unknown[i]!);
      console.info(`password reset timing: known median ${median(known).toFixed(1)} ms, unknown median ${median(unknown).toFixed(1)} ms, median pair difference ${median(differences).toFixed(1)} ms`);
      expect(Math.abs(median(differences))).toBeLessThan(15);
    } finally {
      await handle.close();
    }
  });

  it('when the password is too short, then the field error says so', async () => {
    const res = await agentFor().post('/api/passwords').send({ token: 'x'.repeat(43), password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.details.password[0]).toMatch(/at least 8/);
  });
});
