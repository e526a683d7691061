// Scans a plain decimal number (digits, an optional point, an optional e-exponent) and converts digit strings to
// numbers exactly once, so "4.70" with prefix k gives exactly 4700 (the double nearest the decimal value,
// ECMAScript Number() being correctly rounded).
import { unexpectedCharacter } from './notation-error.js';

export interface ScannedDecimal {
  /** All significant digits, integer part then fraction, e.g. "470" for "4.70". */
  digits: string;
  /** Power of ten to apply to `digits` read as an integer, e.g. -2 for "4.70". */
  exponent: number;
  /** Index just past the number. */
  end: number;
}

function isDigit(ch: string | undefined): boolean {
  return ch !== undefined && ch >= '0' && ch <= '9';
}

/** Reads digits[.digits][e±digits] starting at `start`; at least one digit is required. */
export function scanDecimal(text: string, start: number, where: string, accepted: string): ScannedDecimal {
  let i = start;
  let intPart = '';
  while (isDigit(text[i])) intPart += text[i++];
  let fracPart = '';
  if (text[i] === '.') {
    i++;
    while (isDigit(text[i])) fracPart += text[i++];
  }
  if (intPart === '' && fracPart === '') throw unexpectedCharacter(where, text, i, accepted);
  let exponent = -fracPart.length;
  if ((text[i] === 'e' || text[i] === 'E') && (isDigit(text[i + 1]) || ((text[i + 1] === '+' || text[i + 1] === '-') && isDigit(text[i + 2])))) {
    i++;
    let sign = 1;
    if (text[i] === '+' || text[i] === '-') sign = text[i++] === '-' ? -1 : 1;
    let expDigits = '';
    while (isDigit(text[i])) expDigits += text[i++];
    exponent += sign * Number(expDigits);
  }
  return { digits: intPart + fracPart, exponent, end: i };
}

/** digits × 10^exponent, rounded once to the nearest double. */
export function decimalValue(digits: string, exponent: number): number {
  return Number(`${digits === '' ? '0' : digits}e${exponent}`);
}
