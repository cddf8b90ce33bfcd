import type { Confidence, SizeClass } from '../herd/herd-enums';
import { poundsToGrams } from '../units/units';
import { invert, solveLinear } from './stats';

/**
 * The Gompertz growth curve W(t) = A·exp(−b·exp(−k·t)), t the age in days: A the mature weight, b fixes
 * the birth weight (W(0) = A·e^(−b)), k the rate at which growth slows. Its inflection, the age of
 * fastest gain, is ln(b)/k at A/e ≈ 37 % of mature weight — for meat rabbits around 7–8 weeks, inside the
 * fryer grow-out, which is why a straight line through two weigh-ins misleads.
 */
export interface GompertzParams {
  matureGrams: number;
  b: number;
  k: number;
}

export function gompertzWeight(ageDays: number, p: GompertzParams): number {
  return p.matureGrams * Math.exp(-p.b * Math.exp(-p.k * ageDays));
}

/** The age at which the curve reaches `grams`; null when it never does (at or above A, or not above W(0)). */
export function gompertzAgeAt(grams: number, p: GompertzParams): number | null {
  if (!(grams > 0) || grams >= p.matureGrams) return null;
  const ratio = Math.log(p.matureGrams / grams) / p.b; // = exp(−k·t)
  if (ratio >= 1) return 0;
  return -Math.log(ratio) / p.k;
}

/** Gain per day on the curve at an age: dW/dt = W·b·k·e^(−k·t). */
export function gompertzGain(ageDays: number, p: GompertzParams): number {
  return gompertzWeight(ageDays, p) * p.b * p.k * Math.exp(-p.k * ageDays);
}

/**
 * The mature-weight prior by breed size (used when the weigh-ins are too few or too young to show where
 * growth levels off, which is always true of a fryer grow-out). A breed's own senior standard weight is
 * better when known; these stand in when it is not.
 */
export const MATURE_WEIGHT_PRIORS: Readonly<Record<SizeClass, { grams: number; note: string; confidence: Confidence }>> = Object.freeze({
  small: { grams: Math.round(poundsToGrams(5)), note: '5 lb: the middle of the Florida White senior range, 4–6 lb (ARBA Standard of Perfection, as quoted second-hand)', confidence: 'sec' },
  medium: { grams: Math.round(poundsToGrams(10)), note: '10 lb: the middle of the New Zealand and Californian senior ranges, 8–12 lb (ARBA Standard of Perfection, as quoted second-hand)', confidence: 'sec' },
  large: { grams: Math.round(poundsToGrams(12)), note: '12 lb: the top of the heavier medium breeds\' senior ranges', confidence: 'mem' },
  giant: { grams: Math.round(poundsToGrams(14)), note: '14 lb: the Flemish Giant senior doe minimum, remembered from the ARBA Standard', confidence: 'mem' },
});

/** How far the mature weight may plausibly sit from the prior: one standard deviation is a factor of 1.25. */
export const MATURE_PRIOR_FACTOR = 1.25;

/**
 * The assumed spread of a group's weigh-in around its smooth curve, on the log scale (≈ 5 % of the
 * weight: gut fill, the weaning check, the scale), worth `ASSUMED_SPREAD_DF` degrees of freedom. The
 * residuals of the farm's own weigh-ins are pooled with it, so three weigh-ins lying by chance almost on
 * a curve do not claim a certainty they do not have. Common practice, from memory.
 */
export const ASSUMED_LOG_SPREAD = 0.05;
export const ASSUMED_SPREAD_DF = 4;

/**
 * A reference curve for medium meat breeds, for plausibility checks and as a start: A = 10 lb (the
 * medium prior), W(0) = 55 g (kit birth weight 50–60 g, common practice, from memory), and k chosen so
 * W(56) = 1,644 g, the published 8-week weight (Rao et al. 1977, J. Anim. Sci. 44:1021) — derived.
 */
export const REFERENCE_MEDIUM_CURVE: Readonly<GompertzParams> = (() => {
  const matureGrams = MATURE_WEIGHT_PRIORS.medium.grams;
  const b = Math.log(matureGrams / 55);
  const k = -Math.log(Math.log(matureGrams / 1644) / b) / 56;
  return Object.freeze({ matureGrams, b, k });
})();

/** The reference curve scaled to a breed size (kits of small breeds are born smaller, too). */
export function referenceCurve(sizeClass: SizeClass = 'medium', matureGrams?: number | null): GompertzParams {
  const mature = matureGrams ?? MATURE_WEIGHT_PRIORS[sizeClass].grams;
  return { matureGrams: mature, b: REFERENCE_MEDIUM_CURVE.b, k: REFERENCE_MEDIUM_CURVE.k };
}

export interface GrowthPoint {
  ageDays: number;
  grams: number;
}

