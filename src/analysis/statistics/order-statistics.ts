// Exact order statistics without sorting every value: the fine histogram says which bins hold the ranks wanted,
// so only the values in those bins are gathered and sorted. Coverage intervals need only the two tails (the
// symmetric and shortest 100p % intervals start at ranks 1 … M − q and end at ranks q + 1 … M, JCGM 101:2008 7.7),
// so a 95 % interval sorts about 10 % of the values, and a middle percentile sorts one bin.
import type { FineHistogram } from './histogram.js';

/** A run of consecutive ranks, first..last (1-based), with their values ascending. */
interface RankRun {
  first: number;
  last: number;
  values: Float64Array;
}

export class OrderStatistics {
  private readonly runs: RankRun[] = [];

  /**
   * @param chunks the values, in any order and split into any pieces (their total must match the histogram's)
   * @param h the fine histogram of exactly these values
   * @param rankRanges the ranks to make available: [first, last] pairs, 1-based, inclusive
   */
  constructor(chunks: Float64Array[], h: FineHistogram, rankRanges: Array<[number, number]>) {
    const bins = h.bins;
    const scale = bins / (h.hi - h.lo);
    const cumulative = new Float64Array(bins + 3); // cumulative[b] = values in bins < b
    for (let b = 0; b < bins + 2; b++) cumulative[b + 1] = cumulative[b]! + h.counts[b]!;
    const binOfRank = (rank: number): number => {
      let lo = 0;
      let hi = bins + 1;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (cumulative[mid + 1]! >= rank) hi = mid;
        else lo = mid + 1;
      }
      return lo;
    };
    // Bin ranges to gather, merged where they overlap.
    const wanted = rankRanges
      .map(([a, b]) => [binOfRank(a), binOfRank(b)] as [number, number])
      .sort((x, y) => x[0] - y[0]);
    const merged: Array<[number, number]> = [];
    for (const [a, b] of wanted) {
      const last = merged[merged.length - 1];
      if (last && a <= last[1] + 1) last[1] = Math.max(last[1], b);
      else merged.push([a, b]);
    }
    // Which gather run (if any) each bin belongs to.
    const runOfBin = new Int32Array(bins + 2).fill(-1);
    merged.forEach(([a, b], i) => runOfBin.fill(i, a, b + 1));
    const buffers = merged.map(([a, b]) => new Float64Array(cumulative[b + 1]! - cumulative[a]!));
    const fill = new Int32Array(merged.length);
    for (const x of chunks) {
      for (let j = 0; j < x.length; j++) {
        const v = x[j]!;
        const raw = Math.floor((v - h.lo) * scale); // the same bin formula as countInto
        const run = runOfBin[raw < 0 ? 0 : raw >= bins ? bins + 1 : raw + 1]!;
        if (run >= 0) buffers[run]![fill[run]!++] = v;
      }
    }
    merged.forEach(([a, b], i) => {
      const values = buffers[i]!.sort();
      this.runs.push({ first: cumulative[a]! + 1, last: cumulative[b + 1]!, values });
    });
  }

  /** The rank-th smallest value (1-based); the rank must lie in one of the ranges asked for. */
  at(rank: number): number {
    for (const run of this.runs) if (rank >= run.first && rank <= run.last) return run.values[rank - run.first]!;
    throw new Error(`rank ${rank} was not gathered`);
  }
}
