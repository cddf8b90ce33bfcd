import { afterAll, describe, expect, it } from 'vitest';
import { addDays, RealtimeEvent, USDA_CLASS_LIMITS, type ProcessingListDto, type ProcessingRecordDto } from '@burrowline/shared';
import { withTenant } from '../../packages/server/src/db/tenant';
import { processingFactsOfFarm } from '../../packages/server/src/modules/processing/processing.service';
import { breedingPair, daysAgo, farmToday } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { growingGroupAs, healthYieldCounts, markAs, processingAs, treatmentAs } from '../support/health-yield';
import { addAnimalAs } from '../support/herd';
import { liveTestServer } from '../support/sockets';
import { agentFor, ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

const recordRow = (coopId: string, id: string) =>
  asTenant(coopId, async (c) => (await c.query(
    `SELECT processed_on::text, animal_id, group_id, head_count, age_days, live_grams, hot_carcass_grams, chilled_carcass_grams,
            hot_dress_out_percent::text, chilled_dress_out_percent::text, usda_class, flags, recorded_by
       FROM processing_records WHERE id = $1`, [id])).rows[0]);

describe('processing records and their yields', () => {
  it('when 3 heads of a 17-head group are processed, then the group list, its page and the weigh-in form count 14', async () => {
    const coop = await createTestCoop();
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 80, heads: 17, name: 'Oat pen' });
    const agent = await agentOf(coop.member.email);
    await agent.post('/api/processing-records').send({ groupId: group.id, processedOn: daysAgo(1), headCount: 3, liveGrams: 7200, hotCarcassGrams: 3960 }).expect(201);

    const list = await agent.get('/api/grow-out/groups').query({ status: 'growing' }).expect(200);
    expect(list.body.groups.find((g: { id: string }) => g.id === group.id)).toMatchObject({ heads: 17, currentHeads: 14 });
    const page = await agent.get(`/api/grow-out/groups/${group.id}`).expect(200);
    expect(page.body).toMatchObject({ heads: 17, currentHeads: 14 });
    const tooMany = await agent.post(`/api/grow-out/groups/${group.id}/weigh-ins`).send({ weighedOn: farmToday(), totalGrams: 40_000, headCount: 17 });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.details.headCount).toEqual(['The group has 14 heads; 17 is more']);
    await agent.post(`/api/grow-out/groups/${group.id}/weigh-ins`).send({ weighedOn: farmToday(), totalGrams: 33_600, headCount: 14 }).expect(201);
  });

  it('when a member processes a fryer from the Herd, then dress-out and USDA class are computed and kept, and the Herd shows it processed', async () => {
    const coop = await createTestCoop();
    const fryer = await addAnimalAs(coop.member, { sex: 'buck', name: 'Pippin', birthDate: daysAgo(70) });
    const agent = await agentOf(coop.member.email);
    const res = await agent.post('/api/processing-records').send({ animalId: fryer.id, processedOn: farmToday(), liveGrams: 2270, hotCarcassGrams: 1250, chilledCarcassGrams: 1220 });
    expect(res.status).toBe(201);
    const record = res.body as ProcessingRecordDto;
    // Dress-out = carcass ÷ live: 1250/2270 = 55.07 % hot, 1220/2270 = 53.74 % chilled — within the published
    // 55–56 % head-on (Kuzelov & Atanasova 2011) give or take, and above half the live weight (MSU Extension 4H1508).
    // USDA FSIS "Rabbit from Farm to Table": under 12 weeks (70 d) with a carcass of at least 1½ lb (680.4 g): fryer.
    expect(record).toMatchObject({
      animal: { id: fryer.id, name: 'Pippin' }, group: null, headCount: 1, ageDays: 70, liveGrams: 2270, hotCarcassGrams: 1250, chilledCarcassGrams: 1220,
      hotDressOutPercent: 55.07, chilledDressOutPercent: 53.74, usdaClass: 'fryer', usdaClassNote: null, flags: [], recordedBy: { id: coop.member.id },
    });
    expect(USDA_CLASS_LIMITS.fryerMinCarcassGrams).toBeCloseTo(680.39, 2);
    expect(await recordRow(coop.id, record.id)).toEqual({
      processed_on: farmToday(), animal_id: fryer.id, group_id: null, head_count: 1, age_days: 70, live_grams: 2270, hot_carcass_grams: 1250,
      chilled_carcass_grams: 1220, hot_dress_out_percent: '55.07', chilled_dress_out_percent: '53.74', usda_class: 'fryer', flags: [], recorded_by: coop.member.id,
    });
    const herd = await asTenant(coop.id, async (c) => (await c.query(
      `SELECT a.disposition, e.kind, e.value, e.effective_on::text, e.cause FROM animals a JOIN animal_status_events e ON e.animal_id = a.id WHERE a.id = $1 AND e.kind = 'disposition' AND e.value = 'processed'`, [fryer.id])).rows);
    expect(herd).toEqual([{ disposition: 'processed', kind: 'disposition', value: 'processed', effective_on: farmToday(), cause: 'Processing record' }]);
    const list = (await agent.get('/api/processing-records')).body as ProcessingListDto;
    expect(list.records.map((r) => r.id)).toEqual([record.id]);
  });

  it('when figures fall outside the usual range or between the USDA definitions, then the record keeps the flag and says "unclassed" or notes the weight', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const young = await addAnimalAs(coop.member, { sex: 'doe', birthDate: daysAgo(100) });
    const low = (await agent.post('/api/processing-records').send({ animalId: young.id, processedOn: farmToday(), liveGrams: 2500, hotCarcassGrams: 1150 })).body as ProcessingRecordDto;
    // 1150/2500 = 46 %: under half the live weight (MSU Extension 4H1508) → a warning; 100 d lies between 12 weeks and 8 months (USDA FSIS) → unclassed.
    expect(low).toMatchObject({ hotDressOutPercent: 46, usdaClass: 'unclassed', flags: [expect.objectContaining({ level: 'warning', code: 'below_usual', field: 'hotCarcassGrams' })] });
    expect((await recordRow(coop.id, low.id)).flags).toEqual([expect.objectContaining({ code: 'below_usual' })]);
    const old = await addAnimalAs(coop.member, { sex: 'doe', birthDate: '2023-04-01' });
    const roaster = (await agent.post('/api/processing-records').send({ animalId: old.id, processedOn: farmToday(), liveGrams: 3400, hotCarcassGrams: 1800, chilledCarcassGrams: 1780 })).body as ProcessingRecordDto;
    // Over 8 months (USDA FSIS): roaster; a carcass of 1780 g is not over 4 lb (1814.4 g), which a roaster usually is.
    expect(roaster).toMatchObject({ usdaClass: 'roaster', usdaClassNote: 'Not over 4 lb, which a roaster usually is', hotDressOutPercent: 52.94, chilledDressOutPercent: 52.35 });
  });

  it('when a batch of a group\'s heads is processed, then totals, age from the group\'s birth date and the per-head class are kept; more heads than are left are refused', async () => {
    const coop = await createTestCoop();
    const { group, litter } = await growingGroupAs(coop.member, { kindledDaysAgo: 80, heads: 6, name: 'Barley pen' });
    const agent = await agentOf(coop.member.email);
    const res = await agent.post('/api/processing-records').send({ groupId: group.id, processedOn: farmToday(), headCount: 4, liveGrams: 9600, hotCarcassGrams: 5280 });
    expect(res.status).toBe(201);
    // 5280/9600 = 55 %; 1320 g a head at 80 days: fryer (USDA FSIS).
    expect(res.body).toMatchObject({ group: { id: group.id, name: 'Barley pen' }, animal: null, headCount: 4, ageDays: 80, hotDressOutPercent: 55, chilledDressOutPercent: null, usdaClass: 'fryer' });
    expect(litter.kindledOn).toBe(daysAgo(80));
    const before = await healthYieldCounts(coop.id);
    const tooMany = await agent.post('/api/processing-records').send({ groupId: group.id, processedOn: farmToday(), headCount: 3, liveGrams: 7200, hotCarcassGrams: 3900 });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.details.headCount).toEqual(['Barley pen has 2 heads left; 3 cannot be processed from it']);
    expect(await healthYieldCounts(coop.id)).toEqual(before);
    const groupBefore = await agent.get(`/api/grow-out/groups/${group.id}`);
    expect(groupBefore.body).toMatchObject({ status: 'growing' });
    expect((await agent.post('/api/processing-records').send({ groupId: group.id, processedOn: farmToday(), headCount: 2, liveGrams: 4700, hotCarcassGrams: 2600 })).status).toBe(201);
    // Its last heads processed, the group is closed on that day (no one has to remember to).
    expect((await agent.get(`/api/grow-out/groups/${group.id}`)).body).toMatchObject({ status: 'closed', closedOn: farmToday() });

    const facts = await withTenant({ coopId: coop.id }, (tx) => processingFactsOfFarm(tx, coop.id, coop.farms[0]!.id));
    expect(facts.map((f) => [f.groupId, f.headCount, f.liveGrams, f.hotCarcassGrams, f.chilledCarcassGrams, f.ageDays])).toEqual([
      [group.id, 4, 9600, 5280, null, 80],
      [group.id, 2, 4700, 2600, null, 80],
    ]);
  });

  it('when two batches that together take more heads than a group has are saved at the same moment, then one is kept and the other refused', async () => {
    const coop = await createTestCoop();
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 80, heads: 6, name: 'Oat pen' });
    const [first, second] = await Promise.all([agentOf(coop.member.email), agentOf(coop.admin.email)]);
    const batch = { groupId: group.id, processedOn: farmToday(), headCount: 4, liveGrams: 9600, hotCarcassGrams: 5280 };
    const answers = await Promise.all([first.post('/api/processing-records').send(batch), second.post('/api/processing-records').send(batch)]);
    expect(answers.map((a) => a.status).sort()).toEqual([201, 400]);
    const kept = await withTenant({ coopId: coop.id }, (tx) => processingFactsOfFarm(tx, coop.id, coop.farms[0]!.id));
    expect(kept.map((k) => k.headCount)).toEqual([4]);
  });

  it('when a grow-out group was closed, then its heads may be recorded up to its closing day but not after, and it can no longer be marked', async () => {
    const coop = await createTestCoop();
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 90, heads: 5, name: 'Millet pen' });
    const agent = await agentOf(coop.member.email);
    const closed = await agent.post(`/api/grow-out/groups/${group.id}/close`).send({ closedOn: daysAgo(3), version: group.version });
    expect(closed.status).toBe(200);
    const before = await healthYieldCounts(coop.id);
    const late = await agent.post('/api/processing-records').send({ groupId: group.id, processedOn: daysAgo(2), headCount: 5, liveGrams: 12_500, hotCarcassGrams: 7000 });
    expect(late.status).toBe(400);
    expect(late.body.error.details.groupId).toEqual([`Millet pen was closed on ${daysAgo(3)}`]);
    const mark = await agent.post('/api/processing-marks').send({ groupId: group.id, plannedOn: farmToday() });
    expect(mark.status).toBe(400);
    expect(await healthYieldCounts(coop.id)).toEqual(before);
    const onTheDay = await agent.post('/api/processing-records').send({ groupId: group.id, processedOn: daysAgo(3), headCount: 5, liveGrams: 12_500, hotCarcassGrams: 7000 });
    expect(onTheDay.status).toBe(201);
    // 87 days old: past 12 weeks and not 8 months: neither class by the USDA FSIS definitions.
    expect(onTheDay.body).toMatchObject({ ageDays: 87, usdaClass: 'unclassed', hotDressOutPercent: 56 });
  });

  it('when the input is bad (carcass heavier than live, chilled heavier than hot, negative or absurd weights, a future date, another farm\'s or co-op\'s animal, two heads for one animal), then 400 names the field and nothing is written', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const fryer = await addAnimalAs(coop.member, { sex: 'buck', birthDate: daysAgo(70) });
    const neighbours = await addAnimalAs(coop.otherFarmMember, { sex: 'buck', birthDate: daysAgo(70) });
    const outsider = await addAnimalAs(foreign.member, { sex: 'buck', birthDate: daysAgo(70) });
    const agent = await agentOf(coop.member.email);
    const before = await healthYieldCounts(coop.id);
    const ok = { animalId: fryer.id, processedOn: farmToday(), liveGrams: 2270, hotCarcassGrams: 1250 };
    const cases: [Record<string, unknown>, string, string | RegExp][] = [
      [{ liveGrams: 2000, hotCarcassGrams: 2100 }, 'hotCarcassGrams', 'The hot carcass (2100 g) weighs more than the live weight (2000 g)'],
      [{ chilledCarcassGrams: 1300 }, 'chilledCarcassGrams', 'The chilled carcass (1300 g) weighs more than the hot one (1250 g); check the weights'],
      [{ liveGrams: -2270 }, 'liveGrams', 'The live weight must be above zero'],
      [{ hotCarcassGrams: 0 }, 'hotCarcassGrams', 'The hot carcass weight must be above zero'],
      [{ liveGrams: 25_000, hotCarcassGrams: 12_000 }, 'liveGrams', '25000 g a head is more than any rabbit weighs; check the weight and the head count'],
      [{ liveGrams: 9000, hotCarcassGrams: 5000 }, 'liveGrams', /9000 g a head is not possible at 70 days/],
      [{ processedOn: addDays(farmToday(), 1) }, 'processedOn', `${addDays(farmToday(), 1)} is in the future (today is ${farmToday()})`],
      [{ animalId: neighbours.id }, 'animalId', 'Choose an animal your farm owns and keeps'],
      [{ animalId: outsider.id }, 'animalId', 'Choose an animal your farm owns and keeps'],
      [{ headCount: 2 }, 'headCount', 'A record for one animal has one head'],
      [{ animalId: undefined }, 'animalId', 'Choose the animal or the grow-out group processed (one of them)'],
    ];
    for (const [overrides, field, message] of cases) {
      const res = await agent.post('/api/processing-records').send(JSON.parse(JSON.stringify({ ...ok, ...overrides })));
      expect(res.status, JSON.stringify(overrides)).toBe(400);
      const messages = res.body.error.details[field] as string[];
      expect(messages.some((m) => (typeof message === 'string' ? m === message : message.test(m))), `${JSON.stringify(overrides)}: ${JSON.stringify(res.body.error.details)}`).toBe(true);
    }
    expect(await healthYieldCounts(coop.id)).toEqual(before);
    expect((await agent.post('/api/processing-records').send(ok)).status).toBe(201);
    const again = await agent.post('/api/processing-records').send(ok);
    expect(again.status).toBe(400);
    expect(again.body.error.details.animalId[0]).toMatch(/is no longer on the farm \(processed\)/);
  });
});

