// The CV/CC supply as a Model: the feedback divider that sets Vout, and the current-sense path that sets the limit.
// SupplySpec is plain JSON in SI base units with every value resolved (the design layer fills "auto" values first),
// so it crosses to worker threads as is; each worker rebuilds the same Model from it.
//
// How the parts enter (each uncertain quantity is its own Part, so worst case, RSS and the contributions name it):
//   resistor value at temperature   R·(1 + drift)·(1 + α·(T − 25 °C))     α: the unit's TCR, unknown within ±TCR
//     with named drift allowances   R·(1 + drift)·Π(1 + d_allowance)·(1 + α·(T − 25 °C))   (life-allowances.ts)
//   reference                        Vref·(1 + drift)·(1 + tc·(T − 25 °C))
//   amplifier offset                 Vos + (dVos/dT)·(T − 25 °C)
//   shunt self-heating               R_hot = R25·(1 + α·(T + θ·P − 25 °C)), P = I²·R_hot at the limit (hotShunt)
// Bias currents are held constant over temperature (their temperature dependence is left to the ± bound given).
// The physics lives in src/circuits/ (divider, combine, temperature, sense/*); this file only wires parts to it.
import { parallelResistance, seriesResistance } from '../../circuits/combine.js';
import { dividerVout } from '../../circuits/divider.js';
import { diffLimit, diffOutput, type DiffSense } from '../../circuits/sense/diff.js';
import { directLimit, directSignal, type DirectSense } from '../../circuits/sense/direct.js';
import { noninvLimit, noninvOutput, type NoninvSense } from '../../circuits/sense/noninv.js';
import { REFERENCE_TEMPERATURE_C } from '../../circuits/temperature.js';
import { InputError } from '../../errors.js';
import type { DistributionSpec, Part } from '../../tolerance/part.js';
import { partFromBound, partFromTolerance } from '../../tolerance/part.js';
import type { AllowanceSpec } from '../../tolerance/life-allowances.js';
import type { Model, ModelOutput } from '../model.js';
import { ambientGrid } from '../ambient-grid.js';
import { memberColumn, NetworkRegistry, type MemberSlot, type NetworkSpec } from './network-parts.js';

export type { NetworkSpec } from './network-parts.js';

/** One resistor: value, tolerance (fraction), TCR bound (1/K), drift allowance (fraction), distribution. */
export interface ResistorSpec {
  /** Designator shown in reports, e.g. 'R1'. */
  name: string;
  nominal: number;
  tolerance: number;
  tcrPerK?: number;
  drift?: number;
  /** Default uniform. */
  distribution?: DistributionSpec;
  /** Named drift allowances (load life, damp heat, soldering), each its own part `${name} ${allowance}`. */
  allowances?: AllowanceSpec[];
  /** The allowances are its grade's defaults (src/tolerance/life-allowances.ts): a graded copy takes the new grade's. */
  allowancesFromGrade?: boolean;
}

/** A potentiometer used as a variable resistor in a leg: `wiper` (0..1) of its track is in circuit. */
export interface PotentiometerSpec extends ResistorSpec {
  wiper: number;
}

/** One divider leg: one resistor, or two in series or in parallel, plus an optional potentiometer in series. */
export interface LegSpec {
  resistors: [ResistorSpec] | [ResistorSpec, ResistorSpec];
  /** How two resistors combine; required when there are two. */
  arrangement?: 'series' | 'parallel';
  potentiometer?: PotentiometerSpec;
}

/** A quantity known as nominal ± bound (offsets, bias currents). */
export interface BoundSpec {
  nominal: number;
  plusMinus: number;
  /** Default uniform; for a datasheet maximum given as kσ use { kind: 'normal', k }. */
  distribution?: DistributionSpec;
}

export interface ReferenceSpec {
  /** Default 'Vref'. */
  name?: string;
  nominal: number;
  /** Initial accuracy, fraction. */
  tolerance: number;
  /** Temperature coefficient bound, 1/K (e.g. 50e-6 for 50 ppm/K). */
  tempcoPerK?: number;
  /** Long-term drift allowance, fraction. */
  drift?: number;
  distribution?: DistributionSpec;
}

export interface TemperatureSpec {
  /** Operating ambient range, °C; worst case takes both ends. */
  minC: number;
  maxC: number;
  /**
   * The ambient drawn with each Monte Carlo trial (the random-ambient figures and the distribution statistics):
   * uniform over the range, or held at one temperature. The per-unit check covers the whole range either way.
   */
  monteCarlo: 'uniform' | { fixedC: number };
  /** Ambients per unit for the per-unit check, evenly spaced over minC..maxC, ends included (default ambient-grid.ts). */
  unitPoints?: number;
}

export interface ShuntSpec extends ResistorSpec {
  /** Power rating, W: shuntLoss gets the spec window [0, rating] when no lossLimitW is given. */
  powerRatingW?: number;
  /**
   * Largest loss the design allows at the limit, W: shuntLoss gets the spec window [0, lossLimitW] (a design sets it
   * to the lower of the derated rating and its loss budget).
   */
  lossLimitW?: number;
  /** Where lossLimitW came from, for the notes, e.g. '50 % of the 500 mW rating'. */
  lossLimitFrom?: string;
  /** Thermal resistance to ambient θ, K/W: enables self-heating θ·I²R at the limit. */
  thermalResistanceKPerW?: number;
  /**
   * Parasitic series resistance of pads and traces that the sense connections see (common practice concern; Kelvin
   * sensing removes most of it): it adds to the shunt in the sensed resistance and in the loss at the limit, with
   * its own tolerance and TCR (copper's, typically). With self-heating its loss is counted as heating the shunt
   * body too (conservative); only the shunt's own value takes the shunt's TCR through that heat.
   */
  parasitic?: ResistorSpec;
}

