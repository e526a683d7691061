// Wilson score interval for a binomial proportion (E. B. Wilson, "Probable inference, the law of succession, and
// statistical inference", JASA 22, 1927; also NIST/SEMATECH e-Handbook 7.2.4.1):
//   centre = (p̂ + z²/2n)/(1 + z²/n),  half-width = z·√(p̂(1−p̂)/n + z²/4n²)/(1 + z²/n).
import type { Interval } from '../result.js';

/** z for a two-sided 95 % interval, Φ⁻¹(0.975) (standard normal tables). */
export const Z95 = 1.959963984540054;

export function wilsonInterval(successes: number, n: number, z = Z95): Interval {
  if (n <= 0) return { low: 0, high: 1 };
  const p = successes / n;
  const z2 = z * z;
  const denominator = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denominator;
  const half = (z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))) / denominator;
  return { low: Math.max(0, centre - half), high: Math.min(1, centre + half) };
}
