import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays, RealtimeEvent, type AgendaDto, type AlmanacTaskDto, type LitterDto } from '@burrowline/shared';
import { almanacCounts, breedingPair, daysAgo, farmToday, fosteringAs, kindlingAs, litterAs, serviceAs, taskRows } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { nextTattoo } from '../support/herd';
import { liveTestServer } from '../support/sockets';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

const byKey = (tasks: AlmanacTaskDto[]) => Object.fromEntries(tasks.map((t) => [t.key, t]));

describe('kindling: the litter and the plan from the real date', () => {
  it('when she kindles while her nest box task is days late, then the kindling closes it and the agenda no longer calls it late', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member, { doe: 'Bramble' });
    const servicedOn = daysAgo(33);
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn });
    const agent = await agentOf(coop.member.email);
    const agendaOf = async () => (await agent.get('/api/almanac/tasks').query({ from: servicedOn, to: farmToday() }).expect(200)).body as AgendaDto;
    const lateBefore = (await agendaOf()).tasks.find((t) => t.kind === 'nest_box_in' && t.serviceId === service.id);
    expect(lateBefore).toMatchObject({ state: 'open', timing: 'overdue', daysLate: 5 });

    await agent.post('/api/litters').send({ serviceId: service.id, kindledOn: farmToday(), bornAlive: 7, bornDead: 0 }).expect(201);
    const nestBox = (await taskRows(coop.id, { serviceId: service.id })).find((r) => r.kind === 'nest_box_in');
    expect(nestBox).toMatchObject({ state: 'skipped', state_reason: 'Kindled on day 33; the nest box task closes with the kindling' });
    const after = (await agendaOf()).tasks.filter((t) => t.serviceId === service.id && (t.timing === 'overdue' || t.timing === 'due_today'));
    expect(after).toEqual([]);
  });

  it('when she kindles on day 30, then the service closes and nest box out, weigh-ins, weaning and breed-back count from that day', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member, { doe: 'Willow' });
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(30) });
    const agent = await agentOf(coop.member.email);
    const kindledOn = farmToday();
    const res = await agent.post('/api/litters').send({ serviceId: service.id, kindledOn, bornAlive: 9, bornDead: 1, notes: 'Good nest' });
    expect(res.status).toBe(201);
    const litter = res.body as LitterDto;
    expect(litter).toMatchObject({
      dam: { id: doe.id }, sire: { id: buck.id }, serviceId: service.id, servicedOn: daysAgo(30), kindledOn, bornAlive: 9, bornDead: 1,
      onDoe: 9, weaned: 0, status: 'nursing', summary: { totalBorn: 10, raised: 9 }, countHistory: [{ on: kindledOn, count: 9 }],
    });
    // Rabbit Production, 9th ed.: nest box out 15–21 d (21 here); Texas Extension: weaning 4–8 weeks (42 d); breed back 35 d.
    const tasks = byKey(litter.tasks);
    expect(tasks.nest_box_out!.dueOn).toBe(addDays(kindledOn, 21));
    expect(['weigh_in:28', 'weigh_in:42', 'weigh_in:56', 'weigh_in:70'].map((k) => tasks[k]!.dueOn)).toEqual([28, 42, 56, 70].map((d) => addDays(kindledOn, d)));
    expect(tasks.weaning!.dueOn).toBe(addDays(kindledOn, 42));
    expect(tasks.breed_back!.dueOn).toBe(addDays(kindledOn, 35));

    const serviceRows = Object.fromEntries((await taskRows(coop.id, { serviceId: service.id })).map((r) => [r.kind, r]));
    expect(serviceRows.kindling_due).toMatchObject({ state: 'done', done_on: kindledOn });
    expect(serviceRows.kindling_overdue).toMatchObject({ state: 'skipped', state_reason: 'Kindled on day 30' });
    expect(serviceRows.palpation).toMatchObject({ state: 'skipped', state_reason: 'Kindled on day 30 before a palpation was recorded' });
    const db = await asTenant(coop.id, async (c) => ({
      service: (await c.query('SELECT status, closed_on::text AS closed_on, litter_id FROM services WHERE id = $1', [service.id])).rows[0],
      litter: (await c.query('SELECT dam_id, sire_id, born_alive, born_dead, farm_id FROM litters WHERE id = $1', [litter.id])).rows[0],
    }));
    expect(db.service).toEqual({ status: 'kindled', closed_on: kindledOn, litter_id: litter.id });
    expect(db.litter).toEqual({ dam_id: doe.id, sire_id: buck.id, born_alive: 9, born_dead: 1, farm_id: coop.farms[0]!.id });
    // A second kindling of the same service is refused.
    const again = await agent.post('/api/litters').send({ serviceId: service.id, kindledOn, bornAlive: 2, bornDead: 0 });
    expect(again.status).toBe(400);
    expect(again.body.error.details.serviceId).toEqual(['That service already has its litter']);
  });

  it('when she kindles late on day 33, then everything after the kindling follows the real date (Merck: 29–35 d window)', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member);
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(33) });
    const litter = await kindlingAs(coop.member, { serviceId: service.id, kindledOn: farmToday(), bornAlive: 7, bornDead: 0 });
    const tasks = byKey(litter.tasks);
    expect(tasks.weaning!.dueOn).toBe(addDays(farmToday(), 42));
    expect(tasks.nest_box_out!.dueOn).toBe(addDays(farmToday(), 21));
    const serviceRows = Object.fromEntries((await taskRows(coop.id, { serviceId: service.id })).map((r) => [r.kind, r]));
    expect(serviceRows.kindling_due).toMatchObject({ state: 'done' });
    expect(serviceRows.kindling_overdue).toMatchObject({ state: 'skipped', state_reason: 'Kindled on day 33' });
  });

  it('when a kindling comes before its service or more than 40 days after, is in the future, or has negative counts, then clear errors and nothing written', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member);
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(45) });
    const agent = await agentOf(coop.member.email);
    const before = await almanacCounts(coop.id);
    const early = await agent.post('/api/litters').send({ serviceId: service.id, kindledOn: daysAgo(46), bornAlive: 8, bornDead: 0 });
    expect(early.status).toBe(400);
    expect(early.body.error.details.kindledOn).toEqual([`The kindling on ${daysAgo(46)} is before its service on ${daysAgo(45)}`]);
    const late = await agent.post('/api/litters').send({ serviceId: service.id, kindledOn: daysAgo(3), bornAlive: 8, bornDead: 0 });
    expect(late.status).toBe(400);
    expect(late.body.error.details.kindledOn).toEqual(['The kindling is 42 days after the service; more than 40 days cannot be the same pregnancy. Record a new service']);
    const future = await agent.post('/api/litters').send({ serviceId: service.id, kindledOn: addDays(farmToday(), 1), bornAlive: 8, bornDead: 0 });
    expect(future.status).toBe(400);
    expect(future.body.error.details.kindledOn[0]).toMatch(/is in the future \(today is /);
    const negative = await agent.post('/api/litters').send({ serviceId: service.id, kindledOn: daysAgo(14), bornAlive: -1, bornDead: 0 });
    expect(negative.status).toBe(400);
    expect(negative.body.error.details.bornAlive).toEqual(['Born alive cannot be negative']);
    // Outside the 29–35 day window (day 31 here would pass): day 38 asks to check the service date.
    const outside = await agent.post('/api/litters').send({ serviceId: service.id, kindledOn: daysAgo(7), bornAlive: 8, bornDead: 0 });
    expect(outside.status).toBe(422);
    expect(outside.body.error.details.kindledOn[0]).toMatch(/^Day 38 after the service is outside the kindling window \(days 29–35\)/);
    expect(await almanacCounts(coop.id)).toEqual(before);
  });
});

