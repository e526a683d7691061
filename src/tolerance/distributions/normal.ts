// Normal (Gaussian) distribution, drawn by the inverse-CDF method: x = μ + σ·Φ⁻¹(u).
//
// Why inverse CDF rather than Box–Muller: it uses exactly one uniform per draw, so each part consumes a fixed,
// known stretch of its chunk's stream (no pairs, no rejection), and the same function serves the truncated and
// binned distributions (Φ⁻¹ over a sub-range of [0, 1)). Its cost here is a rational function in the central
// 95 % and one log + sqrt in the tails, comparable to Box–Muller's log, sqrt and sin/cos.
//
// Φ⁻¹: Peter J. Acklam's rational approximation (2003, "An algorithm for computing the inverse normal cumulative
// distribution function"), relative error below 1.15e-9 over (0, 1). Coefficients as published by Acklam.
// Φ: via erfc from Numerical Recipes in C, 2nd ed. (Press et al. 1992), §6.2 `erfcc`, fractional error below
// 1.2e-7 everywhere; used only for the per-part cut-off masses of the truncated and binned distributions.
// The tails' logarithm is exactLog (../exact-log.ts), the one the WebAssembly kernel runs too, so both give the same bits.
import { exactLog } from '../exact-log.js';
import { SMALLEST_UNIFORM, type UniformSource } from '../uniform-source.js';

const A1 = -3.969683028665376e1;
const A2 = 2.209460984245205e2;
const A3 = -2.759285104469687e2;
const A4 = 1.38357751867269e2;
const A5 = -3.066479806614716e1;
const A6 = 2.506628277459239;
const B1 = -5.447609879822406e1;
const B2 = 1.615858368580409e2;
const B3 = -1.556989798598866e2;
const B4 = 6.680131188771972e1;
const B5 = -1.328068155288572e1;
const C1 = -7.784894002430293e-3;
const C2 = -3.223964580411365e-1;
const C3 = -2.400758277161838;
const C4 = -2.549732539343734;
const C5 = 4.374664141464968;
const C6 = 2.938163982698783;
const D1 = 7.784695709041462e-3;
const D2 = 3.224671290700398e-1;
const D3 = 2.445134137142996;
const D4 = 3.754408661907416;
const P_LOW = 0.02425;
const P_HIGH = 1 - P_LOW;

/** Inverse of the standard normal CDF (Acklam 2003). u ≤ 0 is read as SMALLEST_UNIFORM; u < 1 required. */
export function inverseNormalCdf(u: number): number {
  const p = u > 0 ? u : SMALLEST_UNIFORM;
  if (p < P_LOW) {
    const q = Math.sqrt(-2 * exactLog(p));
    return (((((C1 * q + C2) * q + C3) * q + C4) * q + C5) * q + C6) / ((((D1 * q + D2) * q + D3) * q + D4) * q + 1);
  }
  if (p <= P_HIGH) {
    const q = p - 0.5;
    const r = q * q;
    return ((((((A1 * r + A2) * r + A3) * r + A4) * r + A5) * r + A6) * q) / (((((B1 * r + B2) * r + B3) * r + B4) * r + B5) * r + 1);
  }
  const q = Math.sqrt(-2 * exactLog(1 - p));
  return -(((((C1 * q + C2) * q + C3) * q + C4) * q + C5) * q + C6) / ((((D1 * q + D2) * q + D3) * q + D4) * q + 1);
}

/** Complementary error function, Numerical Recipes §6.2 `erfcc` (Chebyshev fit, fractional error < 1.2e-7). */
export function erfc(x: number): number {
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const ans =
    t *
    Math.exp(
      -z * z -
        1.26551223 +
        t * (1.00002368 + t * (0.37409196 + t * (0.09678418 + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))),
    );
  return x >= 0 ? ans : 2 - ans;
}

/** Standard normal CDF Φ(z) = erfc(−z/√2)/2. */
export function normalCdf(z: number): number {
  return 0.5 * erfc(-z / Math.SQRT2);
}

/** Standard normal density φ(z). */
export function normalPdf(z: number): number {
  return Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
}

/** Default coverage factor: a tolerance band's half-width is 3σ (common practice for resistor production). */
export const DEFAULT_K = 3;

// Scratch for normalQuantilesInPlace: the positions and uniforms of the tail draws (grown, never shrunk).
let tailIndex = new Int32Array(0);
let tailUniform = new Float64Array(0);

