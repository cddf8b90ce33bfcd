/**
 * The demo grow-out and feed book of Larkspur Hollow: for each demo farm, groups formed at weaning from
 * its litters of the past year, weighed at the farm's ages (weaning, 8, 10 and 12 weeks) with invented
 * gains of about 30–40 g a day, closed near the usual fryer weight; one or two groups still growing with
 * recent weigh-ins, so projections show; feed bought in bags every few weeks and given to the groups (at
 * a feed conversion near 3.5 : 1, about the published 3.8 on pellets) and to the does with their
 * litters. Everything goes through the grow-out and feed services' checks. A seeded generator keeps every
 * load the same.
 */
import type { Transaction } from 'sequelize';
import {
  addDays, crossLabel, daysBetween, feedPurchaseCreateSchema, feedUseCreateSchema, gompertzWeight, groupWeighInCreateSchema, growOutGroupCloseSchema,
  growOutGroupCreateSchema, referenceCurve, todayIn, type FeedUseCreateInput,
} from '@burrowline/shared';
import type { SessionUser } from '../packages/server/src/lib/session-user';
import { animalFactsOf } from '../packages/server/src/modules/animals/animal-facts.service';
import { recordFeedPurchaseIn, recordFeedUseIn } from '../packages/server/src/modules/feed/feed.service';
import { closeGroupIn, formGroupIn, weighGroupIn } from '../packages/server/src/modules/grow-out/grow-out.service';
import { groupsOfFarm } from '../packages/server/src/modules/grow-out/grow-out-facts.service';
import { farmLitterFactsOf, type LitterFacts } from '../packages/server/src/modules/litters/litter-facts.service';
import { seededRandom } from '../packages/shared/src/pedigree/seeded-random';

export interface DemoGrowOutContext {
  coopId: string;
  farms: Map<string, string>;
  keepers: Map<string, string>;
  apprenticeId: string | null;
  apprenticeFarmKey?: string;
}

const actorFor = (coopId: string, farmId: string, userId: string, role: 'member' | 'apprentice' = 'member'): SessionUser => ({
  id: userId, coopId, farmId, mentorId: null, email: 'demo@larkspur-hollow.example', name: 'Demo', role,
});

const GROWER = 'Grower pellets 16%';
const DOE_RATION = 'Doe ration 18%';
/** A 50 lb bag (NIST Handbook 44: 22,679.6 g). */
const BAG_GRAMS = 22_680;
// The last weigh-in at 80 days and closing a few days later keeps the demo batches fryers (under 12 weeks, USDA FSIS).
const WEIGH_AGES = [56, 70, 80];
const TARGET_GRAMS = 2270;
/** A group's name from the season it was formed in: "Autumn fryers 2026", then "Autumn fryers 2026 B". */
function seasonName(formedOn: string, taken: Set<string>): string {
  const month = Number(formedOn.slice(5, 7));
  const season = month <= 2 || month === 12 ? 'Winter' : month <= 5 ? 'Spring' : month <= 8 ? 'Summer' : 'Autumn';
  const base = `${season} fryers ${formedOn.slice(0, 4)}`;
  let name = base;
  for (let i = 0; taken.has(name); i++) name = `${base} ${String.fromCharCode(66 + i)}`;
  taken.add(name);
  return name;
}

