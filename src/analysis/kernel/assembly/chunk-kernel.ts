// The Monte Carlo engine's per-chunk kernel in WebAssembly (AssemblyScript): draw every part of a chunk from its
// xor128 stream, transform the uniforms into each part's distribution, evaluate the CV/CC supply's outputs, and
// reduce each output to its moments, histogram counts and window counts. It is the same computation as the
// JavaScript reference (src/analysis/chunk.ts with src/tolerance/sample.ts, src/tolerance/distributions/*.ts and
// src/analysis/models/supply.ts), written with the same floating-point operations in the same order per trial, so
// it gives the same bits (test/wasm-kernel.test.ts compares every example, whole JSON reports).
//
// Memory is laid out by the caller (src/analysis/kernel/wasm-runner.ts): part columns of `stride` bytes, descriptor
// tables and result slots at addresses it passes in. Nothing here allocates; the module has no imports.
import { exactLog } from './exact-log';

export { exactLog };

// ---------------------------------------------------------------------------------------------------------------
// Random stream: seedrandom's xor128 (G. Marsaglia, "Xorshift RNGs", J. Stat. Software 8(14), 2003), the same
// recurrence and the same (w >>> 0)·2^−32 as src/analysis/chunk-random.ts.

const TWO_TO_MINUS_32: f64 = 2.3283064365386963e-10;

/**
 * Uniforms for up to four parts at once, one part per SIMD lane: each group of the table (144 bytes: the x, y, z
 * and w words of four states as i32x4 vectors, four column addresses, then lo and width of each lane as f64) runs
 * four xor128 streams side by side for n steps and stores lane l's lo + width·((w >>> 0)·2^−32) into column l: a
 * uniform part's values at once (fillXor128Affine's expression), the bare uniform for any other part (lo 0, width
 * 1: 0 + 1·u = u exactly). The caller starts each part at its own stretch of the chunk's stream
 * (src/analysis/kernel/xor128-jump.ts), so the values are those of the one sequential stream. XOR is associative,
 * so the order of the step's XORs does not change a bit. Values go to column + `offset` bytes on, and each group's
 * states are stored back, so the next call goes on where this one stopped: a chunk drawn block by block (the caller
 * keeps a block's columns in cache through transform and evaluate) gives the bits of one call over the chunk.
 */
export function generate(groups: usize, count: i32, n: i32, offset: usize): void {
  const scale = kept(0, TWO_TO_MINUS_32);
  for (let q = 0; q < count; q++) {
    const g = groups + <usize>q * 144;
    let x = v128.load(g);
    let y = v128.load(g, 16);
    let z = v128.load(g, 32);
    let w = v128.load(g, 48);
    const c0 = <usize>load<u32>(g, 64) + offset;
    const c1 = <usize>load<u32>(g, 68) + offset;
    const c2 = <usize>load<u32>(g, 72) + offset;
    const c3 = <usize>load<u32>(g, 76) + offset;
    const lo01 = v128.load(g, 80);
    const lo23 = v128.load(g, 96);
    const width01 = v128.load(g, 112);
    const width23 = v128.load(g, 128);
    for (let j = 0; j < n; j++) {
      const t = v128.xor(x, i32x4.shl(x, 11));
      x = y;
      y = z;
      z = w;
      w = v128.xor(v128.xor(w, i32x4.shr_u(w, 19)), v128.xor(t, i32x4.shr_u(t, 8)));
      const low = f64x2.add(lo01, f64x2.mul(width01, f64x2.mul(f64x2.convert_low_i32x4_u(w), scale)));
      const high = f64x2.add(lo23, f64x2.mul(width23, f64x2.mul(f64x2.convert_low_i32x4_u(v128.shuffle<i32>(w, w, 2, 3, 0, 1)), scale)));
      const off = <usize>j << 3;
      store<f64>(c0 + off, f64x2.extract_lane(low, 0));
      store<f64>(c1 + off, f64x2.extract_lane(low, 1));
      store<f64>(c2 + off, f64x2.extract_lane(high, 0));
      store<f64>(c3 + off, f64x2.extract_lane(high, 1));
    }
    v128.store(g, x);
    v128.store(g, y, 16);
    v128.store(g, z, 32);
    v128.store(g, w, 48);
  }
}

// ---------------------------------------------------------------------------------------------------------------
// Inverse normal CDF: Peter J. Acklam's rational approximation (2003), the constants and branches of
// src/tolerance/distributions/normal.ts.

const A1: f64 = -3.969683028665376e1;
const A2: f64 = 2.209460984245205e2;
const A3: f64 = -2.759285104469687e2;
const A4: f64 = 1.38357751867269e2;
const A5: f64 = -3.066479806614716e1;
const A6: f64 = 2.506628277459239;
const B1: f64 = -5.447609879822406e1;
const B2: f64 = 1.615858368580409e2;
const B3: f64 = -1.556989798598866e2;
const B4: f64 = 6.680131188771972e1;
const B5: f64 = -1.328068155288572e1;
const C1: f64 = -7.784894002430293e-3;
const C2: f64 = -3.223964580411365e-1;
const C3: f64 = -2.400758277161838;
const C4: f64 = -2.549732539343734;
const C5: f64 = 4.374664141464968;
const C6: f64 = 2.938163982698783;
const D1: f64 = 7.784695709041462e-3;
const D2: f64 = 3.224671290700398e-1;
const D3: f64 = 2.445134137142996;
const D4: f64 = 3.754408661907416;
const P_LOW: f64 = 0.02425;
const P_HIGH: f64 = 1 - P_LOW;
/** src/tolerance/uniform-source.ts SMALLEST_UNIFORM, 2^−33. */
const SMALLEST_UNIFORM: f64 = reinterpret<f64>(0x3de0000000000000);