describe('kit counts: derived from dated events, never typed in', () => {
  it('when kits are lost, culled and weaned, then the count follows the events; weaning more than are with the doe is refused with the sum', async () => {
    const coop = await createTestCoop();
    const { litter } = await litterAs(coop.member, { servicedDaysAgo: 75, kindledDaysAgo: 44, bornAlive: 8, bornDead: 1 });
    const agent = await agentOf(coop.member.email);
    const noCause = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'lost', on: daysAgo(40), count: 1 });
    expect(noCause.status).toBe(400);
    expect(noCause.body.error.details.cause).toEqual(['Say what happened (cause unknown is a cause)']);
    expect((await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'lost', on: daysAgo(40), count: 1, cause: 'Chilled outside the nest' })).status).toBe(201);
    expect((await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'culled', on: daysAgo(30), count: 1, cause: 'Runt, not thriving' })).status).toBe(201);

    const before = await almanacCounts(coop.id);
    const tooMany = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'weaned', on: daysAgo(2), count: 7 });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.details.count).toEqual([
      `Weaned 7 kits on ${daysAgo(2)}, but only 6 kits were with the doe (born alive 8 + fostered in 0 − fostered out 0 − lost 1 − culled 1 − weaned 0)`,
    ]);
    const beforeKindling = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'lost', on: daysAgo(50), count: 1, cause: 'x' });
    expect(beforeKindling.status).toBe(400);
    expect(beforeKindling.body.error.details.on[0]).toMatch(/before the kindling/);
    const future = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'weaned', on: addDays(farmToday(), 1), count: 1 });
    expect(future.status).toBe(400);
    expect(future.body.error.details.on[0]).toMatch(/a date in the future/);
    const negative = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'weaned', on: daysAgo(2), count: -2 });
    expect(negative.status).toBe(400);
    expect(await almanacCounts(coop.id)).toEqual(before);

    const weaned = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'weaned', on: daysAgo(2), count: 6 });
    expect(weaned.status).toBe(201);
    const body = weaned.body as LitterDto;
    expect(body).toMatchObject({ onDoe: 0, weaned: 6, status: 'weaned', summary: { lost: 1, culled: 1, weaned: 6, raised: 8, survivalToWeaning: 0.75, lossesByCause: { 'chilled outside the nest': 1 } } });
    expect(body.countHistory).toEqual([{ on: daysAgo(44), count: 8 }, { on: daysAgo(40), count: 7 }, { on: daysAgo(30), count: 6 }, { on: daysAgo(2), count: 0 }]);
    // Weaning all kits ticks the weaning task; the grow-out weigh-ins (56, 70 days) and the breed-back stay planned.
    const tasks = byKey(body.tasks);
    expect(tasks.weaning).toMatchObject({ state: 'done', doneOn: daysAgo(2) });
    expect(tasks['weigh_in:56']).toMatchObject({ state: 'open' });
    expect(tasks.breed_back!.state).toBe('open');
    const db = await asTenant(coop.id, async (c) => (await c.query('SELECT kind, kit_count, cause FROM litter_events WHERE litter_id = $1 ORDER BY occurred_on', [litter.id])).rows);
    expect(db).toEqual([
      { kind: 'lost', kit_count: 1, cause: 'Chilled outside the nest' },
      { kind: 'culled', kit_count: 1, cause: 'Runt, not thriving' },
      { kind: 'weaned', kit_count: 6, cause: null },
    ]);
  });

  it('when every kit is lost, then the litter\'s nest box out, weigh-ins and weaning are skipped with the reason and her breed-back stays', async () => {
    const coop = await createTestCoop();
    const { litter } = await litterAs(coop.member, { servicedDaysAgo: 34, kindledDaysAgo: 3, bornAlive: 2 });
    const agent = await agentOf(coop.member.email);
    const res = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'lost', on: daysAgo(1), count: 2, cause: 'Doe scattered the kits' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ onDoe: 0, status: 'weaned', summary: { survivalToWeaning: 0 } });
    const rows = Object.fromEntries((await taskRows(coop.id, { litterId: litter.id })).map((r) => [r.key, r]));
    for (const key of ['nest_box_out', 'weigh_in:28', 'weaning']) {
      expect(rows[key]).toMatchObject({ state: 'skipped', state_reason: `No kits left with the doe from ${daysAgo(1)}` });
    }
    expect(rows.breed_back).toMatchObject({ state: 'open' });
  });

  it('when kits are fostered between two litters of the farm, then both counts follow and parentage stays with the birth litter', async () => {
    const coop = await createTestCoop();
    const big = await litterAs(coop.member, { servicedDaysAgo: 33, kindledDaysAgo: 2, bornAlive: 12, doe: 'Big litter' });
    const small = await litterAs(coop.member, { servicedDaysAgo: 32, kindledDaysAgo: 1, bornAlive: 4, doe: 'Small litter' });
    const agent = await agentOf(coop.member.email);
    const candidates = (await agent.get(`/api/litters/${big.litter.id}/foster-candidates`)).body.candidates;
    expect(candidates).toEqual([expect.objectContaining({ id: small.litter.id, isOwnFarm: true, onDoe: 4 })]);

    const res = await agent.post(`/api/litters/${big.litter.id}/fosterings`).send({ direction: 'out', otherLitterId: small.litter.id, on: daysAgo(1), count: 3 });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ onDoe: 9, summary: { fosteredOut: 3, raised: 9 } });
    expect(res.body.events).toMatchObject([{ kind: 'fostered_out', count: 3, otherLitter: { id: small.litter.id, isOwnFarm: true } }]);
    const other = (await agent.get(`/api/litters/${small.litter.id}`)).body as LitterDto;
    expect(other).toMatchObject({ onDoe: 7, summary: { fosteredIn: 3 }, fosteredInFrom: [{ id: big.litter.id }] });
    const pair = await asTenant(coop.id, async (c) => (await c.query('SELECT litter_id, kind, other_litter_id, pair_id FROM litter_events ORDER BY kind')).rows);
    expect(pair).toHaveLength(2);
    expect(pair[0].pair_id).toBe(pair[1].pair_id);

    // More than the big litter has left is refused, on this side, with the sum.
    const tooMany = await agent.post(`/api/litters/${small.litter.id}/fosterings`).send({ direction: 'in', otherLitterId: big.litter.id, on: farmToday(), count: 10 });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.details['otherLitter.count'][0]).toMatch(/^Fostered out 10 kits/);

    // A kit fostered in and kept is its birth litter's: sire and dam of the big litter, its birth date.
    const keeper = await agent.post(`/api/litters/${small.litter.id}/keepers`).send({ tattoo: nextTattoo('K'), name: 'Fostered Fern', sex: 'doe', bornInLitterId: big.litter.id });
    expect(keeper.status).toBe(201);
    const kept = (keeper.body as LitterDto).keepers.find((k) => k.name === 'Fostered Fern')!;
    expect(kept.bornInLitterId).toBe(big.litter.id);
    const animal = await asTenant(coop.id, async (c) => (await c.query('SELECT sire_id, dam_id, birth_date::text AS birth_date FROM animals WHERE id = $1', [kept.id])).rows[0]);
    expect(animal).toEqual({ sire_id: big.buck.id, dam_id: big.doe.id, birth_date: daysAgo(2) });
    const wrong = await agent.post(`/api/litters/${big.litter.id}/keepers`).send({ tattoo: nextTattoo('K'), sex: 'doe', bornInLitterId: small.litter.id });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details.bornInLitterId).toEqual(['No kits of that litter were fostered into this one']);
  });

  it('when kits are fostered to a litter on another farm, then only the giving farm records it, the other farm sees them arrive, and neither sees the other\'s litter', async () => {
    const coop = await createTestCoop();
    const ours = await litterAs(coop.member, { servicedDaysAgo: 32, kindledDaysAgo: 1, bornAlive: 11 });
    const theirs = await litterAs(coop.otherFarmMember, { servicedDaysAgo: 31, kindledDaysAgo: 0, bornAlive: 3 });
    const agent = await agentOf(coop.member.email);
    const neighbour = await agentOf(coop.otherFarmMember.email);
    const candidates = (await agent.get(`/api/litters/${ours.litter.id}/foster-candidates`)).body.candidates;
    expect(candidates).toEqual([expect.objectContaining({ id: theirs.litter.id, isOwnFarm: false, onDoe: null, farm: { id: coop.farms[1]!.id, name: coop.farms[1]!.name } })]);

    const taking = await agent.post(`/api/litters/${ours.litter.id}/fosterings`).send({ direction: 'in', otherLitterId: theirs.litter.id, on: farmToday(), count: 1 });
    expect(taking.status).toBe(400);
    expect(taking.body.error.details.direction[0]).toMatch(/recorded by that farm/);
    const tooMany = await agent.post(`/api/litters/${ours.litter.id}/fosterings`).send({ direction: 'out', otherLitterId: theirs.litter.id, on: daysAgo(2), count: 2 });
    expect(tooMany.status).toBe(400);
    const giving = await agent.post(`/api/litters/${ours.litter.id}/fosterings`).send({ direction: 'out', otherLitterId: theirs.litter.id, on: farmToday(), count: 2 });
    expect(giving.status).toBe(201);
    expect(giving.body.onDoe).toBe(9);
    const received = (await neighbour.get(`/api/litters/${theirs.litter.id}`)).body as LitterDto;
    expect(received.onDoe).toBe(5);
    expect(received.events).toMatchObject([{ kind: 'fostered_in', count: 2, fromOtherFarm: true, otherLitter: { id: ours.litter.id, isOwnFarm: false, farm: { id: coop.farms[0]!.id } } }]);
    // Parentage never changes: the receiving litter's own sire and dam stay its own.
    expect(received).toMatchObject({ dam: { id: theirs.doe.id }, sire: { id: theirs.buck.id } });
    expect((await neighbour.get(`/api/litters/${ours.litter.id}`)).status).toBe(404);
    expect((await agent.get(`/api/litters/${theirs.litter.id}`)).status).toBe(404);
  });
});

