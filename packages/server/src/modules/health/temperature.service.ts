import { Op, type Transaction } from 'sequelize';
import {
  addDays, DEFAULT_CYCLE_SETTINGS, HEAT_CAUTION, KINDLING_SOON_DAYS, kitCount, RealtimeEvent, readingToCelsius, rooms, YOUNG_LITTER_DAYS, daysBetween, type HeatCautionDto, type TemperatureListDto, type TemperatureReadingCreateInput, type TemperatureReadingDto,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import { ensureCan, farmOf } from '../farms/farm-access';
import { farmClockOf } from '../farms/farm-clock';
import { presentAnimalRef } from '../animals/animal-facts.service';
import { serviceOutcomesOfFarm } from '../almanac/breeding.service';
import { presentContextOf } from '../almanac/tasks.service';
import { litterFactsOfFarm } from '../litters/litters.service';
import { namesOf } from '../users/users.service';
import { TemperatureReading } from './temperature-reading.model';
import { presentReading } from './health.presenter';

/** A reading "taken" a little ahead of the server clock is a phone's clock, not the future. */
const CLOCK_SKEW_MS = 5 * 60_000;
const HOUR_MS = 3_600_000;

/**
 * Logs a barn temperature reading in the farm's unit (°F or °C), stored in °C to one decimal.
 * Members and apprentices of the farm may log one. The farm's members hear of it live, with whether it
 * calls for the heat caution (85 °F / 29.4 °C or above).
 */
export async function recordTemperature(actor: SessionUser, input: TemperatureReadingCreateInput, now: Date = new Date()): Promise<TemperatureReadingDto> {
  return withTenant(actor, (tx) => recordTemperatureIn(tx, actor, input, now));
}

/** recordTemperature inside the caller's transaction (the demo loader). */
export async function recordTemperatureIn(tx: Transaction, actor: SessionUser, input: TemperatureReadingCreateInput, now: Date = new Date()): Promise<TemperatureReadingDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'TemperatureReading', { farmId }, 'That farm', 'You may not log temperatures here');
  const takenAt = input.takenAt ? new Date(input.takenAt) : now;
  if (takenAt.getTime() > now.getTime() + CLOCK_SKEW_MS) throw AppError.validation({ takenAt: ['That time is in the future'] });
  if (takenAt.getTime() < now.getTime() - 366 * 24 * HOUR_MS) throw AppError.validation({ takenAt: ['That reading is more than a year old'] });
  if (input.id) {
    const existing = await TemperatureReading.findOne({ where: { id: input.id }, transaction: tx });
    if (existing) {
      if (existing.farmId !== farmId) throw AppError.idTaken();
      return presentReading(existing, await namesOf([existing.recordedBy], tx));
    }
  }
  const celsius = readingToCelsius(input.value, input.unit);
  const row = await TemperatureReading.create(
    { ...(input.id ? { id: input.id } : {}), coopId: actor.coopId, farmId, takenAt, celsius, place: input.place, recordedBy: actor.id },
    { transaction: tx },
  );
  const dto = presentReading(row, await namesOf([actor.id], tx));
  tx.afterCommit(() => publish(rooms.farm(farmId), RealtimeEvent.temperatureRecorded, { farmId, readingId: row.id, celsius, hot: dto.hot }));
  return dto;
}

/** Whether the farm has logged any reading (the demo loader loads its readings once). */
export async function hasTemperatureReadings(tx: Transaction, farmId: string): Promise<boolean> {
  return (await TemperatureReading.count({ where: { farmId }, transaction: tx })) > 0;
}

/** The heat caution of a farm now: the latest reading of the last 24 hours, and who is most at risk when it is hot. */
async function heatCautionOf(tx: Transaction, coopId: string, farmId: string, today: string, now: Date): Promise<HeatCautionDto> {
  const latest = await TemperatureReading.findOne({
    where: { farmId, takenAt: { [Op.gte]: new Date(now.getTime() - HEAT_CAUTION.withinHours * HOUR_MS), [Op.lte]: new Date(now.getTime() + CLOCK_SKEW_MS) } },
    order: [['takenAt', 'DESC'], ['createdAt', 'DESC']],
    transaction: tx,
  });
  const names = await namesOf([latest?.recordedBy], tx);
  const reading = latest ? presentReading(latest, names) : null;
  const hot = Boolean(reading?.hot);
  const caution: HeatCautionDto = { hot, thresholdCelsius: HEAT_CAUTION.celsius, latest: reading, dueToKindle: [], youngLitters: [] };
  if (!hot) return caution;

  // Does in the last week of gestation (kindling expected on day 31, Merck), and litters under 3 weeks.
  const gestation = DEFAULT_CYCLE_SETTINGS.kindlingExpectedDays;
  const open = (await serviceOutcomesOfFarm(tx, coopId, farmId, today))
    .filter((s) => s.outcome === 'open')
    .map((s) => ({ doeId: s.doeId, dueOn: addDays(s.servicedOn, gestation) }))
    .filter((s) => s.dueOn <= addDays(today, KINDLING_SOON_DAYS))
    .sort((a, b) => a.dueOn.localeCompare(b.dueOn));
  const young = (await litterFactsOfFarm(tx, coopId, farmId))
    .filter((l) => l.kindledOn <= today && daysBetween(l.kindledOn, today) < YOUNG_LITTER_DAYS)
    .map((l) => ({ litter: l, alive: safeKitCount(l.record, today) }))
    .filter((l) => l.alive === null || l.alive > 0);
  const ctx = await presentContextOf(tx, coopId, today, { animalIds: [...open.map((s) => s.doeId), ...young.map((l) => l.litter.damId)] });
  caution.dueToKindle = open.map((s) => ({ doe: presentAnimalRef(s.doeId, ctx), dueOn: s.dueOn }));
  caution.youngLitters = young.map(({ litter, alive }) => ({
    litterId: litter.id, dam: presentAnimalRef(litter.damId, ctx), kindledOn: litter.kindledOn, ageDays: daysBetween(litter.kindledOn, today), alive,
  }));
  return caution;
}

function safeKitCount(record: Parameters<typeof kitCount>[0], today: string): number | null {
  try {
    return kitCount(record, today);
  } catch {
    return null;
  }
}

/** Commons: the farm's heat caution (hot or not, with who is at risk). */
export async function heatCaution(actor: SessionUser, now: Date = new Date()): Promise<HeatCautionDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'TemperatureReading', { farmId }, 'That farm');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId, now);
    return heatCautionOf(tx, actor.coopId, farmId, clock.today, now);
  });
}

/** The farm's readings of the last `days` days, latest first, with the heat caution. */
export async function listTemperatures(actor: SessionUser, days: number, now: Date = new Date()): Promise<TemperatureListDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'TemperatureReading', { farmId }, 'That farm');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId, now);
    const rows = await TemperatureReading.findAll({
      where: { farmId, takenAt: { [Op.gte]: new Date(now.getTime() - days * 24 * HOUR_MS) } },
      order: [['takenAt', 'DESC'], ['createdAt', 'DESC']],
      limit: 500,
      transaction: tx,
    });
    const names = await namesOf(rows.map((r) => r.recordedBy), tx);
    return { readings: rows.map((r) => presentReading(r, names)), heat: await heatCautionOf(tx, actor.coopId, farmId, clock.today, now) };
  });
}
