// The quantile of a continuous distribution from its CDF: bisection on a bracket that is widened until it holds the
// probability. Slow next to a closed form (about 100 CDF calls) but safe for any monotone CDF; used for the Student t
// and chi-square quantiles, which a pilot study needs a handful of times.

/** x with cdf(x) = p, for a non-decreasing cdf; `lo`, `hi` a first guess at a bracket (widened as needed). */
export function invertCdf(cdf: (x: number) => number, p: number, lo: number, hi: number, floor = -Infinity): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`invertCdf: p = ${p} must lie strictly between 0 and 1`);
  let a = lo;
  let b = hi;
  for (let i = 0; i < 200 && cdf(a) > p; i++) a = Math.max(floor, a - 2 * (b - a));
  for (let i = 0; i < 200 && cdf(b) < p; i++) b += 2 * (b - a);
  for (let i = 0; i < 200; i++) {
    const mid = (a + b) / 2;
    if (mid === a || mid === b) break;
    if (cdf(mid) < p) a = mid;
    else b = mid;
  }
  return (a + b) / 2;
}
