import { randomUUID } from 'node:crypto';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { registerOutsideAnimal } from '../../packages/server/src/modules/animals/outside-animals.service';
import { createAnimalNote, createWeighIn } from '../../packages/server/src/modules/animals/weigh-ins.service';
import { asTenant } from './db';
import type { TestCoop } from './factories';
import { actorOf, addAnimalAs, nextTattoo } from './herd';

/** Herd objects for the authorization matrix, made fresh for every cell. */
export interface HerdIds {
  animalId?: string;
  weighInId?: string;
  noteId?: string;
  /** For a trial mating: a buck of farm B. */
  buckId?: string;
  /** For a merge: the record that stands. */
  intoId?: string;
}

export async function herdTarget(coop: TestCoop, target: string): Promise<HerdIds> {
  connectDatabase(process.env.DATABASE_URL!);
  switch (target) {
    case 'animalA':
      return {
        animalId: (await addAnimalAs(coop.member, { name: 'Matrix doe A' })).id,
        buckId: (await addAnimalAs(coop.otherFarmMember, { sex: 'buck', name: 'Matrix buck B' })).id,
      };
    case 'animalB':
      return { animalId: (await addAnimalAs(coop.otherFarmMember, { name: 'Matrix doe B' })).id };
    case 'weighInA': {
      const animal = await addAnimalAs(coop.member);
      const weighIn = await createWeighIn(actorOf(coop.apprentice), { animalId: animal.id, totalGrams: 3100, headCount: 1, weighedOn: '2024-02-01', note: '' });
      return { animalId: animal.id, weighInId: weighIn.id };
    }
    case 'noteA': {
      const animal = await addAnimalAs(coop.member);
      const note = await createAnimalNote(actorOf(coop.apprentice), animal.id, { body: 'Matrix note', notedOn: '2024-02-01' });
      return { animalId: animal.id, noteId: note.id };
    }
    case 'outsideDuplicate': {
      const tag = randomUUID().slice(0, 6);
      const paper = { tattoo: null, registrationNumber: null, breedId: null, colour: '', birthDate: null, breederName: '', sireId: null, damId: null } as const;
      const into = await registerOutsideAnimal(actorOf(coop.member), { ...paper, name: `Matrix sire ${tag}`, sex: 'buck' });
      const duplicate = await registerOutsideAnimal(actorOf(coop.otherFarmMember), { ...paper, name: `Matrix sire ${tag} (again)`, sex: 'buck' });
      return { animalId: duplicate.animal.id, intoId: into.animal.id };
    }
    default:
      return {};
  }
}

/** Request bodies of the Herd's rows; undefined for bodies that are not the Herd's. */
export async function herdBody(coop: TestCoop, body: string | undefined, ids: HerdIds & { farmId: string }): Promise<object | undefined> {
  const version = async () =>
    ids.animalId ? (await asTenant(coop.id, (c) => c.query('SELECT version FROM animals WHERE id = $1', [ids.animalId]))).rows[0]?.version ?? 0 : 0;
  switch (body) {
    case 'animal':
      return { tattoo: nextTattoo('M'), sex: 'doe', birthDate: '2023-05-01' };
    case 'animalEdit':
      return { name: `Renamed ${Date.now()}`, version: await version() };
    case 'statusEvent':
      return { kind: 'lifecycle', value: 'retired', effectiveOn: '2024-06-01' };
    case 'custodyMove':
      return { kind: 'lent', toFarmId: coop.farms[1]!.id, movedOn: '2024-06-01' };
    case 'weighIn':
      return { animalId: ids.animalId, totalGrams: 4200, weighedOn: '2024-06-01' };
    case 'note':
      return { body: 'Checked by the authorization matrix', notedOn: '2024-06-01' };
    case 'review':
      return { decision: 'accepted', version: 0 };
    case 'trialMating':
      return { damId: ids.animalId, sireIds: [ids.buckId] };
    case 'outsideAnimal':
      return { name: 'Matrix ancestor', sex: 'doe', registrationNumber: `MX-${randomUUID().slice(0, 8)}` };
    case 'merge':
      return { intoId: ids.intoId };
    case 'breed':
      return { name: `Matrix breed ${randomUUID().slice(0, 6)}`, sizeClass: 'medium', source: 'Authorization matrix' };
    default:
      return undefined;
  }
}

/** What a refused Herd call must leave as it was: every herd table's rows of the co-op, and the target's version. */
export async function herdStateOf(coopId: string, ids: HerdIds) {
  return asTenant(coopId, async (c) => {
    const count = async (table: string) => (await c.query(`SELECT count(*)::int AS n FROM ${table} WHERE coop_id = $1`, [coopId])).rows[0].n as number;
    return {
      animals: await count('animals'),
      statusEvents: await count('animal_status_events'),
      custody: await count('animal_custody_events'),
      weighIns: (await c.query('SELECT count(*)::int AS n, count(*) FILTER (WHERE review_state = \'pending\')::int AS pending FROM weigh_ins WHERE coop_id = $1', [coopId])).rows[0],
      notes: (await c.query('SELECT count(*)::int AS n, count(*) FILTER (WHERE review_state = \'pending\')::int AS pending FROM animal_notes WHERE coop_id = $1', [coopId])).rows[0],
      breeds: (await c.query('SELECT count(*)::int AS n FROM breeds WHERE coop_id = $1', [coopId])).rows[0].n,
      target: ids.animalId ? (await c.query('SELECT version, deleted_at FROM animals WHERE id = $1', [ids.animalId])).rows[0] ?? null : null,
    };
  });
}