export interface AmplifierSpec {
  /** Input offset voltage maximum, V (about 0 V). */
  offsetMax: number;
  /** Default uniform over ±offsetMax. */
  offsetDistribution?: DistributionSpec;
  /** Offset drift bound, V/K. */
  offsetDriftPerK?: number;
  /** Input bias current, A: the mean of the two inputs' currents. */
  biasCurrent?: BoundSpec;
  /** Input offset current Ios = Ib+ − Ib−, maximum magnitude, A (uniform over ±; default 0). */
  offsetCurrentMax?: number;
  /**
   * The amplifier's own common-mode rejection, dB (datasheet minimum): diff only, where its inputs sit at the
   * common-mode voltage; its input offset moves by ±V+/CMRR, the sign unknown for a unit (uniform).
   */
  cmrrDb?: number;
  /** Supply rail, V: ampOutput gets the spec window [0, railV − headroomV], the swing the output can reach. */
  railV?: number;
  /** How far below the rail the output can swing, V (default 0). */
  headroomV?: number;
}

export type ThresholdSpec =
  | { kind: 'fixed'; nominal: number; tolerance: number; tempcoPerK?: number; distribution?: DistributionSpec; allowances?: AllowanceSpec[] }
  /** Threshold = source·bottom/(top + bottom); the source is the regulator's own reference or a separate one. */
  | { kind: 'divided'; source: 'regulator-reference' | ReferenceSpec; top: ResistorSpec; bottom: ResistorSpec };

interface SenseCommon {
  shunt: ShuntSpec;
  threshold: ThresholdSpec;
  /** Offset of the stage that compares with the threshold, referred to its input. */
  compareOffset?: BoundSpec;
  /** The current limit the design aims at, A (for reports; the model computes the actual limit). */
  limitTarget: number;
}

export type SenseSpec =
  | (SenseCommon & { topology: 'direct' })
  | (SenseCommon & { topology: 'noninv'; rf: ResistorSpec; rg: ResistorSpec; amplifier: AmplifierSpec })
  | (SenseCommon & {
      topology: 'diff';
      r1: ResistorSpec;
      r2: ResistorSpec;
      r3: ResistorSpec;
      r4: ResistorSpec;
      /** Voltage of the shunt's load-side node: 0 V low-side, the rail high-side. */
      commonModeV: number;
      /**
       * When the common-mode voltage spreads from unit to unit (an LED string's forward voltage): its band about
       * commonModeV, drawn once per unit (uniform unless given) as the part 'Vcm'; worst case takes its ends.
       */
      commonModeBand?: { plusMinus: number; distribution?: DistributionSpec };
      amplifier: AmplifierSpec;
    });

export interface SupplySpec {
  /** The regulator's feedback reference; needed with a divider (and by a threshold divided from it). */
  reference?: ReferenceSpec;
  /** The output divider; absent for a current-only design (no voltage loop: no vout, no dividerCurrent). */
  divider?: { top: LegSpec; bottom: LegSpec; feedbackBias?: BoundSpec };
  temperature: TemperatureSpec;
  sense?: SenseSpec;
  /**
   * Acceptance windows [lo, hi]: output voltage (V) and current limit (A). `voutSides` says which vout limits the
   * design gave (an adjustable output's ends give one each; the other end is its worst case, to count units).
   */
  windows?: { vout?: [number, number]; ilimit?: [number, number]; voutSides?: 'both' | 'low' | 'high' };
  /** The output voltage the design aims at, V (for reports). */
  voutTarget?: number;
  /** Resistor networks: their members take the network's shared and own draws (network-parts.ts), not their own tolerance and TCR. */
  networks?: NetworkSpec[];
}

// ---------------------------------------------------------------------------------------------------------------
// Wiring parts to parameter indices.

const NONE = -1;

/** Indices (into the parts list) of what makes up one resistor's value at temperature. */
interface ResistorSlot {
  value: number;
  tcr: number;
  drift: number;
  /** A network member: its value comes from the network's draws (value and tcr are NONE). */
  member?: MemberSlot;
  /** Named drift allowances' parts (empty without any). */
  life: number[];
}

interface LegSlots {
  a: ResistorSlot;
  b: ResistorSlot | null;
  parallel: boolean;
  pot: ResistorSlot | null;
  wiper: number;
}

class PartList {
  readonly parts: Part[] = [];
  networks: NetworkRegistry | null = null;
  add(part: Part): number {
    if (this.parts.some((p) => p.name === part.name)) {
      throw new InputError(`part ${part.name}`, 'two parts share this name', 'a unique designator for each part');
    }
    this.parts.push(part);
    return this.parts.length - 1;
  }
}

function checkFinite(value: number | undefined, where: string, accepted: string, positive = false): void {
  if (value === undefined) return;
  if (!Number.isFinite(value) || (positive ? value <= 0 : value < 0)) {
    throw new InputError(where, `${value} is not allowed`, accepted);
  }
}

function addResistor(list: PartList, r: ResistorSpec, where: string, kind: 'resistor' | 'shunt' | 'potentiometer' = 'resistor'): ResistorSlot {
  checkFinite(r.nominal, `${where}.nominal`, 'a resistance above 0 Ω', true);
  checkFinite(r.tolerance, `${where}.tolerance`, 'a tolerance fraction ≥ 0 (0.01 for 1 %)');
  if (r.tolerance >= 1) throw new InputError(`${where}.tolerance`, `${r.tolerance} would let the resistance reach 0 Ω`, 'a tolerance fraction below 1 (0.01 for 1 %)');
  checkFinite(r.tcrPerK, `${where}.tcrPerK`, 'a TCR bound ≥ 0 per kelvin (1e-4 for 100 ppm/K)');
  checkFinite(r.drift, `${where}.drift`, 'a drift fraction ≥ 0');
  if (list.networks?.has(r.name)) {
    if (kind !== 'resistor') throw new InputError(where, `${r.name} is a ${kind} and cannot be a network member`, 'fixed resistors of the divider, gain stage or threshold divider');
    const member = list.networks.member(r.name, r.nominal, where);
    const drift = r.drift ? list.add(partFromBound({ name: `${r.name} drift`, kind: 'drift', nominal: 0, plusMinus: r.drift })) : NONE;
    return { value: NONE, tcr: NONE, drift, member, life: addAllowances(list, r.name, r.allowances, `${where}.allowances`) };
  }
  const input = { name: r.name, kind, nominal: r.nominal, tolerance: r.tolerance } as Parameters<typeof partFromTolerance>[0];
  if (r.distribution) input.distribution = r.distribution;
  if (r.tcrPerK !== undefined) input.tcrPerK = r.tcrPerK;
  const value = list.add(partFromTolerance(input));
  const tcr = r.tcrPerK ? list.add(partFromBound({ name: `${r.name} TCR`, kind: 'temperature coefficient', nominal: 0, plusMinus: r.tcrPerK })) : NONE;
  const drift = r.drift ? list.add(partFromBound({ name: `${r.name} drift`, kind: 'drift', nominal: 0, plusMinus: r.drift })) : NONE;
  return { value, tcr, drift, life: addAllowances(list, r.name, r.allowances, `${where}.allowances`) };
}

