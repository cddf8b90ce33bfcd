import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { weightInputToGrams, type WeighingRoundCandidatesDto, type WeighingRoundDto } from '@burrowline/shared';
import { daysAgo, farmToday } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { breedLitterAs, groupAs } from '../support/grow-out';
import { addAnimalAs, catalogueBreeds } from '../support/herd';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

const roundRows = (coopId: string, roundId: string) =>
  asTenant(coopId, async (c) => (await c.query(
    `SELECT animal_id, group_id, litter_id, total_grams, head_count, kit_weights, review_state, weighed_on::text AS weighed_on
       FROM weigh_ins WHERE round_id = $1 ORDER BY total_grams`, [roundId])).rows);
const roundCount = (coopId: string) =>
  asTenant(coopId, async (c) => ({
    rounds: (await c.query('SELECT count(*)::int AS n FROM weighing_rounds WHERE coop_id = $1', [coopId])).rows[0].n as number,
    weighIns: (await c.query('SELECT count(*)::int AS n FROM weigh_ins WHERE coop_id = $1', [coopId])).rows[0].n as number,
  }));

/** Three young animals of the member's farm, 70 days old (juniors of no recorded breed: the medium reference curve). */
async function threeJuniors(coop: TestCoop) {
  const born = daysAgo(70);
  return Promise.all(['Bramble', 'Sorrel', 'Wick'].map((name) => addAnimalAs(coop.member, { name, sex: 'buck', birthDate: born, lifecycle: 'junior' })));
}