describe('who records what on a litter', () => {
  let coop: TestCoop;
  let foreign: TestCoop;
  let litter: LitterDto;
  beforeAll(async () => {
    [coop, foreign] = await Promise.all([createTestCoop(), createTestCoop()]);
    litter = (await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 8 })).litter;
  });

  it('when the apprentice records a loss, then it counts as unverified until the mentor accepts or returns it; kindlings and fosterings are the members\'', async () => {
    const apprentice = await agentOf(coop.apprentice.email);
    const mentor = await agentOf(coop.member.email);
    const res = await apprentice.post(`/api/litters/${litter.id}/events`).send({ kind: 'lost', on: daysAgo(1), count: 2, cause: 'Found dead in the nest' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ onDoe: 6, pendingReview: 1, events: [{ kind: 'lost', reviewState: 'pending', enteredBy: { id: coop.apprentice.id } }] });
    const eventId = res.body.events[0].id as string;
    expect((await apprentice.post(`/api/litter-events/${eventId}/review`).send({ decision: 'accepted', version: 0 })).status).toBe(403);

    const { doe, buck } = await breedingPair(coop.member);
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(31) });
    const before = await almanacCounts(coop.id);
    expect((await apprentice.post('/api/litters').send({ serviceId: service.id, kindledOn: farmToday(), bornAlive: 5, bornDead: 0 })).status).toBe(403);
    expect((await apprentice.post(`/api/litters/${litter.id}/fosterings`).send({ direction: 'out', otherLitterId: litter.id, on: farmToday(), count: 1 })).status).toBe(403);
    expect((await apprentice.post(`/api/litters/${litter.id}/keepers`).send({ tattoo: nextTattoo(), sex: 'doe' })).status).toBe(403);
    expect(await almanacCounts(coop.id)).toEqual(before);

    const returned = await mentor.post(`/api/litter-events/${eventId}/review`).send({ decision: 'returned', comment: 'Those two were in the other box', version: 0 });
    expect(returned.status).toBe(200);
    expect(returned.body).toMatchObject({ onDoe: 8, pendingReview: 0, events: [{ reviewState: 'returned', reviewComment: 'Those two were in the other box' }] });
    const db = await asTenant(coop.id, async (c) => (await c.query('SELECT review_state, reviewed_by FROM litter_events WHERE id = $1', [eventId])).rows[0]);
    expect(db).toEqual({ review_state: 'returned', reviewed_by: coop.member.id });
  });

  it('when another farm or another co-op asks for the litter or records on it, then it is not there (404) and nothing is written', async () => {
    for (const email of [coop.otherFarmMember.email, foreign.admin.email]) {
      const agent = await agentOf(email);
      const before = await almanacCounts(coop.id);
      expect((await agent.get(`/api/litters/${litter.id}`)).status).toBe(404);
      expect((await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'weaned', on: farmToday(), count: 1 })).status).toBe(404);
      expect((await agent.get(`/api/litters/${litter.id}/foster-candidates`)).status).toBe(404);
      const listed = await agent.get('/api/litters');
      expect(listed.status).toBe(200);
      const list = listed.body.items as { id: string }[];
      expect(list.some((l) => l.id === litter.id)).toBe(false);
      expect(await almanacCounts(coop.id)).toEqual(before);
    }
  });
});

