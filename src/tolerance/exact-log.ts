// Natural logarithm written out in IEEE 754 double arithmetic only (+, −, ×, ÷ and integer operations on the
// bits), so the Monte Carlo engine's JavaScript path and its WebAssembly kernel (src/analysis/kernel/assembly/exact-log.ts, the same
// operations in the same order) give the same bits on any machine: WebAssembly has no log instruction, and a
// JavaScript engine's Math.log is not bound by any standard to one result.
//
// The algorithm is fdlibm's __ieee754_log (Sun Microsystems, 1993, e_log.c; the method and constants as written
// there, recalled from memory): reduce x = 2^k·(1 + f) with √2/2 < 1 + f < √2, then
// log(1 + f) = f − s·(f − R) with s = f/(2 + f) and R a degree-14 polynomial in s (Remez, error below 2^−58.45),
// and log(x) = k·ln2_hi + (… + k·ln2_lo). test/exact-log.test.ts checks it against Math.log bit for bit over many
// arguments (V8's Math.log is a port of the same fdlibm routine) and against log's identities.

const LN2_HI = 6.93147180369123816490e-1; // 0x3fe62e42 fee00000
const LN2_LO = 1.90821492927058770002e-10; // 0x3dea39ef 35793c76
const TWO54 = 1.8014398509481984e16; // 2^54
const LG1 = 6.666666666666735130e-1;
const LG2 = 3.999999999940941908e-1;
const LG3 = 2.857142874366239149e-1;
const LG4 = 2.222219843214978396e-1;
const LG5 = 1.818357216161805012e-1;
const LG6 = 1.531383769920937332e-1;
const LG7 = 1.479819860511658591e-1;

// The bits of one double (little-endian: word 0 low, word 1 high), reused for every call.
const bits = new Float64Array(1);
const words = new Int32Array(bits.buffer);

/** log(x) as fdlibm computes it: −Infinity at ±0, NaN below 0 and for NaN, +Infinity at +Infinity. */
export function exactLog(x: number): number {
  bits[0] = x;
  let hx = words[1]!;
  const lx = words[0]!;
  let k = 0;
  if (hx < 0x00100000) {
    // x < 2^−1022: zero, negative or subnormal.
    if (((hx & 0x7fffffff) | lx) === 0) return -Infinity;
    if (hx < 0) return NaN;
    k -= 54;
    x *= TWO54;
    bits[0] = x;
    hx = words[1]!;
  }
  if (hx >= 0x7ff00000) return x + x;
  k += (hx >> 20) - 1023;
  hx &= 0x000fffff;
  const i0 = (hx + 0x95f64) & 0x100000;
  // Normalise x or x/2 into [√2/2, √2).
  bits[0] = x;
  words[1] = hx | (i0 ^ 0x3ff00000);
  x = bits[0]!;
  k += i0 >> 20;
  const f = x - 1.0;
  if ((0x000fffff & (2 + hx)) < 3) {
    // −2^−20 ≤ f < 2^−20.
    if (f === 0) {
      if (k === 0) return 0;
      const dk = k;
      return dk * LN2_HI + dk * LN2_LO;
    }
    const r = f * f * (0.5 - 0.33333333333333333 * f);
    if (k === 0) return f - r;
    const dk = k;
    return dk * LN2_HI - ((r - dk * LN2_LO) - f);
  }
  const s = f / (2.0 + f);
  const dk = k;
  const z = s * s;
  let i = hx - 0x6147a;
  const w = z * z;
  const j = 0x6b851 - hx;
  const t1 = w * (LG2 + w * (LG4 + w * LG6));
  const t2 = z * (LG1 + w * (LG3 + w * (LG5 + w * LG7)));
  i |= j;
  const r = t2 + t1;
  if (i > 0) {
    const hfsq = 0.5 * f * f;
    if (k === 0) return f - (hfsq - s * (hfsq + r));
    return dk * LN2_HI - ((hfsq - (s * (hfsq + r) + dk * LN2_LO)) - f);
  }
  if (k === 0) return f - s * (f - r);
  return dk * LN2_HI - ((s * (f - r) - dk * LN2_LO) - f);
}
