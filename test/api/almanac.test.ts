import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays, RealtimeEvent, type AgendaDto, type AlmanacSummaryDto, type AlmanacTaskDto, type ServiceDto } from '@burrowline/shared';
import { almanacCounts, breedingPair, daysAgo, farmToday, palpationAs, serviceAs, taskRows } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { addAnimalAs } from '../support/herd';
import { liveTestServer } from '../support/sockets';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

// Many sign-ins in one file: keep the sign-in limit out of the way.
const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

const byKind = <T extends { kind: string }>(tasks: T[]): Record<string, T> => Object.fromEntries(tasks.map((t) => [t.kind, t]));

describe('services and the tasks they plan', () => {
  it('when a member records a service, then the Almanac places palpation, nest box, kindling (with its window) and the overdue alert on the default days', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member, { doe: 'Larkin' });
    const agent = await agentOf(coop.member.email);
    const servicedOn = daysAgo(2);
    const res = await agent.post('/api/services').send({ doeId: doe.id, buckId: buck.id, servicedOn, notes: 'Two covers, morning.' });
    expect(res.status).toBe(201);
    const service = res.body as ServiceDto;
    expect(service).toMatchObject({ status: 'open', servicedOn, notes: 'Two covers, morning.', doe: { id: doe.id, name: 'Larkin' }, buck: { id: buck.id }, kindlingStatus: 'not_due', dayToday: 2, litterId: null, warnings: [] });
    // Merck Veterinary Manual: palpate day 10–14 (12 common), nest box day 28–29, gestation 31–32 d typical in a 29–35 d range, no kits by day 32 → watch.
    const tasks = byKind(service.tasks);
    expect(tasks.palpation).toMatchObject({ dueOn: addDays(servicedOn, 12), state: 'open', title: 'Palpate', subject: expect.stringContaining('Larkin') });
    expect(tasks.nest_box_in).toMatchObject({ dueOn: addDays(servicedOn, 28) });
    expect(tasks.kindling_due).toMatchObject({ dueOn: addDays(servicedOn, 31), windowStart: addDays(servicedOn, 29), windowEnd: addDays(servicedOn, 35) });
    expect(tasks.kindling_overdue).toMatchObject({ dueOn: addDays(servicedOn, 32) });

    const rows = await taskRows(coop.id, { serviceId: service.id });
    expect(rows.map((r) => [r.kind, r.due_on, r.state])).toEqual([
      ['palpation', addDays(servicedOn, 12), 'open'],
      ['nest_box_in', addDays(servicedOn, 28), 'open'],
      ['kindling_due', addDays(servicedOn, 31), 'open'],
      ['kindling_overdue', addDays(servicedOn, 32), 'open'],
    ]);
    // Stable ids: the tasks the API shows are the stored rows (the calendar feed's UIDs).
    expect(new Set(service.tasks.map((t) => t.id))).toEqual(new Set(rows.map((r) => r.id)));
    const db = await asTenant(coop.id, async (c) => (await c.query('SELECT farm_id, doe_id, buck_id, status, recorded_by FROM services WHERE id = $1', [service.id])).rows[0]);
    expect(db).toEqual({ farm_id: coop.farms[0]!.id, doe_id: doe.id, buck_id: buck.id, status: 'open', recorded_by: coop.member.id });

    // The agenda shows them by date on the farm's clock.
    const agenda = (await agent.get('/api/almanac/tasks').query({ from: servicedOn, to: addDays(servicedOn, 40) })).body as AgendaDto;
    expect(agenda.today).toBe(farmToday());
    expect(agenda.timeZone).toBe('America/Chicago');
    expect(agenda.tasks.map((t) => t.kind)).toEqual(['palpation', 'nest_box_in', 'kindling_due', 'kindling_overdue']);
  });

  it('when the same service is sent twice with its id, then one service and one set of tasks exist', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member);
    const agent = await agentOf(coop.member.email);
    const id = crypto.randomUUID();
    const body = { id, doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(1) };
    expect((await agent.post('/api/services').send(body)).status).toBe(201);
    const again = await agent.post('/api/services').send(body);
    expect(again.status).toBe(201);
    expect(again.body.id).toBe(id);
    expect(await almanacCounts(coop.id)).toMatchObject({ services: 1, tasks: 4 });
  });

  it('when a buck is chosen as the doe, a date is in the future, or an animal of another farm is named, then clear errors and nothing written', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member);
    const neighbours = await breedingPair(coop.otherFarmMember);
    const agent = await agentOf(coop.member.email);
    const before = await almanacCounts(coop.id);

    const buckAsDoe = await agent.post('/api/services').send({ doeId: buck.id, buckId: doe.id, servicedOn: daysAgo(1) });
    expect(buckAsDoe.status).toBe(400);
    expect(buckAsDoe.body.error.details.doeId).toContain('That animal is a buck; choose a doe');
    expect(buckAsDoe.body.error.details.buckId).toContain('That animal is a doe; choose a buck');

    const tomorrow = addDays(farmToday(), 1);
    const future = await agent.post('/api/services').send({ doeId: doe.id, buckId: buck.id, servicedOn: tomorrow });
    expect(future.status).toBe(400);
    expect(future.body.error.details.servicedOn[0]).toBe(`The service on ${tomorrow} is in the future (today is ${farmToday()})`);

    const theirs = await agent.post('/api/services').send({ doeId: neighbours.doe.id, buckId: buck.id, servicedOn: daysAgo(1) });
    expect(theirs.status).toBe(400);
    expect(theirs.body.error.details.doeId[0]).toMatch(/is not kept on your farm/);

    const badDate = await agent.post('/api/services').send({ doeId: doe.id, buckId: buck.id, servicedOn: '2026-02-30' });
    expect(badDate.status).toBe(400);
    expect(badDate.body.error.details.servicedOn).toEqual(['Enter a date as YYYY-MM-DD']);
    expect(await almanacCounts(coop.id)).toEqual(before);
  });

  it('when the doe is younger than her breed\'s first-breeding age or under treatment, then a warning asks to confirm before anything is saved', async () => {
    const coop = await createTestCoop();
    const buck = await addAnimalAs(coop.member, { sex: 'buck', birthDate: '2022-01-01' });
    const young = await addAnimalAs(coop.member, { sex: 'doe', name: 'Pip', birthDate: daysAgo(100) });
    const agent = await agentOf(coop.member.email);
    const before = await almanacCounts(coop.id);
    const res = await agent.post('/api/services').send({ doeId: young.id, buckId: buck.id, servicedOn: farmToday() });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('confirmation_required');
    // Rabbit Production, 9th ed.: medium breeds first bred at 4½–5½ months (137 days used when the breed is unknown).
    expect(res.body.error.details.doeId[0]).toBe('The doe is 100 days old; her breed is usually first bred from 137 days');
    expect(await almanacCounts(coop.id)).toEqual(before);

    const confirmed = await agent.post('/api/services').send({ doeId: young.id, buckId: buck.id, servicedOn: farmToday(), confirm: true });
    expect(confirmed.status).toBe(201);
    expect(confirmed.body.warnings).toMatchObject([{ code: 'young_doe', level: 'warning' }]);

    const treated = await addAnimalAs(coop.member, { sex: 'doe', name: 'Tansy', birthDate: '2023-02-01' });
    const treatment = await agent.post('/api/treatments').send({
      animalId: treated.id, startedOn: daysAgo(3), lastDoseOn: daysAgo(1), withdrawalEndsOn: addDays(farmToday(), 10), treatment: 'Ear mites, as the vet prescribed', dose: '0.1 ml', route: 'topical', veterinarian: 'Dr. Quill',
    });
    expect(treatment.status).toBe(201);
    const warned = await agent.post('/api/services').send({ doeId: treated.id, buckId: buck.id, servicedOn: farmToday() });
    expect(warned.status).toBe(422);
    expect(warned.body.error.details.doeId[0]).toBe(`She is under treatment (Ear mites, as the vet prescribed) until ${addDays(farmToday(), 10)}; ask the veterinarian before breeding her`);
    const stock = (await agent.get('/api/almanac/breeding-stock')).body;
    expect(stock.does.find((d: { id: string }) => d.id === treated.id).underTreatment).toEqual({ treatment: 'Ear mites, as the vet prescribed', endsOn: addDays(farmToday(), 10) });
    expect(stock.does.find((d: { id: string }) => d.id === young.id).openService).toMatchObject({ servicedOn: farmToday() });
  });

  it('when she already carries an open service, then a second is refused until the first is closed; a negative palpation plans the rebreed', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member);
    const agent = await agentOf(coop.member.email);
    const first = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(13) });
    const before = await almanacCounts(coop.id);

    const second = await agent.post('/api/services').send({ doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(1), confirm: true });
    expect(second.status).toBe(400);
    expect(second.body.error.details.doeId[0]).toBe(`She was served on ${daysAgo(13)} and no kindling is recorded yet; record it or close that service as missed first`);
    expect(await almanacCounts(coop.id)).toEqual(before);

    const palpation = await agent.post(`/api/services/${first.id}/palpations`).send({ palpatedOn: daysAgo(1), result: 'negative', notes: 'No marbles felt.' });
    expect(palpation.status).toBe(201);
    const after = palpation.body as ServiceDto;
    expect(after).toMatchObject({ status: 'empty', closedOn: daysAgo(1), palpations: [{ result: 'negative', dayAfterService: 12, notes: 'No marbles felt.' }] });
    const tasks = byKind(after.tasks);
    expect(tasks.palpation).toMatchObject({ state: 'done', doneOn: daysAgo(1) });
    for (const kind of ['nest_box_in', 'kindling_due', 'kindling_overdue']) {
      expect(tasks[kind]).toMatchObject({ state: 'skipped', stateReason: `Palpated empty on ${daysAgo(1)}` });
    }
    // Common practice: rebreed as soon as she palpates empty (1 day after by default).
    expect(tasks.rebreed).toMatchObject({ state: 'open', dueOn: farmToday(), anchor: 'palpation', anchorDate: daysAgo(1) });

    // Now she may be bred again, and that ticks her rebreed task.
    const rebred = await agent.post('/api/services').send({ doeId: doe.id, buckId: buck.id, servicedOn: farmToday() });
    expect(rebred.status).toBe(201);
    const rows = await taskRows(coop.id, { serviceId: first.id });
    expect(rows.find((r) => r.kind === 'rebreed')).toMatchObject({ state: 'done', done_on: farmToday() });
  });

  it('when a positive palpation is recorded, then its task is done and the kindling plan stays; a service can be closed as missed', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member);
    const agent = await agentOf(coop.member.email);
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(37) });
    const early = await agent.post(`/api/services/${service.id}/palpations`).send({ palpatedOn: daysAgo(30), result: 'positive' });
    // Merck Veterinary Manual: kits are felt from day 10; day 7 is a warning, not a refusal.
    expect(early.status).toBe(422);
    expect(early.body.error.details.palpatedOn[0]).toMatch(/^Day 7 is early to palpate/);
    const ok = await agent.post(`/api/services/${service.id}/palpations`).send({ palpatedOn: daysAgo(25), result: 'positive' });
    expect(ok.status).toBe(201);
    const tasks = byKind(ok.body.tasks as AlmanacTaskDto[]);
    expect(tasks.palpation!.state).toBe('done');
    expect(tasks.kindling_due!.state).toBe('open');
    // Day 37, past the 35-day window with no kits: the Almanac says so by itself.
    const agenda = (await agent.get('/api/almanac/tasks')).body as AgendaDto;
    expect(agenda.attention).toContainEqual(expect.objectContaining({ kind: 'kindling_missed', sourceId: service.id }));

    const stale = await agent.post(`/api/services/${service.id}/closure`).send({ closedOn: farmToday(), reason: 'No kits by day 37', version: 99 });
    expect(stale.status).toBe(409);
    const closed = await agent.post(`/api/services/${service.id}/closure`).send({ closedOn: farmToday(), reason: 'No kits by day 37', version: ok.body.version });
    expect(closed.status).toBe(200);
    expect(closed.body).toMatchObject({ status: 'missed', closedOn: farmToday(), closeReason: 'No kits by day 37' });
    const after = byKind(closed.body.tasks);
    expect(after.kindling_due).toMatchObject({ state: 'skipped', stateReason: 'Service closed as missed: No kits by day 37' });
    expect(after.rebreed).toMatchObject({ state: 'open', dueOn: addDays(farmToday(), 1) });
  });
});

