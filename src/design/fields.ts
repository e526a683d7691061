// Value fields of the design file: each accepts the notation of src/units ("4K7", "12 V", "1%", "100ppm") or a
// plain JSON number, and is converted to SI base units here, at the edge. A plain number means the same as the
// notation without its unit: 4700 → 4.7 kΩ, 12 → 12 V, 1 → 1 % (percent fields), 100 → 100 ppm/K (TCR fields).
// A notation error from src/units becomes a zod issue carrying what is accepted; load.ts adds the field path.
import { z } from 'zod';
import { InputError } from '../errors.js';
import {
  CURRENT_BAND_ACCEPTED,
  parseCurrent,
  parseCurrentBand,
  parsePercent,
  parsePower,
  parsePpmPerK,
  parseResistance,
  parseVoltage,
  type CurrentBand,
} from '../units/index.js';

type Parser = (text: string, where: string) => number;
type Ctx = z.core.$RefinementCtx<unknown>;

/** Marker in issue params: what the field accepts, for the error line. */
export interface AcceptedParams {
  accepted: string;
}

/** Reports an InputError thrown by a parser as an issue at the current field; returns undefined. */
function report(ctx: Ctx, input: unknown, error: unknown): undefined {
  if (!(error instanceof InputError)) throw error;
  ctx.issues.push({ code: 'custom', message: error.message, input, params: { accepted: error.accepted } });
  return undefined;
}

/** Issue for a value that parsed but breaks a rule of the field (out of range, inverted window...). */
export function fieldIssue(ctx: Ctx, input: unknown, problem: string, accepted: string): void {
  ctx.issues.push({ code: 'custom', message: problem, input, params: { accepted } });
}

const textOrNumber = z.union([z.string(), z.number()]);

/** Magnitudes trimfree accepts at all (beyond them, arithmetic could overflow to Infinity or lose all precision). */
const LARGEST = 1e12;
const SMALLEST = 1e-12;

function parseWith(parse: Parser, input: string | number, ctx: Ctx): number | undefined {
  let value: number;
  try {
    value = parse(typeof input === 'number' ? String(input) : input, '');
  } catch (error) {
    return report(ctx, input, error);
  }
  const size = Math.abs(value);
  if (size > LARGEST || (size !== 0 && size < SMALLEST)) {
    fieldIssue(ctx, input, `${JSON.stringify(input)} is out of range`, 'a magnitude from 1e-12 to 1e12 in SI units (or zero)');
    return undefined;
  }
  return value;
}

interface Bounds {
  min?: number;
  max?: number;
  /** Notation of the bounds for the message, e.g. "0 % to 50 %". */
  text?: string;
}

/** A quantity in SI units from notation or a number, optionally bounded (inclusive). */
export function quantity(parse: Parser, description: string, bounds: Bounds = {}) {
  return textOrNumber
    .transform((input, ctx): number => {
      const value = parseWith(parse, input, ctx);
      if (value === undefined) return z.NEVER;
      if ((bounds.min !== undefined && value < bounds.min) || (bounds.max !== undefined && value > bounds.max)) {
        fieldIssue(ctx, input, `${JSON.stringify(input)} is out of range`, `${description}, ${bounds.text ?? ''}`.replace(/, $/, ''));
        return z.NEVER;
      }
      return value;
    })
    .meta({ description });
}

/** The literal "auto", or a quantity: output is the number or 'auto'. */
export function autoOr(parse: Parser, description: string, bounds: Bounds = LIMITS.resistance) {
  return textOrNumber
    .transform((input, ctx): number | 'auto' => {
      if (typeof input === 'string' && input.trim().toLowerCase() === 'auto') return 'auto';
      const value = parseWith(parse, input, ctx);
      if (value === undefined) return z.NEVER;
      if ((bounds.min !== undefined && value < bounds.min) || (bounds.max !== undefined && value > bounds.max)) {
        fieldIssue(ctx, input, `${JSON.stringify(input)} is out of range`, `"auto", or ${description}, ${bounds.text ?? ''}`.replace(/, $/, ''));
        return z.NEVER;
      }
      return value;
    })
    .meta({ description: `"auto" (picked by trimfree), or ${description}` });
}

