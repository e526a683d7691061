// Normal distribution N(μ, σ²) cut off to [lo, hi], drawn by inverse CDF over [Φ(α), Φ(β)]: one uniform per draw.
// Moments of the truncated normal (Johnson, Kotz & Balakrishnan, Continuous Univariate Distributions vol. 1,
// 2nd ed., §10.1): with α = (lo−μ)/σ, β = (hi−μ)/σ, Z = Φ(β) − Φ(α),
//   mean = μ + σ·(φ(α) − φ(β))/Z,   var = σ²·[1 + (α·φ(α) − β·φ(β))/Z − ((φ(α) − φ(β))/Z)²].
import type { UniformSource } from '../uniform-source.js';
import { clampInPlace, normalCdf, normalPdf, normalQuantilesInPlace } from './normal.js';

/** In place: uniforms u in [0, 1) → μ + σ·Φ⁻¹(Φ(α) + u·(Φ(β) − Φ(α))), kept inside [lo, hi]. */
export function truncatedNormalFromUnit(buf: Float64Array, n: number, mean: number, sigma: number, lo: number, hi: number): void {
  const pLo = normalCdf((lo - mean) / sigma);
  const span = normalCdf((hi - mean) / sigma) - pLo;
  probabilities(buf, n, pLo, span);
  normalQuantilesInPlace(buf, n, mean, sigma);
  // The two approximations (Φ and Φ⁻¹) can land a hair outside the band; clamp to keep the cut-off exact.
  clampInPlace(buf, n, lo, hi);
}

/** u → Φ(α) + u·(Φ(β) − Φ(α)), in place (its own function: see normalQuantilesInPlace). */
function probabilities(buf: Float64Array, n: number, pLo: number, span: number): void {
  for (let j = 0; j < n; j++) buf[j] = pLo + span * buf[j]!;
}

export function fillTruncatedNormal(out: Float64Array, n: number, mean: number, sigma: number, lo: number, hi: number, random: UniformSource): void {
  for (let j = 0; j < n; j++) out[j] = random();
  truncatedNormalFromUnit(out, n, mean, sigma, lo, hi);
}

export function truncatedNormalMean(mean: number, sigma: number, lo: number, hi: number): number {
  const a = (lo - mean) / sigma;
  const b = (hi - mean) / sigma;
  const z = normalCdf(b) - normalCdf(a);
  return mean + (sigma * (normalPdf(a) - normalPdf(b))) / z;
}

export function truncatedNormalSigma(mean: number, sigma: number, lo: number, hi: number): number {
  const a = (lo - mean) / sigma;
  const b = (hi - mean) / sigma;
  const z = normalCdf(b) - normalCdf(a);
  const d = (normalPdf(a) - normalPdf(b)) / z;
  return sigma * Math.sqrt(1 + (a * normalPdf(a) - b * normalPdf(b)) / z - d * d);
}
