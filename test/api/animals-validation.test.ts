import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { addDays, formatDayInWords, todayIn } from '@burrowline/shared';
import { daysAgo, kindlingAs, serviceAs } from '../support/almanac';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { asTenant } from '../support/db';
import { addAnimal, catalogueBreeds } from '../support/herd';
import { signedInAgent } from '../support/test-app';

/** Everything a refused write could have touched, to show that nothing was written. */
async function herdState(coop: TestCoop) {
  return asTenant(coop.id, async (c) => {
    const count = async (table: string) => (await c.query(`SELECT count(*)::int AS n FROM ${table} WHERE coop_id = $1`, [coop.id])).rows[0].n as number;
    return {
      animals: await count('animals'),
      statusEvents: await count('animal_status_events'),
      custody: await count('animal_custody_events'),
      coi: await count('animal_inbreeding'),
      changes: await count('record_changes'),
      versions: (await c.query('SELECT id, version, sire_id, dam_id FROM animals WHERE coop_id = $1 ORDER BY id', [coop.id])).rows,
    };
  });
}

async function setUp() {
  const coop = await createTestCoop();
  const breeds = await catalogueBreeds(coop.id);
  const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
  const buck = await addAnimal(agent, { tattoo: 'B-1', name: 'Alder', sex: 'buck', breedId: breeds['New Zealand']!.id, birthDate: '2022-01-01' });
  const doe = await addAnimal(agent, { tattoo: 'D-1', name: 'Fern', sex: 'doe', breedId: breeds['New Zealand']!.id, birthDate: '2022-02-01' });
  return { coop, breeds, agent, buck, doe };
}

