// A fine fixed-range histogram that streams (counts add, in any order), and quantiles read from it when the
// samples themselves were not kept. Bin 0 counts values below the range, bin B+1 values above it; the range comes
// from the worst case (widened), so both are normally empty. A quantile read from the histogram lies in the same
// bin as the true order statistic, so its error is at most that bin's width (stated in the result).
import type { Histogram, Interval } from '../result.js';
import { coverageCount, symmetricStartRank } from './coverage.js';

export interface FineHistogram {
  lo: number;
  hi: number;
  /** Inner bins between lo and hi. */
  bins: number;
  /** bins + 2 counts: [below lo, inner bins…, above hi] (a run's totals, or one chunk's own counts). */
  counts: Float64Array | Uint32Array;
  /** Observed extremes, which bound the outer bins. */
  min: number;
  max: number;
}

/** Adds x[0..n) into counts (length bins + 2) of the range [lo, hi). */
export function countInto(counts: Uint32Array | Float64Array, bins: number, lo: number, hi: number, x: Float64Array, n: number): void {
  const scale = bins / (hi - lo);
  for (let j = 0; j < n; j++) {
    const b = Math.floor((x[j]! - lo) * scale);
    counts[b < 0 ? 0 : b >= bins ? bins + 1 : b + 1]!++;
  }
}

/**
 * The bin the chunk runners count v in, with scale = bins / (hi − lo): 0 below the range, bins + 1 above it, else
 * ⌊(v − lo)·scale⌋ + 1 (chunk.ts scanPass, the kernel's reduce). Monotone in v (a subtraction and a product by a
 * positive number round monotonically), so a chunk's values all lie in the bins from its min's to its max's.
 */
export function histogramBin(v: number, lo: number, scale: number, bins: number): number {
  const t = (v - lo) * scale;
  return t < 0 ? 0 : t >= bins ? bins + 1 : (t | 0) + 1;
}

function binEdges(h: FineHistogram, b: number): [number, number] {
  const width = (h.hi - h.lo) / h.bins;
  if (b === 0) return [h.min, h.lo];
  if (b === h.bins + 1) return [h.hi, h.max];
  return [h.lo + (b - 1) * width, h.lo + b * width];
}

/** Cumulative counts: cumulative[b] = values in bins before b (length bins + 3). */
function cumulativeCounts(h: FineHistogram): Float64Array {
  const cumulative = new Float64Array(h.counts.length + 1);
  for (let b = 0; b < h.counts.length; b++) cumulative[b + 1] = cumulative[b]! + h.counts[b]!;
  return cumulative;
}

/** Value of the rank-th smallest sample (1-based), interpolated within its bin (binary search on the cumulative). */
function rankValue(h: FineHistogram, cumulative: Float64Array, rank: number): number {
  let lo = 0;
  let hi = h.counts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (cumulative[mid + 1]! >= rank) hi = mid;
    else lo = mid + 1;
  }
  const c = h.counts[lo]!;
  if (c === 0) return h.max;
  const [a, z] = binEdges(h, lo);
  return a + ((rank - cumulative[lo]! - 0.5) / c) * (z - a);
}

/** Value of the rank-th smallest sample (1-based), interpolated within its bin. */
export function histogramRankValue(h: FineHistogram, rank: number): number {
  return rankValue(h, cumulativeCounts(h), rank);
}

/** Largest error of a quantile read from this histogram: the widest bin that holds any value. */
export function histogramQuantileBound(h: FineHistogram): number {
  let bound = (h.hi - h.lo) / h.bins;
  if (h.counts[0]! > 0) bound = Math.max(bound, h.lo - h.min);
  if (h.counts[h.bins + 1]! > 0) bound = Math.max(bound, h.max - h.hi);
  return bound;
}

export function histogramTotal(h: FineHistogram): number {
  let total = 0;
  for (let b = 0; b < h.counts.length; b++) total += h.counts[b]!;
  return total;
}

/** Probabilistically symmetric interval (JCGM 101:2008 7.7.1) from the histogram. */
export function histogramSymmetricInterval(h: FineHistogram, p: number): Interval {
  const cumulative = cumulativeCounts(h);
  const m = cumulative[cumulative.length - 1]!;
  const q = coverageCount(p, m);
  const r = symmetricStartRank(p, m);
  return { low: rankValue(h, cumulative, r), high: rankValue(h, cumulative, Math.min(m, r + q)) };
}

/**
 * Shortest interval (JCGM 101:2008 7.7.2) from the histogram: for each bin holding the interval's first value,
 * the interval starting at that bin's first rank; each end within one bin of the exact answer.
 */
export function histogramShortestInterval(h: FineHistogram, p: number): Interval {
  const cumulative = cumulativeCounts(h);
  const m = cumulative[cumulative.length - 1]!;
  const q = coverageCount(p, m);
  let best: Interval = { low: h.min, high: h.max };
  let bestWidth = Infinity;
  let before = 0;
  for (let b = 0; b < h.counts.length; b++) {
    const c = h.counts[b]!;
    if (c > 0) {
      const r = before + 1;
      if (r + q > m) break;
      const low = rankValue(h, cumulative, r);
      const high = rankValue(h, cumulative, r + q);
      if (high - low < bestWidth) {
        bestWidth = high - low;
        best = { low, high };
      }
    }
    before += c;
  }
  return best;
}

/** Nearest-rank percentile read from the histogram. */
export function histogramPercentile(h: FineHistogram, pct: number): number {
  const m = histogramTotal(h);
  return histogramRankValue(h, Math.min(m, Math.max(1, Math.ceil((pct / 100) * m))));
}

/** A report-sized histogram: consecutive fine bins grouped into at most `target` bins spanning min..max. */
export function coarseHistogram(h: FineHistogram, target = 60): Histogram {
  const width = (h.hi - h.lo) / h.bins;
  const segments: Array<[number, number, number]> = []; // [from, to, count]
  if (h.counts[0]! > 0) segments.push([h.min, h.lo, h.counts[0]!]);
  let first = -1;
  let last = -1;
  for (let b = 1; b <= h.bins; b++) {
    if (h.counts[b]! > 0) {
      if (first < 0) first = b;
      last = b;
    }
  }
  if (first > 0) {
    const group = Math.max(1, Math.ceil((last - first + 1) / target));
    for (let b = first; b <= last; b += group) {
      const end = Math.min(b + group, last + 1);
      let c = 0;
      for (let i = b; i < end; i++) c += h.counts[i]!;
      segments.push([h.lo + (b - 1) * width, h.lo + (end - 1) * width, c]);
    }
  }
  if (h.counts[h.bins + 1]! > 0) segments.push([h.hi, h.max, h.counts[h.bins + 1]!]);
  if (segments.length === 0) return { edges: [], counts: [] };
  const edges: number[] = [segments[0]![0]];
  const counts: number[] = [];
  for (const [from, to, c] of segments) {
    if (from > edges[edges.length - 1]!) {
      // An empty stretch between the outer bins and the inner ones.
      edges.push(from);
      counts.push(0);
    }
    edges.push(to);
    counts.push(c);
  }
  // The outer edges are the observed extremes (the first and last bins hold them, so this only trims empty space).
  edges[0] = h.min;
  edges[edges.length - 1] = h.max;
  return { edges, counts };
}
