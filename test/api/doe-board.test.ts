import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays, type AgendaDto, type AnimalListDto, type BreedingRecordDto, type DoeBoardDto, type LitterDto } from '@burrowline/shared';
import { breedingPair, daysAgo, farmToday, kindlingAs, palpationAs, serviceAs } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop, type TestPerson } from '../support/factories';
import { addAnimalAs } from '../support/herd';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

/*
 * The fixture farm, worked out by hand with the default cycle settings (Merck Veterinary Manual, "Breeding
 * and Reproduction of Rabbits", 2020: palpate day 12, nest box day 28, kindling expected day 31, no kits by
 * day 32 → check; McNitt et al., Rabbit Production, 9th ed.: nest box out day 21 after kindling; breed back
 * day 35 is the farm default, one of the published 7–42 d schedules; a medium-breed doe's first service at
 * 137 days, Rabbit Production, 9th ed.). T is the farm's today; "T−9" is 9 days ago.
 *
 *   Ash    serviced T−9                                → serviced, day 9;          palpate on T−9+12 = T+3
 *   Birch  serviced T−18, palpated positive T−6        → palpated positive, day 18; nest box in on T−18+28 = T+10
 *   Cedar  serviced T−28                               → due in 31−28 = 3 days;     nest box in on T−28+28 = T (today)
 *   Dove   serviced T−33                               → day 33, no kits;           check the doe on T−33+32 = T−1 (1 day late)
 *   Elm    serviced T−43, kindled T−12 (7 alive), 1 lost chilled → nursing 6 kits, day 12; nest box out on T−12+21 = T+9
 *   Fern   serviced T−61, kindled T−30 (6 alive), 6 weaned T−1   → resting;       breed on T−30+35 = T+5
 *   Gale   serviced T−20, palpated negative T−8        → open (service empty);     breed on T−8+1 = T−7 (7 days late)
 *   Hazel  born T−60, no records                        → growing;                  first service on T−60+137 = T+77
 *
 * By what is due: Gale T−7, Dove T−1, Cedar T, Ash T+3, Fern T+5, Elm T+9, Birch T+10, Hazel T+77.
 */
interface Fixture {
  coop: TestCoop;
  ids: Record<string, string>;
  litters: Record<string, LitterDto>;
}

async function servicedDoe(person: TestPerson, name: string, servicedDaysAgo: number) {
  const pair = await breedingPair(person, { doe: name, buck: `${name}'s buck` });
  const service = await serviceAs(person, { doeId: pair.doe.id, buckId: pair.buck.id, servicedOn: daysAgo(servicedDaysAgo) });
  return { ...pair, service };
}

async function fixtureFarm(): Promise<Fixture> {
  const coop = await createTestCoop();
  const m = coop.member;
  const ids: Record<string, string> = {};
  const litters: Record<string, LitterDto> = {};
  ids.Ash = (await servicedDoe(m, 'Ash', 9)).doe.id;
  const birch = await servicedDoe(m, 'Birch', 18);
  await palpationAs(m, birch.service.id, daysAgo(6), 'positive');
  ids.Birch = birch.doe.id;
  ids.Cedar = (await servicedDoe(m, 'Cedar', 28)).doe.id;
  ids.Dove = (await servicedDoe(m, 'Dove', 33)).doe.id;
  const elm = await servicedDoe(m, 'Elm', 43);
  litters.Elm = await kindlingAs(m, { serviceId: elm.service.id, kindledOn: daysAgo(12), bornAlive: 7, bornDead: 0 });
  ids.Elm = elm.doe.id;
  const fern = await servicedDoe(m, 'Fern', 61);
  litters.Fern = await kindlingAs(m, { serviceId: fern.service.id, kindledOn: daysAgo(30), bornAlive: 6, bornDead: 0 });
  ids.Fern = fern.doe.id;
  const gale = await servicedDoe(m, 'Gale', 20);
  await palpationAs(m, gale.service.id, daysAgo(8), 'negative');
  ids.Gale = gale.doe.id;
  ids.Hazel = (await addAnimalAs(m, { sex: 'doe', name: 'Hazel', birthDate: daysAgo(60) })).id;
  // The other farm's doe is on its own board only.
  await servicedDoe(coop.otherFarmMember, 'Elsewhere', 5);
  const agent = await agentOf(m.email);
  await agent.post(`/api/litters/${litters.Elm.id}/events`).send({ kind: 'lost', on: daysAgo(10), count: 1, deathCause: 'chilled' }).expect(201);
  await agent.post(`/api/litters/${litters.Fern.id}/events`).send({ kind: 'weaned', on: daysAgo(1), count: 6 }).expect(201);
  return { coop, ids, litters };
}