describe('withdrawal before processing', () => {
  it('when an animal or group is under withdrawal, then it can be neither marked for processing nor processed on a covered date, but breeding is only a warning and it clears the day after', async () => {
    const coop = await createTestCoop();
    const { doe: treated, buck } = await breedingPair(coop.member, { doe: 'Thistle' });
    const cleared = await addAnimalAs(coop.member, { sex: 'doe', name: 'Clearing', birthDate: '2023-05-01' });
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 60, heads: 5, name: 'Rye pen' });
    await treatmentAs(coop.member, { animalId: treated.id, startedOn: daysAgo(5), lastDoseOn: daysAgo(1), withdrawalDays: 10 });
    await treatmentAs(coop.member, { animalId: cleared.id, startedOn: daysAgo(20), lastDoseOn: daysAgo(15), withdrawalDays: undefined, withdrawalEndsOn: daysAgo(1) });
    await treatmentAs(coop.member, { groupId: group.id, treatment: 'Toltrazuril in water', startedOn: daysAgo(2), lastDoseOn: farmToday(), withdrawalDays: 14 });
    const ends = addDays(daysAgo(1), 10);
    const agent = await agentOf(coop.member.email);
    const before = await healthYieldCounts(coop.id);

    const mark = await agent.post('/api/processing-marks').send({ animalId: treated.id, plannedOn: addDays(farmToday(), 20) });
    expect(mark.status).toBe(400);
    expect(mark.body.error.details.animalId).toEqual([`Under withdrawal (Coccidiosis course) through ${ends}, set by Dr. Wren Hollis: it can be marked for processing from ${addDays(ends, 1)}`]);
    const record = await agent.post('/api/processing-records').send({ animalId: treated.id, processedOn: farmToday(), liveGrams: 4200, hotCarcassGrams: 2300 });
    expect(record.status).toBe(400);
    expect(record.body.error.details.animalId).toEqual([`Under withdrawal (Coccidiosis course) through ${ends}, set by Dr. Wren Hollis: it can be processed from ${addDays(ends, 1)}`]);
    const groupMark = await agent.post('/api/processing-marks').send({ groupId: group.id, plannedOn: addDays(farmToday(), 3) });
    expect(groupMark.status).toBe(400);
    expect(groupMark.body.error.details.groupId[0]).toMatch(/^Under withdrawal \(Toltrazuril in water\) through/);
    const groupRecord = await agent.post('/api/processing-records').send({ groupId: group.id, processedOn: farmToday(), headCount: 2, liveGrams: 4400, hotCarcassGrams: 2400 });
    expect(groupRecord.status).toBe(400);
    expect(groupRecord.body.error.details.groupId[0]).toMatch(/it can be processed from/);
    // A processing date the (now ended) withdrawal still covered is refused too.
    const covered = await agent.post('/api/processing-records').send({ animalId: cleared.id, processedOn: daysAgo(2), liveGrams: 4200, hotCarcassGrams: 2300 });
    expect(covered.status).toBe(400);
    expect(await healthYieldCounts(coop.id)).toEqual(before);

    // Breeding the doe under withdrawal: a warning to confirm, then saved.
    expect((await agent.post('/api/services').send({ doeId: treated.id, buckId: buck.id, servicedOn: farmToday() })).status).toBe(422);
    expect((await agent.post('/api/services').send({ doeId: treated.id, buckId: buck.id, servicedOn: farmToday(), confirm: true })).status).toBe(201);

    // The day after the withdrawal's last day it may be marked and processed.
    expect((await agent.post('/api/processing-marks').send({ animalId: cleared.id, plannedOn: farmToday() })).status).toBe(201);
    expect((await agent.post('/api/processing-records').send({ animalId: cleared.id, processedOn: farmToday(), liveGrams: 4200, hotCarcassGrams: 2300 })).status).toBe(201);
  });
});

