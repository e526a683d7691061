// Test of a measured variance against a predicted one, allowing for the predicted distribution's shape.
// For a normal population (n − 1)s²/σ₀² is χ² with n − 1 degrees of freedom (NIST/SEMATECH e-Handbook 1.3.5.8). A
// supply's output is often far from normal (a reference's flat band dominates), and then the variance of s² is
//   Var(s²) = σ⁴·(2/(n − 1) + (κ − 3)/n)        κ = E(x − μ)⁴/σ⁴, the kurtosis
// (H. Cramér, Mathematical Methods of Statistics, 1946, §27.4; from memory for the section), so the plain χ² test
// rejects far too rarely for a flat distribution (κ = 1.8) and too often for a peaked one. The statistic is instead
// referred to a scaled chi-square c·χ²_d whose mean and variance match those two moments (Satterthwaite's
// moment-matching, Biometrics Bulletin 2(6), 1946; used for the variance test by G. E. P. Box, Biometrika 40, 1953):
//   c·d = n − 1,   2c²d = (n − 1)²·(2/(n − 1) + (κ − 3)/n).
// With κ = 3 this is the plain χ² test. Two-sided p = 2·min(P(X ≤ x), P(X ≥ x)).
import { chiSquareCdf } from './chi-square.js';

export interface VarianceRatioTest {
  /** s²/σ₀². */
  ratio: number;
  /** Kurtosis of the predicted distribution used for the reference distribution. */
  kurtosis: number;
  /** Degrees of freedom d of the scaled chi-square. */
  degreesOfFreedom: number;
  p: number;
}

export function varianceRatioTest(sigma: number, n: number, predictedSigma: number, kurtosis: number): VarianceRatioTest {
  const ratio = (sigma * sigma) / (predictedSigma * predictedSigma);
  const relativeVariance = 2 / (n - 1) + (kurtosis - 3) / n; // Var(s²)/σ⁴, > 0 for any distribution when n ≥ 2
  const c = ((n - 1) * relativeVariance) / 2;
  const d = (n - 1) / c;
  const x = ((n - 1) * ratio) / c;
  const lower = chiSquareCdf(x, d);
  return { ratio, kurtosis, degreesOfFreedom: d, p: Math.min(1, 2 * Math.min(lower, 1 - lower)) };
}
