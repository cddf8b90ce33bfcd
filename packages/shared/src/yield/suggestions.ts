import { PUBLISHED_GAIN } from '../growth/adg';
import { PRODUCTIVITY_TARGET, type DoePerformance } from './performance';

/**
 * Keep and cull suggestions with the reason shown. Suggestions only: the breeder decides, and nothing
 * changes an animal's record by itself. The thresholds are the farm's to change; the defaults and where
 * they come from:
 */
export interface KeepCullThresholds {
  /** Missed services in a row (common practice: two in a row is the usual signal). */
  missedInARow: number;
  /** Average born alive below this over her recent litters (common practice: 8–12 born is usual for medium meat breeds). */
  minAverageBornAlive: number;
  /** Survival to weaning below this over her weaned litters (common practice, from memory: losses over 30 % are poor mothering). */
  minSurvivalToWeaning: number;
  /** Kits weaned a year below this, pro-rated over her days in service (derived: 70 % of the ≈ 35 target, Rabbit Production 9th ed.). */
  minKitsWeanedPerYear: number;
  /**
   * Days in service in the period before her yearly output is judged; fewer is "not enough history"
   * (common practice: half a year holds two litters to weaning at the usual rebreeding intervals).
   */
  minDaysForYearlyOutput: number;
  /** Her litters' gain below this share of the comparison gain (common practice). */
  slowGrowthShare: number;
  /** How many of her latest litters the litter checks look at. */
  recentLitters: number;
}

export const DEFAULT_KEEP_CULL_THRESHOLDS: Readonly<KeepCullThresholds> = Object.freeze({
  missedInARow: 2,
  minAverageBornAlive: 6,
  minSurvivalToWeaning: 0.7,
  minKitsWeanedPerYear: Math.round(PRODUCTIVITY_TARGET.kitsWeanedPerYear * 0.7),
  minDaysForYearlyOutput: 182,
  slowGrowthShare: 0.85,
  recentLitters: 3,
});

export type SuggestionAction = 'consider_culling' | 'watch' | 'keep' | 'too_early';

export interface KeepCullSuggestion {
  action: SuggestionAction;
  code: 'missed_in_a_row' | 'small_litters' | 'poorly_raised' | 'low_output' | 'slow_growth' | 'good_record' | 'few_records' | 'short_history';
  reason: string;
}

export interface GrowthEvidence {
  /** Average daily gain of each of her recent litters (or their grow-out groups), g/day. */
  litterGainsGramsPerDay: ReadonlyArray<number>;
  /** The co-op's average for the same breed or cross; else the published 28.8 g/day (Rao et al. 1977). */
  comparisonGramsPerDay?: number | null;
}

const pct = (x: number) => `${Math.round(x * 100)} %`;
const one = (x: number) => (Math.round(x * 10) / 10).toString();

/**
 * Whether her yearly output can be judged, and how it is worded: every doe by the same rule over the
 * same period, the yearly figure pro-rated over her days in service when she has under a year of them.
 */
export function yearlyOutputOf(
  perf: Pick<DoePerformance, 'days' | 'kitsWeanedPerYear'>,
  thresholds: Pick<KeepCullThresholds, 'minDaysForYearlyOutput'> = DEFAULT_KEEP_CULL_THRESHOLDS,
): { judged: true; text: string } | { judged: false; text: string } {
  if (perf.days < thresholds.minDaysForYearlyOutput || perf.kitsWeanedPerYear === null) {
    const days = `${perf.days} ${perf.days === 1 ? 'day' : 'days'}`;
    return { judged: false, text: `Only ${days} in service in this period: not enough history to judge her yearly output (that takes ${thresholds.minDaysForYearlyOutput} days)` };
  }
  const proRated = perf.days < 365 ? ` (pro-rated from her ${perf.days} days in service)` : '';
  return { judged: true, text: `${one(perf.kitsWeanedPerYear)} kits weaned a year${proRated}` };
}

/**
 * Suggestions for one doe, most serious first; `keep` only when there is enough record and nothing
 * against her, `too_early` when there is not enough record to say.
 */
export function keepCullSuggestions(
  perf: DoePerformance,
  growth: GrowthEvidence | null = null,
  thresholds: KeepCullThresholds = DEFAULT_KEEP_CULL_THRESHOLDS,
): KeepCullSuggestion[] {
  const out: KeepCullSuggestion[] = [];
  if (perf.missedInARow >= thresholds.missedInARow) {
    out.push({ action: 'consider_culling', code: 'missed_in_a_row', reason: `Her last ${perf.missedInARow} services missed one after another` });
  }
  const recent = perf.litterSummaries.slice(-thresholds.recentLitters);
  if (recent.length >= 2) {
    const bornAlive = recent.reduce((n, s) => n + s.bornAlive, 0) / recent.length;
    if (bornAlive < thresholds.minAverageBornAlive) {
      out.push({ action: 'consider_culling', code: 'small_litters', reason: `Small litters: ${one(bornAlive)} born alive on average over her last ${recent.length} (below ${thresholds.minAverageBornAlive})` });
    }
  }
  const weaned = recent.filter((s) => s.onDoe === 0 && s.raised > 0);
  if (weaned.length >= 2) {
    const survival = weaned.reduce((n, s) => n + s.weaned, 0) / weaned.reduce((n, s) => n + s.raised, 0);
    if (survival < thresholds.minSurvivalToWeaning) {
      out.push({ action: 'consider_culling', code: 'poorly_raised', reason: `Poorly raised litters: ${pct(survival)} of her kits reached weaning over her last ${weaned.length} (below ${pct(thresholds.minSurvivalToWeaning)})` });
    }
  }
  const output = yearlyOutputOf(perf, thresholds);
  if (perf.services > 0 && output.judged && perf.kitsWeanedPerYear! < thresholds.minKitsWeanedPerYear) {
    out.push({ action: 'watch', code: 'low_output', reason: `${output.text}, against a target of about ${PRODUCTIVITY_TARGET.kitsWeanedPerYear} (Rabbit Production, 9th ed.)` });
  }
  if (growth && growth.litterGainsGramsPerDay.length >= 2) {
    const gains = growth.litterGainsGramsPerDay;
    const average = gains.reduce((s, g) => s + g, 0) / gains.length;
    const comparison = growth.comparisonGramsPerDay ?? PUBLISHED_GAIN.gramsPerDay;
    const against = growth.comparisonGramsPerDay ? 'the co-op average' : 'the published 28.8 g a day (Rao et al. 1977)';
    if (average < comparison * thresholds.slowGrowthShare) {
      out.push({ action: 'watch', code: 'slow_growth', reason: `Her litters grow slowly: ${one(average)} g a day against ${one(comparison)} g for ${against}` });
    }
  }
  const shortHistory: KeepCullSuggestion = { action: 'too_early', code: 'short_history', reason: output.text };
  if (out.length === 0) {
    if (perf.litterSummaries.length < 2) return [{ action: 'too_early', code: 'few_records', reason: 'Fewer than two litters on record: too early to say' }];
    if (!output.judged) return [shortHistory];
    return [{ action: 'keep', code: 'good_record', reason: `No concerns in her record; ${output.text}` }];
  }
  if (!output.judged) out.push(shortHistory);
  const rank: Record<SuggestionAction, number> = { consider_culling: 0, watch: 1, keep: 2, too_early: 3 };
  return out.sort((a, b) => rank[a.action] - rank[b.action]);
}
