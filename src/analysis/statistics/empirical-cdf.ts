// The distribution function of a large sample (the Monte Carlo trials) at a point: the mid-rank
// (count below + count at or below)/(2N), kept inside [1/(2N), 1 − 1/(2N)] so that a point beyond every trial still
// has a finite logarithm (the Anderson–Darling statistic takes ln F and ln(1 − F)).

/** `sorted` ascending. */
export function empiricalCdf(sorted: Float64Array, x: number): number {
  const n = sorted.length;
  let below = 0; // first index with sorted[index] ≥ x (binary search)
  let hi = n;
  while (below < hi) {
    const mid = (below + hi) >>> 1;
    if (sorted[mid]! < x) below = mid + 1;
    else hi = mid;
  }
  let atOrBelow = below;
  while (atOrBelow < n && sorted[atOrBelow]! <= x) atOrBelow++;
  const f = (below + atOrBelow) / (2 * n);
  return Math.min(1 - 0.5 / n, Math.max(0.5 / n, f));
}

/** Kurtosis E(x − μ)⁴/σ⁴ of a sample (population moments: the sample is the Monte Carlo distribution itself). */
export function kurtosisOf(values: Float64Array): number {
  const n = values.length;
  let sum = 0;
  for (let j = 0; j < n; j++) sum += values[j]!;
  const mean = sum / n;
  let m2 = 0;
  let m4 = 0;
  for (let j = 0; j < n; j++) {
    const d = (values[j]! - mean) * (values[j]! - mean);
    m2 += d;
    m4 += d * d;
  }
  m2 /= n;
  m4 /= n;
  return m2 > 0 ? m4 / (m2 * m2) : 3;
}
