// The letter-and-digit code of IEC 60062:2016 (often called the RKM code): the multiplier letter stands where the
// decimal point would be, so 4K7 = 4.7 kΩ, 2R2 = 2.2 Ω, R047 = 0.047 Ω, 1M0 = 1 MΩ, 47K3 = 47.3 kΩ.
// IEC 60062:2016 letters for resistance: R (10^0), K (10^3), M (10^6), G (10^9), T (10^12).
// Also read, as common practice (not in the standard's resistance table, from memory): lower-case k for kilo
// (4k7) and m for milli on shunt datasheets (4m7 = 4.7 mΩ; case matters: 4M7 is 4.7 MΩ). The same scheme for
// voltage and current (3V3, 1V25, 1A5) is common practice on schematics.
import { decimalValue } from './decimal-number.js';

/** IEC 60062:2016 multiplier letters for resistance, plus the common-practice k and m. */
export const RESISTANCE_CODE_LETTERS: ReadonlyMap<string, number> = new Map([
  ['R', 0],
  ['K', 3],
  ['k', 3],
  ['M', 6],
  ['G', 9],
  ['T', 12],
  ['m', -3],
]);

/**
 * Reads `text` as a letter-and-digit code with one of `letters` in place of the decimal point.
 * Returns undefined when the text is not of that shape (the caller then tries plain notation).
 */
export function parseLetterCode(text: string, letters: ReadonlyMap<string, number>): number | undefined {
  const match = /^([0-9]*)([A-Za-z])([0-9]*)$/.exec(text);
  if (!match) return undefined;
  const [, whole = '', letter = '', fraction = ''] = match;
  const exponent = letters.get(letter);
  if (exponent === undefined || whole + fraction === '') return undefined;
  return decimalValue(whole + fraction, exponent - fraction.length);
}