/** Each named drift allowance with a band as its own part, `${name} ${allowance}`; their indices. */
function addAllowances(list: PartList, name: string, allowances: AllowanceSpec[] | undefined, where: string): number[] {
  const out: number[] = [];
  (allowances ?? []).forEach((a, i) => {
    checkFinite(a.band, `${where}[${i}].band`, 'a drift band fraction ≥ 0 (0.001 for ±0.1 %)');
    if (a.band >= 1) throw new InputError(`${where}[${i}].band`, `${a.band} would let the value reach 0`, 'a drift band fraction below 1');
    if (a.band === 0) return;
    const input: Parameters<typeof partFromBound>[0] = { name: `${name} ${a.name}`, kind: 'drift', nominal: 0, plusMinus: a.band };
    if (a.distribution) input.distribution = a.distribution;
    out.push(list.add(partFromBound(input)));
  });
  return out;
}

function addLeg(list: PartList, leg: LegSpec, where: string): LegSlots {
  if (!Array.isArray(leg.resistors) || leg.resistors.length < 1 || leg.resistors.length > 2) {
    throw new InputError(`${where}.resistors`, 'a leg needs one or two resistors', 'one resistor, or two with arrangement series|parallel');
  }
  if (leg.resistors.length === 2 && leg.arrangement !== 'series' && leg.arrangement !== 'parallel') {
    throw new InputError(`${where}.arrangement`, `"${String(leg.arrangement)}" for two resistors`, 'series or parallel');
  }
  const a = addResistor(list, leg.resistors[0], `${where}.resistors[0]`);
  const b = leg.resistors.length === 2 ? addResistor(list, leg.resistors[1], `${where}.resistors[1]`) : null;
  let pot: ResistorSlot | null = null;
  let wiper = 0;
  if (leg.potentiometer) {
    const w = leg.potentiometer.wiper;
    if (!Number.isFinite(w) || w < 0 || w > 1) {
      throw new InputError(`${where}.potentiometer.wiper`, `${w} is outside the track`, 'a fraction from 0 to 1 of the track in circuit');
    }
    pot = addResistor(list, leg.potentiometer, `${where}.potentiometer`, 'potentiometer');
    wiper = w;
  }
  return { a, b, parallel: leg.arrangement === 'parallel', pot, wiper };
}

function addBound(list: PartList, name: string, kind: Part['kind'], bound: BoundSpec | undefined, where: string): number {
  if (!bound) return NONE;
  checkFinite(bound.plusMinus, `${where}.plusMinus`, 'a bound ≥ 0');
  if (!Number.isFinite(bound.nominal)) throw new InputError(`${where}.nominal`, `${bound.nominal} is not a number`, 'a finite value');
  const input: Parameters<typeof partFromBound>[0] = { name, kind, nominal: bound.nominal, plusMinus: bound.plusMinus };
  if (bound.distribution) input.distribution = bound.distribution;
  return list.add(partFromBound(input));
}

interface ReferenceSlot {
  value: number;
  tempco: number;
  drift: number;
}

function addReference(list: PartList, ref: ReferenceSpec, defaultName: string, where: string): ReferenceSlot {
  checkFinite(ref.nominal, `${where}.nominal`, 'a reference voltage above 0 V', true);
  checkFinite(ref.tolerance, `${where}.tolerance`, 'a tolerance fraction ≥ 0');
  checkFinite(ref.tempcoPerK, `${where}.tempcoPerK`, 'a temperature coefficient bound ≥ 0 per kelvin');
  checkFinite(ref.drift, `${where}.drift`, 'a drift fraction ≥ 0');
  const name = ref.name ?? defaultName;
  const input: Parameters<typeof partFromTolerance>[0] = { name, kind: 'reference', nominal: ref.nominal, tolerance: ref.tolerance };
  if (ref.distribution) input.distribution = ref.distribution;
  const value = list.add(partFromTolerance(input));
  const tempco = ref.tempcoPerK ? list.add(partFromBound({ name: `${name} tempco`, kind: 'temperature coefficient', nominal: 0, plusMinus: ref.tempcoPerK })) : NONE;
  const drift = ref.drift ? list.add(partFromBound({ name: `${name} drift`, kind: 'drift', nominal: 0, plusMinus: ref.drift })) : NONE;
  return { value, tempco, drift };
}

// ---------------------------------------------------------------------------------------------------------------
// Block evaluation, one column at a time. Each derived quantity (a resistor at its temperature, a leg, the
// reference, the threshold) is computed for the whole block of trials in its own plain loop, into a scratch column
// reused block after block; the outputs then read one column per value. Per trial j, with ΔT = T(j) − 25 °C:
//   resistor   R(j)·(1 + drift(j))·(1 + α(j)·ΔT)           (factors only where the part has them)
//   leg        a ∥ b or a + b, then + wiper·pot
//   reference  V(j)·(1 + drift(j))·(1 + tc(j)·ΔT)
// The operations and their order are those of the per-trial formulas, so the values are the same to the bit as a
// trial-by-trial evaluation (test/engine-fast-paths.test.ts checks it against a plain per-trial reference).

/** ΔT = T − 25 °C per trial. */
function temperatureRise(t: Float64Array, n: number, out: Float64Array): Float64Array {
  for (let j = 0; j < n; j++) out[j] = t[j]! - REFERENCE_TEMPERATURE_C;
  return out;
}

