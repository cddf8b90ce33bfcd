/**
 * Side-by-side figures per breed or cross (or per doe, per buck): every metric summarized over the units
 * (groups, litters, processing records) that have it. A unit without a figure is left out of that
 * metric only.
 */
export interface MetricSummary {
  n: number;
  mean: number | null;
  /** Sample standard deviation (n − 1); null under two values. */
  sd: number | null;
  min: number | null;
  max: number | null;
}

export interface ComparisonRow<M extends string> {
  key: string;
  units: number;
  metrics: Record<M, MetricSummary>;
}

export function summarizeMetric(values: ReadonlyArray<number>): MetricSummary {
  const finite = values.filter((v) => Number.isFinite(v));
  const n = finite.length;
  if (n === 0) return { n: 0, mean: null, sd: null, min: null, max: null };
  const mean = finite.reduce((s, v) => s + v, 0) / n;
  const sd = n > 1 ? Math.sqrt(finite.reduce((s, v) => s + (v - mean) ** 2, 0) / (n - 1)) : null;
  return { n, mean, sd, min: Math.min(...finite), max: Math.max(...finite) };
}

export function compareByKey<M extends string>(
  units: ReadonlyArray<{ key: string; values: Partial<Record<M, number | null>> }>,
  metrics: ReadonlyArray<M>,
): ComparisonRow<M>[] {
  const byKey = new Map<string, { key: string; values: Partial<Record<M, number | null>> }[]>();
  for (const u of units) {
    const rows = byKey.get(u.key);
    if (rows) rows.push(u);
    else byKey.set(u.key, [u]);
  }
  return [...byKey.entries()]
    .map(([key, rows]) => ({
      key,
      units: rows.length,
      metrics: Object.fromEntries(
        metrics.map((m) => [m, summarizeMetric(rows.map((r) => r.values[m]).filter((v): v is number => typeof v === 'number'))]),
      ) as Record<M, MetricSummary>,
    }))
    .sort((a, b) => a.key.localeCompare(b.key));
}
