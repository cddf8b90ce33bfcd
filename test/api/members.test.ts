import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RealtimeEvent } from '@burrowline/shared';
import { asTenant } from '../support/db';
import { applicationBody, createTestApplication, createTestCoop, createTestMember, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { deliveredMailsTo, linkIn, waitForMail } from '../support/mail';
import { heardEverythingSoFar, socketKit } from '../support/sockets';
import { agentFor, listeningServer, signedInAgent } from '../support/test-app';

let server: Awaited<ReturnType<typeof listeningServer>>;
const kit = socketKit(() => server.url);

beforeAll(async () => {
  server = await listeningServer();
});
afterAll(async () => {
  kit.closeAll();
  await server.close();
});

const anonymous = () => agentFor(server.handle);
const signedIn = (email: string, password = TEST_PASSWORD) => signedInAgent(email, password, server.handle);
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function userRow(coopId: string, id: string) {
  return (await asTenant(coopId, (c) => c.query('SELECT * FROM users WHERE id = $1', [id]))).rows[0];
}

async function auditOf(coopId: string, subjectId: string): Promise<{ action: string; actor_user_id: string | null; details: Record<string, unknown> }[]> {
  const res = await asTenant(coopId, (c) =>
    c.query('SELECT action, actor_user_id, details FROM audit_events WHERE subject_id = $1 ORDER BY created_at', [subjectId]),
  );
  return res.rows;
}

const disconnected = (socket: { once: (event: string, cb: (reason: string) => void) => void }) =>
  new Promise<string>((resolve) => socket.once('disconnect', resolve));

function invitationBody(coop: TestCoop, overrides: Record<string, unknown> = {}) {
  const tag = randomUUID().slice(0, 8);
  return {
    name: `Ivy Invitee ${tag}`,
    email: `invitee-${tag}@example.test`,
    role: 'member',
    farm: { kind: 'new', name: `Thornback Holler ${tag}`, location: 'Thornback Road, Tamsin County', timeZone: 'America/Chicago', breedsKept: ['Rex'] },
    ...overrides,
  };
}

describe("the admin's roster", () => {
  it('when the admin opens the roster, then everyone is there with role, farm and status; members and other co-ops see none of it', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const res = await admin.get('/api/members');
    expect(res.status).toBe(200);
    const byId = new Map(res.body.items.map((m: { id: string }) => [m.id, m]));
    expect(byId.size).toBe(4);
    expect(byId.get(coop.admin.id)).toMatchObject({ role: 'admin', status: 'active', farm: { id: coop.farms[0]!.id, name: coop.farms[0]!.name } });
    expect((byId.get(coop.admin.id) as { lastSignInAt: string | null }).lastSignInAt).not.toBeNull();
    expect(byId.get(coop.apprentice.id)).toMatchObject({ role: 'apprentice', mentor: { id: coop.member.id, name: coop.member.name } });
    expect(byId.get(coop.otherFarmMember.id)).toMatchObject({ email: coop.otherFarmMember.email, farm: { id: coop.farms[1]!.id } });
    expect(JSON.stringify(res.body)).not.toMatch(/password|argon/i);

    const single = await admin.get(`/api/members/${coop.member.id}`);
    expect(single.body).toMatchObject({ id: coop.member.id, role: 'member', status: 'active', version: 0 });

    for (const person of [coop.member, coop.apprentice]) {
      const agent = await signedIn(person.email);
      expect((await agent.get('/api/members')).status).toBe(403);
      expect((await agent.get(`/api/members/${coop.admin.id}`)).status).toBe(403);
    }
    const outsider = await signedIn(foreign.admin.email);
    expect((await outsider.get(`/api/members/${coop.member.id}`)).status).toBe(404);
    const theirs = await outsider.get('/api/members');
    expect(theirs.body.items.map((m: { id: string }) => m.id)).not.toContain(coop.member.id);
  });
});