describe('marks for processing', () => {
  it('when a member marks an animal and a group, then they are listed, a second mark is 409, a later withdrawal shows on the mark, processing completes it and a cancel needs the version', async () => {
    const coop = await createTestCoop();
    const fryer = await addAnimalAs(coop.member, { sex: 'buck', name: 'Burdock', birthDate: daysAgo(72) });
    const other = await addAnimalAs(coop.member, { sex: 'buck', name: 'Yarrow', birthDate: daysAgo(72) });
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 4, name: 'Oat pen' });
    const agent = await agentOf(coop.member.email);
    const marked = await agent.post('/api/processing-marks').send({ animalId: fryer.id, plannedOn: addDays(farmToday(), 3), notes: 'Saturday' });
    expect(marked.status).toBe(201);
    expect(marked.body).toMatchObject({ animal: { id: fryer.id, name: 'Burdock' }, plannedOn: addDays(farmToday(), 3), status: 'planned', notes: 'Saturday', version: 0, markedBy: { id: coop.member.id } });
    expect((await agent.post('/api/processing-marks').send({ animalId: fryer.id, plannedOn: addDays(farmToday(), 5) })).status).toBe(409);
    const groupMark = (await agent.post('/api/processing-marks').send({ groupId: group.id, plannedOn: addDays(farmToday(), 4) })).body;
    const yarrowMark = (await markAs(coop.member, { animalId: other.id, plannedOn: addDays(farmToday(), 6) }));
    await treatmentAs(coop.member, { animalId: other.id, withdrawalDays: 30 });
    const list = (await agent.get('/api/processing-records')).body as ProcessingListDto;
    expect(list.marks.map((m) => [m.animal?.name ?? m.group?.name, m.plannedOn, m.withdrawalEndsOn])).toEqual([
      ['Burdock', addDays(farmToday(), 3), null],
      ['Oat pen', addDays(farmToday(), 4), null],
      ['Yarrow', addDays(farmToday(), 6), addDays(daysAgo(1), 30)],
    ]);
    expect(yarrowMark.status).toBe('planned');

    await processingAs(coop.member, { animalId: fryer.id, processedOn: farmToday(), liveGrams: 2300, hotCarcassGrams: 1270 });
    const status = await asTenant(coop.id, async (c) => (await c.query('SELECT status FROM processing_marks WHERE id = $1', [marked.body.id])).rows[0].status);
    expect(status).toBe('done');

    expect((await agent.post(`/api/processing-marks/${groupMark.id}/cancellation`).send({ version: 3 })).status).toBe(409);
    const cancelled = await agent.post(`/api/processing-marks/${groupMark.id}/cancellation`).send({ version: 0 });
    expect(cancelled.status).toBe(200);
    expect(cancelled.body).toMatchObject({ status: 'cancelled', version: 1 });
    expect((await agent.post(`/api/processing-marks/${groupMark.id}/cancellation`).send({ version: 1 })).status).toBe(409);
    const remaining = (await agent.get('/api/processing-records')).body as ProcessingListDto;
    expect(remaining.marks.map((m) => m.animal?.name)).toEqual(['Yarrow']);
  });

  it('when an apprentice, another farm\'s member, another co-op or nobody tries, then the apprentice reads only (403 on writes), others see none of it (404 on the mark) and the signed-out get 401; nothing is written', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const fryer = await addAnimalAs(coop.member, { sex: 'buck', birthDate: daysAgo(70) });
    const spare = await addAnimalAs(coop.member, { sex: 'buck', birthDate: daysAgo(70) });
    await processingAs(coop.member, { animalId: fryer.id, processedOn: farmToday(), liveGrams: 2270, hotCarcassGrams: 1250 });
    const mark = await markAs(coop.member, { animalId: spare.id, plannedOn: addDays(farmToday(), 2) });
    const before = await healthYieldCounts(coop.id);

    const apprentice = await agentOf(coop.apprentice.email);
    const read = (await apprentice.get('/api/processing-records')).body as ProcessingListDto;
    expect(read.records).toHaveLength(1);
    expect(read.marks).toHaveLength(1);
    expect((await apprentice.post('/api/processing-records').send({ animalId: spare.id, processedOn: farmToday(), liveGrams: 2270, hotCarcassGrams: 1250 })).status).toBe(403);
    expect((await apprentice.post('/api/processing-marks').send({ animalId: spare.id, plannedOn: farmToday() })).status).toBe(403);
    expect((await apprentice.post(`/api/processing-marks/${mark.id}/cancellation`).send({ version: 0 })).status).toBe(403);

    const neighbour = await agentOf(coop.otherFarmMember.email);
    expect((await neighbour.get('/api/processing-records')).body).toMatchObject({ records: [], marks: [] });
    expect((await neighbour.post(`/api/processing-marks/${mark.id}/cancellation`).send({ version: 0 })).status).toBe(404);
    expect((await neighbour.post('/api/processing-records').send({ animalId: spare.id, processedOn: farmToday(), liveGrams: 2270, hotCarcassGrams: 1250 })).status).toBe(400);
    const outsider = await agentOf(foreign.admin.email);
    expect((await outsider.get('/api/processing-records')).body).toMatchObject({ records: [], marks: [] });
    expect((await outsider.post(`/api/processing-marks/${mark.id}/cancellation`).send({ version: 0 })).status).toBe(404);
    expect((await agentFor(handle).get('/api/processing-records')).status).toBe(401);
    expect((await agentFor(handle).post('/api/processing-marks').send({ animalId: spare.id, plannedOn: farmToday() })).status).toBe(401);
    expect(await healthYieldCounts(coop.id)).toEqual(before);
  });
});

