// The commander adapters report errors against the option's name (the `where` of the one-line message).
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.js';
import {
  currentOption,
  integerOption,
  percentOption,
  ppmPerKOption,
  rangeOption,
  resistanceOption,
  seriesOption,
  voltageOption,
} from '../src/cli/option-parsers.js';
import { parseResistance } from '../src/units/index.js';

function whereOf(run: () => unknown): string {
  try {
    run();
  } catch (error) {
    if (error instanceof InputError) return error.where;
    throw error;
  }
  throw new Error('expected an InputError');
}

describe('option parsers', () => {
  it('parse like the units parsers (definitions: SI prefixes, IEC 60062 code, % as a fraction, ppm/K per kelvin)', () => {
    expect(resistanceOption('--rtop')('4K7')).toBe(4700);
    expect(voltageOption('--vout')('12V')).toBe(12);
    expect(currentOption('--limit')('150mA')).toBe(0.15);
    expect(percentOption('--tol')('1%')).toBe(0.01);
    expect(ppmPerKOption('--tcr')('100ppm/K')).toBe(1e-4);
    expect(seriesOption('--series')('e96')).toBe('E96');
    expect(rangeOption(parseResistance, '--rbottom')('1k..10k')).toEqual({ lo: 1000, hi: 10000 });
    expect(integerOption('--top', 1, 100)('25')).toBe(25);
  });
  it('errors carry the option name as where', () => {
    expect(whereOf(() => voltageOption('--vout')('12x'))).toBe('--vout');
    expect(whereOf(() => resistanceOption('--rtop')('0'))).toBe('--rtop');
    expect(whereOf(() => seriesOption('--series')('E7'))).toBe('--series');
    expect(whereOf(() => rangeOption(parseResistance, '--rbottom')('10k..1k'))).toBe('--rbottom');
  });
  it('integerOption names a stray character and refuses out-of-range or empty text', () => {
    expect(() => integerOption('--top', 1, 100)('2.5')).toThrow("unexpected character '.' at position 2 in '2.5'");
    expect(() => integerOption('--top', 1, 100)('-3')).toThrow("unexpected character '-' at position 1 in '-3'");
    expect(() => integerOption('--top', 1, 100)('101')).toThrow('101 is out of range');
    expect(() => integerOption('--top', 1, 100)('')).toThrow('empty number');
  });
});
