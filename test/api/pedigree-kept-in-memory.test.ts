import { describe, expect, it } from 'vitest';
import type { TrialMatingDto } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { asTenant } from '../support/db';
import { addAnimal, catalogueBreeds } from '../support/herd';
import { signedInAgent, type Agent } from '../support/test-app';

/**
 * Every server instance keeps the co-op's pedigree in memory and checks the co-op's pedigree version
 * per use. Another instance's change is simulated here the way it reaches this one: the rows change
 * and the version is bumped from another connection, in one committed transaction.
 */
async function litterCoi(agent: Agent, damId: string, sireId: string): Promise<number> {
  const res = await agent.post('/api/trial-matings').send({ damId, sireIds: [sireId] });
  expect(res.status).toBe(200);
  return (res.body as TrialMatingDto).litters[0]!.coi;
}

async function versionOf(coopId: string): Promise<{ version: number; changed: string[] | null }> {
  const { rows } = await asTenant(coopId, (c) => c.query('SELECT version, changed_ids FROM pedigree_versions WHERE coop_id = $1', [coopId]));
  return { version: Number(rows[0].version), changed: rows[0].changed_ids };
}

describe('the co-op pedigree kept in memory by each instance', () => {
  it('when another instance changes a parent and bumps the version, then the next comparison here sees it (one version behind and several)', async () => {
    const coop = await createTestCoop();
    const a = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const b = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    const breeds = await catalogueBreeds(coop.id);
    const nz = breeds['New Zealand']!.id;
    const sire = await addAnimal(a, { sex: 'buck', name: 'Founder buck', breedId: nz, birthDate: '2020-01-01' });
    const dam = await addAnimal(a, { sex: 'doe', name: 'Founder doe', breedId: nz, birthDate: '2020-02-01' });
    const otherDam = await addAnimal(a, { sex: 'doe', name: 'Second doe', breedId: nz, birthDate: '2020-03-01' });
    const stranger = await addAnimal(b, { sex: 'buck', name: 'Unrelated buck', breedId: nz, birthDate: '2020-03-01' });
    const son = await addAnimal(b, { sex: 'buck', name: 'Son', sireId: sire.id, damId: dam.id, birthDate: '2021-01-01' });
    const daughter = await addAnimal(a, { sex: 'doe', name: 'Daughter', sireId: sire.id, damId: dam.id, birthDate: '2021-01-01' });
    // Full sibs: 1/4 (Falconer & Mackay, standard table). This first comparison loads the pedigree.
    expect(await litterCoi(a, daughter.id, son.id)).toBe(0.25);
    const before = await versionOf(coop.id);

    // One version behind, naming the animal: the son's dam corrected elsewhere → half sibs, 1/8.
    await asTenant(coop.id, async (c) => {
      await c.query('UPDATE animals SET dam_id = $2 WHERE id = $1', [son.id, otherDam.id]);
      await c.query('UPDATE pedigree_versions SET version = version + 1, changed_ids = ARRAY[$2::uuid] WHERE coop_id = $1', [coop.id, son.id]);
    }, { commit: true });
    expect(await litterCoi(a, daughter.id, son.id)).toBe(0.125);

    // Several versions behind, and one change not naming its animals: the son's sire becomes the
    // unrelated buck (no common ancestor: 0), then back to full sibs; only the latest state counts.
    await asTenant(coop.id, async (c) => {
      await c.query('UPDATE animals SET sire_id = $2 WHERE id = $1', [son.id, stranger.id]);
      await c.query('UPDATE pedigree_versions SET version = version + 1, changed_ids = NULL WHERE coop_id = $1', [coop.id]);
    }, { commit: true });
    await asTenant(coop.id, async (c) => {
      await c.query('UPDATE pedigree_versions SET version = version + 1, changed_ids = ARRAY[$2::uuid] WHERE coop_id = $1', [coop.id, son.id]);
    }, { commit: true });
    expect(await litterCoi(a, daughter.id, son.id)).toBe(0);
    await asTenant(coop.id, async (c) => {
      await c.query('UPDATE animals SET sire_id = $2, dam_id = $3 WHERE id = $1', [son.id, sire.id, dam.id]);
      await c.query('UPDATE pedigree_versions SET version = version + 1, changed_ids = NULL WHERE coop_id = $1', [coop.id]);
    }, { commit: true });
    expect(await litterCoi(a, daughter.id, son.id)).toBe(0.25);
    expect((await versionOf(coop.id)).version).toBe(before.version + 4);
  });

  it('when a parent is changed or an animal added through the API, then the version moves in the same transaction, naming the animal, and the comparison follows', async () => {
    const coop = await createTestCoop();
    const a = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const sire = await addAnimal(a, { sex: 'buck', name: 'Founder buck', birthDate: '2020-01-01' });
    const dam = await addAnimal(a, { sex: 'doe', name: 'Founder doe', birthDate: '2020-02-01' });
    const son = await addAnimal(a, { sex: 'buck', name: 'Son', sireId: sire.id, birthDate: '2021-01-01' });
    const daughter = await addAnimal(a, { sex: 'doe', name: 'Daughter', sireId: sire.id, damId: dam.id, birthDate: '2021-01-01' });
    expect(await versionOf(coop.id)).toMatchObject({ changed: [daughter.id, sire.id, dam.id] });
    // Half sibs through the sire: 1/8 (Falconer & Mackay).
    expect(await litterCoi(a, daughter.id, son.id)).toBe(0.125);
    const before = await versionOf(coop.id);

    const edit = await a.patch(`/api/animals/${son.id}`).send({ damId: dam.id, version: son.version });
    expect(edit.status).toBe(200);
    expect(await versionOf(coop.id)).toEqual({ version: before.version + 1, changed: [son.id, sire.id, dam.id] });
    expect(await litterCoi(a, daughter.id, son.id)).toBe(0.25);

    // A refused edit (a cycle) rolls the version back with it.
    const cycle = await a.patch(`/api/animals/${sire.id}`).send({ sireId: son.id, version: sire.version });
    expect(cycle.status).toBe(400);
    expect((await versionOf(coop.id)).version).toBe(before.version + 1);
    expect(await litterCoi(a, daughter.id, son.id)).toBe(0.25);
  });
});
