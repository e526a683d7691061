// AssemblyScript twin of src/tolerance/exact-log.ts: fdlibm's __ieee754_log with the same operations in the same
// order, so the kernel and the JavaScript path give the same bits (test/wasm-kernel.test.ts compares them).
// Read that file for the method and its source.

const LN2_HI: f64 = 6.93147180369123816490e-1;
const LN2_LO: f64 = 1.90821492927058770002e-10;
const TWO54: f64 = 1.8014398509481984e16;
const LG1: f64 = 6.666666666666735130e-1;
const LG2: f64 = 3.999999999940941908e-1;
const LG3: f64 = 2.857142874366239149e-1;
const LG4: f64 = 2.222219843214978396e-1;
const LG5: f64 = 1.818357216161805012e-1;
const LG6: f64 = 1.531383769920937332e-1;
const LG7: f64 = 1.479819860511658591e-1;

@inline function highWord(x: f64): i32 {
  return <i32>(reinterpret<u64>(x) >> 32);
}

@inline function lowWord(x: f64): i32 {
  return <i32>reinterpret<u64>(x);
}

@inline function withHighWord(x: f64, hi: i32): f64 {
  return reinterpret<f64>((<u64>(<u32>hi) << 32) | (reinterpret<u64>(x) & 0xffffffff));
}

export function exactLog(x: f64): f64 {
  let hx = highWord(x);
  const lx = lowWord(x);
  let k: i32 = 0;
  if (hx < 0x00100000) {
    if (((hx & 0x7fffffff) | lx) == 0) return -Infinity;
    if (hx < 0) return NaN;
    k -= 54;
    x *= TWO54;
    hx = highWord(x);
  }
  if (hx >= 0x7ff00000) return x + x;
  k += (hx >> 20) - 1023;
  hx &= 0x000fffff;
  const i0 = (hx + 0x95f64) & 0x100000;
  x = withHighWord(x, hx | (i0 ^ 0x3ff00000));
  k += i0 >> 20;
  const f = x - 1.0;
  if ((0x000fffff & (2 + hx)) < 3) {
    if (f == 0) {
      if (k == 0) return 0;
      const dk = <f64>k;
      return dk * LN2_HI + dk * LN2_LO;
    }
    const r = f * f * (0.5 - 0.33333333333333333 * f);
    if (k == 0) return f - r;
    const dk = <f64>k;
    return dk * LN2_HI - ((r - dk * LN2_LO) - f);
  }
  const s = f / (2.0 + f);
  const dk = <f64>k;
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
    if (k == 0) return f - (hfsq - s * (hfsq + r));
    return dk * LN2_HI - ((hfsq - (s * (hfsq + r) + dk * LN2_LO)) - f);
  }
  if (k == 0) return f - s * (f - r);
  return dk * LN2_HI - ((s * (f - r) - dk * LN2_LO) - f);
}
