import { addDays, daysBetween } from '../herd/herd-dates';
import type { SizeClass } from '../herd/herd-enums';
import { sortedWeighIns, type WeighInPoint } from './adg';
import {
  ASSUMED_LOG_SPREAD, ASSUMED_SPREAD_DF, MATURE_WEIGHT_PRIORS, fitGompertz, gompertzAgeAtWithError,
  type GompertzParams, type GrowthPoint,
} from './gompertz';
import { invert, studentTQuantile } from './stats';

/**
 * When will a grow-out group reach the target live weight? The model depends on what the weigh-ins
 * allow, and the projection says which one it used (`model.kind` and `model.description`, for the
 * screen):
 * - three or more weigh-in days: a Gompertz curve fitted to them (see growth/gompertz.ts), with the
 *   mature-weight prior of the breed (or its size) while the weigh-ins are short — fewer than 6, or all
 *   younger than 20 weeks, which is every fryer grow-out; if that fit fails, a least-squares line;
 * - two weigh-in days: the straight line through them, a rough guide only;
 * - fewer: no projection.
 * The interval (90 % unless asked otherwise) comes from the model's own uncertainty by the delta
 * method with Student's t; the weigh-ins' spread is pooled with an assumed 5 % (ASSUMED_LOG_SPREAD), so
 * two or three weigh-ins never look more certain than a scale and a rabbit's gut fill allow.
 */

export type ProjectionStatus = 'reached' | 'projected' | 'levels_off_below_target' | 'not_gaining' | 'too_few_weigh_ins';
export type GrowthModelKind = 'gompertz' | 'linear_two_point' | 'linear_least_squares' | 'none';

export interface GrowthModel {
  kind: GrowthModelKind;
  /** One sentence for the screen. */
  description: string;
  weighInDays: number;
  /** Gompertz parameters (A in grams, b, k per day). */
  gompertz?: GompertzParams;
  /** Straight line: grams per head at age 0 and grams a day. */
  line?: { interceptGrams: number; gramsPerDay: number };
  priorMatureGrams?: number | null;
  /** Pooled spread: log scale for the curve, grams for a line; with its degrees of freedom. */
  spread?: number;
  df?: number;
}

export interface GrowthProjection {
  status: ProjectionStatus;
  targetGrams: number;
  model: GrowthModel;
  /** The first day the group is expected at or above the target. */
  projectedOn: string | null;
  projectedAgeDays: number | null;
  interval: { from: string; to: string; level: number } | null;
  /** When the weigh-ins already show the target (status 'reached'). */
  reachedOn: string | null;
  latest: { weighedOn: string; gramsPerHead: number; headCount: number; ageDays: number } | null;
  message: string;
}

export interface ProjectionInput {
  birthDate: string;
  weighIns: ReadonlyArray<WeighInPoint>;
  targetGrams: number;
  /** The breed's mature weight (e.g. the middle of its senior range); else the size-class prior. */
  matureWeightGrams?: number | null;
  sizeClass?: SizeClass;
  /** Interval level, 0.5–0.99 (default 0.9). */
  level?: number;
  /** 'auto' (default) as described above; 'linear' asks for the straight line even with more weigh-ins. */
  model?: 'auto' | 'linear';
}

const formatGrams = (g: number) => `${Math.round(g).toLocaleString('en-US')} g`;

/** Per-head means by weigh-in day, with ages. */
function growthPoints(birthDate: string, weighIns: ReadonlyArray<WeighInPoint>) {
  const byDay = new Map<string, { grams: number; heads: number }>();
  for (const w of sortedWeighIns(weighIns)) {
    const day = byDay.get(w.weighedOn) ?? { grams: 0, heads: 0 };
    day.grams += w.totalGrams;
    day.heads += w.headCount;
    byDay.set(w.weighedOn, day);
  }
  return [...byDay.entries()].map(([on, d]) => {
    const ageDays = daysBetween(birthDate, on);
    if (ageDays < 0) throw new RangeError(`A weigh-in on ${on} is before the birth date ${birthDate}`);
    return { on, ageDays, grams: d.grams / d.heads, heads: d.heads };
  });
}

