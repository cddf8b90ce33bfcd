import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { daysAgo, farmToday } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { addAnimalAs, nextTattoo } from '../support/herd';
import { ROOMY_SIGN_IN, signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

const RACERS = 20;

/** The same request sent RACERS times at once. */
async function race(send: () => supertest.Test): Promise<supertest.Response[]> {
  return Promise.all(Array.from({ length: RACERS }, () => send()));
}

/** Every answer is one of `allowed`; a 5xx (the aborted-transaction symptom) fails with its body. */
function expectNoServerErrors(answers: supertest.Response[], allowed: number[]) {
  const unexpected = answers.filter((res) => !allowed.includes(res.status)).map((res) => `${res.status} ${JSON.stringify(res.body)}`);
  expect(unexpected).toEqual([]);
}

async function countOf(coop: TestCoop, sql: string, params: unknown[]): Promise<number> {
  return asTenant(coop.id, async (c) => Number((await c.query<{ n: string }>(`SELECT count(*) AS n FROM ${sql}`, params)).rows[0]!.n));
}

/** A repeated client-chosen id is a replay: every answer is the one record. */
function expectOneRecordAnswered(answers: supertest.Response[], id: string) {
  expectNoServerErrors(answers, [201]);
  expect(new Set(answers.map((res) => res.body.id))).toEqual(new Set([id]));
}

describe('twenty identical requests at once', () => {
  it('when a feed purchase is sent twenty times with one id, then one purchase is kept and every answer is the book with it', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const id = randomUUID();
    const body = { id, boughtOn: daysAgo(1), productName: 'Grower pellets 16%', bagGrams: 22_680, bags: 1, priceCents: 1899 };
    const answers = await race(() => agent.post('/api/feed/purchases').send(body));
    expectNoServerErrors(answers, [201]);
    for (const res of answers) expect(res.body.purchases.map((p: { id: string }) => p.id)).toEqual([id]);
    expect(await countOf(coop, 'feed_purchases WHERE id = $1', [id])).toBe(1);
  });

  it('when the calendar feed is made twenty times at once, then each renewal succeeds and the farm has exactly one live feed', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const answers = await race(() => agent.post('/api/almanac/calendar-feed'));
    expectNoServerErrors(answers, [201]);
    expect(await countOf(coop, 'calendar_feed_tokens WHERE farm_id = $1 AND revoked_at IS NULL', [coop.farms[0]!.id])).toBe(1);
    expect(await countOf(coop, 'calendar_feed_tokens WHERE farm_id = $1', [coop.farms[0]!.id])).toBe(RACERS);
  });

  it('when the admin invites one address twenty times at once, then one person and one invitation exist and the others are told why', async () => {
    const coop = await createTestCoop();
    const admin = await agentOf(coop.admin.email);
    const tag = randomUUID().slice(0, 8);
    const body = {
      name: `Ivy Invitee ${tag}`, email: `race-${tag}@example.test`, role: 'member',
      farm: { kind: 'new', name: `Thornback Holler ${tag}`, location: 'Thornback Road', timeZone: 'America/Chicago', breedsKept: ['Rex'] },
    };
    const answers = await race(() => admin.post('/api/invitations').send(body));
    expectNoServerErrors(answers, [201, 409]);
    expect(answers.filter((res) => res.status === 201)).toHaveLength(1);
    for (const refused of answers.filter((res) => res.status === 409)) expect(refused.body.error.message).not.toBe('That already exists');
    expect(await countOf(coop, 'users WHERE coop_id = $1 AND email = $2', [coop.id, body.email])).toBe(1);
    expect(await countOf(coop, 'invitations i JOIN users u ON u.id = i.user_id WHERE u.email = $1', [body.email])).toBe(1);
  });

  it('when an animal is marked for processing twenty times with one id, then one mark is kept and every answer is that mark', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const buck = await addAnimalAs(coop.member, { sex: 'buck', birthDate: daysAgo(200) });
    const id = randomUUID();
    const answers = await race(() => agent.post('/api/processing-marks').send({ id, animalId: buck.id, plannedOn: farmToday() }));
    expectOneRecordAnswered(answers, id);
    expect(await countOf(coop, 'processing_marks WHERE animal_id = $1', [buck.id])).toBe(1);
  });

  it('when an animal is marked for processing twenty times without an id, then one mark is kept and the others are told it is already marked', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const buck = await addAnimalAs(coop.member, { sex: 'buck', birthDate: daysAgo(200) });
    const answers = await race(() => agent.post('/api/processing-marks').send({ animalId: buck.id, plannedOn: farmToday() }));
    expectNoServerErrors(answers, [201, 409]);
    expect(answers.filter((res) => res.status === 201)).toHaveLength(1);
    for (const refused of answers.filter((res) => res.status === 409)) expect(refused.body.error.message).toBe(`Already marked for processing on ${farmToday()}`);
    expect(await countOf(coop, 'processing_marks WHERE animal_id = $1', [buck.id])).toBe(1);
  });

  it('when a temperature reading is sent twenty times with one id, then one reading is kept and every answer is it', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const id = randomUUID();
    const answers = await race(() => agent.post('/api/temperature-readings').send({ id, value: 31.5, unit: 'C', place: 'barn' }));
    expectOneRecordAnswered(answers, id);
    expect(await countOf(coop, 'temperature_readings WHERE id = $1', [id])).toBe(1);
  });

  it('when a weigh-in is sent twenty times with one id, then one weigh-in is kept and every answer is it', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const doe = await addAnimalAs(coop.member, { sex: 'doe', birthDate: daysAgo(200) });
    const id = randomUUID();
    const answers = await race(() => agent.post('/api/weigh-ins').send({ id, animalId: doe.id, totalGrams: 4650, weighedOn: daysAgo(1) }));
    expectOneRecordAnswered(answers, id);
    expect(await countOf(coop, 'weigh_ins WHERE id = $1', [id])).toBe(1);
  });

  it('when the admin adds one breed twenty times at once, then one breed is kept and the others are told it is in the list', async () => {
    const coop = await createTestCoop();
    const admin = await agentOf(coop.admin.email);
    const name = `Race Red ${randomUUID().slice(0, 6)}`;
    const answers = await race(() => admin.post('/api/breeds').send({ name, sizeClass: 'medium', seniorBuckMinGrams: 4000, seniorBuckMaxGrams: 4800, source: 'Our own line records' }));
    expectNoServerErrors(answers, [201, 409]);
    expect(answers.filter((res) => res.status === 201)).toHaveLength(1);
    for (const refused of answers.filter((res) => res.status === 409)) expect(refused.body.error.message).toBe('That breed is already in the list');
    expect(await countOf(coop, 'breeds WHERE coop_id = $1 AND name = $2', [coop.id, name])).toBe(1);
  });
});

describe('a client-chosen id that is already taken', () => {
  async function addWithId(agent: Agent, id: string) {
    return agent.post('/api/animals').send({ id, tattoo: nextTattoo('R'), sex: 'doe', birthDate: daysAgo(300), origin: 'arrived', arrivedOn: daysAgo(30), breederName: 'Ashbury Farm' });
  }

  it("when a member adds an animal with another co-op's animal id, then the answer is the same 409 as for an id taken in their own co-op, and nothing is written", async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const theirs = await addAnimalAs(other.member, { sex: 'doe', birthDate: daysAgo(300) });
    const neighbours = await addAnimalAs(coop.otherFarmMember, { sex: 'doe', birthDate: daysAgo(300) });

    const foreign = await addWithId(agent, theirs.id);
    const ownCoop = await addWithId(agent, neighbours.id);
    expect(ownCoop.status).toBe(409);
    expect({ status: foreign.status, body: foreign.body }).toEqual({ status: ownCoop.status, body: ownCoop.body });
    expect(await countOf(coop, 'animals WHERE coop_id = $1', [coop.id])).toBe(1);

    const fresh = await addWithId(agent, randomUUID());
    expect(fresh.status).toBe(201);
  });
});
