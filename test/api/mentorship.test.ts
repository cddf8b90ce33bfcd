import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import {
  CSRF_HEADER, RealtimeEvent, type ApprenticeDetailDto, type ChoreEntryDto, type ChoreLogDto, type GrowOutGroupDto, type MentorshipHomeDto,
  type NotificationListDto, type ReviewQueueDto,
} from '@burrowline/shared';
import { withTenant } from '../../packages/server/src/db/tenant';
import { mayTakeStation } from '../../packages/server/src/modules/mentorship/skills.service';
import { daysAgo, farmToday } from '../support/almanac';
import { grownLitterAs } from '../support/grow-out';
import { asTenant } from '../support/db';
import { createTestCoop, createTestMember, TEST_PASSWORD, type TestCoop, type TestPerson } from '../support/factories';
import { binaryParser, pdfText, testImage } from '../support/herd-files';
import { addAnimalAs } from '../support/herd';
import { apprenticeOf, growingGroupAs } from '../support/mentorship';
import { queuedMailTo } from '../support/mail';
import { heardEverythingSoFar, liveTestServer } from '../support/sockets';
import { ROOMY_SIGN_IN } from '../support/test-app';
import { dayAs, siteAs } from '../support/processing-days';

const server = liveTestServer({ signIn: ROOMY_SIGN_IN });

async function agentOf(person: TestPerson) {
  const agent = supertest.agent(server.url).set(CSRF_HEADER, '1');
  expect((await agent.post('/api/session').send({ email: person.email, password: TEST_PASSWORD })).status).toBe(200);
  return agent;
}

const bell = async (person: TestPerson) => (await (await agentOf(person)).get('/api/notifications')).body as NotificationListDto;
const groupOf = async (person: TestPerson, id: string) => (await (await agentOf(person)).get(`/api/grow-out/groups/${id}`)).body as GrowOutGroupDto;

async function weighInRows(coop: TestCoop, groupId: string) {
  return (await asTenant(coop.id, (c) => c.query('SELECT total_grams, review_state FROM weigh_ins WHERE group_id = $1 ORDER BY created_at', [groupId]))).rows;
}

