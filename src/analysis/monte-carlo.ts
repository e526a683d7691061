// Monte Carlo engine (JCGM 101:2008): trials in fixed chunks, chunk k drawn from its own generator started from
// SHA-256 of (seed, k) (chunk-random.ts), each trial one unit checked over the ambient grid (unit-check.ts), chunks spread over worker threads, each chunk reduced to moments + fine histogram (+ values while
// they fit the memory cap), and the reductions merged strictly in chunk order. Hence the same seed gives
// bit-identical results for 1, 2 or 16 workers. With workers = 1 (or a Model that has no JSON source) the chunks
// run on the calling thread.
import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import { ImpossibleError, InputError } from '../errors.js';
import { ChunkRunner, DEFAULT_CHUNK_SIZE, type ChunkConfig, type ChunkSummary, type OutputChunk } from './chunk.js';
import type { FromWorker, ToWorker } from './mc-worker.js';
import type { Model } from './model.js';
import { buildFromSource, type ModelSource } from './model-source.js';
import { chooseKernel, createChunkRunner, kernelNote, type KernelChoice } from './kernel/choice.js';
import { checkOutWorkers, giveBackWorkers, startWorkersAhead } from './worker-pool.js';
import type { AllSpecsYield, AmbientPoint, Interval, MonteCarloOutput, Percentile, YieldResult } from './result.js';
import { checkedOutputs } from './unit-check.js';

export type { MonteCarloOutput } from './result.js';
import { oneSidedCapability, processCapability } from './statistics/capability.js';
import { coverageCount, nearestRank, shortestIntervalOf, symmetricIntervalOf, symmetricStartRank } from './statistics/coverage.js';
import { OrderStatistics } from './statistics/order-statistics.js';
import {
  coarseHistogram,
  histogramBin,
  histogramPercentile,
  histogramQuantileBound,
  histogramShortestInterval,
  histogramSymmetricInterval,
  type FineHistogram,
} from './statistics/histogram.js';
import { mergeMoments, momentsSigma, type Moments } from './statistics/moments.js';
import { wilsonInterval } from './statistics/wilson.js';
import { adaptiveState, adaptiveStable, numericalTolerance, pushAdaptive, type AdaptiveState } from './adaptive.js';

export interface Progress {
  trialsDone: number;
  /** Planned trials; for an adaptive run, the cap. */
  trialsPlanned: number;
}

export interface MonteCarloOptions {
  /** A trial count, or 'auto' for the adaptive procedure of JCGM 101:2008 7.9. */
  trials: number | 'auto';
  seed: string | number;
  /**
   * Threads that compute chunks: this thread and workers − 1 worker threads. Default: one thread per
   * MIN_TRIALS_PER_THREAD trials, at least one, at most os.availableParallelism(). Results do not depend on it.
   */
  workers?: number;
  /** JSON the workers rebuild the model from; without it the run stays on this thread. */
  source?: ModelSource;
  /** Histogram range per output name (default: the observed range of a pilot chunk, widened). */
  ranges?: Record<string, { lo: number; hi: number }>;
  onProgress?: (progress: Progress) => void;
  /** Adaptive runs: significant digits of u(y) to stabilise (JCGM 101:2008 7.9.2), default 2. */
  significantDigits?: number;
  /** Adaptive runs: the most trials to spend, default 1e8. */
  maxTrials?: number;
  /** Memory for kept values (exact quantiles); past it quantiles come from the histogram. Default 256 MiB. */
  sampleMemoryBytes?: number;
  /** Fine histogram bins per output, default 8192. */
  histogramBins?: number;
  /** Trials per chunk, default 65536. Part of what a seed reproduces: change it and the numbers change. */
  chunkSize?: number;
  /**
   * Check every unit at each ambient of the model's grid (default true; see unit-check.ts). Off, yields are those of
   * units at the ambient drawn with them (the benchmark keeps this case for comparison across versions).
   */
  perUnit?: boolean;
  /**
   * Which kernel computes the chunks: 'auto' (default) the WebAssembly kernel for every supply spec it implements
   * and the JavaScript reference otherwise, or either one by name. Both give the same numbers; the notes say which ran.
   */
  kernel?: KernelChoice;
  /**
   * A summary for a caller that never shows the shortest coverage intervals or the per-ambient sweep (default false):
   * outputs without shortest95, shortest9973 and ambientSweep. The exact quantiles then gather and sort only the bins
   * of the ranks still reported (percentiles and the symmetric intervals' ends) rather than the two tails the shortest
   * intervals search, and the per-ambient histograms (which feed only the sweep's bands) are not merged. Every figure
   * a summary gives is the full run's: an order statistic is the same value whichever other ranks are gathered with
   * it, and Cp/Cpk come from the per-ambient moments, which are merged as before.
   */
  summary?: boolean;
}

