import { describe, expect, it } from 'vitest';
import { inbreedingCoefficients, type AnimalDetailDto, type PedigreeTreeDto, type TrialMatingDto } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { asTenant } from '../support/db';
import { addAnimal, addAnimalAs, catalogueBreeds } from '../support/herd';
import { signedInAgent, type Agent } from '../support/test-app';

/**
 * A small family across two farms: founders (a buck, a doe, a second doe) on farm A; the founders'
 * son lives on farm B, his full sister and his half sister (by the second doe) on farm A.
 */
async function family(coop: TestCoop, a: Agent, b: Agent) {
  const breeds = await catalogueBreeds(coop.id);
  const nz = breeds['New Zealand']!.id;
  const sire = await addAnimal(a, { sex: 'buck', name: 'Founder buck', breedId: nz, birthDate: '2020-01-01' });
  const dam = await addAnimal(a, { sex: 'doe', name: 'Founder doe', breedId: nz, birthDate: '2020-02-01' });
  const otherDam = await addAnimal(a, { sex: 'doe', name: 'Second doe', breedId: breeds.Californian!.id, birthDate: '2020-03-01' });
  const son = await addAnimal(b, { sex: 'buck', name: 'Son on farm B', sireId: sire.id, damId: dam.id, birthDate: '2021-01-01' });
  const daughter = await addAnimal(a, { sex: 'doe', name: 'Daughter', sireId: sire.id, damId: dam.id, birthDate: '2021-01-01' });
  const halfSister = await addAnimal(a, { sex: 'doe', name: 'Half sister', sireId: sire.id, damId: otherDam.id, birthDate: '2021-02-01' });
  return { breeds, sire, dam, otherDam, son, daughter, halfSister };
}

