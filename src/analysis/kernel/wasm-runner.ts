// A chunk runner that computes with the WebAssembly kernel: the same ChunkSummary as ChunkRunner (src/analysis/
// chunk.ts) for the same chunk, to the bit (test/wasm-kernel.test.ts). The kernel draws, transforms, evaluates
// and reduces; this file lays out the kernel's memory once, seeds each chunk (SHA-256 of (seed, k), chunk-random.ts)
// and turns the kernel's results into the summary (the chunk's own 95 % interval, when asked, as ChunkRunner does).
import { chunkLength, keepCountedBins, type ChunkConfig, type ChunkSummary, type OutputChunk } from '../chunk.js';
import { chunkState } from '../chunk-random.js';
import type { Model } from '../model.js';
import type { SupplySpec } from '../models/supply.js';
import { coverageCount, symmetricIntervalOf, symmetricStartRank } from '../statistics/coverage.js';
import type { FineHistogram } from '../statistics/histogram.js';
import { OrderStatistics } from '../statistics/order-statistics.js';
import { checkedOutputs, type CheckedOutput } from '../unit-check.js';
import { kernelLayout, P_FIXED_T } from './layout.js';
import { applyBitMatrix, jumpMatrix } from './xor128-jump.js';
import { borrowKernel, giveBackKernel, KERNEL_SCRATCH_BYTES, type KernelExports } from './wasm-module.js';

const PAGE = 65536;
const RESULT_FIELDS = 9;
/** One group of src/analysis/kernel/assembly/chunk-kernel.ts generate: four states (4 × i32x4), four columns, four lo, four width. */
const GROUP_BYTES = 144;
/** Trials drawn, transformed and evaluated at a time within a chunk (even, so only a chunk's last block is odd;
 *  our choice: a block's part and output columns, about 0.4 MB for 20 parts and 5 outputs at 3 ambients, fit the
 *  1 MB L2 cache of the machine the bench figures come from). */
export const KERNEL_BLOCK = 2048;

/** Bump allocation of the kernel's memory, 16-byte aligned (SIMD loads). */
class Arena {
  top = KERNEL_SCRATCH_BYTES;
  take(bytes: number): number {
    const at = this.top;
    this.top += Math.ceil(bytes / 16) * 16;
    return at;
  }
}

export class WasmChunkRunner {
  private readonly k: KernelExports;
  private readonly parts: number;
  private readonly stride: number;
  private readonly desc: number;
  private readonly lay: number;
  private readonly par: number;
  private readonly res: number;
  private readonly cols: number;
  private readonly outs: number;
  private readonly ambientOuts: number;
  private readonly counts: number;
  private readonly ambientCounts: number;
  private readonly passRows: number;
  /** countAllInside's table: each checked output's drawn column and window. */
  private readonly windowRows: number;
  private readonly all: number;
  private readonly checked: CheckedOutput[];
  private readonly gridC: number[] | null;
  private readonly countStride: number;
  /** Parts that draw (not constant), in order: they are generated four at a time. */
  private readonly drawing: number[];
  private readonly groups: number;
  private readonly spare: number;
  /** Scratch of transform's normal passes: the tail values of a block, 16 bytes each. */
  private readonly tails: number;
  private readonly descriptors: Float64Array;