export interface MonteCarloResult {
  seed: string;
  trials: number;
  workers: number;
  chunkSize: number;
  notes: string[];
  outputs: MonteCarloOutput[];
  /** The ambients every unit was checked at, °C; null when units were judged at their drawn ambient. */
  ambientGridC: number[] | null;
  /** Units that met every window at every ambient; null when no output has a window. */
  allSpecs: AllSpecsYield | null;
}

/** Percentiles reported for every output (the 0.135 and 99.865 pair bound the ±3σ-equivalent 99.73 %). */
export const REPORTED_PERCENTILES = [0.135, 1, 2.5, 5, 25, 50, 75, 95, 97.5, 99, 99.865];
const DEFAULT_SAMPLE_MEMORY = 256 * 1024 * 1024;
const DEFAULT_BINS = 8192;
const DEFAULT_MAX_TRIALS = 1e8;
/** Largest trial count accepted: 1e10 (the histogram counts stay exact far beyond, to 2^53). */
const MAX_TRIALS = 1e10;

class Accumulator {
  moments: Moments = { n: 0, mean: 0, m2: 0 };
  min = Infinity;
  max = -Infinity;
  inSpec = 0;
  unitInSpec = 0;
  belowSpec = 0;
  nonFinite = 0;
  counts: Float64Array;
  samples: Float64Array[] | null;
  sampleCount = 0;
  /** The histogram's range: `lo` and scale = bins / (hi − lo), as the chunk runners bin with them. Without
   *  `histogram`, no counts are kept (add then merges none). */
  private readonly lo: number;
  private readonly scale: number;
  constructor(
    private readonly bins: number,
    keep: boolean,
    range: { lo: number; hi: number },
    histogram = true,
  ) {
    this.counts = new Float64Array(histogram ? bins + 2 : 0);
    this.samples = keep ? [] : null;
    this.lo = range.lo;
    this.scale = bins / (range.hi - range.lo);
  }

  add(c: OutputChunk): void {
    this.moments = mergeMoments(this.moments, { n: c.n, mean: c.mean, m2: c.m2 });
    if (c.min < this.min) this.min = c.min;
    if (c.max > this.max) this.max = c.max;
    this.inSpec += c.inSpec;
    this.unitInSpec += c.unitInSpec;
    this.belowSpec += c.belowSpec;
    this.nonFinite += c.nonFinite;
    // Only the bins the chunk can have counted in: a chunk fills a narrow stretch of the 8192 bins, and adding its
    // zeros elsewhere changed nothing but cost 3 ns per bin (40 % of a per-unit run's merging). With a NaN or an
    // infinity among the values (the run then fails anyway) every bin is added.
    const counts = this.counts;
    const source = c.counts;
    const from = c.countsFrom ?? 0;
    const whole = c.nonFinite > 0 || c.n === 0 || counts.length === 0;
    const first = Math.max(from, whole ? 0 : histogramBin(c.min, this.lo, this.scale, this.bins));
    const last = Math.min(from + source.length - 1, whole ? counts.length - 1 : histogramBin(c.max, this.lo, this.scale, this.bins));
    for (let b = first; b <= last; b++) counts[b]! += source[b - from]!;
    if (this.samples && c.samples) {
      this.samples.push(c.samples);
      this.sampleCount += c.n;
    }
  }
}

