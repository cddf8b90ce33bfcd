import { Op, type Transaction } from 'sequelize';
import { crossLabel, groupBirthDate } from '@burrowline/shared';
import { animalFactsOf } from '../animals/animal-facts.service';
import { groupWeighInsOf } from '../animals/group-weigh-ins.service';
import { breedMapOf } from '../breeds/breeds.service';
import { litterFactsOf, type LitterFacts } from '../litters/litter-facts.service';
import { GrowOutGroup, GrowOutGroupLitter, type HeadsSold } from './grow-out-group.model';
import { port } from '../../lib/port';
import { headsLeftOn, type GroupInfo } from './grow-out.presenter';

/**
 * The feed each group of a farm was given, with its share of pen- and farm-wide feed (grams, cents). The
 * feed book reads grow-out's groups, so grow-out cannot import it; the composition root plugs it in.
 */
export const groupFeedTotals = port<(tx: Transaction, coopId: string, farmId: string) => Promise<Map<string, { grams: number; costCents: number }>>>('grow-out group feed totals');

export async function membersOf(tx: Transaction, groupIds: string[]): Promise<GrowOutGroupLitter[]> {
  if (groupIds.length === 0) return [];
  return GrowOutGroupLitter.findAll({ where: { groupId: { [Op.in]: groupIds } }, transaction: tx, raw: true });
}

/**
 * The heads processed from groups, by day. Processing reads grow-out, so grow-out cannot import it; the
 * composition root plugs it in.
 */
export const processedHeadsOfGroups = port<(tx: Transaction, coopId: string, groupIds: string[]) => Promise<ProcessedHeads[]>>('grow-out processed heads');

export interface ProcessedHeads {
  groupId: string;
  processedOn: string;
  headCount: number;
}

/** The heads sold alive from a group, as processing's batches count. */
export function soldHeadsOf(group: { id: string; headsSold?: HeadsSold[] | null }): ProcessedHeads[] {
  return (group.headsSold ?? []).map((s) => ({ groupId: group.id, processedOn: s.soldOn, headCount: s.headCount }));
}

/** Heads of a group on a date (none before it was formed or after it closed). */
export function headsOn(info: GroupInfo, date: string): number {
  if (date < info.group.formedOn || (info.group.closedOn && date > info.group.closedOn)) return 0;
  return headsLeftOn(info, date);
}


/** Everything presenting a set of groups needs, fetched once. */
export async function contextOf(tx: Transaction, coopId: string, groups: GrowOutGroup[]) {
  const members = await membersOf(tx, groups.map((g) => g.id));
  const litters = await litterFactsOf(tx, coopId, members.map((m) => m.litterId));
  const parents = await animalFactsOf(tx, coopId, [...litters.values()].flatMap((l) => [l.damId, l.sireId]));
  const breeds = await breedMapOf(coopId, tx);
  const weighIns = await groupWeighInsOf(tx, coopId, groups.map((g) => g.id));
  const processed = groups.length > 0 ? await processedHeadsOfGroups(tx, coopId, groups.map((g) => g.id)) : [];
  const crossOf = (l: LitterFacts) => crossLabel(parents.get(l.sireId)?.lineBreedName, parents.get(l.damId)?.lineBreedName);
  const cache = new Map<string, GroupInfo>();
  const info = (group: GrowOutGroup): GroupInfo => {
    const hit = cache.get(group.id);
    if (hit) return hit;
    const own = members.filter((m) => m.groupId === group.id).map((m) => ({ litterId: m.litterId, heads: m.heads, litter: litters.get(m.litterId)! }));
    const main = [...own].sort((a, b) => b.heads - a.heads)[0];
    const sireBreed = main ? parents.get(main.litter.sireId)?.breedId : null;
    const damBreed = main ? parents.get(main.litter.damId)?.breedId : null;
    const sizeClass = (sireBreed && breeds.get(sireBreed)?.sizeClass) || (damBreed && breeds.get(damBreed)?.sizeClass) || 'medium';
    const all = weighIns.filter((w) => w.groupId === group.id);
    const result: GroupInfo = {
      group, members: own, heads: own.reduce((n, m) => n + m.heads, 0),
      birthDate: own.length > 0 ? groupBirthDate(own.map((m) => ({ kindledOn: m.litter.kindledOn, heads: m.heads }))) : group.formedOn,
      sizeClass, cross: main ? crossOf(main.litter) : crossLabel(null, null),
      accepted: all.filter((w) => w.reviewState === 'accepted'), all,
      // Heads sold alive leave the group as processed ones do.
      processed: [...processed.filter((p) => p.groupId === group.id), ...soldHeadsOf(group)].sort((a, b) => a.processedOn.localeCompare(b.processedOn)),
    };
    cache.set(group.id, result);
    return result;
  };
  return { info, parents, crossOf };
}

