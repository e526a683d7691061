// Paired trials (common random numbers): one drawn sample of units, reused for every variant of a model whose parts
// differ only in their bands (a resistor in another tolerance grade, with that grade's TCR). Each part of each trial
// is drawn once, as a uniform u in [0, 1), exactly where the engine draws it (chunk k from its (seed, k) stream,
// part i taking the chunk's draws i·n … (i+1)·n − 1: chunk-random.ts, drawChunkParts); a variant's part value is
// then the part's own transform of u (partFromUnit, partUnitMap: lo + width·u for a uniform band), so trial j here is
// trial j of an engine run of that variant with the same seed and trial count, bit for bit, and comparing two
// variants costs model evaluations only, never a new draw. With common random numbers a tighter band maps each u to
// a value closer to its nominal (the same quantile of a narrower band), which is why the comparison of two grades
// on one sample has far less noise than two independent runs.
//
// A unit passes when it meets every spec window at every ambient of the model's grid: unit-check.ts decides, as for
// the engine's all-specs yield. `count` can stop as soon as a variant has more failing units than a caller allows
// (a search only needs to know that an assignment misses its target), and it looks first at the units that failed
// in earlier variants, which fail again most often: both are exact for the pass/fail answer, because a stop happens
// only once the failures already counted are more than allowed.
//
// Memory: the uniforms are kept (8 bytes per part per trial) while they fit SAMPLE_BYTES_CAP; past it each chunk's
// uniforms are drawn again from its own stream when needed (the same numbers, so still paired). Part columns of each
// band are cached up to COLUMN_CACHE_BYTES. Pure: no clock, no I/O, no global random source.
import type { Part } from '../tolerance/part.js';
import { partFromUnit, partUnitMap } from '../tolerance/sample.js';
import { DEFAULT_CHUNK_SIZE } from './chunk.js';
import { chunkState, fillXor128 } from './chunk-random.js';
import { evaluateOutputs, type Model } from './model.js';
import { UnitChecker } from './unit-check.js';

/** Uniforms kept in memory up to this many bytes (our choice: 26 parts × 1e6 trials is 208 MB). */
export const SAMPLE_BYTES_CAP = 256 * 2 ** 20;
/** Part columns (a part's values in one band) cached up to this many bytes (our choice). */
export const COLUMN_CACHE_BYTES = 128 * 2 ** 20;
/** Units checked per call of the model (bounds scratch memory and makes early stops prompt). */
export const PAIRED_BLOCK = 4096;
/** At most this many earlier failures are kept to be checked first, HARD_BLOCK at a time (our choice). */
const HARD_UNITS = 2048;
const HARD_BLOCK = 64;
/** The hard units' gathered columns kept up to this many bytes (our choice: every grade of 26 parts is about 3 MB). */
const HARD_CACHE_BYTES = 32 * 2 ** 20;

export interface PairedSampleOptions {
  seed: string;
  trials: number;
  chunkSize?: number;
  /**
   * What checks the units in count: by default UnitChecker over evaluateOutputs (the JavaScript model); given, this
   * one, which must give the same flags (the WebAssembly evaluator, src/analysis/kernel/wasm-evaluator.ts).
   */
  blockChecker?: BlockChecker;
}

/** Another implementation of the per-unit check for count: the flags UnitChecker.all gives, for blocks of units. */
export interface BlockChecker {
  /** The most units one call takes (at least PAIRED_BLOCK). */
  readonly capacity: number;
  /** all[0..n): 1 where unit j of the part columns p meets every window at every ambient of `model`'s grid (at its
   *  drawn values without a grid). Valid until the next call. */
  check(model: Model, p: readonly Float64Array[], n: number): Uint8Array;
  /** The same for units start..start + n − 1 of whole columns, which never change once handed over (the sample's
   *  cached columns): a checker may keep its own copy of a column and copy it again only for another array. */
  checkRange?(model: Model, columns: readonly Float64Array[], start: number, n: number): Uint8Array;
}

/** count's limits: stop once more than maxFailures units have failed, or after about maxUnits units. */
export interface PairedLimits {
  maxFailures?: number;
  maxUnits?: number;
}

