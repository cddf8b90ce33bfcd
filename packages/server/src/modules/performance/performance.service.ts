import {
  defineAbilityFor, lastTwelveMonths, performanceTables, subjectOf, type PerformanceAnimal, type PerformanceDto, type PerformanceQuery,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { ensureCan, farmOf } from '../farms/farm-access';
import { farmClockOf } from '../farms/farm-clock';
import { serviceOutcomesOfFarm } from '../almanac/breeding.service';
import { animalFactsOf } from '../animals/animal-facts.service';
import { litterFactsOfFarm } from '../litters/litters.service';
import { performanceSourcesOf } from './performance-sources';
import { presentPerformance } from './performance.presenter';

/**
 * The farm's performance tables over the chosen period (default the last 12 months to the farm's
 * today): per doe, per buck, per breed and cross, per grow-out group, and keep and cull suggestions with
 * their reasons. Read-only: nothing here changes an animal. Each table is read once (services, litters
 * and their events, animals, groups, feed, processing) and the figures are computed in memory with the
 * shared yield functions. Another farm's or co-op's tables do not exist for the actor (404).
 */
export async function farmPerformance(actor: SessionUser, q: PerformanceQuery): Promise<PerformanceDto> {
  const ownFarmId = farmOf(actor);
  const farmId = q.farmId ?? ownFarmId;
  ensureCan(actor, 'read', 'Performance', { farmId }, 'That farm');
  const showsMoney = defineAbilityFor(actor).can('read', subjectOf('Money', { coopId: actor.coopId, farmId }));
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const period = q.period === 'all' ? null : q.period === 'custom' ? { from: q.from!, to: q.to! } : lastTwelveMonths(clock.today);
    const services = await serviceOutcomesOfFarm(tx, actor.coopId, farmId, clock.today);
    const litters = await litterFactsOfFarm(tx, actor.coopId, farmId);
    const sources = await performanceSourcesOf(tx, actor.coopId, farmId);
    const processedIds = (sources.processing ?? []).filter((r) => r.animalId && !r.groupId).map((r) => r.animalId!);
    const facts = await animalFactsOf(tx, actor.coopId, [...services.flatMap((s) => [s.doeId, s.buckId]), ...litters.flatMap((l) => [l.damId, l.sireId]), ...processedIds]);
    const animals: PerformanceAnimal[] = [...facts.values()].map((a) => ({
      id: a.id, name: a.name, tattoo: a.tattoo, sex: a.sex, breedName: a.lineBreedName,
      onFarm: a.keepingFarmId === farmId && a.disposition === 'on_farm',
    }));
    const tables = performanceTables({
      today: clock.today,
      period,
      animals,
      services,
      litters,
      groups: sources.groups,
      doeLitterFeed: sources.doeLitterFeed,
      processing: sources.processing,
      processedAnimals: new Map(processedIds.map((id) => [id, { sireId: facts.get(id)?.sireId ?? null, damId: facts.get(id)?.damId ?? null, birthDate: facts.get(id)?.birthDate ?? null }])),
    });
    return presentPerformance(tables, { farmId, today: clock.today, periodChoice: q.period, showsMoney });
  });
}
