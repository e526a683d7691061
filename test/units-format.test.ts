// Formatting, checked two ways: against hand-written expected text (the definitions of engineering notation and
// of the IEC 60062:2016 letter-and-digit code), and by round trips parse(format(x)) === x over every value of
// every IEC 60063 series across 16 decades (1 mΩ to 100 GΩ) plus random 3-digit values (fast-check).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { seriesValuesBetween } from '../src/series/enumerate.js';
import { SERIES_NAMES } from '../src/series/load.js';
import {
  formatEngineering,
  formatEngineeringShortest,
  formatPercent,
  formatRkm,
  formatRkmDigits,
  formatSignedPercent,
  parseCurrent,
  parseResistance,
  parseVoltage,
} from '../src/units/index.js';

describe('formatEngineering (mantissa in [1, 1000), prefix exponent a multiple of 3)', () => {
  it.each([
    [4700, 'Ω', '4.70 kΩ'],
    [12, 'V', '12.0 V'],
    [0.15, 'A', '150 mA'],
    [9760, 'Ω', '9.76 kΩ'],
    [9999, 'Ω', '10.0 kΩ'],
    [999.5, 'Ω', '1.00 kΩ'],
    [0.0047, 'Ω', '4.70 mΩ'],
    [50e-9, 'A', '50.0 nA'],
    [2.2e-6, 'A', '2.20 µA'],
    [1e6, 'Ω', '1.00 MΩ'],
    [-1.5, 'V', '-1.50 V'],
    [0, 'V', '0.00 V'],
    [1e-15, 'V', '1.00e-15 V'],
  ])('%d %s → %s', (value, unit, text) => {
    expect(formatEngineering(value, unit)).toBe(text);
  });
  it('the top of a decade rounds into the next prefix: 999.96 → "1.00 k", 9.9996 k → "10.0 k"', () => {
    expect(formatEngineering(999.96, 'Ω')).toBe('1.00 kΩ');
    expect(formatEngineering(9999.6, 'Ω')).toBe('10.0 kΩ');
    expect(formatEngineering(999_996, 'Ω')).toBe('1.00 MΩ');
  });
  it('other digit counts', () => {
    expect(formatEngineering(28380, 'Ω', 4)).toBe('28.38 kΩ');
    expect(formatEngineering(470, 'Ω', 2)).toBe('470 Ω');
    expect(formatEngineeringShortest(28380, 'Ω')).toBe('28.38 kΩ');
    expect(formatEngineeringShortest(4700, 'Ω')).toBe('4.70 kΩ');
  });
  it('NaN and Infinity are refused, never printed', () => {
    expect(() => formatEngineering(Number.NaN, 'V')).toThrow(RangeError);
    expect(() => formatEngineering(Number.POSITIVE_INFINITY, 'V')).toThrow(RangeError);
  });
});

describe('formatRkm (IEC 60062:2016 letter-and-digit code)', () => {
  it.each([
    [4700, '4K7'],
    [0.047, 'R047'],
    [28700, '28K7'],
    [1e6, '1M0'],
    [100, '100R'],
    [1, '1R0'],
    [2.2, '2R2'],
    [0.1, 'R10'],
    [0.0047, 'R0047'],
    [47300, '47K3'],
    [1000, '1K0'],
    [2.2e9, '2G2'],
    [1e12, '1T0'],
    [9760, '9K76'],
  ])('%d Ω → %s', (value, code) => {
    expect(formatRkm(value)).toBe(code);
  });
  it('refuses zero, negative and non-finite resistances', () => {
    for (const bad of [0, -1, Number.NaN, Number.POSITIVE_INFINITY]) expect(() => formatRkm(bad)).toThrow(RangeError);
  });
});

describe('round trips parse(format(x)) === x', () => {
  const everyStandardValue = SERIES_NAMES.flatMap((name) => seriesValuesBetween(name, 1e-3, 100e9));

  it(`every IEC 60063 value from 1 mΩ to 100 GΩ (${everyStandardValue.length} values), engineering notation`, () => {
    for (const value of everyStandardValue) expect(parseResistance(formatEngineering(value, 'Ω'), 'rt')).toBe(value);
  });
  it('every IEC 60063 value from 1 mΩ to 100 GΩ, RKM code', () => {
    for (const value of everyStandardValue) expect(parseResistance(formatRkm(value), 'rt')).toBe(value);
  });
  it('decade edges: 9.76 k → 10.0 k (E96), 976 m → 1.00 (E96), 9.1 M → 10 M (E24)', () => {
    const e96 = seriesValuesBetween('E96', 9e3, 11e3);
    expect(e96.map((v) => formatEngineering(v, 'Ω'))).toEqual(['9.09 kΩ', '9.31 kΩ', '9.53 kΩ', '9.76 kΩ', '10.0 kΩ', '10.2 kΩ', '10.5 kΩ', '10.7 kΩ', '11.0 kΩ']);
    expect(seriesValuesBetween('E96', 0.96, 1.03).map(formatRkm)).toEqual(['R976', '1R0', '1R02']);
    expect(seriesValuesBetween('E24', 9e6, 10.5e6).map(formatRkm)).toEqual(['9M1', '10M']);
  });
  it('random 3-significant-digit values, any decade from 1 mΩ to 1 GΩ, volts and amperes too (fast-check)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 100, max: 999 }), fc.integer({ min: -5, max: 6 }), (digits, exponent) => {
        const value = Number(`${digits}e${exponent}`);
        expect(parseResistance(formatEngineering(value, 'Ω'), 'rt')).toBe(value);
        expect(parseResistance(formatRkm(value), 'rt')).toBe(value);
        expect(parseVoltage(formatEngineering(value, 'V'), 'rt')).toBe(value);
        expect(parseCurrent(formatEngineering(-value, 'A'), 'rt')).toBe(-value);
      }),
      { numRuns: 2000, seed: 20260101 },
    );
  });
});

describe('formatPercent', () => {
  it('fraction → percent text', () => {
    expect(formatPercent(0.0025)).toBe('0.25 %');
    expect(formatPercent(0.01, 0)).toBe('1 %');
    expect(formatPercent(-0.00001)).toBe('0.00 %');
    expect(formatSignedPercent(0.01128)).toBe('+1.13 %');
    expect(formatSignedPercent(-0.0134)).toBe('-1.34 %');
    expect(formatSignedPercent(0)).toBe('0.00 %');
  });
});

describe('formatRkmDigits (three digits for E48…E192 parts, common practice)', () => {
  it('pads with zeros, never drops digits', () => {
    expect(formatRkmDigits(28000, 3)).toBe('28K0');
    expect(formatRkmDigits(10000, 3)).toBe('10K0');
    expect(formatRkmDigits(383, 3)).toBe('383R');
    expect(formatRkmDigits(0.1, 3)).toBe('R100');
    expect(formatRkmDigits(28700, 3)).toBe('28K7');
    expect(formatRkmDigits(28380, 3)).toBe('28K38');
    expect(parseResistance(formatRkmDigits(10000, 3), 'rt')).toBe(10000);
  });
});