/** mean + sigma·Φ⁻¹(u), as normalQuantilesInPlace gives it (central rational function, or the tail branch). */
@inline function normalQuantile(u: f64, mean: f64, sigma: f64): f64 {
  if (u >= P_LOW && u <= P_HIGH) {
    const q = u - 0.5;
    const r = q * q;
    return mean + sigma * (((((((A1 * r + A2) * r + A3) * r + A4) * r + A5) * r + A6) * q) / (((((B1 * r + B2) * r + B3) * r + B4) * r + B5) * r + 1));
  }
  return mean + sigma * normalTail(u);
}

/** The tail branches of Acklam's approximation (u outside [P_LOW, P_HIGH], u ≤ 0 read as SMALLEST_UNIFORM). */
@inline function normalTail(u: f64): f64 {
  const lower = u < P_LOW;
  const p = u > 0 ? u : SMALLEST_UNIFORM;
  const q = Math.sqrt(-2 * exactLog(lower ? p : 1 - p));
  const z = (((((C1 * q + C2) * q + C3) * q + C4) * q + C5) * q + C6) / ((((D1 * q + D2) * q + D3) * q + D4) * q + 1);
  return lower ? z : -z;
}

// ---------------------------------------------------------------------------------------------------------------
// Drawing. Part descriptor: 8 f64 at desc + 64·i, [kind, a, b, c, d, e, f, g]:
//   0 constant      a value                              (the stream still advances n draws)
//   1 affine        a lo, b width                        lo + width·u (uniform)
//   2 normal        a mean, b sigma                      mean + sigma·Φ⁻¹(u)
//   3 truncated     a pLo, b span, c mean, d sigma, e lo, f hi     clamp(Φ⁻¹(pLo + span·u))
//   4 triangular    a lo, b hi, c split, d left, e right
//   5 binned        a lowStart, b pieceMass, c highStart, d mean, e sigma, f lo, g hi
// Part i takes draws i·n … (i+1)·n − 1 of the chunk's stream, into the column at cols + i·stride.

const CONSTANT = 0;
const AFFINE = 1;
const NORMAL = 2;
const TRUNCATED = 3;
const TRIANGULAR = 4;
const BINNED = 5;

@inline function clamp(x: f64, lo: f64, hi: f64): f64 {
  return x < lo ? lo : x > hi ? hi : x;
}

/**
 * In place, each part's column from its uniforms (left there by generate) to its values; a constant part's column
 * is filled (its stretch of the stream is skipped by the caller's jump, as skipXor128 does). `tails` is scratch
 * for the normal passes: 16·(n + 2) bytes (16 per value).
 */
export function transform(desc: usize, parts: i32, cols: usize, stride: usize, n: i32, tails: usize): void {
  for (let i = 0; i < parts; i++) {
    const d = desc + (<usize>i << 6);
    const kind = <i32>load<f64>(d);
    const a = load<f64>(d, 8);
    const b = load<f64>(d, 16);
    const c = load<f64>(d, 24);
    const e = load<f64>(d, 32);
    const f = load<f64>(d, 40);
    const g = load<f64>(d, 48);
    const h = load<f64>(d, 56);
    const out = cols + <usize>i * stride;
    if (kind == CONSTANT) {
      for (let j = 0; j < n; j++) store<f64>(out + (<usize>j << 3), a);
    } else if (kind == AFFINE) continue; // drawn and scaled by generate
    else if (kind == NORMAL) normalPass(out, n, 0, 1, a, b, -Infinity, Infinity, tails);
    else if (kind == TRUNCATED) normalPass(out, n, a, b, c, e, f, g, tails);
    else if (kind == TRIANGULAR) triangularPass(out, n, a, b, c, e, f);
    else binnedPass(out, n, a, b, c, e, f, g, h, tails);
  }
}

/**
 * u → clamp(mean + sigma·Φ⁻¹(pLo + span·u), lo, hi) in place (a plain normal: pLo 0, span 1, lo −∞, hi +∞, which
 * give u and no clamp, to the bit). Two values per SIMD step through the central rational function, for every
 * value; a tail value (p outside [P_LOW, P_HIGH], about one in twenty) is listed in `tails` (its p and its index,
 * 16 bytes, written for every value and kept by advancing the count), and the second loop redoes the listed values
 * with the tail branch, as the reference's tail pass redoes its tail draws. Neither loop has a data-dependent
 * branch. clampBoth and clamp are the reference's `x < lo ? lo : x > hi ? hi : x`.
 */
