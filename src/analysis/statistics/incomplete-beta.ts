// The regularized incomplete beta function I_x(a, b), by its continued fraction evaluated with the modified Lentz
// method (Numerical Recipes in C, 2nd ed., Press et al. 1992, §6.4 `betai` and `betacf`). ln Γ comes from
// simple-statistics' `gammaln` (Lanczos approximation). The Student t distribution is built on it.
import { gammaln } from 'simple-statistics';

const MAX_ITERATIONS = 300;
const EPSILON = 1e-15;
const TINY = 1e-300;

/** Continued fraction for I_x(a, b) (Numerical Recipes §6.4, `betacf`), modified Lentz. */
function betaContinuedFraction(x: number, a: number, b: number): number {
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= MAX_ITERATIONS; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPSILON) break;
  }
  return h;
}

/** I_x(a, b) for 0 ≤ x ≤ 1, a, b > 0. */
export function regularizedBeta(x: number, a: number, b: number): number {
  if (!(a > 0) || !(b > 0)) throw new RangeError(`regularizedBeta: a = ${a}, b = ${b} must be > 0`);
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const front = Math.exp(gammaln(a + b) - gammaln(a) - gammaln(b) + a * Math.log(x) + b * Math.log(1 - x));
  // The continued fraction converges fast for x < (a + 1)/(a + b + 2); use the symmetry I_x(a,b) = 1 − I_{1−x}(b,a) beyond.
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(x, a, b)) / a;
  return 1 - (front * betaContinuedFraction(1 - x, b, a)) / b;
}
