// Two-sided normal tolerance interval x̄ ± k·s that covers at least a proportion p of the population with confidence
// γ, with k by Howe's approximation (W. G. Howe, JASA 64, 1969; NIST/SEMATECH e-Handbook 7.2.6.3):
//   k = √( (n − 1)·(1 + 1/n)·z²_{(1−p)/2} / χ²_{1−γ, n−1} )     (χ² the lower 1 − γ point)
// Howe's k is within about 1 % of the exact factor for n ≥ 5 at the usual p and γ (compared with the exact factors of
// ISO 16269-6:2014's annex tables, from memory; the test checks four of them).
import { inverseNormalCdf } from '../../tolerance/distributions/normal.js';
import { chiSquareQuantile } from './chi-square.js';

export function twoSidedToleranceFactor(n: number, coverage: number, confidence: number): number {
  const z = inverseNormalCdf((1 + coverage) / 2);
  return Math.sqrt(((n - 1) * (1 + 1 / n) * z * z) / chiSquareQuantile(1 - confidence, n - 1));
}

/**
 * The largest coverage p such that x̄ ± k(n, p, γ)·s lies inside [lo, hi]: the yield a sample supports at confidence
 * γ. 0 when the mean lies outside the window. Found by bisection (k grows with p).
 */
export function supportedCoverage(mean: number, sigma: number, n: number, window: [number, number], confidence: number): number {
  const room = Math.min(mean - window[0], window[1] - mean);
  if (!(room > 0)) return 0;
  if (!(sigma > 0)) return 1;
  let lo = 0;
  let hi = 1 - 1e-12;
  if (twoSidedToleranceFactor(n, hi, confidence) * sigma <= room) return hi;
  for (let i = 0; i < 100; i++) {
    const mid = (lo + hi) / 2;
    if (twoSidedToleranceFactor(n, mid, confidence) * sigma <= room) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * Units needed so that, with the same mean and σ measured, the tolerance interval for `coverage` fits the window:
 * the smallest n with k(n)·s ≤ room; null when even n → ∞ (k → z_{(1+p)/2}) does not fit.
 */
export function unitsNeededForCoverage(mean: number, sigma: number, window: [number, number], coverage: number, confidence: number, maxUnits = 100_000): number | null {
  const room = Math.min(mean - window[0], window[1] - mean);
  if (!(room > 0)) return null;
  if (!(sigma > 0)) return 2;
  if (inverseNormalCdf((1 + coverage) / 2) * sigma >= room) return null;
  let lo = 2;
  let hi = maxUnits;
  if (twoSidedToleranceFactor(hi, coverage, confidence) * sigma > room) return null;
  while (lo < hi) {
    const mid = Math.floor((lo + hi) / 2);
    if (twoSidedToleranceFactor(mid, coverage, confidence) * sigma <= room) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}
