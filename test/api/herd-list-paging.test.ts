import { beforeAll, describe, expect, it } from 'vitest';
import { addDays, herdSortKeys, todayIn, type AnimalDto, type HerdSortKey, type Lifecycle } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { asTenant } from '../support/db';
import { addAnimalAs, catalogueBreeds } from '../support/herd';
import { sharedSignedInAgent, type Agent } from '../support/test-app';

const today = todayIn('America/Chicago');
const natural = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });
const lifecycleRank: Record<Lifecycle, number> = { kit: 0, junior: 1, breeding: 2, retired: 3 };

/** The documented order of each sort: its key, then the tattoo (as people read it), both in the chosen direction. */
const byKey: Record<HerdSortKey, (a: AnimalDto, b: AnimalDto) => number> = {
  tattoo: () => 0,
  name: (a, b) => natural.compare(a.name, b.name),
  sex: (a, b) => a.sex.localeCompare(b.sex),
  birthDate: (a, b) => a.birthDate!.localeCompare(b.birthDate!),
  lifecycle: (a, b) => lifecycleRank[a.lifecycle] - lifecycleRank[b.lifecycle],
  hutch: (a, b) => natural.compare(a.hutch, b.hutch),
  // Animals of unknown breed come last going up, first going down.
  breed: (a, b) => natural.compare(a.breedMakeup.breeds[0]?.name ?? '\uffff', b.breedMakeup.breeds[0]?.name ?? '\uffff'),
  coi: (a, b) => a.coi - b.coi,
};
const expectedOrder = (items: AnimalDto[], sort: HerdSortKey, dir: 'asc' | 'desc') =>
  [...items].sort((a, b) => (dir === 'asc' ? 1 : -1) * (byKey[sort](a, b) || natural.compare(a.tattoo!, b.tattoo!)));

type ListBody = { items: AnimalDto[]; total: number; page: number; pageSize: number };
const list = async (agent: Agent, query: Record<string, string | number>) => {
  const res = await agent.get('/api/animals').query(query);
  expect(res.status).toBe(200);
  return res.body as ListBody;
};
const tattoos = (body: ListBody) => body.items.map((a) => a.tattoo);