describe('the list of services', () => {
  it('when a member lists services, then the farm\'s come latest first, filtered by status and doe, and another farm\'s never appear', async () => {
    const coop = await createTestCoop();
    const first = await breedingPair(coop.member, { doe: 'Alder' });
    const second = await breedingPair(coop.member, { doe: 'Birch' });
    const neighbours = await breedingPair(coop.otherFarmMember, { doe: 'Cedar' });
    const older = await serviceAs(coop.member, { doeId: first.doe.id, buckId: first.buck.id, servicedOn: daysAgo(40) });
    const newer = await serviceAs(coop.member, { doeId: second.doe.id, buckId: second.buck.id, servicedOn: daysAgo(3) });
    const theirs = await serviceAs(coop.otherFarmMember, { doeId: neighbours.doe.id, buckId: neighbours.buck.id, servicedOn: daysAgo(2) });
    await palpationAs(coop.member, older.id, daysAgo(28), 'negative');
    const agent = await agentOf(coop.member.email);

    const all = await agent.get('/api/services');
    expect(all.status).toBe(200);
    expect(all.body).toMatchObject({ total: 2, page: 1, pageSize: 20 });
    expect(all.body.items.map((s: { id: string }) => s.id)).toEqual([newer.id, older.id]);
    expect(all.body.items[0]).toMatchObject({ doe: { id: second.doe.id }, buck: { id: second.buck.id }, servicedOn: daysAgo(3), status: 'open', lastPalpation: null });
    expect(all.body.items[1]).toMatchObject({ doe: { id: first.doe.id }, lastPalpation: 'negative' });
    expect(JSON.stringify(all.body)).not.toContain(theirs.id);

    const ofDoe = await agent.get('/api/services').query({ doeId: first.doe.id });
    expect(ofDoe.body.items.map((s: { id: string }) => s.id)).toEqual([older.id]);
    const open = (await agent.get('/api/services').query({ status: 'open' })).body.items.map((s: { id: string; status: string }) => s.status);
    const closed = (await agent.get('/api/services').query({ status: 'closed' })).body.items.map((s: { id: string; status: string }) => s.status);
    expect(open.every((status: string) => status === 'open')).toBe(true);
    expect(closed.every((status: string) => status !== 'open')).toBe(true);
    expect(open.length + closed.length).toBe(2);
    const oldestFirst = await agent.get('/api/services').query({ dir: 'asc' });
    expect(oldestFirst.body.items.map((s: { id: string }) => s.id)).toEqual([older.id, newer.id]);
    const pastTheEnd = await agent.get('/api/services').query({ page: 2, pageSize: 10 });
    expect({ items: pastTheEnd.body.items, total: pastTheEnd.body.total }).toEqual({ items: [], total: 2 });
  });
});

