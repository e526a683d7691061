// Binned distribution: what remains of a normal production spread after a tighter grade was sorted out of it.
// Parts are made with spread N(c, σ²) where the wide grade's half-width W = k·σ; parts within ±I of c (the tighter
// grade, I = innerFraction·W) were sold as that grade, and parts beyond ±W were tested out. What this grade's
// buyer gets is N(c, σ²) restricted to [c−W, c−I] ∪ [c+I, c+W]: a two-humped distribution with a hole in the
// middle. This happens when the tighter grade is sorted from the same production: common practice (not every
// maker bins; many run grades as separate processes, for which a plain normal or uniform is the right choice).
// Drawn by inverse CDF over the two pieces of [Φ(−W/σ), Φ(W/σ)]: one uniform per draw.
// Variance about c (mean c by symmetry): σ²·[1 + (a·φ(a) − b·φ(b))/(Φ(b) − Φ(a))] with a = I/σ, b = W/σ
// (second moment of a normal truncated to [a, b]; Johnson, Kotz & Balakrishnan §10.1).
import type { UniformSource } from '../uniform-source.js';
import { clampInPlace, normalCdf, normalPdf, normalQuantilesInPlace } from './normal.js';

export function fillBinned(out: Float64Array, n: number, center: number, sigma: number, inner: number, outer: number, random: UniformSource): void {
  for (let j = 0; j < n; j++) out[j] = random();
  binnedFromUnit(out, n, center, sigma, inner, outer);
}

/** In place: uniforms u in [0, 1) → the binned distribution's inverse CDF over its two pieces. */
export function binnedFromUnit(buf: Float64Array, n: number, center: number, sigma: number, inner: number, outer: number): void {
  const a = inner / sigma;
  const b = outer / sigma;
  const lowStart = normalCdf(-b);
  const pieceMass = normalCdf(-a) - lowStart; // mass of each piece (they are mirror images)
  const highStart = normalCdf(a);
  const lo = center - outer;
  const hi = center + outer;
  probabilities(buf, n, lowStart, pieceMass, highStart);
  normalQuantilesInPlace(buf, n, center, sigma);
  clampInPlace(buf, n, lo, hi);
}

/** u → the probability on the low or the high piece, in place (its own function: see normalQuantilesInPlace). */
function probabilities(buf: Float64Array, n: number, lowStart: number, pieceMass: number, highStart: number): void {
  for (let j = 0; j < n; j++) {
    const v = 2 * pieceMass * buf[j]!;
    buf[j] = v < pieceMass ? lowStart + v : highStart + (v - pieceMass);
  }
}

export function binnedSigma(sigma: number, inner: number, outer: number): number {
  const a = inner / sigma;
  const b = outer / sigma;
  return sigma * Math.sqrt(1 + (a * normalPdf(a) - b * normalPdf(b)) / (normalCdf(b) - normalCdf(a)));
}
