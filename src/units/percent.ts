// Percentages: "1%", "0.1 %", "±1 %" and a bare "1" (meaning 1 %) read as the FRACTION 0.01.
import { InputError } from '../errors.js';
import { decimalValue, scanDecimal } from './decimal-number.js';
import { unexpectedCharacter } from './notation-error.js';

const ACCEPTED = 'a percentage such as 1%, 0.1 %, ±0.5% or a bare number of percent (1 means 1 %)';

export interface SignOption {
  /** Allow a leading '-' (a signed quantity such as a drift); by default only '+' or '±' may lead. */
  signed?: boolean;
}

/** Reads a leading sign: '+' or '±' (a tolerance's magnitude) always; '-' only when signed. */
export function scanSign(text: string, where: string, accepted: string, options: SignOption): { negative: boolean; end: number } {
  const first = text[0];
  if (first === '+' || first === '\u00b1') return { negative: false, end: 1 };
  if (first === '-') {
    if (!options.signed) throw new InputError(where, `must not be negative, got '${text}'`, accepted);
    return { negative: true, end: 1 };
  }
  return { negative: false, end: 0 };
}

/** "1%" → 0.01. A bare number is a number of percent. */
export function parsePercent(rawText: string, where: string, options: SignOption = {}): number {
  const text = rawText.trim().replace(/\u2212/g, '-');
  if (text === '') throw new InputError(where, 'empty percentage', ACCEPTED);
  const sign = scanSign(text, where, ACCEPTED, options);
  const number = scanDecimal(text, sign.end, where, ACCEPTED);
  let i = number.end;
  while (text[i] === ' ') i++;
  if (text[i] === '%') i++;
  if (i < text.length) throw unexpectedCharacter(where, text, i, ACCEPTED);
  const value = decimalValue(number.digits, number.exponent - 2);
  if (!Number.isFinite(value)) throw new InputError(where, `'${text}' is out of range`, ACCEPTED);
  return sign.negative && value !== 0 ? -value : value;
}

/** 0.0025 → "0.25 %". */
export function formatPercent(fraction: number, decimals = 2): string {
  if (!Number.isFinite(fraction)) throw new RangeError(`formatPercent: not a finite number (${fraction})`);
  const text = (fraction * 100).toFixed(decimals);
  return `${/^-0\.?0*$/.test(text) ? text.slice(1) : text} %`;
}

/** An error or deviation with its sign always shown: 0.01128 → "+1.13 %", -0.0134 → "-1.34 %". */
export function formatSignedPercent(fraction: number, decimals = 2): string {
  const text = formatPercent(fraction, decimals);
  return text.startsWith('-') || /^0\.?0* %$/.test(text) ? text : `+${text}`;
}
