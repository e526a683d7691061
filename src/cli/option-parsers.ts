// Adapters from the value-notation parsers to commander option/argument parsers.
// Each throws InputError with `where` = the option name (e.g. '--vout'), so src/cli/main.ts prints one line, exit 2.
import { InputError } from '../errors.js';
import { printableText } from '../user-text.js';
import { parseSeriesName, type SeriesName } from '../series/load.js';
import {
  CURRENT_BAND_ACCEPTED,
  parseCurrent,
  parseCurrentBand,
  parsePercent,
  parsePower,
  parsePpmPerK,
  parseRange,
  parseResistance,
  parseVoltage,
  type CurrentBand,
  type Range,
} from '../units/index.js';

type Parse<T> = (text: string, where: string) => T;

/** Wraps `parse` as a commander parser that reports errors against `optionName`. */
export function optionParser<T>(parse: Parse<T>, optionName: string): (value: string) => T {
  return (value: string) => parse(value, optionName);
}

/**
 * Sanity bounds on command-line quantities: past them a value is a slip of the keyboard (1e308, 5e30 V), not a part,
 * and arithmetic on it would overflow into Infinity or NaN. They are far outside any datasheet (from memory: the
 * smallest shunts are about 50 µΩ, the largest catalogue resistors about 1 TΩ).
 */
export const SANE_LIMITS = {
  resistance: { lo: 1e-6, hi: 1e12, text: '1 µΩ to 1 TΩ' },
  voltage: { hi: 1e5, text: 'up to 100 kV in magnitude' },
  current: { hi: 1e5, text: 'up to 100 kA in magnitude' },
  power: { hi: 1e6, text: 'up to 1 MW' },
} as const;

function bounded(parse: Parse<number>, hi: number, text: string, lo = 0): Parse<number> {
  return (value: string, where: string) => {
    const x = parse(value, where);
    const size = Math.abs(x);
    if (size > hi || (x !== 0 && size < lo)) throw new InputError(where, `'${value.trim()}' is outside what trimfree takes as a real part`, text);
    return x;
  };
}

export const parseSaneResistance = bounded(parseResistance, SANE_LIMITS.resistance.hi, SANE_LIMITS.resistance.text, SANE_LIMITS.resistance.lo);
export const parseSaneVoltage = bounded(parseVoltage, SANE_LIMITS.voltage.hi, SANE_LIMITS.voltage.text);
export const parseSaneCurrent = bounded(parseCurrent, SANE_LIMITS.current.hi, SANE_LIMITS.current.text);
export const parseSanePower = bounded(parsePower, SANE_LIMITS.power.hi, SANE_LIMITS.power.text);

export const resistanceOption = (name: string): ((v: string) => number) => optionParser(parseSaneResistance, name);
export const voltageOption = (name: string): ((v: string) => number) => optionParser(parseSaneVoltage, name);
export const currentOption = (name: string): ((v: string) => number) => optionParser(parseSaneCurrent, name);
export const powerOption = (name: string): ((v: string) => number) => optionParser(parseSanePower, name);
/** A fraction: "1%" → 0.01; a bare "1" also means 1 %. */
export const percentOption = (name: string): ((v: string) => number) => optionParser((t, w) => parsePercent(t, w), name);
/** Per kelvin: "100ppm/K" → 1e-4. */
export const ppmPerKOption = (name: string): ((v: string) => number) => optionParser((t, w) => parsePpmPerK(t, w), name);
/** A bias current in the one notation of src/units/current-band.ts: 20n (typical), ±20n, 10n±10n, 0..20n, max 20n. */
export const currentBandOption = (name: string): ((v: string) => CurrentBand) =>
  optionParser((text, where) => {
    const band = parseCurrentBand(text, where);
    if (Math.max(Math.abs(band.lo), Math.abs(band.hi)) > SANE_LIMITS.current.hi) {
      throw new InputError(where, `'${text.trim()}' is outside what trimfree takes as a real part`, `${CURRENT_BAND_ACCEPTED}, ${SANE_LIMITS.current.text}`);
    }
    return band;
  }, name);
export const seriesOption = (name: string): ((v: string) => SeriesName) => optionParser(parseSeriesName, name);

/** "LO..HI" (or one value) where each side is read by `parseOne`. */
export function rangeOption(parseOne: Parse<number>, name: string): (v: string) => Range {
  const sane = (text: string, where: string): number => {
    const x = parseOne(text, where);
    if (Math.abs(x) > 1e12) throw new InputError(where, `'${text.trim()}' is outside what trimfree takes as a real part`, 'each end of the range up to 1e12 in magnitude');
    return x;
  };
  return (value: string) => parseRange(value, sane, name);
}

/** A whole number in [min, max], e.g. a candidate count or a trial count. */
export function integerOption(name: string, min: number, max: number = Number.MAX_SAFE_INTEGER): (v: string) => number {
  return (value: string) => {
    const text = value.trim();
    const accepted = `a whole number from ${min} to ${max}`;
    const bad = /[^0-9]/.exec(text);
    if (bad) throw new InputError(name, `unexpected character '${bad[0]}' at position ${bad.index + 1} in '${text}'`, accepted);
    if (text === '') throw new InputError(name, 'empty number', accepted);
    const n = Number(text);
    if (!Number.isSafeInteger(n) || n < min || n > max) throw new InputError(name, `${text} is out of range`, accepted);
    return n;
  };
}

/** A tolerance as a fraction, 0 % to 50 % (the design file's bound too: a part sold looser than ±50 % is not a part). */
export const toleranceOption = (name: string): ((v: string) => number) => boundedPercentOption(name, 0, 0.5, '0 % to 50 %, e.g. 1% or 0.1%');

/** A fraction from a percentage, within [min, max] (min excluded when `aboveMin`). */
export function boundedPercentOption(name: string, min: number, max: number, accepted: string, aboveMin = false): (v: string) => number {
  const parse = percentOption(name);
  return (value: string) => {
    const fraction = parse(value);
    const low = aboveMin ? fraction > min : fraction >= min;
    if (!(low && fraction <= max)) throw new InputError(name, `'${value.trim()}' is out of range`, accepted);
    return fraction;
  };
}

/** A temperature difference in kelvin: a plain number 0..500, "45" or "45K" (e.g. an ambient's distance from 25 °C). */
export function kelvinOption(name: string): (text: string) => number {
  return (text) => {
    const value = Number(text.trim().replace(/\s*K$/, ''));
    if (text.trim() === '' || !Number.isFinite(value) || value < 0 || value > 500) {
      throw new InputError(name, `'${printableText(text)}' is not a temperature difference`, 'a number of kelvin from 0 to 500, e.g. 45 or 45K');
    }
    return value;
  };
}