function checkOptions(options: MonteCarloOptions): void {
  const t = options.trials;
  if (t !== 'auto' && (!Number.isInteger(t) || t < 1 || t > MAX_TRIALS)) {
    throw new InputError('trials', `${t} is not a usable trial count`, `a whole number from 1 to ${MAX_TRIALS}, or auto`);
  }
  const w = options.workers;
  if (w !== undefined && (!Number.isInteger(w) || w < 1 || w > 256)) {
    throw new InputError('workers', `${w} is not a usable worker count`, 'a whole number from 1 to 256');
  }
  const d = options.significantDigits;
  if (d !== undefined && (!Number.isInteger(d) || d < 1 || d > 4)) {
    throw new InputError('significant digits', `${d}`, 'a whole number from 1 to 4');
  }
}

/** Histogram ranges from one pilot chunk (seeded `${seed}:pilot`, so it never overlaps the run's own streams). */
function pilotRanges(model: Model, seed: string, chunkSize: number): Array<{ lo: number; hi: number }> {
  const config: ChunkConfig = {
    seed: `${seed}:pilot`,
    chunkSize,
    trials: chunkSize,
    ranges: model.outputs.map(() => ({ lo: 0, hi: 1 })),
    bins: 1,
    specs: model.outputs.map(() => null),
    keepSamples: false,
    chunkIntervals: false,
    perUnit: false,
  };
  const summary = new ChunkRunner(model, config).run(0);
  return summary.outputs.map((o) => widenRange(o.min, o.max));
}

/** A histogram range around [min, max], widened by half its span each side (never empty). */
export function widenRange(min: number, max: number): { lo: number; hi: number } {
  const span = max - min;
  const pad = span > 0 ? span / 2 : Math.max(Math.abs(min) * 1e-9, 1e-300);
  return { lo: min - pad, hi: max + pad };
}

/**
 * Trials each computing thread should have before a run without a `workers` choice adds one: a worker thread costs
 * about 0.3 s of CPU time to start and warm up (a new V8 instance that loads and compiles the engine: measured on
 * the 2-core development machine, 1e6 and 4e6 trials of the benchmark design on 1 and 2 threads), the work of about
 * 1.5e6 trials at 150–200 ns each, so a small run stays on the calling thread: the examples' 2e5-trial spreads and the
 * grade search start no thread, 2e6 trials start one on a 2-core machine, and an adaptive run counts its cap (1e8 by
 * default). The numbers never depend on the thread count.
 */
export const MIN_TRIALS_PER_THREAD = 1_000_000;

/** Computing threads by default for a run of `trials` (the cap, for an adaptive run): see MIN_TRIALS_PER_THREAD. */
export function defaultThreads(trials: number): number {
  return Math.max(1, Math.min(availableParallelism(), Math.floor(trials / MIN_TRIALS_PER_THREAD)));
}

/** Worker threads a run with these options starts besides the calling thread (0: it stays on this thread). */
function helperThreads(options: MonteCarloOptions, trials: number, chunkCount: number): number {
  const requested = options.workers ?? defaultThreads(trials);
  return options.source && requested > 1 ? Math.min(requested, chunkCount) - 1 : 0;
}

/**
 * Starts the worker threads that monteCarlo(model, options) will use, so their start-up overlaps what the caller
 * does first (worst case, RSS). Optional: a run starts any worker it still lacks.
 */