function normalPass(buf: usize, n: i32, pLo: f64, span: f64, mean: f64, sigma: f64, lo: f64, hi: f64, tails: usize): void {
  // Every constant of the loop read once from memory before it (see `kept`).
  const vLo = kept(0, pLo);
  const vSpan = kept(1, span);
  const vMean = kept(2, mean);
  const vSigma = kept(3, sigma);
  const low = kept(4, P_LOW);
  const high = kept(5, P_HIGH);
  const half = kept(6, 0.5);
  const bandLo = kept(7, lo);
  const bandHi = kept(8, hi);
  const a1 = kept(9, A1), a2 = kept(10, A2), a3 = kept(11, A3), a4 = kept(12, A4), a5 = kept(13, A5), a6 = kept(14, A6);
  const b1 = kept(15, B1), b2 = kept(16, B2), b3 = kept(17, B3), b4 = kept(18, B4), b5 = kept(19, B5), one = kept(20, 1);
  let count: usize = 0;
  for (let j = 0; j < n; j += 2) {
    const at = buf + (<usize>j << 3);
    const p = f64x2.add(vLo, f64x2.mul(vSpan, v128.load(at)));
    // Central region P_LOW ≤ p ≤ P_HIGH in both lanes?
    const central = v128.and(f64x2.ge(p, low), f64x2.le(p, high));
    const q = f64x2.sub(p, half);
    const r = f64x2.mul(q, q);
    const num = f64x2.mul(poly6(r, a1, a2, a3, a4, a5, a6), q);
    const den = poly6(r, b1, b2, b3, b4, b5, one);
    v128.store(at, clampBoth(f64x2.add(vMean, f64x2.mul(vSigma, f64x2.div(num, den))), bandLo, bandHi));
    // Each lane's p and index go to the list; the count moves past them only for a tail lane.
    const first = tails + (count << 4);
    store<f64>(first, f64x2.extract_lane(p, 0));
    store<i32>(first, j, 8);
    count += <usize>(i64x2.extract_lane(central, 0) == 0);
    const second = tails + (count << 4);
    store<f64>(second, f64x2.extract_lane(p, 1));
    store<i32>(second, j + 1, 8);
    count += <usize>(i64x2.extract_lane(central, 1) == 0);
  }
  for (let t: usize = 0; t < count; t++) {
    const entry = tails + (t << 4);
    store<f64>(buf + (<usize>load<i32>(entry, 8) << 3), clamp(mean + sigma * normalTail(load<f64>(entry)), lo, hi));
  }
}

/** ((((c1·r + c2)·r + c3)·r + c4)·r + c5)·r + c6, Horner's scheme as the reference writes it. */
@inline function poly6(r: v128, c1: v128, c2: v128, c3: v128, c4: v128, c5: v128, c6: v128): v128 {
  let v = f64x2.add(f64x2.mul(c1, r), c2);
  v = f64x2.add(f64x2.mul(v, r), c3);
  v = f64x2.add(f64x2.mul(v, r), c4);
  v = f64x2.add(f64x2.mul(v, r), c5);
  return f64x2.add(f64x2.mul(v, r), c6);
}

/**
 * The kernel's own scratch: bytes 0 … KERNEL_SCRATCH_BYTES − 1 (2048) of the memory, which callers never lay
 * anything in (src/analysis/kernel/wasm-module.ts KERNEL_SCRATCH_BYTES): bytes 0 … 1023 for `kept`, which reads
 * back at once, then evaluate's column and presence tables (COLUMN_TABLE, PRESENT_TABLE).
 */
const KERNEL_SCRATCH: usize = 0;

/**
 * c in both lanes, written to slot `slot` (0 … 63) of the scratch and read back. The compiler cannot see through
 * the memory, so the value stays one loop-invariant local; a splat or a constant written inside a loop is rebuilt
 * there at every step by the engine's code generator (V8 11: three instructions per constant per step, which made
 * the normal pass 30 % slower).
 */
@inline function kept(slot: usize, c: f64): v128 {
  const at = KERNEL_SCRATCH + (slot << 4);
  v128.store(at, f64x2.splat(c));
  return v128.load(at);
}

/** kept for four i32 lanes. */
@inline function keptI32(slot: usize, c: i32): v128 {
  const at = KERNEL_SCRATCH + (slot << 4);
  v128.store(at, i32x4.splat(c));
  return v128.load(at);
}

@inline function clampBoth(x: v128, lo: v128, hi: v128): v128 {
  return v128.bitselect(lo, v128.bitselect(hi, x, f64x2.gt(x, hi)), f64x2.lt(x, lo));
}

/** u < split ? lo + √(u·left) : hi − √((1 − u)·right), both sides computed, each lane picking its own. */
function triangularPass(buf: usize, n: i32, lo: f64, hi: f64, split: f64, left: f64, right: f64): void {
  const vLo = kept(0, lo);
  const vHi = kept(1, hi);
  const vSplit = kept(2, split);
  const vLeft = kept(3, left);
  const vRight = kept(4, right);
  const one = kept(5, 1);
  for (let j = 0; j < n; j += 2) {
    const at = buf + (<usize>j << 3);
    const u = v128.load(at);
    const below = f64x2.add(vLo, f64x2.sqrt(f64x2.mul(u, vLeft)));
    const above = f64x2.sub(vHi, f64x2.sqrt(f64x2.mul(f64x2.sub(one, u), vRight)));
    v128.store(at, v128.bitselect(below, above, f64x2.lt(u, vSplit)));
  }
}