/** Output voltage and divider current (Vref/Rbottom) per trial. */
function dividerBlock(v: Float64Array, rTop: Float64Array, rBottom: Float64Array, bias: Float64Array | null, n: number, voutOut: Float64Array, dividerOut: Float64Array): void {
  for (let j = 0; j < n; j++) {
    voutOut[j] = dividerVout(v[j]!, rTop[j]!, rBottom[j]!, bias === null ? 0 : bias[j]!);
    dividerOut[j] = v[j]! / rBottom[j]!;
  }
}

/** Scratch columns for one model, grown to the block length and reused (no allocation per block once warm). */
class ScratchColumns {
  private readonly columns: Float64Array[] = [];
  private used = 0;
  private n = 0;
  /** Starts a block of n trials: every column taken before is free again. */
  begin(n: number): void {
    this.used = 0;
    this.n = n;
  }
  take(): Float64Array {
    let c = this.columns[this.used];
    if (c === undefined || c.length < this.n) {
      c = new Float64Array(this.n);
      this.columns[this.used] = c;
    }
    this.used++;
    return c;
  }
}

function column(p: Float64Array[], index: number): Float64Array | null {
  return index === NONE ? null : p[index]!;
}

/** value·(1 + drift)·(1 + coefficient·ΔT) per trial; the part's own column when neither factor exists. */
function scaledColumn(p: Float64Array[], value: number, drift: number, coefficient: number, dT: Float64Array, n: number, scratch: ScratchColumns): Float64Array {
  return scaledBy(p[value]!, column(p, drift), column(p, coefficient), dT, n, scratch);
}

/** The same with the drift and coefficient columns given (the drift column may combine several allowances). */
function scaledBy(v: Float64Array, d: Float64Array | null, c: Float64Array | null, dT: Float64Array, n: number, scratch: ScratchColumns): Float64Array {
  if (d === null && c === null) return v;
  const out = scratch.take();
  if (d !== null && c !== null) for (let j = 0; j < n; j++) out[j] = v[j]! * (1 + d[j]!) * (1 + c[j]! * dT[j]!);
  else if (d !== null) for (let j = 0; j < n; j++) out[j] = v[j]! * (1 + d[j]!);
  else for (let j = 0; j < n; j++) out[j] = v[j]! * (1 + c![j]! * dT[j]!);
  return out;
}

function resistorColumn(p: Float64Array[], s: ResistorSlot, dT: Float64Array, n: number, scratch: ScratchColumns): Float64Array {
  if (s.member !== undefined) return memberColumn(p, s.member, memberDrift(p, s, n, scratch), dT, n, scratch.take());
  if (s.life.length === 0) return scaledColumn(p, s.value, s.drift, s.tcr, dT, n, scratch);
  return scaledBy(atReference(p, s, dT, n, scratch), null, column(p, s.tcr), dT, n, scratch);
}

/**
 * The resistor at 25 °C: R·(1 + drift)·Π(1 + allowance), multiplied left to right (the per-trial order), or the
 * value with its drift alone without allowances.
 */
function atReference(p: Float64Array[], s: ResistorSlot, dT: Float64Array, n: number, scratch: ScratchColumns): Float64Array {
  if (s.life.length === 0) return scaledColumn(p, s.value, s.drift, NONE, dT, n, scratch);
  const out = scratch.take();
  const v = p[s.value]!;
  const d = column(p, s.drift);
  if (d === null) out.set(v.subarray(0, n));
  else for (let j = 0; j < n; j++) out[j] = v[j]! * (1 + d[j]!);
  for (const index of s.life) multiplyOnePlus(out, p[index]!, n);
  return out;
}

/** A network member's relative drift per trial, (1 + drift)·Π(1 + allowance) − 1, or null without any drift. */
function memberDrift(p: Float64Array[], s: ResistorSlot, n: number, scratch: ScratchColumns): Float64Array | null {
  const d = column(p, s.drift);
  if (s.life.length === 0) return d;
  const out = scratch.take();
  if (d === null) out.fill(1, 0, n);
  else for (let j = 0; j < n; j++) out[j] = 1 + d[j]!;
  for (const index of s.life) multiplyOnePlus(out, p[index]!, n);
  for (let j = 0; j < n; j++) out[j] = out[j]! - 1;
  return out;
}

/** out[j] ·= 1 + a[j] (its own function: a plain loop). */
function multiplyOnePlus(out: Float64Array, a: Float64Array, n: number): void {
  for (let j = 0; j < n; j++) out[j] = out[j]! * (1 + a[j]!);
}

function referenceColumn(p: Float64Array[], s: ReferenceSlot, dT: Float64Array, n: number, scratch: ScratchColumns): Float64Array {
  return scaledColumn(p, s.value, s.drift, s.tempco, dT, n, scratch);
}

function legColumn(p: Float64Array[], leg: LegSlots, dT: Float64Array, n: number, scratch: ScratchColumns): Float64Array {
  const a = resistorColumn(p, leg.a, dT, n, scratch);
  if (leg.b === null && leg.pot === null) return a;
  const out = scratch.take();
  if (leg.b === null) out.set(a.subarray(0, n));
  else {
    const b = resistorColumn(p, leg.b, dT, n, scratch);
    if (leg.parallel) for (let j = 0; j < n; j++) out[j] = parallelResistance(a[j]!, b[j]!);
    else for (let j = 0; j < n; j++) out[j] = seriesResistance(a[j]!, b[j]!);
  }
  if (leg.pot !== null) {
    const pot = resistorColumn(p, leg.pot, dT, n, scratch);
    const wiper = leg.wiper;
    for (let j = 0; j < n; j++) out[j] += wiper * pot[j]!;
  }
  return out;
}

/**
 * One parameter object shape for every topology (the union of the circuits' own parameter types), so the limit
 * functions see a single (monomorphic) shape.
 */
type SenseParams = NoninvSense & DiffSense & DirectSense;