export function startMonteCarloWorkers(options: MonteCarloOptions): void {
  try {
    checkOptions(options);
  } catch {
    return; // monteCarlo reports the bad option
  }
  const trials = options.trials === 'auto' ? (options.maxTrials ?? DEFAULT_MAX_TRIALS) : options.trials;
  const helpers = helperThreads(options, trials, Math.ceil(trials / (options.chunkSize ?? DEFAULT_CHUNK_SIZE)));
  if (helpers > 0) startWorkersAhead(helpers);
}

export async function monteCarlo(model: Model, options: MonteCarloOptions): Promise<MonteCarloResult> {
  checkOptions(options);
  const seed = String(options.seed);
  const chunkSize = options.chunkSize ?? DEFAULT_CHUNK_SIZE;
  const bins = options.histogramBins ?? DEFAULT_BINS;
  const adaptive = options.trials === 'auto';
  const maxTrials = adaptive ? (options.maxTrials ?? DEFAULT_MAX_TRIALS) : (options.trials as number);
  const chunkCount = Math.ceil(maxTrials / chunkSize);
  const sampleMemory = options.sampleMemoryBytes ?? DEFAULT_SAMPLE_MEMORY;
  const outputs = model.outputs;
  // Keep values only if the whole run fits the cap (adaptive runs: while it does, then drop them).
  const keepSamples = adaptive || maxTrials * outputs.length * 8 <= sampleMemory;
  const ranges = options.ranges
    ? outputs.map((o) => {
        const r = options.ranges![o.name];
        if (!r) throw new Error(`no histogram range for output ${o.name}`);
        return r.hi > r.lo ? r : widenRange(r.lo, r.hi);
      })
    : pilotRanges(model, seed, chunkSize);
  const config: ChunkConfig = {
    seed,
    chunkSize,
    trials: adaptive ? 0 : maxTrials,
    ranges,
    bins,
    specs: outputs.map((o) => o.spec ?? null),
    keepSamples,
    chunkIntervals: adaptive,
    perUnit: options.perUnit ?? true,
    kernel: chooseKernel(options.kernel ?? 'auto', options.source),
  };
  const gridC = config.perUnit && model.ambient ? model.ambient.gridC.slice() : null;
  const accumulators = outputs.map((_, o) => new Accumulator(bins, keepSamples, ranges[o]!));
  const summaryOnly = options.summary ?? false;
  const ambientAccumulators = (gridC ?? []).map(() => outputs.map((_, o) => new Accumulator(bins, false, ranges[o]!, !summaryOnly)));
  let allInSpec = 0;
  const adaptiveTrack: AdaptiveState[] | null = adaptive ? outputs.map(() => adaptiveState()) : null;
  const digits = options.significantDigits ?? 2;
  let merged = 0; // chunks merged so far (in order)
  let trialsDone = 0;
  let stopped = false;
  let samplesDropped = false;

  const mergeChunk = (summary: ChunkSummary): void => {
    for (let o = 0; o < outputs.length; o++) {
      const c = summary.outputs[o]!;
      accumulators[o]!.add(c);
      if (adaptiveTrack) pushAdaptive(adaptiveTrack[o]!, c);
    }
    allInSpec += summary.allInSpec;
    summary.ambient?.forEach((chunks, g) => chunks.forEach((c, o) => ambientAccumulators[g]![o]!.add(c)));
    merged++;
    trialsDone += summary.outputs[0]?.n ?? 0;
    if (keepSamples && !samplesDropped && trialsDone * outputs.length * 8 > sampleMemory) {
      for (const a of accumulators) a.samples = null;
      samplesDropped = true;
    }
    if (adaptiveTrack && adaptiveTrack.every((s) => adaptiveStable(s, digits))) stopped = true;
    // A trial without a finite value fails the run (finishOutput); an adaptive run, which could not become stable
    // then, stops at once rather than at its cap.
    if (adaptiveTrack && summary.outputs.some((c) => c.nonFinite > 0)) stopped = true;
    if (merged >= chunkCount) stopped = true;
    options.onProgress?.({ trialsDone, trialsPlanned: maxTrials });
  };

  // `workers` counts the threads that compute chunks: this thread and workers − 1 worker threads.
  const workers = helperThreads(options, maxTrials, chunkCount) + 1;
  if (workers <= 1) {
    const runner = createChunkRunner(model, config, options.source, true);
    try {
      for (let k = 0; !stopped; k++) {
        mergeChunk(runner.run(k));
        if (k % 8 === 7) await new Promise((resolve) => setImmediate(resolve));
      }
    } finally {
      runner.release?.();
    }
  } else {
    await runOnWorkers(options.source!, config, workers - 1, chunkCount, mergeChunk, () => stopped);
  }

  const notes: string[] = [];
  if (adaptive) {
    const stable = adaptiveTrack!.every((s) => adaptiveStable(s, digits));
    notes.push(
      stable
        ? `Adaptive run (JCGM 101:2008 7.9): stopped after ${trialsDone} trials, when the mean, standard deviation and 95 % interval ends of every output were stable to ${digits} significant digits of u(y).`
        : `Adaptive run (JCGM 101:2008 7.9): NOT stable to ${digits} significant digits within the cap of ${maxTrials} trials; the figures are those of ${trialsDone} trials.`,
    );
  }
  const results = outputs.map((o, i) => finishOutput(o, accumulators[i]!, ranges[i]!, bins, gridC === null ? null : gridC.map((t, g) => ({ ambientC: t, accumulator: ambientAccumulators[g]![i]! })), summaryOnly));
  const exact = results.every((r) => r.quantileMethod === 'exact');
  notes.push(
    exact
      ? 'Quantiles and coverage intervals from all sorted Monte Carlo values (JCGM 101:2008 7.7).'
      : `Quantiles and coverage intervals read from a ${bins}-bin histogram (the values did not fit ${Math.round(sampleMemory / 2 ** 20)} MiB); each is within the stated bound of the exact order statistic.`,
  );
  notes.push(`Seed "${seed}": chunk k of ${chunkSize} trials draws from xor128 started from SHA-256 of (seed, k); identical for any worker count.`);
  notes.push(...unitNotes(gridC));
  notes.push(kernelNote(config.kernel!));
  if (adaptiveTrack) {
    // The numerical tolerance δ each output's u(y) was held to (JCGM 101:2008 7.9.2), for the reports.
    results.forEach((r, o) => (r.numericalTolerance = numericalTolerance(momentsSigma(adaptiveTrack[o]!.all), digits)));
  }
  const checked = checkedOutputs(model);
  const allSpecs: AllSpecsYield | null =
    checked.length === 0 || trialsDone === 0 ? null : { ...yieldOf(allInSpec, trialsDone), outputs: checked.map((c) => outputs[c.index]!.name) };
  return { seed, trials: trialsDone, workers, chunkSize, notes, outputs: results, ambientGridC: gridC, allSpecs };
}