describe('changing a role', () => {
  it('when the admin makes a member an admin, then their sessions end, their socket is told and closed, and they come back with admin powers', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const target = await createTestMember(coop);
    const targetAgent = await signedIn(target.email);
    const live = await kit.listen(target.email);
    const roster = await kit.listen(coop.admin.email);
    const neighbour = await kit.listen(coop.otherFarmMember.email);
    const closed = disconnected(live.socket);
    const before = await userRow(coop.id, target.id);

    const res = await admin.patch(`/api/members/${target.id}/role`).send({ role: 'admin', version: 0 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: target.id, role: 'admin', version: 1 });
    expect(await closed).toBe('io server disconnect');
    expect(live.heard.get(RealtimeEvent.sessionEnded)).toEqual([{ reason: 'role_changed' }]);
    // The admins' roster refreshes; the roster is not a member's to hear about.
    await expect.poll(() => roster.heard.get(RealtimeEvent.memberUpdated), { timeout: 3000 }).toEqual([{ userId: target.id }]);
    await heardEverythingSoFar(neighbour.socket, coop.otherFarmMember.id);
    expect(neighbour.heard.get(RealtimeEvent.memberUpdated)).toBeUndefined();
    expect((await targetAgent.get('/api/me')).status).toBe(401);

    const after = await userRow(coop.id, target.id);
    expect(after.role).toBe('admin');
    expect(new Date(after.sessions_valid_after).getTime()).toBeGreaterThan(new Date(before.sessions_valid_after).getTime());
    expect(await auditOf(coop.id, target.id)).toEqual([
      { action: 'member.role_changed', actor_user_id: coop.admin.id, details: { name: target.name, from: 'member', to: 'admin' } },
    ]);

    const again = await signedIn(target.email);
    expect((await again.get('/api/me')).body.user.role).toBe('admin');
    expect((await again.get('/api/applications')).status).toBe(200);

    const back = await admin.patch(`/api/members/${target.id}/role`).send({ role: 'member', version: 1 });
    expect(back.status).toBe(200);
    expect((await again.get('/api/applications')).status).toBe(401);
  });

  it("when an admin changes their own role, or a member anyone's, then it is refused; another co-op's person is 404", async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const self = await admin.patch(`/api/members/${coop.admin.id}/role`).send({ role: 'member', version: 0 });
    expect(self.status).toBe(403);
    expect(self.body.error.message).toMatch(/yourself/);
    const member = await signedIn(coop.member.email);
    expect((await member.patch(`/api/members/${coop.otherFarmMember.id}/role`).send({ role: 'admin', version: 0 })).status).toBe(403);
    const outsider = await signedIn(foreign.admin.email);
    expect((await outsider.patch(`/api/members/${coop.member.id}/role`).send({ role: 'admin', version: 0 })).status).toBe(404);
    expect((await admin.patch(`/api/members/${coop.member.id}/role`).send({ role: 'apprentice', version: 0 })).status).toBe(400);
    expect((await userRow(coop.id, coop.admin.id)).role).toBe('admin');
    expect((await userRow(coop.id, coop.otherFarmMember.id)).role).toBe('member');
    expect((await userRow(coop.id, coop.member.id)).role).toBe('member');
  });

  it('when an apprentice has a farm, then they can become a member of it; without a farm, they cannot', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const promoted = await admin.patch(`/api/members/${coop.apprentice.id}/role`).send({ role: 'member', version: 0 });
    expect(promoted.status).toBe(200);
    expect(promoted.body).toMatchObject({ role: 'member', farm: { id: coop.farms[0]!.id }, mentor: null });

    const email = `farmless-${randomUUID().slice(0, 8)}@example.test`;
    const inserted = await asTenant(
      coop.id,
      (c) => c.query(`INSERT INTO users (coop_id, email, name, role, mentor_id) VALUES ($1, $2, 'Farmless Learner', 'apprentice', $3) RETURNING id`, [coop.id, email, coop.member.id]),
      { commit: true },
    );
    const farmless = inserted.rows[0].id as string;
    const refused = await admin.patch(`/api/members/${farmless}/role`).send({ role: 'member', version: 0 });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/apprentice without a farm/);
    expect((await userRow(coop.id, farmless)).role).toBe('apprentice');
  });

  it('when the change is made from an old version, then it is refused as stale and nothing changes', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const res = await admin.patch(`/api/members/${coop.member.id}/role`).send({ role: 'admin', version: 4 });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale_version');
    expect((await userRow(coop.id, coop.member.id)).role).toBe('member');
  });
});