/**
 * Shunt self-heating, solved in closed form. The shunt sits at T_amb + θ·P, so with its linear TCR
 * R_hot = R25·(1 + α·(T_amb + θ·P − 25 °C)) = R_amb + R25·α·θ·P, where R_amb = R25·(1 + α·(T_amb − 25 °C)) and R25 is
 * the unit's value at 25 °C (drift included). Every topology's limit is inversely proportional to the shunt
 * (I = K/Rs, see src/circuits/sense/*), so the loss at the limit is P = K²/R_hot and
 * R_hot² − R_amb·R_hot − R25·α·θ·K² = 0, whose positive root is R_hot = (R_amb + √(R_amb² + 4·R25·α·θ·K²))/2:
 * exact for the linear TCR, no first-order step.
 */
export function hotShunt(rAmbient: number, r25: number, alpha: number, theta: number, k: number): number {
  return (rAmbient + Math.sqrt(rAmbient * rAmbient + 4 * r25 * alpha * theta * k * k)) / 2;
}

const DIRECT = 0;
const NONINV = 1;
const DIFF = 2;

/** The block's columns the sense loop reads (unused gain columns point at any column of the block). */
interface SenseColumns {
  threshold: Float64Array;
  compare: Float64Array | null;
  offset: Float64Array | null;
  bias: Float64Array | null;
  /** The amplifier's offset current Ios, or null. */
  ios: Float64Array | null;
  /** The common-mode voltage per unit when it spreads, else null (the scalar commonMode holds). */
  commonMode: Float64Array | null;
  /** The amplifier's common-mode error e (±1/CMRR), or null. */
  cmrr: Float64Array | null;
  g0: Float64Array;
  g1: Float64Array;
  g2: Float64Array;
  g3: Float64Array;
  /** The shunt at ambient temperature. */
  shunt: Float64Array;
  /** The shunt at 25 °C (drift included), read only when it heats itself. */
  shunt25: Float64Array;
  /** The shunt's drawn TCR when it heats itself (θ > 0 and a TCR), else null. */
  alpha: Float64Array | null;
}

/** a + b per trial (the shunt and its parasitic series resistance). */
function sumColumn(a: Float64Array, b: Float64Array, n: number, out: Float64Array): Float64Array {
  for (let j = 0; j < n; j++) out[j] = a[j]! + b[j]!;
  return out;
}

/** Threshold divided from a source: source·Rb/(Rt + Rb) per trial. */
function dividedColumn(source: Float64Array, rt: Float64Array, rb: Float64Array, n: number, out: Float64Array): Float64Array {
  for (let j = 0; j < n; j++) out[j] = (source[j]! * rb[j]!) / (rt[j]! + rb[j]!);
  return out;
}

/** Amplifier offset at temperature, Vos + (dVos/dT)·ΔT (+ 0 without a drift, as the per-trial form adds). */
function offsetColumn(vos: Float64Array, drift: Float64Array | null, dT: Float64Array, n: number, out: Float64Array): Float64Array {
  if (drift !== null) for (let j = 0; j < n; j++) out[j] = vos[j]! + drift[j]! * dT[j]!;
  else for (let j = 0; j < n; j++) out[j] = vos[j]! + 0;
  return out;
}

function limitOf(kind: number, q: SenseParams): number {
  return kind === NONINV ? noninvLimit(q) : kind === DIFF ? diffLimit(q) : directLimit(q);
}

function signalOf(kind: number, q: SenseParams, current: number): number {
  return kind === NONINV ? noninvOutput(q, current) : kind === DIFF ? diffOutput(q, current) : directSignal(q, current);
}

/**
 * The sense path for trials 0..n−1: the limit current (found again with the shunt at its self-heated temperature
 * when it heats itself), the shunt loss at the limit and the amplifier output there. Its own small function, so
 * V8 optimises it whole and inlines the circuit functions (each topology's call is direct); the parameter object is
 * made fresh for each trial so that, once inlined, it lives in registers (escape analysis) rather than memory.
 */
function senseBlock(kind: number, commonMode: number, c: SenseColumns, theta: number, n: number, limitOut: Float64Array, lossOut: Float64Array, ampOut: Float64Array): void {
  const { threshold, compare, offset, bias, ios, cmrr, g0, g1, g2, g3, shunt, shunt25, alpha } = c;
  const cmColumn = c.commonMode;
  const noninv = kind === NONINV;
  const diff = kind === DIFF;
  for (let j = 0; j < n; j++) {
    const rAmbient = shunt[j]!;
    const q: SenseParams = {
      shunt: rAmbient,
      feedback: noninv ? g0[j]! : 0,
      ground: noninv ? g1[j]! : 0,
      r1: diff ? g0[j]! : 0,
      r2: diff ? g1[j]! : 0,
      r3: diff ? g2[j]! : 0,
      r4: diff ? g3[j]! : 0,
      commonMode: cmColumn === null ? commonMode : cmColumn[j]!,
      threshold: threshold[j]!,
      amplifierOffset: offset === null ? 0 : offset[j]!,
      biasCurrent: offset === null || bias === null ? 0 : bias[j]!,
      offsetCurrent: ios === null ? 0 : ios[j]!,
      cmrrError: cmrr === null ? 0 : cmrr[j]!,
      compareOffset: compare === null ? 0 : compare[j]!,
    };
    let current = limitOf(kind, q);
    if (alpha !== null) {
      q.shunt = hotShunt(rAmbient, shunt25[j]!, alpha[j]!, theta, current * rAmbient);
      current = limitOf(kind, q);
    }
    limitOut[j] = current;
    lossOut[j] = current * current * q.shunt;
    ampOut[j] = signalOf(kind, q, current);
  }
}

/** What the sense path computes, a block of trials at a time. */
interface SenseEvaluator {
  /**
   * Fills, for trials 0..n−1, the limit current, the shunt loss at the limit (I²·R of the shunt at its own
   * temperature) and the amplifier output at the limit (the shunt voltage, `direct`). `vref` is the regulator's
   * reference column of this block (a threshold divided from it reuses it).
   */
  evaluate(p: Float64Array[], dT: Float64Array, vref: Float64Array, n: number, scratch: ScratchColumns, limitOut: Float64Array, lossOut: Float64Array, ampOut: Float64Array): void;
  ilimitSpec?: [number, number];
  shuntLossSpec?: [number, number];
  ampOutputSpec?: [number, number];
}

