// The one bias-current notation (src/units/current-band.ts). Expected values are the forms' stated meanings: a
// typical value is exactly that value; "A±B" is [A − B, A + B]; "LO..HI" is that range; "max X" is [0, X]; the nominal
// is the band's centre. Currents by the SI prefix n = 1e-9 (SI Brochure, 9th edition, Table 7).
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.js';
import { describeCurrentBand, parseCurrentBand } from '../src/units/index.js';

const band = (text: string) => parseCurrentBand(text, '--ib');

describe('the four forms', () => {
  it.each([
    ['20n', { nominal: 20e-9, lo: 20e-9, hi: 20e-9, form: 'typical' }],
    ['20 nA', { nominal: 20e-9, lo: 20e-9, hi: 20e-9, form: 'typical' }],
    ['-5nA', { nominal: -5e-9, lo: -5e-9, hi: -5e-9, form: 'typical' }],
    ['2e-8', { nominal: 2e-8, lo: 2e-8, hi: 2e-8, form: 'typical' }],
    ['±20n', { nominal: 0, lo: -20e-9, hi: 20e-9, form: 'plus-minus' }],
    ['+-20n', { nominal: 0, lo: -20e-9, hi: 20e-9, form: 'plus-minus' }],
    ['0±20n', { nominal: 0, lo: -20e-9, hi: 20e-9, form: 'plus-minus' }],
    ['10n±10n', { nominal: 10e-9, lo: 0, hi: 20e-9, form: 'plus-minus' }],
    ['10 nA +/- 10 nA', { nominal: 10e-9, lo: 0, hi: 20e-9, form: 'plus-minus' }],
    ['0..20n', { nominal: 10e-9, lo: 0, hi: 20e-9, form: 'range' }],
    ['-20n..0', { nominal: -10e-9, lo: -20e-9, hi: 0, form: 'range' }],
    ['max 20n', { nominal: 10e-9, lo: 0, hi: 20e-9, form: 'max' }],
    ['MAX 20 nA', { nominal: 10e-9, lo: 0, hi: 20e-9, form: 'max' }],
  ])('%s', (text, expected) => {
    const b = band(text);
    expect(b.form).toBe(expected.form);
    for (const key of ['nominal', 'lo', 'hi'] as const) expect(b[key]).toBeCloseTo(expected[key], 24);
  });

  it('0..20n, 10n±10n and max 20n are the same band; 20n is not', () => {
    const [a, b, c] = ['0..20n', '10n±10n', 'max 20n'].map(band);
    for (const x of [b!, c!]) expect([x.lo, x.hi, x.nominal]).toEqual([a!.lo, a!.hi, a!.nominal]);
    expect(band('20n').hi - band('20n').lo).toBe(0);
  });

  it('says back what was assumed', () => {
    expect(describeCurrentBand(band('20n'))).toBe('20.0 nA (a typical value, taken as exact)');
    expect(describeCurrentBand(band('max 20n'))).toBe('max 20.0 nA: uniform over 0..20.0 nA, nominal 10.0 nA');
    expect(describeCurrentBand(band('±20n'))).toBe('±20.0 nA: uniform over -20.0 nA..20.0 nA');
    expect(describeCurrentBand(band('0..20n'))).toBe('0 A..20.0 nA: uniform, nominal 10.0 nA');
  });
});

describe('bad forms: one InputError naming the place and the accepted forms', () => {
  it.each([
    ['', /empty value/],
    ['20x', /unexpected character 'x'/],
    ['20n..10n', /inverted/],
    ['1..2..3', /cannot read the range/],
    ['..20n', /cannot read the range/],
    ['±-20n', /half-width after ± must not be negative/],
    ['max -20n', /maximum must not be negative/],
    ['max', /ends too early|empty|unexpected/],
  ])("'%s'", (text, pattern) => {
    let error: unknown;
    try {
      band(text);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).where).toBe('--ib');
    expect((error as InputError).message).toMatch(pattern);
    expect((error as InputError).accepted).toMatch(/typical value .* ± band .* range .* maximum \(max 20n: anywhere in 0\.\.20 nA, uniform\)/);
  });
});
