// Temperature coefficients: "100ppm/K", "100 ppm/°C", "100ppm", "±50 ppm/K" or a bare "100" (ppm/K) → 1e-4 per kelvin.
// A difference of 1 °C equals 1 K (SI Brochure, 9th edition, 2.3.1), so ppm/°C reads the same as ppm/K.
import { InputError } from '../errors.js';
import { decimalValue, scanDecimal } from './decimal-number.js';
import { unexpectedCharacter } from './notation-error.js';
import { scanSign, type SignOption } from './percent.js';

const ACCEPTED = 'a temperature coefficient such as 100ppm/K, 50 ppm/°C, ±25ppm or a bare number of ppm/K';
const SUFFIXES = ['ppm/K', 'ppm/°C', 'ppm/degC', 'ppm'];

/** "100ppm/K" → 1e-4 (per kelvin). Sign: '+'/'±' always; '-' only with { signed: true }. */
export function parsePpmPerK(rawText: string, where: string, options: SignOption = {}): number {
  const text = rawText.trim().replace(/\u2212/g, '-');
  if (text === '') throw new InputError(where, 'empty temperature coefficient', ACCEPTED);
  const sign = scanSign(text, where, ACCEPTED, options);
  const number = scanDecimal(text, sign.end, where, ACCEPTED);
  let i = number.end;
  while (text[i] === ' ') i++;
  const rest = text.slice(i);
  if (rest !== '') {
    const suffix = SUFFIXES.find((s) => rest === s);
    if (suffix === undefined) {
      // Point at the first character where the text leaves every accepted suffix.
      let k = 0;
      while (k < rest.length && SUFFIXES.some((s) => s.startsWith(rest.slice(0, k + 1)))) k++;
      throw unexpectedCharacter(where, text, i + k, ACCEPTED);
    }
  }
  const value = decimalValue(number.digits, number.exponent - 6);
  if (!Number.isFinite(value)) throw new InputError(where, `'${text}' is out of range`, ACCEPTED);
  return sign.negative && value !== 0 ? -value : value;
}

/** 1e-4 → "100 ppm/K". */
export function formatPpmPerK(perKelvin: number, decimals = 0): string {
  if (!Number.isFinite(perKelvin)) throw new RangeError(`formatPpmPerK: not a finite number (${perKelvin})`);
  return `${(perKelvin * 1e6).toFixed(decimals)} ppm/K`;
}
