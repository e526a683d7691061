// Grubbs' test for one outlier, two-sided (F. E. Grubbs, Technometrics 11, 1969; NIST/SEMATECH e-Handbook 1.3.5.17):
//   G = max |x_i − x̄|/s,  reject at level α when G > ((n − 1)/√n)·√(t²/(n − 2 + t²)),  t = t_{α/(2n), n−2}.
// It assumes the rest of the data are normal, and tests the single most extreme value.
import { studentTQuantile } from './student-t.js';

export interface GrubbsTest {
  /** Index (in the input order) of the value furthest from the mean. */
  index: number;
  statistic: number;
  critical: number;
  alpha: number;
  outlier: boolean;
}

export const GRUBBS_MIN_N = 3;

export function grubbsCritical(n: number, alpha: number): number {
  const t = studentTQuantile(alpha / (2 * n), n - 2);
  return ((n - 1) / Math.sqrt(n)) * Math.sqrt((t * t) / (n - 2 + t * t));
}

export function grubbsTest(values: readonly number[], mean: number, sigma: number, alpha = 0.05): GrubbsTest {
  let index = 0;
  for (let i = 1; i < values.length; i++) if (Math.abs(values[i]! - mean) > Math.abs(values[index]! - mean)) index = i;
  const statistic = sigma > 0 ? Math.abs(values[index]! - mean) / sigma : 0;
  const critical = grubbsCritical(values.length, alpha);
  return { index, statistic, critical, alpha, outlier: statistic > critical };
}
