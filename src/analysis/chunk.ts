// One chunk of Monte Carlo trials: draw every part from the chunk's own stream, evaluate every output in one
// tight loop each, and reduce each output to moments, a fine histogram, an in-spec count and (optionally) the
// values themselves. The buffers are allocated once per runner and reused for every chunk.
import type { Part } from '../tolerance/part.js';
import { partFromUnit, partUnitMap } from '../tolerance/sample.js';
import { chunkState, fillXor128, fillXor128Affine, skipXor128 } from './chunk-random.js';
import { evaluateOutputs, type Model } from './model.js';
import { coverageCount, symmetricIntervalOf, symmetricStartRank } from './statistics/coverage.js';
import { histogramBin, type FineHistogram } from './statistics/histogram.js';
import { OrderStatistics } from './statistics/order-statistics.js';
import { countPassing, UnitChecker } from './unit-check.js';

export const DEFAULT_CHUNK_SIZE = 65536;

export interface ChunkConfig {
  seed: string;
  chunkSize: number;
  /** Total trials of the run (the last chunk may be short); 0 for an open-ended (adaptive) run. */
  trials: number;
  /** Per output: histogram range [lo, hi) and bin count. */
  ranges: Array<{ lo: number; hi: number }>;
  bins: number;
  /** Per output: spec window or null. */
  specs: Array<[number, number] | null>;
  keepSamples: boolean;
  /** Adaptive runs also need each chunk's own 95 % interval ends (JCGM 101:2008 7.9). */
  chunkIntervals: boolean;
  /** Check each unit over the model's ambient grid (unit-check.ts); off, a trial is judged at its drawn ambient only. */
  perUnit: boolean;
  /** Which kernel computes the chunks (src/analysis/kernel/choice.ts); the JavaScript reference without one. */
  kernel?: 'js' | 'wasm';
}

export interface OutputChunk {
  n: number;
  mean: number;
  m2: number;
  min: number;
  max: number;
  inSpec: number;
  nonFinite: number;
  counts: Uint32Array;
  /** The histogram bin counts[0] stands for (absent: 0). A detached chunk keeps only the bins its values can be in,
   *  from its min's to its max's (histogramBin), every bin when a value is not finite. */
  countsFrom?: number;
  samples: Float64Array | null;
  /** This chunk's probabilistically symmetric 95 % interval (adaptive runs only). */
  low95: number;
  high95: number;
  /** Units inside this output's window at every ambient of the grid (n without a window; inSpec when not per unit). */
  unitInSpec: number;
  /** Trials below the window's low end (0 without a window); those above are n − inSpec − belowSpec. */
  belowSpec: number;
}

export interface ChunkSummary {
  k: number;
  /** Each output over the trials as drawn (the ambient drawn with the unit). */
  outputs: OutputChunk[];
  /** Units that met every window at every ambient. */
  allInSpec: number;
  /** Per unit: ambient[g][o] is output o over the chunk's units held at grid ambient g (no values kept). */
  ambient: OutputChunk[][] | null;
}

export function chunkLength(config: ChunkConfig, k: number): number {
  if (config.trials === 0) return config.chunkSize;
  return Math.max(0, Math.min(config.chunkSize, config.trials - k * config.chunkSize));
}

/**
 * The part values of chunk k's first n trials: part i takes draws i·n … (i+1)·n − 1 of the chunk's stream (as
 * fillPart with the reference generator would). A uniform part is drawn and scaled in one pass, a part that
 * ignores its draws only advances the stream; the numbers are those of fillXor128 then partFromUnit.
 */
export function drawChunkParts(parts: Part[], seed: string, k: number, p: Float64Array[], n: number): void {
  const state = chunkState(seed, k);
  for (let i = 0; i < parts.length; i++) {
    const map = partUnitMap(parts[i]!);
    if (map.kind === 'affine') fillXor128Affine(state, p[i]!, n, map.lo, map.width);
    else if (map.kind === 'constant') {
      skipXor128(state, n);
      p[i]!.fill(map.value, 0, n);
    } else {
      fillXor128(state, p[i]!, n);
      partFromUnit(parts[i]!, p[i]!, n);
    }
  }
}

/**
 * Replaces each output's counts (as drawn, then at each grid ambient) with a copy of only the bins its values can be
 * in, from its min's to its max's (histogramBin; every bin when a value is not finite), all in one new buffer, with
 * countsFrom saying where they start: a chunk fills a narrow stretch of the bins, and a full copy of every output
 * at every ambient was about a megabyte of garbage a chunk. The summary then no longer shares the runner's memory.
 */
