// The supply model and the per-unit check evaluated in the WebAssembly kernel for part values the caller already
// has (a paired sample's columns, the variance indices' rows), block by block: the kernel's `evaluate` at the values
// drawn or at each ambient of the model's grid, then `markWindows` (markInside for every window of the block, sixteen
// units per SIMD step: an export of its own at the end of the kernel), `markAll` and `countOnes`. The same results as
// evaluateOutputs and UnitChecker (src/analysis/model.ts, src/analysis/unit-check.ts), to the bit: the kernel's
// evaluate is the JavaScript model's operations in the same order per trial (test/wasm-kernel.test.ts), and holding
// the ambient at t (fixedT) gives the dT = t − 25 that the reference gets by filling the ambient column with t.
// test/wasm-evaluator.test.ts compares outputs and flags with the reference on every example the kernel supports.
//
// One evaluator serves every variant of one design whose parts differ only in their bands (the grade search's
// assignments): the kernel's layout (layout.ts kernelLayout) depends on which parts exist and on the design's
// wiring, never on a band, so it is computed once; every call checks that the model has the same parts, by name
// and in order, and throws if not. sameKernelLayout says whether two specs give the same tables.
import type { Model } from '../model.js';
import { buildSupplyModel, type SupplySpec } from '../models/supply.js';
import { chooseKernel, type KernelChoice } from './choice.js';
import { checkedOutputs, type CheckedOutput } from '../unit-check.js';
import { kernelLayout, P_FIXED_T, type KernelLayout } from './layout.js';
import { instantiateKernel, KERNEL_SCRATCH_BYTES, type KernelExports } from './wasm-module.js';

const PAGE = 65536;

/** Bytes added to every column past its values: three cache lines (64 bytes each, common practice for x86-64 and
 *  ARM64), so the kernel's 30-odd column streams do not start a whole number of 4 KB pages apart and fall into the
 *  same cache sets (with a block of 4096 values, a power-of-two column size, they did: the evaluation of the LED
 *  example took about 70 ns a unit and ambient unpadded, 50 to 60 ns with this padding, measured on the 2-core
 *  development machine). Layout only: no value depends on it. */
const COLUMN_PAD_BYTES = 3 * 64;

/** Bytes of a column of `capacity` f64: rounded up to 16 (the kernel evaluates two trials per SIMD step, so an odd
 *  block computes one value past its end: a column has room for it), plus COLUMN_PAD_BYTES. */
function columnBytes(capacity: number): number {
  return Math.ceil((capacity * 8) / 16) * 16 + COLUMN_PAD_BYTES;
}

/** True when both specs (with the models built from them) give the kernel the same wiring and parameter tables and
 *  the same part names in the same order: one evaluator then serves both. */
export function sameKernelLayout(a: { spec: SupplySpec; model: Model }, b: { spec: SupplySpec; model: Model }): boolean {
  if (a.model.parts.length !== b.model.parts.length || a.model.parts.some((p, i) => p.name !== b.model.parts[i]!.name)) return false;
  const la = kernelLayout(a.spec, a.model);
  const lb = kernelLayout(b.spec, b.model);
  const same = (x: ArrayLike<number>, y: ArrayLike<number>): boolean => x.length === y.length && Array.from(x).every((v, i) => Object.is(v, y[i]));
  return same(la.layout, lb.layout) && same(la.parameters, lb.parameters);
}

/**
 * The evaluator for the variants of one design, as the run's kernel choice says: `variants` are specs that between
 * them give every part list and wiring a variant can have (for the grade search: every resistor in each candidate
 * grade). Null, so the JavaScript model evaluates, when the choice is js, or (auto) when the kernel does not
 * implement them, or when they do not share one layout; `wasm` asked for a design the kernel does not implement is
 * chooseKernel's input error. The same numbers either way.
 */
export function variantEvaluator(variants: readonly SupplySpec[], choice: KernelChoice, capacity: number): WasmUnitEvaluator | null {
  if (variants.length === 0) return null;
  const kernels = variants.map((spec) => chooseKernel(choice, { kind: 'supply', spec }));
  if (kernels.some((k) => k !== 'wasm')) return null;
  const built = variants.map((spec) => ({ spec, model: buildSupplyModel(spec) }));
  if (!built.every((b) => sameKernelLayout(built[0]!, b))) return null;
  return new WasmUnitEvaluator(built[0]!.spec, built[0]!.model, capacity);
}

