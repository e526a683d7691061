// Triangular distribution on [lo, hi] with mode c, drawn by its inverse CDF (closed form):
//   u < (c−lo)/(hi−lo):  x = lo + √(u·(hi−lo)·(c−lo))   else  x = hi − √((1−u)·(hi−lo)·(hi−c)).
// mean = (lo + hi + c)/3, var = (lo² + hi² + c² − lo·hi − lo·c − hi·c)/18 (JCGM 101:2008, 6.4.5, for the
// symmetric case; the general form is the textbook one).
import type { UniformSource } from '../uniform-source.js';

/** In place: uniforms u in [0, 1) → the triangular inverse CDF. */
export function triangularFromUnit(buf: Float64Array, n: number, lo: number, mode: number, hi: number): void {
  const width = hi - lo;
  const split = width > 0 ? (mode - lo) / width : 0;
  const left = width * (mode - lo);
  const right = width * (hi - mode);
  for (let j = 0; j < n; j++) {
    const u = buf[j]!;
    buf[j] = u < split ? lo + Math.sqrt(u * left) : hi - Math.sqrt((1 - u) * right);
  }
}

export function fillTriangular(out: Float64Array, n: number, lo: number, mode: number, hi: number, random: UniformSource): void {
  for (let j = 0; j < n; j++) out[j] = random();
  triangularFromUnit(out, n, lo, mode, hi);
}

export function triangularMean(lo: number, mode: number, hi: number): number {
  return (lo + mode + hi) / 3;
}

export function triangularSigma(lo: number, mode: number, hi: number): number {
  return Math.sqrt((lo * lo + hi * hi + mode * mode - lo * hi - lo * mode - hi * mode) / 18);
}