  /** With `reuse`, the summary's counts are views of the kernel's memory, valid until the next run (as ChunkRunner's). */
  constructor(
    spec: SupplySpec,
    private readonly model: Model,
    private readonly config: ChunkConfig,
    private readonly reuse = false,
  ) {
    const tables = kernelLayout(spec, model);
    this.k = borrowKernel();
    this.parts = model.parts.length;
    const outputs = model.outputs.length;
    const size = config.chunkSize;
    this.gridC = config.perUnit && model.ambient ? model.ambient.gridC.slice() : null;
    this.checked = checkedOutputs(model);
    this.countStride = config.bins + 2;
    const arena = new Arena();
    this.stride = Math.ceil((size * 8) / 16) * 16;
    this.desc = arena.take(tables.descriptors.byteLength);
    this.lay = arena.take(tables.layout.byteLength);
    this.par = arena.take(tables.parameters.byteLength);
    this.res = arena.take(RESULT_FIELDS * 8);
    this.cols = arena.take(this.stride * (this.parts + 1));
    this.drawing = model.parts.map((_, i) => i).filter((i) => tables.descriptors[8 * i] !== 0);
    this.groups = arena.take(GROUP_BYTES * Math.ceil(this.drawing.length / 4));
    this.descriptors = tables.descriptors;
    this.spare = arena.take(this.stride);
    this.tails = arena.take(16 * (KERNEL_BLOCK + 2));
    this.outs = arena.take(this.stride * outputs);
    this.ambientOuts = arena.take(this.stride * outputs * (this.gridC?.length ?? 0));
    this.counts = arena.take(4 * this.countStride * outputs);
    this.ambientCounts = arena.take(4 * this.countStride * outputs * (this.gridC?.length ?? 0));
    this.passRows = arena.take(size * this.checked.length);
    this.windowRows = arena.take(24 * this.checked.length);
    this.all = arena.take(size);
    const memory = this.k.memory;
    const have = memory.buffer.byteLength;
    if (arena.top > have) memory.grow(Math.ceil((arena.top - have) / PAGE));
    const buffer = memory.buffer;
    new Float64Array(buffer, this.desc, tables.descriptors.length).set(tables.descriptors);
    new Int32Array(buffer, this.lay, tables.layout.length).set(tables.layout);
    new Float64Array(buffer, this.par, tables.parameters.length).set(tables.parameters);
    // The column of zeros (absent parts): the kernel never writes it, but a borrowed instance's memory may hold
    // anything there.
    new Uint8Array(buffer, this.cols + this.parts * this.stride, this.stride).fill(0);
    const rows = new DataView(buffer, this.windowRows, 24 * this.checked.length);
    this.checked.forEach((c, i) => {
      rows.setUint32(24 * i, this.outs + c.index * this.stride, true);
      rows.setFloat64(24 * i + 8, c.lo, true);
      rows.setFloat64(24 * i + 16, c.hi, true);
    });
  }

  /** Gives the kernel instance back for the next runner; this runner is not used after. */
  release(): void {
    giveBackKernel(this.k);
  }

  run(k: number): ChunkSummary {
    const { config, model } = this;
    const kernel = this.k;
    const n = chunkLength(config, k);
    const buffer = kernel.memory.buffer;
    const outputCount = model.outputs.length;
    const rowBytes = config.chunkSize;
    const ambientSet = this.stride * outputCount;
    if (this.gridC) new Uint8Array(buffer, this.passRows, rowBytes * this.checked.length).fill(1);
    const parameters = new Float64Array(buffer, this.par + 8 * P_FIXED_T, 1);
    // Block by block (KERNEL_BLOCK trials): a block's part columns stay in cache from their draw to their last
    // evaluation. Every operation is per trial, and the streams go on where the last block stopped, so the bits
    // are those of the whole chunk at once; the reductions below run over whole columns, in trial order.
    this.startStreams(chunkState(config.seed, k), n);
    for (let start = 0; start < n; start += KERNEL_BLOCK) {
      const m = Math.min(KERNEL_BLOCK, n - start);
      const off = 8 * start;
      kernel.generate(this.groups, Math.ceil(this.drawing.length / 4), m, off);
      kernel.transform(this.desc, this.parts, this.cols + off, this.stride, m, this.tails);
      kernel.evaluate(this.lay, this.par, this.cols + off, this.stride, m, this.outs + off, 0);
      // The per-unit check (src/analysis/unit-check.ts): pass rows start at 1, each ambient ands its flags in.
      this.gridC?.forEach((t, g) => {
        parameters[0] = t;
        const outs = this.ambientOuts + g * ambientSet;
        kernel.evaluate(this.lay, this.par, this.cols + off, this.stride, m, outs + off, 1);
        this.checked.forEach((c, i) => kernel.markInside(outs + c.index * this.stride + off, m, c.lo, c.hi, this.passRows + i * rowBytes + start));
      });
    }
    const counts = new Uint32Array(buffer, this.counts, this.countStride * outputCount);
    counts.fill(0);
    const outputs = model.outputs.map((_, o) => this.reduce(o, this.outs + o * this.stride, n, this.counts + 4 * o * this.countStride, config.keepSamples, config.chunkIntervals));
    let ambient: OutputChunk[][] | null = null;
    let allInSpec: number;
    if (this.gridC) {
      ambient = [];
      const stride = this.countStride * outputCount;
      new Uint32Array(buffer, this.ambientCounts, stride * this.gridC.length).fill(0);
      this.gridC.forEach((_, g) => {
        const outs = this.ambientOuts + g * ambientSet;
        const base = this.ambientCounts + 4 * g * stride;
        ambient!.push(model.outputs.map((_, o) => this.reduce(o, outs + o * this.stride, n, base + 4 * o * this.countStride, false, false)));
      });
      this.checked.forEach((c, i) => (outputs[c.index]!.unitInSpec = kernel.countOnes(this.passRows + i * rowBytes, n)));
      kernel.markAll(this.passRows, this.checked.length, rowBytes, n, this.all);
      allInSpec = kernel.countOnes(this.all, n);
    } else {
      // Judged as drawn: a unit meets a window when its drawn value is inside, the reduction's own in-spec count.
      this.checked.forEach((c) => (outputs[c.index]!.unitInSpec = outputs[c.index]!.inSpec));
      allInSpec = kernel.countAllInside(this.windowRows, this.checked.length, n);
    }
    if (!this.reuse) keepCountedBins(outputs, ambient, config);
    return { k, outputs, allInSpec, ambient };
  }