describe('housing: hutches and pens with dated placements', () => {
  it('when a litter and a doe are placed and moved, then each has one current place and the old one ends on the day of the move', async () => {
    const coop = await createTestCoop();
    const { litter, doe } = await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 6 });
    const agent = await agentOf(coop.member.email);
    const hutch = (await agent.post('/api/housing-units').send({ name: 'D3', kind: 'hutch', capacity: 2 })).body;
    const pen = (await agent.post('/api/housing-units').send({ name: 'Grow-out 1', kind: 'grow_out' })).body;
    expect((await agent.post('/api/housing-units').send({ name: 'd3', kind: 'hutch' })).status).toBe(400);
    expect((await agent.post(`/api/housing-units/${hutch.id}/placements`).send({ animalId: doe.id, placedOn: daysAgo(9) })).status).toBe(201);
    const placed = await agent.post(`/api/housing-units/${hutch.id}/placements`).send({ litterId: litter.id, placedOn: daysAgo(9) });
    expect(placed.body.current.map((p: { animal: unknown; litter: unknown }) => Boolean(p.animal) || Boolean(p.litter))).toEqual([true, true]);
    expect((await agent.get(`/api/litters/${litter.id}`)).body.housing).toMatchObject({ unitName: 'D3', placedOn: daysAgo(9) });
    const early = await agent.post(`/api/housing-units/${pen.id}/placements`).send({ litterId: litter.id, placedOn: daysAgo(10) });
    expect(early.status).toBe(400);
    const moved = await agent.post(`/api/housing-units/${pen.id}/placements`).send({ litterId: litter.id, placedOn: farmToday() });
    expect(moved.status).toBe(201);
    const rows = await asTenant(coop.id, async (c) => (await c.query('SELECT unit_id, placed_on::text AS placed_on, ended_on::text AS ended_on FROM housing_placements WHERE litter_id = $1 ORDER BY placed_on', [litter.id])).rows);
    expect(rows).toEqual([{ unit_id: hutch.id, placed_on: daysAgo(9), ended_on: farmToday() }, { unit_id: pen.id, placed_on: farmToday(), ended_on: null }]);
    const apprentice = await agentOf(coop.apprentice.email);
    expect((await apprentice.get('/api/housing-units')).body.units.map((u: { name: string }) => u.name)).toEqual(['D3', 'Grow-out 1']);
    expect((await apprentice.post('/api/housing-units').send({ name: 'X', kind: 'pen' })).status).toBe(403);
    expect((await (await agentOf(coop.otherFarmMember.email)).post(`/api/housing-units/${pen.id}/placements`).send({ animalId: doe.id, placedOn: farmToday() })).status).toBe(404);
  });

  it('when a placement is ended, then the hutch no longer lists the animal, the row carries the end date, and it cannot end twice or before it began', async () => {
    const coop = await createTestCoop();
    const { doe } = await breedingPair(coop.member);
    const agent = await agentOf(coop.member.email);
    const hutch = (await agent.post('/api/housing-units').send({ name: 'E1', kind: 'hutch' })).body;
    const placed = await agent.post(`/api/housing-units/${hutch.id}/placements`).send({ animalId: doe.id, placedOn: daysAgo(5) });
    expect(placed.status).toBe(201);
    const placementId = placed.body.current[0].id as string;

    const tooEarly = await agent.post(`/api/housing-placements/${placementId}/end`).send({ endedOn: daysAgo(6) });
    expect(tooEarly.status).toBe(400);
    expect(tooEarly.body.error.details.endedOn).toEqual([`It was placed there on ${daysAgo(5)}`]);
    const ended = await agent.post(`/api/housing-placements/${placementId}/end`).send({ endedOn: daysAgo(1) });
    expect(ended.status).toBe(200);
    expect(ended.body).toMatchObject({ id: hutch.id, current: [] });
    const row = await asTenant(coop.id, async (c) => (await c.query('SELECT ended_on::text AS ended_on FROM housing_placements WHERE id = $1', [placementId])).rows);
    expect(row).toEqual([{ ended_on: daysAgo(1) }]);
    expect((await agent.get('/api/housing-units')).body.units.find((u: { id: string }) => u.id === hutch.id).current).toEqual([]);
    const again = await agent.post(`/api/housing-placements/${placementId}/end`).send({ endedOn: farmToday() });
    expect(again.status).toBe(409);
  });
});

