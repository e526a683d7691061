// The first trials of a spread run, drawn again from the engine's own streams (same seed, same chunking, so they are
// the trials the run counted), with each column's unit: what the samples CSV (src/report/samples-csv.ts) writes.
import { firstTrials, type TrialValues } from '../analysis/trial-values.js';
import type { SpreadRun } from './spread-study.js';

export interface SpreadSamples extends TrialValues {
  /** Unit of each part column ('Ω', 'V', …). */
  partUnits: string[];
  outputUnits: string[];
}

/** The first `rows` trials of the run (at most the run's own trial count), parts and outputs. */
export function spreadSamples(run: SpreadRun, rows: number): SpreadSamples {
  const stream = {
    seed: run.result.seed,
    chunkSize: run.result.chunkSize,
    runTrials: run.choice.trials === 'auto' ? 0 : run.result.trials,
  };
  const values = firstTrials(run.model, stream, Math.min(rows, run.result.trials));
  return {
    ...values,
    partUnits: run.model.parts.map((p) => p.unit),
    outputUnits: run.model.outputs.map((o) => o.unit),
  };
}
