import { DEFAULT_CYCLE_SETTINGS } from '../breeding/cycle-settings';
import type { GainSummary } from '../growth/adg';
import type { GrowthProjection, Readiness } from '../growth/projection';
import type { ScheduledWeighIn } from '../growth/weigh-in-schedule';
import type { ReviewState } from '../herd/herd-enums';
import type { FeedAllocationRule, FeedTarget } from '../schemas/feed.schema';

/** The usual fryer target when a farm has set none (its Almanac setting's default; the source is given there). */
export const DEFAULT_TARGET_GRAMS = DEFAULT_CYCLE_SETTINGS.targetLiveWeightGrams;

/** Kits are put in a grow-out group at weaning or later: 4 weeks is the earliest usual weaning (Texas Extension; Rabbit Production). */
export const EARLIEST_GROW_OUT_AGE_DAYS = 28;

export interface GrowOutLitterDto {
  litterId: string;
  heads: number;
  kindledOn: string;
  dam: { id: string; name: string };
  sire: { id: string; name: string };
  cross: { key: string; label: string; kind: 'purebred' | 'cross' | 'unknown' };
}

export interface GroupKitWeightDto {
  label: string | null;
  grams: number;
}

export interface GroupWeighInDto {
  id: string;
  weighedOn: string;
  ageDays: number;
  totalGrams: number;
  headCount: number;
  gramsPerHead: number;
  kits: GroupKitWeightDto[] | null;
  note: string;
  enteredBy: { id: string; name: string };
  reviewState: ReviewState;
  /** A warning for a weight light or heavy for the age (never blocks). */
  caution: string | null;
  version: number;
}

export interface KitGainDto {
  label: string;
  weighIns: number;
  latestGrams: number;
  gramsPerDay: number | null;
}

export interface GrowthChartDto {
  /** The group's mean weight per head by age (accepted weigh-ins). */
  group: { ageDays: number; grams: number; weighedOn: string }[];
  /** The co-op's average for the same breed or cross, all farms' groups (aggregates only). */
  coop: { ageDays: number; grams: number | null; heads: number; groups: number }[];
  coopLabel: string;
  /** The published line, 28.8 g/day birth to 8 weeks (Rao et al. 1977). */
  published: { ageDays: number; grams: number }[];
  publishedSource: string;
  /** The projection model's curve or line from the first weigh-in to the projected age. */
  projection: { ageDays: number; grams: number }[];
  targetGrams: number;
}

export interface GroupFeedDto {
  feedGrams: number;
  gainGrams: number | null;
  /** Feed ÷ live-weight gain; null with no gain yet. */
  conversion: number | null;
  /** null for apprentices (no money) and with no feed. */
  feedCostCents: number | null;
  costPerKgLiveCents: number | null;
  costPerLbLiveCents: number | null;
  publishedConversion: { ratio: number; source: string };
}

export interface GrowOutGroupListItemDto {
  id: string;
  farmId: string;
  name: string;
  formedOn: string;
  status: 'growing' | 'closed';
  closedOn: string | null;
  heads: number;
  currentHeads: number;
  birthDate: string;
  ageDays: number;
  targetGrams: number;
  crossLabel: string;
  latest: { weighedOn: string; gramsPerHead: number } | null;
  gramsPerDay: number | null;
  projection: { status: GrowthProjection['status']; projectedOn: string | null; interval: GrowthProjection['interval']; modelKind: GrowthProjection['model']['kind']; message: string };
  pendingWeighIns: number;
  version: number;
}

export interface GrowOutGroupDto extends Omit<GrowOutGroupListItemDto, 'projection'> {
  housingUnit: { id: string; name: string } | null;
  notes: string;
  litters: GrowOutLitterDto[];
  weighIns: GroupWeighInDto[];
  /** The farm's weigh-in ages (its Almanac settings) over the group's life. */
  weighInSchedule: ScheduledWeighIn[];
  gain: GainSummary;
  kitGains: KitGainDto[];
  projection: GrowthProjection & { modelName: string; why: string };
  chart: GrowthChartDto;
  feed: GroupFeedDto;
  canEdit: boolean;
  canSeeMoney: boolean;
}

export interface ReadyByDto {
  date: string;
  entries: { groupId: string; name: string; readiness: Readiness; words: string; projectedOn: string | null; headCount: number | null }[];
}

export interface GrowOutListDto {
  groups: GrowOutGroupListItemDto[];
  readyBy: ReadyByDto | null;
  defaultTargetGrams: number;
  canEdit: boolean;
}

export interface LitterChoiceDto {
  litterId: string;
  kindledOn: string;
  ageDays: number;
  dam: { id: string; name: string };
  sire: { id: string; name: string };
  crossLabel: string;
  alive: number;
  inGroups: number;
  available: number;
  weaned: boolean;
}

export interface FeedPurchaseDto {
  id: string;
  boughtOn: string;
  productName: string;
  bagGrams: number;
  bags: number;
  grams: number;
  gramsLeft: number;
  crudeProteinPercent: number | null;
  /** null for apprentices. */
  priceCents: number | null;
  centsPerKg: number | null;
  note: string;
  version: number;
}

export interface FeedUseShareDto {
  groupId: string | null;
  litterId: string | null;
  label: string;
  grams: number;
}

export interface FeedUseDto {
  id: string;
  givenOn: string;
  fromOn: string;
  grams: number;
  productName: string;
  purchaseId: string | null;
  target: FeedTarget;
  /** The one of these the target names (for a correction form). */
  groupId: string | null;
  housingUnitId: string | null;
  doeId: string | null;
  targetLabel: string;
  allocation: FeedAllocationRule | null;
  shares: FeedUseShareDto[];
  /** null for apprentices. */
  costCents: number | null;
  enteredBy: { id: string; name: string };
  note: string;
  version: number;
}

export interface FeedOverviewDto {
  purchases: FeedPurchaseDto[];
  /** One page of the feed given, latest first. */
  uses: FeedUseDto[];
  usesTotal: number;
  usesPage: number;
  usesPageSize: number;
  products: { name: string; gramsLeft: number }[];
  canEdit: boolean;
  canSeeMoney: boolean;
}

/** Readiness for a date in plain words. */
export function readinessWords(readiness: Readiness): string {
  switch (readiness) {
    case 'reached': return 'At target already';
    case 'ready': return 'Ready by then';
    case 'likely': return 'Likely ready';
    case 'possible': return 'Possibly ready';
    case 'not_ready': return 'Not ready by then';
    default: return 'No projection yet';
  }
}

/** The projection model's name for the screen, and why that one. */
export function projectionModelName(p: Pick<GrowthProjection, 'model' | 'status'>): { name: string; why: string } {
  switch (p.model.kind) {
    case 'gompertz':
      return { name: 'Fitted Gompertz growth curve', why: `${p.model.weighInDays} weigh-in days are enough to fit a growth curve, which follows the slowing gain as kits near their mature weight; a straight line would not.` };
    case 'linear_two_point':
      return { name: 'Straight line through two weigh-ins', why: 'Only two weigh-in days so far: a rough guide until the third weigh-in lets a growth curve be fitted.' };
    case 'linear_least_squares':
      return { name: 'Least-squares straight line', why: 'The growth curve could not be fitted to these weigh-ins, so a straight line through them stands in.' };
    default:
      return { name: p.status === 'reached' ? 'Target reached' : 'No projection', why: p.status === 'reached' ? 'A weigh-in already shows the target weight.' : 'Weigh the group at least twice to project a ready date.' };
  }
}