// ---- the quantities ----------------------------------------------------------------------------------------------
// Each has outer limits far beyond any supply trimfree is for, so that no value (a denormal 5e-324 Ω, 1e300 V) can
// carry an Infinity or NaN into the analysis; a field may narrow them.
const LIMITS = {
  resistance: { min: 1e-6, max: 1e12, text: '1 µΩ to 1 TΩ' },
  voltage: { min: -1e5, max: 1e5, text: '-100 kV to 100 kV' },
  current: { min: -1e4, max: 1e4, text: '-10 kA to 10 kA' },
  power: { min: 0, max: 1e5, text: 'up to 100 kW' },
  percent: { min: 0, max: 1, text: '0 % to 100 %' },
  ppmPerK: { min: 0, max: 1e-2, text: '0 to 10000 ppm/K' },
} satisfies Record<string, Bounds>;

/** The field's own bounds within the quantity's outer limits. */
function within(limits: Bounds, bounds: Bounds = {}): Bounds {
  const out: Bounds = {
    min: Math.max(limits.min ?? -Infinity, bounds.min ?? -Infinity),
    max: Math.min(limits.max ?? Infinity, bounds.max ?? Infinity),
  };
  const text = bounds.text ?? limits.text;
  if (text !== undefined) out.text = text;
  return out;
}

export const resistance = (bounds?: Bounds) =>
  quantity(parseResistance, 'a resistance: 4K7, 4.7k, 4.7 kΩ, 10m, or a number of ohms', within(LIMITS.resistance, bounds));
export const voltage = (bounds?: Bounds) =>
  quantity(parseVoltage, 'a voltage: 12 V, 800mV, 3V3, or a number of volts', within(LIMITS.voltage, bounds));
export const current = (bounds?: Bounds) =>
  quantity(parseCurrent, 'a current: 1.5 A, 150mA, 50 nA, or a number of amperes', within(LIMITS.current, bounds));
export const power = (bounds?: Bounds) => quantity(parsePower, 'a power: 1 W, 250mW, or a number of watts', within(LIMITS.power, bounds));
/** A fraction from "1%" / "0.5 %" / 1 (a bare number is percent). */
export const percent = (bounds?: Bounds) =>
  quantity(parsePercent, 'a percentage: 1%, 0.5 %, or a number of percent', within(LIMITS.percent, bounds));
/** Per kelvin from "100ppm/K" / "100ppm" / 100 (a bare number is ppm/K). */
export const ppmPerK = (bounds?: Bounds) =>
  quantity(parsePpmPerK, 'a temperature coefficient: 100ppm/K, 25 ppm, or a number of ppm/K', within(LIMITS.ppmPerK, bounds));

/**
 * A bias current in the one notation of src/units/current-band.ts: a typical value ("20 nA", or a plain number of
 * amperes: exactly that), a ± band ("±20n", "10n±10n"), a range ("0..20n") or a maximum ("max 20n": 0..20 nA).
 */
export const currentBand = () =>
  textOrNumber
    .transform((input, ctx): CurrentBand => {
      let band: CurrentBand;
      try {
        band = parseCurrentBand(typeof input === 'number' ? String(input) : input, '');
      } catch (error) {
        return report(ctx, input, error) ?? z.NEVER;
      }
      if (Math.max(Math.abs(band.lo), Math.abs(band.hi)) > LIMITS.current.max) {
        fieldIssue(ctx, input, `${JSON.stringify(input)} is out of range`, `${CURRENT_BAND_ACCEPTED}, ${LIMITS.current.text}`);
        return z.NEVER;
      }
      return band;
    })
    .meta({ description: CURRENT_BAND_ACCEPTED });

// ---- per-kelvin and thermal quantities (a unit suffix on top of src/units) -------------------------------------
const PER_KELVIN = /\s*\/\s*(K|°C|degC)$/i;

