import { afterAll, describe, expect, it } from 'vitest';
import { addDays, RealtimeEvent, type GrowOutGroupDto, type GrowOutListDto, type LitterChoiceDto } from '@burrowline/shared';
import { withTenant } from '../../packages/server/src/db/tenant';
import { growOutFactsOfFarm, groupsOfFarm } from '../../packages/server/src/modules/grow-out/grow-out-facts.service';
import { daysAgo, farmToday, kindlingAs, serviceAs, taskRows } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { breedLitterAs, feedAs, grownLitterAs, groupAs, growOutCounts, purchaseAs, weighGroupAs } from '../support/grow-out';
import { addAnimalAs, catalogueBreeds } from '../support/herd';
import { liveTestServer } from '../support/sockets';
import { agentFor, ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

/**
 * The usual test group: 8 kits of two litters kindled 60 days ago, formed at 28 days (32 days ago) and
 * weighed at 28, 42 and 56 days: 600, 1,100 and 1,650 g a head. Invented figures near the published 8-week
 * weight, 1,644 g (Rao et al. 1977, J. Anim. Sci. 44:1021).
 */
async function weighedGroup(coop: Awaited<ReturnType<typeof createTestCoop>>, opts: { target?: number } = {}) {
  const breeds = await catalogueBreeds(coop.id);
  const nz = breeds['New Zealand']!.id;
  const cal = breeds['Californian']!.id;
  const a = await breedLitterAs(coop.member, { kindledDaysAgo: 60, kits: 5, sireBreedId: cal, damBreedId: nz, doe: 'Clover', buck: 'Juniper' });
  const b = await breedLitterAs(coop.member, { kindledDaysAgo: 60, kits: 4, sireBreedId: cal, damBreedId: nz, doe: 'Mallow' });
  const group = await groupAs(coop.member, {
    name: 'Spring fryers', formedOn: daysAgo(32), targetGrams: opts.target ?? 2270,
    litters: [{ litterId: a.litter.id, heads: 5 }, { litterId: b.litter.id, heads: 3 }],
  });
  await weighGroupAs(coop.member, group.id, { weighedOn: daysAgo(32), totalGrams: 8 * 600, headCount: 8 });
  await weighGroupAs(coop.member, group.id, { weighedOn: daysAgo(18), totalGrams: 8 * 1100, headCount: 8 });
  const last = await weighGroupAs(coop.member, group.id, { weighedOn: daysAgo(4), totalGrams: 8 * 1650, headCount: 8 });
  return { a, b, group: last, breeds };
}

describe('forming grow-out groups', () => {
  it('when a home-bred buck has no breed recorded but both his parents are Silver Fox, then his litter with a New Zealand doe is named a New Zealand-dam cross; a buck of unknown parents stays unknown', async () => {
    const coop = await createTestCoop();
    const breeds = await catalogueBreeds(coop.id);
    const fox = breeds['Silver Fox']!.id;
    const nz = breeds['New Zealand']!.id;
    const sire = await addAnimalAs(coop.member, { sex: 'buck', name: 'Old Slate', birthDate: '2021-03-01', breedId: fox });
    const dam = await addAnimalAs(coop.member, { sex: 'doe', name: 'Misty', birthDate: '2021-04-01', breedId: fox });
    // The son: parents recorded, his own breed left blank (as home-bred stock often is).
    const son = await addAnimalAs(coop.member, { sex: 'buck', name: 'Thistle', birthDate: '2023-02-01', breedId: null, sireId: sire.id, damId: dam.id });
    const stray = await addAnimalAs(coop.member, { sex: 'buck', name: 'Auction buck', birthDate: '2023-02-01', breedId: null });
    const doe = await addAnimalAs(coop.member, { sex: 'doe', name: 'Willow', birthDate: '2023-01-10', breedId: nz });
    const doe2 = await addAnimalAs(coop.member, { sex: 'doe', name: 'Fern', birthDate: '2023-01-10', breedId: nz });
    const litterOf = async (buckId: string, doeId: string) => {
      const service = await serviceAs(coop.member, { doeId, buckId, servicedOn: daysAgo(71) });
      return kindlingAs(coop.member, { serviceId: service.id, kindledOn: daysAgo(40), bornAlive: 6, bornDead: 0 });
    };
    const known = await litterOf(son.id, doe.id);
    const unknown = await litterOf(stray.id, doe2.id);
    const named = await groupAs(coop.member, { name: 'Fox cross', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: known.id, heads: 6 }] });
    const unnamed = await groupAs(coop.member, { name: 'Auction cross', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: unknown.id, heads: 6 }] });
    expect(named.crossLabel).toBe('Silver Fox × New Zealand');
    expect(unnamed.crossLabel).toBe('Unknown ancestry');
  });

  it('when a member forms a group from two litters at weaning age, then its make-up, cross, birth date and rows are stored', async () => {
    const coop = await createTestCoop();
    const breeds = await catalogueBreeds(coop.id);
    const a = await breedLitterAs(coop.member, { kindledDaysAgo: 40, kits: 6, sireBreedId: breeds['Californian']!.id, damBreedId: breeds['New Zealand']!.id, doe: 'Clover', buck: 'Juniper' });
    const b = await breedLitterAs(coop.member, { kindledDaysAgo: 36, kits: 2, sireBreedId: breeds['Californian']!.id, damBreedId: breeds['New Zealand']!.id, doe: 'Mallow' });
    const agent = await agentOf(coop.member.email);
    const choices = await agent.get('/api/grow-out/litter-choices');
    expect(choices.status).toBe(200);
    expect((choices.body.litters as LitterChoiceDto[]).map((l) => [l.litterId, l.available])).toEqual(expect.arrayContaining([[a.litter.id, 6], [b.litter.id, 2]]));

    const res = await agent.post('/api/grow-out/groups').send({
      name: 'Autumn fryers', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: a.litter.id, heads: 6 }, { litterId: b.litter.id, heads: 2 }],
    });
    expect(res.status).toBe(201);
    const group = res.body as GrowOutGroupDto;
    // Head-weighted mean kindling date: (6 × 0 + 2 × 4 days later) ÷ 8 = 1 day after litter a's.
    expect(group).toMatchObject({ name: 'Autumn fryers', status: 'growing', heads: 8, currentHeads: 8, birthDate: daysAgo(39), targetGrams: 2270, crossLabel: 'Californian × New Zealand' });
    expect(group.litters).toEqual(expect.arrayContaining([
      expect.objectContaining({ litterId: a.litter.id, heads: 6, dam: { id: a.doe.id, name: 'Clover' }, sire: { id: a.buck.id, name: 'Juniper' }, cross: expect.objectContaining({ kind: 'cross', label: 'Californian × New Zealand' }) }),
    ]));
    expect(group.projection).toMatchObject({ status: 'too_few_weigh_ins', modelName: 'No projection' });
    const rows = await asTenant(coop.id, async (c) => ({
      group: (await c.query('SELECT farm_id, name, formed_on::text AS formed_on, target_grams, status, created_by FROM grow_out_groups WHERE id = $1', [group.id])).rows[0],
      litters: (await c.query('SELECT litter_id, heads FROM grow_out_group_litters WHERE group_id = $1 ORDER BY heads DESC', [group.id])).rows,
    }));
    expect(rows.group).toEqual({ farm_id: coop.farms[0]!.id, name: 'Autumn fryers', formed_on: farmToday(), target_grams: 2270, status: 'growing', created_by: coop.member.id });
    expect(rows.litters).toEqual([{ litter_id: a.litter.id, heads: 6 }, { litter_id: b.litter.id, heads: 2 }]);
    // Their kits are taken: the litters no longer offer any.
    const after = (await agent.get('/api/grow-out/litter-choices')).body.litters as LitterChoiceDto[];
    expect(after.find((l) => l.litterId === a.litter.id)).toBeUndefined();
  });

  it('when the heads are more than the kits alive or already in a group, the kits too young, the date in the future or the litter another farm\'s, then clear errors and nothing written', async () => {
    const coop = await createTestCoop();
    const older = await grownLitterAs(coop.member, 45, 6);
    const young = await grownLitterAs(coop.member, 20, 7);
    const theirs = await grownLitterAs(coop.otherFarmMember, 45, 5);
    await groupAs(coop.member, { name: 'First', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: older.litter.id, heads: 4 }] });
    const agent = await agentOf(coop.member.email);
    const before = await growOutCounts(coop.id);

    const tooMany = await agent.post('/api/grow-out/groups').send({ name: 'Second', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: older.litter.id, heads: 3 }] });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.details['litters.0.heads']).toEqual([`The litter kindled on ${daysAgo(45)} has 2 kits alive not yet in a group (6 alive)`]);
    const tooYoung = await agent.post('/api/grow-out/groups').send({ name: 'Young', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: young.litter.id, heads: 7 }] });
    expect(tooYoung.status).toBe(400);
    expect(tooYoung.body.error.details['litters.0.heads']).toEqual([`The kits kindled on ${daysAgo(20)} are 20 days old on ${farmToday()}: put kits in a group at weaning, from 28 days`]);
    const future = await agent.post('/api/grow-out/groups').send({ name: 'Later', formedOn: addDays(farmToday(), 1), targetGrams: 2270, litters: [{ litterId: older.litter.id, heads: 1 }] });
    expect(future.status).toBe(400);
    expect(future.body.error.details.formedOn).toEqual(['A group cannot be formed in the future']);
    const foreign = await agent.post('/api/grow-out/groups').send({ name: 'Theirs', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: theirs.litter.id, heads: 1 }] });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.details['litters.0.litterId']).toEqual(["That is not one of your farm's litters"]);
    const zero = await agent.post('/api/grow-out/groups').send({ name: 'None', formedOn: farmToday(), targetGrams: 100, litters: [{ litterId: older.litter.id, heads: 0 }] });
    expect(zero.status).toBe(400);
    expect(zero.body.error.details).toMatchObject({ targetGrams: ['A target under 500 g is not a market weight'], 'litters.0.heads': ['At least one kit'] });
    expect(await growOutCounts(coop.id)).toEqual(before);
  });
});

