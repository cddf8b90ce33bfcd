import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { CSRF_HEADER, type ChoreEntryDto, type ChoreLogDto, type DoeBoardDto, type NotificationListDto, type ReviewQueueDto, type ServiceDto } from '@burrowline/shared';
import { almanacCounts, breedingPair, daysAgo, farmToday, kindlingAs, serviceAs, taskRows } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, createTestMember, TEST_PASSWORD, type TestCoop, type TestPerson } from '../support/factories';
import { liveTestServer } from '../support/sockets';
import { ROOMY_SIGN_IN } from '../support/test-app';

const server = liveTestServer({ signIn: ROOMY_SIGN_IN });

async function agentOf(person: TestPerson) {
  const agent = supertest.agent(server.url).set(CSRF_HEADER, '1');
  expect((await agent.post('/api/session').send({ email: person.email, password: TEST_PASSWORD })).status).toBe(200);
  return agent;
}

const bell = async (person: TestPerson) => (await (await agentOf(person)).get('/api/notifications')).body as NotificationListDto;

/** A doe of the mentor's farm serviced 12 days ago (palpation day) unless said, with her open service. */
async function servicedDoe(coop: TestCoop, name: string, servicedDaysAgo = 12) {
  const pair = await breedingPair(coop.member, { doe: name });
  const service = await serviceAs(coop.member, { doeId: pair.doe.id, buckId: pair.buck.id, servicedOn: daysAgo(servicedDaysAgo) });
  return { ...pair, service };
}

async function palpationRows(coop: TestCoop, serviceId: string) {
  return (await asTenant(coop.id, (c) => c.query('SELECT result, review_state, review_comment FROM palpations WHERE service_id = $1 ORDER BY created_at', [serviceId]))).rows;
}

async function serviceState(coop: TestCoop, serviceId: string) {
  const tasks = await taskRows(coop.id, { serviceId });
  const [service] = (await asTenant(coop.id, (c) => c.query('SELECT status, closed_on::text AS closed_on FROM services WHERE id = $1', [serviceId]))).rows;
  return { service, tasks: tasks.map((t) => [t.kind, t.state]) };
}

const boardRowOf = async (person: TestPerson, doeName: string) =>
  ((await (await agentOf(person)).get('/api/almanac/doe-board').query({ pageSize: 50 })).body as DoeBoardDto).items.find((d) => d.name === doeName)!;

