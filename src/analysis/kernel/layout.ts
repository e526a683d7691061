// The tables the WebAssembly kernel (src/analysis/kernel/assembly/chunk-kernel.ts) reads: one descriptor per part (how its uniforms
// become values: the parameters partFromUnit in src/tolerance/sample.ts computes, computed here the same way, so
// Φ and the other per-part constants are the reference's own bits) and the supply's wiring (which part column
// plays which role in src/analysis/models/supply.ts). Parts are found by the names buildSupplyModel gives them; a
// part of the model that no role takes, or a role whose part is missing, is a mismatch between this file and
// supply.ts and throws (kernelSupports should have declined the spec).
import type { Model } from '../model.js';
import type { ReferenceSpec, ResistorSpec, SupplySpec } from '../models/supply.js';
import { DEFAULT_K, normalCdf } from '../../tolerance/distributions/normal.js';
import { partHigh, partLow, type Part } from '../../tolerance/part.js';

/** Fields per part descriptor (f64), and their meaning by kind: see src/analysis/kernel/assembly/chunk-kernel.ts drawParts. */
export const DESCRIPTOR_FIELDS = 8;
/** i32 slots of the wiring table and f64 slots of the parameter table (src/analysis/kernel/assembly/chunk-kernel.ts L_* and P_*). */
export const LAYOUT_SLOTS = 63;
export const PARAMETER_SLOTS = 5;
export const P_FIXED_T = 4;
const P_WIPER_TOP = 0;
const P_WIPER_BOTTOM = 1;
const P_COMMON_MODE = 2;
const P_THETA = 3;

// Wiring table slots: the L_* constants of src/analysis/kernel/assembly/chunk-kernel.ts (a resistor or reference takes three slots:
// value, drift, tempco or TCR; an absent one holds the column of zeros).
const L_T = 0;
const L_REF = 1;
const L_TOP = 4;
const L_BOTTOM = 15;
const L_IFB = 26;
const L_SENSE = 27;
const L_TH_MODE = 28;
const L_TH_FIXED = 29;
const L_TH_SOURCE = 32;
const L_TH_TOP = 35;
const L_COMPARE = 41;
const L_AMP = 42;
const L_GAIN = 46;
const L_SHUNT = 58;
const L_SELF_HEATING = 61;
const L_ZERO = 62;
/** Offsets inside a leg's slots: resistor a, hasB, resistor b, parallel, potentiometer. */
const LEG_HAS_B = 3;
const LEG_POT = 8;

const CONSTANT = 0;
const AFFINE = 1;
const NORMAL = 2;
const TRUNCATED = 3;
const TRIANGULAR = 4;
const BINNED = 5;

export interface KernelLayout {
  descriptors: Float64Array;
  layout: Int32Array;
  parameters: Float64Array;
  /** Column index of the column of zeros (one past the parts). */
  zero: number;
}

/** A part's descriptor, with the parameters of partFromUnit / partUnitMap computed by the same expressions. */
export function partDescriptor(part: Part): number[] {
  const lo = partLow(part);
  const hi = partHigh(part);
  const d = part.distribution;
  if (d.kind === 'fixed') return [CONSTANT, d.value];
  if (hi <= lo) return [CONSTANT, part.nominal];
  const center = (lo + hi) / 2;
  const half = (hi - lo) / 2;
  const k = 'k' in d && d.k !== undefined ? d.k : DEFAULT_K;
  switch (d.kind) {
    case 'uniform':
      return [AFFINE, lo, hi - lo];
    case 'normal':
      return [NORMAL, center, half / k];
    case 'truncated-normal': {
      // truncatedNormalFromUnit(buf, n, center, half / k, lo, hi)
      const mean = center;
      const sigma = half / k;
      const pLo = normalCdf((lo - mean) / sigma);
      const span = normalCdf((hi - mean) / sigma) - pLo;
      return [TRUNCATED, pLo, span, mean, sigma, lo, hi];
    }
    case 'triangular': {
      // triangularFromUnit(buf, n, lo, nominal, hi)
      const mode = part.nominal;
      const width = hi - lo;
      const split = width > 0 ? (mode - lo) / width : 0;
      return [TRIANGULAR, lo, hi, split, width * (mode - lo), width * (hi - mode)];
    }
    case 'binned': {
      // binnedFromUnit(buf, n, center, half / k, innerFraction·half, half)
      const sigma = half / k;
      const inner = d.innerFraction * half;
      const outer = half;
      const a = inner / sigma;
      const b = outer / sigma;
      const lowStart = normalCdf(-b);
      const pieceMass = normalCdf(-a) - lowStart;
      const highStart = normalCdf(a);
      return [BINNED, lowStart, pieceMass, highStart, center, sigma, center - outer, center + outer];
    }
  }
}