export const OUTPUT_NAMES = ['vout', 'dividerCurrent', 'ilimit', 'shuntLoss', 'ampOutput'] as const;
const OUTPUT_UNITS = { vout: 'V', dividerCurrent: 'A', ilimit: 'A', shuntLoss: 'W', ampOutput: 'V' } as const;

// ---------------------------------------------------------------------------------------------------------------

/** Builds the supply's Model. Throws InputError (with the field path under `supply`) for values it cannot use. */
export function buildSupplyModel(spec: SupplySpec): Model {
  const list = new PartList();
  const notes: string[] = [];
  if (spec.networks && spec.networks.length > 0) list.networks = new NetworkRegistry(spec.networks, (part) => list.add(part));

  const t = spec.temperature;
  if (!t || !Number.isFinite(t.minC) || !Number.isFinite(t.maxC) || t.minC > t.maxC) {
    throw new InputError('supply.temperature', 'the temperature range is missing or reversed', 'minC ≤ maxC in °C');
  }
  const tNominal = Math.min(Math.max(REFERENCE_TEMPERATURE_C, t.minC), t.maxC);
  let tDistribution: DistributionSpec = { kind: 'uniform' };
  if (t.minC === t.maxC) {
    // One ambient (a design's temperature.fixed, or no range: 25 °C): every analysis holds it there.
    tDistribution = { kind: 'fixed', value: t.minC };
    notes.push(`The ambient is held at ${t.minC} °C for every analysis; TCRs and tempcos act through the ${t.minC - REFERENCE_TEMPERATURE_C} K from ${REFERENCE_TEMPERATURE_C} °C.`);
  } else if (t.monteCarlo === 'uniform') {
    notes.push(`Monte Carlo draws the ambient temperature uniformly over ${t.minC}..${t.maxC} °C; worst case takes both ends.`);
  } else {
    const fixed = t.monteCarlo?.fixedC;
    if (!Number.isFinite(fixed) || fixed < t.minC || fixed > t.maxC) {
      throw new InputError('supply.temperature.monteCarlo.fixedC', `${fixed} °C is outside the range`, `a temperature within ${t.minC}..${t.maxC} °C`);
    }
    tDistribution = { kind: 'fixed', value: fixed };
    notes.push(`Monte Carlo holds the ambient at ${fixed} °C; worst case takes both ends of ${t.minC}..${t.maxC} °C.`);
  }
  const temperature = list.add({
    name: 'T ambient',
    kind: 'temperature',
    nominal: tNominal,
    minus: tNominal - t.minC,
    plus: t.maxC - tNominal,
    distribution: tDistribution,
    unit: '°C',
  });

  if (!spec.divider && !spec.sense) {
    throw new InputError('supply', 'neither a divider nor a sense path', 'a divider (voltage loop), a sense path (current loop) or both');
  }
  if (spec.divider && !spec.reference) throw new InputError('supply.reference', 'a divider needs the reference it sets the output from', 'a reference { nominal, tolerance }');
  const vref = spec.reference ? addReference(list, spec.reference, 'Vref', 'supply.reference') : null;
  const divider = spec.divider ? dividerSlots(list, spec.divider) : null;
  notes.push('Resistor TCRs, reference tempco and offset drift are unknown within their bounds for a given unit: drawn uniformly (common practice).');

  const sense = spec.sense ? addSense(spec.sense, spec, list, vref, notes) : null;
  if (list.networks) {
    list.networks.finish();
    notes.push(...list.networks.notes());
  }
  // Outputs in OUTPUT_NAMES order, each loop's only when the design has that loop (single-loop designs).
  const names = OUTPUT_NAMES.filter((name) => (name === 'vout' || name === 'dividerCurrent' ? divider !== null : sense !== null));
  const count = names.length;
  const senseAt = divider ? 2 : 0;

  const scratch = new ScratchColumns();
  /** Every output for trials 0..n−1: outs in `names` order (the voltage loop's two, then the current loop's three). */
  function evaluateAll(p: Float64Array[], outs: Float64Array[], n: number): void {
    scratch.begin(n);
    const tp = p[temperature]!;
    const dT = temperatureRise(tp, n, scratch.take());
    const v = vref ? referenceColumn(p, vref, dT, n, scratch) : dT;
    if (divider) {
      const rTop = legColumn(p, divider.top, dT, n, scratch);
      const rBottom = legColumn(p, divider.bottom, dT, n, scratch);
      dividerBlock(v, rTop, rBottom, column(p, divider.ifb), n, outs[0]!, outs[1]!);
    }
    if (sense) sense.evaluate(p, dT, v, n, scratch, outs[senseAt]!, outs[senseAt + 1]!, outs[senseAt + 2]!);
  }

  const outputs: ModelOutput[] = names.map((name, o) => {
    const output: ModelOutput = {
      name,
      unit: OUTPUT_UNITS[name],
      evaluate(p, out, n) {
        const outs = Array.from({ length: count }, (_, i) => (i === o ? out : new Float64Array(n)));
        evaluateAll(p, outs, n);
      },
    };
    const window =
      name === 'vout' ? spec.windows?.vout : name === 'ilimit' ? sense?.ilimitSpec : name === 'shuntLoss' ? sense?.shuntLossSpec : name === 'ampOutput' ? sense?.ampOutputSpec : undefined;
    if (window) output.spec = [window[0], window[1]];
    if (name === 'vout' && spec.windows?.voutSides && spec.windows.voutSides !== 'both') output.specSides = spec.windows.voutSides;
    return output;
  });
  if (t.unitPoints !== undefined && (!Number.isInteger(t.unitPoints) || t.unitPoints < 2 || t.unitPoints > 101)) {
    throw new InputError('supply.temperature.unitPoints', `${t.unitPoints} is not a usable count`, 'a whole number of ambients from 2 to 101');
  }
  return { parts: list.parts, outputs, notes, evaluateAll, ambient: { part: temperature, gridC: ambientGrid(t.minC, t.maxC, t.unitPoints) } };
}