describe('mentorship: the chore log and the one review queue', () => {
  it('when the apprentice logs a weighing of a group, then it waits unverified, her mentor is told live, and only acceptance puts the weight in the group\'s figures', async () => {
    const coop = await createTestCoop();
    const group = await growingGroupAs(coop.member);
    const mentorSocket = await server.kit.listen(coop.member.email);
    const apprentice = await agentOf(coop.apprentice);

    const logged = await apprentice.post('/api/mentorship/chores').send({ kind: 'weighing', minutes: 20, groupId: group.id, weighing: { totalGrams: 8 * 950, headCount: 8 }, notes: 'Scale tared first' });
    expect(logged.status).toBe(201);
    const entry = logged.body as ChoreEntryDto;
    // The farm's today, not the device's.
    expect(entry).toMatchObject({ doneOn: farmToday(), reviewState: 'pending', minutes: 20, kindLabel: 'Weighing', weighing: { totalGrams: 7600, headCount: 8 }, group: { id: group.id } });
    expect(await weighInRows(coop, group.id)).toEqual([{ total_grams: 7600, review_state: 'pending' }]);
    expect((await groupOf(coop.member, group.id)).latest).toBeNull();

    await heardEverythingSoFar(mentorSocket.socket, coop.member.id);
    expect(mentorSocket.heard.get(RealtimeEvent.mentorshipChanged)).toEqual([{ apprenticeId: coop.apprentice.id, what: 'submitted' }]);
    expect(mentorSocket.heard.get(RealtimeEvent.notificationsChanged)).toHaveLength(1);
    const told = await bell(coop.member);
    expect(told.items[0]).toMatchObject({ kind: 'mentor.entry-submitted', link: `/mentorship/review?apprenticeId=${coop.apprentice.id}` });
    expect(told.items[0]!.title).toContain('logged weighing');
    // The admin of the same farm is not her mentor: no notice.
    expect((await bell(coop.admin)).items.filter((n) => n.kind === 'mentor.entry-submitted')).toEqual([]);

    const mentor = await agentOf(coop.member);
    const queue = (await mentor.get('/api/mentorship/review')).body as ReviewQueueDto;
    expect(queue.canReview).toBe(true);
    // The weighing also ticked the litter's weigh-in task in the Almanac: a tick of hers to review too.
    expect(queue.items.map((i) => [i.kind, i.id])).toEqual([['chore', entry.id], ['task', expect.any(String)]]);
    expect(queue.items[1]!.title).toBe('Task ticked');
    expect(queue.items[0]!.chore?.weighing?.totalGrams).toBe(7600);

    // Returned with a comment: the apprentice hears it at once, the weight stays out of the figures.
    const apprenticeSocket = await server.kit.listen(coop.apprentice.email);
    expect((await mentor.post(`/api/mentorship/review/chore/${entry.id}`).send({ decision: 'returned' })).status).toBe(400);
    const returned = await mentor.post(`/api/mentorship/review/chore/${entry.id}`).send({ decision: 'returned', comment: 'Weigh them again: that is the weight with the carrier' });
    expect(returned.status).toBe(200);
    await heardEverythingSoFar(apprenticeSocket.socket, coop.apprentice.id);
    expect(apprenticeSocket.heard.get(RealtimeEvent.mentorshipChanged)).toEqual([{ apprenticeId: coop.apprentice.id, what: 'reviewed' }]);
    const backNotice = (await bell(coop.apprentice)).items[0]!;
    expect(backNotice).toMatchObject({ kind: 'mentor.entry-reviewed', link: '/mentorship/log?state=returned' });
    expect(backNotice.title).toContain('Weigh them again');
    expect(await weighInRows(coop, group.id)).toEqual([{ total_grams: 7600, review_state: 'returned' }]);
    expect((await mentor.post(`/api/mentorship/review/chore/${entry.id}`).send({ decision: 'accepted' })).status).toBe(409);

    const log = (await apprentice.get('/api/mentorship/chores?state=returned')).body as ChoreLogDto;
    expect(log.items.map((i) => [i.id, i.reviewComment])).toEqual([[entry.id, 'Weigh them again: that is the weight with the carrier']]);
    expect(log.counts).toEqual({ pending: 0, returned: 1, accepted: 0 });

    // Corrected and sent again: a new pending weigh-in; the returned one stays out of the figures.
    const stale = await apprentice.put(`/api/mentorship/chores/${entry.id}`).send({ doneOn: farmToday(), minutes: 25, notes: 'Without the carrier', weighing: { totalGrams: 8 * 900, headCount: 8 }, version: 0 });
    expect(stale.status).toBe(409);
    expect(log.items[0]!.version).toBe(1);
    const again = await apprentice.put(`/api/mentorship/chores/${entry.id}`).send({ doneOn: farmToday(), minutes: 25, notes: 'Without the carrier', weighing: { totalGrams: 8 * 900, headCount: 8 }, version: 1 });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ reviewState: 'pending', minutes: 25, weighing: { totalGrams: 7200 } });
    expect(await weighInRows(coop, group.id)).toEqual([{ total_grams: 7600, review_state: 'returned' }, { total_grams: 7200, review_state: 'pending' }]);
    expect((await apprentice.put(`/api/mentorship/chores/${entry.id}`).send({ doneOn: farmToday(), minutes: 25, version: 2, weighing: { totalGrams: 7000, headCount: 8 } })).status).toBe(409);
    expect((await bell(coop.member)).items[0]!.title).toContain('corrected');

    const accepted = await mentor.post(`/api/mentorship/review/chore/${entry.id}`).send({ decision: 'accepted' });
    expect(accepted.status).toBe(200);
    expect(await weighInRows(coop, group.id)).toEqual([{ total_grams: 7600, review_state: 'returned' }, { total_grams: 7200, review_state: 'accepted' }]);
    expect((await groupOf(coop.member, group.id)).latest).toEqual({ weighedOn: farmToday(), gramsPerHead: 900 });
    expect((await bell(coop.apprentice)).items[0]).toMatchObject({ kind: 'mentor.entry-reviewed', link: '/mentorship/log' });

    // Hours count only accepted work.
    const detail = (await mentor.get(`/api/mentorship/apprentices/${coop.apprentice.id}`)).body as ApprenticeDetailDto;
    expect(detail.minutesByKind).toEqual([{ kind: 'weighing', label: 'Weighing', minutes: 25 }]);
  });

  it('when a member is not this apprentice\'s mentor, then she sees none of her queue and may not decide; another farm\'s member is told nothing exists; the admin reads but does not decide', async () => {
    const coop = await createTestCoop();
    const farmMate = await createTestMember(coop, { farmIndex: 0 });
    const animal = await addAnimalAs(coop.member, { sex: 'doe', name: 'Clover', birthDate: daysAgo(200) });
    const apprentice = await agentOf(coop.apprentice);
    const entry = (await apprentice.post('/api/mentorship/chores').send({ kind: 'health-check', minutes: 10, animalId: animal.id, notes: 'Eyes clear' })).body as ChoreEntryDto;

    const mate = await agentOf(farmMate);
    const mateQueue = (await mate.get('/api/mentorship/review')).body as ReviewQueueDto;
    expect(mateQueue.items).toEqual([]);
    expect(mateQueue.canReview).toBe(false);
    const refused = await mate.post(`/api/mentorship/review/chore/${entry.id}`).send({ decision: 'accepted' });
    expect(refused.status).toBe(403);
    expect((await mate.post('/api/mentorship/review/accept-many').send({ items: [{ kind: 'chore', id: entry.id }] })).status).toBe(403);
    expect((await mate.get(`/api/mentorship/apprentices/${coop.apprentice.id}`)).status).toBe(403);
    expect((await mate.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/handling`).send({ state: 'practising' })).status).toBe(403);

    const other = await agentOf(coop.otherFarmMember);
    expect((await other.post(`/api/mentorship/review/chore/${entry.id}`).send({ decision: 'accepted' })).status).toBe(404);
    expect((await other.get('/api/mentorship/review')).body.items).toEqual([]);

    const admin = await agentOf(coop.admin);
    const adminQueue = (await admin.get('/api/mentorship/review')).body as ReviewQueueDto;
    expect(adminQueue.items.map((i) => i.id)).toEqual([entry.id]);
    expect(adminQueue.canReview).toBe(false);
    expect((await admin.post(`/api/mentorship/review/chore/${entry.id}`).send({ decision: 'accepted' })).status).toBe(403);
    expect((await admin.get(`/api/mentorship/apprentices/${coop.apprentice.id}`)).status).toBe(200);

    const foreign = await createTestCoop();
    expect((await (await agentOf(foreign.admin)).post(`/api/mentorship/review/chore/${entry.id}`).send({ decision: 'accepted' })).status).toBe(404);

    const state = await asTenant(coop.id, (c) => c.query('SELECT review_state FROM chore_entries WHERE id = $1', [entry.id]));
    expect(state.rows).toEqual([{ review_state: 'pending' }]);
    // The apprentice never reviews, not even her own.
    expect((await apprentice.get('/api/mentorship/review')).status).toBe(403);
    expect((await apprentice.post(`/api/mentorship/review/chore/${entry.id}`).send({ decision: 'accepted' })).status).toBe(403);
  });

  it('when the apprentice logs wrongly, then nothing is written: a member logging, a future date, an unknown chore, another farm\'s animal', async () => {
    const coop = await createTestCoop();
    const theirs = await addAnimalAs(coop.otherFarmMember, { sex: 'buck', name: 'Pepper', birthDate: daysAgo(300) });
    const apprentice = await agentOf(coop.apprentice);
    const member = await agentOf(coop.member);
    expect((await member.post('/api/mentorship/chores').send({ kind: 'feeding', minutes: 10 })).status).toBe(403);
    const future = await apprentice.post('/api/mentorship/chores').send({ kind: 'feeding', minutes: 10, doneOn: '2099-01-01' });
    expect(future.status).toBe(400);
    const unknown = await apprentice.post('/api/mentorship/chores').send({ kind: 'juggling', minutes: 10 });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details.kind).toEqual(["Choose a chore from the co-op's list"]);
    const elsewhere = await apprentice.post('/api/mentorship/chores').send({ kind: 'handling', minutes: 10, animalId: theirs.id });
    expect(elsewhere.status).toBe(400);
    const count = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM chore_entries'));
    expect(count.rows[0].n).toBe(0);
  });

  it('when the apprentice has weigh-ins, notes, litter counts and a chore waiting, then the queue holds them all oldest first, filters by kind, and accepting many enters them together', async () => {
    const coop = await createTestCoop();
    const second = await apprenticeOf(coop, coop.member);
    const animal = await addAnimalAs(coop.member, { sex: 'doe', name: 'Juniper', birthDate: daysAgo(200) });
    const { litter } = await grownLitterAs(coop.member, 20, 7);
    const apprentice = await agentOf(coop.apprentice);
    const w = await apprentice.post('/api/weigh-ins').send({ animalId: animal.id, totalGrams: 3900, weighedOn: farmToday() });
    expect(w.status).toBe(201);
    const n = await apprentice.post(`/api/animals/${animal.id}/notes`).send({ body: 'Eating well', notedOn: farmToday() });
    expect(n.status).toBe(201);
    const lost = await apprentice.post('/api/mentorship/chores').send({ kind: 'nest-box-check', minutes: 5, litterId: litter.id, litterCount: { kind: 'lost', count: 1, cause: 'Found cold' } });
    expect(lost.status).toBe(201);
    const other = await (await agentOf(second)).post('/api/mentorship/chores').send({ kind: 'cleaning', minutes: 45 });
    expect(other.status).toBe(201);

    const mentor = await agentOf(coop.member);
    const queue = (await mentor.get('/api/mentorship/review')).body as ReviewQueueDto;
    expect(queue.items.map((i) => i.kind)).toEqual(['weigh-in', 'note', 'chore', 'chore']);
    expect(queue.apprentices.map((a) => a.id).sort()).toEqual([coop.apprentice.id, second.id].sort());
    const onlyHers = (await mentor.get(`/api/mentorship/review?apprenticeId=${second.id}`)).body as ReviewQueueDto;
    expect(onlyHers.items.map((i) => i.id)).toEqual([other.body.id]);
    const notes = (await mentor.get('/api/mentorship/review?kind=note')).body as ReviewQueueDto;
    expect(notes.items.map((i) => i.id)).toEqual([n.body.id]);
    expect((await mentor.get('/api/mentorship/review?kind=gossip')).status).toBe(400);

    // Litter count pending: still counted as unverified until accepted (the litter's alive count keeps it out of the accepted figures).
    const many = await mentor.post('/api/mentorship/review/accept-many').send({ items: queue.items.map((i) => ({ kind: i.kind, id: i.id })) });
    expect(many.status).toBe(200);
    expect(many.body).toEqual({ accepted: 4 });
    const states = await asTenant(coop.id, (c) => c.query(`
      SELECT (SELECT review_state FROM weigh_ins WHERE id = $1) AS w, (SELECT review_state FROM animal_notes WHERE id = $2) AS n,
             (SELECT string_agg(review_state, ',') FROM chore_entries) AS c, (SELECT review_state FROM litter_events WHERE litter_id = $3) AS l`,
    [w.body.id, n.body.id, litter.id]));
    expect(states.rows[0]).toEqual({ w: 'accepted', n: 'accepted', c: 'accepted,accepted', l: 'accepted' });
    expect(((await mentor.get('/api/mentorship/review')).body as ReviewQueueDto).items).toEqual([]);
    // One notice per apprentice for the lot.
    expect((await bell(coop.apprentice)).items.filter((i) => i.kind === 'mentor.entry-reviewed').map((i) => i.title)).toEqual([`${coop.member.name} accepted 3 of your entries`]);
  });
});

describe('mentorship: skills and the record of skills', () => {
  it('when the mentor marks practising, signs off and withdraws with a reason, then the history keeps each, the apprentice is told, and the roster rule follows the sign-off', async () => {
    const coop = await createTestCoop();
    const apprentice = await agentOf(coop.apprentice);
    const mentor = await agentOf(coop.member);
    const entry = (await apprentice.post('/api/mentorship/chores').send({ kind: 'processing-station', minutes: 120, notes: 'Dispatch under supervision' })).body as ChoreEntryDto;
    expect((await mentor.post(`/api/mentorship/review/chore/${entry.id}`).send({ decision: 'accepted' })).status).toBe(200);

    const station = () => withTenant({ coopId: coop.id }, (tx) => mayTakeStation(tx, coop.id, coop.apprentice.id, 'dispatch'));
    expect(await station()).toMatchObject({ allowed: false });
    expect((await withTenant({ coopId: coop.id }, (tx) => mayTakeStation(tx, coop.id, coop.apprentice.id, 'weighing'))).allowed).toBe(true);

    expect((await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/dispatch`).send({ state: 'withdrawn', comment: 'x' })).status).toBe(409);
    expect((await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/dispatch`).send({ state: 'practising' })).status).toBe(200);
    expect((await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/juggling`).send({ state: 'practising' })).status).toBe(404);
    const bogus = await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/dispatch`).send({ state: 'signed-off', entryIds: [crypto.randomUUID()] });
    expect(bogus.status).toBe(400);
    const signed = await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/dispatch`).send({ state: 'signed-off', comment: 'Calm, quick and clean', entryIds: [entry.id] });
    expect(signed.status).toBe(200);
    const dispatch = (signed.body as ApprenticeDetailDto).skills.find((s) => s.key === 'dispatch')!;
    expect(dispatch).toMatchObject({ state: 'signed-off', on: farmToday(), comment: 'Calm, quick and clean', entryIds: [entry.id], dangerous: true, by: { id: coop.member.id } });
    expect(await station()).toEqual({ allowed: true, reason: null });
    expect((await bell(coop.apprentice)).items[0]).toMatchObject({ kind: 'mentor.skill-signed-off', link: '/mentorship/skills' });
    expect((await queuedMailTo(coop.apprentice.email)).map((m) => m.subject)).toContain('Signed off: Humane dispatch');

    // The apprentice reads her own skills but marks none.
    expect((await apprentice.get(`/api/mentorship/apprentices/${coop.apprentice.id}`)).status).toBe(200);
    expect((await apprentice.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/handling`).send({ state: 'signed-off' })).status).toBe(403);

    expect((await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/dispatch`).send({ state: 'withdrawn' })).status).toBe(400);
    const withdrawn = await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/dispatch`).send({ state: 'withdrawn', comment: 'Hesitated twice on the last day; practise again first' });
    expect(withdrawn.status).toBe(200);
    const after = (withdrawn.body as ApprenticeDetailDto).skills.find((s) => s.key === 'dispatch')!;
    expect(after.state).toBe('withdrawn');
    expect(after.history.map((h) => h.state)).toEqual(['practising', 'signed-off', 'withdrawn']);
    expect((await station()).allowed).toBe(false);

    // The co-op may drop the roster rule.
    const admin = await agentOf(coop.admin);
    const settings = (await admin.get('/api/mentorship/settings')).body;
    expect((await mentor.put('/api/mentorship/settings').send({ ...settings, caution: undefined })).status).toBe(403);
    const { caution: _caution, ...body } = settings;
    const saved = await admin.put('/api/mentorship/settings').send({ ...body, requireDangerousSignOff: false });
    expect(saved.status).toBe(200);
    expect(await station()).toEqual({ allowed: true, reason: null });
  });

  it('when the apprentice prints her record of skills, then the PDF names the signed-off skills with dates and mentor and her hours by kind', async () => {
    const coop = await createTestCoop();
    const apprentice = await agentOf(coop.apprentice);
    const mentor = await agentOf(coop.member);
    const a = (await apprentice.post('/api/mentorship/chores').send({ kind: 'feeding', minutes: 90 })).body as ChoreEntryDto;
    const b = (await apprentice.post('/api/mentorship/chores').send({ kind: 'cleaning', minutes: 30 })).body as ChoreEntryDto;
    await apprentice.post('/api/mentorship/chores').send({ kind: 'grooming', minutes: 600 });
    await mentor.post('/api/mentorship/review/accept-many').send({ items: [{ kind: 'chore', id: a.id }, { kind: 'chore', id: b.id }] });
    await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/weighing`).send({ state: 'signed-off', comment: 'Accurate to the gram' });
    await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/palpation`).send({ state: 'practising' });

    const res = await apprentice.get(`/api/mentorship/apprentices/${coop.apprentice.id}/record-of-skills`).buffer(true).parse(binaryParser);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const { text } = await pdfText(res.body as Buffer);
    expect(text).toContain('Record of skills');
    expect(text).toContain(`Apprentice: ${coop.apprentice.name}`);
    expect(text).toContain(`Weighing and recording (Records): signed off on ${farmToday()} by ${coop.member.name}`);
    expect(text).toContain(`Palpation, since ${farmToday()}`);
    expect(text).toContain('Feeding: 1.5 h');
    expect(text).toContain('Cleaning: 0.5 h');
    // Grooming waits for review: not in the hours.
    expect(text).not.toContain('Grooming');
    expect(text).toContain('In all: 2.0 h');
    expect((await (await agentOf(coop.otherFarmMember)).get(`/api/mentorship/apprentices/${coop.apprentice.id}/record-of-skills`)).status).toBe(403);
  });

  it('when the apprentice adds a photo to her entry, then her mentor opens it and another farm cannot', async () => {
    const coop = await createTestCoop();
    const apprentice = await agentOf(coop.apprentice);
    const entry = (await apprentice.post('/api/mentorship/chores').send({ kind: 'cleaning', minutes: 30 })).body as ChoreEntryDto;
    const image = await testImage('jpeg');
    const up = await apprentice.post(`/api/mentorship/chores/${entry.id}/photos`).attach('photos', image, { filename: 'hutch.jpg', contentType: 'image/jpeg' });
    expect(up.status).toBe(201);
    const photoId = up.body.photos[0].id as string;
    expect((await (await agentOf(coop.member)).get(`/api/photos/${photoId}`)).status).toBe(200);
    expect((await (await agentOf(coop.otherFarmMember)).get(`/api/photos/${photoId}`)).status).toBe(404);
    expect((await (await agentOf(coop.member)).post(`/api/mentorship/chores/${entry.id}/photos`).attach('photos', image, { filename: 'x.jpg', contentType: 'image/jpeg' })).status).toBe(403);
    const queue = (await (await agentOf(coop.member)).get('/api/mentorship/review')).body as ReviewQueueDto;
    expect(queue.items[0]!.chore!.photos.map((p) => p.id)).toEqual([photoId]);
    const home = (await apprentice.get('/api/mentorship')).body as MentorshipHomeDto;
    expect(home).toMatchObject({ role: 'apprentice', today: farmToday(), waiting: 1, returned: 0 });
  });

  it('when the admin edits the checklist, then a removed skill leaves the list but keeps its sign-offs for when it returns, and a removed chore can no longer be logged', async () => {
    const coop = await createTestCoop();
    const admin = await agentOf(coop.admin);
    const mentor = await agentOf(coop.member);
    const apprentice = await agentOf(coop.apprentice);
    expect((await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/tattooing`).send({ state: 'signed-off', comment: 'Clean and legible' })).status).toBe(200);
    const { caution: _caution, ...settings } = (await admin.get('/api/mentorship/settings')).body;
    const withoutTattooing = {
      ...settings,
      choreKinds: settings.choreKinds.filter((k: { key: string }) => k.key !== 'grooming'),
      skills: settings.skills.filter((k: { key: string }) => k.key !== 'tattooing'),
    };
    expect((await admin.put('/api/mentorship/settings').send({ ...withoutTattooing, skills: [...withoutTattooing.skills, withoutTattooing.skills[0]] })).status).toBe(400);
    const saved = await admin.put('/api/mentorship/settings').send(withoutTattooing);
    expect(saved.status).toBe(200);
    expect(saved.body.version).toBe(1);
    expect((await admin.put('/api/mentorship/settings').send(withoutTattooing)).status).toBe(409);
    const page = (await mentor.get(`/api/mentorship/apprentices/${coop.apprentice.id}`)).body as ApprenticeDetailDto;
    expect(page.skills.map((s) => s.key)).not.toContain('tattooing');
    expect((await apprentice.post('/api/mentorship/chores').send({ kind: 'grooming', minutes: 10 })).status).toBe(400);

    const back = await admin.put('/api/mentorship/settings').send({ ...settings, version: 1 });
    expect(back.status).toBe(200);
    const restored = ((await mentor.get(`/api/mentorship/apprentices/${coop.apprentice.id}`)).body as ApprenticeDetailDto).skills.find((s) => s.key === 'tattooing');
    expect(restored).toMatchObject({ state: 'signed-off', comment: 'Clean and legible' });
  });
});

