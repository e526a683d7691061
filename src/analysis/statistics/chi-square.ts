// The chi-square distribution with ν degrees of freedom: CDF P(ν/2, x/2) through the regularized incomplete gamma
// function (Abramowitz & Stegun 26.4.19; Numerical Recipes §6.2), and its quantile by inverting the CDF. Used for the
// confidence interval of σ (NIST/SEMATECH e-Handbook 1.3.5.8 and 7.2.3) and Howe's tolerance factor. simple-statistics
// has a printed table of upper points (`chiSquaredDistributionTable`, two decimals) but no CDF; the test checks this
// file against that table.
import { regularizedGammaP } from './incomplete-gamma.js';
import { invertCdf } from './invert-cdf.js';

export function chiSquareCdf(x: number, df: number): number {
  if (!(df > 0)) throw new RangeError(`chiSquareCdf: ${df} degrees of freedom`);
  return x <= 0 ? 0 : regularizedGammaP(df / 2, x / 2);
}

/** The p-quantile χ²_{p,ν} (lower tail p). */
export function chiSquareQuantile(p: number, df: number): number {
  return invertCdf((x) => chiSquareCdf(x, df), p, 0, Math.max(1, 2 * df), 0);
}