export function keepCountedBins(outputs: OutputChunk[], ambient: OutputChunk[][] | null, config: ChunkConfig): void {
  const chunks = [...outputs, ...(ambient ?? []).flat()];
  const spans = chunks.map((c, i) => {
    const range = config.ranges[i % outputs.length]!;
    if (c.nonFinite > 0 || c.n === 0) return { from: 0, to: config.bins + 1 };
    const scale = config.bins / (range.hi - range.lo);
    return { from: histogramBin(c.min, range.lo, scale, config.bins), to: histogramBin(c.max, range.lo, scale, config.bins) };
  });
  const all = new Uint32Array(spans.reduce((sum, span) => sum + span.to - span.from + 1, 0));
  let at = 0;
  chunks.forEach((c, i) => {
    const { from, to } = spans[i]!;
    const kept = all.subarray(at, at + to - from + 1);
    kept.set(c.counts.subarray(from, to + 1));
    at += to - from + 1;
    c.counts = kept;
    c.countsFrom = from;
  });
}

export class ChunkRunner {
  private readonly p: Float64Array[];
  private outs: Float64Array[];
  private readonly units: UnitChecker;

  /** The histogram counts of every output, as drawn and at each grid ambient, reused for every chunk. With `reuse`
   *  the summary's counts are views of them (for a caller that consumes each summary before asking for the next,
   *  the in-thread run); without, the summary takes a compact copy (about 1 MB a chunk for 5 outputs at 6 ambients
   *  in full). */
  private counts: Uint32Array | null = null;
  private ambientCounts: Uint32Array | null = null;

  constructor(
    private readonly model: Model,
    private readonly config: ChunkConfig,
    private readonly reuse = false,
  ) {
    this.p = model.parts.map(() => new Float64Array(config.chunkSize));
    this.outs = model.outputs.map(() => new Float64Array(config.chunkSize));
    // Without the per-unit check a model's ambient grid is ignored: units are judged as drawn.
    const { ambient: _grid, ...asDrawn } = model;
    this.units = new UnitChecker(config.perUnit ? model : asDrawn, config.chunkSize);
  }

  run(k: number): ChunkSummary {
    const { model, config, p } = this;
    const n = chunkLength(config, k);
    drawChunkParts(model.parts, config.seed, k, p, n);
    evaluateOutputs(model, p, this.outs, n);
    // One buffer for every output's histogram counts, kept from chunk to chunk; a summary that leaves this runner
    // (not `reuse`) takes a compact copy at the end (keepCountedBins).
    const stride = config.bins + 2;
    const allCounts = this.counts === null ? (this.counts = new Uint32Array(stride * model.outputs.length)) : this.counts.fill(0);
    const outputs = this.outs.map((x, o) => this.reduce(o, x, n, allCounts.subarray(o * stride, (o + 1) * stride), config.keepSamples, config.chunkIntervals));
    // Each unit over the ambient grid: the pass flags, and each output's reduction at every grid ambient.
    const grid = this.units.gridC;
    const ambient: OutputChunk[][] | null = grid ? [] : null;
    let ambientCounts: Uint32Array | null = null;
    if (grid) ambientCounts = this.ambientCounts === null ? (this.ambientCounts = new Uint32Array(stride * model.outputs.length * grid.length)) : this.ambientCounts.fill(0);
    this.units.check(p, n, this.outs, (g, outs) => {
      const base = g * stride * model.outputs.length;
      ambient!.push(outs.map((x, o) => this.reduce(o, x, n, ambientCounts!.subarray(base + o * stride, base + (o + 1) * stride), false, false)));
    });
    this.units.checked.forEach((c, i) => (outputs[c.index]!.unitInSpec = countPassing(this.units.pass[i]!, n)));
    const allInSpec = countPassing(this.units.all, n);
    if (config.keepSamples) this.outs = model.outputs.map(() => new Float64Array(config.chunkSize));
    if (!this.reuse) keepCountedBins(outputs, ambient, config);
    return { k, outputs, allInSpec, ambient };
  }

