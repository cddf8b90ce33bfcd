import {
  defineAbilityFor, lastTwelveMonths, performanceTables, subjectOf,
  type PerformanceAnimal, type PerformanceDto, type PerformancePeriod, type PerformanceQuery, type PerformanceTables,
} from '@burrowline/shared';
import type { Transaction } from 'sequelize';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { ensureCan, farmOf } from '../farms/farm-access';
import { farmClockOf } from '../farms/farm-clock';
import { settingsOf } from '../almanac/cycle-settings.service';
import { animalFactsOf } from '../animals/animal-facts.service';
import { keptOrWorkedOut, performanceVersionOf } from './performance-cache';
import { performanceSourcesOf } from './performance-sources';
import { presentPerformance } from './performance.presenter';

/**
 * The farm's performance tables over the chosen period (default the last 12 months to the farm's
 * today): per doe, per buck, per breed and cross, per grow-out group, and keep and cull suggestions with
 * their reasons. Read-only: nothing here changes an animal. The farm's records come in one statement
 * (`performance-sources.ts`), the animals they name in one more, and the figures are computed in memory
 * with the shared yield functions. Another farm's or co-op's tables do not exist for the actor (404).
 */
export async function farmPerformance(actor: SessionUser, q: PerformanceQuery): Promise<PerformanceDto> {
  const ownFarmId = farmOf(actor);
  const farmId = q.farmId ?? ownFarmId;
  ensureCan(actor, 'read', 'Performance', { farmId }, 'That farm');
  const showsMoney = defineAbilityFor(actor).can('read', subjectOf('Money', { coopId: actor.coopId, farmId }));
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const period = q.period === 'all' ? null : q.period === 'custom' ? { from: q.from!, to: q.to! } : lastTwelveMonths(clock.today);
    // Worked out again only when a record the tables rest on changed since they were kept (or the day turned).
    const version = await performanceVersionOf(tx, actor.coopId);
    const key = `${farmId}|${period?.from ?? ''}|${period?.to ?? ''}|${clock.today}`;
    const tables = await keptOrWorkedOut(key, version, () => tablesOf(tx, actor.coopId, farmId, clock.today, period));
    return presentPerformance(tables, { farmId, today: clock.today, periodChoice: q.period, showsMoney });
  });
}

/** The tables worked out from the farm's records: its settings, its records in one statement, the animals they name. */
async function tablesOf(tx: Transaction, coopId: string, farmId: string, today: string, period: PerformancePeriod | null): Promise<PerformanceTables> {
  const { settings } = await settingsOf(tx, farmId);
  const { services, litters, groups, doeLitterFeed, processing } = await performanceSourcesOf(tx, coopId, farmId, { today, settings, period });
  const processedIds = processing.filter((r) => r.animalId && !r.groupId).map((r) => r.animalId!);
  const ids = new Set<string>(processedIds);
  for (const s of services) ids.add(s.doeId).add(s.buckId);
  for (const l of litters) ids.add(l.damId).add(l.sireId);
  const facts = await animalFactsOf(tx, coopId, [...ids]);
  const animals: PerformanceAnimal[] = [...facts.values()].map((a) => ({
    id: a.id, name: a.name, tattoo: a.tattoo, sex: a.sex, breedName: a.lineBreedName,
    onFarm: a.keepingFarmId === farmId && a.disposition === 'on_farm',
  }));
  return performanceTables({
    today,
    period,
    animals,
    services,
    litters,
    groups,
    doeLitterFeed,
    processing,
    processedAnimals: new Map(processedIds.map((id) => [id, { sireId: facts.get(id)?.sireId ?? null, damId: facts.get(id)?.damId ?? null, birthDate: facts.get(id)?.birthDate ?? null }])),
  });
}
