import {
  processingMarkCreateSchema, processingRecordCreateSchema, temperatureReadingCreateSchema, treatmentCreateSchema,
  type ProcessingMarkCreateBody, type ProcessingRecordCreateBody, type TemperatureReadingCreateBody, type TreatmentCreateBody,
} from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { recordTreatment } from '../../packages/server/src/modules/almanac/treatments.service';
import { recordTemperature } from '../../packages/server/src/modules/health/temperature.service';
import { markForProcessing, recordProcessing } from '../../packages/server/src/modules/processing/processing.service';
import { daysAgo } from './almanac';
import { asTenant } from './db';
import type { TestPerson } from './factories';
import { groupAs, grownLitterAs } from './grow-out';
import { actorOf } from './herd';

/** A treatment as the veterinarian prescribed it, with defaults for what a test does not care about. */
export function treatmentBody(overrides: Partial<TreatmentCreateBody>): TreatmentCreateBody {
  return {
    treatment: 'Coccidiosis course', dose: '1 ml per litre of water', route: 'in_water', veterinarian: 'Dr. Wren Hollis',
    startedOn: daysAgo(5), lastDoseOn: daysAgo(1), withdrawalDays: 10, ...overrides,
  };
}

export async function treatmentAs(person: TestPerson, overrides: Partial<TreatmentCreateBody>) {
  connectDatabase(process.env.DATABASE_URL!);
  return recordTreatment(actorOf(person), treatmentCreateSchema.parse(treatmentBody(overrides)));
}

export async function temperatureAs(person: TestPerson, body: TemperatureReadingCreateBody) {
  connectDatabase(process.env.DATABASE_URL!);
  return recordTemperature(actorOf(person), temperatureReadingCreateSchema.parse(body));
}

export async function processingAs(person: TestPerson, body: ProcessingRecordCreateBody) {
  connectDatabase(process.env.DATABASE_URL!);
  return recordProcessing(actorOf(person), processingRecordCreateSchema.parse(body));
}

export async function markAs(person: TestPerson, body: ProcessingMarkCreateBody) {
  connectDatabase(process.env.DATABASE_URL!);
  return markForProcessing(actorOf(person), processingMarkCreateSchema.parse(body));
}

/** A growing group of the person's farm: `heads` kits of a litter kindled `kindledDaysAgo` days ago, formed at 30 days. */
export async function growingGroupAs(person: TestPerson, opts: { kindledDaysAgo: number; heads: number; name?: string }) {
  const { litter } = await grownLitterAs(person, opts.kindledDaysAgo, opts.heads);
  const group = await groupAs(person, {
    name: opts.name ?? `Pen ${opts.kindledDaysAgo}`, formedOn: daysAgo(opts.kindledDaysAgo - 30), targetGrams: 2270,
    litters: [{ litterId: litter.id, heads: opts.heads }],
  });
  return { group, litter };
}

/** Rows of the health and yield tables of a co-op (and the animals' dispositions), for "nothing was written" checks. */
export async function healthYieldCounts(coopId: string) {
  return asTenant(coopId, async (c) => {
    const count = async (table: string) => (await c.query(`SELECT count(*)::int AS n FROM ${table} WHERE coop_id = $1`, [coopId])).rows[0].n as number;
    return {
      treatments: await count('treatments'),
      readings: await count('temperature_readings'),
      records: await count('processing_records'),
      marks: (await c.query(`SELECT string_agg(status || ':' || version, ',' ORDER BY id) AS s FROM processing_marks WHERE coop_id = $1`, [coopId])).rows[0].s as string | null,
      dispositions: (await c.query(`SELECT string_agg(disposition, ',' ORDER BY id) AS s FROM animals WHERE coop_id = $1`, [coopId])).rows[0].s as string | null,
      statusEvents: await count('animal_status_events'),
    };
  });
}
