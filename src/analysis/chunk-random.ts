// The random stream of one chunk of Monte Carlo trials: seedrandom's xor128 generator (G. Marsaglia, "Xorshift
// RNGs", Journal of Statistical Software 8(14), 2003) started, for chunk k, from a state derived from (seed, k)
// through SHA-256 (FIPS 180-4, node:crypto). Seeding per chunk, never per worker, is what makes a run's numbers the
// same for any worker count.
//
// Why a hash: seedrandom's own string seeding of xor128 XORs the seed's character codes into the state and steps
// the generator, which is linear over GF(2); seeding chunk k with the string `${seed}:${k}` therefore made the
// state words of chunks 0, 1, 2 and 3 XOR to exactly zero (and likewise across seeds). SHA-256 of the stream's name
// gives each chunk 128 state bits with no linear relation to any other chunk's (test/chunk-seeding.test.ts).
//
// Why xor128: measured side by side on the development machine (2 cores, shared with other jobs, so absolute
// figures are noisy), seedrandom's Alea cost 7–13 ns per draw through its function call and its recurrence is
// latency-bound (a float→int→float chain per draw), so a plain loop did not beat the call; xor128 is pure 32-bit
// integer arithmetic and, written as a plain loop (`fillXor128`), cost 3.2–4.5 ns per draw in the same run.
// Its known weakness (it fails TestU01's linear-complexity and matrix-rank tests, from memory) matters for
// bit-level structure, not for Monte Carlo of smooth circuit functions.
//
// `fillXor128` continues exactly seedrandom's xor128 recurrence (lib/xor128.js: `next` and `(next() >>> 0) / 2^32`)
// from the same state, so it gives the same numbers as the library's generator given that state, call by call (a
// test checks it).
import { createHash } from 'node:crypto';
import { createRequire } from 'node:module';
import type seedrandomLibrary from 'seedrandom';
import type { UniformSource } from '../tolerance/uniform-source.js';

// seedrandom is loaded on first use: only the one-call-per-draw reference below needs it, and loading its CommonJS
// files cost about 30 ms of CPU time in every process and worker thread that imported this module (measured with
// process.cpuUsage around the import, Node 20 on the development machine), while the engine's fill loops never
// call it.
const require = createRequire(import.meta.url);
let seedrandom: typeof seedrandomLibrary | null = null;

/** The text whose SHA-256 gives chunk k's state: a prefix of our own, the seed and k, separated by NUL. */
export function chunkStreamName(seed: string, chunk: number): string {
  return `trimfree chunk stream\u0000${seed}\u0000${chunk}`;
}

/** xor128's state words for chunk k: the first 16 bytes of SHA-256(chunkStreamName), little-endian 32-bit words. */
export function chunkStateWords(seed: string, chunk: number): { x: number; y: number; z: number; w: number } {
  const digest = createHash('sha256').update(chunkStreamName(seed, chunk), 'utf8').digest();
  const words = { x: digest.readInt32LE(0), y: digest.readInt32LE(4), z: digest.readInt32LE(8), w: digest.readInt32LE(12) };
  // xor128 never leaves the all-zero state; a digest starting with 128 zero bits is not expected, but is handled.
  if ((words.x | words.y | words.z | words.w) === 0) words.w = 1;
  return words;
}

/** seedrandom's xor128 for chunk k started from chunkStateWords, one call per draw (the reference). */
export function chunkRandom(seed: string, chunk: number): UniformSource {
  seedrandom ??= require('seedrandom') as typeof seedrandomLibrary;
  return seedrandom.xor128('', { state: chunkStateWords(seed, chunk) });
}

/** xor128's state words [x, y, z, w]. A typed array: the fill loops then read and write it with the same access
 *  every time (a plain object's field representation varies with the seed, which upset V8's compiled loops). */
export type Xor128State = Int32Array;

/** xor128's starting state for chunk k (chunkStateWords as a typed array). */
export function chunkState(seed: string, chunk: number): Xor128State {
  const { x, y, z, w } = chunkStateWords(seed, chunk);
  return Int32Array.of(x, y, z, w);
}

const TWO_TO_MINUS_32 = 2.3283064365386963e-10;

// The fill loops below keep the state as a ring: step j writes the new word over word j mod 4, inside the loop, and
// `unrotate` puts the words back in x, y, z, w order afterwards. Nothing after a loop touches memory: V8 first
// compiles a long loop while it runs (on-stack replacement), and state stores placed after the loop, not yet run at
// that moment, made the compiled loop deoptimise on every later call (measured: the affine fill took about 2.5
// times as long on a thread where that happened).

/** Fills out[0..n) with the next n uniforms in [0, 1) and advances the state. */
export function fillXor128(state: Xor128State, out: Float64Array, n: number): void {
  uniformLoop(state, out, n);
  unrotate(state, n);
}

/**
 * Fills out[0..n) with lo + width·u for the next n uniforms u: the same numbers as fillXor128 followed by
 * uniformFromUnit (the same operations on each draw), in one pass over the buffer instead of two.
 */
export function fillXor128Affine(state: Xor128State, out: Float64Array, n: number, lo: number, width: number): void {
  affineLoop(state, out, n, lo, width);
  unrotate(state, n);
}

/** Advances the state by n draws without storing them (a part held fixed still consumes its stretch of the stream). */
export function skipXor128(state: Xor128State, n: number): void {
  skipLoop(state, n);
  unrotate(state, n);
}

/** After n steps of a fill loop, the words are s[n mod 4], s[(n + 1) mod 4], …: back to x, y, z, w order. */
function unrotate(s: Xor128State, n: number): void {
  const r = n & 3;
  if (r === 0) return;
  const x = s[r]!;
  const y = s[(r + 1) & 3]!;
  const z = s[(r + 2) & 3]!;
  const w = s[(r + 3) & 3]!;
  s[0] = x;
  s[1] = y;
  s[2] = z;
  s[3] = w;
}

function uniformLoop(s: Xor128State, out: Float64Array, n: number): void {
  let x = s[0]!;
  let y = s[1]!;
  let z = s[2]!;
  let w = s[3]!;
  for (let j = 0; j < n; j++) {
    const t = x ^ (x << 11);
    x = y;
    y = z;
    z = w;
    w ^= (w >>> 19) ^ t ^ (t >>> 8);
    s[j & 3] = w;
    out[j] = (w >>> 0) * TWO_TO_MINUS_32;
  }
}

function affineLoop(s: Xor128State, out: Float64Array, n: number, lo: number, width: number): void {
  let x = s[0]!;
  let y = s[1]!;
  let z = s[2]!;
  let w = s[3]!;
  for (let j = 0; j < n; j++) {
    const t = x ^ (x << 11);
    x = y;
    y = z;
    z = w;
    w ^= (w >>> 19) ^ t ^ (t >>> 8);
    s[j & 3] = w;
    out[j] = lo + width * ((w >>> 0) * TWO_TO_MINUS_32);
  }
}

function skipLoop(s: Xor128State, n: number): void {
  let x = s[0]!;
  let y = s[1]!;
  let z = s[2]!;
  let w = s[3]!;
  for (let j = 0; j < n; j++) {
    const t = x ^ (x << 11);
    x = y;
    y = z;
    z = w;
    w ^= (w >>> 19) ^ t ^ (t >>> 8);
    s[j & 3] = w;
  }
}
