// Every value of a series within [from, to] ohms, across decades, in ascending order.
// Values are built as integer significand × 10^k so that 4.7 × 10^3 is exactly 4700 (no 4700.000000000001).
import { InputError } from '../errors.js';
import { loadSeries, type SeriesName } from './load.js';

/** Significand in hundredths (4.7 → 470) times 10^(exponent − 2), rounded once. */
export function scaleSignificand(significand: number, exponent: number): number {
  const hundredths = Math.round(significand * 100);
  const power = exponent - 2;
  return power >= 0 ? hundredths * 10 ** power : hundredths / 10 ** -power;
}

export function seriesValuesBetween(name: SeriesName, from: number, to: number): number[] {
  if (!(from > 0) || !Number.isFinite(from) || !Number.isFinite(to)) {
    throw new InputError('range', `range ${from}..${to} is not a positive finite range`, 'a positive lower bound and a finite upper bound');
  }
  if (to < from) throw new InputError('range', `range is inverted (${from} > ${to})`, 'from ≤ to');
  const decade = loadSeries(name).values;
  const out: number[] = [];
  const firstExponent = Math.floor(Math.log10(from)) - 1;
  const lastExponent = Math.floor(Math.log10(to)) + 1;
  for (let exponent = firstExponent; exponent <= lastExponent; exponent++) {
    for (const significand of decade) {
      const value = scaleSignificand(significand, exponent);
      if (value >= from * (1 - 1e-12) && value <= to * (1 + 1e-12)) out.push(value);
    }
  }
  return out;
}