export async function loadDemoGrowOut(ctx: DemoGrowOutContext, tx: Transaction): Promise<{ groups: number; weighIns: number; uses: number } | null> {
  const firstFarm = [...ctx.farms.values()][0];
  if (!firstFarm || (await groupsOfFarm(tx, ctx.coopId, firstFarm)).length > 0) return null;
  const random = seededRandom(20_261_201);
  const between = (min: number, max: number) => min + random() * (max - min);
  const today = todayIn('America/Chicago');
  const yearAgo = addDays(today, -365);
  let groupCount = 0;
  let weighInCount = 0;
  let useCount = 0;

  for (const [farmKey, farmId] of ctx.farms) {
    const keeper = actorFor(ctx.coopId, farmId, ctx.keepers.get(farmKey)!);
    const litters = (await farmLitterFactsOf(tx, ctx.coopId, farmId))
      .filter((l) => l.weaned > 0 && l.weanedOn && l.kindledOn >= yearAgo && l.weanedOn <= today)
      .sort((a, b) => a.kindledOn.localeCompare(b.kindledOn));

    // Litters of one breed or cross kindled within a week of each other are grown out together, so each
    // group counts for its breed or cross in the comparison.
    const parents = await animalFactsOf(tx, ctx.coopId, litters.flatMap((l) => [l.sireId, l.damId]));
    const crossOf = (l: LitterFacts) => crossLabel(parents.get(l.sireId)?.lineBreedName, parents.get(l.damId)?.lineBreedName).key;
    const clusters: LitterFacts[][] = [];
    for (const l of litters) {
      const open = clusters.find((c) => crossOf(c[0]!) === crossOf(l) && daysBetween(c[0]!.kindledOn, l.kindledOn) <= 7 && c.length < 3);
      if (open) open.push(l);
      else clusters.push([l]);
    }

    const uses: FeedUseCreateInput[] = [];
    const names = new Set<string>();
    for (const cluster of clusters) {
      const formedOn = cluster.map((l) => l.weanedOn!).sort().at(-1)!;
      const group = await formGroupIn(tx, keeper, growOutGroupCreateSchema.parse({
        name: seasonName(formedOn, names), formedOn, targetGrams: TARGET_GRAMS,
        litters: cluster.map((l) => ({ litterId: l.id, heads: l.weaned })),
      }));
      groupCount++;
      const heads0 = cluster.reduce((n, l) => n + l.weaned, 0);
      const birth = addDays(cluster[0]!.kindledOn, Math.round(cluster.reduce((n, l) => n + daysBetween(cluster[0]!.kindledOn, l.kindledOn) * l.weaned, 0) / heads0));
      const closes = addDays(birth, 84 + Math.floor(between(2, 6))) <= addDays(today, -1);

      // Weigh-ins: at forming (weaning), then 8, 10 and 12 weeks while the group grows.
      const ages = [daysBetween(birth, formedOn), ...WEIGH_AGES.filter((a) => a > daysBetween(birth, formedOn) + 6)];
      const dates = ages.map((a) => addDays(birth, a)).filter((d) => d <= today);
      if (!closes && dates.length > 0 && daysBetween(dates.at(-1)!, today) >= 7) dates.push(addDays(today, -1));
      let perHead = gompertzWeight(ages[0]!, referenceCurve('medium')) * between(0.93, 1.07);
      let heads = heads0;
      let previous = dates[0]!;
      const weighed: { on: string; total: number }[] = [];
      for (const on of dates) {
        const days = daysBetween(previous, on);
        // Gains of 30–40 g a day, slowing a little toward market weight (invented).
        perHead += days * between(30, 40) * (daysBetween(birth, on) > 70 ? 0.92 : 1);
        if (weighed.length > 0 && heads > 3 && random() < 0.15) heads -= 1;
        const total = Math.round(perHead * heads);
        await weighGroupIn(tx, keeper, group.id, groupWeighInCreateSchema.parse({ weighedOn: on, totalGrams: total, headCount: heads }));
        weighInCount++;
        weighed.push({ on, total });
        previous = on;
      }
      const closedOn = closes ? addDays(dates.at(-1)!, Math.floor(between(1, 4))) : null;
      if (closedOn && closedOn <= today) await closeGroupIn(tx, keeper, group.id, growOutGroupCloseSchema.parse({ closedOn, version: group.version }));

      // Feed: weekly, the gain of each week times a feed conversion near 3.5 : 1 (invented, about the published 3.8).
      const conversion = between(3.2, 3.9);
      for (let i = 1; i < weighed.length; i++) {
        const gain = Math.max(weighed[i]!.total - weighed[i - 1]!.total, 500);
        const span = daysBetween(weighed[i - 1]!.on, weighed[i]!.on);
        const weeks = Math.max(1, Math.round(span / 7));
        for (let w = 0; w < weeks; w++) {
          const fromOn = addDays(weighed[i - 1]!.on, Math.round((w * span) / weeks) + (w === 0 ? 0 : 1));
          const givenOn = addDays(weighed[i - 1]!.on, Math.round(((w + 1) * span) / weeks));
          uses.push({ givenOn, fromOn, grams: Math.round((gain * conversion) / weeks), productName: GROWER, target: 'group', groupId: group.id, note: '' });
        }
      }
    }

    // Each doe and her litter, kindling to weaning (Kellogg 1933 puts doe + litter near 5.3 lb feed per lb of young at 60 days).
    for (const l of litters) {
      const young = l.weaned * gompertzWeight(daysBetween(l.kindledOn, l.weanedOn!), referenceCurve('medium'));
      uses.push({ givenOn: l.weanedOn!, fromOn: l.kindledOn, grams: Math.round(young * between(4.2, 5)), productName: DOE_RATION, target: 'doe', doeId: l.damId, note: '' });
    }

    // Bags bought every five weeks, enough for the feed given until the next purchase.
    uses.sort((a, b) => a.givenOn.localeCompare(b.givenOn));
    const start = uses[0]?.fromOn ?? today;
    for (const product of [GROWER, DOE_RATION]) {
      const mine = uses.filter((u) => u.productName === product);
      if (mine.length === 0) continue;
      for (let on = addDays(mine[0]!.givenOn < start ? mine[0]!.givenOn : start, -3); on <= today; on = addDays(on, 35)) {
        const until = addDays(on, 35);
        const need = mine.filter((u) => u.givenOn >= on && u.givenOn < until).reduce((n, u) => n + u.grams, 0);
        if (need === 0) continue;
        const bags = Math.ceil(need / BAG_GRAMS) + 1;
        const pricePerBag = product === GROWER ? Math.round(between(1850, 2250)) : Math.round(between(2050, 2450));
        await recordFeedPurchaseIn(tx, keeper, feedPurchaseCreateSchema.parse({
          boughtOn: on, productName: product, bagGrams: BAG_GRAMS, bags, priceCents: bags * pricePerBag, crudeProteinPercent: product === GROWER ? 16 : 18,
        }));
      }
    }
    for (const use of uses) {
      await recordFeedUseIn(tx, keeper, feedUseCreateSchema.parse(use));
      useCount++;
    }

    // The apprentice's weigh-in of a growing group, waiting for the mentor's review.
    if (ctx.apprenticeId && farmKey === ctx.apprenticeFarmKey) {
      const growing = (await groupsOfFarm(tx, ctx.coopId, farmId)).find((g) => g.status === 'growing');
      if (growing) {
        const apprentice = actorFor(ctx.coopId, farmId, ctx.apprenticeId, 'apprentice');
        const group = (await farmLitterFactsOf(tx, ctx.coopId, farmId)).filter((l) => growing.litterIds.includes(l.id));
        const kits = Math.max(1, group.reduce((n, l) => n + l.weaned, 0) - 1);
        const age = daysBetween(group[0]!.kindledOn, today);
        await weighGroupIn(tx, apprentice, growing.id, groupWeighInCreateSchema.parse({
          weighedOn: today, totalGrams: Math.round(kits * gompertzWeight(age, referenceCurve('medium'))), headCount: kits, note: 'Weighed before evening feed',
        }));
        weighInCount++;
      }
    }
  }
  return { groups: groupCount, weighIns: weighInCount, uses: useCount };
}