/** A voltage per kelvin, e.g. "5 µV/K", "5uV/°C" (amplifier offset drift), V/K. */
function parseVoltagePerK(text: string, where: string): number {
  const bare = text.trim();
  if (/^[-+]?[\d.]+(e[-+]?\d+)?$/i.test(bare)) return parseVoltage(bare, where);
  if (!PER_KELVIN.test(bare)) {
    throw new InputError(where, `'${text}' has no per-kelvin unit`, 'a voltage per kelvin: 5 µV/K, 5uV/°C, or a number of V/K');
  }
  return parseVoltage(bare.replace(PER_KELVIN, ''), where);
}
export const voltagePerK = () =>
  quantity(parseVoltagePerK, 'a voltage drift: 5 µV/K, 5uV/°C, or a number of volts per kelvin', { min: -1, max: 1, text: 'within ±1 V/K' });

/** Thermal resistance θ, "60 K/W", "60 °C/W" or 60, in K/W. */
function parseThermalResistance(text: string, where: string): number {
  const accepted = 'a thermal resistance: 60 K/W, 60 °C/W, or a number of K/W';
  const match = /^\s*([+]?\d+(\.\d*)?(e[-+]?\d+)?|\.\d+)\s*((K|°C|degC)\s*\/\s*W)?\s*$/i.exec(text);
  const value = match ? Number(match[1]) : NaN;
  if (!Number.isFinite(value) || value < 0) throw new InputError(where, `'${text}' is not a thermal resistance`, accepted);
  return value;
}
export const thermalResistance = () =>
  quantity(parseThermalResistance, 'a thermal resistance: 60 K/W, 60 °C/W, or a number of K/W', { min: 0, max: 1e4, text: '0 to 10000 K/W' });

/** Temperature in °C, "-20 °C", "85C", or a number. */
function parseCelsius(text: string, where: string): number {
  const accepted = 'a temperature in °C: -20 °C, 85C, or a number of degrees Celsius';
  const match = /^\s*([-+\u2212]?(\d+(\.\d*)?|\.\d+))\s*(°?C|degC)?\s*$/i.exec(text);
  const value = match ? Number(match[1]!.replace('\u2212', '-')) : NaN;
  if (!Number.isFinite(value)) throw new InputError(where, `'${text}' is not a temperature`, accepted);
  if (value < -273.15) throw new InputError(where, `'${text}' is below absolute zero`, accepted);
  return value;
}
export const celsius = () => quantity(parseCelsius, 'a temperature: -20 °C, 85C, or a number of degrees Celsius', { min: -273.15, max: 1000, text: '-273.15 °C to 1000 °C' });

// ---- windows ----------------------------------------------------------------------------------------------------

/** A spec window as written: relative to the target (±0.5 %) or absolute [lo, hi] in the field's unit. */
export type WindowInput = { kind: 'relative'; minus: number; plus: number } | { kind: 'absolute'; lo: number; hi: number };

const WINDOW_ACCEPTED = (unit: string) =>
  `"±0.5%" (about the target), "-1%/+2%", "LO..HI" such as "8.36..8.44 ${unit}", or [LO, HI]`;

function parseRelative(text: string, ctx: Ctx, input: unknown, unit: string): WindowInput | undefined {
  const accepted = WINDOW_ACCEPTED(unit);
  const symmetric = /^\s*(±|\+-|\+\/-)\s*(.+)$/.exec(text);
  try {
    if (symmetric) {
      const half = parsePercent(symmetric[2]!, '');
      if (!(half > 0)) return void fieldIssue(ctx, input, 'a window must have a width', accepted);
      return { kind: 'relative', minus: half, plus: half };
    }
    const asymmetric = /^\s*-\s*([^/]+)\/\s*\+\s*(.+)$/.exec(text);
    if (asymmetric) {
      const minus = parsePercent(asymmetric[1]!, '');
      const plus = parsePercent(asymmetric[2]!, '');
      if (minus < 0 || plus < 0 || minus + plus <= 0) return void fieldIssue(ctx, input, 'a window must have a width', accepted);
      return { kind: 'relative', minus, plus };
    }
  } catch (error) {
    if (error instanceof InputError) return void fieldIssue(ctx, input, error.message, accepted);
    throw error;
  }
  return undefined;
}