describe('tasks: done, moved, skipped, one by one or several at once', () => {
  it('when a member ticks, moves, skips and reopens tasks, then each keeps its id and version, and a stale version is refused', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member);
    const agent = await agentOf(coop.member.email);
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(12) });
    const { palpation, nest_box_in: nestBox, kindling_overdue: overdue } = byKind(service.tasks);

    const future = await agent.patch(`/api/almanac/tasks/${palpation!.id}`).send({ action: 'done', doneOn: addDays(farmToday(), 1), version: palpation!.version });
    expect(future.status).toBe(400);
    expect(future.body.error.details.doneOn[0]).toMatch(/a date in the future/);
    const done = await agent.patch(`/api/almanac/tasks/${palpation!.id}`).send({ action: 'done', version: palpation!.version });
    expect(done.status).toBe(200);
    expect(done.body).toMatchObject({ id: palpation!.id, state: 'done', doneOn: farmToday(), doneBy: { id: coop.member.id }, completionReview: 'accepted', version: palpation!.version + 1 });
    const stale = await agent.patch(`/api/almanac/tasks/${palpation!.id}`).send({ action: 'reopen', version: palpation!.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_version');

    const moved = await agent.patch(`/api/almanac/tasks/${nestBox!.id}`).send({ action: 'move', dueOn: addDays(nestBox!.dueOn, 1), reason: 'Boxes still drying', version: nestBox!.version });
    expect(moved.body).toMatchObject({ state: 'moved', dueOn: addDays(nestBox!.dueOn, 1), movedFrom: nestBox!.dueOn, stateReason: 'Boxes still drying' });
    const noReason = await agent.patch(`/api/almanac/tasks/${overdue!.id}`).send({ action: 'skip', reason: ' ', version: overdue!.version });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.details.reason).toEqual(['Say why you skip it']);
    const skipped = await agent.patch(`/api/almanac/tasks/${overdue!.id}`).send({ action: 'skip', reason: 'Watching her anyway', version: overdue!.version });
    expect(skipped.body).toMatchObject({ state: 'skipped', stateReason: 'Watching her anyway' });
    const reopened = await agent.patch(`/api/almanac/tasks/${palpation!.id}`).send({ action: 'reopen', version: done.body.version });
    expect(reopened.body).toMatchObject({ state: 'open', doneOn: null });

    const rows = await taskRows(coop.id, { serviceId: service.id });
    expect(Object.fromEntries(rows.map((r) => [r.kind, r.state]))).toEqual({ palpation: 'open', nest_box_in: 'moved', kindling_due: 'open', kindling_overdue: 'skipped' });
    const history = await asTenant(coop.id, async (c) => (await c.query(`SELECT count(*)::int AS n FROM record_changes WHERE table_name = 'almanac_tasks' AND record_id = ANY($1::uuid[])`, [rows.map((r) => r.id)])).rows[0].n);
    expect(history).toBe(4);
  });

  it('when several tasks are done at once and one of them is stale, then none changes; with current versions all do', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const a = await breedingPair(coop.member);
    const b = await breedingPair(coop.member);
    const s1 = await serviceAs(coop.member, { doeId: a.doe.id, buckId: a.buck.id, servicedOn: daysAgo(12) });
    const s2 = await serviceAs(coop.member, { doeId: b.doe.id, buckId: b.buck.id, servicedOn: daysAgo(13) });
    const p1 = s1.tasks.find((t) => t.kind === 'palpation')!;
    const p2 = s2.tasks.find((t) => t.kind === 'palpation')!;
    const before = await almanacCounts(coop.id);
    const refused = await agent.post('/api/almanac/tasks/bulk').send({ action: 'done', tasks: [{ id: p1.id, version: p1.version }, { id: p2.id, version: p2.version + 5 }] });
    expect(refused.status).toBe(409);
    expect(await almanacCounts(coop.id)).toEqual(before);

    const res = await agent.post('/api/almanac/tasks/bulk').send({ action: 'done', tasks: [{ id: p1.id, version: p1.version }, { id: p2.id, version: p2.version }] });
    expect(res.status).toBe(200);
    expect(res.body.tasks.map((t: AlmanacTaskDto) => [t.id, t.state])).toEqual(expect.arrayContaining([[p1.id, 'done'], [p2.id, 'done']]));
    const moved = await agent.post('/api/almanac/tasks/bulk').send({
      action: 'move', dueOn: addDays(farmToday(), 20),
      tasks: [s1, s2].map((s) => s.tasks.find((t) => t.kind === 'nest_box_in')!).map((t) => ({ id: t.id, version: t.version })),
    });
    expect(moved.status).toBe(200);
    expect(moved.body.tasks.every((t: AlmanacTaskDto) => t.state === 'moved' && t.dueOn === addDays(farmToday(), 20))).toBe(true);
  });

  it('when Commons asks for the summary, then today\'s tasks, this week\'s and the overdue ones come on the farm\'s clock', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const a = await breedingPair(coop.member, { doe: 'Due today' });
    const b = await breedingPair(coop.member, { doe: 'Late' });
    const c = await breedingPair(coop.member, { doe: 'This week' });
    await serviceAs(coop.member, { doeId: a.doe.id, buckId: a.buck.id, servicedOn: daysAgo(12) });
    await serviceAs(coop.member, { doeId: b.doe.id, buckId: b.buck.id, servicedOn: daysAgo(15) });
    await serviceAs(coop.member, { doeId: c.doe.id, buckId: c.buck.id, servicedOn: daysAgo(9) });
    const summary = (await agent.get('/api/almanac/summary')).body as AlmanacSummaryDto;
    expect(summary.today).toBe(farmToday());
    expect(summary.weekEnd).toBe(addDays(farmToday(), 6));
    expect(summary.dueToday.map((t) => [t.kind, t.animal?.id])).toEqual([['palpation', a.doe.id]]);
    expect(summary.thisWeek.map((t) => [t.kind, t.animal?.id, t.dueOn])).toEqual([['palpation', c.doe.id, addDays(farmToday(), 3)]]);
    expect(summary.overdue.map((t) => [t.kind, t.animal?.id, t.daysLate])).toEqual([['palpation', b.doe.id, 3]]);
    // The attention names the doe it is about and carries her for the banner's link.
    expect(summary.attention).toEqual([expect.objectContaining({
      kind: 'missed_palpation', daysLate: 3, message: `Late (${b.doe.tattoo}): Palpation 3 days late`, doe: { id: b.doe.id, name: 'Late', tattoo: b.doe.tattoo },
    })]);
    // Apprentices see the mentor's; another farm sees nothing of it.
    const apprentice = (await (await agentOf(coop.apprentice.email)).get('/api/almanac/summary')).body as AlmanacSummaryDto;
    expect(apprentice.dueToday.map((t) => t.id)).toEqual(summary.dueToday.map((t) => t.id));
    const neighbour = (await (await agentOf(coop.otherFarmMember.email)).get('/api/almanac/summary')).body as AlmanacSummaryDto;
    expect([...neighbour.dueToday, ...neighbour.thisWeek, ...neighbour.overdue]).toEqual([]);
  });
});

