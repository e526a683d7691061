// Coverage intervals and quantiles from the sorted Monte Carlo values (JCGM 101:2008, 7.7).
// With M values sorted ascending, y_(1) ≤ … ≤ y_(M), and coverage probability p:
//   q = pM if pM is an integer, otherwise int(pM + 1/2);
//   probabilistically symmetric interval (7.7.1): [y_(r), y_(r+q)] with r = (M − q)/2 if that is an integer,
//   otherwise int((M − q + 1)/2);
//   shortest interval (7.7.2): the r* that minimises y_(r+q) − y_(r) over r = 1 … M − q.
import type { Interval } from '../result.js';

/** q of JCGM 101:2008 7.7.1: the number of values a 100p % interval spans. */
export function coverageCount(p: number, m: number): number {
  const pm = p * m;
  return Number.isInteger(pm) ? pm : Math.floor(pm + 0.5);
}

/** r (1-based) of the probabilistically symmetric interval, JCGM 101:2008 7.7.1. */
export function symmetricStartRank(p: number, m: number): number {
  const q = coverageCount(p, m);
  const half = (m - q) / 2;
  return Math.max(1, Number.isInteger(half) ? half : Math.floor((m - q + 1) / 2));
}

/** The k-th smallest of M values (1-based), however they are stored. */
export type OrderStatistic = (rank: number) => number;

export function symmetricIntervalOf(y: OrderStatistic, m: number, p: number): Interval {
  const q = coverageCount(p, m);
  const r = symmetricStartRank(p, m);
  return { low: y(r), high: y(Math.min(m, r + q)) };
}

export function shortestIntervalOf(y: OrderStatistic, m: number, p: number): Interval {
  const q = coverageCount(p, m);
  if (q >= m) return { low: y(1), high: y(m) };
  let best = 1;
  let bestWidth = Infinity;
  for (let r = 1; r + q <= m; r++) {
    const width = y(r + q) - y(r);
    if (width < bestWidth) {
      bestWidth = width;
      best = r;
    }
  }
  return { low: y(best), high: y(best + q) };
}

export function symmetricInterval(sorted: Float64Array, p: number): Interval {
  return symmetricIntervalOf((r) => sorted[r - 1]!, sorted.length, p);
}

export function shortestInterval(sorted: Float64Array, p: number): Interval {
  return shortestIntervalOf((r) => sorted[r - 1]!, sorted.length, p);
}

/** Nearest rank of a percentile: ⌈pct/100·M⌉, at least 1. */
export function nearestRank(pct: number, m: number): number {
  return Math.min(m, Math.max(1, Math.ceil((pct / 100) * m)));
}

/** Nearest-rank percentile: y_(⌈pct/100·M⌉). */
export function sortedPercentile(sorted: Float64Array, pct: number): number {
  return sorted[nearestRank(pct, sorted.length) - 1]!;
}
