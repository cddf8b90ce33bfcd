import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { weighInCreateSchema, type StudFinderDto, type StudFinderRowDto } from '@burrowline/shared';
import { createWeighIn } from '../../packages/server/src/modules/animals/weigh-ins.service';
import { daysAgo } from '../support/almanac';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { withTenant } from '../../packages/server/src/db/tenant';
import { createUser } from '../../packages/server/src/modules/users/users.service';
import { actorOf, addAnimalAs, catalogueBreeds } from '../support/herd';
import { acceptAs, doeOf, inDays, offeredBuck, requestAs } from '../support/stud-share';
import { signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp();
let coop: TestCoop;
let borrower: Agent;
let apprentice: Agent;
let owner: Agent;
let doeId: string;
const bucks: Record<string, { id: string; offerId: string }> = {};

/**
 * Farm A offers four bucks to a farm-B doe of New Zealand breed on both sides: one her half-brother (litter COI 1/8,
 * the half-sib value), one of no known breed, and two unrelated and of known breed, one of them with a
 * get's growth record (two weigh-ins of a kit 30 days apart: 800 g → 2,000 g, 40 g/day).
 */
beforeAll(async () => {
  coop = await createTestCoop();
  [borrower, apprentice, owner] = await Promise.all([
    signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle),
    signedInAgent(coop.apprentice.email, TEST_PASSWORD, handle),
    signedInAgent(coop.member.email, TEST_PASSWORD, handle),
  ]);
  const breeds = await catalogueBreeds(coop.id);
  const nz = breeds['New Zealand']!.id;
  const cal = breeds['Californian']!.id;
  const sharedSire = await addAnimalAs(coop.member, { sex: 'buck', name: 'Old Ash', birthDate: '2020-01-01', breedId: nz });
  const dam = await addAnimalAs(coop.otherFarmMember, { sex: 'doe', name: 'Old Fern', birthDate: '2020-03-01', breedId: nz });
  const doe = await doeOf(coop.otherFarmMember, { name: 'Wren', sireId: sharedSire.id, damId: dam.id, breedId: nz });
  doeId = doe.id;
  const offer = async (key: string, name: string, fields: { breedId?: string; sireId?: string }, extra: Record<string, unknown> = {}) => {
    const { buck, card } = await offeredBuck(coop, extra, { name, ...fields });
    bucks[key] = { id: buck.id, offerId: card.offerId };
  };
  await offer('halfBrother', 'Hazel', { sireId: sharedSire.id, breedId: nz });
  await offer('unknownBreed', 'Moss', {});
  await offer('pure', 'Birch', { breedId: nz }, { loanFeeCents: 6_000 });
  await offer('cross', 'Aspen', { breedId: cal }, { loan: false, service: true, serviceFeeCents: 2_500 });
  const kit = await addAnimalAs(coop.member, { sex: 'doe', name: 'Aspen kit', birthDate: daysAgo(70), sireId: bucks.cross!.id });
  for (const [grams, ago] of [[800, 40], [2_000, 10]] as const) {
    await createWeighIn(actorOf(coop.member), weighInCreateSchema.parse({ animalId: kit.id, totalGrams: grams, headCount: 1, weighedOn: daysAgo(ago) }));
  }
});
afterAll(async () => {
  await handle.close();
});

const names = (body: StudFinderDto) => body.items.map((row: StudFinderRowDto) => row.card.buck.name);
const dms = (d: number, m: number, s: number, sign = 1) => sign * (d + m / 60 + s / 3600);