export interface PairedCount {
  /** Units checked, and those of them that met every window at every ambient. */
  checked: number;
  inSpec: number;
  /** Failing units counted (all of them when complete). */
  failures: number;
  /** True when every unit of the sample was checked (then inSpec / trials is the yield). */
  complete: boolean;
  /** Model evaluations spent: units × ambients (× 1 without an ambient grid). */
  evaluations: number;
}

interface SampleChunk {
  k: number;
  offset: number;
  n: number;
  /** u[i][j]: part i of trial offset + j; null when the sample is past SAMPLE_BYTES_CAP (drawn again when needed). */
  u: Float64Array[] | null;
}

interface HardSnapshot {
  version: number;
  /** The hard units, most recent first. */
  recent: number[];
  /** Positions in `recent` by ascending trial. */
  ascending: Int32Array;
  /** columns[i].get(part): part i's values at those units, in that order. */
  columns: Array<Map<Part, Float64Array>>;
  bytes: number;
}

/** One drawn sample of `trials` units of a model with `partCount` parts; see the header. */
export class PairedSample {
  readonly trials: number;
  readonly seed: string;
  readonly partCount: number;
  private readonly chunks: SampleChunk[] = [];
  private readonly columns = new Map<string, Float64Array>();
  private columnBytes = 0;
  /** The same columns by Part object: part → chunk → part index → values. */
  private byPart = new WeakMap<Part, Float64Array[][]>();
  /** Reused between variants that share outputs, ambient grid and evaluation (variants put together from parts). */
  private checker: { model: Model; checker: UnitChecker; drawn: Float64Array[] } | null = null;
  /** Trial indices that failed in some variant, checked first (at most HARD_UNITS, most recent kept). */
  private hard: number[] = [];
  /** Changes whenever `hard` does; the snapshot of the hard units and their gathered columns for one version. */
  private hardVersion = 0;
  private hardCache: HardSnapshot | null = null;
  private readonly isHard: Uint8Array;
  private scratchU: Float64Array[] | null = null;
  private readonly blockChecker: BlockChecker | null;

  constructor(partCount: number, options: PairedSampleOptions) {
    const chunkSize = options.chunkSize ?? DEFAULT_CHUNK_SIZE;
    if (!Number.isInteger(options.trials) || options.trials < 1) throw new Error(`paired sample: ${options.trials} trials is not a whole number ≥ 1`);
    this.blockChecker = options.blockChecker ?? null;
    if (this.blockChecker && this.blockChecker.capacity < PAIRED_BLOCK) throw new Error(`paired sample: a block checker of ${this.blockChecker.capacity} units (needs ${PAIRED_BLOCK})`);
    this.trials = options.trials;
    this.seed = options.seed;
    this.partCount = partCount;
    this.isHard = new Uint8Array(options.trials);
    const keep = partCount * options.trials * 8 <= SAMPLE_BYTES_CAP;
    for (let k = 0, offset = 0; offset < options.trials; k++) {
      // The engine's chunk lengths for a run of `trials` (the last chunk cut short).
      const n = Math.min(chunkSize, options.trials - offset);
      const chunk: SampleChunk = { k, offset, n, u: null };
      if (keep) chunk.u = drawUnits(partCount, options.seed, k, n);
      this.chunks.push(chunk);
      offset += n;
    }
  }

