// The joint yield of trial-values.ts (every spec window met by one unit), computed chunk by chunk with a pause for the
// event loop every few chunks, so a long run on the calling thread (grades with many trials) still answers Ctrl-C at
// once. Draws exactly as forEachTrialChunk does (chunk k from its (seed, k) stream, the engine's chunk lengths), so the answer
// is identical to jointYield's: test/determinism.test.ts checks that.
import type { Model } from './model.js';
import { jointCounter, trialChunks, type JointYield, type TrialStream } from './trial-values.js';

/** Chunks between pauses: one. A chunk of 65536 trials of the charger example takes about 0.08 s on one core (8 took
 * 0.65 s idle and over 2 s on a loaded machine before Ctrl-C was answered); a pause costs microseconds. */
const CHUNKS_PER_PAUSE = 1;

const pause = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

/** Same result as jointYield(model, stream, trials); yields to the event loop between groups of chunks. */
export async function jointYieldAsync(model: Model, stream: TrialStream, trials: number): Promise<JointYield> {
  const counter = jointCounter(model);
  let k = 0;
  for (const chunk of trialChunks(model, stream, trials)) {
    counter.add(chunk.parts, chunk.outputs, chunk.n);
    if (++k % CHUNKS_PER_PAUSE === 0) await pause();
  }
  return counter.result(trials);
}
