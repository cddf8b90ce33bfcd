import { afterAll, describe, expect, it } from 'vitest';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { linkIn, waitForMail } from '../support/mail';
import { agentFor, testApp } from '../support/test-app';

// One proxy hop, so each request's X-Forwarded-For is its client address, as behind the production proxy.
const handle = testApp({
  trustProxyHops: 1,
  signIn: { windowSeconds: 600, maxPerIp: 1000, maxFailuresPerAccount: 5, maxFailuresPerAccountAllAddresses: 6, maxResetsPerIp: 100 },
});
afterAll(async () => {
  await handle.close();
});

function signIn(from: string, body: Record<string, unknown>) {
  return agentFor(handle).post('/api/session').set('X-Forwarded-For', from).send(body);
}

async function resetPassword(email: string, from: string, password: string) {
  expect((await agentFor(handle).post('/api/password-resets').set('X-Forwarded-For', from).send({ email })).status).toBe(202);
  const token = linkIn(await waitForMail(email, { subject: /reset/i }), '/set-password?token=').searchParams.get('token')!;
  const set = await agentFor(handle).post('/api/passwords').set('X-Forwarded-For', from).send({ token, password });
  expect(set.status).toBe(200);
}

describe('sign-in throttle', () => {
  it("when an attacker fails 50 times from one address, then the attacker is refused and the owner still signs in from another", async () => {
    const coop = await createTestCoop();
    const statuses: number[] = [];
    for (let i = 0; i < 50; i++) statuses.push((await signIn('203.0.113.9', { email: coop.member.email, password: `guess-${i}-password` })).status);
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(statuses.slice(5).every((s) => s === 429)).toBe(true);
    // Refused even with the right password: the attacker's address learns nothing more.
    expect((await signIn('203.0.113.9', { email: coop.member.email, password: TEST_PASSWORD })).status).toBe(429);

    const owner = await signIn('198.51.100.7', { email: coop.member.email, password: TEST_PASSWORD });
    expect(owner.status).toBe(200);
    expect(owner.body.user.id).toBe(coop.member.id);
  });

  it('when requests are malformed (answered 400), then they do not count as failed sign-ins', async () => {
    const coop = await createTestCoop();
    for (let i = 0; i < 8; i++) {
      const malformed = await signIn('198.51.100.20', { email: coop.member.email });
      expect(malformed.status).toBe(400);
    }
    expect((await signIn('198.51.100.20', { email: coop.member.email, password: TEST_PASSWORD })).status).toBe(200);
  });

  it('when the owner has locked their own address out, then a successful password reset lets them sign in from it again', async () => {
    const coop = await createTestCoop();
    for (let i = 0; i < 5; i++) expect((await signIn('198.51.100.30', { email: coop.member.email, password: `typo-${i}-password` })).status).toBe(401);
    expect((await signIn('198.51.100.30', { email: coop.member.email, password: TEST_PASSWORD })).status).toBe(429);

    await resetPassword(coop.member.email, '198.51.100.30', 'willow-hutch-meadow-58');
    expect((await signIn('198.51.100.30', { email: coop.member.email, password: 'willow-hutch-meadow-58' })).status).toBe(200);
  });

  it('when failures from many addresses pass the account-wide limit, then new addresses are refused but an address the owner signed in from before gets through', async () => {
    const coop = await createTestCoop();
    expect((await signIn('198.51.100.40', { email: coop.member.email, password: TEST_PASSWORD })).status).toBe(200);
    // Two failures from each of three addresses: under the per-address limit, at the account-wide one.
    for (let address = 1; address <= 3; address++) {
      for (let i = 0; i < 2; i++) {
        expect((await signIn(`203.0.113.${address}`, { email: coop.member.email, password: `spray-${i}-password` })).status).toBe(401);
      }
    }
    const fromNewAddress = await signIn('192.0.2.77', { email: coop.member.email, password: TEST_PASSWORD });
    expect(fromNewAddress.status).toBe(429);
    expect(fromNewAddress.body.error.code).toBe('rate_limited');
    expect((await signIn('198.51.100.40', { email: coop.member.email, password: TEST_PASSWORD })).status).toBe(200);
    // A wrong password from the known address still counts against that address.
    expect((await signIn('198.51.100.40', { email: coop.member.email, password: 'not-it-either' })).status).toBe(401);
  });

  it('when one address sends more sign-ins than its limit, then it is refused whatever the account', async () => {
    const coop = await createTestCoop();
    const tight = testApp({ trustProxyHops: 1, signIn: { windowSeconds: 600, maxPerIp: 3, maxFailuresPerAccount: 50, maxFailuresPerAccountAllAddresses: 500, maxResetsPerIp: 10 } });
    const send = (email: string) => agentFor(tight).post('/api/session').set('X-Forwarded-For', '203.0.113.200').send({ email, password: TEST_PASSWORD });
    expect((await send(coop.member.email)).status).toBe(200);
    expect((await send(coop.admin.email)).status).toBe(200);
    expect((await send(coop.otherFarmMember.email)).status).toBe(200);
    expect((await send(coop.member.email)).status).toBe(429);
    expect((await agentFor(tight).post('/api/session').set('X-Forwarded-For', '203.0.113.201').send({ email: coop.member.email, password: TEST_PASSWORD })).status).toBe(200);
    await tight.close();
  });
});