function leastSquaresSlope(points: ReadonlyArray<GrowthPoint>): number {
  const n = points.length;
  const mt = points.reduce((s, p) => s + p.ageDays, 0) / n;
  const mw = points.reduce((s, p) => s + p.grams, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (const p of points) {
    sxx += (p.ageDays - mt) ** 2;
    sxy += (p.ageDays - mt) * (p.grams - mw);
  }
  return sxy / sxx;
}

function shortData(points: ReadonlyArray<GrowthPoint>): boolean {
  return points.length < 6 || Math.max(...points.map((p) => p.ageDays)) < 140;
}

export function projectTargetDate(input: ProjectionInput): GrowthProjection {
  const level = input.level ?? 0.9;
  if (!(level >= 0.5 && level <= 0.99)) throw new RangeError('The interval level must lie between 0.5 and 0.99');
  if (!(input.targetGrams > 0)) throw new RangeError('The target weight must be above zero');
  const points = growthPoints(input.birthDate, input.weighIns);
  const target = input.targetGrams;
  const last = points[points.length - 1];
  const latest = last ? { weighedOn: last.on, gramsPerHead: last.grams, headCount: last.heads, ageDays: last.ageDays } : null;
  const base = { targetGrams: target, latest, projectedOn: null, projectedAgeDays: null, interval: null, reachedOn: null };
  const none: GrowthModel = { kind: 'none', description: 'No projection: weigh the group at least twice.', weighInDays: points.length };

  const reached = points.find((p) => p.grams >= target);
  if (reached && last && last.grams >= target) {
    return { ...base, status: 'reached', model: { ...none, description: 'Reached the target at a weigh-in.' }, reachedOn: reached.on,
      message: `At or above ${formatGrams(target)} since the weigh-in on ${reached.on}` };
  }
  if (points.length < 2) {
    return { ...base, status: 'too_few_weigh_ins', model: none, message: 'Weigh the group at least twice to project a ready date' };
  }
  const quantile = (df: number) => studentTQuantile((1 + level) / 2, df);
  const toDates = (age: number, se: number, df: number, model: GrowthModel): GrowthProjection => {
    const half = quantile(df) * se;
    const lastAge = last!.ageDays;
    const fromAge = Math.max(Math.ceil(age - half), lastAge + 1);
    const dayAge = Math.max(Math.ceil(age), lastAge + 1);
    const toAge = Math.max(Math.ceil(age + half), dayAge);
    const projectedOn = addDays(input.birthDate, dayAge);
    return {
      ...base, status: 'projected', model, projectedAgeDays: age, projectedOn,
      interval: { from: addDays(input.birthDate, Math.min(fromAge, dayAge)), to: addDays(input.birthDate, toAge), level },
      message: `Expected at ${formatGrams(target)} on ${projectedOn} (${Math.round(level * 100)} % between ${addDays(input.birthDate, Math.min(fromAge, dayAge))} and ${addDays(input.birthDate, toAge)})`,
    };
  };

  if (points.length >= 3 && leastSquaresSlope(points) <= 0) {
    return { ...base, status: 'not_gaining', model: { ...none, weighInDays: points.length, description: 'No projection: the weigh-ins show no gain.' },
      message: 'The weigh-ins show no gain: check the group' };
  }
  if (points.length >= 3 && input.model !== 'linear') {
    const prior = shortData(points) ? (input.matureWeightGrams ?? MATURE_WEIGHT_PRIORS[input.sizeClass ?? 'medium'].grams) : null;
    const fit = fitGompertz(points, { priorMatureGrams: prior });
    if (fit) {
      const model: GrowthModel = {
        kind: 'gompertz', weighInDays: points.length, gompertz: fit.params, priorMatureGrams: prior, spread: fit.logSpread, df: fit.df,
        description: `Gompertz growth curve W(t) = A·exp(−b·exp(−k·t)) fitted to ${points.length} weigh-ins (A ${formatGrams(fit.params.matureGrams)}, b ${fit.params.b.toFixed(2)}, k ${fit.params.k.toFixed(4)}/day)`
          + (prior ? `, with a mature weight expected near ${formatGrams(prior)}` : '')
          + `; ${Math.round(level * 100)} % interval from the fit's uncertainty.`,
      };
      const at = gompertzAgeAtWithError(target, fit);
      if (!at) {
        return { ...base, status: 'levels_off_below_target', model,
          message: `The fitted curve levels off near ${formatGrams(fit.params.matureGrams)}, below the target ${formatGrams(target)}` };
      }
      return toDates(at.ageDays, at.se, fit.df, model);
    }
  }

  if (points.length === 2) {
    const [p1, p2] = points as [typeof points[number], typeof points[number]];
    const rise = p2.grams - p1.grams;
    const run = p2.ageDays - p1.ageDays;
    const gramsPerDay = rise / run;
    const model: GrowthModel = {
      kind: 'linear_two_point', weighInDays: 2, line: { interceptGrams: p1.grams - gramsPerDay * p1.ageDays, gramsPerDay },
      spread: ASSUMED_LOG_SPREAD, df: ASSUMED_SPREAD_DF,
      description: `Straight line through two weigh-ins (${gramsPerDay.toFixed(1)} g a day), a rough guide until the third; `
        + `${Math.round(level * 100)} % interval assuming each weigh-in is within about 5 % of the group's true weight.`,
    };
    if (!(rise > 0)) return { ...base, status: 'not_gaining', model, message: 'No gain between the two weigh-ins: check the group' };
    const age = p1.ageDays + ((target - p1.grams) * run) / rise;
    // ∂t*/∂w1 = run·(T − w2)/rise², ∂t*/∂w2 = −run·(T − w1)/rise²; each weight's sd ≈ 5 % of it
    const d1 = (run * (target - p2.grams)) / rise ** 2;
    const d2 = (-run * (target - p1.grams)) / rise ** 2;
    const se = Math.sqrt((d1 * ASSUMED_LOG_SPREAD * p1.grams) ** 2 + (d2 * ASSUMED_LOG_SPREAD * p2.grams) ** 2);
    return toDates(age, se, ASSUMED_SPREAD_DF, model);
  }

  // Three or more weigh-ins the curve could not fit (or a line was asked for): a least-squares line on grams.
  const n = points.length;
  const mt = points.reduce((s, p) => s + p.ageDays, 0) / n;
  const mw = points.reduce((s, p) => s + p.grams, 0) / n;
  const slope = leastSquaresSlope(points);
  const intercept = mw - slope * mt;
  const ss = points.reduce((s, p) => s + (p.grams - intercept - slope * p.ageDays) ** 2, 0);
  const df = ASSUMED_SPREAD_DF + n - 2;
  const spread = Math.sqrt((ASSUMED_SPREAD_DF * (ASSUMED_LOG_SPREAD * mw) ** 2 + ss) / df);
  const model: GrowthModel = {
    kind: 'linear_least_squares', weighInDays: n, line: { interceptGrams: intercept, gramsPerDay: slope }, spread, df,
    description: `Least-squares straight line through ${n} weigh-ins (${slope.toFixed(1)} g a day)`
      + (input.model === 'linear' ? '; ' : ': the growth curve would not fit them; ')
      + `${Math.round(level * 100)} % interval from the line's uncertainty.`,
  };
  if (!(slope > 0)) return { ...base, status: 'not_gaining', model, message: 'The weigh-ins show no gain: check the group' };
  const age = (target - intercept) / slope;
  const xtx = [[n, n * mt], [n * mt, points.reduce((s, p) => s + p.ageDays ** 2, 0)]];
  const inv = invert(xtx)!;
  const g = [-1 / slope, -(target - intercept) / slope ** 2];
  const variance = spread ** 2 * (g[0]! ** 2 * inv[0]![0]! + 2 * g[0]! * g[1]! * inv[0]![1]! + g[1]! ** 2 * inv[1]![1]!);
  return toDates(age, Math.sqrt(variance), df, model);
}

export type Readiness = 'reached' | 'ready' | 'likely' | 'possible' | 'not_ready' | 'unknown';

export interface ReadyByEntry<G> {
  group: G;
  readiness: Readiness;
  projectedOn: string | null;
  headCount: number | null;
}

/**
 * Which groups will be at the target by `date` (to book processing places): reached (already weighed at
 * target), ready (even the late end of the interval is by then), likely (the projected day is by then),
 * possible (only the early end is), not_ready, unknown (no projection). Soonest first.
 */
export function readyBy<G extends { projection: GrowthProjection }>(groups: ReadonlyArray<G>, date: string): ReadyByEntry<G>[] {
  const rank: Record<Readiness, number> = { reached: 0, ready: 1, likely: 2, possible: 3, not_ready: 4, unknown: 5 };
  return groups
    .map((group) => {
      const p = group.projection;
      const headCount = p.latest?.headCount ?? null;
      let readiness: Readiness;
      if (p.status === 'reached') readiness = 'reached';
      else if (p.status !== 'projected' || !p.projectedOn || !p.interval) readiness = 'unknown';
      else if (p.interval.to <= date) readiness = 'ready';
      else if (p.projectedOn <= date) readiness = 'likely';
      else if (p.interval.from <= date) readiness = 'possible';
      else readiness = 'not_ready';
      return { group, readiness, projectedOn: p.status === 'reached' ? p.reachedOn : p.projectedOn, headCount };
    })
    .sort((a, b) => rank[a.readiness] - rank[b.readiness] || (a.projectedOn ?? '9999').localeCompare(b.projectedOn ?? '9999'));
}