describe('the Stud Share finder', () => {
  it('when she opens the finder from her doe, then every offered buck is ranked by litter COI, known make-up, then his get\'s growth, each place explained', async () => {
    const res = await borrower.get(`/api/stud-share/finder?damId=${doeId}`).expect(200);
    const body = res.body as StudFinderDto;
    expect(body.dam.id).toBe(doeId);
    expect(body.order).toBe('Lowest litter COI first, then a known breed make-up, then his get\'s growth.');
    expect(names(body)).toEqual(['Aspen', 'Birch', 'Moss', 'Hazel']);
    const [aspen, birch, moss, hazel] = body.items as [StudFinderRowDto, StudFinderRowDto, StudFinderRowDto, StudFinderRowDto];
    expect(aspen).toMatchObject({ rank: 1, litterCoi: 0, makeupClass: 'known_cross', getRecord: { meanDailyGainGrams: 40 }, feeCents: 2_500 });
    expect(aspen.explanation).toMatch(/^1st: litter COI 0\.0 %, the lowest offered; a known cross; his get gain 40 g\/day\.$/);
    expect(birch).toMatchObject({ rank: 2, makeupClass: 'purebred', feeCents: 6_000 });
    expect(birch.explanation).toMatch(/^2nd: litter COI 0\.0 % and purebred like 1st; no growth record for his get yet, below 1st's 40 g\/day\.$/);
    expect(moss).toMatchObject({ rank: 3, makeupClass: 'partly_unknown' });
    expect(moss.explanation).toMatch(/partly unknown make-up where 2nd is known/);
    // Half-siblings: 1/8 (Wright's coefficient for half-sib matings; Falconer & Mackay, 4th ed., ch. 5).
    expect(hazel.litterCoi).toBeCloseTo(0.125, 12);
    expect(hazel.sharedAncestors.map((a) => a.name)).toEqual(['Old Ash']);
    expect(hazel.explanation).toMatch(/^4th: litter COI 12\.5 %, higher than 3rd's 0\.0 %/);
    expect(body.items.every((row) => row.available === null && row.distanceKm === null)).toBe(true);
  });

  it('when both farms have coordinates, then the distance is the great-circle one; a distance filter keeps only what is near', async () => {
    // Movable Type Scripts' haversine example: Land's End to John o' Groats is 968.9 km.
    await borrower.put(`/api/farms/${coop.otherFarmMember.farmId}/coordinates`).send({ latitude: dms(50, 3, 59), longitude: dms(5, 42, 53, -1) }).expect(200);
    expect((await borrower.put(`/api/farms/${coop.member.farmId}/coordinates`).send({ latitude: 1, longitude: 1 })).status).toBe(403);
    const half = await owner.put(`/api/farms/${coop.member.farmId}/coordinates`).send({ latitude: 58.5, longitude: null });
    expect(half.status).toBe(400);
    await owner.put(`/api/farms/${coop.member.farmId}/coordinates`).send({ latitude: dms(58, 38, 38), longitude: dms(3, 4, 12, -1) }).expect(200);
    const res = await borrower.get(`/api/stud-share/finder?damId=${doeId}`).expect(200);
    expect(res.body.items.map((row: StudFinderRowDto) => row.distanceKm)).toEqual([968.9, 968.9, 968.9, 968.9]);
    const near = await borrower.get(`/api/stud-share/finder?damId=${doeId}&maxDistanceKm=500`).expect(200);
    expect(near.body.items).toEqual([]);
    const far = await borrower.get(`/api/stud-share/finder?damId=${doeId}&maxDistanceKm=1000`).expect(200);
    expect(far.body.total).toBe(4);
  });

  it('when filters are set, then breed, kind, fee and free dates narrow the list, keeping the ranking', async () => {
    const breeds = await catalogueBreeds(coop.id);
    const byBreed = await borrower.get(`/api/stud-share/finder?damId=${doeId}&breedId=${breeds['Californian']!.id}`).expect(200);
    expect(names(byBreed.body)).toEqual(['Aspen']);
    const loans = await borrower.get(`/api/stud-share/finder?damId=${doeId}&kind=loan`).expect(200);
    expect(names(loans.body)).toEqual(['Birch', 'Moss', 'Hazel']);
    const cheap = await borrower.get(`/api/stud-share/finder?damId=${doeId}&kind=loan&maxFeeCents=5000`).expect(200);
    expect(names(cheap.body)).toEqual(['Moss', 'Hazel']);

    await acceptAs(coop.member, await requestAs(coop.otherFarmMember, bucks.pure!.offerId, [doeId], { startOn: inDays(10), endOn: inDays(20) }));
    const dated = await borrower.get(`/api/stud-share/finder?damId=${doeId}&from=${inDays(15)}&to=${inDays(25)}`).expect(200);
    expect(dated.body.items.map((row: StudFinderRowDto) => [row.card.buck.name, row.available])).toEqual([['Aspen', true], ['Birch', false], ['Moss', true], ['Hazel', true]]);
    const free = await borrower.get(`/api/stud-share/finder?damId=${doeId}&from=${inDays(15)}&to=${inDays(25)}&freeOnly=true`).expect(200);
    expect(names(free.body)).toEqual(['Aspen', 'Moss', 'Hazel']);
    expect((await borrower.get(`/api/stud-share/finder?damId=${doeId}&sort=fee`).expect(200)).body.items.map((r: StudFinderRowDto) => r.card.buck.name)).toEqual(['Aspen', 'Moss', 'Hazel', 'Birch']);
    expect((await borrower.get(`/api/stud-share/finder?damId=${doeId}&colour=blue`)).status).toBe(400);
  });

  it('when an apprentice or someone of another farm asks, then the apprentice sees no fee and another farm\'s doe is refused', async () => {
    const email = `apprentice-b-${randomUUID().slice(0, 8)}@example.test`;
    await withTenant({ coopId: coop.id }, (tx) => createUser({
      coopId: coop.id, farmId: coop.otherFarmMember.farmId, mentorId: coop.otherFarmMember.id, email, name: 'Apprentice of farm B', role: 'apprentice', passwordHash: inject('passwordHash'),
    }, tx));
    const seen = await (await signedInAgent(email, TEST_PASSWORD, handle)).get(`/api/stud-share/finder?damId=${doeId}`).expect(200);
    expect(seen.body.total).toBe(4);
    for (const row of seen.body.items as StudFinderRowDto[]) {
      expect(row).toMatchObject({ feeCents: null, card: { loanFeeCents: null, serviceFeeCents: null, feesVisible: false, canRequest: false } });
    }
    expect((await apprentice.get(`/api/stud-share/finder?damId=${doeId}`)).status).toBe(403);
    expect((await owner.get(`/api/stud-share/finder?damId=${doeId}`)).status).toBe(403);
    const other = await createTestCoop();
    const foreign = await signedInAgent(other.member.email, TEST_PASSWORD, handle);
    expect((await foreign.get(`/api/stud-share/finder?damId=${doeId}`)).status).toBe(404);
  });
});
