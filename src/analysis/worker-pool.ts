// A pool of Monte Carlo worker threads kept between runs, so commands that run several analyses (grades, design)
// start the threads once. A run checks workers out (spawning more if none is idle), holds them referenced while it
// runs and returns them idle and unreferenced afterwards, so an idle pool never keeps the process alive.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { PROJECT_ROOT } from '../project-root.js';

const idle: Worker[] = [];

function workerScript(): URL {
  const here = fileURLToPath(import.meta.url);
  // Running from TypeScript source (tests): a Worker needs the compiled JavaScript in dist/.
  const file = here.endsWith('.ts') ? join(PROJECT_ROOT, 'dist', 'src', 'analysis', 'mc-worker.js') : join(here, '..', 'mc-worker.js');
  if (!existsSync(file)) throw new Error(`Monte Carlo worker ${file} is missing: build first (npx tsc -p ${PROJECT_ROOT})`);
  return pathToFileURL(file);
}

/** Takes `count` workers for one run (idle ones first), referenced until they are given back. */
export function checkOutWorkers(count: number): Worker[] {
  const taken: Worker[] = [];
  while (taken.length < count && idle.length > 0) taken.push(idle.pop()!);
  if (taken.length < count) {
    const script = workerScript();
    while (taken.length < count) taken.push(new Worker(script));
  }
  for (const w of taken) w.ref();
  return taken;
}

/**
 * Starts worker threads ahead of a run, idle and unreferenced, so that their start-up (a new V8 instance and the
 * engine's modules) overlaps the caller's other work; the run then checks them out like any idle worker.
 */
export function startWorkersAhead(count: number): void {
  if (idle.length >= count) return;
  const script = workerScript();
  while (idle.length < count) {
    const w = new Worker(script);
    // A worker that fails while idle leaves the pool (a run would otherwise be handed a dead thread).
    w.on('error', () => {
      const i = idle.indexOf(w);
      if (i >= 0) idle.splice(i, 1);
    });
    w.unref();
    idle.push(w);
  }
}

/** Gives a run's workers back: healthy ones wait idle (unreferenced), broken ones are ended. */
export function giveBackWorkers(workers: Worker[], healthy: boolean): void {
  for (const w of workers) {
    w.removeAllListeners('message');
    w.removeAllListeners('error');
    if (healthy) {
      w.unref();
      idle.push(w);
    } else {
      void w.terminate();
    }
  }
}

/** Ends every idle worker (for tests and embedders that want a clean exit at once). */
export async function closeWorkerPool(): Promise<void> {
  const all = idle.splice(0);
  await Promise.all(all.map((w) => w.terminate()));
}