/** u → the probability on the low or the high piece (binned.ts), then the normal pass with the band's clamp. */
function binnedPass(buf: usize, n: i32, lowStart: f64, pieceMass: f64, highStart: f64, mean: f64, sigma: f64, lo: f64, hi: f64, tails: usize): void {
  const twice = kept(0, 2 * pieceMass);
  const mass = kept(1, pieceMass);
  const vLow = kept(2, lowStart);
  const vHigh = kept(3, highStart);
  for (let j = 0; j < n; j += 2) {
    const at = buf + (<usize>j << 3);
    const v = f64x2.mul(twice, v128.load(at));
    v128.store(at, v128.bitselect(f64x2.add(vLow, v), f64x2.add(vHigh, f64x2.sub(v, mass)), f64x2.lt(v, mass)));
  }
  normalPass(buf, n, 0, 1, mean, sigma, lo, hi, tails);
}

// ---------------------------------------------------------------------------------------------------------------
// The supply model, one trial at a time (src/analysis/models/supply.ts evaluateAll and src/circuits/*). The layout
// is an i32 table of part column indices; an absent part points at a column of zeros (index `parts`), which gives
// the same bits as the reference's missing factor: v·(1 + 0) = v and 1 + 0·ΔT = 1 exactly for finite values.

// Layout slots (i32 at lay + 4·slot).
const L_T = 0;
const L_REF = 1; // value, drift, tempco
const L_TOP = 4; // a (value, drift, tcr), hasB, b (value, drift, tcr), parallel, pot (value, drift, tcr)
const L_BOTTOM = 15; // as L_TOP
const L_IFB = 26;
const L_SENSE = 27; // 0 none, 1 direct, 2 noninv, 3 diff
const L_TH_MODE = 28; // 0 fixed, 1 divided from the regulator's reference, 2 divided from its own reference
const L_TH_FIXED = 29; // value, the zero column (no drift), tempco
const L_TH_SOURCE = 32; // value, drift, tempco
const L_TH_TOP = 35; // value, drift, tcr
const L_TH_BOTTOM = 38; // value, drift, tcr
const L_COMPARE = 41;
const L_AMP = 42; // offset, drift (or the zero column), bias (or the zero column), hasDrift
const L_GAIN = 46; // four resistors (value, drift, tcr)
const L_SHUNT = 58; // value, drift, tcr
const L_SELF_HEATING = 61;
const L_ZERO = 62; // the column of zeros
// f64 parameters at par + 8·slot.
const P_WIPER_TOP = 0;
const P_WIPER_BOTTOM = 1;
const P_COMMON_MODE = 2;
const P_THETA = 3;
const P_FIXED_T = 4;

const SENSE_NONE = 0;
const SENSE_DIRECT = 1;
const SENSE_NONINV = 2;

const REFERENCE_TEMPERATURE_C: f64 = 25;

// The columns of one evaluation, by layout slot: evaluate writes each slot's column address (cols + index·stride)
// to the scratch's column table, and a byte saying whether the part is there (not the column of zeros) to its
// presence table; the loops read both from there, one load per use. (As locals, V8 recomputed each address from
// spilled values at every step, four instructions a column.)
const COLUMN_TABLE: usize = KERNEL_SCRATCH + 1024;
const PRESENT_TABLE: usize = KERNEL_SCRATCH + 1280;

@inline function colAt(slot: i32): usize {
  return <usize>load<u32>(COLUMN_TABLE + (<usize>slot << 2));
}

@inline function has(slot: i32): bool {
  return load<u8>(PRESENT_TABLE + <usize>slot) != 0;
}

// Two trials per SIMD step: every f64x2 operation gives in each lane the bits of the scalar operation (IEEE 754
// add, sub, mul, div and sqrt are correctly rounded, lane by lane), so the loops below are the reference's
// per-trial formulas, two trials at a time. A chunk of odd length computes one trial past its end, in columns that
// have room for it; nothing reads that value.
@inline function add(a: v128, b: v128): v128 {
  return f64x2.add(a, b);
}
@inline function sub(a: v128, b: v128): v128 {
  return f64x2.sub(a, b);
}
@inline function mul(a: v128, b: v128): v128 {
  return f64x2.mul(a, b);
}
@inline function div(a: v128, b: v128): v128 {
  return f64x2.div(a, b);
}
/** Slot's column at byte offset off (two trials). */
@inline function at(slot: i32, off: usize): v128 {
  return v128.load(colAt(slot) + off);
}

/**
 * value·(1 + drift)·(1 + coefficient·ΔT): scaledColumn of supply.ts, which leaves out the factor of a part that is
 * absent (here: the column of zeros), as this does. The test is the same for every trial, so it predicts perfectly.
 */
@inline function scaled(v: i32, d: i32, c: i32, off: usize, dT: v128, one: v128): v128 {
  let r = at(v, off);
  if (has(d)) r = mul(r, add(one, at(d, off)));
  if (has(c)) r = mul(r, add(one, mul(at(c, off), dT)));
  return r;
}

/**
 * Evaluates the outputs for trials 0..n−1 into out + o·stride (o in vout, dividerCurrent, ilimit, shuntLoss,
 * ampOutput order; the first two only without a sense path). With fixedT ≠ 0 every trial is evaluated at the
 * ambient par[P_FIXED_T] instead of its drawn one (the per-unit check of src/analysis/unit-check.ts).
 */
