/**
 * The demo health and yield records of Larkspur Hollow (all invented): for every farm, barn temperature
 * readings twice a day over the past four weeks (a December barn: cold), and on the apprentice's farm a
 * hot reading in the kindling shed under the heat lamps within the last two hours, so Commons shows the
 * heat caution; a doe and a growing group under a veterinarian's withdrawal now, and a few past
 * treatments; and the past processing batches of each farm's most recent closed grow-out groups, on the
 * day each group was closed, with dress-out between 55 and 60 % (Kuzelov & Atanasova 2011: 55–56 %
 * head-on; Nofal, Toth & Virag: ≈ 60 %). Everything goes through the services' checks; a seeded
 * generator keeps every load the same. Loaded once (a farm's first reading marks it loaded).
 */
import type { Transaction } from 'sequelize';
import { addDays, processingRecordCreateSchema, temperatureReadingCreateSchema, todayIn, treatmentCreateSchema, type TreatmentCreateBody } from '@burrowline/shared';
import type { SessionUser } from '../packages/server/src/lib/session-user';
import { recordTreatmentIn } from '../packages/server/src/modules/almanac/treatments.service';
import { farmBreedingStockOf } from '../packages/server/src/modules/animals/animal-facts.service';
import { growOutFactsOfFarm } from '../packages/server/src/modules/grow-out/grow-out-facts.service';
import { hasTemperatureReadings, recordTemperatureIn } from '../packages/server/src/modules/health/temperature.service';
import { recordProcessingIn } from '../packages/server/src/modules/processing/processing.service';
import { seededRandom } from '../packages/shared/src/pedigree/seeded-random';

export interface DemoHealthYieldContext {
  coopId: string;
  farms: Map<string, string>;
  keepers: Map<string, string>;
  apprenticeId: string | null;
  apprenticeFarmKey?: string;
  /** Each farm's temperature unit, by farm key (readings are typed in it). */
  temperatureUnits: Map<string, 'F' | 'C'>;
}

const actorFor = (coopId: string, farmId: string, userId: string, role: 'member' | 'apprentice' = 'member'): SessionUser => ({
  id: userId, coopId, farmId, mentorId: null, email: 'demo@larkspur-hollow.example', name: 'Demo', role,
});

const HOUR_MS = 3_600_000;
const VETS = ['Dr. Imre Calloway, Tamsin Valley Veterinary', 'Dr. Solenne Achterberg, Fennick Ridge Animal Clinic'];