let runCounter = 0;

/**
 * Runs the chunks on `helperCount` pooled worker threads and on this thread, merging the summaries strictly in
 * chunk order. This thread computes a chunk whenever one is left to hand out, between handling the workers'
 * replies (one chunk per turn of the event loop), so a run on N threads starts only N − 1 workers.
 */
function runOnWorkers(
  source: ModelSource,
  config: ChunkConfig,
  helperCount: number,
  chunkCount: number,
  merge: (summary: ChunkSummary) => void,
  isStopped: () => boolean,
): Promise<void> {
  // This thread's share: the same model rebuilt from the same JSON as in each worker. Its summaries may wait for
  // earlier chunks, so its buffers are not reused.
  const local = createChunkRunner(buildFromSource(source), config, source);
  const pool = checkOutWorkers(helperCount);
  // Replies carry the run's id: a pooled worker may still answer chunks of a run that stopped early.
  const run = ++runCounter;
  return new Promise((resolve, reject) => {
    const pending = new Map<number, ChunkSummary>();
    let nextToSend = 0;
    let nextToMerge = 0;
    let finished = false;
    let localScheduled = false;
    const finish = (error?: Error): void => {
      if (finished) return;
      finished = true;
      giveBackWorkers(pool, !error);
      if (error) reject(error);
      else resolve();
    };
    // Two chunks in flight per worker keeps each busy while this thread computes or merges; a cap on what waits
    // to be merged bounds memory when one thread falls behind.
    const inFlightLimit = 2;
    const pendingLimit = 4 * (helperCount + 1);
    const inFlight = new Map<Worker, number>();
    const canHandOut = (): boolean => !isStopped() && nextToSend < chunkCount && pending.size <= pendingLimit;
    const send = (worker: Worker): void => {
      while (canHandOut() && inFlight.get(worker)! < inFlightLimit) {
        worker.postMessage({ type: 'chunk', run, k: nextToSend++ } satisfies ToWorker);
        inFlight.set(worker, inFlight.get(worker)! + 1);
      }
    };
    /** Takes a finished chunk from any thread: merges every chunk now in order, then hands out more work. */
    const accept = (summary: ChunkSummary): void => {
      pending.set(summary.k, summary);
      while (!isStopped() && pending.has(nextToMerge)) {
        const next = pending.get(nextToMerge)!;
        pending.delete(nextToMerge);
        nextToMerge++;
        merge(next);
      }
      if (isStopped() || nextToMerge >= chunkCount) {
        finish();
        return;
      }
      // Refill every worker (one that waited on the pending cap may now proceed), and this thread.
      for (const w of pool) send(w);
      scheduleLocal();
    };
    const computeLocal = (): void => {
      localScheduled = false;
      if (finished || !canHandOut()) return;
      const k = nextToSend++;
      let summary: ChunkSummary;
      try {
        summary = local.run(k);
      } catch (error) {
        finish(error instanceof Error ? error : new Error(String(error)));
        return;
      }
      accept(summary);
    };
    // setImmediate runs after the event loop has delivered the workers' waiting replies.
    function scheduleLocal(): void {
      if (localScheduled || finished || !canHandOut()) return;
      localScheduled = true;
      setImmediate(computeLocal);
    }
    for (const worker of pool) {
      inFlight.set(worker, 0);
      worker.on('message', (message: FromWorker) => {
        if (finished || message.run !== run) return;
        inFlight.set(worker, inFlight.get(worker)! - 1);
        if (message.type === 'error') {
          finish(new ImpossibleError('Monte Carlo', message.message, 'check the design values; this trial could not be evaluated'));
          return;
        }
        accept(message.summary);
      });
      worker.on('error', (error) => finish(error));
      worker.postMessage({ type: 'init', run, source, config } satisfies ToWorker);
      send(worker);
    }
    scheduleLocal();
  });
}