describe('weighing a group and projecting its ready date', () => {
  it('when a group is weighed at 28, 42 and 56 days, then the gains, a fitted Gompertz projection with its interval and the chart series are shown', async () => {
    const coop = await createTestCoop();
    // Another farm's group of the same cross feeds the co-op average; its name never reaches us.
    const breeds = await catalogueBreeds(coop.id);
    const other = await breedLitterAs(coop.otherFarmMember, { kindledDaysAgo: 60, kits: 4, sireBreedId: breeds['Californian']!.id, damBreedId: breeds['New Zealand']!.id });
    const theirs = await groupAs(coop.otherFarmMember, { name: 'Secret neighbours', formedOn: daysAgo(32), targetGrams: 2270, litters: [{ litterId: other.litter.id, heads: 4 }] });
    await weighGroupAs(coop.otherFarmMember, theirs.id, { weighedOn: daysAgo(32), totalGrams: 4 * 500, headCount: 4 });
    const { group } = await weighedGroup(coop);

    const res = await (await agentOf(coop.member.email)).get(`/api/grow-out/groups/${group.id}`);
    expect(res.status).toBe(200);
    const body = res.body as GrowOutGroupDto;
    // ADG per head: (1,100 − 600) ÷ 14 = 35.71 g/d, (1,650 − 1,100) ÷ 14 = 39.29 g/d; overall 1,050 ÷ 28 = 37.5 g/d (worked by hand).
    expect(body.gain.gramsPerDay).toBeCloseTo(37.5, 6);
    expect(body.gain.periods.map((p) => p.gramsPerDay)).toEqual([500 / 14, 550 / 14]);
    expect(body.projection).toMatchObject({ status: 'projected', model: { kind: 'gompertz', weighInDays: 3 }, modelName: 'Fitted Gompertz growth curve' });
    expect(body.projection.model.description).toContain('Gompertz growth curve');
    expect(body.projection.why).toContain('3 weigh-in days');
    // At 37.5 g/d from 1,650 g at 56 days a straight line reaches 2,270 g near day 73; the curve, slowing, a little later.
    const birth = body.birthDate;
    expect(body.projection.projectedOn! >= addDays(birth, 66) && body.projection.projectedOn! <= addDays(birth, 85)).toBe(true);
    expect(body.projection.interval!.from <= body.projection.projectedOn! && body.projection.projectedOn! <= body.projection.interval!.to).toBe(true);
    expect(body.projection.interval!.level).toBe(0.9);
    expect(body.chart.group.map((p) => [p.ageDays, p.grams])).toEqual([[28, 600], [42, 1100], [56, 1650]]);
    expect(body.weighIns.map((w) => w.caution)).toEqual([null, null, null]);
    // Rao et al. 1977: 28.8 g/d birth to 8 weeks, 1,644 g at 56 days.
    expect(body.chart.published).toEqual([{ ageDays: 0, grams: 31.2 }, { ageDays: 56, grams: 1644 }]);
    expect(body.chart.publishedSource).toContain('Rao et al. 1977');
    // The co-op average at 28 days: (8 × 600 + 4 × 500) ÷ 12 = 566.7 g, aggregates only.
    expect(body.chart.coop.find((p) => p.ageDays === 28)).toEqual({ ageDays: 28, grams: 567, heads: 12, groups: 2 });
    expect(body.chart.coopLabel).toBe('Californian × New Zealand');
    expect(JSON.stringify(body)).not.toContain('Secret neighbours');
    expect(body.chart.projection.length).toBeGreaterThan(3);

    // A fourth weigh-in heavier than the curve expected moves the projected date earlier.
    const moved = await weighGroupAs(coop.member, group.id, { weighedOn: farmToday(), totalGrams: 8 * 2000, headCount: 8 });
    expect(moved.projection.projectedOn! < body.projection.projectedOn!).toBe(true);
    // 350 g a head in 4 days is 87.5 g a day: fast, but not flagged (the check starts above 100 g a day and 300 g).
    expect(moved.weighIns.at(-1)!.caution).toBeNull();
    const stored = await asTenant(coop.id, async (c) => (await c.query(`SELECT total_grams, head_count, review_state, entered_by FROM weigh_ins WHERE group_id = $1 ORDER BY weighed_on`, [group.id])).rows);
    expect(stored.map((r) => r.total_grams)).toEqual([4800, 8800, 13200, 16000]);
    expect(stored.every((r) => r.review_state === 'accepted' && r.entered_by === coop.member.id)).toBe(true);
  });

  it('when kits are weighed one by one with labels, then each labelled kit has its own gain and the group its mean', async () => {
    const coop = await createTestCoop();
    const { litter } = await grownLitterAs(coop.member, 56, 3);
    const group = await groupAs(coop.member, { name: 'Tagged', formedOn: daysAgo(14), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 3 }] });
    const agent = await agentOf(coop.member.email);
    const first = await agent.post(`/api/grow-out/groups/${group.id}/weigh-ins`).send({ weighedOn: daysAgo(14), kits: [{ label: 'L1', grams: 1000 }, { label: 'L2', grams: 1100 }, { grams: 900 }] });
    expect(first.status).toBe(201);
    const second = await agent.post(`/api/grow-out/groups/${group.id}/weigh-ins`).send({ weighedOn: farmToday(), kits: [{ label: 'L1', grams: 1560 }, { label: 'L2', grams: 1520 }, { grams: 1400 }] });
    expect(second.status).toBe(201);
    const body = second.body as GrowOutGroupDto;
    // L1: 560 g in 14 days = 40 g/d; L2: 420 g in 14 days = 30 g/d (worked by hand).
    expect(body.kitGains).toEqual([
      { label: 'L1', weighIns: 2, latestGrams: 1560, gramsPerDay: 40 },
      { label: 'L2', weighIns: 2, latestGrams: 1520, gramsPerDay: 30 },
    ]);
    expect(body.weighIns.at(-1)).toMatchObject({ totalGrams: 4480, headCount: 3, gramsPerHead: 1493, kits: [{ label: 'L1', grams: 1560 }, { label: 'L2', grams: 1520 }, { label: null, grams: 1400 }] });
    const row = await asTenant(coop.id, async (c) => (await c.query(`SELECT kit_weights FROM weigh_ins WHERE group_id = $1 AND weighed_on = $2`, [group.id, farmToday()])).rows[0]);
    expect(row.kit_weights).toEqual([{ label: 'L1', grams: 1560 }, { label: 'L2', grams: 1520 }, { label: null, grams: 1400 }]);
  });

  it('when a weigh-in is negative, impossible for the age, has more heads than the group, is dated before forming or in the future, then clear errors and nothing written', async () => {
    const coop = await createTestCoop();
    const { litter } = await grownLitterAs(coop.member, 50, 6);
    const group = await groupAs(coop.member, { name: 'Checked', formedOn: daysAgo(10), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 6 }] });
    const agent = await agentOf(coop.member.email);
    const before = await growOutCounts(coop.id);
    const post = (body: object) => agent.post(`/api/grow-out/groups/${group.id}/weigh-ins`).send(body);

    const negative = await post({ weighedOn: farmToday(), totalGrams: -500, headCount: 6 });
    expect(negative.status).toBe(400);
    expect(negative.body.error.details.totalGrams).toEqual(['Enter a weight above zero']);
    // 50 days old: the reference curve expects about 1,380 g; 6,000 g a head is more than three times that.
    const absurd = await post({ weighedOn: farmToday(), totalGrams: 36_000, headCount: 6 });
    expect(absurd.status).toBe(400);
    expect(absurd.body.error.details.totalGrams[0]).toMatch(/^6000 g a head is not possible at 50 days/);
    const tooMany = await post({ weighedOn: farmToday(), totalGrams: 7 * 1300, headCount: 7 });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.details.headCount).toEqual(['The group has 6 heads; 7 is more']);
    const early = await post({ weighedOn: daysAgo(11), totalGrams: 6 * 1200, headCount: 6 });
    expect(early.status).toBe(400);
    expect(early.body.error.details.weighedOn).toEqual([`That is before the group was formed on ${daysAgo(10)}`]);
    const future = await post({ weighedOn: addDays(farmToday(), 1), totalGrams: 6 * 1300, headCount: 6 });
    expect(future.status).toBe(400);
    expect(future.body.error.details.weighedOn).toEqual(['A weigh-in cannot be dated in the future']);
    const kitAbsurd = await post({ weighedOn: farmToday(), kits: [{ label: 'A', grams: 1300 }, { label: 'B', grams: 90 }] });
    expect(kitAbsurd.status).toBe(400);
    expect(kitAbsurd.body.error.details['kits.1.grams'][0]).toMatch(/^B: 90 g a head is not possible at 50 days/);
    const neither = await post({ weighedOn: farmToday() });
    expect(neither.status).toBe(400);
    expect(neither.body.error.details).toMatchObject({ totalGrams: ['Enter the total weight'], headCount: ['Enter the head count'] });
    expect(await growOutCounts(coop.id)).toEqual(before);
  });
});

