// Confidence interval of Cpk estimated from a sample, by Bissell's normal approximation (A. F. Bissell, "How reliable
// is your capability index?", Applied Statistics 39(3), 1990; quoted in NIST/SEMATECH e-Handbook 6.1.6):
//   Cpk ± z_{1−α/2}·√(1/(9n) + Cpk²/(2(n − 1))).
import { inverseNormalCdf } from '../../tolerance/distributions/normal.js';
import type { Interval } from '../result.js';

export function cpkInterval(cpk: number, n: number, confidence = 0.95): Interval {
  const z = inverseNormalCdf(1 - (1 - confidence) / 2);
  const half = z * Math.sqrt(1 / (9 * n) + (cpk * cpk) / (2 * (n - 1)));
  return { low: cpk - half, high: cpk + half };
}