export async function loadDemoHealthYield(
  ctx: DemoHealthYieldContext, tx: Transaction, now: Date = new Date(),
): Promise<{ readings: number; treatments: number; batches: number } | null> {
  const firstFarm = [...ctx.farms.values()][0];
  if (!firstFarm || (await hasTemperatureReadings(tx, firstFarm))) return null;
  const random = seededRandom(20_261_207);
  const between = (min: number, max: number) => min + random() * (max - min);
  const today = todayIn('America/Chicago', now);
  let readings = 0;
  let treatments = 0;
  let batches = 0;

  for (const [farmKey, farmId] of ctx.farms) {
    const keeper = actorFor(ctx.coopId, farmId, ctx.keepers.get(farmKey)!);
    const unit = ctx.temperatureUnits.get(farmKey) ?? 'F';
    const inUnit = (celsius: number) => (unit === 'F' ? Math.round(celsius * 1.8 + 32) : Math.round(celsius * 10) / 10);

    // A December barn, morning and afternoon, over the past four weeks (invented).
    for (let day = 28; day >= 1; day--) {
      for (const [hoursAgo, base] of [[day * 24 + 9, 3], [day * 24 + 1, 9]] as const) {
        await recordTemperatureIn(tx, keeper, temperatureReadingCreateSchema.parse({
          value: inUnit(base + between(-3, 4)), unit, place: 'barn', takenAt: new Date(now.getTime() - hoursAgo * HOUR_MS).toISOString(),
        }), now);
        readings++;
      }
    }
    const onApprenticeFarm = farmKey === ctx.apprenticeFarmKey;
    if (onApprenticeFarm) {
      // The kindling shed under the heat lamps, read this afternoon: hot enough for the caution.
      await recordTemperatureIn(tx, keeper, temperatureReadingCreateSchema.parse({
        value: inUnit(31.1), unit, place: 'kindling shed, heat lamps on', takenAt: new Date(now.getTime() - 1.5 * HOUR_MS).toISOString(),
      }), now);
      readings++;
    }

    // Treatments, on the apprentice's farm and the first farm: one doe and one growing group under withdrawal, a few past ones.
    if (onApprenticeFarm || farmId === firstFarm) {
      const stock = await farmBreedingStockOf(tx, ctx.coopId, farmId);
      // Grown stock, born long before the oldest treatment below.
      const grown = stock.filter((a) => a.birthDate !== null && a.birthDate <= addDays(today, -200));
      const does = grown.filter((a) => a.sex === 'doe');
      const bucks = grown.filter((a) => a.sex === 'buck');
      const groups = await growOutFactsOfFarm(tx, ctx.coopId, farmId, { withFeed: false });
      const growing = groups.find((g) => g.status === 'growing');
      const plan: TreatmentCreateBody[] = [];
      if (does[0]) {
        plan.push({
          animalId: does[0].id, treatment: 'Ivermectin for ear mites', dose: '0.2 ml under the skin, repeated after 10 days', route: 'injection',
          veterinarian: VETS[0]!, startedOn: addDays(today, -12), lastDoseOn: addDays(today, -2), withdrawalDays: 28, notes: 'Crusting in both ears; recheck at the second dose.',
        });
      }
      if (growing && onApprenticeFarm) {
        plan.push({
          groupId: growing.id, treatment: 'Toltrazuril for coccidiosis', dose: '1 ml per litre of drinking water', route: 'in_water',
          veterinarian: VETS[0]!, startedOn: addDays(today, -3), lastDoseOn: addDays(today, -2), withdrawalEndsOn: addDays(today, 12), notes: 'Loose droppings in two kits; whole pen treated.',
        });
      }
      if (does[1]) {
        plan.push({
          animalId: does[1].id, treatment: 'Chlorhexidine wash for a hock sore', dose: 'Twice daily', route: 'topical',
          veterinarian: VETS[1]!, startedOn: addDays(today, -96), lastDoseOn: addDays(today, -89), withdrawalDays: 0, notes: 'Resting mat added to the hutch.',
        });
      }
      if (bucks[0]) {
        plan.push({
          animalId: bucks[0].id, treatment: 'Penicillin G for a jaw abscess', dose: '0.5 ml per kg once daily', route: 'injection',
          veterinarian: VETS[1]!, startedOn: addDays(today, -150), lastDoseOn: addDays(today, -143), withdrawalDays: 30, notes: 'Lanced and drained by the vet.',
        });
      }
      for (const body of plan) {
        await recordTreatmentIn(tx, keeper, treatmentCreateSchema.parse(body));
        treatments++;
      }
    }

    // Processing: each farm's two most recent closed groups, every head left, on the day the group closed.
    const closed = (await growOutFactsOfFarm(tx, ctx.coopId, farmId, { withFeed: false }))
      .filter((g) => g.status === 'closed' && g.closedOn && g.weighIns.length > 0)
      .sort((a, b) => b.closedOn!.localeCompare(a.closedOn!))
      .slice(0, 2);
    for (const group of closed) {
      const last = group.weighIns.at(-1)!;
      const days = Math.max(0, (Date.parse(group.closedOn!) - Date.parse(last.weighedOn)) / 86_400_000);
      const liveGrams = Math.round(last.totalGrams * (1 + days * 0.012));
      const hotCarcassGrams = Math.round(liveGrams * between(0.55, 0.6));
      const chilledCarcassGrams = Math.round(hotCarcassGrams * between(0.975, 0.99));
      await recordProcessingIn(tx, keeper, processingRecordCreateSchema.parse({
        groupId: group.id, processedOn: group.closedOn, headCount: last.headCount, liveGrams, hotCarcassGrams, chilledCarcassGrams,
        notes: 'Fasted overnight; processed at the farm station, chilled in ice water.',
      }));
      batches++;
    }
  }
  return { readings, treatments, batches };
}
