// A circuit as the engine sees it: uncertain parts in, named outputs out, evaluated a block of trials at a time.
// Monte Carlo, worst case, RSS and sensitivities all work on any Model.
import type { Part } from '../tolerance/part.js';

export interface ModelOutput {
  /** Short name: 'vout', 'ilimit', 'shuntLoss', 'ampOutput', 'dividerCurrent', or a picker's own. */
  name: string;
  /** SI unit symbol: 'V', 'A', 'W'. */
  unit: string;
  /** Acceptance window [lo, hi] for yield, ppm out, Cp and Cpk. */
  spec?: [number, number];
  /**
   * Which of the window's limits the design gave: 'both' (default), or only the 'low' or the 'high' one (the other
   * end is there to count units, e.g. an adjustable output's reach). One-sided windows get Cpl or Cpu, no Cp.
   */
  specSides?: 'both' | 'low' | 'high';
  /**
   * Fills out[j] for j < n from the part values p[i][j] (p has one Float64Array per part, in `Model.parts` order).
   * Must be a plain loop: no allocation per trial, no randomness, no I/O.
   */
  evaluate(p: Float64Array[], out: Float64Array, n: number): void;
}

export interface Model {
  parts: Part[];
  outputs: ModelOutput[];
  /**
   * Optional fast path: fills outs[o] (one array per output, in `outputs` order) for every output in one pass,
   * giving exactly what each output's own `evaluate` gives. The Monte Carlo engine uses it when present.
   */
  evaluateAll?(p: Float64Array[], outs: Float64Array[], n: number): void;
  /** Notes on how the model treats its parts (e.g. 'Monte Carlo at a fixed 25 °C'); reports show them. */
  notes?: string[];
  /**
   * The operating range as the per-unit check sees it: the part that holds the ambient temperature and the
   * temperatures (°C) at which every unit is evaluated (src/analysis/unit-check.ts). Without it a unit is checked
   * at the values drawn for it, ambient included if the model has one.
   */
  ambient?: { part: number; gridC: number[] };
}

/** Evaluates one output at a single point (one value per part): for nominal values and checks, not hot loops. */
export function evaluateAt(output: ModelOutput, values: ArrayLike<number>): number {
  const p = Array.from(values, (v) => Float64Array.of(v));
  const out = new Float64Array(1);
  output.evaluate(p, out, 1);
  return out[0]!;
}

/** The output values with every part at its nominal value. */
export function nominalOutputs(model: Model): Record<string, number> {
  const values = model.parts.map((part) => part.nominal);
  const result: Record<string, number> = {};
  for (const output of model.outputs) result[output.name] = evaluateAt(output, values);
  return result;
}

/** What evaluates a model's outputs over n trials: evaluateOutputs, or the same to the bit elsewhere (the
 *  WebAssembly kernel's evaluator, src/analysis/kernel/wasm-evaluator.ts). */
export type OutputsEvaluator = (model: Model, p: Float64Array[], outs: Float64Array[], n: number) => void;

/** Evaluates every output over n trials, through `evaluateAll` when the model has it. */
export function evaluateOutputs(model: Model, p: Float64Array[], outs: Float64Array[], n: number): void {
  if (model.evaluateAll) {
    model.evaluateAll(p, outs, n);
    return;
  }
  model.outputs.forEach((output, o) => output.evaluate(p, outs[o]!, n));
}

/** Looks up an output by name; throws if the model has none of that name. */
export function findOutput(model: Model, name: string): ModelOutput {
  const output = model.outputs.find((o) => o.name === name);
  if (!output) throw new Error(`model has no output named ${name} (has ${model.outputs.map((o) => o.name).join(', ')})`);
  return output;
}