  /** Part i's values over the chunk for `part`'s band (cached; the same numbers drawChunkParts gives). */
  private column(chunk: SampleChunk, i: number, part: Part): Float64Array {
    // Variants put together from the same Part objects find their columns by identity; others by the band.
    const byPart = chunk.u ? this.byPart.get(part)?.[chunk.k]?.[i] : undefined;
    if (byPart) return byPart;
    const u = chunk.u ?? this.unitsOf(chunk);
    const map = partUnitMap(part);
    const key = `${chunk.k}|${i}|${map.kind === 'constant' ? `c${map.value}` : `${part.nominal}|${part.minus}|${part.plus}|${JSON.stringify(part.distribution)}`}`;
    const cached = chunk.u ? this.columns.get(key) : undefined;
    if (cached) {
      this.remember(part, chunk.k, i, cached);
      return cached;
    }
    const values = new Float64Array(chunk.n);
    if (map.kind === 'constant') values.fill(map.value);
    else if (map.kind === 'affine') affineColumn(u[i]!, values, chunk.n, map.lo, map.width);
    else {
      values.set(u[i]!.subarray(0, chunk.n));
      partFromUnit(part, values, chunk.n);
    }
    if (chunk.u) {
      if (this.columnBytes + values.byteLength > COLUMN_CACHE_BYTES) {
        this.columns.clear();
        this.byPart = new WeakMap();
        this.columnBytes = 0;
      }
      this.columns.set(key, values);
      this.columnBytes += values.byteLength;
      this.remember(part, chunk.k, i, values);
    }
    return values;
  }

  private remember(part: Part, k: number, i: number, values: Float64Array): void {
    let perChunk = this.byPart.get(part);
    if (!perChunk) this.byPart.set(part, (perChunk = []));
    (perChunk[k] ??= [])[i] = values;
  }

  /** A chunk's uniforms drawn again from its stream (only past SAMPLE_BYTES_CAP). */
  private unitsOf(chunk: SampleChunk): Float64Array[] {
    // Every part's column of a chunk asks for the chunk's uniforms: they are drawn once and kept until another chunk's
    // are needed (the same numbers: each chunk's stream starts from (seed, k)).
    if (this.scratchU !== null && this.scratchK === chunk.k) return this.scratchU;
    if (this.scratchU === null || this.scratchU[0]!.length < chunk.n) this.scratchU = Array.from({ length: this.partCount }, () => new Float64Array(chunk.n));
    const state = chunkState(this.seed, chunk.k);
    for (let i = 0; i < this.partCount; i++) fillXor128(state, this.scratchU[i]!, chunk.n);
    this.scratchK = chunk.k;
    return this.scratchU;
  }

  /** The chunk whose uniforms scratchU holds (−1: none). */
  private scratchK = -1;

  /**
   * Every part's values over the whole sample in `model`'s bands (the numbers drawChunkParts gives for chunk 0), for a
   * sample of one chunk (made with chunkSize ≥ trials). Shared with the cache: read them, never write them.
   */
  columnsOf(model: Model): Float64Array[] {
    if (this.chunks.length !== 1 || this.chunks[0]!.u === null) throw new Error('paired sample: columnsOf needs a sample of one chunk held in memory');
    if (model.parts.length !== this.partCount) throw new Error(`paired sample of ${this.partCount} parts given a model of ${model.parts.length}`);
    return model.parts.map((part, i) => this.column(this.chunks[0]!, i, part));
  }

  /**
   * Counts the units of `model` (a variant of the sample's model: the same parts in the same order, bands free)
   * that meet every window at every ambient. With `maxFailures`, stops once more units than that have failed
   * (complete is then false; the variant certainly has more failures than allowed on this sample); with
   * `maxUnits`, stops after about that many units (a screen: complete false, nothing proven unless failures >
   * maxFailures). Units that failed in earlier variants are checked first when they alone can decide.
   */
  count(model: Model, limits: PairedLimits = {}): PairedCount {
    const steps = this.countSteps(model, limits);
    for (;;) {
      const step = steps.next();
      if (step.done) return step.value;
    }
  }

  /** count, pausing for the event loop between the chunks of the sample (a long count still answers Ctrl-C at once);
   *  the same result, however it is driven. Run one count of a sample at a time. */
  async countAsync(model: Model, limits: PairedLimits = {}): Promise<PairedCount> {
    const steps = this.countSteps(model, limits);
    for (;;) {
      const step = steps.next();
      if (step.done) return step.value;
      await new Promise((resolve) => setImmediate(resolve));
    }
  }

