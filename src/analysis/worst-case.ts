// Worst case (extreme-value analysis): the output's min and max over every combination of band ends of the parts
// that vary (tolerance extremes × temperature corners × coefficient extremes). Exact for outputs monotonic in each
// part over its band, which holds for dividers and current-sense transfers. Vertices are evaluated a block at a
// time through the model's own loop (the scalar `cornerExtremes` in corners.ts is the reference it is tested
// against). Beyond `maxVariables` varying parts (2^20 ≈ 1e6 vertices by default), the vertex given by the signs of
// the sensitivity coefficients is taken (at each temperature corner, see below) and then checked by flipping one
// part at a time until no single flip improves it: a local search, not a proof, so the result says which method
// gave it.
import { partHigh, partLow, partVaries } from '../tolerance/part.js';
import { partMean } from '../tolerance/sample.js';
import { evaluateOutputs, type Model, type OutputsEvaluator } from './model.js';
import type { WorstCaseResult } from './result.js';
import { sensitivities } from './sensitivity.js';

export const DEFAULT_MAX_ENUMERATION_VARIABLES = 20;
/** Vertices evaluated per call. */
export const WORST_CASE_BLOCK = 4096;
const BLOCK = WORST_CASE_BLOCK;

export interface WorstCaseOptions {
  maxVariables?: number;
  /** What evaluates the model over a block of vertices (default evaluateOutputs; the kernel's evaluator gives the
   *  same bits). */
  evaluate?: OutputsEvaluator;
}

export interface WorstCaseOutput extends WorstCaseResult {
  name: string;
}

function describeVertex(model: Model, varying: number[], bits: ArrayLike<number>): Record<string, 'low' | 'high'> {
  const vertex: Record<string, 'low' | 'high'> = {};
  varying.forEach((partIndex, v) => {
    vertex[model.parts[partIndex]!.name] = bits[v] ? 'high' : 'low';
  });
  return vertex;
}

export function worstCase(model: Model, options: WorstCaseOptions = {}): WorstCaseOutput[] {
  const maxVariables = options.maxVariables ?? DEFAULT_MAX_ENUMERATION_VARIABLES;
  const varying = model.parts.map((part, i) => (partVaries(part) ? i : -1)).filter((i) => i >= 0);
  return varying.length <= maxVariables ? enumerate(model, varying, options.evaluate ?? evaluateOutputs) : bySensitivitySigns(model, varying);
}

function enumerate(model: Model, varying: number[], evaluate: OutputsEvaluator): WorstCaseOutput[] {
  const parts = model.parts;
  const count = 2 ** varying.length;
  const block = Math.min(BLOCK, count);
  const p = parts.map((part) => new Float64Array(block).fill(part.nominal));
  const lo = varying.map((i) => partLow(parts[i]!));
  const hi = varying.map((i) => partHigh(parts[i]!));
  const outs = model.outputs.map(() => new Float64Array(block));
  const best = model.outputs.map(() => ({ min: Infinity, max: -Infinity, minVertex: 0, maxVertex: 0 }));
  for (let start = 0; start < count; start += block) {
    const n = Math.min(block, count - start);
    for (let v = 0; v < varying.length; v++) {
      const column = p[varying[v]!]!;
      const l = lo[v]!;
      const h = hi[v]!;
      fillVertexColumn(column, start, n, v, l, h);
    }
    evaluate(model, p, outs, n);
    model.outputs.forEach((_output, o) => {
      const out = outs[o]!;
      const b = best[o]!;
      for (let j = 0; j < n; j++) {
        const y = out[j]!;
        if (y < b.min) {
          b.min = y;
          b.minVertex = start + j;
        }
        if (y > b.max) {
          b.max = y;
          b.maxVertex = start + j;
        }
      }
    });
  }
  const bitsOf = (vertex: number): number[] => varying.map((_, v) => ((vertex / 2 ** v) % 2 >= 1 ? 1 : 0));
  return model.outputs.map((output, o) => ({
    name: output.name,
    min: best[o]!.min,
    max: best[o]!.max,
    minVertex: describeVertex(model, varying, bitsOf(best[o]!.minVertex)),
    maxVertex: describeVertex(model, varying, bitsOf(best[o]!.maxVertex)),
    method: 'enumeration' as const,
    evaluations: count,
  }));
}

/** column[j] = bit v of vertex (start + j) ? high : low. Integer bit operations while the vertex numbers fit 31 bits. */
function fillVertexColumn(column: Float64Array, start: number, n: number, v: number, low: number, high: number): void {
  if (start + n <= 2 ** 31 && v < 31) {
    for (let j = 0; j < n; j++) column[j] = ((start + j) >>> v) & 1 ? high : low;
  } else {
    for (let j = 0; j < n; j++) column[j] = ((start + j) / 2 ** v) % 2 >= 1 ? high : low;
  }
}

function bySensitivitySigns(model: Model, varying: number[]): WorstCaseOutput[] {
  const parts = model.parts;
  // Temperature multiplies every coefficient (R·(1 + α·ΔT)): at 25 °C the coefficients' sensitivities vanish and at
  // the mean coefficient (0) the temperature's does. So the temperature corners are enumerated, and the sign
  // vertex of the other parts is taken with the sensitivities at each corner.
  const corners = varying.filter((i) => parts[i]!.kind === 'temperature');
  const cornerCount = 2 ** corners.length;
  const base = parts.map(partMean);
  const signSets: number[][][] = [];
  for (let corner = 0; corner < cornerCount; corner++) {
    const point = base.slice();
    corners.forEach((i, b) => (point[i] = (corner >>> b) & 1 ? partHigh(parts[i]!) : partLow(parts[i]!)));
    signSets.push(sensitivities(model, point));
  }
  const point = parts.map((part) => Float64Array.of(part.nominal));
  const out = new Float64Array(1);
  return model.outputs.map((output, o) => {
    let evaluations = 0;
    const at = (bits: number[]): number => {
      varying.forEach((i, v) => (point[i]![0] = bits[v] ? partHigh(parts[i]!) : partLow(parts[i]!)));
      output.evaluate(point, out, 1);
      evaluations++;
      return out[0]!;
    };
    const search = (sign: 1 | -1, corner: number): { value: number; bits: number[] } => {
      const c = signSets[corner]![o]!;
      const bits: number[] = varying.map((i) => {
        const b = corners.indexOf(i);
        if (b >= 0) return (corner >>> b) & 1;
        return sign * c[i]! >= 0 ? 1 : 0;
      });
      let value = sign * at(bits);
      for (let round = 0, improved = true; improved && round < 10; round++) {
        improved = false;
        for (let v = 0; v < varying.length; v++) {
          bits[v] = 1 - bits[v]!;
          const trial = sign * at(bits);
          if (trial > value) {
            value = trial;
            improved = true;
          } else {
            bits[v] = 1 - bits[v]!;
          }
        }
      }
      return { value: sign * value, bits };
    };
    let high = search(1, 0);
    let low = search(-1, 0);
    for (let corner = 1; corner < cornerCount; corner++) {
      const h = search(1, corner);
      if (h.value > high.value) high = h;
      const l = search(-1, corner);
      if (l.value < low.value) low = l;
    }
    return {
      name: output.name,
      min: low.value,
      max: high.value,
      minVertex: describeVertex(model, varying, low.bits),
      maxVertex: describeVertex(model, varying, high.bits),
      method: 'sensitivity-signs' as const,
      evaluations,
    };
  });
}
