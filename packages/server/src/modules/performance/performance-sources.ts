import type { Transaction } from 'sequelize';
import type { PerformanceGroupInput, PerformanceProcessingInput } from '@burrowline/shared';
import { feedTotalsOfFarm } from '../feed/feed-totals.service';
import { growOutFactsOfFarm } from '../grow-out/grow-out-facts.service';
import { processingFactsOfFarm } from '../processing/processing.service';

/**
 * The grow-out, feed and processing records the performance tables read, through the services of
 * those domains (each reads its tables once, whatever the number of does). A source that is not
 * available answers null: its figures are left out, and the screen says which.
 */
export interface PerformanceSources {
  groups: PerformanceGroupInput[] | null;
  doeLitterFeed: Map<string, { grams: number; costCents: number }> | null;
  processing: PerformanceProcessingInput[] | null;
}

export async function performanceSourcesOf(tx: Transaction, coopId: string, farmId: string): Promise<PerformanceSources> {
  // The feed book is read and costed once for both the groups and the does with their litters.
  const feed = await feedTotalsOfFarm(tx, coopId, farmId);
  const groups = (await growOutFactsOfFarm(tx, coopId, farmId, { withFeed: false })).map((g) => ({
    ...g, feedGrams: feed.byGroup.get(g.id)?.grams ?? 0, feedCostCents: feed.byGroup.get(g.id)?.costCents ?? 0,
  }));
  const doeLitterFeed = feed.byLitter;
  const processing = await processingFactsOfFarm(tx, coopId, farmId);
  return { groups, doeLitterFeed, processing };
}
