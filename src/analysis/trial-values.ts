// The values of individual Monte Carlo trials, drawn exactly as the engine draws them (chunk k from its own stream
// started from SHA-256 of (seed, k) (chunk-random.ts), part i taking the chunk's draws i·n … (i+1)·n − 1, then every output evaluated: the same calls
// as ChunkRunner.run, drawChunkParts then evaluateOutputs), so trial j here is trial j of the engine's run with the
// same seed, chunk size and trial count. Used for the samples CSV and for the joint yield (every spec met by one
// unit), which the per-output summaries cannot give.
import { DEFAULT_CHUNK_SIZE, drawChunkParts } from './chunk.js';
import { evaluateOutputs, type Model } from './model.js';
import type { Interval } from './result.js';
import { wilsonInterval } from './statistics/wilson.js';
import { checkedOutputs, countPassing, UnitChecker } from './unit-check.js';

export interface TrialStream {
  seed: string;
  /** Trials per chunk (the engine's default unless the run changed it). */
  chunkSize?: number;
  /** The run's total trial count (the last chunk may be short), or 0 for an open-ended ('auto') run. */
  runTrials: number;
}

/** One chunk of drawn trials: part and output values of trials [offset, offset + n) (arrays reused between chunks). */
export interface TrialChunk {
  parts: Float64Array[];
  outputs: Float64Array[];
  n: number;
  offset: number;
}

/** The first `count` trials of a run, chunk by chunk, drawn and evaluated exactly as the engine does. */
export function* trialChunks(model: Model, stream: TrialStream, count: number): Generator<TrialChunk> {
  const chunkSize = stream.chunkSize ?? DEFAULT_CHUNK_SIZE;
  const p = model.parts.map(() => new Float64Array(chunkSize));
  const out = model.outputs.map(() => new Float64Array(chunkSize));
  for (let k = 0, offset = 0; offset < count; k++) {
    // The engine's chunk length: full chunks, the last one cut at the run's trial count.
    const length = stream.runTrials === 0 ? chunkSize : Math.max(0, Math.min(chunkSize, stream.runTrials - k * chunkSize));
    if (length === 0) break;
    drawChunkParts(model.parts, stream.seed, k, p, length);
    evaluateOutputs(model, p, out, length);
    const n = Math.min(length, count - offset);
    yield { parts: p, outputs: out, n, offset };
    offset += n;
  }
}

/** Calls `visit` chunk by chunk with the part values and output values of trials [offset, offset + n). */
export function forEachTrialChunk(
  model: Model,
  stream: TrialStream,
  count: number,
  visit: (parts: Float64Array[], outputs: Float64Array[], n: number, offset: number) => void,
): void {
  for (const chunk of trialChunks(model, stream, count)) visit(chunk.parts, chunk.outputs, chunk.n, chunk.offset);
}

export interface TrialValues {
  partNames: string[];
  outputNames: string[];
  /** parts[i][j]: part i in trial j; outputs[o][j]: output o in trial j. */
  parts: Float64Array[];
  outputs: Float64Array[];
  count: number;
}

/** The first `count` trials of a run, part values and outputs. */
export function firstTrials(model: Model, stream: TrialStream, count: number): TrialValues {
  const total = stream.runTrials === 0 ? count : Math.min(count, stream.runTrials);
  const parts = model.parts.map(() => new Float64Array(total));
  const outputs = model.outputs.map(() => new Float64Array(total));
  forEachTrialChunk(model, stream, total, (p, out, n, offset) => {
    p.forEach((values, i) => parts[i]!.set(values.subarray(0, n), offset));
    out.forEach((values, o) => outputs[o]!.set(values.subarray(0, n), offset));
  });
  return { partNames: model.parts.map((p) => p.name), outputNames: model.outputs.map((o) => o.name), parts, outputs, count: total };
}

export interface JointYield {
  /** Outputs with a spec window (the ones a unit must meet). */
  outputs: string[];
  trials: number;
  inSpec: number;
  /** Percent of units meeting every spec window at once at every ambient, with its 95 % Wilson interval in %. */
  pct: number;
  interval: Interval;
}

/**
 * Share of units in which every output with a spec window is inside it at every ambient of the grid: the yield of a
 * unit that must meet all of them (unit-check.ts). Equals the engine's allSpecs figure for the same run, and with one
 * spec window that output's per-unit yield.
 */
export function jointYield(model: Model, stream: TrialStream & { runTrials: number }, trials: number): JointYield {
  const counter = jointCounter(model);
  forEachTrialChunk(model, stream, trials, (p, out, n) => counter.add(p, out, n));
  return counter.result(trials);
}

/**
 * Counts units that meet every spec window at once, at every ambient of the model's grid (unit-check.ts: the same
 * test as the engine's all-specs yield).
 */
export function jointCounter(model: Model): { add(parts: Float64Array[], outputs: Float64Array[], n: number): void; result(trials: number): JointYield } {
  let checker: UnitChecker | null = null;
  let inSpec = 0;
  return {
    add(parts, outputs, n) {
      if (checker === null || parts[0]!.length > checker.all.length) checker = new UnitChecker(model, parts[0]?.length ?? n);
      checker.check(parts, n, outputs);
      inSpec += countPassing(checker.all, n);
    },
    result(trials) {
      return jointYieldOf(model, inSpec, trials);
    },
  };
}

/** The joint yield of `inSpec` units out of `trials`, with its 95 % Wilson interval (jointCounter's result). */
export function jointYieldOf(model: Model, inSpec: number, trials: number): JointYield {
  const w = wilsonInterval(inSpec, trials);
  return {
    outputs: checkedOutputs(model).map((c) => model.outputs[c.index]!.name),
    trials,
    inSpec,
    pct: trials > 0 ? (100 * inSpec) / trials : 0,
    interval: { low: 100 * w.low, high: 100 * w.high },
  };
}