  /**
   * The groups table of src/analysis/kernel/assembly/chunk-kernel.ts generate: part i's stream starts i·n steps into the chunk's
   * (xor128-jump.ts), four drawing parts per group, a short last group padded with the spare column.
   */
  private startStreams(state: Int32Array, n: number): void {
    const jump = jumpMatrix(n);
    const groups = Math.ceil(this.drawing.length / 4);
    const buffer = this.k.memory.buffer;
    const words = new Int32Array(buffer, this.groups, (GROUP_BYTES / 4) * groups);
    const scales = new Float64Array(buffer, this.groups, (GROUP_BYTES / 8) * groups);
    words.fill(0);
    const place = (slot: number, column: number, lo: number, width: number): void => {
      const g = Math.floor(slot / 4);
      const lane = slot % 4;
      words[(GROUP_BYTES / 4) * g + 16 + lane] = column;
      scales[(GROUP_BYTES / 8) * g + 10 + lane] = lo;
      scales[(GROUP_BYTES / 8) * g + 14 + lane] = width;
    };
    let next = 0;
    for (let i = 0; i < this.parts; i++) {
      if (next < this.drawing.length && this.drawing[next] === i) {
        const g = (GROUP_BYTES / 4) * Math.floor(next / 4);
        const lane = next % 4;
        for (let word = 0; word < 4; word++) words[g + 4 * word + lane] = state[word]!;
        // A uniform part (descriptor kind 1) is scaled as it is drawn; any other gets the bare uniform.
        const d = 8 * i;
        const affine = this.descriptors[d] === 1;
        place(next, this.cols + i * this.stride, affine ? this.descriptors[d + 1]! : 0, affine ? this.descriptors[d + 2]! : 1);
        next++;
      }
      applyBitMatrix(jump, state, state);
    }
    for (let pad = next; pad % 4 !== 0; pad++) place(pad, this.spare, 0, 1);
  }

  /** ChunkRunner.reduce over a column of the kernel's memory. */
  private reduce(o: number, x: number, n: number, countsAt: number, keepSamples: boolean, chunkIntervals: boolean): OutputChunk {
    const { config } = this;
    const kernel = this.k;
    const spec = config.specs[o];
    const lo = config.ranges[o]!.lo;
    kernel.reduce(x, n, lo, config.bins / (config.ranges[o]!.hi - lo), config.bins, countsAt, spec ? spec[0] : -Infinity, spec ? spec[1] : Infinity, this.res);
    const buffer = kernel.memory.buffer;
    const r = new Float64Array(buffer, this.res, RESULT_FIELDS);
    const [min, max, , scanInSpec, below, mean, sq, dev, nonFinite] = r as unknown as number[];
    const inSpec = spec ? scanInSpec! : n;
    const belowSpec = spec ? below! : 0;
    // Corrected two-pass variance (Chan, Golub & LeVeque 1983), as chunkMoments in statistics/moments.ts.
    const m2 = n > 0 ? Math.max(0, sq! - (dev! * dev!) / n) : 0;
    const counts = new Uint32Array(buffer, countsAt, config.bins + 2);
    const values = new Float64Array(buffer, x, n);
    let low95 = NaN;
    let high95 = NaN;
    if (chunkIntervals && n > 0 && nonFinite === 0) {
      const h: FineHistogram = { lo, hi: config.ranges[o]!.hi, bins: config.bins, counts, min: min!, max: max! };
      const rank = symmetricStartRank(0.95, n);
      const end = Math.min(n, rank + coverageCount(0.95, n));
      const order = new OrderStatistics([values], h, [[rank, rank], [end, end]]);
      ({ low: low95, high: high95 } = symmetricIntervalOf((i) => order.at(i), n, 0.95));
    }
    const samples = keepSamples ? values.slice() : null;
    return { n, mean: mean!, m2, min: min!, max: max!, inSpec, nonFinite: nonFinite!, counts, samples, low95, high95, unitInSpec: inSpec, belowSpec };
  }
}