describe('turning an account off and on', () => {
  it('when the admin turns an account off with a reason, then its sessions and sockets end at once, it cannot sign in, and turning it on restores sign-in', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const target = await createTestMember(coop);
    const targetAgent = await signedIn(target.email);
    const live = await kit.listen(target.email);
    const closed = disconnected(live.socket);

    const noReason = await admin.post(`/api/members/${target.id}/disable`).send({ version: 0 });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.details.reason).toBeDefined();
    expect((await targetAgent.get('/api/me')).status).toBe(200);

    const reason = 'Sold two untested does as breeding stock against the co-op rules.';
    const res = await admin.post(`/api/members/${target.id}/disable`).send({ reason, version: 0 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'disabled', disabledReason: reason });
    expect(await closed).toBe('io server disconnect');
    expect(live.heard.get(RealtimeEvent.sessionEnded)).toEqual([{ reason: 'disabled' }]);
    expect((await targetAgent.get('/api/me')).status).toBe(401);
    const signIn = await anonymous().post('/api/session').send({ email: target.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(401);
    expect(signIn.body.error.code).toBe('invalid_credentials');

    const row = await userRow(coop.id, target.id);
    expect(row.disabled_reason).toBe(reason);
    expect(row.disabled_at).not.toBeNull();
    expect(new Date(row.sessions_valid_after).getTime()).toBe(new Date(row.disabled_at).getTime());
    const farm = await admin.get(`/api/farms/${target.farmId}`);
    expect(farm.body.members.map((m: { id: string }) => m.id)).not.toContain(target.id);

    expect((await admin.post(`/api/members/${target.id}/disable`).send({ reason, version: 1 })).status).toBe(409);
    const on = await admin.post(`/api/members/${target.id}/enable`).send({ version: 1 });
    expect(on.status).toBe(200);
    expect(on.body).toMatchObject({ status: 'active', disabledReason: null, disabledAt: null });
    expect((await anonymous().post('/api/session').send({ email: target.email, password: TEST_PASSWORD })).status).toBe(200);
    expect((await auditOf(coop.id, target.id)).map((e) => e.action)).toEqual(['member.disabled', 'member.enabled']);
    expect((await auditOf(coop.id, target.id))[0]!.details).toMatchObject({ reason });
  });

  it('when an admin would turn off their own account, then it is refused', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const res = await admin.post(`/api/members/${coop.admin.id}/disable`).send({ reason: 'Testing what happens here.', version: 0 });
    expect(res.status).toBe(403);
    expect((await userRow(coop.id, coop.admin.id)).disabled_at).toBeNull();
  });
});