/**
 * Splits "LO..HI" into its two ends, each read on its own as src/units' parseRange does: "1..100k" is
 * 1 Ω to 100 kΩ, and "800..900 mV" is 800 V to 0.9 V (inverted, so it is refused); write "800mV..900mV".
 */
export function splitRange(text: string): [string, string] | undefined {
  const parts = text.split('..');
  if (parts.length !== 2 || parts[0]!.trim() === '' || parts[1]!.trim() === '') return undefined;
  return [parts[0]!.trim(), parts[1]!.trim()];
}

/** A spec window field for a quantity parsed by `parse` (voltage or current). */
export function windowField(parse: Parser, unit: string) {
  const accepted = WINDOW_ACCEPTED(unit);
  return z
    .union([z.string(), z.tuple([textOrNumber, textOrNumber])])
    .transform((input, ctx): WindowInput => {
      let lo: number | undefined;
      let hi: number | undefined;
      if (typeof input === 'string') {
        if (/^\s*(±|\+-|\+\/-|-[^.]*\/)/.test(input)) {
          const relative = parseRelative(input, ctx, input, unit);
          if (relative) return relative;
          if (ctx.issues.length === 0) fieldIssue(ctx, input, `cannot read the window '${input}'`, accepted);
          return z.NEVER;
        }
        const parts = splitRange(input);
        if (!parts) {
          fieldIssue(ctx, input, `cannot read the window '${input}'`, accepted);
          return z.NEVER;
        }
        lo = parseWith(parse, parts[0], ctx);
        hi = parseWith(parse, parts[1], ctx);
      } else {
        lo = parseWith(parse, input[0], ctx);
        hi = parseWith(parse, input[1], ctx);
      }
      if (lo === undefined || hi === undefined) return z.NEVER;
      if (!(lo < hi)) {
        fieldIssue(ctx, input, `the window is inverted or empty (low ${lo} ≥ high ${hi})`, `${accepted}, with LO < HI`);
        return z.NEVER;
      }
      return { kind: 'absolute', lo, hi };
    })
    .meta({ description: `spec window: ${accepted}` });
}

/** Absolute [lo, hi] of a window about `target`. */
export function windowBounds(window: WindowInput, target: number): [number, number] {
  if (window.kind === 'absolute') return [window.lo, window.hi];
  return [target * (1 - window.minus), target * (1 + window.plus)];
}

/** A range "LO..HI" (or one value, lo = hi) of a quantity; returns [lo, hi]. */
export function rangeField(parse: Parser, description: string) {
  return z
    .union([z.string(), z.number(), z.tuple([textOrNumber, textOrNumber])])
    .transform((input, ctx): [number, number] => {
      let pair: [string | number, string | number];
      if (Array.isArray(input)) pair = input;
      else if (typeof input === 'string' && input.includes('..')) {
        const parts = splitRange(input);
        if (!parts) {
          fieldIssue(ctx, input, `cannot read the range '${input}'`, `LO..HI: ${description}`);
          return z.NEVER;
        }
        pair = parts;
      } else pair = [input, input];
      const lo = parseWith(parse, pair[0], ctx);
      const hi = parseWith(parse, pair[1], ctx);
      if (lo === undefined || hi === undefined) return z.NEVER;
      if (lo > hi) {
        fieldIssue(ctx, input, `the range is inverted (${lo} > ${hi})`, `LO..HI with LO ≤ HI: ${description}`);
        return z.NEVER;
      }
      return [lo, hi];
    })
    .meta({ description: `a range LO..HI (or one value): ${description}` });
}

export const PARSERS = { resistance: parseResistance, voltage: parseVoltage, current: parseCurrent } as const;
