// The joint yield of trial-values.ts (every spec window met by one unit), computed chunk by chunk with a pause for the
// event loop every few chunks, so a long run on the calling thread (grades with many trials) still answers Ctrl-C at
// once. Draws exactly as forEachTrialChunk does (chunk k from `${seed}:k`, the engine's chunk lengths), so the answer
// is identical to jointYield's: test/determinism.test.ts checks that.
import { partFromUnit } from '../tolerance/sample.js';
import { chunkState, fillXor128 } from './chunk-random.js';
import { DEFAULT_CHUNK_SIZE } from './chunk.js';
import { evaluateOutputs, type Model } from './model.js';
import { wilsonInterval } from './statistics/wilson.js';
import type { JointYield, TrialStream } from './trial-values.js';

/** Chunks between pauses: 8 chunks of 65536 trials take well under 0.1 s on the benchmark model. */
const CHUNKS_PER_PAUSE = 8;

const pause = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

/** Same result as jointYield(model, stream, trials); yields to the event loop between groups of chunks. */
export async function jointYieldAsync(model: Model, stream: TrialStream, trials: number): Promise<JointYield> {
  const checked = model.outputs.map((o, i) => ({ i, spec: o.spec })).filter((c): c is { i: number; spec: [number, number] } => c.spec !== undefined);
  const chunkSize = stream.chunkSize ?? DEFAULT_CHUNK_SIZE;
  const p = model.parts.map(() => new Float64Array(chunkSize));
  const out = model.outputs.map(() => new Float64Array(chunkSize));
  let inSpec = 0;
  for (let k = 0, offset = 0; offset < trials; k++) {
    if (k > 0 && k % CHUNKS_PER_PAUSE === 0) await pause();
    const length = stream.runTrials === 0 ? chunkSize : Math.max(0, Math.min(chunkSize, stream.runTrials - k * chunkSize));
    if (length === 0) break;
    const state = chunkState(stream.seed, k);
    for (let i = 0; i < model.parts.length; i++) {
      fillXor128(state, p[i]!, length);
      partFromUnit(model.parts[i]!, p[i]!, length);
    }
    evaluateOutputs(model, p, out, length);
    const n = Math.min(length, trials - offset);
    for (let j = 0; j < n; j++) {
      let ok = true;
      for (let c = 0; c < checked.length && ok; c++) {
        const v = out[checked[c]!.i]![j]!;
        const [lo, hi] = checked[c]!.spec;
        ok = v >= lo && v <= hi;
      }
      if (ok) inSpec++;
    }
    offset += n;
  }
  const w = wilsonInterval(inSpec, trials);
  return {
    outputs: checked.map((c) => model.outputs[c.i]!.name),
    trials,
    inSpec,
    pct: trials > 0 ? (100 * inSpec) / trials : 0,
    interval: { low: 100 * w.low, high: 100 * w.high },
  };
}