describe('live updates of litters', () => {
  const server = liveTestServer({ signIn: ROOMY_SIGN_IN });
  const { kit } = server;

  it('when kits are fostered to another farm, then both farms\' rooms hear their litter changed, and a third co-op hears nothing', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const ours = await litterAs(coop.member, { servicedDaysAgo: 32, kindledDaysAgo: 1, bornAlive: 10 });
    const theirs = await litterAs(coop.otherFarmMember, { servicedDaysAgo: 31, kindledDaysAgo: 0, bornAlive: 3 });
    const here = await kit.listen(coop.apprentice.email);
    const there = await kit.listen(coop.otherFarmMember.email);
    const outsider = await kit.listen(foreign.member.email);
    await fosteringAs(coop.member, ours.litter.id, { direction: 'out', otherLitterId: theirs.litter.id, on: farmToday(), count: 2 });
    await expect.poll(() => there.heard.get(RealtimeEvent.litterChanged)?.length ?? 0).toBe(1);
    expect(there.heard.get(RealtimeEvent.litterChanged)![0]).toEqual({ farmId: coop.farms[1]!.id, litterId: theirs.litter.id });
    await expect.poll(() => here.heard.get(RealtimeEvent.litterChanged)?.length ?? 0).toBe(1);
    expect(here.heard.get(RealtimeEvent.litterChanged)![0]).toEqual({ farmId: coop.farms[0]!.id, litterId: ours.litter.id });
    expect(outsider.heard.get(RealtimeEvent.litterChanged)).toBeUndefined();
  });
});