export function evaluate(lay: usize, par: usize, partCols: usize, stride: usize, n: i32, out: usize, fixedT: i32): void {
  const zeroIndex = load<i32>(lay, L_ZERO << 2);
  for (let slot = 0; slot <= L_ZERO; slot++) {
    const index = load<i32>(lay + (<usize>slot << 2));
    store<u32>(COLUMN_TABLE + (<usize>slot << 2), <u32>(partCols + <usize>index * stride));
    store<u8>(PRESENT_TABLE + <usize>slot, <u8>(index != zeroIndex));
  }
  const tCol = L_T;
  const tFixed = kept(0, load<f64>(par, P_FIXED_T << 3));
  const room = kept(1, REFERENCE_TEMPERATURE_C);
  const one = kept(2, 1);
  const refV = L_REF, refD = L_REF + 1, refC = L_REF + 2;
  const taV = L_TOP, taD = L_TOP + 1, taC = L_TOP + 2;
  const topHasB = load<i32>(lay, (L_TOP + 3) << 2);
  const tbV = L_TOP + 4, tbD = L_TOP + 5, tbC = L_TOP + 6;
  const topParallel = load<i32>(lay, (L_TOP + 7) << 2);
  const tpV = L_TOP + 8, tpD = L_TOP + 9, tpC = L_TOP + 10;
  const baV = L_BOTTOM, baD = L_BOTTOM + 1, baC = L_BOTTOM + 2;
  const bottomHasB = load<i32>(lay, (L_BOTTOM + 3) << 2);
  const bbV = L_BOTTOM + 4, bbD = L_BOTTOM + 5, bbC = L_BOTTOM + 6;
  const bottomParallel = load<i32>(lay, (L_BOTTOM + 7) << 2);
  const bpV = L_BOTTOM + 8, bpD = L_BOTTOM + 9, bpC = L_BOTTOM + 10;
  const wiperTop = kept(3, load<f64>(par, P_WIPER_TOP << 3));
  const wiperBottom = kept(4, load<f64>(par, P_WIPER_BOTTOM << 3));
  const ifb = L_IFB;
  const vout = out;
  const dividerCurrent = out + stride;
  for (let j = 0; j < n; j += 2) {
    const off = <usize>j << 3;
    const dT = sub(fixedT != 0 ? tFixed : at(tCol, off), room);
    const v = scaled(refV, refD, refC, off, dT, one);
    const top = leg(taV, taD, taC, topHasB, tbV, tbD, tbC, topParallel, tpV, tpD, tpC, wiperTop, off, dT, one);
    const bottom = leg(baV, baD, baC, bottomHasB, bbV, bbD, bbC, bottomParallel, bpV, bpD, bpC, wiperBottom, off, dT, one);
    // dividerVout (src/circuits/divider.ts): Vref + Rtop·(Vref/Rbottom + Ifb); divider current Vref/Rbottom.
    v128.store(vout + off, add(v, mul(top, add(div(v, bottom), at(ifb, off)))));
    v128.store(dividerCurrent + off, div(v, bottom));
  }
  if (load<i32>(lay, L_SENSE << 2) != SENSE_NONE) evaluateSense(lay, par, n, out + 2 * stride, stride, fixedT != 0, tFixed);
}

/** One divider leg: a, or a ∥ b, or a + b, then + wiper·pot (a missing pot is the zero column and wiper 0). */
@inline function leg(aV: i32, aD: i32, aC: i32, hasB: i32, bV: i32, bD: i32, bC: i32, parallel: i32, pV: i32, pD: i32, pC: i32, wiper: v128, off: usize, dT: v128, one: v128): v128 {
  const a = scaled(aV, aD, aC, off, dT, one);
  let r = a;
  if (hasB != 0) {
    const b = scaled(bV, bD, bC, off, dT, one);
    r = parallel != 0 ? div(mul(a, b), add(a, b)) : add(a, b);
  }
  return add(r, mul(wiper, scaled(pV, pD, pC, off, dT, one)));
}

/**
 * The sense path (supply.ts senseBlock and src/circuits/sense/*): the limit current, found again with the shunt at
 * its self-heated resistance when it heats itself, the shunt loss there and the amplifier output there.
 */
