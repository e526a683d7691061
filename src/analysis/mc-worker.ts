// Worker thread of the Monte Carlo engine: rebuilds the Model from its JSON source, then runs the chunks the main
// thread hands it and posts each chunk's summary back (buffers transferred, not copied).
import { parentPort } from 'node:worker_threads';
import { ChunkRunner, type ChunkConfig, type ChunkSummary } from './chunk.js';
import { buildFromSource, type ModelSource } from './model-source.js';

export type ToWorker = { type: 'init'; source: ModelSource; config: ChunkConfig } | { type: 'chunk'; k: number } | { type: 'stop' };
export type FromWorker = { type: 'chunk'; summary: ChunkSummary } | { type: 'error'; message: string };

function transferList(summary: ChunkSummary): ArrayBuffer[] {
  // Every output's counts share one buffer; list each buffer once.
  const list = new Set<ArrayBuffer>();
  for (const o of summary.outputs) {
    list.add(o.counts.buffer as ArrayBuffer);
    if (o.samples) list.add(o.samples.buffer as ArrayBuffer);
  }
  return [...list];
}

if (parentPort) {
  const port = parentPort;
  let runner: ChunkRunner | null = null;
  port.on('message', (message: ToWorker) => {
    try {
      if (message.type === 'init') {
        runner = new ChunkRunner(buildFromSource(message.source), message.config);
      } else if (message.type === 'chunk') {
        if (!runner) throw new Error('chunk before init');
        const summary = runner.run(message.k);
        port.postMessage({ type: 'chunk', summary } satisfies FromWorker, transferList(summary));
      } else {
        port.close();
      }
    } catch (error) {
      port.postMessage({ type: 'error', message: error instanceof Error ? error.message : String(error) } satisfies FromWorker);
    }
  });
}
