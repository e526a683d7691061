// Student's t distribution with ν degrees of freedom: CDF through the incomplete beta function,
//   P(T ≤ t) = 1 − I_{ν/(ν+t²)}(ν/2, 1/2)/2 for t ≥ 0 (Abramowitz & Stegun 26.7.1 with 26.5.27; Numerical Recipes
// §6.4), and its quantile by inverting the CDF. Used for the mean's confidence interval and the one-sample t test
// (NIST/SEMATECH e-Handbook of Statistical Methods 1.3.5.2 and 7.2.2). simple-statistics has a t statistic
// (`tTest`) but no t distribution, so the distribution is computed here.
import { regularizedBeta } from './incomplete-beta.js';
import { invertCdf } from './invert-cdf.js';

export function studentTCdf(t: number, df: number): number {
  if (!(df > 0)) throw new RangeError(`studentTCdf: ${df} degrees of freedom`);
  const tail = regularizedBeta(df / (df + t * t), df / 2, 0.5) / 2;
  return t >= 0 ? 1 - tail : tail;
}

/** The p-quantile t_{p,ν}. */
export function studentTQuantile(p: number, df: number): number {
  return invertCdf((t) => studentTCdf(t, df), p, -10, 10);
}

/** Two-sided p-value of a t statistic, 2·P(T ≥ |t|). */
export function studentTTwoSidedP(t: number, df: number): number {
  return regularizedBeta(df / (df + t * t), df / 2, 0.5);
}