export interface GompertzFitOptions {
  /** The prior mature weight; null fits A from the data alone (needs long series). */
  priorMatureGrams: number | null;
  priorFactor?: number;
  assumedLogSpread?: number;
  assumedSpreadDf?: number;
}

export interface GompertzFit {
  params: GompertzParams;
  /** Covariance of (ln A, ln b, ln k). */
  covariance: number[][];
  /** The pooled spread on the log scale and its degrees of freedom (for Student's t). */
  logSpread: number;
  df: number;
  /** Residual standard error of the weigh-ins alone, log scale (null with no residual degrees of freedom). */
  residualLogSe: number | null;
  points: number;
  priorMatureGrams: number | null;
  iterations: number;
}

type Theta = [number, number, number];

const BOUNDS: [number, number][] = [
  [Math.log(100), Math.log(30_000)], // ln A
  [Math.log(0.5), Math.log(60)], // ln b
  [Math.log(1e-4), Math.log(0.5)], // ln k
];

const clamp = (theta: number[]): Theta => theta.map((v, i) => Math.min(BOUNDS[i]![1], Math.max(BOUNDS[i]![0], v))) as Theta;

interface Problem {
  t: number[];
  y: number[];
  sigma: number;
  prior: { a0: number; sd: number } | null;
}

function residualsAndJacobian(theta: Theta, p: Problem): { r: number[]; J: number[][]; cost: number } {
  const [lnA, lnB, lnK] = theta;
  const b = Math.exp(lnB);
  const k = Math.exp(lnK);
  const r: number[] = [];
  const J: number[][] = [];
  for (let i = 0; i < p.t.length; i++) {
    const e = Math.exp(-k * p.t[i]!);
    const f = lnA - b * e;
    r.push((p.y[i]! - f) / p.sigma);
    J.push([1 / p.sigma, (-b * e) / p.sigma, (b * e * k * p.t[i]!) / p.sigma]);
  }
  if (p.prior) {
    r.push((p.prior.a0 - lnA) / p.prior.sd);
    J.push([1 / p.prior.sd, 0, 0]);
  }
  return { r, J, cost: r.reduce((s, v) => s + v * v, 0) };
}

function normalEquations(J: number[][], r: number[]): { JtJ: number[][]; Jtr: number[] } {
  const JtJ = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
  const Jtr = [0, 0, 0];
  for (let i = 0; i < J.length; i++) {
    const row = J[i]!;
    for (let a = 0; a < 3; a++) {
      Jtr[a]! += row[a]! * r[i]!;
      for (let c = 0; c < 3; c++) JtJ[a]![c]! += row[a]! * row[c]!;
    }
  }
  return { JtJ, Jtr };
}

/** Levenberg–Marquardt from one start; returns the best θ and its cost. */
function levenbergMarquardt(start: Theta, p: Problem): { theta: Theta; cost: number; iterations: number } | null {
  let theta = clamp(start);
  let current = residualsAndJacobian(theta, p);
  if (!Number.isFinite(current.cost)) return null;
  let mu = 1e-3;
  let iterations = 0;
  for (; iterations < 500; iterations++) {
    const { JtJ, Jtr } = normalEquations(current.J, current.r);
    let improved = false;
    for (let attempt = 0; attempt < 30; attempt++) {
      const damped = JtJ.map((row, i) => row.map((v, j) => (i === j ? v + mu * Math.max(v, 1e-12) : v)));
      const step = solveLinear(damped, Jtr);
      if (!step) { mu *= 10; continue; }
      const candidate = clamp(theta.map((v, i) => v + step[i]!));
      const next = residualsAndJacobian(candidate, p);
      if (Number.isFinite(next.cost) && next.cost <= current.cost) {
        const change = current.cost - next.cost;
        const stepSize = Math.max(...candidate.map((v, i) => Math.abs(v - theta[i]!)));
        theta = candidate;
        current = next;
        mu = Math.max(mu / 3, 1e-12);
        improved = true;
        if (change <= 1e-14 * (1 + current.cost) && stepSize < 1e-9) return { theta, cost: current.cost, iterations };
        break;
      }
      mu *= 4;
    }
    if (!improved) break;
  }
  return { theta, cost: current.cost, iterations };
}

/** A start from a guessed mature weight: ln(ln A − ln W) = ln b − k·t is a straight line in t. */
function startFrom(lnA: number, t: number[], y: number[]): Theta {
  const z = y.map((v) => Math.log(Math.max(lnA - v, 1e-3)));
  const n = t.length;
  const mt = t.reduce((s, v) => s + v, 0) / n;
  const mz = z.reduce((s, v) => s + v, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (t[i]! - mt) * (z[i]! - mz);
    sxx += (t[i]! - mt) ** 2;
  }
  let k = sxx > 0 ? -sxy / sxx : 0.03;
  if (!(k > 1e-4)) k = 0.03;
  const lnB = mz + k * mt;
  return [lnA, lnB, Math.log(k)];
}