/**
 * In place: buf[j] = μ + σ·Φ⁻¹(buf[j]) for j < n, bit-identical to calling inverseNormalCdf draw by draw (a test
 * checks it). The fast path: every value goes through the central rational function in one branch-free loop (for
 * a tail value the result is discarded), and the tail draws (about 4.85 % of uniform draws) are noted and redone
 * with the full function afterwards. A branch inside the loop, mispredicted at random about one draw in ten, made
 * the plain loop about twice as slow here. Each loop is its own function: V8 compiles a long first loop on the fly
 * (on-stack replacement), and code after such a loop in the same function was found to deoptimise on every call.
 */
export function normalQuantilesInPlace(buf: Float64Array, n: number, mean: number, sigma: number): void {
  if (tailIndex.length < n) {
    tailIndex = new Int32Array(n);
    tailUniform = new Float64Array(n);
  }
  const tails = centralPass(buf, n, mean, sigma, tailIndex, tailUniform);
  tailPass(buf, tails, mean, sigma, tailIndex, tailUniform);
}

/** μ + σ·(Acklam's central rational function) for every value; returns how many were tails (noted in index/saved). */
function centralPass(buf: Float64Array, n: number, mean: number, sigma: number, index: Int32Array, saved: Float64Array): number {
  let tails = 0;
  for (let j = 0; j < n; j++) {
    const u = buf[j]!;
    index[tails] = j;
    saved[tails] = u;
    // The central region of inverseNormalCdf is P_LOW ≤ u ≤ P_HIGH (u ≤ 0 is a tail there too).
    tails += (u < P_LOW ? 1 : 0) | (u > P_HIGH ? 1 : 0);
    const q = u - 0.5;
    const r = q * q;
    buf[j] = mean + sigma * (((((((A1 * r + A2) * r + A3) * r + A4) * r + A5) * r + A6) * q) / (((((B1 * r + B2) * r + B3) * r + B4) * r + B5) * r + 1));
  }
  return tails;
}

/**
 * μ + σ·Φ⁻¹(u) for the noted tail draws: inverseNormalCdf's two tail branches written out in the loop, so that no
 * value crosses a call (allocation measured with V8's sampling heap profiler, HeapProfiler.startSampling). The same
 * operations in the same order: the upper tail's −(num)/den equals −(num/den) bit for bit (IEEE 754 rounding is
 * symmetric in sign), and u ≤ 0 is read as SMALLEST_UNIFORM, a lower-tail value, as there.
 */
function tailPass(buf: Float64Array, tails: number, mean: number, sigma: number, index: Int32Array, saved: Float64Array): void {
  for (let t = 0; t < tails; t++) {
    const u = saved[t]!;
    const lower = u < P_LOW;
    // The unary plus keeps this choice a plain double: with the imported constant as it is, V8 chose a boxed value
    // for p and allocated a heap number per tail draw (measured: 12.7 MB per 150 chunks of 65536 draws, 1.3 MB with it).
    const p = u > 0 ? u : +SMALLEST_UNIFORM;
    const q = Math.sqrt(-2 * exactLog(lower ? p : 1 - p));
    const z = (((((C1 * q + C2) * q + C3) * q + C4) * q + C5) * q + C6) / ((((D1 * q + D2) * q + D3) * q + D4) * q + 1);
    buf[index[t]!] = mean + sigma * (lower ? z : -z);
  }
}

/**
 * In place: clamps buf[0..n) to [lo, hi]. Only a value outside is written: a store of `x < lo ? lo : x > hi ? hi : x`
 * merged the boxed bounds with the unboxed value, and V8 then boxed every value it stored (a heap number per draw,
 * measured), where values inside the band, nearly all of them, need no store at all.
 */
export function clampInPlace(buf: Float64Array, n: number, lo: number, hi: number): void {
  for (let j = 0; j < n; j++) {
    const x = buf[j]!;
    if (x < lo) buf[j] = lo;
    else if (x > hi) buf[j] = hi;
  }
}

/** In place: uniforms u in [0, 1) → μ + σ·Φ⁻¹(u). */
export function normalFromUnit(buf: Float64Array, n: number, mean: number, sigma: number): void {
  normalQuantilesInPlace(buf, n, mean, sigma);
}

export function fillNormal(out: Float64Array, n: number, mean: number, sigma: number, random: UniformSource): void {
  for (let j = 0; j < n; j++) out[j] = random();
  normalFromUnit(out, n, mean, sigma);
}