/** What each yield means, for the method notes. */
function unitNotes(gridC: number[] | null): string[] {
  if (gridC === null) return ['Yield: share of trials inside the window at the ambient drawn with each trial.'];
  const where = gridC.length === 1 ? `at ${formatC(gridC[0]!)}` : `at each of ${gridC.length} ambients evenly spaced from ${formatC(gridC[0]!)} to ${formatC(gridC[gridC.length - 1]!)} (${gridC.map(formatC).join(', ')})`;
  return [
    `Yield is per unit: a trial is one unit (parts, TCRs, drifts drawn once), evaluated ${where}; it counts only if inside the window at every one. The all-specs yield asks that of every window at once.`,
    'Yield at a random ambient: the share of trials inside the window at the ambient drawn with each trial (a random unit at a random ambient); shown beside the per-unit yield, never in its place.',
    'Cp and Cpk: from the mean and σ of the units at each grid ambient, the worst ambient reported; they assume a normal distribution, which flat (uniform) part bands do not give: read the yield for the share of units out.',
  ];
}

function formatC(t: number): string {
  return `${Number(t.toFixed(3))} °C`;
}

function yieldOf(inSpec: number, n: number): YieldResult {
  const wilson = wilsonInterval(inSpec, n);
  return { pct: (100 * inSpec) / n, low: 100 * wilson.low, high: 100 * wilson.high };
}