/** The divider's legs and feedback bias as parts. */
function dividerSlots(list: PartList, divider: NonNullable<SupplySpec['divider']>): { top: LegSlots; bottom: LegSlots; ifb: number } {
  const top = addLeg(list, divider.top, 'supply.divider.top');
  const bottom = addLeg(list, divider.bottom, 'supply.divider.bottom');
  const ifb = addBound(list, 'Ifb', 'bias current', divider.feedbackBias, 'supply.divider.feedbackBias');
  return { top, bottom, ifb };
}

/** A limit for a note, in SI units to four significant digits (notation belongs to src/units, which the engine does not import). */
function plain(value: number, unit: string): string {
  return `${Number(value.toPrecision(4))} ${unit}`;
}

function addSense(sense: SenseSpec, spec: SupplySpec, list: PartList, regulatorReference: ReferenceSlot | null, notes: string[]): SenseEvaluator {
  const where = 'supply.sense';
  checkFinite(sense.limitTarget, `${where}.limitTarget`, 'a current above 0 A', true);
  const shunt = addResistor(list, sense.shunt, `${where}.shunt`, 'shunt');
  const parasitic = sense.shunt.parasitic ? addResistor(list, sense.shunt.parasitic, `${where}.shunt.parasitic`) : null;
  if (parasitic) notes.push('The shunt\'s parasitic series resistance (pads, traces) adds to the sensed resistance and to shuntLoss; Kelvin sensing removes most of it (common practice).');
  const theta = sense.shunt.thermalResistanceKPerW ?? 0;
  checkFinite(theta, `${where}.shunt.thermalResistanceKPerW`, 'a thermal resistance ≥ 0 K/W');
  const alphaMax = sense.shunt.tcrPerK ?? 0;
  if (theta > 0) notes.push(`Shunt self-heating θ·I²R at the limit with θ = ${theta} K/W.`);

  // Threshold.
  const th = sense.threshold;
  let thFixed = NONE;
  let thTempco = NONE;
  let thLife: ResistorSlot | null = null;
  let thSource: ReferenceSlot | null = null;
  let thTop: ResistorSlot | null = null;
  let thBottom: ResistorSlot | null = null;
  if (th.kind === 'fixed') {
    checkFinite(th.nominal, `${where}.threshold.nominal`, 'a threshold above 0 V', true);
    checkFinite(th.tolerance, `${where}.threshold.tolerance`, 'a tolerance fraction ≥ 0');
    const input: Parameters<typeof partFromTolerance>[0] = { name: 'Vth', kind: 'threshold', nominal: th.nominal, tolerance: th.tolerance };
    if (th.distribution) input.distribution = th.distribution;
    thFixed = list.add(partFromTolerance(input));
    if (th.tempcoPerK) thTempco = list.add(partFromBound({ name: 'Vth tempco', kind: 'temperature coefficient', nominal: 0, plusMinus: th.tempcoPerK }));
    const life = addAllowances(list, 'Vth', th.allowances, `${where}.threshold.allowances`);
    if (life.length > 0) thLife = { value: thFixed, tcr: thTempco, drift: NONE, life };
  } else if (th.kind === 'divided') {
    if (th.source === 'regulator-reference' && regulatorReference === null) {
      throw new InputError(`${where}.threshold.source`, 'the threshold is divided from the regulator reference, but the supply has none', 'a reference of its own { nominal, tolerance }, or a supply reference');
    }
    thSource = th.source === 'regulator-reference' ? regulatorReference : addReference(list, th.source, 'Vref threshold', `${where}.threshold.source`);
    thTop = addResistor(list, th.top, `${where}.threshold.top`);
    thBottom = addResistor(list, th.bottom, `${where}.threshold.bottom`);
  } else {
    throw new InputError(`${where}.threshold.kind`, `"${String((th as { kind: unknown }).kind)}"`, 'fixed or divided');
  }

  const compareOffset = addBound(list, 'Vos cmp', 'offset', sense.compareOffset, `${where}.compareOffset`);

  // Amplifier and gain resistors.
  let ampOffset = NONE;
  let ampDrift = NONE;
  let ampBias = NONE;
  let ampIos = NONE;
  let ampCmrr = NONE;
  let commonModeSlot = NONE;
  let railV: number | undefined;
  let headroomV: number | undefined;
  const gain: ResistorSlot[] = [];
  let commonMode = 0;
  if (sense.topology === 'noninv' || sense.topology === 'diff') {
    const amp = sense.amplifier;
    if (!amp) throw new InputError(`${where}.amplifier`, `the ${sense.topology} topology needs an amplifier`, 'offsetMax (V), optional offsetDriftPerK, biasCurrent, railV');
    checkFinite(amp.offsetMax, `${where}.amplifier.offsetMax`, 'an offset maximum ≥ 0 V');
    const offsetInput: Parameters<typeof partFromBound>[0] = { name: 'Vos amp', kind: 'offset', nominal: 0, plusMinus: amp.offsetMax };
    if (amp.offsetDistribution) offsetInput.distribution = amp.offsetDistribution;
    ampOffset = list.add(partFromBound(offsetInput));
    if (amp.offsetDriftPerK) ampDrift = list.add(partFromBound({ name: 'Vos amp drift', kind: 'temperature coefficient', nominal: 0, plusMinus: amp.offsetDriftPerK, unit: 'V/K' }));
    ampBias = addBound(list, 'Ib amp', 'bias current', amp.biasCurrent, `${where}.amplifier.biasCurrent`);
    checkFinite(amp.offsetCurrentMax, `${where}.amplifier.offsetCurrentMax`, 'an offset current maximum ≥ 0 A');
    if (amp.offsetCurrentMax) ampIos = list.add(partFromBound({ name: 'Ios amp', kind: 'bias current', nominal: 0, plusMinus: amp.offsetCurrentMax, unit: 'A' }));
    if (amp.cmrrDb !== undefined) {
      if (!Number.isFinite(amp.cmrrDb) || amp.cmrrDb <= 0) throw new InputError(`${where}.amplifier.cmrrDb`, `${amp.cmrrDb} dB is not a rejection`, 'a CMRR above 0 dB (datasheet minimum, e.g. 80)');
      if (sense.topology !== 'diff') throw new InputError(`${where}.amplifier.cmrrDb`, `the ${sense.topology} stage sees no common-mode voltage`, 'cmrrDb with the diff topology only');
      // 20·log10 of the voltage ratio (IEC 60027-3:2002, from memory): |e| = 10^(−CMRR/20).
      ampCmrr = list.add(partFromBound({ name: 'CMRR amp', kind: 'offset', nominal: 0, plusMinus: 10 ** (-amp.cmrrDb / 20), unit: 'V/V' }));
    }
    railV = amp.railV;
    headroomV = amp.headroomV;
    if (sense.topology === 'noninv') {
      gain.push(addResistor(list, sense.rf, `${where}.rf`), addResistor(list, sense.rg, `${where}.rg`));
    } else {
      gain.push(
        addResistor(list, sense.r1, `${where}.r1`),
        addResistor(list, sense.r2, `${where}.r2`),
        addResistor(list, sense.r3, `${where}.r3`),
        addResistor(list, sense.r4, `${where}.r4`),
      );
      if (!Number.isFinite(sense.commonModeV)) throw new InputError(`${where}.commonModeV`, `${sense.commonModeV} is not a voltage`, 'the load-side node voltage in V (0 for low-side)');
      commonMode = sense.commonModeV;
      const band = sense.commonModeBand;
      if (band && band.plusMinus > 0) {
        checkFinite(band.plusMinus, `${where}.commonModeBand.plusMinus`, 'a half-width ≥ 0 V');
        const input: Parameters<typeof partFromBound>[0] = { name: 'Vcm', kind: 'operating point', nominal: commonMode, plusMinus: band.plusMinus, unit: 'V' };
        if (band.distribution) input.distribution = band.distribution;
        commonModeSlot = list.add(partFromBound(input));
      }
    }
  } else if (sense.topology !== 'direct') {
    throw new InputError(`${where}.topology`, `"${String((sense as { topology: unknown }).topology)}"`, 'direct, noninv or diff');
  }

  const topology = sense.topology;
  const selfHeating = theta > 0 && shunt.tcr !== NONE;
  if (theta > 0 && alphaMax === 0) notes.push('Shunt has a thermal resistance but no TCR: self-heating changes its loss, not its value.');

  const kind = topology === 'noninv' ? NONINV : topology === 'diff' ? DIFF : DIRECT;
  const evaluator: SenseEvaluator = {
    evaluate(p, dT, vref, n, scratch, limitOut, lossOut, ampOut) {
      // Threshold: fixed (with its tempco), or divided from a reference: source·Rb/(Rt + Rb).
      let threshold: Float64Array;
      if (thLife !== null) threshold = resistorColumn(p, thLife, dT, n, scratch);
      else if (thFixed !== NONE) threshold = scaledColumn(p, thFixed, NONE, thTempco, dT, n, scratch);
      else {
        const source = thSource === regulatorReference ? vref : referenceColumn(p, thSource!, dT, n, scratch);
        threshold = dividedColumn(source, resistorColumn(p, thTop!, dT, n, scratch), resistorColumn(p, thBottom!, dT, n, scratch), n, scratch.take());
      }
      const offset = ampOffset === NONE ? null : offsetColumn(p[ampOffset]!, column(p, ampDrift), dT, n, scratch.take());
      const g = gain.map((slot) => resistorColumn(p, slot, dT, n, scratch));
      const columns: SenseColumns = {
        threshold,
        compare: column(p, compareOffset),
        offset,
        bias: column(p, ampBias),
        ios: column(p, ampIos),
        commonMode: column(p, commonModeSlot),
        cmrr: column(p, ampCmrr),
        g0: g[0] ?? dT,
        g1: g[1] ?? dT,
        g2: g[2] ?? dT,
        g3: g[3] ?? dT,
        shunt: parasitic === null ? resistorColumn(p, shunt, dT, n, scratch) : sumColumn(resistorColumn(p, shunt, dT, n, scratch), resistorColumn(p, parasitic, dT, n, scratch), n, scratch.take()),
        shunt25: selfHeating ? atReference(p, shunt, dT, n, scratch) : dT,
        alpha: selfHeating ? p[shunt.tcr]! : null,
      };
      senseBlock(kind, commonMode, columns, theta, n, limitOut, lossOut, ampOut);
    },
  };
  if (spec.windows?.ilimit) evaluator.ilimitSpec = spec.windows.ilimit;
  // The windows are the design's own limits: the shunt's loss limit (else its full rating) and the output swing.
  checkFinite(sense.shunt.powerRatingW, `${where}.shunt.powerRatingW`, 'a power rating above 0 W', true);
  checkFinite(sense.shunt.lossLimitW, `${where}.shunt.lossLimitW`, 'a loss limit above 0 W', true);
  if (sense.shunt.lossLimitW !== undefined) {
    evaluator.shuntLossSpec = [0, sense.shunt.lossLimitW];
    notes.push(`shuntLoss is judged against 0..${plain(sense.shunt.lossLimitW, 'W')}${sense.shunt.lossLimitFrom ? ` (${sense.shunt.lossLimitFrom})` : ''}.`);
  } else if (sense.shunt.powerRatingW !== undefined) {
    evaluator.shuntLossSpec = [0, sense.shunt.powerRatingW];
    notes.push(`shuntLoss is judged against 0..${plain(sense.shunt.powerRatingW, 'W')}, the full power rating (no derated loss limit given).`);
  }
  if (railV !== undefined) {
    checkFinite(railV, `${where}.amplifier.railV`, 'a rail voltage above 0 V', true);
    checkFinite(headroomV, `${where}.amplifier.headroomV`, 'a headroom of 0 V or more, below the rail');
    const swing = railV - (headroomV ?? 0);
    if (!(swing > 0)) throw new InputError(`${where}.amplifier.headroomV`, `${headroomV} V leaves no output swing below the ${railV} V rail`, 'a headroom of 0 V or more, below the rail');
    evaluator.ampOutputSpec = [0, swing];
    notes.push(`ampOutput is judged against 0..${plain(swing, 'V')}, the swing the amplifier reaches (${plain(railV, 'V')} rail − ${plain(headroomV ?? 0, 'V')} headroom).`);
  }
  return evaluator;
}
