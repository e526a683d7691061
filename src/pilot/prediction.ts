// What the design's model predicts for a pilot build: the resolved supply with the ambient held at the measured
// ambient (else the design's one ambient, else 25 °C), run through the engine's public entry points (`analyze` for mean, σ, yield and the
// sensitivities; `firstTrials` for the trials themselves, the predicted distribution that the shape test and the
// projected yields read). The trials are the engine's own: same seed, same chunks.
import { firstTrials } from '../analysis/trial-values.js';
import { buildSupplyModel, type SupplySpec } from '../analysis/models/supply.js';
import type { Model } from '../analysis/model.js';
import type { AnalysisResult, OutputResult } from '../analysis/result.js';
import { kurtosisOf } from '../analysis/statistics/empirical-cdf.js';
import { REFERENCE_TEMPERATURE_C } from '../circuits/temperature.js';
import { analyzeAsChosen, silentProgress, type AnalysisChoice, type ProgressFactory } from '../design/analysis-choice.js';

/** Trials kept as the predicted distribution (sorted), at most the run's own: 1e5 puts the CDF within about 0.003. */
export const REFERENCE_TRIALS = 100_000;

export interface OutputPrediction {
  name: string;
  unit: string;
  /** The engine's result for this output (mean, σ, yield, contributions, histogram …). */
  result: OutputResult;
  /** Kurtosis E(y − μ)⁴/σ⁴ of the reference trials (3 for a normal). */
  kurtosis: number;
  /** The first REFERENCE_TRIALS trials of the output, ascending. */
  reference: Float64Array;
}

export interface PilotPrediction {
  ambientC: number;
  /**
   * 'measured': the mean of the CSV's ambient column; 'design': the CSV has none and the design holds one ambient
   * (temperature.fixed); 'default': 25 °C, neither says.
   */
  ambientSource: 'measured' | 'design' | 'default';
  spec: SupplySpec;
  model: Model;
  result: AnalysisResult;
  outputs: Record<string, OutputPrediction>;
  notes: string[];
}

/** The supply with its Monte Carlo ambient held at `ambientC` (the range widened to include it if needed). */
export function specAtAmbient(spec: SupplySpec, ambientC: number): SupplySpec {
  const t = spec.temperature;
  return { ...spec, temperature: { minC: Math.min(t.minC, ambientC), maxC: Math.max(t.maxC, ambientC), monteCarlo: { fixedC: ambientC } } };
}

/** The trials of every output for a supply, as the engine draws them for `result` (first `count`). */
export function trialOutputs(model: Model, result: AnalysisResult, choice: AnalysisChoice, count: number): Float64Array[] {
  const stream = { seed: result.seed, chunkSize: result.chunkSize, runTrials: choice.trials === 'auto' ? 0 : result.trials };
  return firstTrials(model, stream, Math.min(count, result.trials)).outputs;
}

export async function predictPilot(spec: SupplySpec, measuredAmbientC: number[] | null, choice: AnalysisChoice, progressFor: ProgressFactory = silentProgress): Promise<PilotPrediction> {
  const notes: string[] = [];
  let ambientC = REFERENCE_TEMPERATURE_C;
  let ambientSource: PilotPrediction['ambientSource'] = 'default';
  if (measuredAmbientC && measuredAmbientC.length > 0) {
    ambientC = measuredAmbientC.reduce((a, b) => a + b, 0) / measuredAmbientC.length;
    ambientSource = 'measured';
    const lo = Math.min(...measuredAmbientC);
    const hi = Math.max(...measuredAmbientC);
    notes.push(
      lo === hi
        ? `Prediction at the measured ambient, ${ambientC.toFixed(1)} °C.`
        : `Units were measured at ${lo.toFixed(1)}–${hi.toFixed(1)} °C; the prediction holds the ambient at their mean, ${ambientC.toFixed(1)} °C.`,
    );
  } else if (spec.temperature.minC === spec.temperature.maxC) {
    // The design holds its ambient at one value (temperature.fixed): units without a measured ambient run there.
    ambientC = spec.temperature.minC;
    ambientSource = 'design';
    notes.push(`The CSV gives no ambient column: the prediction holds the ambient at the design's one ambient, ${ambientC} °C.`);
  } else {
    notes.push('The CSV gives no ambient column: the prediction holds the ambient at 25 °C.');
  }
  if (ambientC < spec.temperature.minC || ambientC > spec.temperature.maxC) {
    notes.push(`The measured ambient lies outside the design's range ${spec.temperature.minC}..${spec.temperature.maxC} °C; the prediction extends the model to it.`);
  }
  const atAmbient = specAtAmbient(spec, ambientC);
  const model = buildSupplyModel(atAmbient);
  const result = await analyzeAsChosen(atAmbient, choice, 'pilot prediction', progressFor);
  const trials = trialOutputs(model, result, choice, REFERENCE_TRIALS);
  const outputs: Record<string, OutputPrediction> = {};
  model.outputs.forEach((o, i) => {
    const reference = Float64Array.from(trials[i]!).sort();
    outputs[o.name] = { name: o.name, unit: o.unit, result: result.outputs[o.name]!, kurtosis: kurtosisOf(reference), reference };
  });
  if (model.parts.some((p) => p.kind === 'drift')) {
    notes.push('The prediction keeps the long-term drift allowances of the design file; units fresh from the line have not drifted yet, so their spread may be a little narrower than predicted.');
  }
  return { ambientC, ambientSource, spec: atAmbient, model, result, outputs, notes };
}
