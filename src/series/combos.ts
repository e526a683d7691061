// Two standard resistors in series or in parallel that come closest to a target.
// Exhaustive over a pool of standard values (every value within POOL_DECADES decades of the target), but
// efficient: for each first part a, the partner b is found by binary search, because a + b and a·b/(a + b)
// both rise monotonically with b; the errors then grow monotonically walking outward from that point, so taking
// `count` steps outward on each side gives every pair that can be among the `count` best for that a.
// Cost O(n·(log n + count)) for a pool of n values, against O(n²) for the double loop (kept in the tests).
import { InputError } from '../errors.js';
import { formatEngineering } from '../units/index.js';
import { seriesValuesBetween } from './enumerate.js';
import type { SeriesName } from './load.js';
import { relativeErrorPct } from './relative-error.js';

export type ComboKind = 'series' | 'parallel';

export interface Combination {
  kind: ComboKind;
  /** The two parts in ohms, larger first for series, smaller first for parallel. */
  parts: [number, number];
  /** The combined resistance in ohms. */
  value: number;
  errorPct: number;
}

/**
 * Parts are drawn from within this many decades of the target. A part a thousand times smaller than its partner
 * moves the sum by 0.1 %, below the tolerance of the partner itself: such pairs are not worth ordering
 * (common practice).
 */
export const POOL_DECADES = 3;

/**
 * Orderable resistor values run from about 1 mΩ (metal-strip shunts) to about 1 GΩ (high-voltage thick film):
 * common practice. Series values outside this span are not offered as parts.
 */
export const PART_MIN_OHMS = 1e-3;
export const PART_MAX_OHMS = 1e9;

/** The standard values considered as parts for a target (ascending). */
export function combinationPool(value: number, series: SeriesName | readonly number[]): number[] {
  const lo = Math.max(value / 10 ** POOL_DECADES, PART_MIN_OHMS);
  const hi = Math.min(value * 10 ** POOL_DECADES, PART_MAX_OHMS);
  if (lo > hi) return [];
  if (typeof series === 'string') return seriesValuesBetween(series, lo, hi);
  return series.filter((v) => v >= lo && v <= hi);
}

export function combine(kind: ComboKind, a: number, b: number): number {
  return kind === 'series' ? a + b : (a * b) / (a + b);
}

/** Smallest j in [from, to) with combine(kind, a, pool[j]) ≥ value (to when none). */
function partnerIndex(kind: ComboKind, a: number, pool: readonly number[], from: number, to: number, value: number): number {
  let lo = from;
  let hi = to;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (combine(kind, a, pool[mid] as number) < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

function compareCombos(x: Combination, y: Combination): number {
  return Math.abs(x.errorPct) - Math.abs(y.errorPct) || x.parts[0] - y.parts[0] || x.parts[1] - y.parts[1];
}

/** The `count` best pairs of one kind. Unordered pairs: for series b ≤ a, for parallel b ≥ a. */
export function bestPairs(value: number, pool: readonly number[], kind: ComboKind, count: number): Combination[] {
  const found: Combination[] = [];
  for (let i = 0; i < pool.length; i++) {
    const a = pool[i] as number;
    const from = kind === 'series' ? 0 : i;
    const to = kind === 'series' ? i + 1 : pool.length;
    const j = partnerIndex(kind, a, pool, from, to, value);
    // Walk outward from j on each side: the combined value moves away from the target at every step (combine is
    // monotonic in b), so once a pair is worse than the `count` kept, so is every pair further out on that side.
    for (let k = j; k < Math.min(to, j + count); k++) if (!offer(found, kind, a, pool[k] as number, value, count)) break;
    for (let k = j - 1; k >= Math.max(from, j - count); k--) if (!offer(found, kind, a, pool[k] as number, value, count)) break;
  }
  return found;
}

/** Offers the pair (a, b) to `found`; false when it is worse than all `count` kept (so is any pair further out). */
function offer(found: Combination[], kind: ComboKind, a: number, b: number, value: number, count: number): boolean {
  const combined = combine(kind, a, b);
  const errorPct = relativeErrorPct(combined, value);
  if (found.length === count && Math.abs(errorPct) > Math.abs(found[count - 1]!.errorPct)) return false;
  keepBest(found, { kind, parts: [a, b], value: combined, errorPct }, count);
  return true;
}

/** Inserts `c` into `best` (sorted by compareCombos, at most `count` long) where it belongs, after any equal one: the
 * same `count` as sorting every pair stably and keeping the first `count`, with memory for `count` only. */
function keepBest(best: Combination[], c: Combination, count: number): void {
  if (best.length === count && compareCombos(c, best[count - 1]!) >= 0) return;
  let lo = 0;
  let hi = best.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (compareCombos(best[mid]!, c) <= 0) lo = mid + 1;
    else hi = mid;
  }
  best.splice(lo, 0, c);
  if (best.length > count) best.pop();
}

/**
 * The `count` best series pairs and the `count` best parallel pairs for `value` (ohms), together sorted by
 * |error| (ties: smaller parts first).
 */
export function bestCombinations(value: number, series: SeriesName | readonly number[], count = 3, where = 'value'): Combination[] {
  if (!Number.isFinite(value) || !(value > 0)) {
    throw new InputError(where, `target resistance must be a positive finite number, got ${value}`, 'a resistance > 0');
  }
  if (value < PART_MIN_OHMS || value > PART_MAX_OHMS) {
    throw new InputError(where, `target ${formatEngineering(value, 'Ω')} is outside the span of orderable resistors`, '1 mΩ to 1 GΩ (common practice)');
  }
  if (!Number.isInteger(count) || count < 1) throw new InputError('count', `count must be a whole number ≥ 1, got ${count}`, '1, 2, 3, …');
  const pool = combinationPool(value, series);
  return [...bestPairs(value, pool, 'series', count), ...bestPairs(value, pool, 'parallel', count)].sort(compareCombos);
}
