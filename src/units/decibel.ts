// A ratio in decibels: "90 dB", "90dB" or a bare "90" (dB) → 90. Amplitude ratios (CMRR, PSRR) are 20·log10 of the
// voltage ratio (IEC 60027-3:2002, field quantities; from memory), so 90 dB is a ratio of 10^(90/20) ≈ 31 623.
import { InputError } from '../errors.js';
import { decimalValue, scanDecimal } from './decimal-number.js';
import { unexpectedCharacter } from './notation-error.js';

const ACCEPTED = 'a ratio in decibels such as 90 dB, 80dB or a bare number of dB';

/** "90 dB" → 90 (dB, not the ratio). */
export function parseDecibel(rawText: string, where: string): number {
  const text = rawText.trim();
  if (text === '') throw new InputError(where, 'empty ratio', ACCEPTED);
  const number = scanDecimal(text, 0, where, ACCEPTED);
  let i = number.end;
  while (text[i] === ' ') i++;
  const rest = text.slice(i);
  if (rest !== '' && rest !== 'dB') {
    let k = 0;
    while (k < rest.length && 'dB'.startsWith(rest.slice(0, k + 1))) k++;
    throw unexpectedCharacter(where, text, i + k, ACCEPTED);
  }
  const value = decimalValue(number.digits, number.exponent);
  if (!Number.isFinite(value)) throw new InputError(where, `'${text}' is out of range`, ACCEPTED);
  return value;
}

/** The voltage ratio of an amplitude level in dB: 10^(dB/20) (IEC 60027-3:2002, from memory). */
export function amplitudeRatioOfDecibels(db: number): number {
  return 10 ** (db / 20);
}
