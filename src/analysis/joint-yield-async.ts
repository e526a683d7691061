// The joint yield of trial-values.ts (every spec window met by one unit), computed chunk by chunk with a pause for the
// event loop every few chunks, so a long run on the calling thread (grades with many trials) still answers Ctrl-C at
// once. Draws exactly as forEachTrialChunk does (chunk k from its (seed, k) stream, the engine's chunk lengths), so the answer
// is identical to jointYield's: test/determinism.test.ts checks that. With a block checker (the WebAssembly
// evaluator, src/analysis/kernel/wasm-evaluator.ts) the units are drawn the same way and checked by it: the same
// flags as UnitChecker's (test/wasm-evaluator.test.ts), so the same count.
import { DEFAULT_CHUNK_SIZE, drawChunkParts } from './chunk.js';
import type { Model } from './model.js';
import type { BlockChecker } from './paired-trials.js';
import { jointCounter, jointYieldOf, trialChunks, type JointYield, type TrialStream } from './trial-values.js';

/** Chunks between pauses: one. A chunk of 65536 trials of the charger example takes about 0.08 s on one core (8 took
 * 0.65 s idle and over 2 s on a loaded machine before Ctrl-C was answered); a pause costs microseconds. */
const CHUNKS_PER_PAUSE = 1;

const pause = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

/** Same result as jointYield(model, stream, trials); yields to the event loop between groups of chunks. */
export async function jointYieldAsync(model: Model, stream: TrialStream, trials: number, checker: BlockChecker | null = null): Promise<JointYield> {
  if (checker) return jointYieldChecked(model, stream, trials, checker);
  const counter = jointCounter(model);
  let k = 0;
  for (const chunk of trialChunks(model, stream, trials)) {
    counter.add(chunk.parts, chunk.outputs, chunk.n);
    if (++k % CHUNKS_PER_PAUSE === 0) await pause();
  }
  return counter.result(trials);
}

/** The units of trialChunks (the same chunk lengths and draws), checked by `checker` block by block. */
async function jointYieldChecked(model: Model, stream: TrialStream, trials: number, checker: BlockChecker): Promise<JointYield> {
  const chunkSize = stream.chunkSize ?? DEFAULT_CHUNK_SIZE;
  const p = model.parts.map(() => new Float64Array(chunkSize));
  let inSpec = 0;
  for (let k = 0, offset = 0; offset < trials; k++) {
    const length = stream.runTrials === 0 ? chunkSize : Math.max(0, Math.min(chunkSize, stream.runTrials - k * chunkSize));
    if (length === 0) break;
    drawChunkParts(model.parts, stream.seed, k, p, length);
    const n = Math.min(length, trials - offset);
    for (let start = 0; start < n; start += checker.capacity) {
      const size = Math.min(checker.capacity, n - start);
      const all = checker.check(model, start === 0 && size === chunkSize ? p : p.map((c) => c.subarray(start, start + size)), size);
      for (let j = 0; j < size; j++) inSpec += all[j]!;
    }
    offset += n;
    if ((k + 1) % CHUNKS_PER_PAUSE === 0) await pause();
  }
  return jointYieldOf(model, inSpec, trials);
}
