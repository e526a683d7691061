// A bias current as a datasheet gives it, in one notation for the command line and the design file alike:
//   20n          a typical value, taken as exactly that (no spread)
//   ±20n, 0±20n  a band about zero;  10n±10n  a band about 10 nA (also "+-" or "+/-" for ±)
//   0..20n       a range from its lower to its upper end
//   max 20n      a maximum only: the current lies anywhere in 0..20 nA (uniform), nominal 10 nA
// A plain number is a typical value in amperes. Every band is symmetric about its nominal, so it is (nominal, ±half).
import { InputError } from '../errors.js';
import { formatEngineering } from './format-engineering.js';
import { parseCurrent } from './quantities.js';

export type CurrentBandForm = 'typical' | 'plus-minus' | 'range' | 'max';

export interface CurrentBand {
  /** Centre of the band, A (the typical value itself for a typical value). */
  nominal: number;
  /** Lower and upper ends, A (both equal to the nominal for a typical value). */
  lo: number;
  hi: number;
  /** How it was written, so what was assumed can be said back. */
  form: CurrentBandForm;
}

export const CURRENT_BAND_ACCEPTED =
  'a current as a typical value (20n: exactly 20 nA), a ± band (±20n, 0±20n, 10n±10n), a range (0..20n), or a maximum (max 20n: anywhere in 0..20 nA, uniform)';

const PLUS_MINUS = /±|\+\/-|\+-/;

function current(text: string, where: string): number {
  try {
    return parseCurrent(text, where);
  } catch (error) {
    // The quantity's own message names the character; the accepted text is the band's.
    if (error instanceof InputError) throw new InputError(where, error.message, CURRENT_BAND_ACCEPTED);
    throw error;
  }
}

/** Reads a bias current in any of the four forms; InputError (naming `where`) for anything else. */
export function parseCurrentBand(text: string, where: string): CurrentBand {
  const t = text.trim();
  if (t === '') throw new InputError(where, 'empty value', CURRENT_BAND_ACCEPTED);
  const max = /^max\s*(.*)$/i.exec(t);
  if (max) {
    const hi = current(max[1]!, where);
    if (!(hi >= 0)) throw new InputError(where, `a maximum must not be negative, got '${t}'`, `${CURRENT_BAND_ACCEPTED}; for a current out of the pin give a range such as -20n..0`);
    return { nominal: hi / 2, lo: 0, hi, form: 'max' };
  }
  if (t.includes('..')) {
    const parts = t.split('..');
    if (parts.length !== 2 || parts[0]!.trim() === '' || parts[1]!.trim() === '') throw new InputError(where, `cannot read the range '${t}'`, CURRENT_BAND_ACCEPTED);
    const lo = current(parts[0]!, where);
    const hi = current(parts[1]!, where);
    if (lo > hi) throw new InputError(where, `the range '${t}' is inverted (low end above high end)`, CURRENT_BAND_ACCEPTED);
    return { nominal: (lo + hi) / 2, lo, hi, form: 'range' };
  }
  const pm = PLUS_MINUS.exec(t);
  if (pm) {
    const centreText = t.slice(0, pm.index).trim();
    const halfText = t.slice(pm.index + pm[0].length).trim();
    const centre = centreText === '' ? 0 : current(centreText, where);
    const half = current(halfText, where);
    if (half < 0) throw new InputError(where, `the half-width after ± must not be negative, got '${t}'`, CURRENT_BAND_ACCEPTED);
    return { nominal: centre, lo: centre - half, hi: centre + half, form: 'plus-minus' };
  }
  const value = current(t, where);
  return { nominal: value, lo: value, hi: value, form: 'typical' };
}

/** Half-width of the band, A. */
export function currentBandHalfWidth(band: CurrentBand): number {
  return (band.hi - band.lo) / 2;
}

/** What was assumed, for notes and header lines: "max 20.0 nA: uniform over 0..20.0 nA, nominal 10.0 nA". */
export function describeCurrentBand(band: CurrentBand): string {
  const a = (x: number): string => (x === 0 ? '0 A' : formatEngineering(x, 'A'));
  switch (band.form) {
    case 'typical':
      return band.nominal === 0 ? '0 A' : `${a(band.nominal)} (a typical value, taken as exact)`;
    case 'max':
      return `max ${a(band.hi)}: uniform over 0..${a(band.hi)}, nominal ${a(band.nominal)}`;
    case 'plus-minus':
      return `${band.nominal === 0 ? '' : `${a(band.nominal)} `}±${a(currentBandHalfWidth(band))}: uniform over ${a(band.lo)}..${a(band.hi)}`;
    default:
      return `${a(band.lo)}..${a(band.hi)}: uniform, nominal ${a(band.nominal)}`;
  }
}
