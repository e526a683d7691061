// Uniform (rectangular) distribution on [lo, hi]: mean (lo+hi)/2, σ = (hi−lo)/√12 (JCGM 101:2008, 6.4.2).
import type { UniformSource } from '../uniform-source.js';

/** In place: uniforms u in [0, 1) → lo + (hi − lo)·u. */
export function uniformFromUnit(buf: Float64Array, n: number, lo: number, hi: number): void {
  const width = hi - lo;
  for (let j = 0; j < n; j++) buf[j] = lo + width * buf[j]!;
}

export function fillUniform(out: Float64Array, n: number, lo: number, hi: number, random: UniformSource): void {
  for (let j = 0; j < n; j++) out[j] = random();
  uniformFromUnit(out, n, lo, hi);
}

export function uniformMean(lo: number, hi: number): number {
  return (lo + hi) / 2;
}

export function uniformSigma(lo: number, hi: number): number {
  return (hi - lo) / Math.sqrt(12);
}