let fx: Fixture;
beforeAll(async () => {
  fx = await fixtureFarm();
}, 60_000);

const T = (n: number) => addDays(farmToday(), n);

describe('the doe board', () => {
  it('when a member opens the board sorted by what is due, then each doe has the state and next job worked out by hand, in that order', async () => {
    const agent = await agentOf(fx.coop.member.email);
    const board = (await agent.get('/api/almanac/doe-board').expect(200)).body as DoeBoardDto;
    expect(board.today).toBe(farmToday());
    expect(board.total).toBe(8);
    const rows = board.items.map((d) => [d.name, d.cycle.state, d.cycle.label, d.cycle.next?.label, d.cycle.next?.on, d.cycle.next?.daysLate]);
    expect(rows).toEqual([
      ['Gale', 'open', 'Open, not bred', 'Breed', T(-7), 7],
      ['Dove', 'overdue', 'Day 33 after service, no kits recorded', 'Check the doe', T(-1), 1],
      ['Cedar', 'due', 'Due in 3 days', 'Nest box in', T(0), 0],
      ['Ash', 'serviced', 'Serviced, day 9', 'Palpate', T(3), 0],
      ['Fern', 'resting', 'Resting after weaning', 'Breed', T(5), 0],
      ['Elm', 'nursing', 'Nursing 6 kits, day 12', 'Nest box out', T(9), 0],
      ['Birch', 'palpated_positive', 'Palpated positive, day 18', 'Nest box in', T(10), 0],
      ['Hazel', 'growing', 'Growing, not yet bred', 'First service', T(77), 0],
    ]);
    expect(board.items.find((d) => d.name === 'Elm')).toMatchObject({ nursingLitterId: fx.litters.Elm!.id, cycle: { kits: 6, day: 12 } });
    expect(board.items.find((d) => d.name === 'Cedar')).toMatchObject({ openServiceId: expect.any(String), cycle: { dueInDays: 3 } });
    expect(board.counts).toEqual({ open: 1, overdue: 1, due: 1, serviced: 1, resting: 1, nursing: 1, palpated_positive: 1, growing: 1 });
  });

  it('when the board is sorted by name or paged, then the server sorts and pages it', async () => {
    const agent = await agentOf(fx.coop.member.email);
    const byName = (await agent.get('/api/almanac/doe-board').query({ sort: 'name', dir: 'desc', pageSize: 10 }).expect(200)).body as DoeBoardDto;
    expect(byName.items.map((d) => d.name)).toEqual(['Hazel', 'Gale', 'Fern', 'Elm', 'Dove', 'Cedar', 'Birch', 'Ash']);
    const page2 = (await agent.get('/api/almanac/doe-board').query({ pageSize: 10, page: 2 }).expect(200)).body as DoeBoardDto;
    expect(page2).toMatchObject({ items: [], total: 8, page: 2 });
    await agent.get('/api/almanac/doe-board').query({ sort: 'weight' }).expect(400);
  });

  it('when the herd list shows the does, then each carries the same state as the board and a buck carries none', async () => {
    const agent = await agentOf(fx.coop.member.email);
    const board = (await agent.get('/api/almanac/doe-board').expect(200)).body as DoeBoardDto;
    const herd = (await agent.get('/api/animals').query({ pageSize: 50 }).expect(200)).body as AnimalListDto;
    for (const doe of board.items) expect(herd.items.find((a) => a.id === doe.id)?.cycle).toEqual(doe.cycle);
    expect(herd.items.filter((a) => a.sex === 'buck').every((a) => a.cycle === null)).toBe(true);
  });

  it('when a doe is day 33 after service with no kits, then the attention names her and links to her', async () => {
    const agent = await agentOf(fx.coop.member.email);
    const agenda = (await agent.get('/api/almanac/tasks').expect(200)).body as AgendaDto;
    const dove = agenda.attention.find((a) => a.kind === 'kindling_overdue');
    const tattoo = (await asTenant(fx.coop.id, async (c) => (await c.query('SELECT tattoo FROM animals WHERE id = $1', [fx.ids.Dove])).rows[0].tattoo)) as string;
    expect(dove).toMatchObject({
      doe: { id: fx.ids.Dove, name: 'Dove', tattoo },
      message: `Dove (${tattoo}): day 33 after service and no kits recorded: check her; the vet may induce`,
    });
  });

  it('when the apprentice opens the board, then she reads her mentor\'s does; another farm\'s member sees only their own', async () => {
    const apprentice = (await (await agentOf(fx.coop.apprentice.email)).get('/api/almanac/doe-board').expect(200)).body as DoeBoardDto;
    expect(apprentice.total).toBe(8);
    const other = (await (await agentOf(fx.coop.otherFarmMember.email)).get('/api/almanac/doe-board').expect(200)).body as DoeBoardDto;
    expect(other.items.map((d) => [d.name, d.cycle.state])).toEqual([['Elsewhere', 'serviced']]);
  });
});