/** Where a check finds its part columns (cols + i·stride), writes its outputs (outs + o·stride) and its window table. */
interface Placement {
  cols: number;
  stride: number;
  outs: number;
  windowRows: number;
}

/** Columns kept in the kernel's memory for checkRange, and which array each slot holds. */
interface Region extends Placement {
  resident: Array<Float64Array | null>;
}

export class WasmUnitEvaluator {
  readonly capacity: number;
  readonly checked: readonly CheckedOutput[];
  private readonly k: KernelExports;
  private readonly names: string[];
  private readonly outputCount: number;
  private readonly gridC: number[] | null;
  private readonly stride: number;
  private readonly lay: number;
  private readonly par: number;
  private readonly cols: number;
  private readonly outs: number;
  private readonly passRows: number;
  /** markWindows' table: each checked output's column address and window. */
  private readonly windowRows: number;
  private readonly all: number;

  /**
   * For `model` built from `spec` (kernelSupports(spec) must hold) and every variant of it with the same parts:
   * blocks of up to `capacity` units.
   */
  constructor(spec: SupplySpec, model: Model, capacity: number) {
    if (!Number.isInteger(capacity) || capacity < 1) throw new Error(`wasm evaluator: ${capacity} units a block is not a whole number ≥ 1`);
    const tables: KernelLayout = kernelLayout(spec, model);
    this.k = instantiateKernel();
    this.capacity = capacity;
    this.names = model.parts.map((p) => p.name);
    this.outputCount = model.outputs.length;
    this.checked = checkedOutputs(model);
    this.gridC = model.ambient ? model.ambient.gridC.slice() : null;
    this.stride = columnBytes(capacity);
    // The arena, after the kernel's own scratch: tables, part columns and the column of zeros (index parts.length),
    // outputs, pass rows, all.
    let top = KERNEL_SCRATCH_BYTES;
    const take = (bytes: number): number => {
      const at = top;
      top += Math.ceil(bytes / 16) * 16;
      return at;
    };
    this.lay = take(tables.layout.byteLength);
    this.par = take(tables.parameters.byteLength);
    this.cols = take(this.stride * (this.names.length + 1));
    this.outs = take(this.stride * this.outputCount);
    this.passRows = take(capacity * this.checked.length);
    this.windowRows = take(24 * this.checked.length);
    this.all = take(capacity);
    const memory = this.k.memory;
    if (top > memory.buffer.byteLength) memory.grow(Math.ceil((top - memory.buffer.byteLength) / PAGE));
    const buffer = memory.buffer;
    new Int32Array(buffer, this.lay, tables.layout.length).set(tables.layout);
    new Float64Array(buffer, this.par, tables.parameters.length).set(tables.parameters);
    this.writeWindowRows(this.windowRows, this.outs, this.stride);
    // The column of zeros (absent parts) is never written: a fresh memory is zero.
  }

  /** The ambients each unit is checked at, °C; null when units are checked at their drawn values. */
  get ambientsC(): readonly number[] | null {
    return this.gridC;
  }

  /**
   * Every output of units 0..n−1 at their drawn values, into outs[o] (evaluateOutputs(model, p, outs, n), to the
   * bit). `model` is the evaluator's model or a variant of it (the same parts; bands free).
   */
  evaluate(model: Model, p: readonly Float64Array[], outs: readonly Float64Array[], n: number): void {
    this.load(model, p, n);
    const buffer = this.evaluateInto(n, 0);
    for (let o = 0; o < this.outputCount; o++) outs[o]!.set(new Float64Array(buffer, this.outs + o * this.stride, n));
  }

  /**
   * The per-unit check of units 0..n−1 (UnitChecker.check with evaluateOutputs for the drawn values): returns
   * all[0..n), 1 where the unit meets every window at every ambient of the grid (at its drawn values without a
   * grid). `onAmbient` sees the outputs at each grid ambient. The flags and outputs are views of the kernel's
   * memory, valid until the next call.
   */
  check(model: Model, p: readonly Float64Array[], n: number, onAmbient?: (g: number, outs: Float64Array[]) => void): Uint8Array {
    this.load(model, p, n);
    return this.checkAt({ cols: this.cols, stride: this.stride, outs: this.outs, windowRows: this.windowRows }, n, onAmbient);
  }