describe('cycle settings', () => {
  it('when a member changes the palpation day, then open tasks are re-planned and done or moved ones stay', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const settings = await agent.get('/api/almanac/settings');
    expect(settings.body).toMatchObject({ isDefault: true, version: 0, settings: { palpationDays: 12, nestBoxInDays: 28, kindlingExpectedDays: 31, weaningDays: 42, breedBackDays: 35, weighInAgesDays: [28, 42, 56, 70], targetLiveWeightGrams: 2270 } });
    expect(settings.body.sources.palpationDays).toMatchObject({ published: { min: 10, max: 14 }, confidence: 'pub' });

    const a = await breedingPair(coop.member);
    const b = await breedingPair(coop.member);
    const open = await serviceAs(coop.member, { doeId: a.doe.id, buckId: a.buck.id, servicedOn: daysAgo(3) });
    const ticked = await serviceAs(coop.member, { doeId: b.doe.id, buckId: b.buck.id, servicedOn: daysAgo(4) });
    // Palpated early (day 4, confirmed past the warning): its task is done and must not move.
    await palpationAs(coop.member, ticked.id, farmToday(), 'positive');
    const nestBox = open.tasks.find((t) => t.kind === 'nest_box_in')!;
    await agent.patch(`/api/almanac/tasks/${nestBox.id}`).send({ action: 'move', dueOn: addDays(nestBox.dueOn, 2), version: nestBox.version });

    const bad = await agent.patch('/api/almanac/settings').send({ palpationDays: 30, version: 0 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.palpationDays).toEqual(['Palpation after service: at most 21 days']);
    const order = await agent.patch('/api/almanac/settings').send({ nestBoxInDays: 30, version: 0 });
    expect(order.status).toBe(400);
    expect(order.body.error.details.nestBoxInDays).toEqual(['Put the nest box in by the first day of the kindling window']);

    const res = await agent.patch('/api/almanac/settings').send({ palpationDays: 14, version: 0 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ isDefault: false, version: 1, settings: { palpationDays: 14 }, replanned: { changed: 1, skipped: 0, added: 0 } });
    const openRows = byKind(await taskRows(coop.id, { serviceId: open.id }));
    expect(openRows.palpation).toMatchObject({ due_on: addDays(daysAgo(3), 14), state: 'open' });
    expect(openRows.nest_box_in).toMatchObject({ due_on: addDays(daysAgo(3), 30), state: 'moved' });
    const tickedRows = byKind(await taskRows(coop.id, { serviceId: ticked.id }));
    expect(tickedRows.palpation).toMatchObject({ due_on: addDays(daysAgo(4), 12), state: 'done' });

    const stale = await agent.patch('/api/almanac/settings').send({ palpationDays: 11, version: 0 });
    expect(stale.status).toBe(409);
    const history = await asTenant(coop.id, async (c) => (await c.query(`SELECT changes FROM record_changes WHERE table_name = 'farm_cycle_settings' AND record_id = $1`, [coop.farms[0]!.id])).rows);
    expect(history).toEqual([{ changes: { palpationDays: [12, 14] } }]);
  });
});