function evaluateSense(lay: usize, par: usize, n: i32, out: usize, stride: usize, useFixed: bool, tFixed: v128): void {
  const tCol = L_T;
  const refV = L_REF, refD = L_REF + 1, refC = L_REF + 2;
  const kind = load<i32>(lay, L_SENSE << 2);
  const thMode = load<i32>(lay, L_TH_MODE << 2);
  const thV = L_TH_FIXED, thD = L_TH_FIXED + 1, thC = L_TH_FIXED + 2;
  const sV = L_TH_SOURCE, sD = L_TH_SOURCE + 1, sC = L_TH_SOURCE + 2;
  const ttV = L_TH_TOP, ttD = L_TH_TOP + 1, ttC = L_TH_TOP + 2;
  const tbV = L_TH_BOTTOM, tbD = L_TH_BOTTOM + 1, tbC = L_TH_BOTTOM + 2;
  const compare = L_COMPARE;
  const ampOffset = L_AMP, ampDrift = L_AMP + 1, ampBias = L_AMP + 2;
  const ampHasDrift = load<i32>(lay, (L_AMP + 3) << 2);
  const g0V = L_GAIN, g0D = L_GAIN + 1, g0C = L_GAIN + 2;
  const g1V = L_GAIN + 3, g1D = L_GAIN + 4, g1C = L_GAIN + 5;
  const g2V = L_GAIN + 6, g2D = L_GAIN + 7, g2C = L_GAIN + 8;
  const g3V = L_GAIN + 9, g3D = L_GAIN + 10, g3C = L_GAIN + 11;
  const shV = L_SHUNT, shD = L_SHUNT + 1, shC = L_SHUNT + 2;
  const selfHeating = load<i32>(lay, L_SELF_HEATING << 2);
  const commonMode = kept(0, load<f64>(par, P_COMMON_MODE << 3));
  const theta = kept(1, load<f64>(par, P_THETA << 3));
  const room = kept(2, REFERENCE_TEMPERATURE_C);
  const one = kept(3, 1);
  const zero = kept(4, 0);
  const four = kept(5, 4);
  const two = kept(6, 2);
  const limitOut = out;
  const lossOut = out + stride;
  const ampOut = out + 2 * stride;
  for (let j = 0; j < n; j += 2) {
    const off = <usize>j << 3;
    const dT = sub(useFixed ? tFixed : at(tCol, off), room);
    let threshold: v128;
    if (thMode == 0) threshold = scaled(thV, thD, thC, off, dT, one);
    else {
      const source = thMode == 1 ? scaled(refV, refD, refC, off, dT, one) : scaled(sV, sD, sC, off, dT, one);
      const rt = scaled(ttV, ttD, ttC, off, dT, one);
      const rb = scaled(tbV, tbD, tbC, off, dT, one);
      threshold = div(mul(source, rb), add(rt, rb));
    }
    const compareOffset = at(compare, off);
    const rAmbient = scaled(shV, shD, shC, off, dT, one);
    let shunt = rAmbient;
    let current: v128;
    let signal: v128;
    if (kind == SENSE_DIRECT) {
      // src/circuits/sense/direct.ts
      current = div(sub(threshold, compareOffset), shunt);
      if (selfHeating != 0) {
        shunt = hotShunt(rAmbient, mul(at(shV, off), add(one, at(shD, off))), at(shC, off), theta, mul(current, rAmbient), four, two);
        current = div(sub(threshold, compareOffset), shunt);
      }
      signal = mul(current, shunt);
    } else {
      const amplifierOffset = ampHasDrift != 0 ? add(at(ampOffset, off), mul(at(ampDrift, off), dT)) : add(at(ampOffset, off), zero);
      const biasCurrent = at(ampBias, off);
      if (kind == SENSE_NONINV) {
        // src/circuits/sense/noninv.ts
        const feedback = scaled(g0V, g0D, g0C, off, dT, one);
        const ground = scaled(g1V, g1D, g1C, off, dT, one);
        const gain = add(one, div(feedback, ground));
        const drive = sub(sub(threshold, compareOffset), mul(biasCurrent, feedback));
        current = div(sub(div(drive, gain), amplifierOffset), shunt);
        if (selfHeating != 0) {
          shunt = hotShunt(rAmbient, mul(at(shV, off), add(one, at(shD, off))), at(shC, off), theta, mul(current, rAmbient), four, two);
          current = div(sub(div(drive, gain), amplifierOffset), shunt);
        }
        signal = add(mul(gain, add(mul(current, shunt), amplifierOffset)), mul(biasCurrent, feedback));
      } else {
        // src/circuits/sense/diff.ts
        const r1 = scaled(g0V, g0D, g0C, off, dT, one);
        const r2 = scaled(g1V, g1D, g1C, off, dT, one);
        const r3 = scaled(g2V, g2D, g2C, off, dT, one);
        const r4 = scaled(g3V, g3D, g3C, off, dT, one);
        const ratio = div(r2, r1);
        const plusGain = mul(div(r4, add(r3, r4)), add(one, ratio));
        const sourceAtPlus = div(mul(r3, r4), add(r3, r4));
        const offsetTerm = add(mul(add(one, ratio), sub(amplifierOffset, mul(biasCurrent, sourceAtPlus))), mul(biasCurrent, r2));
        const commonModeOut = mul(sub(plusGain, ratio), commonMode);
        const drive = sub(sub(sub(threshold, compareOffset), commonModeOut), offsetTerm);
        current = div(drive, mul(plusGain, shunt));
        if (selfHeating != 0) {
          shunt = hotShunt(rAmbient, mul(at(shV, off), add(one, at(shD, off))), at(shC, off), theta, mul(current, rAmbient), four, two);
          current = div(drive, mul(plusGain, shunt));
        }
        const vp = add(commonMode, mul(current, shunt));
        signal = add(sub(mul(plusGain, vp), mul(ratio, commonMode)), offsetTerm);
      }
    }
    v128.store(limitOut + off, current);
    v128.store(lossOut + off, mul(mul(current, current), shunt));
    v128.store(ampOut + off, signal);
  }
}

/** supply.ts hotShunt: the self-heated shunt, (R_amb + √(R_amb² + 4·R25·α·θ·K²))/2. */
@inline function hotShunt(rAmbient: v128, r25: v128, alpha: v128, theta: v128, k: v128, four: v128, two: v128): v128 {
  const inside = add(mul(rAmbient, rAmbient), mul(mul(mul(mul(mul(four, r25), alpha), theta), k), k));
  return div(add(rAmbient, f64x2.sqrt(inside)), two);
}

// ---------------------------------------------------------------------------------------------------------------
// Reduction of one output column (src/analysis/chunk.ts scanPass, deviationPass, countNonFinite), results as f64 at
// res: [min, max, sum, inSpec, below, mean, sq, dev, nonFinite]. Sums run in trial order, as there.

