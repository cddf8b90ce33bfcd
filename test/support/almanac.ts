import {
  addDays, fosteringCreateSchema, kindlingCreateSchema, palpationCreateSchema, serviceCreateSchema, todayIn,
  type FosteringCreateInput, type KindlingCreateBody, type LitterDto, type ServiceCreateBody, type ServiceDto,
} from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { recordPalpation, recordService } from '../../packages/server/src/modules/almanac/breeding.service';
import { recordFostering, recordKindling } from '../../packages/server/src/modules/litters/litters.service';
import { asTenant } from './db';
import type { TestPerson } from './factories';
import { actorOf, addAnimalAs } from './herd';

/** The test farms keep Chicago's clock (test/support/factories.ts): "today" is that farm day. */
export const FARM_TIME_ZONE = 'America/Chicago';
export const farmToday = () => todayIn(FARM_TIME_ZONE);
export const daysAgo = (n: number) => addDays(farmToday(), -n);

/** A grown doe and buck of the person's farm (born 2023, so no age warning). */
export async function breedingPair(person: TestPerson, names: { doe?: string; buck?: string } = {}) {
  const doe = await addAnimalAs(person, { sex: 'doe', name: names.doe ?? 'Test doe', birthDate: '2023-01-10' });
  const buck = await addAnimalAs(person, { sex: 'buck', name: names.buck ?? 'Test buck', birthDate: '2022-11-02' });
  return { doe, buck };
}

/** A service recorded through the service layer (arranging state without HTTP). */
export async function serviceAs(person: TestPerson, body: ServiceCreateBody): Promise<ServiceDto> {
  connectDatabase(process.env.DATABASE_URL!);
  return recordService(actorOf(person), serviceCreateSchema.parse({ confirm: true, ...body }));
}

export async function palpationAs(person: TestPerson, serviceId: string, palpatedOn: string, result: 'positive' | 'negative'): Promise<ServiceDto> {
  return recordPalpation(actorOf(person), serviceId, palpationCreateSchema.parse({ palpatedOn, result, confirm: true }));
}

export async function kindlingAs(person: TestPerson, body: KindlingCreateBody): Promise<LitterDto> {
  connectDatabase(process.env.DATABASE_URL!);
  return recordKindling(actorOf(person), kindlingCreateSchema.parse({ confirm: true, ...body }));
}

export async function fosteringAs(person: TestPerson, litterId: string, body: FosteringCreateInput): Promise<LitterDto> {
  return recordFostering(actorOf(person), litterId, fosteringCreateSchema.parse(body));
}

/** A doe of the person's farm serviced `daysAgo` days ago and kindled `kindledDaysAgo` days ago, with `bornAlive` kits. */
export async function litterAs(person: TestPerson, opts: { servicedDaysAgo: number; kindledDaysAgo: number; bornAlive: number; bornDead?: number; doe?: string }) {
  const pair = await breedingPair(person, { doe: opts.doe });
  const service = await serviceAs(person, { doeId: pair.doe.id, buckId: pair.buck.id, servicedOn: daysAgo(opts.servicedDaysAgo) });
  const litter = await kindlingAs(person, { serviceId: service.id, kindledOn: daysAgo(opts.kindledDaysAgo), bornAlive: opts.bornAlive, bornDead: opts.bornDead ?? 0 });
  return { ...pair, service, litter };
}

/** Every Almanac and litter table's rows of a co-op, for "nothing was written" checks. */
export async function almanacCounts(coopId: string) {
  return asTenant(coopId, async (c) => {
    const count = async (table: string) => (await c.query(`SELECT count(*)::int AS n FROM ${table} WHERE coop_id = $1`, [coopId])).rows[0].n as number;
    return {
      services: await count('services'),
      palpations: await count('palpations'),
      tasks: await count('almanac_tasks'),
      taskStates: (await c.query(`SELECT string_agg(state || ':' || due_on || ':' || version, ',' ORDER BY id) AS s FROM almanac_tasks WHERE coop_id = $1`, [coopId])).rows[0].s as string | null,
      litters: await count('litters'),
      litterEvents: await count('litter_events'),
      treatments: await count('treatments'),
      settings: await count('farm_cycle_settings'),
      housing: await count('housing_units'),
      placements: await count('housing_placements'),
    };
  });
}

/** The stored tasks of a service or litter, as rows. */
export async function taskRows(coopId: string, where: { serviceId?: string; litterId?: string; animalId?: string }) {
  const [column, value] = where.serviceId ? ['service_id', where.serviceId] : where.litterId ? ['litter_id', where.litterId] : ['animal_id', where.animalId];
  return asTenant(coopId, async (c) =>
    (await c.query(
      `SELECT id, kind, key, due_on::text AS due_on, window_start::text AS window_start, window_end::text AS window_end, state, state_reason,
              done_on::text AS done_on, completion_review, version
       FROM almanac_tasks WHERE ${column} = $1 ORDER BY due_on, kind`,
      [value],
    )).rows as { id: string; kind: string; key: string; due_on: string; window_start: string | null; window_end: string | null; state: string; state_reason: string | null; done_on: string | null; completion_review: string; version: number }[],
  );
}
