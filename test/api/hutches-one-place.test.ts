import { afterAll, describe, expect, it } from 'vitest';
import type { HousingUnitDto } from '@burrowline/shared';
import { randomUUID } from 'node:crypto';
import { up as hutchesFromAnimalField } from '../../packages/server/src/db/migrations/0117-hutches-from-animal-field';
import { withTenant } from '../../packages/server/src/db/tenant';
import { importHerd } from '../../packages/server/src/modules/animals/herd-import.service';
import { daysAgo, farmToday } from '../support/almanac';
import { asTenant, ownerDb } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { addAnimalAs } from '../support/herd';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

const placementsOf = (coopId: string, animalId: string) =>
  asTenant(coopId, async (c) => (await c.query(
    `SELECT u.name, p.placed_on::text AS placed_on, p.ended_on::text AS ended_on
       FROM housing_placements p JOIN housing_units u ON u.id = p.unit_id WHERE p.animal_id = $1 ORDER BY p.created_at`, [animalId])).rows);
const hutchField = (coopId: string, animalId: string) =>
  asTenant(coopId, async (c) => (await c.query('SELECT hutch FROM animals WHERE id = $1', [animalId])).rows[0].hutch as string);
const occupants = (units: HousingUnitDto[], name: string) => units.find((u) => u.name === name)?.current.map((p) => p.animal?.id ?? p.litter?.id) ?? null;