describe('dangerous stations on a processing day', () => {
  it('when the co-op requires a sign-off, then an apprentice takes Dispatch only once her mentor signed off humane dispatch, and Packing at any time', async () => {
    const coop = await createTestCoop();
    const day = await dayAs(coop.admin, (await siteAs(coop.admin, coop)).id);
    const stationId = (name: string) => day.stations.find((s) => s.name === name)!.id;
    const mentor = await agentOf(coop.member);
    const apprentice = await agentOf(coop.apprentice);
    expect((await mentor.put(`/api/processing-days/farm-settings/${coop.farms[0]!.id}`).send({ apprenticesMayStaff: true })).status).toBe(200);
    const rosterOf = async () => (await asTenant(coop.id, (c) => c.query('SELECT station_id FROM processing_day_roster WHERE day_id = $1 AND user_id = $2', [day.id, coop.apprentice.id]))).rows;

    const refused = await apprentice.post(`/api/processing-days/${day.id}/stations/${stationId('Dispatch')}/sign-up`).send({});
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/^Humane dispatch must be signed off by the mentor before an apprentice takes this station\. Dangerous work/);
    // Her mentor cannot put her there either, nor on Evisceration (the skinning and evisceration skill).
    expect((await mentor.post(`/api/processing-days/${day.id}/stations/${stationId('Evisceration')}/sign-up`).send({ userId: coop.apprentice.id })).status).toBe(403);
    expect(await rosterOf()).toEqual([]);

    expect((await apprentice.post(`/api/processing-days/${day.id}/stations/${stationId('Packing')}/sign-up`).send({})).status).toBe(200);
    expect((await apprentice.post(`/api/processing-days/${day.id}/stations/${stationId('Packing')}/leave`).send({})).status).toBe(200);

    expect((await mentor.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/dispatch`).send({ state: 'signed-off', comment: 'Calm and quick under supervision' })).status).toBe(200);
    expect((await apprentice.post(`/api/processing-days/${day.id}/stations/${stationId('Dispatch')}/sign-up`).send({})).status).toBe(200);
    expect(await rosterOf()).toEqual([{ station_id: stationId('Dispatch') }]);
  });
});
