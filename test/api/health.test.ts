import { afterAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { addDays, RealtimeEvent, WITHDRAWAL_MISSING_MESSAGE, type HeatCautionDto, type TreatmentDto, type WithdrawalStateDto } from '@burrowline/shared';
import { breedingPair, daysAgo, farmToday, litterAs, serviceAs } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { growingGroupAs, healthYieldCounts, temperatureAs, treatmentAs, treatmentBody } from '../support/health-yield';
import { addAnimalAs } from '../support/herd';
import { liveTestServer } from '../support/sockets';
import { agentFor, ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

const treatmentRow = (coopId: string, id: string) =>
  asTenant(coopId, async (c) => (await c.query(
    `SELECT animal_id, group_id, treatment, dose, route, veterinarian, started_on::text, last_dose_on::text, ends_on::text, withdrawal_days, recorded_by
       FROM treatments WHERE id = $1`, [id])).rows[0]);

describe('treatments and their withdrawal', () => {
  it('when a member records a doe\'s treatment with a withdrawal in days after the last dose, then it is kept in full and the doe is under withdrawal until then', async () => {
    const coop = await createTestCoop();
    const doe = await addAnimalAs(coop.member, { sex: 'doe', name: 'Bramble', birthDate: '2023-03-01' });
    const agent = await agentOf(coop.member.email);
    const res = await agent.post('/api/treatments').send(treatmentBody({
      animalId: doe.id, treatment: 'Sulfadimethoxine for coccidiosis', dose: '1 ml per litre', route: 'in_water',
      veterinarian: 'Dr. Wren Hollis', startedOn: daysAgo(6), lastDoseOn: daysAgo(2), withdrawalDays: 10,
    }));
    expect(res.status).toBe(201);
    const t = res.body as TreatmentDto;
    expect(t).toMatchObject({
      animal: { id: doe.id, name: 'Bramble' }, group: null, treatment: 'Sulfadimethoxine for coccidiosis', dose: '1 ml per litre', route: 'in_water',
      veterinarian: 'Dr. Wren Hollis', startedOn: daysAgo(6), lastDoseOn: daysAgo(2), withdrawalEndsOn: addDays(daysAgo(2), 10), withdrawalDays: 10, underWithdrawal: true,
    });
    expect(await treatmentRow(coop.id, t.id)).toEqual({
      animal_id: doe.id, group_id: null, treatment: 'Sulfadimethoxine for coccidiosis', dose: '1 ml per litre', route: 'in_water', veterinarian: 'Dr. Wren Hollis',
      started_on: daysAgo(6), last_dose_on: daysAgo(2), ends_on: addDays(daysAgo(2), 10), withdrawal_days: 10, recorded_by: coop.member.id,
    });

    const state = (await agent.get('/api/withdrawals').query({ animalId: doe.id })).body as WithdrawalStateDto;
    expect(state).toEqual({
      today: farmToday(),
      withdrawals: [expect.objectContaining({ treatmentId: t.id, treatment: 'Sulfadimethoxine for coccidiosis', veterinarian: 'Dr. Wren Hollis', withdrawalEndsOn: addDays(daysAgo(2), 10), clearFrom: addDays(daysAgo(2), 11) })],
    });
    const farm = (await agent.get('/api/withdrawals')).body as WithdrawalStateDto;
    expect(farm.withdrawals.map((w) => w.animal?.id)).toEqual([doe.id]);
    const list = (await agent.get('/api/treatments')).body.treatments as TreatmentDto[];
    expect(list.map((x) => x.id)).toEqual([t.id]);
  });

  it('when a grow-out group is treated with a withdrawal end date, then the group\'s withdrawal state says until when; "no withdrawal" is an explicit 0 days', async () => {
    const coop = await createTestCoop();
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 50, heads: 6, name: 'Clover pen' });
    const agent = await agentOf(coop.member.email);
    const res = await agent.post('/api/treatments').send(treatmentBody({ groupId: group.id, startedOn: daysAgo(3), lastDoseOn: daysAgo(1), withdrawalDays: undefined, withdrawalEndsOn: addDays(farmToday(), 7) }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ animal: null, group: { id: group.id, name: 'Clover pen' }, withdrawalEndsOn: addDays(farmToday(), 7), withdrawalDays: 8 });
    const state = (await agent.get('/api/withdrawals').query({ groupId: group.id })).body as WithdrawalStateDto;
    expect(state.withdrawals).toEqual([expect.objectContaining({ group: { id: group.id, name: 'Clover pen' }, withdrawalEndsOn: addDays(farmToday(), 7), clearFrom: addDays(farmToday(), 8) })]);

    const doe = await addAnimalAs(coop.member, { sex: 'doe', birthDate: '2023-03-01' });
    const none = await agent.post('/api/treatments').send(treatmentBody({ animalId: doe.id, treatment: 'Wound wash', route: 'topical', startedOn: daysAgo(2), lastDoseOn: daysAgo(2), withdrawalDays: 0 }));
    expect(none.status).toBe(201);
    expect(none.body).toMatchObject({ withdrawalEndsOn: daysAgo(2), withdrawalDays: 0, underWithdrawal: false });
    expect((await agent.get('/api/withdrawals').query({ animalId: doe.id })).body.withdrawals).toEqual([]);
  });

  it('when a treatment has no withdrawal end, no veterinarian, a last day before the start, a withdrawal ending before the last dose, a future start or another farm\'s animal or group, then 400 names the field and nothing is written', async () => {
    const coop = await createTestCoop();
    const doe = await addAnimalAs(coop.member, { sex: 'doe', birthDate: '2023-03-01' });
    const neighbours = await addAnimalAs(coop.otherFarmMember, { sex: 'doe', birthDate: '2023-03-01' });
    const { group: theirGroup } = await growingGroupAs(coop.otherFarmMember, { kindledDaysAgo: 50, heads: 4 });
    const agent = await agentOf(coop.member.email);
    const before = await healthYieldCounts(coop.id);
    const cases: [Record<string, unknown>, string, string][] = [
      [{ animalId: doe.id, withdrawalDays: undefined }, 'withdrawalEndsOn', WITHDRAWAL_MISSING_MESSAGE],
      [{ animalId: doe.id, veterinarian: '' }, 'veterinarian', 'Name the veterinarian who prescribed it'],
      [{ animalId: doe.id, dose: ' ' }, 'dose', 'Give the dose the veterinarian prescribed'],
      [{ animalId: doe.id, route: 'rectal' }, 'route', 'Choose how it is given'],
      [{ animalId: doe.id, startedOn: daysAgo(2), lastDoseOn: daysAgo(4) }, 'lastDoseOn', 'The last day of treatment cannot come before it starts'],
      [{ animalId: doe.id, withdrawalDays: undefined, withdrawalEndsOn: daysAgo(3) }, 'withdrawalEndsOn', 'The withdrawal cannot end before the last day of treatment'],
      [{ animalId: doe.id, withdrawalDays: -1 }, 'withdrawalDays', 'Withdrawal days cannot be negative'],
      [{ animalId: doe.id, withdrawalEndsOn: farmToday() }, 'withdrawalDays', 'Give the withdrawal one way: its end date or its days, not both'],
      [{ animalId: doe.id, startedOn: addDays(farmToday(), 2), lastDoseOn: addDays(farmToday(), 3) }, 'startedOn', `The treatment starts on ${addDays(farmToday(), 2)}, a date in the future (today is ${farmToday()})`],
      [{ animalId: neighbours.id }, 'animalId', 'Choose an animal your farm keeps'],
      [{ groupId: theirGroup.id }, 'groupId', 'Choose a grow-out group of your farm'],
      [{}, 'animalId', 'Choose the animal or the grow-out group that was treated (one of them)'],
    ];
    for (const [overrides, field, message] of cases) {
      const body = { ...treatmentBody({}), ...overrides };
      const res = await agent.post('/api/treatments').send(JSON.parse(JSON.stringify(body)));
      expect(res.status, JSON.stringify(overrides)).toBe(400);
      expect(res.body.error.details[field], JSON.stringify(overrides)).toContain(message);
    }
    expect(await healthYieldCounts(coop.id)).toEqual(before);
  });

  it('when a treatment recorded before treatments had a dose, route and last day is read, then it still shows with its withdrawal end', async () => {
    const coop = await createTestCoop();
    const doe = await addAnimalAs(coop.member, { sex: 'doe', name: 'Old record', birthDate: '2023-03-01' });
    await asTenant(coop.id, (c) => c.query(
      `INSERT INTO treatments (coop_id, farm_id, animal_id, started_on, ends_on, treatment, veterinarian) VALUES ($1, $2, $3, $4, $5, 'Ear mites', 'Dr. Quill')`,
      [coop.id, coop.farms[0]!.id, doe.id, daysAgo(4), addDays(farmToday(), 3)],
    ), { commit: true });
    const list = (await (await agentOf(coop.member.email)).get('/api/treatments')).body.treatments as TreatmentDto[];
    expect(list).toEqual([expect.objectContaining({ treatment: 'Ear mites', dose: '', route: null, lastDoseOn: null, withdrawalDays: null, withdrawalEndsOn: addDays(farmToday(), 3), underWithdrawal: true })]);
  });

  it('when a doe is under withdrawal, then breeding her is a warning she can be confirmed past, not a block', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member, { doe: 'Sorrel' });
    await treatmentAs(coop.member, { animalId: doe.id, treatment: 'Ivermectin', route: 'injection', withdrawalDays: 20 });
    const agent = await agentOf(coop.member.email);
    const warned = await agent.post('/api/services').send({ doeId: doe.id, buckId: buck.id, servicedOn: farmToday() });
    expect(warned.status).toBe(422);
    expect(warned.body.error.details.doeId[0]).toBe(`She is under treatment (Ivermectin) until ${addDays(daysAgo(1), 20)}; ask the veterinarian before breeding her`);
    const saved = await agent.post('/api/services').send({ doeId: doe.id, buckId: buck.id, servicedOn: farmToday(), confirm: true });
    expect(saved.status).toBe(201);
    const rows = await asTenant(coop.id, (c) => c.query('SELECT id, doe_id, buck_id, serviced_on::text AS serviced_on FROM services WHERE doe_id = $1', [doe.id]));
    expect(rows.rows).toEqual([{ id: saved.body.id, doe_id: doe.id, buck_id: buck.id, serviced_on: farmToday() }]);
  });

  it('when an apprentice, another farm\'s member, another co-op or nobody asks, then the apprentice reads but records no treatment, others find nothing (404) and the signed-out get 401', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const doe = await addAnimalAs(coop.member, { sex: 'doe', birthDate: '2023-03-01' });
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 50, heads: 5 });
    await treatmentAs(coop.member, { animalId: doe.id });
    const before = await healthYieldCounts(coop.id);

    const apprentice = await agentOf(coop.apprentice.email);
    expect((await apprentice.get('/api/treatments')).body.treatments).toHaveLength(1);
    expect((await apprentice.get('/api/withdrawals').query({ animalId: doe.id })).body.withdrawals).toHaveLength(1);
    const refused = await apprentice.post('/api/treatments').send(treatmentBody({ animalId: doe.id }));
    expect(refused.status).toBe(403);

    const neighbour = await agentOf(coop.otherFarmMember.email);
    expect((await neighbour.get('/api/withdrawals').query({ animalId: doe.id })).status).toBe(404);
    expect((await neighbour.get('/api/withdrawals').query({ groupId: group.id })).status).toBe(404);
    expect((await neighbour.get('/api/treatments')).body.treatments).toEqual([]);
    const outsider = await agentOf(foreign.admin.email);
    expect((await outsider.get('/api/withdrawals').query({ animalId: doe.id })).status).toBe(404);
    expect((await outsider.get('/api/withdrawals').query({ groupId: group.id })).status).toBe(404);
    expect((await outsider.post('/api/treatments').send(treatmentBody({ animalId: doe.id }))).status).toBe(400);
    expect((await agentFor(handle).get('/api/withdrawals')).status).toBe(401);
    expect((await agentFor(handle).post('/api/treatments').send(treatmentBody({ animalId: doe.id }))).status).toBe(401);
    expect(await healthYieldCounts(coop.id)).toEqual(before);
  });
});

