// Worker thread of the Monte Carlo engine: rebuilds the Model from its JSON source, then runs the chunks the main
// thread hands it and posts each chunk's summary back (buffers transferred, not copied).
import { parentPort } from 'node:worker_threads';
import type { ChunkConfig, ChunkSummary } from './chunk.js';
import { createChunkRunner, type ChunkComputer } from './kernel/choice.js';
import { buildFromSource, type ModelSource } from './model-source.js';

/** Every message names its run: a pooled worker serves run after run. */
export type ToWorker = { type: 'init'; run: number; source: ModelSource; config: ChunkConfig } | { type: 'chunk'; run: number; k: number };
export type FromWorker = { type: 'chunk'; run: number; summary: ChunkSummary } | { type: 'error'; run: number; message: string };

function transferList(summary: ChunkSummary): ArrayBuffer[] {
  // Every output's counts share one buffer; list each buffer once.
  const list = new Set<ArrayBuffer>();
  for (const o of [...summary.outputs, ...(summary.ambient ?? []).flat()]) {
    list.add(o.counts.buffer as ArrayBuffer);
    if (o.samples) list.add(o.samples.buffer as ArrayBuffer);
  }
  return [...list];
}

if (parentPort) {
  const port = parentPort;
  let runner: ChunkComputer | null = null;
  let runnerRun = -1;
  port.on('message', (message: ToWorker) => {
    try {
      if (message.type === 'init') {
        runner = createChunkRunner(buildFromSource(message.source), message.config, message.source);
        runnerRun = message.run;
      } else {
        // A chunk of a run that has since been replaced is skipped (its answer would be ignored anyway).
        if (message.run !== runnerRun || !runner) return;
        const summary = runner.run(message.k);
        port.postMessage({ type: 'chunk', run: message.run, summary } satisfies FromWorker, transferList(summary));
      }
    } catch (error) {
      port.postMessage({ type: 'error', run: message.run, message: error instanceof Error ? error.message : String(error) } satisfies FromWorker);
    }
  });
}
