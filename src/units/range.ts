// Ranges written "LO..HI" (e.g. "1k..10k", "-20..70"); a single value gives lo = hi.
import { InputError } from '../errors.js';

export interface Range {
  lo: number;
  hi: number;
}

/** Parses each side with `parseOne`; an empty side or lo > hi is an InputError. */
export function parseRange(text: string, parseOne: (text: string, where: string) => number, where: string): Range {
  const parts = text.split('..');
  const accepted = 'LO..HI with LO ≤ HI (e.g. 1k..10k), or a single value';
  if (parts.length > 2) throw new InputError(where, `'${text}' has more than one '..'`, accepted);
  if (parts.length === 1) {
    const value = parseOne(text, where);
    return { lo: value, hi: value };
  }
  const [loText = '', hiText = ''] = parts;
  if (loText.trim() === '' || hiText.trim() === '') {
    throw new InputError(where, `range '${text}' is missing its ${loText.trim() === '' ? 'lower' : 'upper'} end`, accepted);
  }
  const lo = parseOne(loText, where);
  const hi = parseOne(hiText, where);
  if (lo > hi) throw new InputError(where, `range '${text}' is inverted (low end above high end)`, accepted);
  return { lo, hi };
}
