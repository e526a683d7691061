// One uncertain quantity of a design, in SI base units (ohms, volts, amperes, kelvin-per-… as fractions, °C for
// temperature). Its value lies in the band [nominal − minus, nominal + plus]; the distribution says how production
// spreads inside (or, for a normal, around) that band. Worst case uses the band's ends; RSS uses the distribution's σ;
// Monte Carlo draws from the distribution.

/** How a part's value spreads in production. Every kind is defined on the part's band [lo, hi]. */
export type DistributionSpec =
  /** Flat over [lo, hi]. */
  | { kind: 'uniform' }
  /** Normal centred on the band's middle, half-width = k·σ (k = 3 by default: common practice). Unbounded. */
  | { kind: 'normal'; k?: number }
  /** Normal as above, cut off at the band's ends (parts outside the band were tested out). */
  | { kind: 'truncated-normal'; k?: number }
  /** Triangular on [lo, hi] with its peak at the nominal value. */
  | { kind: 'triangular' }
  /**
   * Binned: this grade is what is left of a normal production spread (half-width = k·σ of this band) after a
   * tighter grade, ±innerFraction of this grade's half-width about the middle, was sorted out of it. Happens when
   * the tighter grade is sorted from the same production: common practice.
   */
  | { kind: 'binned'; k?: number; innerFraction: number }
  /** Monte Carlo holds the value at `value` (e.g. a fixed temperature); worst case still uses the band's ends. */
  | { kind: 'fixed'; value: number };

export type DistributionKind = DistributionSpec['kind'];

export type PartKind =
  | 'resistor'
  | 'shunt'
  | 'potentiometer'
  | 'reference'
  | 'offset'
  | 'bias current'
  | 'threshold'
  | 'temperature'
  /** A temperature coefficient whose sign and size within ±limit are unknown for a given unit (TCR, tempco). */
  | 'temperature coefficient'
  /** A long-term drift allowance, a relative change within ±limit. */
  | 'drift'
  /** A resistor network's deviation shared by all its members, a relative change (src/tolerance/network-bands.ts). */
  | 'network absolute'
  /** One network member's own deviation from the others, a relative change (src/tolerance/network-bands.ts). */
  | 'network ratio'
  /** A circuit condition that differs from unit to unit, e.g. the common-mode voltage an LED string sets. */
  | 'operating point';

export interface Part {
  /** Name shown in reports: a designator (R1, RS) or a quantity (Vref, Vos amp, T ambient, R1 TCR). */
  name: string;
  kind: PartKind;
  /** Nominal value in SI base units (Ω, V, A, °C, or 1/K for a temperature coefficient). */
  nominal: number;
  /** Absolute distance from nominal down to the band's lower end (≥ 0). */
  minus: number;
  /** Absolute distance from nominal up to the band's upper end (≥ 0). */
  plus: number;
  distribution: DistributionSpec;
  /** For information (reports, BOM): the TCR the part was specified with, 1/K. Models that apply it do so explicitly. */
  tcrPerK?: number;
  /** SI unit symbol for reports: 'Ω', 'V', 'A', '°C', '1/K', '' (fraction). */
  unit: string;
}

/** Lower end of a part's band. */
export function partLow(part: Part): number {
  return part.nominal - part.minus;
}

/** Upper end of a part's band. */
export function partHigh(part: Part): number {
  return part.nominal + part.plus;
}

/** True when the part has any spread at all (worst case and RSS skip fixed parts). */
export function partVaries(part: Part): boolean {
  return part.minus > 0 || part.plus > 0;
}

const DEFAULT_UNITS: Record<PartKind, string> = {
  resistor: 'Ω',
  shunt: 'Ω',
  potentiometer: 'Ω',
  reference: 'V',
  offset: 'V',
  'bias current': 'A',
  threshold: 'V',
  temperature: '°C',
  'temperature coefficient': '1/K',
  drift: '',
  'network absolute': '',
  'network ratio': '',
  'operating point': '',
};

export interface RelativePartInput {
  name: string;
  kind: PartKind;
  nominal: number;
  /** Relative tolerance as a fraction (0.01 for ±1 %); give `minusFraction` too for an asymmetric band. */
  tolerance: number;
  minusFraction?: number;
  distribution?: DistributionSpec;
  tcrPerK?: number;
}

/** A part from a relative tolerance: ±tolerance·|nominal| (or −minusFraction / +tolerance). Uniform by default. */
export function partFromTolerance(input: RelativePartInput): Part {
  const magnitude = Math.abs(input.nominal);
  const part: Part = {
    name: input.name,
    kind: input.kind,
    nominal: input.nominal,
    minus: (input.minusFraction ?? input.tolerance) * magnitude,
    plus: input.tolerance * magnitude,
    distribution: input.distribution ?? { kind: 'uniform' },
    unit: DEFAULT_UNITS[input.kind],
  };
  if (input.tcrPerK !== undefined) part.tcrPerK = input.tcrPerK;
  return part;
}

export interface AbsolutePartInput {
  name: string;
  kind: PartKind;
  nominal: number;
  /** Absolute half-width of the band (e.g. a Vos maximum of 2 mV about 0 V). */
  plusMinus: number;
  distribution?: DistributionSpec;
  unit?: string;
}

/** A part from an absolute ± bound (offsets, bias currents, coefficients). Uniform by default. */
export function partFromBound(input: AbsolutePartInput): Part {
  return {
    name: input.name,
    kind: input.kind,
    nominal: input.nominal,
    minus: input.plusMinus,
    plus: input.plusMinus,
    distribution: input.distribution ?? { kind: 'uniform' },
    unit: input.unit ?? DEFAULT_UNITS[input.kind],
  };
}

/** A part with no spread (an exactly known value). */
export function fixedPart(name: string, kind: PartKind, value: number): Part {
  return { name, kind, nominal: value, minus: 0, plus: 0, distribution: { kind: 'uniform' }, unit: DEFAULT_UNITS[kind] };
}
