// Helpers for the report tests: read a displayed figure back with the units parsers (engineer A's code, not the
// formatter under test) and check it against the exact number within the rounding of the digits shown.
import { parseCurrent, parsePower, parseVoltage } from '../src/units/index.js';

const PARSERS: Record<string, (text: string, where: string) => number> = { V: parseVoltage, A: parseCurrent, W: parsePower };

/** The value a displayed text like "8.400 V" or "12.0 mV" stands for, and half a unit of its last digit. */
export function readDisplayed(text: string, unit: string): { value: number; halfStep: number } {
  const parse = PARSERS[unit];
  if (!parse) throw new Error(`no parser for unit ${unit}`);
  const value = parse(text, 'test');
  const mantissa = /^-?[0-9]+(?:\.([0-9]+))?/.exec(text.trim());
  if (!mantissa) throw new Error(`not a number: ${text}`);
  const decimals = mantissa[1]?.length ?? 0;
  const scale = Number(mantissa[0]) === 0 ? 1 : value / Number(mantissa[0]);
  return { value, halfStep: Math.abs(0.5 * 10 ** -decimals * scale) };
}

/** Checks that a displayed text rounds the exact value (within half its last digit, plus 1e-9 relative slack). */
export function displayedMatches(text: string, unit: string, exact: number): boolean {
  const { value, halfStep } = readDisplayed(text, unit);
  return Math.abs(value - exact) <= halfStep * (1 + 1e-9) + Math.abs(exact) * 1e-12;
}
