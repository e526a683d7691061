// Reproducibility: the same seed gives bit-identical results for 1, 2 and 4 workers (chunk k always draws from its
// own stream started from SHA-256 of (seed, k), and chunk results merge in chunk order); different seeds give different numbers.
// Worker threads run the compiled JavaScript, so this file builds dist/ first (tsc emits even when another
// engineer's file has a type error; only the worker file matters here).
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyze } from '../src/analysis/analyze.js';
import { defaultThreads, MIN_TRIALS_PER_THREAD } from '../src/analysis/monte-carlo.js';
import type { SupplySpec } from '../src/analysis/models/supply.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { BENCH_SUPPLY } from '../src/bench/cvcc-spec.js';

beforeAll(() => {
  try {
    execFileSync(process.execPath, [join(PROJECT_ROOT, 'node_modules', 'typescript', 'bin', 'tsc'), '-p', PROJECT_ROOT], { stdio: 'pipe' });
  } catch {
    // Type errors elsewhere still emit; the check below is what matters.
  }
  expect(existsSync(join(PROJECT_ROOT, 'dist', 'src', 'analysis', 'mc-worker.js'))).toBe(true);
}, 180_000);

const spec: SupplySpec = BENCH_SUPPLY;

describe('Monte Carlo reproducibility across worker counts', () => {
  it('1, 2 and 4 workers: deep-equal results (exact quantiles, 5 chunks with a short last one)', async () => {
    const trials = 4 * 65536 + 1234;
    const [one, two, four] = await Promise.all([1, 2, 4].map((workers) => analyze(spec, { trials, seed: 'same', workers })));
    expect(one!.workers).toBe(1);
    expect(two!.workers).toBe(2);
    expect(four!.workers).toBe(4);
    const strip = (r: typeof one): unknown => ({ ...r, workers: 0 });
    expect(strip(two)).toEqual(strip(one));
    expect(strip(four)).toEqual(strip(one));
    expect(one!.outputs.vout!.quantileMethod).toBe('exact');
  }, 120_000);

  it('past the memory cap (histogram quantiles): still identical for 1 and 2 workers', async () => {
    const options = { trials: 3 * 65536, seed: 7, sampleMemoryBytes: 1024 };
    const [one, two] = await Promise.all([analyze(spec, { ...options, workers: 1 }), analyze(spec, { ...options, workers: 2 })]);
    expect(one.outputs.ilimit!.quantileMethod).toBe('histogram');
    expect({ ...two, workers: 0 }).toEqual({ ...one, workers: 0 });
  }, 120_000);

  it('adaptive runs stop at the same trial count whatever the worker count', async () => {
    const options = { trials: 'auto' as const, seed: 'adaptive', significantDigits: 1 };
    const [one, two] = await Promise.all([analyze(spec, { ...options, workers: 1 }), analyze(spec, { ...options, workers: 2 })]);
    expect(two.trials).toBe(one.trials);
    expect({ ...two, workers: 0 }).toEqual({ ...one, workers: 0 });
  }, 120_000);

  it('different seeds give different numbers; the same seed twice gives the same', async () => {
    const a = await analyze(spec, { trials: 20_000, seed: 'a', workers: 1 });
    const b = await analyze(spec, { trials: 20_000, seed: 'b', workers: 1 });
    const again = await analyze(spec, { trials: 20_000, seed: 'a', workers: 1 });
    expect(b.outputs.vout!.mean).not.toBe(a.outputs.vout!.mean);
    expect(b.outputs.ilimit!.interval95).not.toEqual(a.outputs.ilimit!.interval95);
    expect(again).toEqual(a);
  });

  it('pooled workers serve run after run: a fixed run right after an adaptive one that stopped early is unaffected', async () => {
    await analyze(spec, { trials: 'auto', seed: 'first', significantDigits: 1, workers: 2 });
    const pooled = await analyze(spec, { trials: 150_000, seed: 'second', workers: 2 });
    const alone = await analyze(spec, { trials: 150_000, seed: 'second', workers: 1 });
    expect({ ...pooled, workers: 0 }).toEqual({ ...alone, workers: 0 });
  }, 120_000);

  it('without a workers choice a small run stays on this thread, with the same numbers as on two threads', async () => {
    // The rule of MIN_TRIALS_PER_THREAD: one thread per 1e6 trials, at least one, at most every core.
    expect(defaultThreads(MIN_TRIALS_PER_THREAD - 1)).toBe(1);
    expect(defaultThreads(2 * MIN_TRIALS_PER_THREAD)).toBe(Math.min(2, availableParallelism()));
    expect(defaultThreads(1e10)).toBe(availableParallelism());
    const options = { trials: 2 * 65536 + 77, seed: 'default threads' };
    const [chosen, two] = await Promise.all([analyze(spec, options), analyze(spec, { ...options, workers: 2 })]);
    expect(chosen.workers).toBe(1);
    expect(two.workers).toBe(2);
    expect({ ...chosen, workers: 0 }).toEqual({ ...two, workers: 0 });
  }, 120_000);

  it('progress reaches the planned trial count, in order', async () => {
    const seen: number[] = [];
    await analyze(spec, { trials: 200_000, seed: 1, workers: 2, onProgress: (p) => seen.push(p.trialsDone) });
    expect(seen[seen.length - 1]).toBe(200_000);
    expect([...seen].sort((x, y) => x - y)).toEqual(seen);
  }, 120_000);
});
