// The random stream of one chunk of Monte Carlo trials: seedrandom's xor128 generator (G. Marsaglia, "Xorshift
// RNGs", Journal of Statistical Software 8(14), 2003) seeded with `${seed}:${k}` for chunk k. Seeding per chunk,
// never per worker, is what makes a run's numbers the same for any worker count.
//
// Why xor128: measured side by side on the development machine (2 cores, shared with other jobs, so absolute
// figures are noisy), seedrandom's Alea cost 7–13 ns per draw through its function call and its recurrence is
// latency-bound (a float→int→float chain per draw), so a plain loop did not beat the call; xor128 is pure 32-bit
// integer arithmetic and, written as a plain loop (`fillXor128`), cost 3.2–4.5 ns per draw in the same run.
// Its known weakness (it fails TestU01's linear-complexity and matrix-rank tests, from memory) matters for
// bit-level structure, not for Monte Carlo of smooth circuit functions.
//
// `fillXor128` continues exactly seedrandom's xor128 recurrence (lib/xor128.js: `next` and `(next() >>> 0) / 2^32`)
// from the state seedrandom computed from the seed, so it gives the same numbers as the library's generator, call by
// call (a test checks it).
import seedrandom from 'seedrandom';
import type { UniformSource } from '../tolerance/uniform-source.js';

export function chunkSeed(seed: string, chunk: number): string {
  return `${seed}:${chunk}`;
}

/** seedrandom's xor128 for chunk k, one call per draw (the reference). */
export function chunkRandom(seed: string, chunk: number): UniformSource {
  return seedrandom.xor128(chunkSeed(seed, chunk));
}

export interface Xor128State {
  x: number;
  y: number;
  z: number;
  w: number;
}

/** xor128's state after seedrandom seeded it for chunk k. */
export function chunkState(seed: string, chunk: number): Xor128State {
  const { x, y, z, w } = seedrandom.xor128(chunkSeed(seed, chunk), { state: true }).state();
  return { x, y, z, w };
}

const TWO_TO_MINUS_32 = 2.3283064365386963e-10;

/** Fills out[0..n) with the next n uniforms in [0, 1) and advances the state. */
export function fillXor128(state: Xor128State, out: Float64Array, n: number): void {
  let x = state.x | 0;
  let y = state.y | 0;
  let z = state.z | 0;
  let w = state.w | 0;
  for (let j = 0; j < n; j++) {
    const t = x ^ (x << 11);
    x = y;
    y = z;
    z = w;
    w ^= (w >>> 19) ^ t ^ (t >>> 8);
    out[j] = (w >>> 0) * TWO_TO_MINUS_32;
  }
  state.x = x;
  state.y = y;
  state.z = z;
  state.w = w;
}

/**
 * Fills out[0..n) with lo + width·u for the next n uniforms u: the same numbers as fillXor128 followed by
 * uniformFromUnit (the same operations on each draw), in one pass over the buffer instead of two.
 */
export function fillXor128Affine(state: Xor128State, out: Float64Array, n: number, lo: number, width: number): void {
  let x = state.x | 0;
  let y = state.y | 0;
  let z = state.z | 0;
  let w = state.w | 0;
  for (let j = 0; j < n; j++) {
    const t = x ^ (x << 11);
    x = y;
    y = z;
    z = w;
    w ^= (w >>> 19) ^ t ^ (t >>> 8);
    out[j] = lo + width * ((w >>> 0) * TWO_TO_MINUS_32);
  }
  state.x = x;
  state.y = y;
  state.z = z;
  state.w = w;
}

/** Advances the state by n draws without storing them (a part held fixed still consumes its stretch of the stream). */
export function skipXor128(state: Xor128State, n: number): void {
  let x = state.x | 0;
  let y = state.y | 0;
  let z = state.z | 0;
  let w = state.w | 0;
  for (let j = 0; j < n; j++) {
    const t = x ^ (x << 11);
    x = y;
    y = z;
    z = w;
    w ^= (w >>> 19) ^ t ^ (t >>> 8);
  }
  state.x = x;
  state.y = y;
  state.z = z;
  state.w = w;
}
