// The grammar shared by resistance, voltage, current and power:
//   [sign] number [spaces] [SI prefix] [unit]        e.g. 4.7k, 4.7 kΩ, 10 MΩ, 150mA, 0.5 W, 1e3
//   letter-and-digit code (IEC 60062:2016)           e.g. 4K7, R047, 3V3
// Anything else is an InputError naming the first character that does not fit. Nothing is guessed.
import { InputError } from '../errors.js';
import { printableText } from '../user-text.js';
import { decimalValue, scanDecimal } from './decimal-number.js';
import { unexpectedCharacter } from './notation-error.js';
import { parseLetterCode } from './rkm-code.js';
import { SI_PREFIX_EXPONENTS } from './si-prefix.js';

export type SignRule = 'positive' | 'nonNegative' | 'signed';

export interface QuantityKind {
  /** Noun used in messages: "resistance". */
  noun: string;
  /** Unit spellings. Symbols of one character match exactly; longer words match in any case. */
  units: readonly string[];
  /** Letters that may stand for the decimal point (letter-and-digit code), with their power of ten. */
  codeLetters: ReadonlyMap<string, number>;
  sign: SignRule;
  /** What is accepted, for the error line. */
  accepted: string;
}

function matchUnit(rest: string, units: readonly string[]): string | undefined {
  let best: string | undefined;
  for (const unit of units) {
    const hit = unit.length === 1 ? rest === unit : rest.toLowerCase() === unit.toLowerCase();
    if (hit && (best === undefined || unit.length > best.length)) best = unit;
  }
  return best;
}

function checkValue(value: number, text: string, kind: QuantityKind, where: string): number {
  if (!Number.isFinite(value)) throw new InputError(where, `'${printableText(text)}' is out of range`, kind.accepted);
  if (kind.sign === 'positive' && !(value > 0)) {
    throw new InputError(where, `${kind.noun} must be greater than zero, got '${printableText(text)}'`, kind.accepted);
  }
  if (kind.sign === 'nonNegative' && value < 0) {
    throw new InputError(where, `${kind.noun} must not be negative, got '${printableText(text)}'`, kind.accepted);
  }
  return value === 0 ? 0 : value; // no -0
}

/**
 * When text starts like a letter-and-digit code with digits after the letter (4K7…) but does not end there,
 * the index of the first character past the code, so "4K7F" blames the 'F'.
 */
function codeShapeEnd(text: string, letters: ReadonlyMap<string, number>): number | undefined {
  const match = /^([0-9]*)([A-Za-z])([0-9]+)/.exec(text);
  if (!match || !letters.has(match[2] ?? '')) return undefined;
  return match[0].length < text.length ? match[0].length : undefined;
}

/** Parses one quantity of `kind` from user text; the result is in SI base units. */
export function parseQuantity(rawText: string, where: string, kind: QuantityKind): number {
  const text = rawText.trim().replace(/\u2212/g, '-'); // U+2212 MINUS SIGN reads as '-'
  if (text === '') throw new InputError(where, `empty ${kind.noun}`, kind.accepted);

  const coded = parseLetterCode(text, kind.codeLetters);
  if (coded !== undefined) return checkValue(coded, text, kind, where);

  const codeEnd = codeShapeEnd(text, kind.codeLetters);
  if (codeEnd !== undefined) throw unexpectedCharacter(where, text, codeEnd, kind.accepted);

  let i = 0;
  let negative = false;
  if (text[i] === '+' || text[i] === '-') negative = text[i++] === '-';
  const number = scanDecimal(text, i, where, kind.accepted);
  i = number.end;
  while (text[i] === ' ') i++;

  let prefixExponent = 0;
  const rest = text.slice(i);
  if (rest !== '' && matchUnit(rest, kind.units) === undefined) {
    const prefixChar = String.fromCodePoint(text.codePointAt(i) ?? 0);
    const exponent = SI_PREFIX_EXPONENTS.get(prefixChar);
    if (exponent === undefined) throw unexpectedCharacter(where, text, i, kind.accepted);
    prefixExponent = exponent;
    i += prefixChar.length;
    const unitText = text.slice(i);
    if (unitText !== '' && matchUnit(unitText, kind.units) === undefined) {
      throw unexpectedCharacter(where, text, i, kind.accepted);
    }
  }
  const magnitude = decimalValue(number.digits, number.exponent + prefixExponent);
  return checkValue(negative ? -magnitude : magnitude, text, kind, where);
}