describe('temperature readings and the heat caution', () => {
  it('when a member logs 86 °F in the barn, then it is stored as 30.0 °C and the caution names the doe due to kindle and the young litter', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member, { doe: 'Hazel' });
    await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(27) });
    const { litter, doe: dam } = await litterAs(coop.member, { servicedDaysAgo: 41, kindledDaysAgo: 10, bornAlive: 7, doe: 'Juniper' });
    await litterAs(coop.member, { servicedDaysAgo: 70, kindledDaysAgo: 39, bornAlive: 6, doe: 'Older litter' });
    const agent = await agentOf(coop.member.email);
    const res = await agent.post('/api/temperature-readings').send({ value: 86, unit: 'F', place: 'barn' });
    expect(res.status).toBe(201);
    // 86 °F = (86 − 32) × 5/9 = 30.0 °C (NIST HB44 temperature conversion).
    expect(res.body).toMatchObject({ celsius: 30, place: 'barn', hot: true, recordedBy: { id: coop.member.id } });
    const row = await asTenant(coop.id, async (c) => (await c.query('SELECT celsius::text, place, farm_id, recorded_by FROM temperature_readings WHERE id = $1', [res.body.id])).rows[0]);
    expect(row).toEqual({ celsius: '30.0', place: 'barn', farm_id: coop.farms[0]!.id, recorded_by: coop.member.id });

    const heat = (await agent.get('/api/heat-caution')).body as HeatCautionDto;
    expect(heat).toMatchObject({ hot: true, thresholdCelsius: 29.4, latest: { id: res.body.id, celsius: 30 } });
    // Kindling expected on day 31 after the service (Merck Veterinary Manual): 4 days from now.
    expect(heat.dueToKindle).toEqual([{ doe: expect.objectContaining({ id: doe.id, name: 'Hazel' }), dueOn: addDays(daysAgo(27), 31) }]);
    expect(heat.youngLitters).toEqual([{ litterId: litter.id, dam: expect.objectContaining({ id: dam.id, name: 'Juniper' }), kindledOn: daysAgo(10), ageDays: 10, alive: 7 }]);
    const listed = (await agent.get('/api/temperature-readings')).body;
    expect(listed.readings.map((r: { id: string }) => r.id)).toEqual([res.body.id]);
    expect(listed.heat.hot).toBe(true);
  });

  it('when the latest reading is 29.4 °C or 85 °F, then the caution shows; at 84 °F or 28 °C, or when the hot reading is over a day old, it does not', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const hot = async () => ((await agent.get('/api/heat-caution')).body as HeatCautionDto).hot;
    expect(await hot()).toBe(false);
    // Heat stress above about 85 °F (Texas Extension, TAMUK); 85 °F = 29.4 °C to one decimal.
    await agent.post('/api/temperature-readings').send({ value: 29.4, unit: 'C', takenAt: new Date(Date.now() - 60 * 60_000).toISOString() }).expect(201);
    expect(await hot()).toBe(true);
    await agent.post('/api/temperature-readings').send({ value: 84, unit: 'F', takenAt: new Date(Date.now() - 30 * 60_000).toISOString() }).expect(201);
    expect(await hot()).toBe(false);
    await agent.post('/api/temperature-readings').send({ value: 85, unit: 'F', takenAt: new Date(Date.now() - 20 * 60_000).toISOString() }).expect(201);
    expect(await hot()).toBe(true);
    await agent.post('/api/temperature-readings').send({ value: 28, unit: 'C' }).expect(201);
    expect(await hot()).toBe(false);

    const other = await createTestCoop();
    const theirs = await agentOf(other.member.email);
    await theirs.post('/api/temperature-readings').send({ value: 33, unit: 'C', takenAt: new Date(Date.now() - 25 * 60 * 60_000).toISOString() }).expect(201);
    expect(((await theirs.get('/api/heat-caution')).body as HeatCautionDto)).toMatchObject({ hot: false, latest: null });
  });

  it('when a reading is absurd, not a number, or in the future, then 400 names the field and nothing is written', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const before = await healthYieldCounts(coop.id);
    const cases: [Record<string, unknown>, string, string][] = [
      [{ value: -41, unit: 'C' }, 'value', '-41 °C is not a barn temperature; enter a reading between -40 to 55 °C'],
      [{ value: 56, unit: 'C' }, 'value', '56 °C is not a barn temperature; enter a reading between -40 to 55 °C'],
      [{ value: 140, unit: 'F' }, 'value', '140 °F is not a barn temperature; enter a reading between -40 to 131 °F'],
      [{ value: 'hot', unit: 'F' }, 'value', 'Enter the temperature as a number'],
      [{ value: 20, unit: 'K' }, 'unit', 'Choose °F or °C'],
      [{ value: 20, unit: 'C', takenAt: new Date(Date.now() + 60 * 60_000).toISOString() }, 'takenAt', 'That time is in the future'],
    ];
    for (const [body, field, message] of cases) {
      const res = await agent.post('/api/temperature-readings').send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.details[field], JSON.stringify(body)).toContain(message);
    }
    expect(await healthYieldCounts(coop.id)).toEqual(before);
  });

  it('when an apprentice logs a reading, then it is saved for the mentor\'s farm; other farms and co-ops do not see it, and the signed-out get 401', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const apprentice = await agentOf(coop.apprentice.email);
    const res = await apprentice.post('/api/temperature-readings').send({ value: 31, unit: 'C', place: 'hutch row' });
    expect(res.status).toBe(201);
    const row = await asTenant(coop.id, async (c) => (await c.query('SELECT farm_id, recorded_by FROM temperature_readings WHERE id = $1', [res.body.id])).rows[0]);
    expect(row).toEqual({ farm_id: coop.farms[0]!.id, recorded_by: coop.apprentice.id });
    expect(((await (await agentOf(coop.member.email)).get('/api/heat-caution')).body as HeatCautionDto).hot).toBe(true);
    expect(((await (await agentOf(coop.otherFarmMember.email)).get('/api/heat-caution')).body as HeatCautionDto).hot).toBe(false);
    expect((await (await agentOf(coop.otherFarmMember.email)).get('/api/temperature-readings')).body.readings).toEqual([]);
    expect((await (await agentOf(foreign.admin.email)).get('/api/temperature-readings')).body.readings).toEqual([]);
    expect((await agentFor(handle).post('/api/temperature-readings').send({ value: 20, unit: 'C' })).status).toBe(401);
    expect((await agentFor(handle).get('/api/heat-caution')).status).toBe(401);
  });
});