describe('inviting someone directly', () => {
  it('when the admin invites someone, then a single-use link arrives, and setting a password creates their farm and lets them in', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const neighbour = await kit.listen(coop.otherFarmMember.email);
    const body = invitationBody(coop);

    const res = await admin.post('/api/invitations').send(body);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: body.name, email: body.email, role: 'member', status: 'invited', farm: null });
    expect(res.body.invitation).toMatchObject({ farmName: body.farm.name, invitedBy: { id: coop.admin.id } });
    const user = await userRow(coop.id, res.body.id);
    expect(user).toMatchObject({ password_hash: null, farm_id: null, role: 'member' });
    const noFarmYet = await asTenant(coop.id, (c) => c.query('SELECT 1 FROM farms WHERE name = $1', [body.farm.name]));
    expect(noFarmYet.rowCount).toBe(0);

    const mail = await waitForMail(body.email, { subject: /invited you to/ });
    expect(mail.subject).toContain(coop.admin.name);
    expect(mail.text).toContain(body.farm.name);
    const token = linkIn(mail, '/set-password?token=').searchParams.get('token')!;
    expect((await anonymous().post('/api/passwords').send({ token, password: 'thistle-burrow-lamp-8' })).status).toBe(200);

    const farm = (await asTenant(coop.id, (c) => c.query('SELECT * FROM farms WHERE name = $1', [body.farm.name]))).rows[0];
    expect(farm).toMatchObject({ location: body.farm.location, breeds_kept: ['Rex'] });
    expect((await userRow(coop.id, user.id)).farm_id).toBe(farm.id);
    const invitation = (await asTenant(coop.id, (c) => c.query('SELECT * FROM invitations WHERE user_id = $1', [user.id]))).rows[0];
    expect(invitation).toMatchObject({ status: 'accepted', farm_id: farm.id, invited_by_user_id: coop.admin.id });
    await expect.poll(() => neighbour.heard.get(RealtimeEvent.farmCreated), { timeout: 3000 }).toEqual([{ farmId: farm.id }]);
    expect((await auditOf(coop.id, user.id)).map((e) => e.action)).toEqual(['invitation.sent', 'invitation.accepted']);

    const newcomer = await signedIn(body.email, 'thistle-burrow-lamp-8');
    expect((await newcomer.get('/api/me')).body.user).toMatchObject({ farmId: farm.id, role: 'member' });
    expect((await admin.get(`/api/members/${user.id}`)).body).toMatchObject({ status: 'active', invitation: null, farm: { id: farm.id } });
  });

  it("when the admin invites a partner to a farm already in the co-op, then they join that farm on accepting", async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const body = invitationBody(coop, { farm: { kind: 'existing', farmId: coop.farms[1]!.id } });
    const res = await admin.post('/api/invitations').send(body);
    expect(res.status).toBe(201);
    expect(res.body.invitation.farmName).toBe(coop.farms[1]!.name);
    const mail = await waitForMail(body.email, { subject: /invited you to/ });
    expect(mail.text).toContain(`You will join ${coop.farms[1]!.name}`);
    const token = linkIn(mail, '/set-password?token=').searchParams.get('token')!;
    expect((await anonymous().post('/api/passwords').send({ token, password: 'partner-on-the-farm-5' })).status).toBe(200);
    const farm = await admin.get(`/api/farms/${coop.farms[1]!.id}`);
    expect(farm.body.members.map((m: { name: string }) => m.name)).toContain(body.name);
    const farms = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM farms'));
    expect(farms.rows[0].n).toBe(2);
  });

  it('when the address has an account in another co-op, then the invitation answers exactly as for a new address, stores nothing and tells the holder by e-mail', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const freshBody = invitationBody(coop);
    const fresh = await admin.post('/api/invitations').send(freshBody);
    const hiddenBody = invitationBody(coop, { email: foreign.member.email.toUpperCase() });
    const hidden = await admin.post('/api/invitations').send(hiddenBody);
    expect(hidden.status).toBe(fresh.status);
    const comparable = (body: Record<string, unknown>, sent: { name: string; email: string; farm: { name: string } }) =>
      JSON.parse(
        JSON.stringify(body)
          .replace(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/g, 'ID')
          .replace(/\d{4}-\d\d-\d\dT[\d:.]+Z/g, 'TIME')
          .replaceAll(sent.email.toLowerCase(), 'EMAIL')
          .replaceAll(sent.farm.name, 'FARM')
          .replaceAll(sent.name, 'NAME'),
      );
    expect(comparable(hidden.body, hiddenBody)).toEqual(comparable(fresh.body, freshBody));
    // Nothing of it is stored in this co-op, and the other co-op's person is untouched.
    const stored = await asTenant(coop.id, async (c) => (await c.query('SELECT count(*)::int AS n FROM users WHERE lower(email) = lower($1)', [foreign.member.email])).rows[0].n);
    expect(stored).toBe(0);
    expect((await userRow(foreign.id, foreign.member.id)).coop_id).toBe(foreign.id);
    const told = await waitForMail(foreign.member.email, { subject: new RegExp(`tried to invite you to ${coop.name}`) });
    expect(told.text).toContain('already has a Burrowline account');
    expect((await auditOf(coop.id, foreign.member.id))).toEqual([]);
  });

  it('when the e-mail already has an account, a pending application, or the farm is not of this co-op, then the invitation is refused', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const taken = await admin.post('/api/invitations').send(invitationBody(coop, { email: coop.otherFarmMember.email }));
    expect(taken.status).toBe(409);
    expect(taken.body.error.details.email[0]).toMatch(new RegExp(`${coop.otherFarmMember.name} already has this e-mail address in the co-op`));
    const app = await createTestApplication(coop);
    const waiting = await admin.post('/api/invitations').send(invitationBody(coop, { email: app.email }));
    expect(waiting.status).toBe(409);
    expect(waiting.body.error.details.email[0]).toMatch(/waiting in the queue/);
    const foreignFarm = await admin.post('/api/invitations').send(invitationBody(coop, { farm: { kind: 'existing', farmId: foreign.farms[0]!.id } }));
    expect(foreignFarm.status).toBe(400);
    expect(foreignFarm.body.error.details['farm.farmId']).toBeDefined();
    const sameName = await admin.post('/api/invitations').send(
      invitationBody(coop, { farm: { kind: 'new', name: coop.farms[0]!.name, location: 'Elsewhere', timeZone: 'America/Chicago', breedsKept: [] } }),
    );
    expect(sameName.status).toBe(409);
    expect(sameName.body.error.details['farm.name']).toBeDefined();
    const member = await signedIn(coop.member.email);
    expect((await member.post('/api/invitations').send(invitationBody(coop))).status).toBe(403);
    const users = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM users'));
    expect(users.rows[0].n).toBe(4);
  });

  it('when the admin withdraws an invitation, then its link stops working, and inviting the same address again sends a fresh one', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const body = invitationBody(coop);
    const invited = await admin.post('/api/invitations').send(body);
    const first = linkIn(await waitForMail(body.email, { subject: /invited you/ }), '/set-password?token=').searchParams.get('token')!;

    const revoked = await admin.delete(`/api/members/${invited.body.id}/invitation`);
    expect(revoked.status).toBe(200);
    expect(revoked.body).toMatchObject({ status: 'disabled', invitation: null });
    const dead = await anonymous().post('/api/passwords').send({ token: first, password: 'sorrel-warren-gate-4' });
    expect(dead.status).toBe(400);
    expect(dead.body.error.code).toBe('invalid_token');
    expect((await admin.post(`/api/members/${invited.body.id}/enable`).send({ version: revoked.body.version })).status).toBe(409);

    const again = await admin.post('/api/invitations').send({ ...body, name: `${body.name} Jr` });
    expect(again.status).toBe(201);
    expect(again.body).toMatchObject({ id: invited.body.id, status: 'invited', name: `${body.name} Jr` });
    const mails = await deliveredMailsTo(body.email);
    expect(mails).toHaveLength(2);
    const second = linkIn(mails.at(-1)!, '/set-password?token=').searchParams.get('token')!;
    expect(second).not.toBe(first);
    expect((await anonymous().post('/api/passwords').send({ token: second, password: 'sorrel-warren-gate-4' })).status).toBe(200);
    const invitations = await asTenant(coop.id, (c) => c.query('SELECT status FROM invitations WHERE user_id = $1 ORDER BY created_at', [invited.body.id]));
    expect(invitations.rows.map((r) => r.status)).toEqual(['revoked', 'accepted']);
  });

  it('when a new member lost their link, then the admin sends a new one and the old one stops working', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const app = await createTestApplication(coop);
    expect((await admin.post(`/api/applications/${app.id}/approval`).send({})).status).toBe(200);
    const old = linkIn(await waitForMail(app.email, { subject: /Welcome/ }), '/set-password?token=').searchParams.get('token')!;
    const member = (await admin.get('/api/members')).body.items.find((m: { email: string }) => m.email === app.email);
    expect(member.status).toBe('awaiting_password');

    const res = await admin.post(`/api/members/${member.id}/set-password-link`);
    expect(res.status).toBe(200);
    const fresh = linkIn(await waitForMail(app.email, { subject: /Your link to sign in/ }), '/set-password?token=').searchParams.get('token')!;
    expect((await anonymous().post('/api/passwords').send({ token: old, password: 'yarrow-nest-box-11' })).status).toBe(400);
    expect((await anonymous().post('/api/passwords').send({ token: fresh, password: 'yarrow-nest-box-11' })).status).toBe(200);
    const active = await admin.post(`/api/members/${member.id}/set-password-link`);
    expect(active.status).toBe(409);
    expect(active.body.error.message).toMatch(/already set a password/);
  });
});