export function reduce(x: usize, n: i32, lo: f64, scale: f64, bins: i32, counts: usize, specLo: f64, specHi: f64, res: usize): void {
  const above = bins + 1;
  const binsF = <f64>bins;
  // Two values per step. The sum adds them one at a time in trial order (as the reference does); min and max run
  // per lane and join at the end (checked below where a NaN or a zero could make the order matter); the window
  // counts are whole numbers, added per lane.
  let minLanes = f64x2.splat(Infinity);
  let maxLanes = f64x2.splat(-Infinity);
  let insideLanes = i64x2.splat(0);
  let belowLanes = i64x2.splat(0);
  const vLo = kept(0, lo);
  const vScale = kept(1, scale);
  const vSpecLo = kept(2, specLo);
  const vSpecHi = kept(3, specHi);
  const vBins = kept(4, binsF);
  const minusOne = kept(5, -1);
  const oneI = keptI32(7, 1);
  let sum: f64 = 0;
  const pairs = n & ~1;
  for (let j = 0; j < pairs; j += 2) {
    const v = v128.load(x + (<usize>j << 3));
    minLanes = f64x2.pmin(minLanes, v);
    maxLanes = f64x2.pmax(maxLanes, v);
    sum += f64x2.extract_lane(v, 0);
    sum += f64x2.extract_lane(v, 1);
    // countBin two lanes at once: t held to [−1, bins] by pmin and pmax (a NaN passes both unchanged), then
    // floored, so the saturating truncation plus one gives countBin's bin in each lane: t < 0 → 0 (−0 → 1, as
    // `t | 0` + 1), t ≥ bins → bins + 1, NaN → 1, else ⌊t⌋ + 1.
    const t = f64x2.mul(f64x2.sub(v, vLo), vScale);
    const held = f64x2.floor(f64x2.pmax(f64x2.pmin(t, vBins), minusOne));
    const bin = i32x4.add(i32x4.trunc_sat_f64x2_s_zero(held), oneI);
    const slot0 = counts + (<usize>i32x4.extract_lane(bin, 0) << 2);
    store<u32>(slot0, load<u32>(slot0) + 1);
    const slot1 = counts + (<usize>i32x4.extract_lane(bin, 1) << 2);
    store<u32>(slot1, load<u32>(slot1) + 1);
    // A true comparison is all ones (−1 as an integer): subtracting it counts one.
    insideLanes = i64x2.sub(insideLanes, v128.and(f64x2.ge(v, vSpecLo), f64x2.le(v, vSpecHi)));
    belowLanes = i64x2.sub(belowLanes, f64x2.lt(v, vSpecLo));
  }
  let min = Math.min(f64x2.extract_lane(minLanes, 0), f64x2.extract_lane(minLanes, 1));
  let max = Math.max(f64x2.extract_lane(maxLanes, 0), f64x2.extract_lane(maxLanes, 1));
  let inSpec = <i32>(i64x2.extract_lane(insideLanes, 0) + i64x2.extract_lane(insideLanes, 1));
  let below = <i32>(i64x2.extract_lane(belowLanes, 0) + i64x2.extract_lane(belowLanes, 1));
  if (pairs < n) {
    const v = load<f64>(x + (<usize>pairs << 3));
    min = Math.min(min, v);
    max = Math.max(max, v);
    sum += v;
    countBin(counts, (v - lo) * scale, binsF, above);
    inSpec += <i32>(v >= specLo && v <= specHi);
    below += <i32>(v < specLo);
  }
  let nonFinite: i32 = 0;
  if (!isFinite(sum)) for (let j = 0; j < n; j++) nonFinite += <i32>!isFinite(load<f64>(x + (<usize>j << 3)));
  // pmin and pmax (b < a ? b : a, one instruction each) agree with Math.min and Math.max except where a NaN or a
  // zero of either sign takes part; then the column's min and max are found again the reference's way.
  if (nonFinite != 0 || min == 0 || max == 0) {
    min = Infinity;
    max = -Infinity;
    for (let j = 0; j < n; j++) {
      const v = load<f64>(x + (<usize>j << 3));
      min = Math.min(min, v);
      max = Math.max(max, v);
    }
  }
  const mean = n > 0 ? sum / <f64>n : 0;
  // Σ(x − mean)² and Σ(x − mean), each in trial order (the subtraction two lanes at a time).
  let sq: f64 = 0;
  let dev: f64 = 0;
  const vMean = kept(8, mean);
  for (let j = 0; j < pairs; j += 2) {
    const d = f64x2.sub(v128.load(x + (<usize>j << 3)), vMean);
    const d0 = f64x2.extract_lane(d, 0);
    const d1 = f64x2.extract_lane(d, 1);
    sq += d0 * d0;
    sq += d1 * d1;
    dev += d0;
    dev += d1;
  }
  if (pairs < n) {
    const d = load<f64>(x + (<usize>pairs << 3)) - mean;
    sq += d * d;
    dev += d;
  }
  store<f64>(res, min);
  store<f64>(res, max, 8);
  store<f64>(res, sum, 16);
  store<f64>(res, <f64>inSpec, 24);
  store<f64>(res, <f64>below, 32);
  store<f64>(res, mean, 40);
  store<f64>(res, sq, 48);
  store<f64>(res, dev, 56);
  store<f64>(res, <f64>nonFinite, 64);
}

/** counts[⌊t⌋ + 1]++ inside the range, [0] below, [bins + 1] above; a NaN lands in bin 1, as `t | 0` puts it in the
 *  reference (any NaN fails the run). */
