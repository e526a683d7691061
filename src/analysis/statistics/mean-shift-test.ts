// One-sample t test of a measured mean against a predicted one (NIST/SEMATECH e-Handbook 7.2.2 and 1.3.5.2):
//   t = (x̄ − μ₀)/(s/√n) with n − 1 degrees of freedom, two-sided p = 2·P(T ≥ |t|).
// s is the measured σ, so the test of the mean does not assume the predicted spread is right (that is the spread
// test's question).
import { studentTTwoSidedP } from './student-t.js';

export interface MeanShiftTest {
  /** x̄ − μ₀. */
  shift: number;
  t: number;
  degreesOfFreedom: number;
  p: number;
}

export function meanShiftTest(mean: number, sigma: number, n: number, predictedMean: number): MeanShiftTest {
  const shift = mean - predictedMean;
  if (!(sigma > 0)) return { shift, t: 0, degreesOfFreedom: n - 1, p: shift === 0 ? 1 : 0 };
  const t = shift / (sigma / Math.sqrt(n));
  return { shift, t, degreesOfFreedom: n - 1, p: studentTTwoSidedP(t, n - 1) };
}