  /**
   * One pass for extremes, sum, histogram bin and spec count; a second for the deviations (the corrected two-pass
   * variance needs the mean first). Each accumulator adds in trial order, as the separate reference functions do
   * (chunkMoments, countInto), so the results are bit-identical to them (a test checks it).
   */
  private reduce(o: number, x: Float64Array, n: number, counts: Uint32Array, keepSamples: boolean, chunkIntervals: boolean): OutputChunk {
    const { config } = this;
    const spec = config.specs[o];
    const lo = config.ranges[o]!.lo;
    // Without a window every trial counts as in spec (the loop's count is then replaced by n).
    const scan = scanPass(x, n, lo, config.bins / (config.ranges[o]!.hi - lo), config.bins, counts, spec ? spec[0] : -Infinity, spec ? spec[1] : Infinity);
    const { min, max, sum } = scan;
    const inSpec = spec ? scan.inSpec : n;
    const belowSpec = spec ? scan.below : 0;
    // A NaN or an infinity makes the sum non-finite; only then count them (the run then fails loudly).
    const nonFinite = Number.isFinite(sum) ? 0 : countNonFinite(x, n);
    // Corrected two-pass variance (Chan, Golub & LeVeque 1983), as chunkMoments in statistics/moments.ts.
    const mean = n > 0 ? sum / n : 0;
    const { sq, dev } = deviationPass(x, n, mean);
    const m2 = n > 0 ? Math.max(0, sq - (dev * dev) / n) : 0;
    let low95 = NaN;
    let high95 = NaN;
    if (chunkIntervals && n > 0 && nonFinite === 0) {
      // The two order statistics of the interval, exact: the chunk's own histogram says which bins hold those ranks,
      // and only the values in those bins are sorted (the same values a full sort would put at those ranks).
      const h: FineHistogram = { lo, hi: config.ranges[o]!.hi, bins: config.bins, counts, min, max };
      const r = symmetricStartRank(0.95, n);
      const end = Math.min(n, r + coverageCount(0.95, n));
      const order = new OrderStatistics([x.subarray(0, n)], h, [[r, r], [end, end]]);
      ({ low: low95, high: high95 } = symmetricIntervalOf((rank) => order.at(rank), n, 0.95));
    }
    const samples = keepSamples ? (n === x.length ? x : x.slice(0, n)) : null;
    return { n, mean, m2, min, max, inSpec, nonFinite, counts, samples, low95, high95, unitInSpec: inSpec, belowSpec };
  }
}

// The passes of the reduction, each a function of its own whose loop is the whole body (V8 compiles a long loop
// while it runs, by on-stack replacement; code after the loop that has not run yet can make that compiled code
// deoptimise on later calls: see chunk-random.ts). This still happens now and then to the scan, on V8 11.3.

/** min, max, sum (in trial order), histogram counts, the count inside [specLo, specHi] and the count below specLo. */
function scanPass(x: Float64Array, n: number, lo: number, scale: number, bins: number, counts: Uint32Array, specLo: number, specHi: number): { min: number; max: number; sum: number; inSpec: number; below: number } {
  const above = bins + 1;
  let min = Infinity;
  let max = -Infinity;
  let sum = 0;
  let inSpec = 0;
  let below = 0;
  for (let j = 0; j < n; j++) {
    const v = x[j]!;
    min = Math.min(min, v);
    max = Math.max(max, v);
    sum += v;
    // The bin of countInto, ⌊(v − lo)·scale⌋ + 1 inside the range: for 0 ≤ t < bins, t | 0 is ⌊t⌋, and it skips
    // Math.floor's float result and checked conversion. (A NaN lands in bin 1 here, but any NaN fails the run.)
    const t = (v - lo) * scale;
    counts[t < 0 ? 0 : t >= bins ? above : (t | 0) + 1]!++;
    inSpec += v >= specLo && v <= specHi ? 1 : 0;
    below += v < specLo ? 1 : 0;
  }
  return { min, max, sum, inSpec, below };
}

/** Σ(x − mean)² and Σ(x − mean), in trial order. */
function deviationPass(x: Float64Array, n: number, mean: number): { sq: number; dev: number } {
  let sq = 0;
  let dev = 0;
  for (let j = 0; j < n; j++) {
    const d = x[j]! - mean;
    sq += d * d;
    dev += d;
  }
  return { sq, dev };
}

function countNonFinite(x: Float64Array, n: number): number {
  let count = 0;
  for (let j = 0; j < n; j++) if (!Number.isFinite(x[j]!)) count++;
  return count;
}