/*
 * Ivy's record, by hand: service 1 on T−120 kindled T−89 (day 31): 8 alive, 1 dead; 2 lost chilled on
 * T−85; 6 weaned on T−47 (day 42) weighing 5,400 g. Service 2 on T−60 palpated empty on T−48. Service 3 on
 * T−40 kindled T−9: 6 alive; 1 trampled on T−5.
 *   services 3, conceptions 2, conception rate 2/3 (all three have an outcome)
 *   born alive 14 (7 a litter), born dead 1, lost 3 (chilled 2, trampled 1), weaned 6 (6 a finished litter)
 *   survival to weaning 6/8 = 0.75 (the finished litter); weaning weight 5,400 / 6 = 900 g a kit
 *   kindling interval (T−9) − (T−89) = 80 days
 */
describe("a doe's breeding record", () => {
  let ivy: string;
  let coop: TestCoop;
  beforeAll(async () => {
    coop = await createTestCoop();
    const m = coop.member;
    const first = await servicedDoe(m, 'Ivy', 120);
    ivy = first.doe.id;
    const agent = await agentOf(m.email);
    const l1 = await kindlingAs(m, { serviceId: first.service.id, kindledOn: daysAgo(89), bornAlive: 8, bornDead: 1 });
    await agent.post(`/api/litters/${l1.id}/events`).send({ kind: 'lost', on: daysAgo(85), count: 2, deathCause: 'chilled', cause: 'Nest box wet after the storm' }).expect(201);
    await agent.post(`/api/litters/${l1.id}/events`).send({ kind: 'weaned', on: daysAgo(47), count: 6, weaningWeightGrams: 5400, confirm: true }).expect(201);
    const second = await serviceAs(m, { doeId: ivy, buckId: first.buck.id, servicedOn: daysAgo(60) });
    await palpationAs(m, second.id, daysAgo(48), 'negative');
    const third = await serviceAs(m, { doeId: ivy, buckId: first.buck.id, servicedOn: daysAgo(40) });
    const l2 = await kindlingAs(m, { serviceId: third.id, kindledOn: daysAgo(9), bornAlive: 6, bornDead: 0 });
    await agent.post(`/api/litters/${l2.id}/events`).send({ kind: 'lost', on: daysAgo(5), count: 1, deathCause: 'trampled' }).expect(201);
  }, 60_000);

  it('when a member opens her record, then services, litters and figures are as worked out by hand', async () => {
    const agent = await agentOf(coop.member.email);
    const record = (await agent.get(`/api/almanac/does/${ivy}/breeding-record`).expect(200)).body as BreedingRecordDto;
    expect(record.services.map((s) => [s.servicedOn, s.status, s.palpation?.result ?? null])).toEqual([
      [T(-40), 'kindled', null], [T(-60), 'empty', 'negative'], [T(-120), 'kindled', null],
    ]);
    expect(record.litters.map((l) => [l.kindledOn, l.bornAlive, l.bornDead, l.lost, l.weaned, l.onDoe, l.weaningWeightGrams, l.daysSincePrevious, l.deaths])).toEqual([
      [T(-9), 6, 0, 1, 0, 5, null, 80, { trampled: 1 }],
      [T(-89), 8, 1, 2, 6, 0, 5400, null, { chilled: 2 }],
    ]);
    expect(record.figures).toMatchObject({
      services: 3, conceptions: 2, litters: 2, bornAlive: 14, bornDead: 1, lost: 3, weaned: 6,
      bornAlivePerLitter: 7, weanedPerLitter: 6, survivalToWeaning: 0.75, weaningGramsPerKit: 900, kindlingIntervalDays: 80,
    });
    expect(record.figures.conceptionRate).toBeCloseTo(2 / 3, 10);
    expect(record.figures.deaths).toMatchObject({ chilled: 2, trampled: 1, not_nursed: 0, unknown: 0 });
    expect(record.cycle).toMatchObject({ state: 'nursing', kits: 5, day: 9 });
  });

  it('when kits are lost with a cause, then the cause is stored from the list and the loss keeps its words', async () => {
    const rows = await asTenant(coop.id, async (c) => (await c.query(
      `SELECT e.death_cause, e.cause FROM litter_events e JOIN litters l ON l.id = e.litter_id WHERE l.dam_id = $1 AND e.kind = 'lost' ORDER BY e.occurred_on`, [ivy],
    )).rows);
    expect(rows).toEqual([
      { death_cause: 'chilled', cause: 'Nest box wet after the storm' },
      { death_cause: 'trampled', cause: 'Trampled or smothered' },
    ]);
  });

  it('when a loss gives no cause, or a weaning gives one, then it is refused and nothing is written', async () => {
    const agent = await agentOf(coop.member.email);
    const litter = (await agent.get(`/api/almanac/does/${ivy}/breeding-record`).expect(200)).body.litters[0].id as string;
    const before = await asTenant(coop.id, async (c) => (await c.query('SELECT count(*)::int AS n FROM litter_events WHERE litter_id = $1', [litter])).rows[0].n);
    const noCause = await agent.post(`/api/litters/${litter}/events`).send({ kind: 'lost', on: daysAgo(1), count: 1 });
    expect(noCause.status).toBe(400);
    expect(noCause.body.error.details.cause).toBeDefined();
    const wrongKind = await agent.post(`/api/litters/${litter}/events`).send({ kind: 'weaned', on: daysAgo(1), count: 1, deathCause: 'chilled' });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.error.details.deathCause).toBeDefined();
    const badCause = await agent.post(`/api/litters/${litter}/events`).send({ kind: 'lost', on: daysAgo(1), count: 1, deathCause: 'bad luck' });
    expect(badCause.status).toBe(400);
    const after = await asTenant(coop.id, async (c) => (await c.query('SELECT count(*)::int AS n FROM litter_events WHERE litter_id = $1', [litter])).rows[0].n);
    expect(after).toBe(before);
  });

  it('when another farm asks for her record, then it is refused; a buck has none', async () => {
    const other = await agentOf(coop.otherFarmMember.email);
    expect((await other.get(`/api/almanac/does/${ivy}/breeding-record`)).status).toBe(403);
    const agent = await agentOf(coop.member.email);
    const buck = (await addAnimalAs(coop.member, { sex: 'buck', name: 'Not a doe' })).id;
    expect((await agent.get(`/api/almanac/does/${buck}/breeding-record`)).status).toBe(404);
  });
});