describe('mentorship: a palpation logged as a chore', () => {
  it('when the apprentice logs a negative palpation, then it waits unverified and closes nothing; the mentor\'s accept closes the service in the same decision', async () => {
    const coop = await createTestCoop();
    const { doe, service } = await servicedDoe(coop, 'Sorrel');
    const before = await serviceState(coop, service.id);
    expect(before.service).toEqual({ status: 'open', closed_on: null });
    const boardBefore = await boardRowOf(coop.member, 'Sorrel');

    const apprentice = await agentOf(coop.apprentice);
    const logged = await apprentice.post('/api/mentorship/chores').send({ kind: 'palpation', minutes: 5, animalId: doe.id, palpation: { result: 'negative' }, notes: 'Felt nothing' });
    expect(logged.status).toBe(201);
    const entry = logged.body as ChoreEntryDto;
    expect(entry).toMatchObject({ reviewState: 'pending', kindLabel: 'Palpation', palpation: { serviceId: service.id, result: 'negative' } });

    // Pending: the service, its tasks and the doe board are as they were.
    expect(await palpationRows(coop, service.id)).toEqual([{ result: 'negative', review_state: 'pending', review_comment: null }]);
    expect(await serviceState(coop, service.id)).toEqual(before);
    const boardPending = await boardRowOf(coop.member, 'Sorrel');
    expect(boardPending.cycle).toEqual(boardBefore.cycle);
    expect(boardPending.openServiceId).toBe(service.id);
    // The service's page shows it, marked unverified.
    const detail = (await (await agentOf(coop.member)).get(`/api/services/${service.id}`)).body as ServiceDto;
    expect(detail.palpations.map((p) => [p.result, p.reviewState, p.recordedBy?.id])).toEqual([['negative', 'pending', coop.apprentice.id]]);
    expect(detail.status).toBe('open');

    // The mentor's one queue lists it as a palpation (not a second time as a chore), with its entry.
    const mentor = await agentOf(coop.member);
    const queue = (await mentor.get('/api/mentorship/review')).body as ReviewQueueDto;
    expect(queue.items.map((i) => [i.kind, i.id])).toEqual([['palpation', entry.palpation!.palpationId]]);
    expect(queue.items[0]!.chore?.id).toBe(entry.id);
    expect(queue.items[0]!.detail).toContain('Sorrel');
    expect(((await mentor.get('/api/mentorship/review?kind=palpation')).body as ReviewQueueDto).items).toHaveLength(1);
    expect(((await mentor.get('/api/mentorship/review?kind=chore')).body as ReviewQueueDto).items).toEqual([]);

    const accepted = await mentor.post(`/api/mentorship/review/palpation/${entry.palpation!.palpationId}`).send({ decision: 'accepted' });
    expect(accepted.status).toBe(200);
    expect(await palpationRows(coop, service.id)).toEqual([{ result: 'negative', review_state: 'accepted', review_comment: null }]);
    const after = await serviceState(coop, service.id);
    expect(after.service).toEqual({ status: 'empty', closed_on: farmToday() });
    expect(after.tasks).toContainEqual(['palpation', 'done']);
    expect(after.tasks).toContainEqual(['rebreed', 'open']);
    expect(after.tasks.filter(([kind]) => kind === 'kindling_due' || kind === 'nest_box_in').map(([, state]) => state)).toEqual(['skipped', 'skipped']);
    const boardAfter = await boardRowOf(coop.member, 'Sorrel');
    expect(boardAfter.openServiceId).toBeNull();
    const chore = await asTenant(coop.id, (c) => c.query('SELECT review_state FROM chore_entries WHERE id = $1', [entry.id]));
    expect(chore.rows).toEqual([{ review_state: 'accepted' }]);
    expect((await bell(coop.apprentice)).items[0]).toMatchObject({ kind: 'mentor.entry-reviewed', link: '/mentorship/log' });
    expect((await mentor.post(`/api/mentorship/review/palpation/${entry.palpation!.palpationId}`).send({ decision: 'accepted' })).status).toBe(409);
  });

  it('when the mentor returns a palpation with a comment, then the apprentice is told, it never counts, and her corrected one counts once accepted', async () => {
    const coop = await createTestCoop();
    const { doe, service } = await servicedDoe(coop, 'Bramble');
    const before = await serviceState(coop, service.id);
    const apprentice = await agentOf(coop.apprentice);
    const entry = (await apprentice.post('/api/mentorship/chores').send({ kind: 'palpation', minutes: 5, animalId: doe.id, palpation: { result: 'unsure' } })).body as ChoreEntryDto;
    const mentor = await agentOf(coop.member);
    const palpationId = entry.palpation!.palpationId;

    expect((await mentor.post(`/api/mentorship/review/palpation/${palpationId}`).send({ decision: 'returned' })).status).toBe(400);
    const returned = await mentor.post(`/api/mentorship/review/palpation/${palpationId}`).send({ decision: 'returned', comment: 'Feel again along the belly, the kits are marble-sized by now' });
    expect(returned.status).toBe(200);
    const notice = (await bell(coop.apprentice)).items[0]!;
    expect(notice).toMatchObject({ kind: 'mentor.entry-reviewed', link: '/mentorship/log?state=returned' });
    expect(notice.title).toContain('marble-sized');
    expect(await palpationRows(coop, service.id)).toEqual([{ result: 'unsure', review_state: 'returned', review_comment: 'Feel again along the belly, the kits are marble-sized by now' }]);
    expect(await serviceState(coop, service.id)).toEqual(before);
    // A returned palpation is not part of the service's record.
    expect(((await mentor.get(`/api/services/${service.id}`)).body as ServiceDto).palpations).toEqual([]);
    const log = (await apprentice.get('/api/mentorship/chores?state=returned')).body as ChoreLogDto;
    expect(log.items.map((i) => [i.id, i.reviewComment])).toEqual([[entry.id, 'Feel again along the belly, the kits are marble-sized by now']]);

    // Corrected: the result is required again, and the new one waits like the first.
    expect((await apprentice.put(`/api/mentorship/chores/${entry.id}`).send({ doneOn: farmToday(), minutes: 8, version: 1 })).status).toBe(400);
    const again = await apprentice.put(`/api/mentorship/chores/${entry.id}`).send({ doneOn: farmToday(), minutes: 8, notes: 'Two firm kits felt', palpation: { result: 'positive' }, version: 1 });
    expect(again.status).toBe(200);
    const corrected = again.body as ChoreEntryDto;
    expect(corrected.palpation).toMatchObject({ result: 'positive', serviceId: service.id });
    expect(corrected.palpation!.palpationId).not.toBe(palpationId);
    expect(await serviceState(coop, service.id)).toEqual(before);
    expect((await boardRowOf(coop.member, 'Bramble')).cycle.state).toBe('serviced');

    expect((await mentor.post(`/api/mentorship/review/palpation/${corrected.palpation!.palpationId}`).send({ decision: 'accepted' })).status).toBe(200);
    expect(await palpationRows(coop, service.id)).toEqual([
      { result: 'unsure', review_state: 'returned', review_comment: 'Feel again along the belly, the kits are marble-sized by now' },
      { result: 'positive', review_state: 'accepted', review_comment: null },
    ]);
    const after = await serviceState(coop, service.id);
    expect(after.service).toEqual({ status: 'open', closed_on: null });
    expect(after.tasks).toContainEqual(['palpation', 'done']);
    expect((await boardRowOf(coop.member, 'Bramble')).cycle.state).toBe('palpated_positive');
  });

  it('when someone other than her mentor decides a palpation, then a farm-mate and the admin are refused (403), another farm is told it does not exist, and nothing changes', async () => {
    const coop = await createTestCoop();
    const farmMate = await createTestMember(coop, { farmIndex: 0 });
    const { doe, service } = await servicedDoe(coop, 'Thistle');
    const apprentice = await agentOf(coop.apprentice);
    const entry = (await apprentice.post('/api/mentorship/chores').send({ kind: 'palpation', minutes: 5, animalId: doe.id, palpation: { result: 'negative' } })).body as ChoreEntryDto;
    const palpationId = entry.palpation!.palpationId;
    const before = await almanacCounts(coop.id);
    const url = `/api/mentorship/review/palpation/${palpationId}`;

    const mate = await agentOf(farmMate);
    expect(((await mate.get('/api/mentorship/review')).body as ReviewQueueDto).items).toEqual([]);
    expect((await mate.post(url).send({ decision: 'accepted' })).status).toBe(403);
    expect((await mate.post('/api/mentorship/review/accept-many').send({ items: [{ kind: 'palpation', id: palpationId }] })).status).toBe(403);
    expect((await (await agentOf(coop.admin)).post(url).send({ decision: 'accepted' })).status).toBe(403);
    expect((await apprentice.post(url).send({ decision: 'accepted' })).status).toBe(403);
    expect((await (await agentOf(coop.otherFarmMember)).post(url).send({ decision: 'accepted' })).status).toBe(404);
    // The palpation route of the Almanac is the farm members' own, not a way around the review.
    expect((await apprentice.post(`/api/services/${service.id}/palpations`).send({ palpatedOn: farmToday(), result: 'negative', confirm: true })).status).toBe(403);

    expect(await almanacCounts(coop.id)).toEqual(before);
    expect(await palpationRows(coop, service.id)).toEqual([{ result: 'negative', review_state: 'pending', review_comment: null }]);
    expect((await serviceState(coop, service.id)).service).toEqual({ status: 'open', closed_on: null });
  });

  it('when a palpation has no open service to go on, or its service closed before the review, then it is refused and nothing counts', async () => {
    const coop = await createTestCoop();
    const { doe: unbred } = await breedingPair(coop.member, { doe: 'Nettle' });
    const apprentice = await agentOf(coop.apprentice);
    const before = await almanacCounts(coop.id);
    const noService = await apprentice.post('/api/mentorship/chores').send({ kind: 'palpation', minutes: 5, animalId: unbred.id, palpation: { result: 'positive' } });
    expect(noService.status).toBe(400);
    expect(noService.body.error.details.palpation[0]).toContain('no open service');
    expect((await apprentice.post('/api/mentorship/chores').send({ kind: 'palpation', minutes: 5, palpation: { result: 'positive' } })).status).toBe(400);
    expect(await almanacCounts(coop.id)).toEqual(before);
    expect((await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM chore_entries'))).rows[0].n).toBe(0);

    // She kindled before the mentor got to it: accepting is a conflict; returning still works.
    const { doe, service } = await servicedDoe(coop, 'Yarrow', 31);
    const entry = (await apprentice.post('/api/mentorship/chores').send({ kind: 'palpation', minutes: 5, animalId: doe.id, palpation: { result: 'negative' } })).body as ChoreEntryDto;
    await kindlingAs(coop.member, { serviceId: service.id, kindledOn: farmToday(), bornAlive: 7, bornDead: 0 });
    const mentor = await agentOf(coop.member);
    const url = `/api/mentorship/review/palpation/${entry.palpation!.palpationId}`;
    expect((await mentor.post(url).send({ decision: 'accepted' })).status).toBe(409);
    expect(await palpationRows(coop, service.id)).toEqual([{ result: 'negative', review_state: 'pending', review_comment: null }]);
    expect((await serviceState(coop, service.id)).service.status).toBe('kindled');
    expect((await mentor.post(url).send({ decision: 'returned', comment: 'She kindled seven on day 31; nothing to palpate' })).status).toBe(200);
    expect((await palpationRows(coop, service.id))[0].review_state).toBe('returned');
  });
});