describe('who sees and does what in the Almanac', () => {
  let coop: TestCoop;
  let foreign: TestCoop;
  let service: ServiceDto;
  beforeAll(async () => {
    [coop, foreign] = await Promise.all([createTestCoop(), createTestCoop()]);
    const { doe, buck } = await breedingPair(coop.member);
    service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(12) });
  });

  it('when the apprentice works in the mentor\'s Almanac, then they read it and tick tasks off for review, but plan nothing', async () => {
    const agent = await agentOf(coop.apprentice.email);
    const agenda = (await agent.get('/api/almanac/tasks')).body as AgendaDto;
    expect(agenda.farm.id).toBe(coop.farms[0]!.id);
    const palpation = agenda.tasks.find((t) => t.serviceId === service.id && t.kind === 'palpation')!;
    expect((await agent.get(`/api/services/${service.id}`)).status).toBe(200);

    const before = await almanacCounts(coop.id);
    const { doe, buck } = await breedingPair(coop.member);
    const plan = await agent.post('/api/services').send({ doeId: doe.id, buckId: buck.id, servicedOn: farmToday() });
    expect(plan.status).toBe(403);
    const move = await agent.patch(`/api/almanac/tasks/${palpation.id}`).send({ action: 'skip', reason: 'Not today', version: palpation.version });
    expect(move.status).toBe(403);
    expect((await agent.patch('/api/almanac/settings').send({ palpationDays: 13, version: 0 })).status).toBe(403);
    expect((await agent.post(`/api/services/${service.id}/palpations`).send({ palpatedOn: farmToday(), result: 'positive' })).status).toBe(403);
    expect((await almanacCounts(coop.id)).taskStates).toEqual(before.taskStates);

    const tick = await agent.patch(`/api/almanac/tasks/${palpation.id}`).send({ action: 'done', note: 'Felt four or five', version: palpation.version });
    expect(tick.status).toBe(200);
    expect(tick.body).toMatchObject({ state: 'done', completionReview: 'pending', doneBy: { id: coop.apprentice.id } });
    expect((await agent.post(`/api/almanac/tasks/${palpation.id}/review`).send({ decision: 'accepted', version: tick.body.version })).status).toBe(403);

    // The mentor returns it: it is open again, with the comment.
    const mentor = await agentOf(coop.member.email);
    expect(((await mentor.get('/api/almanac/summary')).body as AlmanacSummaryDto).pendingReview).toBe(1);
    const returned = await mentor.post(`/api/almanac/tasks/${palpation.id}/review`).send({ decision: 'returned', comment: 'Palpate with me tomorrow', version: tick.body.version });
    expect(returned.status).toBe(200);
    expect(returned.body).toMatchObject({ state: 'open', completionReview: 'returned', reviewComment: 'Palpate with me tomorrow', doneOn: null });
    const again = await agent.patch(`/api/almanac/tasks/${palpation.id}`).send({ action: 'done', version: returned.body.version });
    const accepted = await mentor.post(`/api/almanac/tasks/${palpation.id}/review`).send({ decision: 'accepted', version: again.body.version });
    expect(accepted.body).toMatchObject({ state: 'done', completionReview: 'accepted' });
    const row = (await taskRows(coop.id, { serviceId: service.id })).find((r) => r.id === palpation.id);
    expect(row).toMatchObject({ state: 'done', completion_review: 'accepted' });
  });

  it('when another farm or another co-op asks for the farm\'s service or task, then it is not there (404) and nothing changes', async () => {
    const task = service.tasks.find((t) => t.kind === 'nest_box_in')!;
    for (const email of [coop.otherFarmMember.email, foreign.admin.email]) {
      const agent = await agentOf(email);
      const before = await almanacCounts(coop.id);
      expect((await agent.get(`/api/services/${service.id}`)).status).toBe(404);
      expect((await agent.patch(`/api/almanac/tasks/${task.id}`).send({ action: 'done', version: task.version })).status).toBe(404);
      expect((await agent.post('/api/almanac/tasks/bulk').send({ action: 'skip', reason: 'x', tasks: [{ id: task.id, version: task.version }] })).status).toBe(404);
      expect((await agent.post(`/api/services/${service.id}/palpations`).send({ palpatedOn: farmToday(), result: 'negative' })).status).toBe(404);
      const agenda = (await agent.get('/api/almanac/tasks')).body as AgendaDto;
      expect([...agenda.tasks, ...agenda.overdue].some((t) => t.serviceId === service.id)).toBe(false);
      expect(await almanacCounts(coop.id)).toEqual(before);
    }
  });
});

