// What a Monte Carlo trial means: one unit off the line. Its parts, TCRs and drifts are drawn once; the unit is then
// evaluated at every ambient of the model's operating grid (Model.ambient, see ambient-grid.ts). A unit meets an
// output's window when the output lies inside it (lo ≤ y ≤ hi) at every one of those ambients, and meets all specs
// when it meets every output's window. This file is the one place that says so: the Monte Carlo engine's per-unit
// yield, the all-specs yield and the grade search all count through it.
import { evaluateOutputs, type Model } from './model.js';

export interface CheckedOutput {
  /** Index into model.outputs. */
  index: number;
  lo: number;
  hi: number;
}

/** The outputs that have a window, in model order. */
export function checkedOutputs(model: Model): CheckedOutput[] {
  const checked: CheckedOutput[] = [];
  model.outputs.forEach((o, index) => {
    if (o.spec) checked.push({ index, lo: o.spec[0], hi: o.spec[1] });
  });
  return checked;
}

/** pass[j] stays 1 only while x[j] is inside [lo, hi] (a NaN fails). */
function markInside(x: Float64Array, n: number, lo: number, hi: number, pass: Uint8Array): void {
  for (let j = 0; j < n; j++) pass[j] = pass[j]! & (x[j]! >= lo && x[j]! <= hi ? 1 : 0);
}

/** all[j] = 1 when every pass array has a 1 at j (1 everywhere with no arrays: no window, nothing to fail). */
function markAll(pass: Uint8Array[], n: number, all: Uint8Array): void {
  all.fill(1, 0, n);
  for (const p of pass) for (let j = 0; j < n; j++) all[j] = all[j]! & p[j]!;
}

/** Number of ones in flags[0..n). */
export function countPassing(flags: Uint8Array, n: number): number {
  let count = 0;
  for (let j = 0; j < n; j++) count += flags[j]!;
  return count;
}

/**
 * Checks a block of drawn units. Buffers are sized once (capacity units) and reused block after block. With an
 * ambient grid, `onAmbient` sees every output's values at each grid temperature (for per-ambient statistics).
 */
export class UnitChecker {
  readonly checked: CheckedOutput[];
  /** pass[c][j]: unit j met checked output c at every ambient. */
  readonly pass: Uint8Array[];
  /** all[j]: unit j met every window. */
  readonly all: Uint8Array;
  private readonly outs: Float64Array[];
  private readonly drawnAmbient: Float64Array;

  constructor(
    private readonly model: Model,
    capacity: number,
  ) {
    this.checked = checkedOutputs(model);
    this.pass = this.checked.map(() => new Uint8Array(capacity));
    this.all = new Uint8Array(capacity);
    this.outs = model.ambient ? model.outputs.map(() => new Float64Array(capacity)) : [];
    this.drawnAmbient = new Float64Array(model.ambient ? capacity : 0);
  }

  /** The ambients each unit is evaluated at, °C; null when units are checked at their drawn values. */
  get gridC(): number[] | null {
    return this.model.ambient ? this.model.ambient.gridC : null;
  }

  /**
   * Fills pass and all for units 0..n−1. `p` holds the units' drawn part values (left as they were on return);
   * `drawn` their outputs as drawn, used when the model has no ambient grid.
   */
  check(p: Float64Array[], n: number, drawn: Float64Array[], onAmbient?: (g: number, outs: Float64Array[]) => void): void {
    for (const flags of this.pass) flags.fill(1, 0, n);
    const ambient = this.model.ambient;
    if (!ambient) {
      this.checked.forEach((c, i) => markInside(drawn[c.index]!, n, c.lo, c.hi, this.pass[i]!));
    } else {
      const column = p[ambient.part]!;
      this.drawnAmbient.set(column.subarray(0, n));
      ambient.gridC.forEach((t, g) => {
        column.fill(t, 0, n);
        evaluateOutputs(this.model, p, this.outs, n);
        this.checked.forEach((c, i) => markInside(this.outs[c.index]!, n, c.lo, c.hi, this.pass[i]!));
        onAmbient?.(g, this.outs);
      });
      column.set(this.drawnAmbient.subarray(0, n));
    }
    markAll(this.pass, n, this.all);
  }
}