describe('live updates', () => {
  const server = liveTestServer({ signIn: ROOMY_SIGN_IN });
  const { kit } = server;

  it('when a hot reading is logged, then the farm\'s members hear it with the caution flag after commit; other farms hear nothing', async () => {
    const coop = await createTestCoop();
    const partner = await kit.listen(coop.member.email);
    const neighbour = await kit.listen(coop.otherFarmMember.email);
    const reading = await temperatureAs(coop.apprentice, { id: randomUUID(), value: 90, unit: 'F', place: 'barn' });
    await expect.poll(() => partner.heard.get(RealtimeEvent.temperatureRecorded)?.length ?? 0).toBe(1);
    // 90 °F = 32.2 °C.
    expect(partner.heard.get(RealtimeEvent.temperatureRecorded)![0]).toEqual({ farmId: coop.farms[0]!.id, readingId: reading.id, celsius: 32.2, hot: true });
    expect(neighbour.heard.get(RealtimeEvent.temperatureRecorded)).toBeUndefined();

    const doe = await addAnimalAs(coop.member, { sex: 'doe', birthDate: '2023-03-01' });
    await treatmentAs(coop.member, { animalId: doe.id });
    await expect.poll(() => partner.heard.get(RealtimeEvent.healthChanged)?.length ?? 0).toBe(1);
    expect(neighbour.heard.get(RealtimeEvent.healthChanged)).toBeUndefined();
  });
});