  /**
   * check for units start..start + n − 1 of whole columns (all of one length), which the caller never changes once
   * handed over: each column is copied into the kernel's memory once and kept there while the same array comes back
   * (variants share most of their parts' columns), and the kernel reads the block in place.
   */
  checkRange(model: Model, columns: readonly Float64Array[], start: number, n: number): Uint8Array {
    if (!Number.isInteger(n) || n < 0 || n > this.capacity) throw new Error(`wasm evaluator: a block of ${n} units (capacity ${this.capacity})`);
    this.assertVariant(model);
    if (columns.length !== this.names.length) throw new Error(`wasm evaluator: ${columns.length} part columns for ${this.names.length} parts`);
    const length = columns[0]?.length ?? 0;
    if (!Number.isInteger(start) || start < 0 || start + n > length) throw new Error(`wasm evaluator: units ${start}..${start + n} of columns of ${length}`);
    const region = this.regionFor(length);
    for (let i = 0; i < columns.length; i++) {
      const column = columns[i]!;
      if (region.resident[i] === column) continue;
      if (column.length !== length) throw new Error('wasm evaluator: part columns of different lengths');
      this.heap().set(column, (region.cols + i * region.stride) / 8);
      region.resident[i] = column;
    }
    return this.checkAt({ ...region, cols: region.cols + 8 * start }, n);
  }

  /** The per-unit check of n units whose part columns are at `at.cols`, `at.stride` bytes apart (the kernel writes the
   *  outputs with the same stride: at `at.outs`, marked through the window table at `at.windowRows`). */
  private checkAt(at: Placement, n: number, onAmbient?: (g: number, outs: Float64Array[]) => void): Uint8Array {
    const kernel = this.k;
    const { cols, stride, outs } = at;
    const rowBytes = this.capacity;
    const checked = this.checked;
    this.bytes().fill(1, this.passRows, this.passRows + rowBytes * checked.length);
    const grid = this.gridC;
    for (let g = 0; g < (grid === null ? 1 : grid.length); g++) {
      if (grid !== null) this.heap()[this.par / 8 + P_FIXED_T] = grid[g]!;
      kernel.evaluate(this.lay, this.par, cols, stride, n, outs, grid === null ? 0 : 1);
      const buffer = kernel.memory.buffer;
      kernel.markWindows(at.windowRows, checked.length, n, this.passRows, rowBytes);
      if (grid !== null && onAmbient) onAmbient(g, Array.from({ length: this.outputCount }, (_, o) => new Float64Array(buffer, outs + o * stride, n)));
    }
    kernel.markAll(this.passRows, checked.length, rowBytes, n, this.all);
    return this.bytes().subarray(this.all, this.all + n);
  }

  /** pass[c][0..n) of the last check: 1 where the unit met checked output c at every ambient (a view, as check's). */
  passOf(c: number, n: number): Uint8Array {
    return new Uint8Array(this.k.memory.buffer, this.passRows + c * this.capacity, n);
  }

  /** Ones in all[0..n) of the last check (countPassing of unit-check.ts). */
  countAll(n: number): number {
    return this.k.countOnes(this.all, n);
  }

  /**
   * The region of kept columns for columns of `length` values: one per size class (a power of two, at least 1024), each
   * with a slot per part and the column of zeros after them, made when first needed.
   */
  private regionFor(length: number): Region {
    const size = Math.max(1024, 2 ** Math.ceil(Math.log2(Math.max(1, length))));
    let region = this.regions.get(size);
    if (region === undefined) {
      const stride = columnBytes(size);
      const memory = this.k.memory;
      const at = Math.ceil(memory.buffer.byteLength / 16) * 16;
      // Part columns and the column of zeros, the outputs (the kernel writes them with the columns' stride), the
      // window table. Fresh pages past the arena: zero, so the column of zeros and every pad are zero.
      const outs = at + stride * (this.names.length + 1);
      const windowRows = outs + stride * this.outputCount;
      const end = windowRows + 24 * this.checked.length;
      memory.grow(Math.ceil((end - memory.buffer.byteLength) / PAGE));
      region = { cols: at, stride, outs, windowRows, resident: this.names.map(() => null) };
      this.writeWindowRows(windowRows, outs, stride);
      this.regions.set(size, region);
    }
    return region;
  }

