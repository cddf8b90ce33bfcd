import { addDays, daysBetween } from '../herd/herd-dates';

/**
 * Splits a whole number (grams of feed, cents) into parts proportional to whole-number weights so that
 * the parts add up to the whole exactly: each part gets the floor of its exact quota, and the units left
 * over go one each to the largest remainders (Hamilton's largest-remainder method). The quotas are
 * worked in exact integer arithmetic. Ties go to the larger weight, then to the earlier part.
 */
export function largestRemainder(total: number, weights: ReadonlyArray<number>): number[] {
  if (!Number.isSafeInteger(total) || total < 0) throw new RangeError('The amount to split must be a whole number, 0 or more');
  if (weights.length === 0) throw new RangeError('Nothing to split the amount between');
  for (const w of weights) {
    if (!Number.isSafeInteger(w) || w < 0) throw new RangeError('Each share must be a whole number, 0 or more');
  }
  const sum = weights.reduce((s, w) => s + w, 0);
  if (sum === 0) {
    if (total === 0) return weights.map(() => 0);
    throw new RangeError('All shares are zero: nothing to split the amount by');
  }
  const T = BigInt(total);
  const W = BigInt(sum);
  const parts = weights.map((w, index) => {
    const product = T * BigInt(w);
    return { index, weight: w, floor: product / W, remainder: product % W };
  });
  let left = T - parts.reduce((s, p) => s + p.floor, 0n);
  const order = [...parts].sort((a, b) => (a.remainder === b.remainder ? b.weight - a.weight || a.index - b.index : a.remainder > b.remainder ? -1 : 1));
  for (const p of order) {
    if (left === 0n) break;
    if (p.weight === 0) continue;
    p.floor += 1n;
    left -= 1n;
  }
  return parts.map((p) => Number(p.floor));
}

export interface AllocationShare {
  id: string;
  grams: number;
}

function allocate(totalGrams: number, shares: ReadonlyArray<{ id: string; weight: number }>): AllocationShare[] {
  const parts = largestRemainder(totalGrams, shares.map((s) => s.weight));
  return shares.map((s, i) => ({ id: s.id, grams: parts[i]! }));
}

/** By head-days: a group of 8 for 7 days (56 head-days) gets twice the feed of 4 for 7 days. */
export function allocateByHeadDays(totalGrams: number, groups: ReadonlyArray<{ id: string; headDays: number }>): AllocationShare[] {
  return allocate(totalGrams, groups.map((g) => ({ id: g.id, weight: g.headDays })));
}

/** By live weight (grams on hand): heavier groups eat more. */
export function allocateByLiveWeight(totalGrams: number, groups: ReadonlyArray<{ id: string; liveGrams: number }>): AllocationShare[] {
  return allocate(totalGrams, groups.map((g) => ({ id: g.id, weight: Math.round(g.liveGrams) })));
}

/**
 * Head-days of a group from `from` to `to`, both days counted: the head count set by each change holds
 * from its date on (a change before `from` sets the starting count; none → 0 heads).
 */
export function headDays(from: string, to: string, changes: ReadonlyArray<{ on: string; heads: number }>): number {
  const span = daysBetween(from, to);
  if (span < 0) throw new RangeError('The period ends before it starts');
  for (const c of changes) {
    if (!Number.isInteger(c.heads) || c.heads < 0) throw new RangeError('A head count must be a whole number, 0 or more');
  }
  const sorted = [...changes].sort((a, b) => (a.on < b.on ? -1 : a.on > b.on ? 1 : 0));
  let total = 0;
  let heads = 0;
  let i = 0;
  for (let day = 0; day <= span; day++) {
    const date = addDays(from, day);
    while (i < sorted.length && sorted[i]!.on <= date) heads = sorted[i++]!.heads;
    total += heads;
  }
  return total;
}
