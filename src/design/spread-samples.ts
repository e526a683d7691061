// The first trials of a spread run, drawn again from the engine's own streams (same seed, same chunking, so they are
// the trials the run counted), with each column's unit: what the samples CSV (src/report/samples-csv.ts) writes.
// The trials come one engine chunk at a time (src/analysis/trial-values.ts), so a samples file of any length needs
// the memory of one chunk.
import { trialChunks, type TrialChunk } from '../analysis/trial-values.js';
import type { SpreadRun } from './spread-study.js';

export interface SpreadSamples {
  partNames: string[];
  /** Unit of each part column ('Ω', 'V', …). */
  partUnits: string[];
  outputNames: string[];
  outputUnits: string[];
  /** Trials the samples hold: the rows asked for, at most the run's own trial count. */
  count: number;
  /** The trials [0, count) chunk by chunk, drawn as the iteration asks (each call starts again from trial 0; a
   * chunk's arrays are reused for the next one). */
  chunks(): Generator<TrialChunk>;
}

/** The first `rows` trials of the run (at most the run's own trial count), parts and outputs. */
export function spreadSamples(run: SpreadRun, rows: number): SpreadSamples {
  const stream = {
    seed: run.result.seed,
    chunkSize: run.result.chunkSize,
    runTrials: run.choice.trials === 'auto' ? 0 : run.result.trials,
  };
  const count = Math.min(rows, run.result.trials);
  return {
    partNames: run.model.parts.map((p) => p.name),
    partUnits: run.model.parts.map((p) => p.unit),
    outputNames: run.model.outputs.map((o) => o.name),
    outputUnits: run.model.outputs.map((o) => o.unit),
    count,
    chunks: () => trialChunks(run.model, stream, count),
  };
}
