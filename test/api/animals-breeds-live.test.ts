import { describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { CSRF_HEADER, poundsToGrams, RealtimeEvent, type BreedDto } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { asTenant } from '../support/db';
import { nextTattoo } from '../support/herd';
import { liveTestServer } from '../support/sockets';
import { signedInAgent } from '../support/test-app';

describe('the breed catalogue', () => {
  it('when a member lists breeds, then the catalogue carries senior weights in grams, class counts, first-breeding ages and sources', async () => {
    const coop = await createTestCoop();
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const res = await agent.get('/api/breeds');
    expect(res.status).toBe(200);
    const byName = Object.fromEntries((res.body.breeds as BreedDto[]).map((b) => [b.name, b]));
    expect(Object.keys(byName)).toEqual(expect.arrayContaining([
      'New Zealand', 'Californian', 'Silver Fox', 'Palomino', 'Rex', 'Florida White', "Champagne d'Argent", 'Satin', 'American Chinchilla', 'Flemish Giant',
    ]));
    const g = (lb: number) => Math.round(poundsToGrams(lb)); // NIST Handbook 44: 1 lb = 453.59237 g
    // Senior weights of the ARBA Standard of Perfection as quoted second-hand ("sec"); Champagne, Satin and American Chinchilla from memory ("mem").
    expect(byName['New Zealand']).toMatchObject({ seniorBuckGrams: { minGrams: g(9), maxGrams: g(11) }, seniorDoeGrams: { minGrams: g(10), maxGrams: g(12) } });
    expect(byName.Californian).toMatchObject({ seniorBuckGrams: { minGrams: g(8), maxGrams: g(10) }, seniorDoeGrams: { minGrams: g(8.5), maxGrams: g(10.5) } });
    expect(byName.Rex).toMatchObject({ seniorBuckGrams: { minGrams: g(7.5), maxGrams: g(9.5) } });
    expect(byName['Florida White']).toMatchObject({ seniorDoeGrams: { minGrams: g(4), maxGrams: g(6) } });
    expect(byName["Champagne d'Argent"]!.sources.buckWeight!.confidence).toBe('mem');
    expect(byName['New Zealand']!.sources.buckWeight!.confidence).toBe('sec');
    // UF/IFAS Florida 4-H: ideal ≥ 9 lb → six classes, lighter → four.
    expect(byName['New Zealand']!.showClassCount).toBe(6);
    expect(byName['Florida White']!.showClassCount).toBe(4);
    expect(byName.Rex!.showClassCount).toBe(4);
    // Rabbit Production, 9th ed.: medium breeds, does 4½–5½ months, bucks about a month later (30.44-day months).
    expect(byName.Californian!.firstBreedingDays).toEqual({ doe: { min: 137, max: 167 }, buck: { min: 167, max: 198 } });
    expect(byName.Californian!.sources.firstBreeding!.confidence).toBe('pub');
    // Giant breeds: slow-growing and heavy-boned, poor dress-out for meat (common practice).
    expect(byName['Flemish Giant']).toMatchObject({ sizeClass: 'giant', slowGrowing: true, heavyBoned: true, seniorBuckGrams: { maxGrams: null } });
    expect(byName['Flemish Giant']!.sources.meat!.confidence).toBe('common_practice');
  });

  it('when the admin adds a breed, then their co-op sees it and another co-op does not; members cannot add one; a duplicate name is refused', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const admin = await signedInAgent(coop.admin.email, TEST_PASSWORD);
    const member = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const body = { name: 'Tamsin Red', sizeClass: 'medium', seniorBuckMinGrams: 4000, seniorBuckMaxGrams: 4800, source: 'Our own line records' };
    expect((await member.post('/api/breeds').send(body)).status).toBe(403);
    const created = await admin.post('/api/breeds').send(body);
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Tamsin Red', isCatalogue: false, showClassCount: 6, idealWeightGrams: 4400, firstBreedingDays: { doe: { min: 137 } } });
    expect((await member.get('/api/breeds')).body.breeds.map((b: BreedDto) => b.name)).toContain('Tamsin Red');
    const outsider = await signedInAgent(other.member.email, TEST_PASSWORD);
    expect((await outsider.get('/api/breeds')).body.breeds.map((b: BreedDto) => b.name)).not.toContain('Tamsin Red');
    const dup = await admin.post('/api/breeds').send({ ...body, name: 'new zealand' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.details.name).toEqual(['New Zealand is already in the breed list']);
    const rows = await asTenant(coop.id, (c) => c.query(`SELECT count(*)::int AS n FROM breeds WHERE coop_id = $1`, [coop.id]));
    expect(rows.rows[0].n).toBe(1);
  });
});

describe('live herd updates', () => {
  const server = liveTestServer();
  const { kit } = server;

  it('when a member adds an animal, then her farm\'s sockets hear herd:changed, the co-op hears pedigree:changed, another co-op nothing', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const partner = await kit.listen(coop.admin.email); // same farm
    const neighbour = await kit.listen(coop.otherFarmMember.email);
    const outsider = await kit.listen(foreign.member.email);
    const cookie = await kit.signInCookie(coop.member.email);
    const res = await supertest(server.url).post('/api/animals').set(CSRF_HEADER, '1').set('cookie', cookie)
      .send({ tattoo: nextTattoo(), sex: 'doe', birthDate: '2023-01-01' });
    expect(res.status).toBe(201);
    await expect.poll(() => partner.heard.get(RealtimeEvent.herdChanged)?.length ?? 0).toBe(1);
    expect(partner.heard.get(RealtimeEvent.herdChanged)![0]).toEqual({ farmId: coop.farms[0]!.id, animalId: res.body.id });
    await expect.poll(() => neighbour.heard.get(RealtimeEvent.pedigreeChanged)?.length ?? 0).toBe(1);
    expect(neighbour.heard.get(RealtimeEvent.herdChanged)).toBeUndefined();
    expect(outsider.heard.get(RealtimeEvent.herdChanged)).toBeUndefined();
    expect(outsider.heard.get(RealtimeEvent.pedigreeChanged)).toBeUndefined();
  });
});