describe('the audit log', () => {
  it('when the admin reads the audit log, then every admin action is there newest first and filterable; members may not read it', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const target = await createTestMember(coop);
    await admin.patch(`/api/members/${target.id}/role`).send({ role: 'admin', version: 0 });
    await sleep(5);
    await admin.post(`/api/members/${target.id}/disable`).send({ reason: 'Moved away from the county.', version: 1 });
    const app = await createTestApplication(coop);
    await admin.post(`/api/applications/${app.id}/rejection`).send({ reason: 'No quarantine space on the farm yet.' });

    const members = await admin.get('/api/audit-events').query({ category: 'members' });
    expect(members.status).toBe(200);
    expect(members.body.items.map((e: { action: string }) => e.action)).toEqual(['member.disabled', 'member.role_changed']);
    expect(members.body.items[0]).toMatchObject({
      actor: { id: coop.admin.id, name: coop.admin.name },
      subjectType: 'User',
      subjectId: target.id,
      details: { reason: 'Moved away from the county.' },
    });
    const applications = await admin.get('/api/audit-events').query({ category: 'applications' });
    expect(applications.body.items.map((e: { action: string }) => e.action)).toEqual(['application.rejected', 'application.submitted']);
    const signIns = await admin.get('/api/audit-events').query({ category: 'sign_in', actorId: coop.admin.id });
    expect(signIns.body.items.every((e: { action: string }) => e.action === 'sign_in.succeeded')).toBe(true);
    const aboutTarget = await admin.get('/api/audit-events').query({ subjectId: target.id, dir: 'asc' });
    expect(aboutTarget.body.items.map((e: { action: string }) => e.action)).toEqual(['member.role_changed', 'member.disabled']);
    const paged = await admin.get('/api/audit-events').query({ pageSize: 10, page: 1 });
    expect(paged.body.total).toBeGreaterThanOrEqual(5);
    expect(paged.body.items.map((e: { createdAt: string }) => e.createdAt)).toEqual(
      [...paged.body.items.map((e: { createdAt: string }) => e.createdAt)].sort().reverse(),
    );

    const member = await signedIn(coop.member.email);
    expect((await member.get('/api/audit-events')).status).toBe(403);
    const outsider = await signedIn(foreign.admin.email);
    expect((await outsider.get('/api/audit-events').query({ subjectId: target.id })).body.total).toBe(0);
  });
});