describe('pedigree and inbreeding across the co-op', () => {
  it('when full sibs of two farms are mated, then the litter\'s COI is 1/4 (Wright 1922; Falconer & Mackay table)', async () => {
    const coop = await createTestCoop();
    const a = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const b = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    const f = await family(coop, a, b);
    const kit = await addAnimal(a, { sireId: f.son.id, damId: f.daughter.id, birthDate: '2022-01-01' });
    expect(kit.coi).toBe(0.25); // full sibs: F = 1/4 (Falconer & Mackay, standard table)
    const stored = await asTenant(coop.id, (c) => c.query('SELECT coi FROM animal_inbreeding WHERE animal_id = $1', [kit.id]));
    expect(stored.rows[0].coi).toBe(0.25);
  });

  it('when a parent changes, then COI is recomputed for the animal and its descendants on other farms, and no other record\'s version moves', async () => {
    const coop = await createTestCoop();
    const a = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const b = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    const f = await family(coop, a, b);
    // A kit of son × half sister (half sibs: F = 1/8, Falconer & Mackay), kept on farm B.
    const kit = await addAnimal(b, { sireId: f.son.id, damId: f.halfSister.id, birthDate: '2022-03-01' });
    expect(kit.coi).toBe(0.125);
    const grandkit = await addAnimal(b, { sireId: f.son.id, damId: kit.id, birthDate: '2023-03-01' });
    // Sire × his daughter by a half sister: F = ½(½(1 + F_son) + f(son, half sister)) = ½(½ + ⅛) = 0.3125 (derived from Wright's formula).
    const before = await asTenant(coop.id, (c) =>
      c.query('SELECT a.id, a.version, i.coi, i.computed_at FROM animals a JOIN animal_inbreeding i ON i.animal_id = a.id WHERE a.coop_id = $1', [coop.id]),
    );
    const row = (id: string) => before.rows.find((r) => r.id === id);
    expect(row(grandkit.id).coi).toBe(0.3125);

    // Farm A changes the half sister's dam to the founder doe: she becomes a full sister of the son.
    const halfSister = (await a.get(`/api/animals/${f.halfSister.id}`)).body as AnimalDetailDto;
    const res = await a.patch(`/api/animals/${f.halfSister.id}`).send({ damId: f.dam.id, version: halfSister.version });
    expect(res.status).toBe(200);
    const after = await asTenant(coop.id, (c) =>
      c.query('SELECT a.id, a.version, i.coi, i.computed_at FROM animals a JOIN animal_inbreeding i ON i.animal_id = a.id WHERE a.coop_id = $1', [coop.id]),
    );
    const now = (id: string) => after.rows.find((r) => r.id === id);
    expect(now(kit.id).coi).toBe(0.25); // now a full-sib litter (Falconer & Mackay)
    expect(now(grandkit.id).coi).toBe(0.375); // ½(½ + ¼), derived from Wright's formula
    expect((await b.get(`/api/animals/${kit.id}`)).body.coi).toBe(0.25);
    expect(now(kit.id).computed_at.getTime()).toBeGreaterThan(row(kit.id).computed_at.getTime());
    // Unchanged figures are not rewritten, and recomputing never bumps a record's version.
    expect(now(f.son.id).computed_at.getTime()).toBe(row(f.son.id).computed_at.getTime());
    for (const r of after.rows) if (r.id !== f.halfSister.id) expect(r.version).toBe(row(r.id).version);
    expect(now(f.halfSister.id).version).toBe(row(f.halfSister.id).version + 1);
    // The half sister's breed make-up follows her new dam: purebred New Zealand instead of ½ Californian.
    expect(res.body.breedMakeup.purity).toBe('purebred');
  });

  it('when any member opens the pedigree of another farm\'s animal, then four generations of cards come back, with no farm-private data', async () => {
    const coop = await createTestCoop();
    const a = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const b = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    const f = await family(coop, a, b);
    const kit = await addAnimal(a, { sireId: f.son.id, damId: f.daughter.id, birthDate: '2022-01-01', notes: 'secret note' });
    const res = await b.get(`/api/animals/${kit.id}/pedigree`).query({ generations: 4 });
    expect(res.status).toBe(200);
    const tree = res.body as PedigreeTreeDto;
    expect(tree.slots).toHaveLength(32);
    expect(tree.slots.slice(1, 8)).toEqual([kit.id, f.son.id, f.daughter.id, f.sire.id, f.dam.id, f.sire.id, f.dam.id]);
    expect(tree.cards[f.son.id]).toMatchObject({ currentFarm: { id: coop.farms[1]!.id }, breedingFarm: { id: coop.farms[1]!.id } });
    expect(tree.cards[kit.id]!.coi).toBe(0.25);
    expect(tree.completeness).toEqual([1, 1, 0, 0]);
    expect(JSON.stringify(tree)).not.toMatch(/secret note|latestWeight|"notes"|"hutch"/);
    expect((await b.get(`/api/animals/${kit.id}/pedigree`).query({ generations: 9 })).status).toBe(400);

    const cards = await b.get('/api/pedigree-cards').query({ sex: 'buck', onFarm: 'true' });
    expect(cards.status).toBe(200);
    expect(cards.body.items.map((c: { id: string }) => c.id).sort()).toEqual([f.sire.id, f.son.id].sort());
    const search = await b.get('/api/pedigree-cards').query({ search: 'daught' });
    expect(search.body.items.map((c: { id: string }) => c.id)).toEqual([f.daughter.id]);
  });

  it('when a member runs trial matings of her doe with bucks of two farms, then each litter\'s COI, breed make-up and shared ancestors come back', async () => {
    const coop = await createTestCoop();
    const a = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const b = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    const f = await family(coop, a, b);
    const stranger = await addAnimal(b, { sex: 'buck', name: 'Unrelated Californian', breedId: f.breeds.Californian!.id, birthDate: '2020-06-01' });
    const res = await a.post('/api/trial-matings').send({ damId: f.daughter.id, sireIds: [f.son.id, stranger.id, f.sire.id] });
    expect(res.status).toBe(200);
    const trial = res.body as TrialMatingDto;
    expect(trial.dam.id).toBe(f.daughter.id);
    const byBuck = Object.fromEntries(trial.litters.map((l) => [l.sire.id, l]));
    expect(byBuck[f.son.id]!.coi).toBe(0.25); // full sibs (Falconer & Mackay)
    expect(byBuck[f.sire.id]!.coi).toBe(0.25); // parent × offspring (Falconer & Mackay)
    expect(byBuck[stranger.id]!.coi).toBe(0);
    expect(byBuck[f.son.id]!.commonAncestors.map((x) => x.id).sort()).toEqual([f.sire.id, f.dam.id].sort());
    expect(byBuck[f.sire.id]!.commonAncestors.map((x) => x.id)).toEqual([f.sire.id]);
    // In words, as the service form shows them.
    expect([byBuck[f.son.id]!.relationship, byBuck[f.sire.id]!.relationship, byBuck[stranger.id]!.relationship]).toEqual(['brother', 'her sire', 'no shared ancestor on record']);
    expect(byBuck[stranger.id]!.breedMakeup).toMatchObject({ purity: 'known_cross' });
    expect(byBuck[stranger.id]!.breedMakeup.breeds.map((x) => [x.name, x.fraction]).sort()).toEqual([['Californian', 0.5], ['New Zealand', 0.5]]);
    expect(byBuck[stranger.id]!.sire.currentFarm?.id).toBe(coop.farms[1]!.id);
    expect(JSON.stringify(trial)).not.toMatch(/latestWeight|"notes"/);
    // Nothing is stored by a trial.
    const count = await asTenant(coop.id, (c) => c.query('SELECT count(*)::int AS n FROM animals WHERE coop_id = $1', [coop.id]));
    expect(count.rows[0].n).toBe(7);

    const wrong = await a.post('/api/trial-matings').send({ damId: f.son.id, sireIds: [f.daughter.id] });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details.damId[0]).toMatch(/is a buck; choose a doe/);
    expect(wrong.body.error.details['sireIds.0'][0]).toMatch(/is a doe; choose a buck/);
    const foreign = await createTestCoop();
    const outsider = await signedInAgent(foreign.member.email, TEST_PASSWORD);
    const leak = await outsider.post('/api/trial-matings').send({ damId: f.daughter.id, sireIds: [f.son.id] });
    expect(leak.status).toBe(400); // another co-op's animals are simply not there
    expect(leak.body.error.details.damId).toEqual(["That doe is not in the co-op's records: choose one from the list"]);
  });

  it('when two farms enter the same ancestor from papers, then the registry holds one animal; the admin merges a duplicate that slipped in', async () => {
    const coop = await createTestCoop();
    const breeds = await catalogueBreeds(coop.id);
    const a = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const b = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    const papers = { name: 'Ridgeback Oberon', registrationNumber: 'ARB-7731', breedId: breeds['Silver Fox']!.id, breederName: 'Far Hollow Rabbitry' };
    const first = await addAnimal(a, { birthDate: '2023-02-01', sireFromPapers: papers });
    const second = await addAnimal(b, { birthDate: '2023-03-01', sireFromPapers: { ...papers, name: 'RIDGEBACK OBERON', registrationNumber: 'arb-7731' } });
    expect(second.sireId).toBe(first.sireId);
    expect(first.sire).toMatchObject({ isOutside: true, registrationNumber: 'ARB-7731', breederName: 'Far Hollow Rabbitry', currentFarm: null });

    // Matched on tattoo + name when there is no registration number.
    const byTattoo1 = await a.post('/api/outside-animals').send({ name: 'Dusk', tattoo: 'FH9', sex: 'doe' });
    expect(byTattoo1.status).toBe(201);
    const byTattoo2 = await b.post('/api/outside-animals').send({ name: 'dusk', tattoo: 'fh9', sex: 'doe', colour: 'Chestnut' });
    expect(byTattoo2.status).toBe(200);
    expect(byTattoo2.body).toMatchObject({ matched: true, animal: { id: byTattoo1.body.animal.id, colour: 'Chestnut' } });
    const sexClash = await b.post('/api/outside-animals').send({ name: 'Dusk', tattoo: 'FH9', sex: 'buck' });
    expect(sexClash.status).toBe(400);

    // A duplicate: same ancestor, typed differently, no number, by farm B.
    const duplicate = await addAnimal(b, { birthDate: '2023-04-01', sireFromPapers: { name: 'Oberon of Ridgeback', breedId: breeds['Silver Fox']!.id } });
    expect(duplicate.sireId).not.toBe(first.sireId);
    const registry = await a.get('/api/outside-animals').query({ search: 'oberon' });
    expect(registry.body.animals).toHaveLength(2);

    expect((await a.post(`/api/outside-animals/${duplicate.sireId}/merge`).send({ intoId: first.sireId })).status).toBe(403);
    const admin = await signedInAgent(coop.admin.email, TEST_PASSWORD);
    const merged = await admin.post(`/api/outside-animals/${duplicate.sireId}/merge`).send({ intoId: first.sireId });
    expect(merged.status).toBe(200);
    expect(merged.body.id).toBe(first.sireId);
    const db = await asTenant(coop.id, async (c) => ({
      child: (await c.query('SELECT sire_id, version FROM animals WHERE id = $1', [duplicate.id])).rows[0],
      gone: (await c.query('SELECT deleted_at, merged_into_id FROM animals WHERE id = $1', [duplicate.sireId])).rows[0],
      audit: (await c.query(`SELECT action FROM audit_events WHERE coop_id = $1 AND action = 'outside_animal.merged'`, [coop.id])).rows,
    }));
    expect(db.child).toEqual({ sire_id: first.sireId, version: 1 });
    expect(db.gone.merged_into_id).toBe(first.sireId);
    expect(db.gone.deleted_at).not.toBeNull();
    expect(db.audit).toHaveLength(1);
    expect((await a.get('/api/outside-animals').query({ search: 'oberon' })).body.animals).toHaveLength(1);
    // Trial mating now sees the three kits as half sibs through one sire: 1/8 (Falconer & Mackay).
    const trial = await a.post('/api/trial-matings').send({ damId: first.id, sireIds: [(await addAnimal(b, { sex: 'buck', birthDate: '2023-04-01', sireId: first.sireId })).id] });
    expect(trial.body.litters[0].coi).toBe(0.125);
  });

  it('when an outside ancestor is entered with its own outside parents, then it counts in the pedigree like any other animal', async () => {
    const coop = await createTestCoop();
    const breeds = await catalogueBreeds(coop.id);
    const a = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const grandsire = await a.post('/api/outside-animals').send({ name: 'Old Tom', sex: 'buck', registrationNumber: 'CH-1', breedId: breeds["Champagne d'Argent"]!.id });
    const granddam = await a.post('/api/outside-animals').send({ name: 'Silva', sex: 'doe', registrationNumber: 'CH-2', breedId: breeds["Champagne d'Argent"]!.id });
    const sire = await a.post('/api/outside-animals').send({ name: 'Tom II', sex: 'buck', registrationNumber: 'CH-3', sireId: grandsire.body.animal.id, damId: granddam.body.animal.id });
    const dam = await a.post('/api/outside-animals').send({ name: 'Silva II', sex: 'doe', registrationNumber: 'CH-4', sireId: grandsire.body.animal.id, damId: granddam.body.animal.id });
    const kit = await addAnimalAs(coop.member, { sireId: sire.body.animal.id, damId: dam.body.animal.id, birthDate: '2024-01-01' });
    expect(kit.coi).toBe(0.25);
    expect(kit.breedMakeup).toMatchObject({ purity: 'purebred', breeds: [{ name: "Champagne d'Argent", fraction: 1 }] });
    expect(kit.completeness).toEqual([1, 1, 0, 0]);
  });

  it('when two farms change parents at the same moment, then the stored COIs equal a fresh computation over the committed pedigree', async () => {
    const coop = await createTestCoop();
    const a = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const b = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    const f = await family(coop, a, b);
    const kitsA = await Promise.all([1, 2, 3].map((i) => addAnimal(a, { sex: 'doe', birthDate: `2022-0${i}-10`, sireId: f.son.id })));
    const kitsB = await Promise.all([1, 2, 3].map((i) => addAnimal(b, { sex: 'buck', birthDate: `2022-0${i}-12`, damId: f.daughter.id })));
    // Each farm re-parents its kits at once; every write takes the co-op's pedigree lock, so none computes from a stale pedigree.
    const edits = await Promise.all([
      ...kitsA.map((k) => a.patch(`/api/animals/${k.id}`).send({ damId: f.daughter.id, version: k.version })),
      ...kitsB.map((k) => b.patch(`/api/animals/${k.id}`).send({ sireId: f.son.id, version: k.version })),
      b.patch(`/api/animals/${f.son.id}`).send({ damId: f.otherDam.id, version: f.son.version }),
    ]);
    expect(edits.map((r) => r.status)).toEqual([200, 200, 200, 200, 200, 200, 200]);
    const db = await asTenant(coop.id, async (c) => ({
      pedigree: (await c.query('SELECT id, sire_id, dam_id FROM animals WHERE coop_id = $1 AND deleted_at IS NULL', [coop.id])).rows,
      stored: (await c.query('SELECT animal_id, coi FROM animal_inbreeding WHERE coop_id = $1', [coop.id])).rows,
    }));
    const fresh = inbreedingCoefficients(db.pedigree.map((r) => ({ id: r.id, sireId: r.sire_id, damId: r.dam_id })));
    expect(db.stored).toHaveLength(fresh.size);
    for (const row of db.stored) expect(row.coi, row.animal_id).toBeCloseTo(fresh.get(row.animal_id)!, 12);
    // The son is now by the second doe, so son × daughter share only the founder buck: half sibs, F = 1/8 (Falconer & Mackay).
    for (const kit of kitsA) expect(fresh.get(kit.id)).toBe(0.125);
  });
});