  private readonly regions = new Map<number, Region>();

  /** markWindows' table at `rows` for outputs at `outs`, `stride` bytes apart. */
  private writeWindowRows(rows: number, outs: number, stride: number): void {
    const table = new DataView(this.k.memory.buffer, rows, 24 * this.checked.length);
    this.checked.forEach((c, i) => {
      table.setUint32(24 * i, outs + c.index * stride, true);
      table.setFloat64(24 * i + 8, c.lo, true);
      table.setFloat64(24 * i + 16, c.hi, true);
    });
  }

  private evaluateInto(n: number, fixedT: number): ArrayBuffer {
    this.k.evaluate(this.lay, this.par, this.cols, this.stride, n, this.outs, fixedT);
    return this.k.memory.buffer;
  }

  /** Copies the block's part columns into the kernel's memory, after checking the model is a variant it serves. */
  private load(model: Model, p: readonly Float64Array[], n: number): void {
    if (!Number.isInteger(n) || n < 0 || n > this.capacity) throw new Error(`wasm evaluator: a block of ${n} units (capacity ${this.capacity})`);
    this.assertVariant(model);
    const parts = model.parts;
    if (p.length !== parts.length) throw new Error(`wasm evaluator: ${p.length} part columns for ${parts.length} parts`);
    const heap = this.heap();
    for (let i = 0; i < p.length; i++) {
      const column = p[i]!;
      const at = (this.cols + i * this.stride) / 8;
      if (column.length === n) heap.set(column, at);
      else for (let j = 0; j < n; j++) heap[at + j] = column[j]!;
    }
  }

  /** The kernel's memory as f64 (one view, made again only if the memory grows). */
  private heap(): Float64Array {
    const buffer = this.k.memory.buffer;
    if (this.f64 === null || this.f64.buffer !== buffer) this.f64 = new Float64Array(buffer);
    return this.f64;
  }

  private f64: Float64Array | null = null;

  /** The kernel's memory as bytes (as heap). */
  private bytes(): Uint8Array {
    const buffer = this.k.memory.buffer;
    if (this.u8 === null || this.u8.buffer !== buffer) this.u8 = new Uint8Array(buffer);
    return this.u8;
  }

  private u8: Uint8Array | null = null;

  /** Throws unless `model` has the evaluator's parts (by name, in order), output windows and ambient grid. */
  private assertVariant(model: Model): void {
    // Outputs and grid are compared once per outputs / ambient object (a variant shares its base model's).
    if (model.outputs !== this.verified.outputs || model.ambient !== this.verified.ambient) {
      const windows = checkedOutputs(model);
      const grid = model.ambient ? model.ambient.gridC : null;
      const sameWindows = windows.length === this.checked.length && windows.every((c, i) => c.index === this.checked[i]!.index && Object.is(c.lo, this.checked[i]!.lo) && Object.is(c.hi, this.checked[i]!.hi));
      const sameGrid = grid === null ? this.gridC === null : this.gridC !== null && grid.length === this.gridC.length && grid.every((t, i) => Object.is(t, this.gridC![i]));
      if (model.outputs.length !== this.outputCount || !sameWindows || !sameGrid) throw new Error('wasm evaluator: the model\'s outputs, windows or ambient grid are not those its layout was made for');
      this.verified = { outputs: model.outputs, ambient: model.ambient };
    }
    const parts = model.parts;
    if (parts.length !== this.names.length || parts.some((part, i) => part.name !== this.names[i])) {
      throw new Error(`wasm evaluator: the model's parts (${parts.map((q) => q.name).join(', ')}) are not the parts its layout was made for (${this.names.join(', ')})`);
    }
  }

  private verified: { outputs: Model['outputs'] | null; ambient: Model['ambient'] | null } = { outputs: null, ambient: null };
}