describe('who may see and do what', () => {
  it('when an apprentice weighs the group, then the weigh-in waits for review and does not move the projection; money is never shown to them', async () => {
    const coop = await createTestCoop();
    const { group } = await weighedGroup(coop);
    await purchaseAs(coop.member, { boughtOn: daysAgo(40), productName: 'Grower pellets 16%', bagGrams: 22_680, bags: 2, priceCents: 3800 });
    await feedAs(coop.member, { givenOn: daysAgo(4), fromOn: daysAgo(32), grams: 20_000, productName: 'Grower pellets 16%', target: 'group', groupId: group.id });
    const apprentice = await agentOf(coop.apprentice.email);
    const res = await apprentice.post(`/api/grow-out/groups/${group.id}/weigh-ins`).send({ weighedOn: farmToday(), totalGrams: 8 * 2300, headCount: 8 });
    expect(res.status).toBe(201);
    const body = res.body as GrowOutGroupDto;
    expect(body.weighIns.at(-1)).toMatchObject({ reviewState: 'pending', enteredBy: { id: coop.apprentice.id } });
    expect(body.pendingWeighIns).toBe(1);
    // Still projected from the three accepted weigh-ins, not "reached" from the pending 2,300 g.
    expect(body.projection.status).toBe('projected');
    expect(body.projection.latest!.gramsPerHead).toBe(1650);
    expect(body.canSeeMoney).toBe(false);
    expect(body.feed).toMatchObject({ feedGrams: 20_000, feedCostCents: null, costPerKgLiveCents: null, costPerLbLiveCents: null });
    expect(body.feed.conversion).toBeCloseTo(20_000 / (13_200 - 4_800), 6);
    const row = await asTenant(coop.id, async (c) => (await c.query(`SELECT review_state FROM weigh_ins WHERE group_id = $1 AND entered_by = $2`, [group.id, coop.apprentice.id])).rows);
    expect(row).toEqual([{ review_state: 'pending' }]);
    // The member sees the money.
    const member = (await (await agentOf(coop.member.email)).get(`/api/grow-out/groups/${group.id}`)).body as GrowOutGroupDto;
    expect(member.feed.feedCostCents).toBeGreaterThan(0);
    // Once the mentor accepts it, it counts: 2,300 g ≥ the 2,270 g target.
    const weighInId = body.weighIns.at(-1)!.id;
    const review = await (await agentOf(coop.member.email)).post(`/api/weigh-ins/${weighInId}/review`).send({ decision: 'accepted', version: 0 });
    expect(review.status).toBe(200);
    const after = (await (await agentOf(coop.member.email)).get(`/api/grow-out/groups/${group.id}`)).body as GrowOutGroupDto;
    expect(after.projection.status).toBe('reached');
  });

  it('when an apprentice forms or closes a group, a member of another farm or co-op asks for it, or no one is signed in, then 403, 404 and 401 and nothing changes', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const { group, a } = await weighedGroup(coop);
    const before = await growOutCounts(coop.id);
    const apprentice = await agentOf(coop.apprentice.email);
    expect((await apprentice.get(`/api/grow-out/groups/${group.id}`)).status).toBe(200);
    const form = await apprentice.post('/api/grow-out/groups').send({ name: 'Mine', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: a.litter.id, heads: 1 }] });
    expect(form.status).toBe(403);
    expect((await apprentice.post(`/api/grow-out/groups/${group.id}/close`).send({ closedOn: farmToday(), version: group.version })).status).toBe(403);
    const other = await agentOf(coop.otherFarmMember.email);
    expect((await other.get(`/api/grow-out/groups/${group.id}`)).status).toBe(404);
    expect((await other.post(`/api/grow-out/groups/${group.id}/weigh-ins`).send({ weighedOn: farmToday(), totalGrams: 8000, headCount: 8 })).status).toBe(404);
    expect((await other.post(`/api/grow-out/groups/${group.id}/close`).send({ closedOn: farmToday(), version: group.version })).status).toBe(404);
    expect(((await other.get('/api/grow-out/groups')).body as GrowOutListDto).groups).toEqual([]);
    const outsider = await agentOf(foreign.admin.email);
    expect((await outsider.get(`/api/grow-out/groups/${group.id}`)).status).toBe(404);
    expect((await outsider.post(`/api/grow-out/groups/${group.id}/weigh-ins`).send({ weighedOn: farmToday(), totalGrams: 8000, headCount: 8 })).status).toBe(404);
    const anonymous = agentFor(handle);
    expect((await anonymous.get('/api/grow-out/groups')).status).toBe(401);
    expect((await anonymous.get(`/api/grow-out/groups/${group.id}`)).status).toBe(401);
    expect(await growOutCounts(coop.id)).toEqual(before);
  });
});

