import { randomUUID } from 'node:crypto';
import { animalCreateSchema, type AnimalCreateBody, type AnimalDetailDto, type BreedDto } from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { withTenant } from '../../packages/server/src/db/tenant';
import type { SessionUser } from '../../packages/server/src/lib/session-user';
import { createAnimal } from '../../packages/server/src/modules/animals/animal-edits.service';
import { breedsOf } from '../../packages/server/src/modules/breeds/breeds.service';
import type { TestPerson } from './factories';
import type { Agent } from './test-app';

/** The catalogue, by name (the migration's reference data; the same in every co-op). */
export async function catalogueBreeds(coopId: string): Promise<Record<string, BreedDto>> {
  connectDatabase(process.env.DATABASE_URL!);
  const breeds = await withTenant({ coopId }, (tx) => breedsOf(coopId, tx));
  return Object.fromEntries(breeds.map((b) => [b.name, b]));
}

export function actorOf(person: TestPerson): SessionUser {
  return { id: person.id, coopId: person.coopId, farmId: person.farmId, mentorId: null, email: person.email, name: person.name, role: person.role };
}

let tattooCounter = 0;
/** A tattoo unique within a test run. */
export function nextTattoo(prefix = 'T'): string {
  tattooCounter += 1;
  return `${prefix}${tattooCounter}-${randomUUID().slice(0, 4)}`;
}

/** What a test gives for a new animal (the request body's shape; defaults fill the rest). */
type AnimalFields = Partial<AnimalCreateBody>;

function createBody(fields: AnimalFields): Record<string, unknown> {
  return { tattoo: nextTattoo(), sex: 'doe', birthDate: '2023-01-10', confirm: true, ...fields };
}

/** Adds an animal through the API as the signed-in person; fails the test loudly if refused. */
export async function addAnimal(agent: Agent, fields: AnimalFields = {}): Promise<AnimalDetailDto> {
  const res = await agent.post('/api/animals').send(createBody(fields));
  if (res.status !== 201) throw new Error(`adding an animal failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as AnimalDetailDto;
}

/** Adds an animal through the service as `person` (arranging state without HTTP). */
export async function addAnimalAs(person: TestPerson, fields: AnimalFields = {}): Promise<AnimalDetailDto> {
  connectDatabase(process.env.DATABASE_URL!);
  return createAnimal(actorOf(person), animalCreateSchema.parse(createBody(fields)));
}