describe('weighing rounds', () => {
  it('when a member saves three weights typed in pounds and ounces, then one round writes them in grams at 453.59237 g to the pound and each animal shows its weight', async () => {
    const coop = await createTestCoop();
    const [a, b, c] = await threeJuniors(coop);
    const agent = await agentOf(coop.member.email);
    // NIST Handbook 44, Appendix C (the international yard and pound agreement of 1959): 1 lb = 453.59237 g exactly, 1 oz = 28.349523125 g.
    const typed = [weightInputToGrams('4', '', 'lb_oz'), weightInputToGrams('3', '8', 'lb_oz'), weightInputToGrams('4', '4', 'lb_oz')];
    expect(typed).toEqual([1814, 1588, 1928]); // 4 × 453.59237 = 1,814.369 g; 3.5 × 453.59237 = 1,587.573 g; 4.25 × 453.59237 = 1,927.768 g
    const id = randomUUID();
    const res = await agent.post('/api/weighing-rounds').send({
      id, weighedOn: farmToday(),
      entries: [{ animalId: a!.id, grams: typed[0] }, { animalId: b!.id, grams: typed[1] }, { animalId: c!.id, grams: typed[2] }],
    });
    expect(res.status).toBe(201);
    const round = res.body as WeighingRoundDto;
    expect(round).toMatchObject({ id, weighedOn: farmToday(), reviewState: 'accepted', enteredBy: { id: coop.member.id } });
    expect(round.weighIns.map((w) => [w.subjectId, w.totalGrams]).sort((x, y) => Number(x[1]) - Number(y[1]))).toEqual([[b!.id, 1588], [a!.id, 1814], [c!.id, 1928]]);
    expect((await roundRows(coop.id, id)).map((r) => [r.animal_id, r.total_grams, r.review_state])).toEqual([[b!.id, 1588, 'accepted'], [a!.id, 1814, 'accepted'], [c!.id, 1928, 'accepted']]);

    const series = await agent.get(`/api/animals/${b!.id}/weigh-ins`).expect(200);
    expect(series.body.weighIns.map((w: { totalGrams: number; weighedOn: string }) => [w.totalGrams, w.weighedOn])).toEqual([[1588, farmToday()]]);
    const herd = await agent.get('/api/animals').query({ search: 'Wick' }).expect(200);
    expect(herd.body.items[0].latestWeight).toMatchObject({ grams: 1928, weighedOn: farmToday() });
  });

  it('when the same round is sent again, then the first save is answered and nothing is written twice; another farm sending that id gets a 409', async () => {
    const coop = await createTestCoop();
    const [a, b] = await threeJuniors(coop);
    const agent = await agentOf(coop.member.email);
    const body = { id: randomUUID(), weighedOn: farmToday(), entries: [{ animalId: a!.id, grams: 1900 }, { animalId: b!.id, grams: 1850 }] };
    const first = await agent.post('/api/weighing-rounds').send(body).expect(201);
    const before = await roundCount(coop.id);
    const again = await agent.post('/api/weighing-rounds').send(body);
    expect(again.status).toBe(200);
    expect(again.body).toEqual(first.body);
    expect(await roundCount(coop.id)).toEqual(before);
    expect(before.rounds).toBe(1);

    const other = await agentOf(coop.otherFarmMember.email);
    const clash = await other.post('/api/weighing-rounds').send({ ...body, entries: [{ animalId: a!.id, grams: 1900 }] });
    expect(clash.status).toBe(409);
    expect(await roundCount(coop.id)).toEqual(before);
  });

  it('when one weight of a round is refused, then none of the round is written (one transaction)', async () => {
    const coop = await createTestCoop();
    const [a, b] = await threeJuniors(coop);
    const stranger = await addAnimalAs(coop.otherFarmMember, { name: 'Elsewhere', birthDate: daysAgo(70), lifecycle: 'junior' });
    const agent = await agentOf(coop.member.email);
    const before = await roundCount(coop.id);
    const res = await agent.post('/api/weighing-rounds').send({
      id: randomUUID(), weighedOn: farmToday(),
      entries: [{ animalId: a!.id, grams: 1900 }, { animalId: b!.id, grams: 1850 }, { animalId: stranger.id, grams: 1800 }],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details['entries.2.animalId']).toEqual(['Choose an animal your farm keeps']);
    expect(await roundCount(coop.id)).toEqual(before);

    const impossible = await agent.post('/api/weighing-rounds').send({
      id: randomUUID(), weighedOn: farmToday(), entries: [{ animalId: a!.id, grams: 1900 }, { animalId: b!.id, grams: 25_000, confirmed: true }],
    });
    expect(impossible.status).toBe(400);
    expect(impossible.body.error.details['entries.1.grams'][0]).toMatch(/more than any rabbit weighs/);
    expect(await roundCount(coop.id)).toEqual(before);
  });

  it('when a weight is far below the usual band for the age or a big drop since the last weigh-in, then the round asks to confirm those entries and saves once they are confirmed', async () => {
    const coop = await createTestCoop();
    const [a, b, c] = await threeJuniors(coop);
    const agent = await agentOf(coop.member.email);
    await agent.post('/api/weigh-ins').send({ animalId: c!.id, totalGrams: 2000, weighedOn: daysAgo(7) }).expect(201);
    const before = await roundCount(coop.id);
    const entries = [
      { animalId: a!.id, grams: 1900 },
      // 700 g at 70 days: under 0.6 × the reference weight for the age, above the impossible quarter.
      { animalId: b!.id, grams: 700 },
      // 1,600 g a week after 2,000 g: a fifth lost, in the band for the age.
      { animalId: c!.id, grams: 1600 },
    ];
    const id = randomUUID();
    const asked = await agent.post('/api/weighing-rounds').send({ id, weighedOn: farmToday(), entries });
    expect(asked.status).toBe(422);
    expect(asked.body.error.code).toBe('confirmation_required');
    expect(Object.keys(asked.body.error.details).sort()).toEqual(['entries.1.grams', 'entries.2.grams']);
    expect(asked.body.error.details['entries.1.grams'][0]).toMatch(/^700 g a head is light at 70 days/);
    expect(asked.body.error.details['entries.2.grams'][0]).toBe(`1600 g is 400 g less than on ${daysAgo(7)} (2000 g)`);
    expect(await roundCount(coop.id)).toEqual(before);

    const halfConfirmed = await agent.post('/api/weighing-rounds').send({ id, weighedOn: farmToday(), entries: entries.map((e, i) => (i === 1 ? { ...e, confirmed: true } : e)) });
    expect(halfConfirmed.status).toBe(422);
    expect(Object.keys(halfConfirmed.body.error.details)).toEqual(['entries.2.grams']);

    const saved = await agent.post('/api/weighing-rounds').send({ id, weighedOn: farmToday(), entries: entries.map((e, i) => (i > 0 ? { ...e, confirmed: true } : e)) });
    expect(saved.status).toBe(201);
    expect((await roundRows(coop.id, id)).map((r) => r.total_grams)).toEqual([700, 1600, 1900]);
  });

  it("when an apprentice saves a round, then the weights wait for the mentor's review and show in the mentor's queue", async () => {
    const coop = await createTestCoop();
    const [a, b] = await threeJuniors(coop);
    const apprentice = await agentOf(coop.apprentice.email);
    const id = randomUUID();
    const res = await apprentice.post('/api/weighing-rounds').send({ id, weighedOn: farmToday(), entries: [{ animalId: a!.id, grams: 1900 }, { animalId: b!.id, grams: 1850 }] });
    expect(res.status).toBe(201);
    expect(res.body.reviewState).toBe('pending');
    expect((await roundRows(coop.id, id)).map((r) => r.review_state)).toEqual(['pending', 'pending']);
    const mentor = await agentOf(coop.member.email);
    const queue = await mentor.get('/api/mentorship/review').expect(200);
    const weighInIds = (res.body as WeighingRoundDto).weighIns.map((w) => w.id);
    expect(JSON.stringify(queue.body)).toContain(weighInIds[0]);
  });

  it("when a grow-out group is weighed kit by kit in a round, then the candidates are its heads with the band for their age and the round writes one weigh-in of the group's kits", async () => {
    const coop = await createTestCoop();
    const breeds = await catalogueBreeds(coop.id);
    const nz = breeds['New Zealand']!.id;
    const { litter } = await breedLitterAs(coop.member, { kindledDaysAgo: 56, kits: 3, sireBreedId: nz, damBreedId: nz });
    const group = await groupAs(coop.member, { name: 'Hazel pen', formedOn: daysAgo(20), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 3 }] });
    const agent = await agentOf(coop.member.email);
    const candidates = (await agent.get('/api/weighing-rounds/candidates').query({ set: 'group', groupId: group.id }).expect(200)).body as WeighingRoundCandidatesDto;
    expect(candidates.title).toBe('Hazel pen');
    expect(candidates.candidates.map((k) => [k.kind, k.id, k.kitNumber, k.kitCount, k.ageDays])).toEqual([
      ['group', group.id, 1, 3, 56], ['group', group.id, 2, 3, 56], ['group', group.id, 3, 3, 56],
    ]);
    // The reference curve passes through the published 8-week weight, 1,644 g (Rao et al. 1977, J. Anim. Sci. 44:1021).
    expect(candidates.candidates[0]!.band).toEqual({ lowGrams: Math.round(1644 * 0.6), expectedGrams: 1644, highGrams: Math.round(1644 * 1.6) });

    const id = randomUUID();
    await agent.post('/api/weighing-rounds').send({ id, weighedOn: farmToday(), entries: [1600, 1700, 1650].map((grams) => ({ groupId: group.id, grams })) }).expect(201);
    const rows = await roundRows(coop.id, id);
    expect(rows).toEqual([expect.objectContaining({ group_id: group.id, total_grams: 4950, head_count: 3, kit_weights: [{ label: null, grams: 1600 }, { label: null, grams: 1700 }, { label: null, grams: 1650 }] })]);
    const page = await agent.get(`/api/grow-out/groups/${group.id}`).expect(200);
    expect(page.body.weighIns.at(-1)).toMatchObject({ totalGrams: 4950, headCount: 3, weighedOn: farmToday() });

    const fourth = await agent.post('/api/weighing-rounds').send({ id: randomUUID(), weighedOn: farmToday(), entries: [1600, 1700, 1650, 1600].map((grams) => ({ groupId: group.id, grams })) });
    expect(fourth.status).toBe(400);
    expect(fourth.body.error.details['entries.3.groupId']).toEqual(['Hazel pen has 3 heads; this is kit 4']);
  });

  it('when a litter is weighed in a round, then one weigh-in of the litter holds its kits and the next round shows it as their last weight', async () => {
    const coop = await createTestCoop();
    const { litter } = await breedLitterAs(coop.member, { kindledDaysAgo: 28, kits: 2, sireBreedId: null, damBreedId: null, doe: 'Primrose' });
    const agent = await agentOf(coop.member.email);
    const first = (await agent.get('/api/weighing-rounds/candidates').query({ set: 'litter', litterId: litter.id }).expect(200)).body as WeighingRoundCandidatesDto;
    expect(first.title).toBe(`Primrose's litter of ${daysAgo(28)}`);
    expect(first.candidates.map((k) => [k.kitNumber, k.last])).toEqual([[1, null], [2, null]]);
    await agent.post('/api/weighing-rounds').send({ id: randomUUID(), weighedOn: farmToday(), entries: [{ litterId: litter.id, grams: 500 }, { litterId: litter.id, grams: 540 }] }).expect(201);
    const next = (await agent.get('/api/weighing-rounds/candidates').query({ set: 'litter', litterId: litter.id }).expect(200)).body as WeighingRoundCandidatesDto;
    expect(next.candidates[0]!.last).toEqual({ gramsPerHead: 520, weighedOn: farmToday(), ageDays: 28 });
  });

  it("when the growing animals are asked for, then the farm's kits and juniors and its growing groups' heads come back, and another farm's animal cannot be chosen", async () => {
    const coop = await createTestCoop();
    const [a] = await threeJuniors(coop);
    await addAnimalAs(coop.member, { name: 'Old doe', sex: 'doe', birthDate: '2022-01-01', lifecycle: 'breeding' });
    const stranger = await addAnimalAs(coop.otherFarmMember, { name: 'Elsewhere', birthDate: daysAgo(70), lifecycle: 'junior' });
    const agent = await agentOf(coop.member.email);
    await agent.post('/api/weigh-ins').send({ animalId: a!.id, totalGrams: 1500, weighedOn: daysAgo(10) }).expect(201);
    const growing = (await agent.get('/api/weighing-rounds/candidates').query({ set: 'growing' }).expect(200)).body as WeighingRoundCandidatesDto;
    expect(growing.candidates.map((k) => k.label).sort()).toEqual(['Bramble', 'Sorrel', 'Wick']);
    expect(growing.candidates.find((k) => k.id === a!.id)).toMatchObject({ ageDays: 70, last: { gramsPerHead: 1500, weighedOn: daysAgo(10), ageDays: 60 } });
    const refused = await agent.get('/api/weighing-rounds/candidates').query({ set: 'animals', animalIds: `${a!.id},${stranger.id}` });
    expect(refused.status).toBe(400);
    expect(refused.body.error.details.animalIds).toEqual(['Choose animals your farm keeps']);
  });
});
