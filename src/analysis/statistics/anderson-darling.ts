// Anderson–Darling goodness-of-fit test against a fully specified continuous distribution ("case 0"):
//   A² = −n − (1/n)·Σ_{i=1..n} (2i − 1)·[ln F(x_(i)) + ln(1 − F(x_(n+1−i)))]
// (T. W. Anderson & D. A. Darling, JASA 49, 1954; NIST/SEMATECH e-Handbook 1.3.5.14). Its p-value is the limiting
// distribution's, by the approximation of G. Marsaglia & J. Marsaglia, "Evaluating the Anderson–Darling
// distribution", Journal of Statistical Software 9(2), 2004 (`ADinf`, stated absolute error below about 2e-6;
// the coefficients are from memory of that paper, and the test checks them against Stephens' table of points). M. A. Stephens (JASA 69, 1974, table 1A; also D'Agostino & Stephens,
// Goodness-of-Fit Techniques, 1986, table 4.2) finds the limiting points good for n ≥ 5; with fewer units the
// test has little power and is not run. Small samples in general: a pass says only that the data do not
// contradict the prediction, not that they confirm it.
export interface AndersonDarlingTest {
  statistic: number;
  p: number;
}

/** Smallest n for which the limiting distribution is used (Stephens 1974). */
export const ANDERSON_DARLING_MIN_N = 5;

/** A² from the values of the hypothesised CDF at each observation (any order); F must lie strictly inside (0, 1). */
export function andersonDarlingStatistic(cdfValues: readonly number[]): number {
  const u = [...cdfValues].sort((a, b) => a - b);
  const n = u.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += (2 * i + 1) * (Math.log(u[i]!) + Math.log(1 - u[n - 1 - i]!));
  return -n - sum / n;
}

/** P(A² ≤ z) in the limit n → ∞ (Marsaglia & Marsaglia 2004, ADinf). */
export function andersonDarlingLimitCdf(z: number): number {
  if (z <= 0) return 0;
  if (z < 2) {
    return (Math.exp(-1.2337141 / z) / Math.sqrt(z)) * (2.00012 + (0.247105 - (0.0649821 - (0.0347962 - (0.011672 - 0.00168691 * z) * z) * z) * z) * z);
  }
  return Math.exp(-Math.exp(1.0776 - (2.30695 - (0.43424 - (0.082433 - (0.008056 - 0.0003146 * z) * z) * z) * z) * z));
}

export function andersonDarlingTest(cdfValues: readonly number[]): AndersonDarlingTest {
  const statistic = andersonDarlingStatistic(cdfValues);
  return { statistic, p: Math.min(1, Math.max(0, 1 - andersonDarlingLimitCdf(statistic))) };
}
