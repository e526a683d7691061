// Extreme-value (worst-case) check of a function over a box: evaluates every vertex of [lo, hi]^n.
// Exact for functions monotonic in each variable on the box (true of dividers and current-sense transfers
// over tolerance ranges); 2^n evaluations, so callers keep n small (about 20 at most).
import { InputError } from '../errors.js';

export interface CornerExtremes {
  min: number;
  max: number;
  /** Vertex index bits: bit i set means variable i at its high bound. */
  minVertex: number;
  maxVertex: number;
}

export const MAX_CORNER_VARIABLES = 24;

export function cornerExtremes(f: (x: Float64Array) => number, lo: ArrayLike<number>, hi: ArrayLike<number>): CornerExtremes {
  const n = lo.length;
  if (n > MAX_CORNER_VARIABLES) {
    throw new InputError('worst case', `${n} uncertain variables is too many to enumerate`, `at most ${MAX_CORNER_VARIABLES}`);
  }
  const x = new Float64Array(n);
  let min = Infinity;
  let max = -Infinity;
  let minVertex = 0;
  let maxVertex = 0;
  const count = 2 ** n;
  for (let vertex = 0; vertex < count; vertex++) {
    for (let i = 0; i < n; i++) x[i] = (vertex >>> i) & 1 ? hi[i]! : lo[i]!;
    const y = f(x);
    if (y < min) {
      min = y;
      minVertex = vertex;
    }
    if (y > max) {
      max = y;
      maxVertex = vertex;
    }
  }
  return { min, max, minVertex, maxVertex };
}