/** One output at one grid ambient: the units' spread there, its 0.135 … 99.865 % band and the capability. */
/** Cp and Cpk against the window, or the one-sided Cpl/Cpu (no Cp) when the design gave only one limit. */
function capabilityOf(spec: [number, number], sides: 'both' | 'low' | 'high', mean: number, sigma: number): { cp?: number; cpk: number } | null {
  if (sides === 'both') return processCapability(spec[0], spec[1], mean, sigma);
  const cpk = oneSidedCapability(sides, sides === 'low' ? spec[0] : spec[1], mean, sigma);
  return cpk === null ? null : { cpk };
}

/** An ambient point without the band read from its histogram (a summary's, which merges no per-ambient histogram). */
type AmbientMoments = Omit<AmbientPoint, 'band9973' | 'bandBound'>;

function ambientPoint(ambientC: number, a: Accumulator, range: { lo: number; hi: number }, bins: number, spec: [number, number] | undefined, sides: 'both' | 'low' | 'high'): AmbientPoint {
  const fine: FineHistogram = { lo: range.lo, hi: range.hi, bins, counts: a.counts, min: a.min, max: a.max };
  return { ...ambientMoments(ambientC, a, spec, sides), band9973: { low: histogramPercentile(fine, 0.135), high: histogramPercentile(fine, 99.865) }, bandBound: histogramQuantileBound(fine) };
}

function ambientMoments(ambientC: number, a: Accumulator, spec: [number, number] | undefined, sides: 'both' | 'low' | 'high'): AmbientMoments {
  const mean = a.moments.mean;
  const sigma = momentsSigma(a.moments);
  const point: AmbientMoments = {
    ambientC,
    mean,
    sigma,
    min: a.min,
    max: a.max,
  };
  if (spec) {
    point.yield = yieldOf(a.inSpec, a.moments.n);
    const capability = capabilityOf(spec, sides, mean, sigma);
    if (capability) {
      if (capability.cp !== undefined) point.cp = capability.cp;
      point.cpk = capability.cpk;
    }
  }
  return point;
}

