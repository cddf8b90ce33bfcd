import { Op, type Transaction } from 'sequelize';
import { kitCount } from '@burrowline/shared';
import { HousingPlacement } from './housing-placement.model';
import { HousingUnit } from './housing-unit.model';
import { LitterEvent } from './litter-event.model';
import { Litter } from './litter.model';
import { recordOf, summaryOf } from './litters.presenter';
import { groupBy } from '../../lib/group-by';

/**
 * What grow-out and feed need to know of litters and housing, without the Almanac: a litter's parents,
 * kindling date and derived kit counts (the same rules the litter screen uses). Kept apart from
 * litters.service so grow-out and feed do not pull in the Almanac's modules.
 */
export interface LitterFacts {
  id: string;
  coopId: string;
  farmId: string;
  damId: string;
  sireId: string;
  kindledOn: string;
  bornAlive: number;
  /** Kits raised and still alive: with the doe or weaned. */
  alive: number;
  weaned: number;
  onDoe: number;
  weanedOn: string | null;
  /** Kits with the doe on a date (0 before the kindling and once all are weaned). */
  onDoeAt: (date: string) => number;
}

async function factsOf(tx: Transaction, litters: Litter[]): Promise<LitterFacts[]> {
  if (litters.length === 0) return [];
  // Plain rows: read-only facts over a farm's years of litters.
  const events = await LitterEvent.findAll({ where: { litterId: { [Op.in]: litters.map((l) => l.id) } }, order: [['occurredOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx, raw: true });
  const byLitter = groupBy(events, (e) => e.litterId);
  return litters.map((l) => {
    const record = recordOf(l, byLitter.get(l.id) ?? []);
    const summary = summaryOf(record);
    return {
      id: l.id, coopId: l.coopId, farmId: l.farmId, damId: l.damId, sireId: l.sireId, kindledOn: l.kindledOn, bornAlive: l.bornAlive,
      alive: summary.onDoe + summary.weaned, weaned: summary.weaned, onDoe: summary.onDoe, weanedOn: summary.weanedOn,
      onDoeAt: (date: string) => {
        try {
          return kitCount(record, date);
        } catch {
          return 0;
        }
      },
    };
  });
}

/** Facts of litters by id (another co-op's are simply absent). */
export async function litterFactsOf(tx: Transaction, coopId: string, litterIds: string[]): Promise<Map<string, LitterFacts>> {
  if (litterIds.length === 0) return new Map();
  const litters = await Litter.findAll({ where: { coopId, id: { [Op.in]: [...new Set(litterIds)] } }, transaction: tx, raw: true });
  return new Map((await factsOf(tx, litters)).map((f) => [f.id, f]));
}

/**
 * Parents and kindling date of litters by id, nothing derived (another co-op's are simply absent): for
 * reads over years of litters that need no kit counts, such as a farm's grow-out groups.
 */
export async function litterParentsOf(
  tx: Transaction, coopId: string, litterIds: string[],
): Promise<Map<string, { damId: string; sireId: string; kindledOn: string }>> {
  if (litterIds.length === 0) return new Map();
  const litters = await Litter.findAll({
    where: { coopId, id: { [Op.in]: [...new Set(litterIds)] } }, attributes: ['id', 'damId', 'sireId', 'kindledOn'], transaction: tx, raw: true,
  });
  return new Map(litters.map((l) => [l.id, { damId: l.damId, sireId: l.sireId, kindledOn: l.kindledOn }]));
}

/** Every litter of a farm, latest first. */
export async function farmLitterFactsOf(tx: Transaction, coopId: string, farmId: string): Promise<LitterFacts[]> {
  const litters = await Litter.findAll({ where: { coopId, farmId }, order: [['kindledOn', 'DESC']], transaction: tx, raw: true });
  return factsOf(tx, litters);
}

/** A farm's hutch or pen by id, or null (another farm's or co-op's). */
export async function housingUnitOfFarm(tx: Transaction, coopId: string, farmId: string, unitId: string): Promise<{ id: string; name: string } | null> {
  const unit = await HousingUnit.findOne({ where: { id: unitId, coopId, farmId }, transaction: tx });
  return unit ? { id: unit.id, name: unit.name } : null;
}

export async function housingUnitNamesOf(tx: Transaction, coopId: string, unitIds: string[]): Promise<Map<string, string>> {
  if (unitIds.length === 0) return new Map();
  const units = await HousingUnit.findAll({ where: { coopId, id: { [Op.in]: [...new Set(unitIds)] } }, paranoid: false, transaction: tx });
  return new Map(units.map((u) => [u.id, u.name]));
}

/** Who was placed in a unit (or anywhere on the farm) at some time in a period: litters and animals, with the dates. */
export async function placementsDuring(
  tx: Transaction, coopId: string, farmId: string, from: string, to: string, unitId?: string,
): Promise<{ unitId: string; litterId: string | null; animalId: string | null; placedOn: string; endedOn: string | null }[]> {
  const rows = await HousingPlacement.findAll({
    where: {
      coopId, farmId, ...(unitId ? { unitId } : {}),
      placedOn: { [Op.lte]: to },
      [Op.or]: [{ endedOn: { [Op.is]: null } }, { endedOn: { [Op.gte]: from } }],
    },
    transaction: tx,
  });
  return rows.map((p) => ({ unitId: p.unitId, litterId: p.litterId, animalId: p.animalId, placedOn: p.placedOn, endedOn: p.endedOn }));
}

/**
 * The days each dam kindled on the farm's record (its own litters only: another farm's litters are
 * private to it), for checking a kit's birth date. All the farm's dams when `damIds` is left out.
 */
export async function kindlingDaysOfDams(tx: Transaction, coopId: string, farmId: string, damIds?: string[]): Promise<Map<string, string[]>> {
  if (damIds && damIds.length === 0) return new Map();
  const where = { coopId, farmId, ...(damIds ? { damId: { [Op.in]: [...new Set(damIds)] } } : {}) };
  const litters = await Litter.findAll({ where, attributes: ['damId', 'kindledOn'], order: [['kindledOn', 'ASC']], transaction: tx, raw: true });
  const days = new Map<string, string[]>();
  for (const l of litters) days.set(l.damId, [...(days.get(l.damId) ?? []), l.kindledOn]);
  return days;
}