describe("the co-op's rules", () => {
  it('when the admin edits the rules, then applicants see and agree to the new text; members may not edit; a stale edit is refused', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const member = await signedIn(coop.member.email);
    const current = await member.get('/api/coop');
    expect(current.status).toBe(200);
    expect(current.body).toMatchObject({ id: coop.id, slug: coop.slug, rulesText: '', version: 0 });

    const rulesText = 'Isolate every new or returning animal for 30 days.\nReport sudden deaths to the coordinator within a day.';
    expect((await member.patch('/api/coop').send({ rulesText, version: 0 })).status).toBe(403);
    const saved = await admin.patch('/api/coop').send({ rulesText, version: 0 });
    expect(saved.status).toBe(200);
    expect(saved.body).toMatchObject({ rulesText, version: 1 });
    const stale = await admin.patch('/api/coop').send({ rulesText: `${rulesText}\nA third rule.`, version: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_version');

    expect((await anonymous().get(`/api/apply/${coop.slug}`)).body.rulesText).toBe(rulesText);
    const application = await anonymous().post(`/api/apply/${coop.slug}`).send(applicationBody());
    const agreed = await asTenant(coop.id, (c) => c.query('SELECT rules_text_agreed FROM applications WHERE id = $1', [application.body.id]));
    expect(agreed.rows[0].rules_text_agreed).toBe(rulesText);
    const history = await asTenant(coop.id, (c) => c.query(`SELECT actor_user_id, changes FROM record_changes WHERE table_name = 'cooperatives' AND record_id = $1`, [coop.id]));
    expect(history.rows).toEqual([{ actor_user_id: coop.admin.id, changes: { rulesText: ['', rulesText] } }]);
    expect((await auditOf(coop.id, coop.id)).map((e) => e.action)).toEqual(['coop.rules_updated']);
  });
});