describe('live updates', () => {
  const server = liveTestServer({ signIn: ROOMY_SIGN_IN });
  const { kit } = server;

  it('when a service is recorded, then the farm\'s room hears the Almanac changed after commit; other farms hear nothing', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member);
    const partner = await kit.listen(coop.apprentice.email);
    const neighbour = await kit.listen(coop.otherFarmMember.email);
    const refused = await (await agentOf(coop.member.email)).post('/api/services').send({ doeId: buck.id, buckId: doe.id, servicedOn: farmToday() });
    expect(refused.status).toBe(400);
    await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(1) });
    await expect.poll(() => partner.heard.get(RealtimeEvent.almanacChanged)?.length ?? 0).toBe(1);
    expect(partner.heard.get(RealtimeEvent.almanacChanged)![0]).toEqual({ farmId: coop.farms[0]!.id });
    expect(neighbour.heard.get(RealtimeEvent.almanacChanged)).toBeUndefined();
  });
});

describe('arrivals and the co-op\'s quarantine rule', () => {
  it('when an animal arrives, or is lent to another farm, then a quarantine task spans the co-op\'s quarantine days at the farm it arrives at', async () => {
    const coop = await createTestCoop();
    // The co-op's rule (30 days by default; a common RHDV2 recommendation, Minnesota Board of Animal Health).
    const arrived = await addAnimalAs(coop.member, { sex: 'doe', birthDate: '2024-01-01', origin: 'arrived', arrivedOn: daysAgo(5), breederName: 'Gorse Hill' });
    const rows = await taskRows(coop.id, { animalId: arrived.id });
    expect(rows).toEqual([expect.objectContaining({ kind: 'quarantine_end', due_on: addDays(daysAgo(5), 30), window_start: daysAgo(5), window_end: addDays(daysAgo(5), 30), state: 'open' })]);

    const buck = await addAnimalAs(coop.member, { sex: 'buck', birthDate: '2023-01-01' });
    const agent = await agentOf(coop.member.email);
    const lent = await agent.post(`/api/animals/${buck.id}/custody-events`).send({ kind: 'lent', toFarmId: coop.farms[1]!.id, movedOn: daysAgo(2) });
    expect(lent.status).toBe(201);
    const lentRows = await asTenant(coop.id, async (c) => (await c.query('SELECT farm_id, due_on::text AS due_on FROM almanac_tasks WHERE animal_id = $1', [buck.id])).rows);
    expect(lentRows).toEqual([{ farm_id: coop.farms[1]!.id, due_on: addDays(daysAgo(2), 30) }]);
    const neighbour = (await (await agentOf(coop.otherFarmMember.email)).get('/api/almanac/tasks').query({ to: addDays(farmToday(), 40) })).body as AgendaDto;
    expect(neighbour.tasks.map((t) => [t.kind, t.animal?.id])).toEqual([['quarantine_end', buck.id]]);
  });
});
