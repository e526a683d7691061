// Streaming mean and variance: each chunk's moments by the corrected two-pass formula, chunks merged in order by
// the pairwise update of Chan, Golub & LeVeque ("Updating formulae and a pairwise algorithm for computing sample
// variances", Stanford STAN-CS-79-773, 1979; and "Algorithms for computing the sample variance: analysis and
// recommendations", The American Statistician 37(3), 1983). Merging in a fixed order makes the result bit-identical
// whatever the number of workers that computed the chunks.

export interface Moments {
  n: number;
  mean: number;
  /** Sum of squared deviations from the mean, Σ(x − mean)². */
  m2: number;
}

/** Moments of x[0..n) by the corrected two-pass algorithm (Chan, Golub & LeVeque 1983, eq. 1.7). */
export function chunkMoments(x: Float64Array, n: number): Moments {
  if (n === 0) return { n: 0, mean: 0, m2: 0 };
  let sum = 0;
  for (let j = 0; j < n; j++) sum += x[j]!;
  const mean = sum / n;
  let sq = 0;
  let dev = 0;
  for (let j = 0; j < n; j++) {
    const d = x[j]! - mean;
    sq += d * d;
    dev += d;
  }
  return { n, mean, m2: Math.max(0, sq - (dev * dev) / n) };
}

/** Merges b into a (Chan, Golub & LeVeque 1979): δ = mean_b − mean_a, M2 = M2_a + M2_b + δ²·n_a·n_b/n. */
export function mergeMoments(a: Moments, b: Moments): Moments {
  if (b.n === 0) return a;
  if (a.n === 0) return { n: b.n, mean: b.mean, m2: b.m2 };
  const n = a.n + b.n;
  const delta = b.mean - a.mean;
  return { n, mean: a.mean + (delta * b.n) / n, m2: a.m2 + b.m2 + (delta * delta * a.n * b.n) / n };
}

/** Sample standard deviation, √(M2/(n − 1)) (0 for fewer than two values). */
export function momentsSigma(m: Moments): number {
  return m.n > 1 ? Math.sqrt(m.m2 / (m.n - 1)) : 0;
}
