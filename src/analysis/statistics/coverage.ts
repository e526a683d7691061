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

export function symmetricInterval(sorted: Float64Array, p: number): Interval {
  const m = sorted.length;
  const q = coverageCount(p, m);
  const r = symmetricStartRank(p, m);
  return { low: sorted[r - 1]!, high: sorted[Math.min(m, r + q) - 1]! };
}

export function shortestInterval(sorted: Float64Array, p: number): Interval {
  const m = sorted.length;
  const q = coverageCount(p, m);
  if (q >= m) return { low: sorted[0]!, high: sorted[m - 1]! };
  let best = 1;
  let bestWidth = Infinity;
  for (let r = 1; r + q <= m; r++) {
    const width = sorted[r + q - 1]! - sorted[r - 1]!;
    if (width < bestWidth) {
      bestWidth = width;
      best = r;
    }
  }
  return { low: sorted[best - 1]!, high: sorted[best + q - 1]! };
}

/** Nearest-rank percentile: y_(⌈pct/100·M⌉) (at least the first value). */
export function sortedPercentile(sorted: Float64Array, pct: number): number {
  const m = sorted.length;
  const rank = Math.min(m, Math.max(1, Math.ceil((pct / 100) * m)));
  return sorted[rank - 1]!;
}