function finishOutput(
  output: Model['outputs'][number],
  a: Accumulator,
  range: { lo: number; hi: number },
  bins: number,
  grid: Array<{ ambientC: number; accumulator: Accumulator }> | null,
  summaryOnly: boolean,
): MonteCarloOutput {
  const shortest = !summaryOnly;
  if (a.nonFinite > 0) {
    throw new ImpossibleError(
      `output ${output.name}`,
      `${a.nonFinite} Monte Carlo trials gave no finite value`,
      'check the parts whose band reaches zero or a sign change (a resistance, a gain, a threshold below the offsets)',
    );
  }
  const n = a.moments.n;
  const mean = a.moments.mean;
  const sigma = momentsSigma(a.moments);
  const fine: FineHistogram = { lo: range.lo, hi: range.hi, bins, counts: a.counts, min: a.min, max: a.max };
  let percentiles: Percentile[];
  let interval95: Interval;
  let interval9973: Interval;
  let shortest95: Interval | undefined;
  let shortest9973: Interval | undefined;
  let quantileMethod: 'exact' | 'histogram';
  let quantileBound: number;
  if (a.samples && a.sampleCount === n) {
    // Exact order statistics: only the tails and the bins of the middle percentiles are sorted.
    const q95 = coverageCount(0.95, n);
    const q9973 = coverageCount(0.9973, n);
    const tail = Math.max(1, n - Math.min(q95, q9973));
    const percentileRanks = REPORTED_PERCENTILES.map((pct) => nearestRank(pct, n));
    // The symmetric intervals' ends (symmetricIntervalOf's ranks): inside the tails, and all that is needed of them
    // without the shortest intervals.
    const symmetricEnds = [0.95, 0.9973].flatMap((p) => {
      const r = symmetricStartRank(p, n);
      return [r, Math.min(n, r + coverageCount(p, n))];
    });
    const ranks = [...percentileRanks, ...(shortest ? [] : symmetricEnds)].map((r) => [r, r] as [number, number]);
    const order = new OrderStatistics(a.samples, fine, shortest ? [[1, tail], [n - tail + 1, n], ...ranks] : ranks);
    a.samples = null;
    percentiles = REPORTED_PERCENTILES.map((pct, i) => ({ pct, value: order.at(percentileRanks[i]!) }));
    interval95 = symmetricIntervalOf((r) => order.at(r), n, 0.95);
    interval9973 = symmetricIntervalOf((r) => order.at(r), n, 0.9973);
    if (shortest) {
      shortest95 = shortestIntervalOf((r) => order.at(r), n, 0.95);
      shortest9973 = shortestIntervalOf((r) => order.at(r), n, 0.9973);
    }
    quantileMethod = 'exact';
    quantileBound = 0;
  } else {
    percentiles = REPORTED_PERCENTILES.map((pct) => ({ pct, value: histogramPercentile(fine, pct) }));
    interval95 = histogramSymmetricInterval(fine, 0.95);
    interval9973 = histogramSymmetricInterval(fine, 0.9973);
    if (shortest) {
      shortest95 = histogramShortestInterval(fine, 0.95);
      shortest9973 = histogramShortestInterval(fine, 0.9973);
    }
    quantileMethod = 'histogram';
    quantileBound = histogramQuantileBound(fine);
  }
  const result: MonteCarloOutput = {
    name: output.name,
    unit: output.unit,
    mean,
    sigma,
    min: a.min,
    max: a.max,
    percentiles,
    interval95,
    interval9973,
    ...(shortest95 && shortest9973 ? { shortest95, shortest9973 } : {}),
    quantileMethod,
    quantileBound,
    histogram: coarseHistogram(fine),
  };
  const sides = output.specSides ?? 'both';
  if (grid && !summaryOnly) result.ambientSweep = grid.map((g) => ambientPoint(g.ambientC, g.accumulator, range, bins, output.spec, sides));
  // The points Cp and Cpk are read from: the sweep's, or (a summary) the same points without their bands.
  const points: AmbientMoments[] | null = grid ? (result.ambientSweep ?? grid.map((g) => ambientMoments(g.ambientC, g.accumulator, output.spec, sides))) : null;
  if (output.spec) {
    const [lsl, usl] = output.spec;
    result.spec = [lsl, usl];
    result.yield = yieldOf(a.unitInSpec, n);
    result.histogram.belowSpec = a.belowSpec;
    result.histogram.aboveSpec = n - a.inSpec - a.belowSpec;
    result.yieldAtRandomAmbient = yieldOf(a.inSpec, n);
    result.ppmOut = (1e6 * (n - a.unitInSpec)) / n;
    if (points) {
      // Cp and Cpk of the units at the grid ambient where Cpk is lowest.
      let worst: AmbientMoments | null = null;
      for (const point of points) if (point.cpk !== undefined && (worst === null || point.cpk < worst.cpk!)) worst = point;
      if (worst) {
        if (worst.cp !== undefined) result.cp = worst.cp;
        result.cpk = worst.cpk!;
        result.capabilityAmbientC = worst.ambientC;
      }
    } else {
      const capability = capabilityOf([lsl, usl], sides, mean, sigma);
      if (capability) {
        if (capability.cp !== undefined) result.cp = capability.cp;
        result.cpk = capability.cpk;
      }
    }
    if (sides !== 'both') result.capabilitySides = sides;
  }
  return result;
}