describe('ready by a date, closing, and the facts for the other modules', () => {
  it("when a group is weighed, then its litters' weigh-in in the Almanac nearest that day is done on it; an apprentice's waits for review; ages far from it stay open", async () => {
    const coop = await createTestCoop();
    // Kindled 45 days ago: weigh-ins planned at the farm's ages 28, 42, 56 and 70 days (the defaults).
    const one = await grownLitterAs(coop.member, 45, 4);
    const two = await grownLitterAs(coop.member, 45, 4);
    const group = await groupAs(coop.member, { name: 'Weighed pen', formedOn: daysAgo(3), targetGrams: 2270, litters: [{ litterId: one.litter.id, heads: 4 }, { litterId: two.litter.id, heads: 2 }] });
    const weighIns = async (litterId: string) => (await taskRows(coop.id, { litterId })).filter((t) => t.kind === 'weigh_in').map((t) => [t.key, t.state, t.done_on, t.completion_review]);
    await weighGroupAs(coop.member, group.id, { weighedOn: daysAgo(1), totalGrams: 6 * 1300, headCount: 6 });
    // Day 44 is 2 days from the 42-day weigh-in; 28 (16 days off) and 56 (12 days off) stay open.
    const expected = [['weigh_in:28', 'open', null, 'accepted'], ['weigh_in:42', 'done', daysAgo(1), 'accepted'], ['weigh_in:56', 'open', null, 'accepted'], ['weigh_in:70', 'open', null, 'accepted']];
    expect(await weighIns(one.litter.id)).toEqual(expected);
    expect(await weighIns(two.litter.id)).toEqual(expected);
    // The group's page shows the same ages from its forming on: 42 weighed, 56 and 70 still to come.
    const detail = (await (await agentOf(coop.member.email)).get(`/api/grow-out/groups/${group.id}`)).body as GrowOutGroupDto;
    expect(detail.weighInSchedule).toEqual([
      { ageDays: 42, on: daysAgo(3), state: 'weighed', weighedOn: daysAgo(1) },
      { ageDays: 56, on: addDays(farmToday(), 11), state: 'upcoming', weighedOn: null },
      { ageDays: 70, on: addDays(farmToday(), 25), state: 'upcoming', weighedOn: null },
    ]);

    // Another farm's litter of the same age is not touched.
    const theirs = await grownLitterAs(coop.otherFarmMember, 45, 4);
    expect((await weighIns(theirs.litter.id)).every((t) => t[1] === 'open')).toBe(true);

    // The apprentice weighs the group a day later: the 42-day weigh-in is done already, so nothing more.
    await weighGroupAs(coop.apprentice, group.id, { weighedOn: farmToday(), totalGrams: 6 * 1340, headCount: 6 });
    expect(await weighIns(one.litter.id)).toEqual(expected);
  });

  it("when an apprentice's weighing is the one due, then the weigh-in is ticked for the mentor's review", async () => {
    const coop = await createTestCoop();
    const { litter } = await grownLitterAs(coop.member, 55, 5);
    const group = await groupAs(coop.member, { name: 'Apprentice pen', formedOn: daysAgo(8), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 5 }] });
    await weighGroupAs(coop.apprentice, group.id, { weighedOn: farmToday(), totalGrams: 5 * 1600, headCount: 5 });
    const rows = (await taskRows(coop.id, { litterId: litter.id })).filter((t) => t.kind === 'weigh_in');
    expect(rows.find((t) => t.key === 'weigh_in:56')).toMatchObject({ state: 'done', done_on: farmToday(), completion_review: 'pending' });
    expect(rows.filter((t) => t.state === 'done')).toHaveLength(1);
  });

  it('when the farm sets its own target fryer weight in the Almanac settings, then a new group aims at it', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const saved = await agent.patch('/api/almanac/settings').send({ targetLiveWeightGrams: 2500, version: 0 });
    expect(saved.status).toBe(200);
    expect(((await agent.get('/api/grow-out/groups')).body as GrowOutListDto).defaultTargetGrams).toBe(2500);
    // Another farm of the co-op keeps the default.
    const other = await agentOf(coop.otherFarmMember.email);
    expect(((await other.get('/api/grow-out/groups')).body as GrowOutListDto).defaultTargetGrams).toBe(2270);
  });

  it('when asked which groups are ready by a date, then each growing group has its readiness in words; closing needs the current version', async () => {
    const coop = await createTestCoop();
    const { group } = await weighedGroup(coop);
    const { litter } = await grownLitterAs(coop.member, 30, 5);
    const young = await groupAs(coop.member, { name: 'Just weaned', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 5 }] });
    const agent = await agentOf(coop.member.email);
    const soon = await agent.get(`/api/grow-out/groups?readyBy=${addDays(farmToday(), 60)}`);
    expect(soon.status).toBe(200);
    const list = soon.body as GrowOutListDto;
    expect(list.groups.map((g) => g.name)).toEqual(expect.arrayContaining(['Spring fryers', 'Just weaned']));
    expect(list.defaultTargetGrams).toBe(2270); // the Almanac setting's default: 5 lb (common practice)
    expect(list.readyBy!.entries).toEqual([
      expect.objectContaining({ groupId: group.id, readiness: 'ready', words: 'Ready by then', headCount: 8 }),
      expect.objectContaining({ groupId: young.id, readiness: 'unknown', words: 'No projection yet', headCount: null }),
    ]);
    const today = (await agent.get(`/api/grow-out/groups?readyBy=${farmToday()}`)).body as GrowOutListDto;
    expect(today.readyBy!.entries[0]).toMatchObject({ groupId: group.id, readiness: 'not_ready', words: 'Not ready by then' });

    const stale = await agent.post(`/api/grow-out/groups/${group.id}/close`).send({ closedOn: farmToday(), version: group.version + 1 });
    expect(stale.status).toBe(409);
    const closed = await agent.post(`/api/grow-out/groups/${group.id}/close`).send({ closedOn: farmToday(), version: group.version });
    expect(closed.status).toBe(200);
    expect(closed.body).toMatchObject({ status: 'closed', closedOn: farmToday(), version: group.version + 1 });
    const again = await agent.post(`/api/grow-out/groups/${group.id}/close`).send({ closedOn: farmToday(), version: group.version + 1 });
    expect(again.status).toBe(409);
    const row = await asTenant(coop.id, async (c) => (await c.query('SELECT status, closed_on::text AS closed_on, version FROM grow_out_groups WHERE id = $1', [group.id])).rows[0]);
    expect(row).toEqual({ status: 'closed', closed_on: farmToday(), version: group.version + 1 });
    const growing = (await agent.get('/api/grow-out/groups')).body as GrowOutListDto;
    expect(growing.groups.map((g) => g.id)).toEqual([young.id]);
    const closedList = (await agent.get('/api/grow-out/groups?status=closed')).body as GrowOutListDto;
    expect(closedList.groups.map((g) => g.id)).toEqual([group.id]);
  });

  it('when performance or processing asks for the farm\'s groups, then growOutFactsOfFarm and groupsOfFarm give make-up, accepted weigh-ins and feed', async () => {
    const coop = await createTestCoop();
    const { group, a, b } = await weighedGroup(coop);
    await purchaseAs(coop.member, { boughtOn: daysAgo(40), productName: 'Grower', bagGrams: 20_000, bags: 2, priceCents: 4000 });
    await feedAs(coop.member, { givenOn: daysAgo(4), grams: 25_000, productName: 'Grower', target: 'group', groupId: group.id });
    await weighGroupAs(coop.apprentice, group.id, { weighedOn: farmToday(), totalGrams: 8 * 1700, headCount: 8 });
    const facts = await withTenant({ coopId: coop.id }, (tx) => growOutFactsOfFarm(tx, coop.id, coop.farms[0]!.id));
    expect(facts).toHaveLength(1);
    expect(facts[0]).toMatchObject({
      id: group.id, farmId: coop.farms[0]!.id, name: 'Spring fryers', formedOn: daysAgo(32), status: 'growing', closedOn: null, targetGrams: 2270,
      // 25,000 g of 40,000 g bought for $40.00: 2,500 cents.
      feedGrams: 25_000, feedCostCents: 2500,
    });
    expect(facts[0]!.litters).toEqual(expect.arrayContaining([
      { litterId: a.litter.id, heads: 5, damId: a.doe.id, sireId: a.buck.id, kindledOn: daysAgo(60) },
      { litterId: b.litter.id, heads: 3, damId: b.doe.id, sireId: b.buck.id, kindledOn: daysAgo(60) },
    ]));
    expect(facts[0]!.weighIns).toEqual([
      { weighedOn: daysAgo(32), totalGrams: 4800, headCount: 8 },
      { weighedOn: daysAgo(18), totalGrams: 8800, headCount: 8 },
      { weighedOn: daysAgo(4), totalGrams: 13200, headCount: 8 },
    ]);
    const picker = await withTenant({ coopId: coop.id }, (tx) => groupsOfFarm(tx, coop.id, coop.farms[0]!.id));
    expect(picker).toEqual([{ id: group.id, name: 'Spring fryers', status: 'growing', litterIds: expect.arrayContaining([a.litter.id, b.litter.id]) }]);
    expect(await withTenant({ coopId: coop.id }, (tx) => growOutFactsOfFarm(tx, coop.id, coop.farms[1]!.id))).toEqual([]);
  });
});

describe('live updates of grow-out', () => {
  const server = liveTestServer({ signIn: ROOMY_SIGN_IN });
  const { kit } = server;

  it('when a group is formed and weighed, then the farm\'s room hears grow-out:changed and another farm hears nothing', async () => {
    const coop = await createTestCoop();
    const { litter } = await grownLitterAs(coop.member, 40, 4);
    const here = await kit.listen(coop.apprentice.email);
    const there = await kit.listen(coop.otherFarmMember.email);
    const group = await groupAs(coop.member, { name: 'Live', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 4 }] });
    await weighGroupAs(coop.member, group.id, { weighedOn: farmToday(), totalGrams: 4 * 1000, headCount: 4 });
    await expect.poll(() => here.heard.get(RealtimeEvent.growOutChanged)?.length ?? 0).toBe(2);
    expect(here.heard.get(RealtimeEvent.growOutChanged)![0]).toEqual({ farmId: coop.farms[0]!.id, groupId: group.id });
    expect(there.heard.get(RealtimeEvent.growOutChanged)).toBeUndefined();
  });
});