describe('one place an animal lives: its hutch', () => {
  it('when animals carried only a written hutch, then the migration makes one hutch per name of each farm, places them in it, and the Hutches screen shows who lives there', async () => {
    const coop = await createTestCoop();
    const a = await addAnimalAs(coop.member, { name: 'Aster', sex: 'doe' });
    const b = await addAnimalAs(coop.member, { name: 'Birch', sex: 'doe' });
    const c = await addAnimalAs(coop.otherFarmMember, { name: 'Cedar', sex: 'buck' });
    // As records were before one notion of housing: free text on the animal, no hutch rows or placements.
    await asTenant(coop.id, async (client) => {
      await client.query(`UPDATE animals SET hutch = CASE id WHEN $1 THEN 'A2' WHEN $2 THEN ' a2 ' ELSE 'A2' END WHERE id = ANY($3::uuid[])`, [a.id, b.id, [a.id, b.id, c.id]]);
    }, { commit: true });
    await ownerDb(async (client) => {
      await client.query('BEGIN');
      await hutchesFromAnimalField({ context: { sql: async (s: string) => { await client.query(s); }, appRole: 'unused' } } as never);
      await client.query('COMMIT');
    });

    const units = await asTenant(coop.id, async (client) => (await client.query(
      'SELECT farm_id, name, kind FROM housing_units WHERE coop_id = $1 ORDER BY farm_id, name', [coop.id])).rows);
    expect(units).toEqual(expect.arrayContaining([
      { farm_id: coop.farms[0]!.id, name: 'A2', kind: 'hutch' },
      { farm_id: coop.farms[1]!.id, name: 'A2', kind: 'hutch' },
    ]));
    expect(units).toHaveLength(2);
    expect(await hutchField(coop.id, b.id)).toBe('A2');
    const member = await agentOf(coop.member.email);
    const screen = (await member.get('/api/housing-units').expect(200)).body.units as HousingUnitDto[];
    expect(occupants(screen, 'A2')?.sort()).toEqual([a.id, b.id].sort());
    const other = (await (await agentOf(coop.otherFarmMember.email)).get('/api/housing-units').expect(200)).body.units as HousingUnitDto[];
    expect(occupants(other, 'A2')).toEqual([c.id]);
  });

  it("when a hutch is typed on an animal's record, then it is the farm's hutch of that name (made when new) and moving it on the Hutches screen rewrites the record's hutch", async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    await agent.post('/api/housing-units').send({ name: 'Row B-3', kind: 'hutch' }).expect(201);
    const doe = await addAnimalAs(coop.member, { name: 'Dahlia', sex: 'doe', hutch: 'row b-3' });
    expect(await hutchField(coop.id, doe.id)).toBe('Row B-3');
    expect(await placementsOf(coop.id, doe.id)).toEqual([{ name: 'Row B-3', placed_on: farmToday(), ended_on: null }]);

    // Edited to a hutch the farm does not have yet: it is made, and the old placement ends today.
    const record = (await agent.get(`/api/animals/${doe.id}`).expect(200)).body;
    await agent.patch(`/api/animals/${doe.id}`).send({ hutch: 'Nursery 1', version: record.version }).expect(200);
    expect(await placementsOf(coop.id, doe.id)).toEqual([
      { name: 'Row B-3', placed_on: farmToday(), ended_on: farmToday() },
      { name: 'Nursery 1', placed_on: farmToday(), ended_on: null },
    ]);
    const units = (await agent.get('/api/housing-units').expect(200)).body.units as HousingUnitDto[];
    expect(occupants(units, 'Nursery 1')).toEqual([doe.id]);
    expect(occupants(units, 'Row B-3')).toEqual([]);

    // Moved on the Hutches screen: the record's hutch follows; moved out of any, it is blank.
    const rowB = units.find((u) => u.name === 'Row B-3')!;
    const placed = (await agent.post(`/api/housing-units/${rowB.id}/placements`).send({ animalId: doe.id, placedOn: farmToday() }).expect(201)).body as HousingUnitDto;
    expect(await hutchField(coop.id, doe.id)).toBe('Row B-3');
    await agent.post(`/api/housing-placements/${placed.current[0]!.id}/end`).send({ endedOn: farmToday() }).expect(200);
    expect(await hutchField(coop.id, doe.id)).toBe('');
    const herd = await agent.get('/api/animals').query({ search: 'Dahlia' }).expect(200);
    expect(herd.body.items[0].hutch).toBe('');
  });

  it('when an animal in a hutch is sold to another farm, then it no longer shows in the hutch and its hutch cards still print', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const doe = await addAnimalAs(coop.member, { name: 'Elder', sex: 'doe', hutch: 'C1', birthDate: daysAgo(400) });
    const keeper = await addAnimalAs(coop.member, { name: 'Fennel', sex: 'doe', hutch: 'C1', birthDate: daysAgo(400) });
    await agent.post(`/api/animals/${doe.id}/custody-events`).send({ kind: 'transferred', toFarmId: coop.farms[1]!.id, movedOn: farmToday() }).expect(201);
    const units = (await agent.get('/api/housing-units').expect(200)).body.units as HousingUnitDto[];
    expect(occupants(units, 'C1')).toEqual([keeper.id]);
    expect(await hutchField(coop.id, doe.id)).toBe('');
    const cards = await agent.get('/api/hutch-cards').query({ animalIds: keeper.id });
    expect(cards.status).toBe(200);
    expect(cards.headers['content-type']).toMatch(/application\/pdf/);
  });

  it('when a herd is loaded with written hutches, then each name becomes one hutch of the farm with the loaded animals in it', async () => {
    const coop = await createTestCoop();
    await addAnimalAs(coop.member, { name: 'Ivy', sex: 'doe' });
    const farmId = coop.farms[0]!.id;
    const loaded = ['Juno', 'Kale'].map((name, i) => ({
      id: randomUUID(), farmId, breedingFarmId: farmId, tattoo: `IMP-${randomUUID().slice(0, 6)}`, name, sex: 'doe' as const, breedId: null,
      birthDate: '2024-01-0' + (i + 1), sireId: null, damId: null, hutch: i === 0 ? 'D4' : 'd4', lifecycle: 'breeding' as const,
    }));
    await withTenant({ coopId: coop.id }, (tx) => importHerd(coop.id, loaded, coop.member.id, tx));
    const units = (await (await agentOf(coop.member.email)).get('/api/housing-units').expect(200)).body.units as HousingUnitDto[];
    expect(units.map((u) => u.name)).toEqual(['D4']);
    expect(occupants(units, 'D4')?.sort()).toEqual(loaded.map((a) => a.id).sort());
    expect(await hutchField(coop.id, loaded[1]!.id)).toBe('D4');
  });
});