describe('cycle settings and litters', () => {
  it('when the weigh-in ages change, then open litter weigh-ins follow: a dropped age is skipped, a new one added from today on', async () => {
    const coop = await createTestCoop();
    const { litter } = await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 6 });
    const agent = await agentOf(coop.member.email);
    const res = await agent.patch('/api/almanac/settings').send({ weighInAgesDays: [21, 42, 56], version: 0 });
    expect(res.status).toBe(200);
    const rows = Object.fromEntries((await taskRows(coop.id, { litterId: litter.id })).map((r) => [r.key, r]));
    expect(rows['weigh_in:28']).toMatchObject({ state: 'skipped', state_reason: "No longer in the farm's cycle settings" });
    expect(rows['weigh_in:70']).toMatchObject({ state: 'skipped' });
    expect(rows['weigh_in:21']).toMatchObject({ state: 'open', due_on: addDays(daysAgo(9), 21) });
    expect(rows['weigh_in:42']).toMatchObject({ state: 'open', due_on: addDays(daysAgo(9), 42) });
  });
});

describe('litter weight at weaning', () => {
  it('when a weaning carries the litter weight, then it is stored on the weaning and shown on the litter', async () => {
    const coop = await createTestCoop();
    const { litter } = await litterAs(coop.member, { servicedDaysAgo: 66, kindledDaysAgo: 35, bornAlive: 8 });
    const agent = await agentOf(coop.member.email);
    // 6,000 g for 8 kits = 750 g a kit at 35 days: about the usual 780 g of the reference curve (growth/gompertz.ts, Rao et al. 1977).
    const res = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'weaned', on: farmToday(), count: 8, weaningWeightGrams: 6000 });
    expect(res.status).toBe(201);
    const body = res.body as LitterDto;
    expect(body.events.find((e) => e.kind === 'weaned')).toMatchObject({ count: 8, weaningWeightGrams: 6000 });
    const row = await asTenant(coop.id, async (c) => (await c.query(`SELECT kit_count, weaning_weight_grams FROM litter_events WHERE litter_id = $1 AND kind = 'weaned'`, [litter.id])).rows);
    expect(row).toEqual([{ kit_count: 8, weaning_weight_grams: 6000 }]);
  });

  it('when the litter weight is negative, absurd for the kits\' age, or on a loss, then clear errors and nothing written', async () => {
    const coop = await createTestCoop();
    const { litter } = await litterAs(coop.member, { servicedDaysAgo: 66, kindledDaysAgo: 35, bornAlive: 8 });
    const agent = await agentOf(coop.member.email);
    const before = await almanacCounts(coop.id);
    const negative = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'weaned', on: farmToday(), count: 8, weaningWeightGrams: -500 });
    expect(negative.status).toBe(400);
    expect(negative.body.error.details.weaningWeightGrams).toEqual(['The litter weight must be above zero']);
    // 30,000 g for 8 kits = 3,750 g a kit at 35 days: over three times the usual 780 g (growth/plausibility.ts).
    const absurd = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'weaned', on: farmToday(), count: 8, weaningWeightGrams: 30000 });
    expect(absurd.status).toBe(400);
    expect(absurd.body.error.details.weaningWeightGrams).toEqual([
      '3750 g a head is not possible at 35 days (about 780 g is usual); check the weight, the head count and the date (30000 g for 8 kits)',
    ]);
    const tooLight = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'weaned', on: farmToday(), count: 8, weaningWeightGrams: 800 });
    expect(tooLight.status).toBe(400);
    expect(tooLight.body.error.details.weaningWeightGrams[0]).toMatch(/^100 g a head is not possible at 35 days/);
    const onALoss = await agent.post(`/api/litters/${litter.id}/events`).send({ kind: 'lost', on: farmToday(), count: 1, cause: 'Crushed', weaningWeightGrams: 700 });
    expect(onALoss.status).toBe(400);
    expect(onALoss.body.error.details.weaningWeightGrams).toEqual(['A litter weight goes with a weaning only']);
    expect(await almanacCounts(coop.id)).toEqual(before);
  });

  it('when the litter weight is unusual for the age, then it asks for confirmation, and saves when confirmed', async () => {
    const coop = await createTestCoop();
    const { litter } = await litterAs(coop.member, { servicedDaysAgo: 66, kindledDaysAgo: 35, bornAlive: 8 });
    const agent = await agentOf(coop.member.email);
    // 14,000 g for 8 kits = 1,750 g a kit: over 1.6 times the usual 780 g, under 3 times → a warning.
    const body = { kind: 'weaned', on: farmToday(), count: 8, weaningWeightGrams: 14000 };
    const asked = await agent.post(`/api/litters/${litter.id}/events`).send(body);
    expect(asked.status).toBe(422);
    expect(asked.body.error.details.weaningWeightGrams).toEqual(['1750 g a head is heavy at 35 days (about 780 g is usual) (14000 g for 8 kits)']);
    expect(await asTenant(coop.id, async (c) => (await c.query('SELECT count(*)::int AS n FROM litter_events WHERE litter_id = $1', [litter.id])).rows[0].n)).toBe(0);
    const saved = await agent.post(`/api/litters/${litter.id}/events`).send({ ...body, confirm: true });
    expect(saved.status).toBe(201);
    expect((saved.body as LitterDto).events[0]).toMatchObject({ kind: 'weaned', weaningWeightGrams: 14000 });
  });
});
