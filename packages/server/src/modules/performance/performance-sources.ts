import type { Transaction } from 'sequelize';
import type { PerformanceGroupInput, PerformanceProcessingInput } from '@burrowline/shared';
import { doeLitterFeedOfFarm } from '../feed/feed.service';
import { growOutFactsOfFarm } from '../growout/growout.service';
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
  const groups = await growOutFactsOfFarm(tx, coopId, farmId);
  const doeLitterFeed = await doeLitterFeedOfFarm(tx, coopId, farmId);
  const processing = await processingFactsOfFarm(tx, coopId, farmId);
  return { groups, doeLitterFeed, processing };
}
