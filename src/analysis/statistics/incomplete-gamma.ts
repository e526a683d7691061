// The regularized lower incomplete gamma function P(a, x), by its series for x < a + 1 and its continued fraction
// (modified Lentz) beyond (Numerical Recipes in C, 2nd ed., Press et al. 1992, §6.2 `gser`, `gcf`, `gammp`).
// ln Γ comes from simple-statistics' `gammaln`. The chi-square distribution is built on it.
import { gammaln } from 'simple-statistics';

const MAX_ITERATIONS = 500;
const EPSILON = 1e-15;
const TINY = 1e-300;

function lowerSeries(a: number, x: number): number {
  let ap = a;
  let sum = 1 / a;
  let del = sum;
  for (let n = 1; n <= MAX_ITERATIONS; n++) {
    ap += 1;
    del *= x / ap;
    sum += del;
    if (Math.abs(del) < Math.abs(sum) * EPSILON) break;
  }
  return sum * Math.exp(-x + a * Math.log(x) - gammaln(a));
}

function upperContinuedFraction(a: number, x: number): number {
  let b = x + 1 - a;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i <= MAX_ITERATIONS; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPSILON) break;
  }
  return Math.exp(-x + a * Math.log(x) - gammaln(a)) * h;
}

/** P(a, x) = γ(a, x)/Γ(a) for a > 0, x ≥ 0. */
export function regularizedGammaP(a: number, x: number): number {
  if (!(a > 0)) throw new RangeError(`regularizedGammaP: a = ${a} must be > 0`);
  if (x <= 0) return 0;
  if (x < a + 1) return lowerSeries(a, x);
  return 1 - upperContinuedFraction(a, x);
}