describe('bad herd input: clear field errors and nothing written', () => {
  it('when a name holds a line break or NUL, or the birth date is 1900, then the field says so and nothing is written; the Almanac refuses a year 9999 query', async () => {
    const { coop, agent } = await setUp();
    const before = await herdState(coop);
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ name: 'Fern\r\nHill' }, 'name', /on one line/],
      [{ name: 'Fern\u0000' }, 'name', /on one line/],
      [{ colour: 'Black\nWhite' }, 'colour', /on one line/],
      [{ birthDate: '1900-01-01' }, 'birthDate', /from 1990-01-01 to 2100-12-31/],
      [{ notes: 'Quiet doe\u0000' }, 'notes', /control characters/],
    ];
    for (const [fields, field, message] of cases) {
      const res = await agent.post('/api/animals').send({ tattoo: 'N-1', sex: 'doe', birthDate: '2023-01-01', ...fields });
      expect(res.status, field).toBe(400);
      expect(res.body.error.details[field]?.[0], field).toMatch(message);
    }
    expect(await herdState(coop)).toEqual(before);
    const future = await agent.get('/api/almanac/tasks?from=9999-12-01');
    expect(future.status).toBe(400);
    expect(future.body.error.details.from[0]).toBe('Enter a date from 1990-01-01 to 2100-12-31');
  });

  it('when a text in the body holds half of a UTF-16 surrogate pair, then the body is refused as 400 (not a 500) and nothing is written', async () => {
    // Found by the fuzzing of every route: JSON may escape a lone surrogate, PostgreSQL's jsonb refuses it.
    const { coop, agent, doe } = await setUp();
    const before = await herdState(coop);
    for (const body of [`{"name":"\\ud800","version":${doe.version}}`, `{"name":"Fern \\udfff Hill","version":${doe.version}}`, `{"\\ud83d":"x","version":${doe.version}}`]) {
      const res = await agent.patch(`/api/animals/${doe.id}`).set('Content-Type', 'application/json').send(body);
      expect(res.status, body).toBe(400);
      expect(res.body.error.code, body).toBe('validation_failed');
    }
    expect(await herdState(coop)).toEqual(before);
    // A whole pair is one character, and fine.
    const paired = await agent.patch(`/api/animals/${doe.id}`).set('Content-Type', 'application/json').send(`{"name":"Fern \\ud83d\\udc07","version":${doe.version}}`);
    expect(paired.status).toBe(200);
    expect(paired.body.name).toBe('Fern 🐇');
  });

  it('when a tattoo is already kept by the farm, then the tattoo field says so with a prompt, and nothing is written', async () => {
    const { coop, agent } = await setUp();
    const before = await herdState(coop);
    const res = await agent.post('/api/animals').send({ tattoo: 'b-1', sex: 'doe', birthDate: '2023-01-01', origin: 'arrived', arrivedOn: '2023-06-01', breederName: 'Ashbury Farm' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.details.tattoo).toEqual([
      'B-1 is already the tattoo of Alder in your herd. Re-tattoo this animal, or add a farm suffix (e.g. b-1-AF).',
    ]);
    expect(await herdState(coop)).toEqual(before);
  });

  it('when a buck is given as dam and a doe as sire, then both fields are refused and nothing is written', async () => {
    const { coop, agent, buck, doe } = await setUp();
    const before = await herdState(coop);
    const res = await agent.post('/api/animals').send({ tattoo: 'K-1', sex: 'doe', birthDate: '2023-05-01', sireId: doe.id, damId: buck.id });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual({
      sireId: [`Fern (D-1) is a doe; a sire must be a buck`],
      damId: [`Alder (B-1) is a buck; a dam must be a doe`],
    });
    expect(await herdState(coop)).toEqual(before);
  });

  it('when a parent was born after the child, then the parent field is refused and nothing is written', async () => {
    const { coop, agent, buck, doe } = await setUp();
    const before = await herdState(coop);
    const res = await agent.post('/api/animals').send({ tattoo: 'K-2', sex: 'doe', birthDate: '2021-12-01', sireId: buck.id, damId: doe.id });
    expect(res.status).toBe(400);
    expect(res.body.error.details.sireId).toEqual(['Alder (B-1) was born on 2022-01-01, not before this animal (2021-12-01)']);
    expect(res.body.error.details.damId).toEqual(['Fern (D-1) was born on 2022-02-01, not before this animal (2021-12-01)']);
    expect(await herdState(coop)).toEqual(before);
  });

  it('when an edit would make an animal its own ancestor, then it is refused as a cycle and nothing changes', async () => {
    const { coop, agent, buck, doe } = await setUp();
    const son = await addAnimal(agent, { tattoo: 'S-1', name: 'Birch', sex: 'buck', sireId: buck.id, damId: doe.id, birthDate: '2022-09-01' });
    const grandson = await addAnimal(agent, { tattoo: 'S-2', name: 'Rowan', sex: 'buck', sireId: son.id, damId: doe.id, birthDate: '2023-04-01' });
    const before = await herdState(coop);
    const own = await agent.patch(`/api/animals/${buck.id}`).send({ sireId: buck.id, version: buck.version });
    expect(own.status).toBe(400);
    expect(own.body.error.details.sireId).toEqual(['An animal cannot be its own sire']);
    // Birth dates usually catch a loop first (an ancestor is older); the pedigree check refuses it whatever the dates say.
    const cycle = await agent.patch(`/api/animals/${buck.id}`).send({ sireId: grandson.id, birthDate: '2024-01-01', version: buck.version });
    expect(cycle.status).toBe(400);
    expect(cycle.body.error.details.sireId).toEqual(['Rowan (S-2) descends from this animal, so it cannot also be its sire (a cycle in the pedigree)']);
    expect(cycle.body.error.details.birthDate[0]).toMatch(/Birch was born on 2022-09-01, before this date/);
    expect(await herdState(coop)).toEqual(before);
  });

  it('when the breed is unknown, then the breed field is refused; malformed fields get field messages; nothing is written', async () => {
    const { coop, agent } = await setUp();
    const before = await herdState(coop);
    const unknown = await agent.post('/api/animals').send({ tattoo: 'K-3', sex: 'doe', birthDate: '2023-01-01', breedId: randomUUID() });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details.breedId).toEqual(['Unknown breed: choose one from the list (your co-op admin can add a missing breed)']);
    const malformed = await agent.post('/api/animals').send({ tattoo: 'has space', sex: 'hen', birthDate: '2023-02-30', owningFarmId: coop.farms[1]!.id });
    expect(malformed.status).toBe(400);
    expect(Object.keys(malformed.body.error.details)).toEqual(expect.arrayContaining(['tattoo', 'sex', 'birthDate']));
    const future = await agent.post('/api/animals').send({ tattoo: 'K-4', sex: 'doe', birthDate: addDays(todayIn('America/Chicago'), 3) });
    expect(future.body.error.details.birthDate).toEqual(['A birth date cannot be in the future']);
    expect(await herdState(coop)).toEqual(before);
  });

  it('when a parent was younger than its breed\'s first-breeding age, then a warning asks for confirmation; confirmed, it saves', async () => {
    const { coop, agent, buck, breeds } = await setUp();
    // A New Zealand doe 120 days old at the birth: medium breeds are first bred at 4½–5½ months (Rabbit Production, 9th ed.).
    const youngDoe = await addAnimal(agent, { tattoo: 'Y-1', name: 'Wren', sex: 'doe', breedId: breeds['New Zealand']!.id, birthDate: '2023-01-01' });
    const before = await herdState(coop);
    const body = { tattoo: 'K-5', sex: 'doe', birthDate: addDays('2023-01-01', 120), sireId: buck.id, damId: youngDoe.id };
    const warned = await agent.post('/api/animals').send(body);
    expect(warned.status).toBe(422);
    expect(warned.body.error.code).toBe('confirmation_required');
    expect(warned.body.error.details.damId[0]).toBe(
      'Wren (Y-1) was 120 days old at this birth, younger than the usual first-breeding age of 137 days for its breed. Save anyway if that is right.',
    );
    expect(warned.body.error.details.sireId).toBeUndefined();
    expect(await herdState(coop)).toEqual(before);
    const confirmed = await agent.post('/api/animals').send({ ...body, confirm: true });
    expect(confirmed.status).toBe(201);
    expect(confirmed.body.damId).toBe(youngDoe.id);
    const row = await asTenant(coop.id, (c) => c.query('SELECT tattoo, sire_id, dam_id, birth_date::text AS birth_date FROM animals WHERE id = $1', [confirmed.body.id]));
    expect(row.rows).toEqual([{ tattoo: 'K-5', sire_id: buck.id, dam_id: youngDoe.id, birth_date: body.birthDate }]);
  });

  it('when a parent from papers is invalid, then the whole entry is refused and no outside animal is left behind', async () => {
    const { coop, agent, buck } = await setUp();
    const before = await herdState(coop);
    const res = await agent.post('/api/animals').send({
      tattoo: 'K-6', sex: 'doe', birthDate: '2023-05-01', sireId: buck.id,
      damFromPapers: { name: 'Paper Doe', registrationNumber: 'P-77', breedId: randomUUID() },
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details['damFromPapers.breedId']).toBeDefined();
    expect(await herdState(coop)).toEqual(before);
    const both = await agent.post('/api/animals').send({ tattoo: 'K-7', sex: 'doe', birthDate: '2023-05-01', sireId: buck.id, sireFromPapers: { name: 'Twice' } });
    expect(both.status).toBe(400);
    expect(both.body.error.details.sireFromPapers).toEqual(['Pick a sire or enter one from papers, not both']);
  });

  it('when a recorded sire would change sex or be born after his kits, then the edit is refused', async () => {
    const { coop, agent, buck, doe } = await setUp();
    await addAnimal(agent, { tattoo: 'K-8', sireId: buck.id, damId: doe.id, birthDate: '2023-01-01' });
    const before = await herdState(coop);
    const sex = await agent.patch(`/api/animals/${buck.id}`).send({ sex: 'doe', version: buck.version });
    expect(sex.status).toBe(400);
    expect(sex.body.error.details.sex).toEqual(['This animal is recorded as the sire of 1 animal; its sex cannot change']);
    const born = await agent.patch(`/api/animals/${buck.id}`).send({ birthDate: '2023-02-01', version: buck.version });
    expect(born.status).toBe(400);
    expect(born.body.error.details.birthDate[0]).toMatch(/was born on 2023-01-01, before this date; a parent is born first/);
    expect(await herdState(coop)).toEqual(before);
  });

  it('when a kit is added to a dam on a day that is not one of her kindlings, then the birth date names her litters and nothing is written; her kindling day saves', async () => {
    const { coop, agent, buck, doe } = await setUp();
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(40) });
    await kindlingAs(coop.member, { serviceId: service.id, kindledOn: daysAgo(9), bornAlive: 6, bornDead: 0 });
    const before = await herdState(coop);
    // A kit five days before her kindling, as the breeder's try found.
    const early = await agent.post('/api/animals').send({ tattoo: 'K-20', sex: 'doe', birthDate: daysAgo(14), sireId: buck.id, damId: doe.id });
    expect(early.status).toBe(400);
    expect(early.body.error.details.birthDate).toEqual([
      `Fern (D-1)'s litter was kindled on ${formatDayInWords(daysAgo(9))}. A kit of hers is born on its litter's kindling day: use that date, or record the kindling of this litter first.`,
    ]);
    expect(await herdState(coop)).toEqual(before);

    const kit = await agent.post('/api/animals').send({ tattoo: 'K-21', sex: 'doe', birthDate: daysAgo(9), sireId: buck.id, damId: doe.id });
    expect(kit.status).toBe(201);
    const row = await asTenant(coop.id, async (c) => (await c.query('SELECT birth_date::text AS born, dam_id FROM animals WHERE id = $1', [kit.body.id])).rows[0]);
    expect(row).toEqual({ born: daysAgo(9), dam_id: doe.id });

    // Moving the kit's birth date off her litter is refused the same way; a name edit of the kit is not held up.
    const moved = await agent.patch(`/api/animals/${kit.body.id}`).send({ birthDate: daysAgo(10), version: kit.body.version });
    expect(moved.status).toBe(400);
    expect(moved.body.error.details.birthDate[0]).toMatch(/^Fern \(D-1\)'s litter was kindled on /);
    const renamed = await agent.patch(`/api/animals/${kit.body.id}`).send({ name: 'Sorrel', version: kit.body.version });
    expect(renamed.status).toBe(200);
  });

  it('when another farm records a kit of a doe whose litters are not on its record, then her private kindling days are not used or told', async () => {
    const { coop, buck, doe } = await setUp();
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(40) });
    await kindlingAs(coop.member, { serviceId: service.id, kindledOn: daysAgo(9), bornAlive: 6, bornDead: 0 });
    const other = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    const res = await other.post('/api/animals').send({ tattoo: 'X-1', sex: 'buck', birthDate: daysAgo(30), damId: doe.id, origin: 'arrived', arrivedOn: daysAgo(2), breederName: 'Fern\'s farm' });
    expect(res.status).toBe(201);
    expect(JSON.stringify(res.body)).not.toContain(formatDayInWords(daysAgo(9)));
  });
});
