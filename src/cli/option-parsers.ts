// Adapters from the value-notation parsers to commander option/argument parsers.
// Each throws InputError with `where` = the option name (e.g. '--vout'), so src/cli/main.ts prints one line, exit 2.
import { InputError } from '../errors.js';
import { parseSeriesName, type SeriesName } from '../series/load.js';
import {
  parseCurrent,
  parsePercent,
  parsePower,
  parsePpmPerK,
  parseRange,
  parseResistance,
  parseVoltage,
  type Range,
} from '../units/index.js';

type Parse<T> = (text: string, where: string) => T;

/** Wraps `parse` as a commander parser that reports errors against `optionName`. */
export function optionParser<T>(parse: Parse<T>, optionName: string): (value: string) => T {
  return (value: string) => parse(value, optionName);
}

export const resistanceOption = (name: string): ((v: string) => number) => optionParser(parseResistance, name);
export const voltageOption = (name: string): ((v: string) => number) => optionParser(parseVoltage, name);
export const currentOption = (name: string): ((v: string) => number) => optionParser(parseCurrent, name);
export const powerOption = (name: string): ((v: string) => number) => optionParser(parsePower, name);
/** A fraction: "1%" → 0.01; a bare "1" also means 1 %. */
export const percentOption = (name: string): ((v: string) => number) => optionParser((t, w) => parsePercent(t, w), name);
/** Per kelvin: "100ppm/K" → 1e-4. */
export const ppmPerKOption = (name: string): ((v: string) => number) => optionParser((t, w) => parsePpmPerK(t, w), name);
export const seriesOption = (name: string): ((v: string) => SeriesName) => optionParser(parseSeriesName, name);

/** "LO..HI" (or one value) where each side is read by `parseOne`. */
export function rangeOption(parseOne: Parse<number>, name: string): (v: string) => Range {
  return (value: string) => parseRange(value, parseOne, name);
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
