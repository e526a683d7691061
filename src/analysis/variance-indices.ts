// Variance-based sensitivity indices: each part's share of an output's variance, interactions included.
//
// With independent parts x_1 … x_k and Y = f(x), the variance splits (Sobol' 1993, the ANOVA decomposition) into
// first-order terms V_i = Var(E[Y | x_i]) and interaction terms. Two shares per part:
//   first-order  S_i  = V_i / V(Y)                 what x_i does alone (interactions left out);
//   total-effect S_Ti = E[Var(Y | x_~i)] / V(Y)    what x_i does alone and together with any other part.
// Σ S_i ≤ 1, and Σ S_Ti ≥ 1: an interaction's variance is counted once in the share of every part it involves.
// A TCR × ambient temperature term is the case in point: with the range centred on 25 °C the TCR's first-order
// share is about 0 (so is its RSS share), while its total-effect share is large.
//
// Estimators (Saltelli et al. 2010, "Variance based sensitivity analysis of model output. Design and estimator for
// the total sensitivity index", Comput. Phys. Commun. 181:259–270, table 2; Jansen 1999, "Analysis of variance
// designs for model output", Comput. Phys. Commun. 117:35–43 — both from memory, the papers not at hand): two independent N × k sample matrices A and B of the parts, and for each part i the matrix
// A_B^i, equal to A except that its column i comes from B. Then, summing over the N rows j,
//   V_Ti ≈ (1/2N) Σ_j (f(A)_j − f(A_B^i)_j)²                 (Jansen 1999)
//   V_i  ≈ (1/N)  Σ_j (f(B)_j − μ̂)·(f(A_B^i)_j − f(A)_j)     (Saltelli et al. 2010)
//   V    ≈ (1/2N) Σ_j ((f(A)_j − μ̂)² + (f(B)_j − μ̂)²)        μ̂ the mean of f over A and B
// at N·(k + 2) evaluations of the model. Subtracting μ̂ from f(B) in V_i leaves its expectation unchanged
// (E[f(A_B^i) − f(A)] = 0) and removes the output's mean from the estimator's noise: without it, an 8.4 V output
// with a spread of millivolts would need millions of rows (a standard variance reduction; our own choice).
//
// Each share is a ratio of two means over the same rows, R = mean(x)/mean(e), with x_j the row's summand above and
// e_j the row's variance summand. Its standard error is the ratio estimator's (Cochran, Sampling Techniques, 3rd ed.
// 1977, section 6.3, from memory): SE(R)² ≈ Σ_j (x_j − R·e_j)² / (N(N − 1)·mean(e)²), which carries the noise of V
// and its correlation with the numerator. test/variance-indices.test.ts checks it against the spread of repeated
// estimates.
//
// The sample is the model's own: A and B are drawn with the engine's part drawing (drawChunkParts: each part from
// the distribution Monte Carlo uses) from a stream of their own, seeded from the run's seed under the name
// `variance-indices:${seed}` (its chunk 0), so the figures are reproducible and independent of the worker count
// and of the Monte Carlo's own trials. Pure: no I/O, no clock, no global random source.
import { partUnitMap } from '../tolerance/sample.js';
import { partVaries } from '../tolerance/part.js';
import { drawChunkParts } from './chunk.js';
import { evaluateOutputs, type Model, type OutputsEvaluator } from './model.js';
import { PairedSample } from './paired-trials.js';
import type { VarianceIndicesMethod } from './result.js';

/** Rows of A and of B. 8192 keeps the whole budget near 0.1 s on the bundled examples (measured, see the changelog)
 *  and the standard error of a share at about 0.01 or below. */
export const DEFAULT_BASE_SAMPLES = 8192;

/** The most rows evaluated in one call of the model (bounds the scratch memory whatever N is). */
/** Rows evaluated per call (a WebAssembly evaluator for these models takes blocks up to this size). */
export const VARIANCE_BLOCK = 8192;
const BLOCK = VARIANCE_BLOCK;

/** The estimator's name, as reports print it. */
export const VARIANCE_INDICES_ESTIMATOR =
  'total-effect: Jansen (1999); first-order: Saltelli et al. (2010); on independent sample matrices A, B and A_B^i';

/** The name the sample's stream is seeded under (its chunk 0 gives A, then B). */
export function varianceIndicesSeed(seed: string): string {
  return `variance-indices:${seed}`;
}

