// Jumping xor128 ahead by n steps in one go. xor128's step is linear over GF(2) on its 128 state bits
// (G. Marsaglia, "Xorshift RNGs", J. Stat. Software 8(14), 2003: every operation is a shift or an XOR), so n steps
// are one 128×128 bit matrix Mⁿ, found by repeated squaring and applied to a state as the XOR of the columns its
// set bits select. The WebAssembly kernel uses it to start each part's stretch of a chunk's stream (part i takes
// draws i·n … (i+1)·n − 1) at once, and draws four parts side by side in SIMD lanes; the numbers are those of the
// one sequential stream (test/wasm-kernel.test.ts and test/xor128-jump.test.ts check it against stepping).

/** A 128×128 bit matrix: column b (the image of state bit b) in words 4b … 4b + 3 (x, y, z, w). */
type BitMatrix = Int32Array;

/** One xor128 step of a state [x, y, z, w], in place (chunk-random.ts's recurrence). */
export function xor128Step(s: Int32Array): void {
  const t = s[0]! ^ (s[0]! << 11);
  const w = s[3]!;
  s[0] = s[1]!;
  s[1] = s[2]!;
  s[2] = w;
  s[3] = w ^ (w >>> 19) ^ t ^ (t >>> 8);
}

/** M·s for a state s: the XOR of the columns of M at s's set bits. */
export function applyBitMatrix(m: BitMatrix, s: ArrayLike<number>, out: Int32Array): void {
  let x = 0;
  let y = 0;
  let z = 0;
  let w = 0;
  for (let word = 0; word < 4; word++) {
    const v = s[word]!;
    for (let bit = 0; bit < 32; bit++) {
      if ((v >>> bit) & 1) {
        const c = 4 * (32 * word + bit);
        x ^= m[c]!;
        y ^= m[c + 1]!;
        z ^= m[c + 2]!;
        w ^= m[c + 3]!;
      }
    }
  }
  out[0] = x;
  out[1] = y;
  out[2] = z;
  out[3] = w;
}

function multiply(a: BitMatrix, b: BitMatrix): BitMatrix {
  const c = new Int32Array(512);
  const column = new Int32Array(4);
  for (let j = 0; j < 128; j++) {
    applyBitMatrix(a, b.subarray(4 * j, 4 * j + 4), column);
    c.set(column, 4 * j);
  }
  return c;
}

function stepMatrix(): BitMatrix {
  const m = new Int32Array(512);
  const s = new Int32Array(4);
  for (let b = 0; b < 128; b++) {
    s.fill(0);
    s[b >> 5] = 1 << (b & 31);
    xor128Step(s);
    m.set(s, 4 * b);
  }
  return m;
}

const cache = new Map<number, BitMatrix>();

/** Mⁿ, the matrix of n xor128 steps (kept per n: a run needs the chunk size and its last chunk's length). */
export function jumpMatrix(n: number): BitMatrix {
  let cached = cache.get(n);
  if (cached) return cached;
  let result: BitMatrix = new Int32Array(512);
  for (let b = 0; b < 128; b++) result[4 * b + (b >> 5)] = 1 << (b & 31);
  let power: BitMatrix = stepMatrix();
  for (let e = n; e > 0; e = Math.floor(e / 2)) {
    if (e % 2 === 1) result = multiply(power, result);
    if (e > 1) power = multiply(power, power);
  }
  if (cache.size > 16) cache.clear();
  cache.set(n, result);
  return result;
}