describe('the herd list pages in the database', () => {
  let coop: TestCoop;
  let member: Agent;
  let ours: AnimalDto[];

  beforeAll(async () => {
    coop = await createTestCoop();
    const breeds = await catalogueBreeds(coop.id);
    const nz = breeds['New Zealand']!.id; // six show classes
    const rex = breeds.Rex!.id; // four show classes
    const add = (fields: Parameters<typeof addAnimalAs>[1]) => addAnimalAs(coop.member, fields);
    const sire = await add({ tattoo: 'HR-2', name: 'Clover', sex: 'buck', breedId: nz, birthDate: '2021-06-01', hutch: 'B10' });
    const dam = await add({ tattoo: 'HR-10', name: 'Bramble', sex: 'doe', breedId: nz, birthDate: '2021-06-01', hutch: 'B2' });
    const daughter = await add({ tattoo: 'HR-11', name: 'bramble', sex: 'doe', sireId: sire.id, damId: dam.id, birthDate: '2022-03-01', hutch: 'B2' });
    await add({ tattoo: 'HR-3', name: 'Sorrel', sex: 'buck', sireId: sire.id, damId: daughter.id, birthDate: addDays(today, -20), hutch: 'A1' });
    await add({ tattoo: 'HR-1', name: 'Aster', sex: 'doe', breedId: nz, birthDate: addDays(today, -215), hutch: 'a1' });
    await add({ tattoo: 'R-7', name: 'Wren', sex: 'doe', breedId: rex, birthDate: addDays(today, -215), hutch: 'C3' });
    await add({ tattoo: 'X-20', name: 'Nobody', sex: 'buck', birthDate: addDays(today, -215), hutch: 'C3' });
    // A buck the neighbour lends to us is on our list; the neighbour's own doe and another co-op's are not.
    const lentBuck = await addAnimalAs(coop.otherFarmMember, { tattoo: 'HR-5', name: 'Borrowed', sex: 'buck', breedId: rex, birthDate: '2022-01-01', hutch: 'L1' });
    await addAnimalAs(coop.otherFarmMember, { tattoo: 'HR-4', name: 'Bramble', sex: 'doe', birthDate: '2022-01-01' });
    const otherCoop = await createTestCoop();
    await addAnimalAs(otherCoop.member, { tattoo: 'HR-6', name: 'Bramble', sex: 'doe', birthDate: '2022-01-01' });

    const neighbour = await sharedSignedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    const lent = await neighbour.post(`/api/animals/${lentBuck.id}/custody-events`).send({ kind: 'lent', toFarmId: coop.farms[0]!.id, movedOn: addDays(today, -1) });
    expect(lent.status).toBe(201);
    member = await sharedSignedInAgent(coop.member.email, TEST_PASSWORD);
    ours = (await list(member, { pageSize: 200 })).items;
  });

  it('when the herd is listed, then it is the farm\'s own and lent-in animals, tattoos in natural order, with the figures of each', () => {
    expect(ours.map((a) => a.tattoo)).toEqual(['HR-1', 'HR-2', 'HR-3', 'HR-5', 'HR-10', 'HR-11', 'R-7', 'X-20']);
    const sorrel = ours.find((a) => a.tattoo === 'HR-3')!;
    expect(sorrel.coi).toBe(0.25); // a sire mated to his daughter: Wright's coefficient, common practice
    expect(ours.find((a) => a.tattoo === 'HR-5')!.custody).toBe('on_loan_here');
    expect(ours.find((a) => a.tattoo === 'HR-1')!.breedMakeup).toMatchObject({ purity: 'purebred', breeds: [{ name: 'New Zealand', fraction: 1 }] });
  });

  it.each(herdSortKeys.flatMap((sort) => (['asc', 'desc'] as const).map((dir) => [sort, dir] as const)))(
    'when the herd is sorted by %s %s, then every page follows the key, ties broken by tattoo, with the same total',
    async (sort, dir) => {
      const expected = expectedOrder(ours, sort, dir).map((a) => a.tattoo);
      const whole = await list(member, { sort, dir, pageSize: 200 });
      expect(tattoos(whole)).toEqual(expected);
      const paged: (string | null)[] = [];
      for (let page = 1; page <= 3; page += 1) {
        const body = await list(member, { sort, dir, page, pageSize: 3 });
        expect(body).toMatchObject({ total: 8, page, pageSize: 3 });
        paged.push(...tattoos(body));
      }
      expect(paged).toEqual(expected);
    },
  );

  it('when the herd is filtered, then only matching animals come back and the total counts them all', async () => {
    const bucks = await list(member, { sex: 'buck', pageSize: 2 });
    expect(bucks.total).toBe(4);
    expect(tattoos(bucks)).toEqual(['HR-2', 'HR-3']);
    expect(tattoos(await list(member, { sex: 'buck', pageSize: 2, page: 2 }))).toEqual(['HR-5', 'X-20']);
    expect(tattoos(await list(member, { search: 'bramble' }))).toEqual(['HR-10', 'HR-11']);
    expect(tattoos(await list(member, { search: '%' }))).toEqual([]); // a wildcard is a character, not a pattern
    expect(tattoos(await list(member, { status: 'kit' }))).toEqual(ours.filter((a) => a.lifecycle === 'kit').map((a) => a.tattoo));
    // Seven months old: intermediate in a six-class breed, senior in a four-class breed or unknown ancestry.
    expect(tattoos(await list(member, { ageClass: 'intermediate' }))).toEqual(['HR-1']);
    const juniors = await list(member, { ageClass: 'junior' });
    expect({ tattoos: tattoos(juniors), total: juniors.total }).toEqual({ tattoos: ['HR-3'], total: 1 });
    expect(tattoos(await list(member, { ageClass: 'senior', sort: 'name' }))).toEqual(['HR-5', 'HR-10', 'HR-11', 'HR-2', 'X-20', 'R-7']);
    expect(tattoos(await list(member, { purity: 'purebred', sex: 'doe' }))).toEqual(['HR-1', 'HR-10', 'HR-11', 'R-7']);
    const breeds = await catalogueBreeds(coop.id);
    expect(tattoos(await list(member, { breedId: breeds.Rex!.id }))).toEqual(['HR-5', 'R-7']);
    const past = await list(member, { page: 9, pageSize: 2 });
    expect({ items: past.items, total: past.total }).toEqual({ items: [], total: 8 });
  });

  it('when a search or filter matches the neighbour\'s or another co-op\'s animals, then they never appear', async () => {
    const brambles = await list(member, { search: 'Bramble', status: 'all', pageSize: 200 });
    expect({ tattoos: tattoos(brambles), total: brambles.total }).toEqual({ tattoos: ['HR-10', 'HR-11'], total: 2 });
    const everything = await list(member, { status: 'all', pageSize: 200 });
    expect(tattoos(everything)).not.toContain('HR-4');
    expect(tattoos(everything)).not.toContain('HR-6');
    const neighbour = await sharedSignedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    // The lender still lists its lent-out buck, and none of ours.
    expect(tattoos(await list(neighbour, { status: 'all', pageSize: 200 }))).toEqual(['HR-4', 'HR-5']);
  });

  it('when the query is malformed, then it is a 400 naming each bad field, and nothing changes', async () => {
    const before = await asTenant(coop.id, async (c) => (await c.query('SELECT id, version, updated_at FROM animals ORDER BY id')).rows);
    const cases: [Record<string, string | number>, string[]][] = [
      [{ page: 0 }, ['page']],
      [{ pageSize: 0 }, ['pageSize']],
      [{ pageSize: 201 }, ['pageSize']],
      [{ page: 'two' }, ['page']],
      [{ sort: 'weight', dir: 'up' }, ['sort', 'dir']],
      [{ status: 'sold' }, ['status']],
      [{ ageClass: 'old' }, ['ageClass']],
      [{ breedId: 'not-an-id' }, ['breedId']],
      [{ search: 'x'.repeat(61) }, ['search']],
    ];
    for (const [query, fields] of cases) {
      const res = await member.get('/api/animals').query(query);
      expect({ query, status: res.status, code: res.body.error?.code }).toEqual({ query, status: 400, code: 'validation_failed' });
      expect(Object.keys(res.body.error.details).sort()).toEqual(fields.sort());
    }
    const unknown = await member.get('/api/animals').query({ farmId: coop.farms[1]!.id });
    expect(unknown.status).toBe(400);
    const after = await asTenant(coop.id, async (c) => (await c.query('SELECT id, version, updated_at FROM animals ORDER BY id')).rows);
    expect(after).toEqual(before);
  });
});