export interface VarianceIndicesOptions {
  seed: string;
  /** N, rows of each of A and B (default DEFAULT_BASE_SAMPLES). */
  baseSamples?: number;
  /**
   * The sample's units drawn once and shared by variants of one model (parts in other grades): from
   * varianceSample(seed, partCount), its 2N rows mapped to each variant's bands, so the rows are the same numbers
   * this function would draw, and a study of several variants draws them once (paired-trials.ts).
   */
  sample?: PairedSample;
  /** What evaluates the model (default evaluateOutputs; the kernel's evaluator gives the same bits). */
  evaluate?: OutputsEvaluator;
}

/** The A and B rows of varianceIndices drawn once, for every variant of a model with `partCount` parts. */
export function varianceSample(seed: string, partCount: number, baseSamples = DEFAULT_BASE_SAMPLES): PairedSample {
  return new PairedSample(partCount, { seed: varianceIndicesSeed(seed), trials: 2 * baseSamples, chunkSize: 2 * baseSamples });
}

export interface PartIndices {
  part: string;
  /** Total-effect index S_Ti (Jansen 1999 estimator), a fraction of the output's variance. */
  totalEffect: number;
  totalEffectStandardError: number;
  /** First-order index S_i (Saltelli et al. 2010 estimator), a fraction of the output's variance. */
  firstOrder: number;
  firstOrderStandardError: number;
}

export interface OutputIndices {
  name: string;
  /** V(Y) estimated from the 2N rows of A and B. */
  variance: number;
  /** One entry per part that has any spread, in the model's part order. */
  parts: PartIndices[];
}

export interface VarianceIndicesResult {
  method: VarianceIndicesMethod;
  outputs: OutputIndices[];
}

/** Computes the indices in one go. */
export function varianceIndices(model: Model, options: VarianceIndicesOptions): VarianceIndicesResult {
  const steps = varianceIndicesSteps(model, options);
  for (;;) {
    const step = steps.next();
    if (step.done) return step.value;
  }
}

/**
 * The same computation as a generator that pauses after each part's evaluations, so a caller on the event loop's
 * thread can answer signals between them (analyze.ts does). The result does not depend on how it is driven.
 */
export function* varianceIndicesSteps(model: Model, options: VarianceIndicesOptions): Generator<void, VarianceIndicesResult> {
  const n = options.baseSamples ?? DEFAULT_BASE_SAMPLES;
  if (!Number.isInteger(n) || n < 2) throw new Error(`variance indices: ${n} rows is not a usable sample size (a whole number ≥ 2)`);
  const parts = model.parts;
  const outputCount = model.outputs.length;
  const seed = varianceIndicesSeed(options.seed);
  // One stream, 2N rows per part: A takes the first N, B the last N. (Two streams seeded "name:0" and "name:1"
  // would not do: seedrandom's xor128 seeding is linear in the seed string, so such a pair differs by the same fixed
  // bit pattern whatever the name, and that bias showed in the estimates: Jansen's S_T of a part whose exact value
  // is 1 came out 1.03 ± 0.003 over 400 seeds.)
  let ab: Float64Array[];
  if (options.sample) {
    if (options.sample.seed !== seed || options.sample.trials !== 2 * n) throw new Error(`variance indices: the shared sample is not the one for seed ${options.seed} and N = ${n}`);
    ab = options.sample.columnsOf(model);
  } else {
    ab = parts.map(() => new Float64Array(2 * n));
    drawChunkParts(parts, seed, 0, ab, 2 * n);
  }
  const a = ab.map((column) => column.subarray(0, n));
  const b = ab.map((column) => column.subarray(n, 2 * n));

  const fA = model.outputs.map(() => new Float64Array(n));
  const fB = model.outputs.map(() => new Float64Array(n));
  const fAB = model.outputs.map(() => new Float64Array(n));
  const evaluate = options.evaluate ?? evaluateOutputs;
  evaluateInBlocks(evaluate, model, a, fA, n);
  evaluateInBlocks(evaluate, model, b, fB, n);
  let evaluations = 2 * n;
  const means = fA.map((ya, o) => meanOfBoth(ya, fB[o]!, n));
  const variances = fA.map((ya, o) => varianceSummands(ya, fB[o]!, means[o]!, n));
  yield;

  const perOutput: PartIndices[][] = model.outputs.map(() => []);
  for (let i = 0; i < parts.length; i++) {
    const part = parts[i]!;
    if (!partVaries(part)) continue;
    // A part Monte Carlo holds fixed (e.g. a fixed ambient) leaves A_B^i equal to A: its indices are exactly 0.
    if (partUnitMap(part).kind === 'constant') {
      for (let o = 0; o < outputCount; o++) perOutput[o]!.push(zeroIndices(part.name));
      continue;
    }
    // A_B^i: A's columns with column i taken from B (no copy: the column arrays are shared).
    const mixed = a.slice();
    mixed[i] = b[i]!;
    evaluateInBlocks(evaluate, model, mixed, fAB, n);
    evaluations += n;
    for (let o = 0; o < outputCount; o++) {
      perOutput[o]!.push(partIndices(part.name, fA[o]!, fB[o]!, fAB[o]!, means[o]!, variances[o]!, n));
    }
    yield;
  }
  return {
    method: { estimator: VARIANCE_INDICES_ESTIMATOR, baseSamples: n, evaluations, seed },
    outputs: model.outputs.map((output, o) => ({ name: output.name, variance: variances[o]!.mean, parts: perOutput[o]! })),
  };
}

