/**
 * The little numerics the growth model needs, written out so the shared package stays free of
 * dependencies: the Student t quantile (through the regularized incomplete beta function, the continued
 * fraction evaluated by the modified Lentz method) and Gaussian elimination for small dense systems.
 */

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** ln Γ(x) for x > 0 (Lanczos approximation, g = 7). */
export function lnGamma(x: number): number {
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - lnGamma(1 - x);
  const z = x - 1;
  let sum = LANCZOS[0]!;
  for (let i = 1; i < LANCZOS.length; i++) sum += LANCZOS[i]! / (z + i);
  const t = z + 7.5;
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(sum);
}

function betaContinuedFraction(a: number, b: number, x: number): number {
  const tiny = 1e-300;
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 500; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-15) break;
  }
  return h;
}

/** The regularized incomplete beta function I_x(a, b). */
export function incompleteBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const front = Math.exp(lnGamma(a + b) - lnGamma(a) - lnGamma(b) + a * Math.log(x) + b * Math.log(1 - x));
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(a, b, x)) / a;
  return 1 - (front * betaContinuedFraction(b, a, 1 - x)) / b;
}

/** P(T ≤ t) for Student's t with `df` degrees of freedom. */
export function studentTCdf(t: number, df: number): number {
  const tail = 0.5 * incompleteBeta(df / (df + t * t), df / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/** The p-quantile of Student's t (p in (0, 1)), by bisection on the CDF to 1e-10. */
export function studentTQuantile(p: number, df: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError('p must lie between 0 and 1');
  if (!(df > 0)) throw new RangeError('Degrees of freedom must be positive');
  if (p === 0.5) return 0;
  if (p < 0.5) return -studentTQuantile(1 - p, df);
  let lo = 0;
  let hi = 1;
  while (studentTCdf(hi, df) < p) hi *= 2;
  for (let i = 0; i < 200 && hi - lo > 1e-10; i++) {
    const mid = (lo + hi) / 2;
    if (studentTCdf(mid, df) < p) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/** Solves A·x = b for a small dense matrix (Gaussian elimination with partial pivoting); null when singular. */
export function solveLinear(matrix: ReadonlyArray<ReadonlyArray<number>>, rhs: ReadonlyArray<number>): number[] | null {
  const n = rhs.length;
  const a = matrix.map((row, i) => [...row, rhs[i]!]);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(a[r]![col]!) > Math.abs(a[pivot]![col]!)) pivot = r;
    const scale = Math.max(...a.map((row) => Math.abs(row[col]!)), 1e-300);
    if (Math.abs(a[pivot]![col]!) <= 1e-14 * scale) return null;
    [a[col], a[pivot]] = [a[pivot]!, a[col]!];
    const pivotRow = a[col]!;
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const row = a[r]!;
      const factor = row[col]! / pivotRow[col]!;
      if (factor === 0) continue;
      for (let c = col; c <= n; c++) row[c] = row[c]! - factor * pivotRow[c]!;
    }
  }
  return a.map((row, i) => row[n]! / row[i]!);
}

/** The inverse of a small dense matrix, null when singular. */
export function invert(matrix: ReadonlyArray<ReadonlyArray<number>>): number[][] | null {
  const n = matrix.length;
  const columns: number[][] = [];
  for (let j = 0; j < n; j++) {
    const unit = Array.from({ length: n }, (_, i) => (i === j ? 1 : 0));
    const column = solveLinear(matrix, unit);
    if (!column) return null;
    columns.push(column);
  }
  return Array.from({ length: n }, (_, i) => columns.map((column) => column[i]!));
}
