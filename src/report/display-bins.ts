// Groups a fine histogram's bins into at most `maxBins` display bins by summing runs of `factor` adjacent bins.
// Only counts are added: no value is re-estimated, and the total count is unchanged.
import type { Histogram } from '../analysis/result.js';

export interface DisplayBin {
  low: number;
  high: number;
  count: number;
}

/** Adjacent fine bins per display bin: the smallest whole factor giving at most maxBins bins. */
export function groupingFactor(fineBins: number, maxBins: number): number {
  return Math.max(1, Math.ceil(fineBins / Math.max(1, maxBins)));
}

export function displayBins(histogram: Histogram, maxBins: number): DisplayBin[] {
  const n = histogram.counts.length;
  const factor = groupingFactor(n, maxBins);
  const bins: DisplayBin[] = [];
  for (let start = 0; start < n; start += factor) {
    const end = Math.min(n, start + factor);
    let count = 0;
    for (let i = start; i < end; i += 1) count += histogram.counts[i];
    bins.push({ low: histogram.edges[start], high: histogram.edges[end], count });
  }
  return bins;
}