  /** count's computation, yielding between the chunks of the sample. */
  private *countSteps(model: Model, limits: PairedLimits): Generator<void, PairedCount> {
    if (model.parts.length !== this.partCount) throw new Error(`paired sample of ${this.partCount} parts given a model of ${model.parts.length}`);
    const maxFailures = limits.maxFailures ?? Infinity;
    const maxUnits = limits.maxUnits ?? Infinity;
    const perUnit = model.ambient ? model.ambient.gridC.length : 1;
    let evaluations = 0;
    // 1. Units that failed before, most recent first, in small blocks, when they alone can show the variant fails.
    if (Number.isFinite(maxFailures) && this.hard.length > maxFailures) {
      const snapshot = this.hardSnapshot();
      const recent = snapshot.recent;
      const columns = model.parts.map((part, i) => this.hardColumn(snapshot, i, part));
      let failed = 0;
      let seen = 0;
      for (let start = 0; start < recent.length && seen < maxUnits; start += HARD_BLOCK) {
        const size = Math.min(HARD_BLOCK, recent.length - start);
        failed += this.checkBlock(model, columns, start, size, 0, null);
        seen += size;
        evaluations += size * perUnit;
        if (failed > maxFailures) return { checked: seen, inSpec: seen - failed, failures: failed, complete: false, evaluations };
        // Stop looking here once the rest of the hard units cannot reach the limit, or, at the rate they have failed
        // so far, would not (a guess that only saves time: the count below decides).
        const rest = recent.length - seen;
        if (failed + rest <= maxFailures || failed + (rest * failed) / seen <= maxFailures) break;
      }
      if (seen >= maxUnits) return { checked: seen, inSpec: seen - failed, failures: failed, complete: false, evaluations };
    }
    // 2. Every unit in trial order, block by block, stopping once too many have failed.
    let checked = 0;
    let failures = 0;
    for (const chunk of this.chunks) {
      const columns = model.parts.map((part, i) => this.column(chunk, i, part));
      for (let start = 0; start < chunk.n; start += PAIRED_BLOCK) {
        if (checked >= maxUnits) return { checked, inSpec: checked - failures, failures, complete: false, evaluations };
        const n = Math.min(PAIRED_BLOCK, chunk.n - start);
        failures += this.checkBlock(model, columns, start, n, chunk.offset + start, this.hard);
        checked += n;
        evaluations += n * perUnit;
        if (failures > maxFailures) return { checked, inSpec: checked - failures, failures, complete: false, evaluations };
      }
      if (chunk !== this.chunks[this.chunks.length - 1]) yield;
    }
    return { checked, inSpec: checked - failures, failures, complete: true, evaluations };
  }

  /** Checks units start..start + n − 1 of the columns; returns how many failed, and (with `remember`) notes their
   *  trial indices (offset + j for the block's unit j) as hard. */
  private checkBlock(model: Model, columns: Float64Array[], start: number, n: number, offset: number, remember: number[] | null): number {
    const all = this.flagsOf(model, columns, start, n);
    let failed = 0;
    for (let j = 0; j < n; j++) {
      if (all[j] === 1) continue;
      failed++;
      if (remember !== null) this.noteHard(offset + j);
    }
    return failed;
  }

  /** all[0..n) of the block: the block checker's, or UnitChecker's over the JavaScript model. */
  private flagsOf(model: Model, columns: Float64Array[], start: number, n: number): Uint8Array {
    const checkRange = this.blockChecker?.checkRange;
    if (checkRange) return checkRange.call(this.blockChecker, model, columns, start, n);
    const p = columns.map((c) => c.subarray(start, start + n));
    if (this.blockChecker) return this.blockChecker.check(model, p, n);
    const { checker, drawn } = this.checkerFor(model);
    if (!model.ambient) evaluateOutputs(model, p, drawn, n);
    checker.check(p, n, drawn);
    return checker.all;
  }