describe('live updates', () => {
  const server = liveTestServer({ signIn: ROOMY_SIGN_IN });
  const { kit } = server;

  it('when a processing record is saved, then the farm\'s room hears processing and the Herd changed; other farms hear nothing; a refused one announces nothing', async () => {
    const coop = await createTestCoop();
    const fryer = await addAnimalAs(coop.member, { sex: 'buck', birthDate: daysAgo(70) });
    const partner = await kit.listen(coop.apprentice.email);
    const neighbour = await kit.listen(coop.otherFarmMember.email);
    await expect(processingAs(coop.member, { animalId: fryer.id, processedOn: farmToday(), liveGrams: 2270, hotCarcassGrams: 2300 })).rejects.toThrow();
    await processingAs(coop.member, { animalId: fryer.id, processedOn: farmToday(), liveGrams: 2270, hotCarcassGrams: 1250 });
    await expect.poll(() => partner.heard.get(RealtimeEvent.processingChanged)?.length ?? 0).toBe(1);
    expect(partner.heard.get(RealtimeEvent.processingChanged)![0]).toEqual({ farmId: coop.farms[0]!.id });
    await expect.poll(() => partner.heard.get(RealtimeEvent.herdChanged)?.length ?? 0).toBeGreaterThan(0);
    expect(neighbour.heard.get(RealtimeEvent.processingChanged)).toBeUndefined();
  });
});

