// How many computing threads a run may use: what was asked (--workers or the design file's analysis.workers), but no
// more than the machine's cores. More threads than cores compute nothing faster and each holds its own copy of the
// model and chunk buffers: about 25 MB a worker thread (measured with /usr/bin/time -v, charger example, 2e6 trials:
// 1 thread 189 MB peak, 2 threads 215 MB); --workers 256 on two cores took 5.5 GB and 74 s for what 2 do in 146 MB
// and 1.4 s. Results never depend on the count (chunk k is seeded `${seed}:k` and merged in chunk order).
import { availableParallelism } from 'node:os';

/** Memory one more computing thread takes, for notes (measured, see above). */
export const BYTES_PER_WORKER = 25e6;

export interface WorkerCount {
  /** Threads the run will use. */
  workers: number;
  /** Why fewer than asked, when capped. */
  note?: string;
}

/** `requested` threads, capped at `cores` (default: os.availableParallelism()). */
export function cappedWorkerCount(requested: number, where: string, cores = availableParallelism()): WorkerCount {
  if (requested <= cores) return { workers: requested };
  return {
    workers: cores,
    note: `${where} ${requested} capped at the ${cores} cores of this machine (more threads are no faster and each takes about ${Math.round(BYTES_PER_WORKER / 1e6)} MB); results do not depend on the count`,
  };
}
