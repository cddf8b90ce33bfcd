import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RealtimeEvent } from '@burrowline/shared';
import { asTenant, ownerDb } from '../support/db';
import { applicationBody, createTestApplication, createTestCoop, createTestMember, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { deliveredMailsTo, linkIn, queuedMailTo, waitForMail } from '../support/mail';
import { heardEverythingSoFar, socketKit } from '../support/sockets';
import { agentFor, listeningServer, signedInAgent, testApp } from '../support/test-app';

// Rate limits out of the way for this file, except where a test sets its own.
const roomy = { linkTtlHours: 72, applyWindowSeconds: 3600, applyMaxPerIp: 10_000, applyMaxPerEmail: 10_000 };

let server: Awaited<ReturnType<typeof listeningServer>>;
const kit = socketKit(() => server.url);

beforeAll(async () => {
  server = await listeningServer({ membership: roomy });
});
afterAll(async () => {
  kit.closeAll();
  await server.close();
});

const anonymous = () => agentFor(server.handle);
const signedIn = (email: string) => signedInAgent(email, TEST_PASSWORD, server.handle);

async function setRules(coop: TestCoop, rulesText: string) {
  await asTenant(coop.id, (c) => c.query('UPDATE cooperatives SET rules_text = $2 WHERE id = $1', [coop.id, rulesText]), { commit: true });
}

async function applicationRow(coopId: string, id: string) {
  return (await asTenant(coopId, (c) => c.query('SELECT * FROM applications WHERE id = $1', [id]))).rows[0];
}

async function applicationsFrom(coopId: string, email: string): Promise<number> {
  return (await asTenant(coopId, (c) => c.query('SELECT count(*)::int AS n FROM applications WHERE lower(email) = lower($1)', [email]))).rows[0].n;
}

describe('the public application form', () => {
  it("when someone opens a co-op's form, then it shows the co-op's name and its own rules, and an unknown co-op is 404", async () => {
    const coop = await createTestCoop();
    await setRules(coop, 'Isolate every new animal for 30 days.\n\nReport sudden deaths within a day.');
    const res = await anonymous().get(`/api/apply/${coop.slug}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ name: coop.name, slug: coop.slug, rulesText: 'Isolate every new animal for 30 days.\n\nReport sudden deaths within a day.' });

    const missing = await anonymous().get('/api/apply/no-such-co-op-here');
    expect(missing.status).toBe(404);
    expect(missing.body.error.code).toBe('not_found');
    const malformed = await anonymous().get('/api/apply/Not_A_Slug!');
    expect(malformed.status).toBe(404);
    const post = await anonymous().post('/api/apply/no-such-co-op-here').send(applicationBody());
    expect(post.status).toBe(404);
  });

  it("when a breeder applies, then the application waits as pending, both e-mails go out, and only the co-op's admin room hears it live", async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    await setRules(coop, 'Members isolate new stock for 30 days before it meets the herd.');
    const admin = await kit.listen(coop.admin.email);
    const member = await kit.listen(coop.member.email);
    const foreignAdmin = await kit.listen(foreign.admin.email);

    const body = applicationBody({ diseaseLastYear: 'yes', diseaseDetails: 'Two kits lost to coccidiosis in May; treated with our vet and cleaned every hutch.' });
    const res = await anonymous().post(`/api/apply/${coop.slug}`).send(body);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ status: 'pending', email: body.email, farmName: body.farmName, coopName: coop.name });

    const row = await applicationRow(coop.id, res.body.id);
    expect(row).toMatchObject({
      coop_id: coop.id,
      status: 'pending',
      applicant_name: body.applicantName,
      farm_name: body.farmName,
      location: body.location,
      time_zone: 'America/Chicago',
      breeds_kept: ['New Zealand', 'Californian'],
      does: 6,
      bucks: 2,
      disease_last_year: true,
      sharing: ['bucks', 'processing_days'],
      rules_text_agreed: 'Members isolate new stock for 30 days before it meets the herd.',
      reviewed_at: null,
      user_id: null,
    });
    expect(row.disease_details).toMatch(/coccidiosis/);

    const received = await waitForMail(body.email, { subject: /received your application/i });
    expect(received.text).toContain(coop.name);
    const notice = await waitForMail(coop.admin.email, { subject: /New application/ });
    expect(notice.subject).toContain(body.applicantName);
    expect(notice.text).toContain(`/admin/applications/${res.body.id}`);
    expect(notice.text).toMatch(/Disease in the herd in the last year: yes/);

    await expect.poll(() => admin.heard.get(RealtimeEvent.applicationCreated), { timeout: 3000 }).toEqual([{ applicationId: res.body.id }]);
    await Promise.all([heardEverythingSoFar(member.socket, coop.member.id), heardEverythingSoFar(foreignAdmin.socket, foreign.admin.id)]);
    expect(member.heard.get(RealtimeEvent.applicationCreated)).toBeUndefined();
    expect(foreignAdmin.heard.get(RealtimeEvent.applicationCreated)).toBeUndefined();

    const audit = await asTenant(coop.id, (c) => c.query(`SELECT action, actor_user_id FROM audit_events WHERE subject_id = $1`, [res.body.id]));
    expect(audit.rows).toEqual([{ action: 'application.submitted', actor_user_id: null }]);
  });

  it('when the e-mail already belongs to an account in any co-op, then the form answers exactly as for a new address, stores nothing and tells the holder by e-mail', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const fresh = await anonymous().post(`/api/apply/${coop.slug}`).send(applicationBody({ farmName: 'Fresh Hollow' }));
    expect(fresh.status).toBe(201);
    const shape = (body: Record<string, unknown>) => ({ ...body, id: typeof body.id, email: typeof body.email, submittedAt: typeof body.submittedAt });
    for (const email of [foreign.member.email, coop.apprentice.email.toUpperCase()]) {
      const body = applicationBody({ email, farmName: 'Fresh Hollow' });
      const res = await anonymous().post(`/api/apply/${coop.slug}`).send(body);
      expect(res.status).toBe(201);
      expect(Object.keys(res.body).sort()).toEqual(Object.keys(fresh.body).sort());
      expect(shape(res.body)).toEqual(shape(fresh.body));
      expect(res.body.id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
      expect(res.body.email).toBe(email.toLowerCase());
      expect(await applicationsFrom(coop.id, email)).toBe(0);
      // The same form sent again is a replay, as for a real application: same id, no second e-mail.
      const again = await anonymous().post(`/api/apply/${coop.slug}`).send(body);
      expect(again.status).toBe(200);
      expect(again.body.id).toBe(res.body.id);
      const told = await waitForMail(email.toLowerCase(), { subject: new RegExp(`An application to ${coop.name} used your e-mail address`) });
      expect(told.text).toContain('already has a Burrowline account');
      expect((await queuedMailTo(email)).map((m) => m.subject)).toEqual([`An application to ${coop.name} used your e-mail address`]);
    }
  });

  it('when an application from the same e-mail is already pending here, then another is refused until the first is decided', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const first = await anonymous().post(`/api/apply/${coop.slug}`).send(applicationBody());
    expect(first.status).toBe(201);
    const again = await anonymous().post(`/api/apply/${coop.slug}`).send(applicationBody({ email: first.body.email.toUpperCase() }));
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already waiting for the coordinator/);
    expect(await applicationsFrom(coop.id, first.body.email)).toBe(1);

    const rejected = await admin.post(`/api/applications/${first.body.id}/rejection`).send({ reason: 'Come back once your quarantine shed is built.' });
    expect(rejected.status).toBe(200);
    const later = await anonymous().post(`/api/apply/${coop.slug}`).send(applicationBody({ email: first.body.email }));
    expect(later.status).toBe(201);
    expect(await applicationsFrom(coop.id, first.body.email)).toBe(2);
  });

  it('when the same form is sent twice with one idempotency key, even at the same moment, then the first application comes back and nothing is duplicated', async () => {
    const coop = await createTestCoop();
    const body = applicationBody();
    const [a, b] = await Promise.all([
      anonymous().post(`/api/apply/${coop.slug}`).send(body),
      anonymous().post(`/api/apply/${coop.slug}`).send(body),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 201]);
    expect(a.body.id).toBe(b.body.id);
    const third = await anonymous().post(`/api/apply/${coop.slug}`).send(body);
    expect(third.status).toBe(200);
    expect(third.body).toEqual(a.status === 201 ? a.body : b.body);
    expect(await applicationsFrom(coop.id, body.email)).toBe(1);
    await waitForMail(body.email, { subject: /received/i });
    expect(await queuedMailTo(body.email)).toHaveLength(1);
    expect(await deliveredMailsTo(body.email)).toHaveLength(1);

    const otherDetails = await anonymous().post(`/api/apply/${coop.slug}`).send({ ...body, email: `other-${randomUUID().slice(0, 6)}@example.test` });
    expect(otherDetails.status).toBe(409);
    expect(otherDetails.body.error.message).toMatch(/already sent with other details/);
  });

  it('when one address sends a flood of applications, then it is refused once over the limit and nothing more is stored', async () => {
    const coop = await createTestCoop();
    const handle = testApp({ membership: { ...roomy, applyMaxPerIp: 3, applyWindowSeconds: 60 } });
    try {
      for (let i = 0; i < 3; i++) expect((await agentFor(handle).post(`/api/apply/${coop.slug}`).send(applicationBody())).status).toBe(201);
      const flooded = applicationBody();
      const res = await agentFor(handle).post(`/api/apply/${coop.slug}`).send(flooded);
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('rate_limited');
      expect(res.body.error.message).toMatch(/Too many applications from this address/);
      expect(await applicationsFrom(coop.id, flooded.email)).toBe(0);
      const total = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM applications'));
      expect(total.rows[0].n).toBe(3);
    } finally {
      await handle.close();
    }
  });

  it('when one e-mail is sent over and over, then it is refused once over its own limit', async () => {
    const coop = await createTestCoop();
    const handle = testApp({ membership: { ...roomy, applyMaxPerEmail: 2, applyWindowSeconds: 60 } });
    try {
      const email = `persistent-${randomUUID().slice(0, 8)}@example.test`;
      expect((await agentFor(handle).post(`/api/apply/${coop.slug}`).send(applicationBody({ email }))).status).toBe(201);
      expect((await agentFor(handle).post(`/api/apply/${coop.slug}`).send(applicationBody({ email }))).status).toBe(409);
      const third = await agentFor(handle).post(`/api/apply/${coop.slug}`).send(applicationBody({ email }));
      expect(third.status).toBe(429);
      expect(third.body.error.message).toMatch(/for this e-mail address/);
      // Another address is not held back by it.
      expect((await agentFor(handle).post(`/api/apply/${coop.slug}`).send(applicationBody())).status).toBe(201);
    } finally {
      await handle.close();
    }
  });

  it('when fields are missing or wrong, then the answer is 400 with a message under each field and nothing is stored', async () => {
    const coop = await createTestCoop();
    const body = applicationBody({
      applicantName: 'Mallory\r\nBcc: everyone@example.test',
      diseaseLastYear: 'yes',
      diseaseDetails: '',
      does: -1,
    });
    const res = await anonymous()
      .post(`/api/apply/${coop.slug}`)
      .send({ ...body, agreeToRules: false, coopId: coop.id });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    const details = res.body.error.details as Record<string, string[]>;
    expect(details.applicantName?.[0]).toMatch(/on one line/);
    expect(details.agreeToRules?.[0]).toMatch(/Agree to the co-op's rules/);
    expect(details.does?.[0]).toMatch(/number of does/);
    expect(Object.values(details).flat().join(' ')).toMatch(/coopId|Unrecognized/);
    expect(await applicationsFrom(coop.id, body.email)).toBe(0);

    const noDetails = await anonymous()
      .post(`/api/apply/${coop.slug}`)
      .send(applicationBody({ diseaseLastYear: 'yes', diseaseDetails: '' }));
    expect(noDetails.status).toBe(400);
    expect(noDetails.body.error.details.diseaseDetails[0]).toMatch(/Say what it was/);
  });
});

describe("the admin's queue", () => {
  it('when the admin lists the queue, then it filters by status, searches, sorts and pages, with counts per status', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const alder = await createTestApplication(coop, { applicantName: 'Alder Quince', farmName: 'Zephyr Hutches', does: 20, bucks: 2 });
    const birch = await createTestApplication(coop, { applicantName: 'Birch Rowan', farmName: 'Yarrow Rabbitry', does: 3, bucks: 1 });
    const cedar = await createTestApplication(coop, { applicantName: 'Cedar Moss', farmName: 'Xylo Acres', does: 9, bucks: 1 });
    expect((await admin.post(`/api/applications/${cedar.id}/rejection`).send({ reason: 'Lives outside the co-op county for now.' })).status).toBe(200);

    const pending = await admin.get('/api/applications');
    expect(pending.status).toBe(200);
    expect(pending.body.items.map((i: { id: string }) => i.id)).toEqual([birch.id, alder.id]); // newest first
    expect(pending.body.counts).toEqual({ pending: 2, approved: 0, rejected: 1, withdrawn: 0 });
    expect(pending.body.total).toBe(2);
    expect(pending.body.items[0]).toMatchObject({ status: 'pending', herdSize: 4, isNew: true, email: birch.email });

    const byName = await admin.get('/api/applications').query({ status: 'all', sort: 'applicantName', dir: 'asc' });
    expect(byName.body.items.map((i: { applicantName: string }) => i.applicantName)).toEqual(['Alder Quince', 'Birch Rowan', 'Cedar Moss']);
    const byFarm = await admin.get('/api/applications').query({ status: 'all', sort: 'farmName', dir: 'asc' });
    expect(byFarm.body.items.map((i: { farmName: string }) => i.farmName)).toEqual(['Xylo Acres', 'Yarrow Rabbitry', 'Zephyr Hutches']);
    const byHerd = await admin.get('/api/applications').query({ status: 'all', sort: 'herdSize', dir: 'desc' });
    expect(byHerd.body.items.map((i: { herdSize: number }) => i.herdSize)).toEqual([22, 10, 4]);

    const search = await admin.get('/api/applications').query({ status: 'all', q: 'ROWAN' });
    expect(search.body.items.map((i: { id: string }) => i.id)).toEqual([birch.id]);
    const wildcard = await admin.get('/api/applications').query({ status: 'all', q: '%' });
    expect(wildcard.body.total).toBe(0); // a % is a character to find, not a wildcard

    const page1 = await admin.get('/api/applications').query({ status: 'all', pageSize: 10, page: 1 });
    expect(page1.body.items).toHaveLength(3);
    const page2 = await admin.get('/api/applications').query({ status: 'all', pageSize: 10, page: 2 });
    expect(page2.body).toMatchObject({ items: [], total: 3, page: 2, pageSize: 10 });

    const bad = await admin.get('/api/applications').query({ status: 'maybe', pageSize: 7 });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.details).sort()).toEqual(['pageSize', 'status']);
  });

  it('when an admin opens an application, then it shows everything the applicant wrote and stops counting as new for that admin only', async () => {
    const coop = await createTestCoop();
    const secondAdmin = await createTestMember(coop, { role: 'admin' });
    const [one, two] = [await signedIn(coop.admin.email), await signedIn(secondAdmin.email)];
    const app = await createTestApplication(coop, { phone: '+1 (555) 010-7788', sharingNotes: 'Can host a processing day.' });
    expect((await one.get('/api/applications/unread-count')).body).toEqual({ count: 1 });
    expect((await two.get('/api/applications/unread-count')).body).toEqual({ count: 1 });

    const detail = await one.get(`/api/applications/${app.id}`);
    expect(detail.status).toBe(200);
    expect(detail.body).toMatchObject({
      id: app.id,
      applicantName: app.input.applicantName,
      email: app.input.email,
      phone: '+1 (555) 010-7788',
      farmName: app.input.farmName,
      location: app.input.location,
      timeZone: 'America/Chicago',
      breedsKept: ['New Zealand', 'Californian'],
      does: 6,
      bucks: 2,
      herdSize: 8,
      quarantinePractice: app.input.quarantinePractice,
      diseaseLastYear: false,
      diseaseDetails: '',
      sharing: ['bucks', 'processing_days'],
      sharingNotes: 'Can host a processing day.',
      status: 'pending',
      reviewedBy: null,
      member: null,
      farm: null,
      isNew: true,
    });
    expect(Date.parse(detail.body.rulesAgreedAt)).toBeGreaterThan(Date.now() - 60_000);

    expect((await one.post(`/api/applications/${app.id}/views`)).status).toBe(204);
    expect((await one.post(`/api/applications/${app.id}/views`)).status).toBe(204); // twice is fine
    expect((await one.get('/api/applications/unread-count')).body).toEqual({ count: 0 });
    expect((await two.get('/api/applications/unread-count')).body).toEqual({ count: 1 });
    expect((await one.get('/api/applications')).body.items[0].isNew).toBe(false);
    expect((await two.get('/api/applications')).body.items[0].isNew).toBe(true);
    const views = await asTenant(coop.id, (c) => c.query('SELECT user_id FROM application_views WHERE application_id = $1', [app.id]));
    expect(views.rows).toEqual([{ user_id: coop.admin.id }]);
  });

  it("when members or apprentices reach for the queue, then they are refused; another co-op's admin finds nothing (404)", async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const app = await createTestApplication(coop);
    for (const person of [coop.member, coop.apprentice, coop.otherFarmMember]) {
      const agent = await signedIn(person.email);
      for (const res of [
        await agent.get('/api/applications'),
        await agent.get('/api/applications/unread-count'),
        await agent.get(`/api/applications/${app.id}`),
        await agent.post(`/api/applications/${app.id}/views`),
        await agent.post(`/api/applications/${app.id}/approval`).send({}),
        await agent.post(`/api/applications/${app.id}/rejection`).send({}),
        await agent.post(`/api/applications/${app.id}/withdrawal`).send({}),
      ]) {
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      }
    }
    const outsider = await signedIn(foreign.admin.email);
    expect((await outsider.get(`/api/applications/${app.id}`)).status).toBe(404);
    expect((await outsider.post(`/api/applications/${app.id}/views`)).status).toBe(404);
    expect((await outsider.post(`/api/applications/${app.id}/approval`).send({})).status).toBe(404);
    expect((await outsider.post(`/api/applications/${app.id}/rejection`).send({ reason: 'Not from around here at all.' })).status).toBe(404);
    const theirList = await outsider.get('/api/applications').query({ status: 'all' });
    expect(theirList.body.items.map((i: { id: string }) => i.id)).not.toContain(app.id);
    expect((await anonymous().get('/api/applications')).status).toBe(401);
    expect((await applicationRow(coop.id, app.id)).status).toBe('pending');
  });
});

describe('deciding on an application', () => {
  it('when the admin approves, then the member and farm exist at once, the applicant sets a password from a single-use link and signs in to their farm', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const adminSocket = await kit.listen(coop.admin.email);
    const neighbour = await kit.listen(coop.otherFarmMember.email);
    const body = applicationBody({ breedsKept: ['Silver Fox', 'Champagne d\'Argent'], timeZone: 'America/Denver' });
    const applied = await anonymous().post(`/api/apply/${coop.slug}`).send(body);

    const approved = await admin.post(`/api/applications/${applied.body.id}/approval`).send({});
    expect(approved.status).toBe(200);
    expect(approved.body).toMatchObject({ status: 'approved', reviewedBy: { id: coop.admin.id, name: coop.admin.name } });
    expect(approved.body.member.name).toBe(body.applicantName);
    expect(approved.body.farm.name).toBe(body.farmName);

    const row = await applicationRow(coop.id, applied.body.id);
    expect(row.status).toBe('approved');
    expect(row.reviewed_by_user_id).toBe(coop.admin.id);
    expect(Date.now() - new Date(row.reviewed_at).getTime()).toBeLessThan(60_000);
    const user = (await asTenant(coop.id, (c) => c.query('SELECT * FROM users WHERE id = $1', [row.user_id]))).rows[0];
    expect(user).toMatchObject({ email: body.email, name: body.applicantName, role: 'member', password_hash: null, farm_id: row.farm_id, disabled_at: null });
    const farm = (await asTenant(coop.id, (c) => c.query('SELECT * FROM farms WHERE id = $1', [row.farm_id]))).rows[0];
    expect(farm).toMatchObject({ coop_id: coop.id, name: body.farmName, location: body.location, time_zone: 'America/Denver', breeds_kept: ['Silver Fox', "Champagne d'Argent"] });
    const audit = await asTenant(coop.id, (c) => c.query(`SELECT actor_user_id, details FROM audit_events WHERE action = 'application.approved' AND subject_id = $1`, [row.id]));
    expect(audit.rows[0]).toMatchObject({ actor_user_id: coop.admin.id, details: { userId: user.id, farmId: farm.id } });

    await expect.poll(() => neighbour.heard.get(RealtimeEvent.farmCreated), { timeout: 3000 }).toEqual([{ farmId: farm.id }]);
    await expect.poll(() => adminSocket.heard.get(RealtimeEvent.applicationUpdated), { timeout: 3000 }).toEqual([{ applicationId: row.id, status: 'approved' }]);
    expect(neighbour.heard.get(RealtimeEvent.applicationUpdated)).toBeUndefined();

    // No password yet: nobody can sign in as the new member.
    expect((await anonymous().post('/api/session').send({ email: body.email, password: 'anything-at-all-1' })).status).toBe(401);
    const welcome = await waitForMail(body.email, { subject: /Welcome to/ });
    expect(welcome.text).toContain(body.farmName);
    const token = linkIn(welcome, '/set-password?token=').searchParams.get('token')!;
    const stored = await ownerDb((c) => c.query(`SELECT token_hash, purpose, expires_at FROM one_time_tokens WHERE user_id = $1`, [user.id]));
    expect(stored.rows).toHaveLength(1);
    expect(stored.rows[0].purpose).toBe('set_password');
    expect(stored.rows[0].token_hash).not.toBe(token);
    const hoursValid = (new Date(stored.rows[0].expires_at).getTime() - Date.now()) / 3_600_000;
    expect(hoursValid).toBeGreaterThan(71);
    expect(hoursValid).toBeLessThanOrEqual(72);

    expect((await anonymous().post('/api/passwords').send({ token, password: 'password1' })).status).toBe(400);
    const set = await anonymous().post('/api/passwords').send({ token, password: 'clover-hay-loft-2031' });
    expect(set.status).toBe(200);
    expect(set.body).toEqual({ email: body.email });
    expect((await anonymous().post('/api/passwords').send({ token, password: 'another-fine-pass-77' })).body.error.code).toBe('invalid_token');

    const newcomer = await signedInAgent(body.email, 'clover-hay-loft-2031', server.handle);
    const me = await newcomer.get('/api/me');
    expect(me.body.user).toMatchObject({ id: user.id, role: 'member', farmId: farm.id });
    const directory = await newcomer.get('/api/farms');
    const own = directory.body.farms.find((f: { id: string }) => f.id === farm.id);
    expect(own.members).toEqual([{ id: user.id, name: body.applicantName, role: 'member' }]);
    expect((await newcomer.get('/api/applications')).status).toBe(403);
  });

  it('when the admin rejects, then a reason is required, the applicant is told it by e-mail, and no account is made', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const app = await createTestApplication(coop);
    const none = await admin.post(`/api/applications/${app.id}/rejection`).send({});
    expect(none.status).toBe(400);
    expect(none.body.error.details.reason).toBeDefined();
    const short = await admin.post(`/api/applications/${app.id}/rejection`).send({ reason: 'No.' });
    expect(short.status).toBe(400);
    expect(short.body.error.details.reason[0]).toMatch(/at least 10 characters/);
    expect((await applicationRow(coop.id, app.id)).status).toBe('pending');

    const reason = 'We are full until the autumn; please apply again in September.';
    const res = await admin.post(`/api/applications/${app.id}/rejection`).send({ reason });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'rejected', decisionNote: reason, reviewedBy: { id: coop.admin.id }, member: null, farm: null });
    const row = await applicationRow(coop.id, app.id);
    expect(row).toMatchObject({ status: 'rejected', decision_note: reason, reviewed_by_user_id: coop.admin.id, user_id: null, farm_id: null });
    const accounts = await ownerDb((c) => c.query('SELECT 1 FROM users WHERE lower(email) = lower($1)', [app.email]));
    expect(accounts.rowCount).toBe(0);
    const mail = await waitForMail(app.email, { subject: /Your application to/ });
    expect(mail.text).toContain(reason);
  });

  it('when two admins decide at the same moment, then exactly one decision wins and the other is told clearly', async () => {
    const coop = await createTestCoop();
    const secondAdmin = await createTestMember(coop, { role: 'admin' });
    const [one, two] = [await signedIn(coop.admin.email), await signedIn(secondAdmin.email)];
    for (let round = 0; round < 3; round++) {
      const app = await createTestApplication(coop);
      const [approve, reject] = await Promise.all([
        one.post(`/api/applications/${app.id}/approval`).send({}),
        two.post(`/api/applications/${app.id}/rejection`).send({ reason: 'Herd health questions still open.' }),
      ]);
      expect([approve.status, reject.status].sort()).toEqual([200, 409]);
      const loser = approve.status === 409 ? approve : reject;
      expect(loser.body.error.code).toBe('conflict');
      expect(loser.body.error.message).toMatch(/already (approved|rejected) this application/);
      const row = await applicationRow(coop.id, app.id);
      expect(row.status).toBe(approve.status === 200 ? 'approved' : 'rejected');
      const accounts = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM users WHERE email = $1', [app.email]));
      const farms = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM farms WHERE name = $1', [app.farmName]));
      expect([accounts.rows[0].n, farms.rows[0].n]).toEqual(approve.status === 200 ? [1, 1] : [0, 0]);
    }

    const app = await createTestApplication(coop);
    const twice = await Promise.all([one.post(`/api/applications/${app.id}/approval`).send({}), one.post(`/api/applications/${app.id}/approval`).send({})]);
    expect(twice.map((r) => r.status).sort()).toEqual([200, 409]);
    expect(twice.find((r) => r.status === 409)!.body.error.message).toMatch(/^You already approved this application/);
    const later = await two.post(`/api/applications/${app.id}/rejection`).send({ reason: 'Changed my mind about this one.' });
    expect(later.status).toBe(409);
    expect(later.body.error.message).toContain(`${coop.admin.name} already approved this application`);
    const accounts = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM users WHERE email = $1', [app.email]));
    expect(accounts.rows[0].n).toBe(1);
  });

  it('when the farm name is already taken in the co-op, then approval asks for another name, and approving with one works', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const app = await createTestApplication(coop, { farmName: coop.farms[0]!.name.toUpperCase() });
    const clash = await admin.post(`/api/applications/${app.id}/approval`).send({});
    expect(clash.status).toBe(409);
    expect(clash.body.error.details.farmName[0]).toMatch(/already in the co-op/);
    expect((await applicationRow(coop.id, app.id)).status).toBe('pending');
    const accounts = await ownerDb((c) => c.query('SELECT 1 FROM users WHERE email = $1', [app.email]));
    expect(accounts.rowCount).toBe(0);

    const renamed = await admin.post(`/api/applications/${app.id}/approval`).send({ farmName: 'Lower Meadow Rabbitry' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.farm.name).toBe('Lower Meadow Rabbitry');
    expect(renamed.body.farmName).toBe(app.farmName); // what they applied with stays on the record
  });

  it('when the admin marks an application withdrawn, then it leaves the queue without an e-mail and the person may apply again', async () => {
    const coop = await createTestCoop();
    const admin = await signedIn(coop.admin.email);
    const app = await createTestApplication(coop);
    await waitForMail(app.email, { subject: /received/i });
    const res = await admin.post(`/api/applications/${app.id}/withdrawal`).send({ note: 'Phoned to say they are moving away.' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'withdrawn', decisionNote: 'Phoned to say they are moving away.' });
    expect((await admin.get('/api/applications')).body.items.map((i: { id: string }) => i.id)).not.toContain(app.id);
    // Only the receipt was ever queued to them; the withdrawal queued nothing.
    expect((await queuedMailTo(app.email)).map((m) => m.idempotency_key)).toEqual([`application-received:${app.id}`]);
    expect(await deliveredMailsTo(app.email)).toHaveLength(1);
    expect((await anonymous().post(`/api/apply/${coop.slug}`).send(applicationBody({ email: app.email }))).status).toBe(201);
  });
});

describe('the membership tables behind the second wall', () => {
  it('when we look at the membership tables, then each forces row-level security and the app role can never delete from them', async () => {
    const tables = await ownerDb((c) =>
      c.query(`SELECT relname, relrowsecurity, relforcerowsecurity FROM pg_class
               WHERE relname IN ('applications', 'application_views', 'invitations') ORDER BY relname`),
    );
    expect(tables.rows).toEqual([
      { relname: 'application_views', relrowsecurity: true, relforcerowsecurity: true },
      { relname: 'applications', relrowsecurity: true, relforcerowsecurity: true },
      { relname: 'invitations', relrowsecurity: true, relforcerowsecurity: true },
    ]);
    const grants = await ownerDb((c) =>
      c.query(`SELECT table_name FROM information_schema.role_table_grants
               WHERE grantee = $1 AND privilege_type = 'DELETE' AND table_name IN ('applications', 'application_views', 'invitations')`, [
        new URL(process.env.DATABASE_URL!).username,
      ]),
    );
    expect(grants.rows).toEqual([]);
  });

  it("when the app role reads applications under another co-op's tenant, then it sees none of ours", async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const app = await createTestApplication(coop);
    const seen = await asTenant(foreign.id, (c) => c.query('SELECT id FROM applications WHERE id = $1', [app.id]));
    expect(seen.rowCount).toBe(0);
    await expect(
      asTenant(foreign.id, (c) => c.query(`UPDATE applications SET status = 'approved' WHERE id = $1 RETURNING id`, [app.id])),
    ).resolves.toMatchObject({ rowCount: 0 });
    expect((await applicationRow(coop.id, app.id)).status).toBe('pending');
  });
});