  /** The hard units, most recent first, and their gathered part columns, kept while the list does not change
   *  (a search's counts mostly see the same list: the gathers, random reads across the sample, are done once). */
  private hardSnapshot(): HardSnapshot {
    if (this.hardCache === null || this.hardCache.version !== this.hardVersion) {
      const recent = this.hard.slice().reverse();
      // Gathered in ascending trial order (reads that run forward through each column), stored in the list's order.
      const keys = new Float64Array(recent.length);
      for (let k = 0; k < recent.length; k++) keys[k] = recent[k]! * HARD_UNITS + k;
      keys.sort();
      const ascending = new Int32Array(recent.length);
      for (let k = 0; k < recent.length; k++) ascending[k] = keys[k]! % HARD_UNITS;
      this.hardCache = { version: this.hardVersion, recent, ascending, columns: Array.from({ length: this.partCount }, () => new Map()), bytes: 0 };
    }
    return this.hardCache;
  }

  /** Part i's values (in `part`'s band) at the snapshot's units, in its order. */
  private hardColumn(snapshot: HardSnapshot, i: number, part: Part): Float64Array {
    const byPart = snapshot.columns[i]!;
    let values = byPart.get(part);
    if (values === undefined) {
      values = this.gather(i, part, snapshot.recent, new Float64Array(snapshot.recent.length), snapshot.ascending);
      // Bounded like the column cache (variants built in full bring new Part objects with every model).
      if (snapshot.bytes + values.byteLength > HARD_CACHE_BYTES) {
        for (const m of snapshot.columns) m.clear();
        snapshot.bytes = 0;
      }
      byPart.set(part, values);
      snapshot.bytes += values.byteLength;
    }
    return values;
  }

  private noteHard(trial: number): void {
    if (this.isHard[trial] === 1) return;
    this.hardVersion += 1;
    if (this.hard.length >= HARD_UNITS) this.isHard[this.hard.shift()!] = 0;
    this.hard.push(trial);
    this.isHard[trial] = 1;
  }

  /** A unit checker for the model: the last one when the model shares its outputs, ambient grid and evaluation. */
  private checkerFor(model: Model): { checker: UnitChecker; drawn: Float64Array[] } {
    const last = this.checker;
    if (last && last.model.outputs === model.outputs && last.model.ambient === model.ambient && last.model.evaluateAll === model.evaluateAll) {
      // The checker evaluates through its own model: give it this variant's (same functions, so only parts differ).
      return { checker: last.checker, drawn: last.drawn };
    }
    const checker = new UnitChecker(model, PAIRED_BLOCK);
    const drawn = model.ambient ? [] : model.outputs.map(() => new Float64Array(PAIRED_BLOCK));
    this.checker = { model, checker, drawn };
    return { checker, drawn };
  }

  /** Part i's values at the given trials, in that order, into `out`. */
  private gather(i: number, part: Part, trials: readonly number[], out: Float64Array, order: Int32Array | null = null): Float64Array {
    let c = 0;
    let chunk = this.chunks[0]!;
    let values = this.column(chunk, i, part);
    // Trials are visited in the order given (by `order`, when given: out[order[k]] for k = 0, 1, …); look the chunk
    // up when a trial leaves the current one.
    for (let k = 0; k < trials.length; k++) {
      const t = order === null ? k : order[k]!;
      const trial = trials[t]!;
      if (trial < chunk.offset || trial >= chunk.offset + chunk.n) {
        c = this.chunks.findIndex((ch) => trial >= ch.offset && trial < ch.offset + ch.n);
        chunk = this.chunks[c]!;
        values = this.column(chunk, i, part);
      }
      out[t] = values[trial - chunk.offset]!;
    }
    return out;
  }
}

/** The chunk's uniforms, part after part, as drawChunkParts consumes them. */
function drawUnits(partCount: number, seed: string, k: number, n: number): Float64Array[] {
  const state = chunkState(seed, k);
  const u: Float64Array[] = [];
  for (let i = 0; i < partCount; i++) {
    const column = new Float64Array(n);
    fillXor128(state, column, n);
    u.push(column);
  }
  return u;
}

/** values[j] = lo + width·u[j]: the operations of fillXor128Affine (and uniformFromUnit) on each draw. */
function affineColumn(u: Float64Array, values: Float64Array, n: number, lo: number, width: number): void {
  for (let j = 0; j < n; j++) values[j] = lo + width * u[j]!;
}