@inline function countBin(counts: usize, t: f64, binsF: f64, above: i32): void {
  const bin = t < 0 ? 0 : t >= binsF ? above : <i32>t + 1;
  const slot = counts + (<usize>bin << 2);
  store<u32>(slot, load<u32>(slot) + 1);
}

// ---------------------------------------------------------------------------------------------------------------
// The per-unit check's flags (src/analysis/unit-check.ts markInside, markAll, countPassing).

/** pass[j] &= lo ≤ x[j] ≤ hi (a NaN fails). */
export function markInside(x: usize, n: i32, lo: f64, hi: f64, pass: usize): void {
  // Sixteen units per step: eight f64x2 window tests (each lane all ones or zero) narrowed to sixteen bytes of
  // 0xFF or 0, masked to 1 or 0 and anded into the flags; the rest one at a time.
  const vLo = kept(0, lo);
  const vHi = kept(1, hi);
  const ones = keptI32(2, 0x01010101);
  const steps = n & ~15;
  for (let j = 0; j < steps; j += 16) {
    const at = x + (<usize>j << 3);
    const a = i16x8.narrow_i32x4_s(insideFour(at, 0, vLo, vHi), insideFour(at, 32, vLo, vHi));
    const b = i16x8.narrow_i32x4_s(insideFour(at, 64, vLo, vHi), insideFour(at, 96, vLo, vHi));
    const flags = v128.and(i8x16.narrow_i16x8_s(a, b), ones);
    v128.store(pass + j, v128.and(v128.load(pass + j), flags));
  }
  for (let j = steps; j < n; j++) {
    const v = load<f64>(x + (<usize>j << 3));
    store<u8>(pass + j, load<u8>(pass + j) & <u8>(v >= lo && v <= hi));
  }
}

/** Four units' window tests from x at byte `off` on, as four i32 lanes of all ones (inside) or zero (a NaN is outside). */
@inline function insideFour(x: usize, off: usize, lo: v128, hi: v128): v128 {
  const v0 = v128.load(x + off);
  const v1 = v128.load(x + off + 16);
  const in0 = v128.and(f64x2.ge(v0, lo), f64x2.le(v0, hi));
  const in1 = v128.and(f64x2.ge(v1, lo), f64x2.le(v1, hi));
  return v128.shuffle<i32>(in0, in1, 0, 2, 4, 6);
}

/** all[j] = 1 when each of `count` flag rows (n bytes apart by rowStride) has a 1 at j. */
export function markAll(rows: usize, count: i32, rowStride: usize, n: i32, all: usize): void {
  memory.fill(all, 1, <usize>n);
  for (let c = 0; c < count; c++) {
    const row = rows + <usize>c * rowStride;
    for (let j = 0; j < n; j++) store<u8>(all + j, load<u8>(all + j) & load<u8>(row + j));
  }
}

/**
 * Units inside every window at the values drawn (markInside over each checked output, markAll and countOnes in one
 * pass): `count` rows of 24 bytes at `rows`, each the output's column address (u32, 4 bytes unused) and lo, hi.
 */
export function countAllInside(rows: usize, count: i32, n: i32): i32 {
  // Two units per step: each lane is all ones while the unit is inside every window so far; subtracting the
  // final mask (−1 per unit inside) counts them. The odd last unit, if any, one at a time as below.
  let lanes = i64x2.splat(0);
  const pairs = n & ~1;
  for (let j = 0; j < pairs; j += 2) {
    const off = <usize>j << 3;
    let all = i64x2.splat(-1);
    for (let c = 0; c < count; c++) {
      const row = rows + <usize>c * 24;
      const v = v128.load(<usize>load<u32>(row) + off);
      all = v128.and(all, v128.and(f64x2.ge(v, f64x2.splat(load<f64>(row, 8))), f64x2.le(v, f64x2.splat(load<f64>(row, 16)))));
    }
    lanes = i64x2.sub(lanes, all);
  }
  let total = <i32>(i64x2.extract_lane(lanes, 0) + i64x2.extract_lane(lanes, 1));
  for (let j = pairs; j < n; j++) {
    const off = <usize>j << 3;
    let all: i32 = 1;
    for (let c = 0; c < count; c++) {
      const row = rows + <usize>c * 24;
      const v = load<f64>(<usize>load<u32>(row) + off);
      all &= <i32>(v >= load<f64>(row, 8) && v <= load<f64>(row, 16));
    }
    total += all;
  }
  return total;
}

export function countOnes(flags: usize, n: i32): i32 {
  let count = 0;
  for (let j = 0; j < n; j++) count += <i32>load<u8>(flags + j);
  return count;
}

// ---------------------------------------------------------------------------------------------------------------
// The paired grade search's window marks (src/analysis/kernel/wasm-evaluator.ts): markInside for every window of a
// block in one call.

/**
 * For each of `count` windows (a row of countAllInside's table: the output column's address as u32, 4 bytes unused,
 * then lo and hi as f64), pass row c (at pass + c·rowStride) &= lo ≤ x[j] ≤ hi for j < n: markInside on each.
 */
export function markWindows(rows: usize, count: i32, n: i32, pass: usize, rowStride: usize): void {
  for (let c = 0; c < count; c++) {
    const row = rows + <usize>c * 24;
    markInside(<usize>load<u32>(row), n, load<f64>(row, 8), load<f64>(row, 16), pass + <usize>c * rowStride);
  }
}