/**
 * Fits the Gompertz curve to weigh-ins on the log scale (growth errors are proportional to weight) by
 * Levenberg–Marquardt, with the mature-weight prior as one extra observation ln A ~ N(ln A₀, ln 1.25²).
 * The spread of the weigh-ins is pooled with the assumed 5 % (see ASSUMED_LOG_SPREAD) and the fit
 * repeated with the pooled spread, so the prior weighs what it should against the farm's own data.
 * Returns null when the fit fails (too few distinct ages, no growth, a singular problem).
 */
export function fitGompertz(points: ReadonlyArray<GrowthPoint>, options: GompertzFitOptions): GompertzFit | null {
  const t = points.map((p) => p.ageDays);
  const y = points.map((p) => Math.log(p.grams));
  if (points.some((p) => !(p.grams > 0) || !(p.ageDays >= 0) || !Number.isFinite(p.ageDays))) return null;
  const distinctAges = new Set(t).size;
  const parameters = 3;
  const priorCount = options.priorMatureGrams ? 1 : 0;
  const residualDf = points.length + priorCount - parameters;
  if (distinctAges < 3 || residualDf < 0 || (residualDf === 0 && !priorCount)) return null;
  const sigma0 = options.assumedLogSpread ?? ASSUMED_LOG_SPREAD;
  const df0 = options.assumedSpreadDf ?? ASSUMED_SPREAD_DF;
  const prior = options.priorMatureGrams
    ? { a0: Math.log(options.priorMatureGrams), sd: Math.log(options.priorFactor ?? MATURE_PRIOR_FACTOR) }
    : null;
  const maxY = Math.max(...y);

  let sigma = sigma0;
  let best: { theta: Theta; cost: number; iterations: number } | null = null;
  let pooled = sigma0;
  let residualSe: number | null = null;
  for (let round = 0; round < 4; round++) {
    const problem: Problem = { t, y, sigma, prior };
    const guesses = prior ? [prior.a0, prior.a0 - 0.3, prior.a0 + 0.3] : [maxY + 0.2, maxY + 0.7, maxY + 1.5];
    best = null;
    for (const g of guesses) {
      const fit = levenbergMarquardt(startFrom(Math.max(g, maxY + 0.02), t, y), problem);
      if (fit && (!best || fit.cost < best.cost)) best = fit;
    }
    if (!best) return null;
    const [lnA, lnB, lnK] = best.theta;
    const ss = t.reduce((s, ti, i) => s + (y[i]! - (lnA - Math.exp(lnB) * Math.exp(-Math.exp(lnK) * ti))) ** 2, 0);
    residualSe = residualDf > 0 ? Math.sqrt(ss / residualDf) : null;
    pooled = Math.sqrt((df0 * sigma0 ** 2 + ss) / (df0 + residualDf));
    if (Math.abs(pooled - sigma) < 1e-6 * sigma) break;
    sigma = pooled;
  }
  if (!best) return null;
  const final = residualsAndJacobian(best.theta, { t, y, sigma: pooled, prior });
  const { JtJ } = normalEquations(final.J, final.r);
  const covariance = invert(JtJ);
  if (!covariance || covariance.some((row) => row.some((v) => !Number.isFinite(v)))) return null;
  const [lnA, lnB, lnK] = best.theta;
  return {
    params: { matureGrams: Math.exp(lnA), b: Math.exp(lnB), k: Math.exp(lnK) },
    covariance,
    logSpread: pooled,
    df: df0 + residualDf,
    residualLogSe: residualSe,
    points: points.length,
    priorMatureGrams: options.priorMatureGrams,
    iterations: best.iterations,
  };
}

/**
 * The age the fitted curve reaches `grams`, with its standard error by the delta method on
 * (ln A, ln b, ln k). null when the curve levels off at or below the target.
 */
export function gompertzAgeAtWithError(grams: number, fit: GompertzFit): { ageDays: number; se: number } | null {
  const { matureGrams, b, k } = fit.params;
  const u = Math.log(matureGrams) - Math.log(grams); // = b·e^(−k·t*)
  if (!(u > 0)) return null;
  const age = (Math.log(b) - Math.log(u)) / k;
  // t* = (ln b − ln u)/k with u = ln A − ln W: ∂t*/∂lnA = −1/(u·k), ∂t*/∂lnb = 1/k, ∂t*/∂lnk = −t*
  const g = [-1 / (u * k), 1 / k, -age];
  let variance = 0;
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) variance += g[i]! * fit.covariance[i]![j]! * g[j]!;
  return { ageDays: age, se: Math.sqrt(Math.max(variance, 0)) };
}