/** The kernel's tables for a supply spec and the model buildSupplyModel made from it. */
export function kernelLayout(spec: SupplySpec, model: Model): KernelLayout {
  const parts = model.parts;
  const zero = parts.length;
  const byName = new Map(parts.map((p, i) => [p.name, i]));
  const used = new Set<number>();
  const find = (name: string): number => {
    const i = byName.get(name);
    if (i === undefined) throw new Error(`wasm kernel: the model has no part named ${name}`);
    used.add(i);
    return i;
  };
  const optional = (present: unknown, name: string): number => (present ? find(name) : zero);
  const layout = new Int32Array(LAYOUT_SLOTS).fill(zero);
  const parameters = new Float64Array(PARAMETER_SLOTS);
  const put = (slot: number, ...columns: number[]): void => columns.forEach((c, i) => (layout[slot + i] = c));
  const resistor = (r: ResistorSpec): number[] => [find(r.name), optional(r.drift, `${r.name} drift`), optional(r.tcrPerK, `${r.name} TCR`)];
  const reference = (r: ReferenceSpec, defaultName: string): number[] => {
    const name = r.name ?? defaultName;
    return [find(name), optional(r.drift, `${name} drift`), optional(r.tempcoPerK, `${name} tempco`)];
  };

  put(L_T, find('T ambient'));
  put(L_REF, ...reference(spec.reference!, 'Vref'));
  const legAt = (slot: number, wiperSlot: number, leg: NonNullable<SupplySpec['divider']>['top']): void => {
    put(slot, ...resistor(leg.resistors[0]));
    if (leg.resistors.length === 2) {
      put(slot + LEG_HAS_B, 1, ...resistor(leg.resistors[1]), leg.arrangement === 'parallel' ? 1 : 0);
    } else put(slot + LEG_HAS_B, 0);
    if (leg.potentiometer) {
      put(slot + LEG_POT, ...resistor(leg.potentiometer));
      parameters[wiperSlot] = leg.potentiometer.wiper;
    }
  };
  legAt(L_TOP, P_WIPER_TOP, spec.divider!.top);
  legAt(L_BOTTOM, P_WIPER_BOTTOM, spec.divider!.bottom);
  put(L_IFB, optional(spec.divider!.feedbackBias, 'Ifb'));
  const sense = spec.sense;
  if (sense) {
    put(L_SENSE, sense.topology === 'direct' ? 1 : sense.topology === 'noninv' ? 2 : 3);
    const th = sense.threshold;
    if (th.kind === 'fixed') {
      put(L_TH_MODE, 0);
      put(L_TH_FIXED, find('Vth'), zero, optional(th.tempcoPerK, 'Vth tempco'));
    } else {
      if (th.source === 'regulator-reference') put(L_TH_MODE, 1);
      else {
        put(L_TH_MODE, 2);
        put(L_TH_SOURCE, ...reference(th.source, 'Vref threshold'));
      }
      // The divider's top and bottom resistors, in consecutive slots.
      put(L_TH_TOP, ...resistor(th.top), ...resistor(th.bottom));
    }
    put(L_COMPARE, optional(sense.compareOffset, 'Vos cmp'));
    if (sense.topology !== 'direct') {
      const amp = sense.amplifier;
      put(L_AMP, find('Vos amp'), optional(amp.offsetDriftPerK, 'Vos amp drift'), optional(amp.biasCurrent, 'Ib amp'), amp.offsetDriftPerK ? 1 : 0);
      const gains = sense.topology === 'noninv' ? [sense.rf, sense.rg] : [sense.r1, sense.r2, sense.r3, sense.r4];
      gains.forEach((r, i) => put(L_GAIN + 3 * i, ...resistor(r)));
      if (sense.topology === 'diff') parameters[P_COMMON_MODE] = sense.commonModeV;
    }
    put(L_SHUNT, ...resistor(sense.shunt));
    const theta = sense.shunt.thermalResistanceKPerW ?? 0;
    parameters[P_THETA] = theta;
    put(L_SELF_HEATING, theta > 0 && sense.shunt.tcrPerK ? 1 : 0);
  } else put(L_SENSE, 0);
  put(L_ZERO, zero);
  const unused = parts.filter((_, i) => !used.has(i)).map((p) => p.name);
  if (unused.length > 0) throw new Error(`wasm kernel: no role for part${unused.length > 1 ? 's' : ''} ${unused.join(', ')}`);
  const descriptors = new Float64Array(DESCRIPTOR_FIELDS * parts.length);
  parts.forEach((part, i) => descriptors.set(partDescriptor(part), DESCRIPTOR_FIELDS * i));
  return { descriptors, layout, parameters, zero };
}