function zeroIndices(part: string): PartIndices {
  return { part, totalEffect: 0, totalEffectStandardError: 0, firstOrder: 0, firstOrderStandardError: 0 };
}

/** Evaluates every output over rows [0, n) of the part columns p, BLOCK rows per call. */
function evaluateInBlocks(evaluate: OutputsEvaluator, model: Model, p: Float64Array[], outs: Float64Array[], n: number): void {
  for (let start = 0; start < n; start += BLOCK) {
    const end = Math.min(n, start + BLOCK);
    if (start === 0 && end === n) {
      evaluate(model, p, outs, n);
      continue;
    }
    evaluate(
      model,
      p.map((column) => column.subarray(start, end)),
      outs.map((column) => column.subarray(start, end)),
      end - start,
    );
  }
}

function meanOfBoth(ya: Float64Array, yb: Float64Array, n: number): number {
  let sum = 0;
  for (let j = 0; j < n; j++) sum += ya[j]! + yb[j]!;
  return sum / (2 * n);
}

/** The variance summands e_j = ((f(A)_j − μ̂)² + (f(B)_j − μ̂)²)/2, and their mean (the estimate of V). */
interface VarianceSummands {
  e: Float64Array;
  mean: number;
}

function varianceSummands(ya: Float64Array, yb: Float64Array, mu: number, n: number): VarianceSummands {
  const e = new Float64Array(n);
  let sum = 0;
  for (let j = 0; j < n; j++) {
    const da = ya[j]! - mu;
    const db = yb[j]! - mu;
    e[j] = (da * da + db * db) / 2;
    sum += e[j]!;
  }
  return { e, mean: sum / n };
}

/** Both indices of one part for one output, with their standard errors (ratio estimator, see the header). */
function partIndices(part: string, ya: Float64Array, yb: Float64Array, yab: Float64Array, mu: number, v: VarianceSummands, n: number): PartIndices {
  if (!(v.mean > 0)) return zeroIndices(part);
  let totalSum = 0;
  let firstSum = 0;
  for (let j = 0; j < n; j++) {
    const d = ya[j]! - yab[j]!;
    totalSum += (d * d) / 2;
    firstSum += (yb[j]! - mu) * (yab[j]! - ya[j]!);
  }
  const totalEffect = totalSum / n / v.mean;
  const firstOrder = firstSum / n / v.mean;
  // Second pass: Σ (x_j − R·e_j)² for each ratio.
  let totalResidual = 0;
  let firstResidual = 0;
  for (let j = 0; j < n; j++) {
    const d = ya[j]! - yab[j]!;
    const rt = (d * d) / 2 - totalEffect * v.e[j]!;
    const rf = (yb[j]! - mu) * (yab[j]! - ya[j]!) - firstOrder * v.e[j]!;
    totalResidual += rt * rt;
    firstResidual += rf * rf;
  }
  const scale = 1 / (v.mean * Math.sqrt(n * (n - 1)));
  return {
    part,
    totalEffect,
    totalEffectStandardError: Math.sqrt(totalResidual) * scale,
    firstOrder,
    firstOrderStandardError: Math.sqrt(firstResidual) * scale,
  };
}
