// Value notation: parsing. Expected values are the definitions themselves: SI prefixes (SI Brochure, 9th edition
// 2019, Table 7), the letter-and-digit code of IEC 60062:2016 (the letter replaces the decimal point and gives the
// multiplier: R = 1, K = 10^3, M = 10^6, G = 10^9, T = 10^12). Equality is exact: the parser builds the decimal
// value once (digits × 10^k, correctly rounded), so 4K7 is the same double as the literal 4700.
import { describe, expect, it } from 'vitest';
import {
  parseCurrent,
  parsePercent,
  parsePower,
  parsePpmPerK,
  parseRange,
  parseResistance,
  parseVoltage,
} from '../src/units/index.js';

const ohms = (text: string): number => parseResistance(text, 'test');

describe('IEC 60062:2016 letter-and-digit code', () => {
  it.each([
    ['4K7', 4.7e3],
    ['2R2', 2.2],
    ['R047', 0.047],
    ['0R1', 0.1],
    ['1M0', 1e6],
    ['47K3', 47.3e3],
    ['100R', 100],
    ['47K', 47e3],
    ['K47', 470],
    ['2G2', 2.2e9],
    ['1T0', 1e12],
    ['R0047', 0.0047],
    ['28K7', 28.7e3],
  ])('%s = %d Ω (IEC 60062:2016)', (text, expected) => {
    expect(ohms(text)).toBe(expected);
  });
  it.each([
    ['4k7', 4.7e3],
    ['4m7', 4.7e-3],
    ['10m', 10e-3],
  ])('%s = %d Ω (common practice: lower-case k; m for milliohm shunts)', (text, expected) => {
    expect(ohms(text)).toBe(expected);
  });
  it('case matters: 4M7 is mega, 4m7 is milli (SI Brochure Table 7)', () => {
    expect(ohms('4M7')).toBe(4.7e6);
    expect(ohms('4m7')).toBe(4.7e-3);
  });
});

describe('SI prefixes and units (SI Brochure, 9th edition, Table 7)', () => {
  it.each([
    ['4.7k', 4.7e3],
    ['4.7 kΩ', 4.7e3],
    ['4.7kohm', 4.7e3],
    ['4.7K', 4.7e3],
    ['10 MΩ', 10e6],
    ['10 Mohm', 10e6],
    ['100 mΩ', 0.1],
    ['1 mohm', 1e-3],
    ['220R', 220],
    ['4.7R', 4.7],
    ['4.7 Ω', 4.7],
    ['4.7 \u2126', 4.7],
    ['1e3', 1e3],
    ['2.2e-3', 2.2e-3],
    ['.5', 0.5],
    ['330', 330],
    ['  1k  ', 1e3],
  ])('resistance %j', (text, expected) => {
    expect(ohms(text)).toBe(expected);
  });
  it('voltage: 12, 12V, 1.25 V, 800mV, 3V3 (3V3: common practice on schematics), -2 mV', () => {
    expect(parseVoltage('12', 'v')).toBe(12);
    expect(parseVoltage('12V', 'v')).toBe(12);
    expect(parseVoltage('1.25 V', 'v')).toBe(1.25);
    expect(parseVoltage('800mV', 'v')).toBe(0.8);
    expect(parseVoltage('3V3', 'v')).toBe(3.3);
    expect(parseVoltage('-2 mV', 'v')).toBe(-2e-3);
    expect(parseVoltage('\u22122mV', 'v')).toBe(-2e-3);
  });
  it('current: 2A, 150mA, 50 nA, 1A5, 10µA (U+00B5), 10μA (U+03BC), 10uA', () => {
    expect(parseCurrent('2A', 'i')).toBe(2);
    expect(parseCurrent('150mA', 'i')).toBe(0.15);
    expect(parseCurrent('50 nA', 'i')).toBe(50e-9);
    expect(parseCurrent('1A5', 'i')).toBe(1.5);
    for (const micro of ['10\u00b5A', '10\u03bcA', '10uA']) expect(parseCurrent(micro, 'i')).toBe(10e-6);
  });
  it('power: 0.25, 250mW, 1 W, 2 watts', () => {
    expect(parsePower('0.25', 'p')).toBe(0.25);
    expect(parsePower('250mW', 'p')).toBe(0.25);
    expect(parsePower('1 W', 'p')).toBe(1);
    expect(parsePower('2 watts', 'p')).toBe(2);
  });
});

describe('percent and ppm/K', () => {
  it('percent gives a fraction; a bare number is a number of percent', () => {
    expect(parsePercent('1%', 'p')).toBe(0.01);
    expect(parsePercent('0.1 %', 'p')).toBe(0.001);
    expect(parsePercent('±0.5%', 'p')).toBe(0.005);
    expect(parsePercent('1', 'p')).toBe(0.01);
    expect(parsePercent('0.25', 'p')).toBe(0.0025);
    expect(parsePercent('-1%', 'p', { signed: true })).toBe(-0.01);
  });
  it('ppm/K gives per kelvin; ppm/°C is the same (a 1 °C difference is 1 K, SI Brochure 2.3.1)', () => {
    expect(parsePpmPerK('100ppm/K', 't')).toBe(1e-4);
    expect(parsePpmPerK('100 ppm', 't')).toBe(1e-4);
    expect(parsePpmPerK('100', 't')).toBe(1e-4);
    expect(parsePpmPerK('50 ppm/°C', 't')).toBe(5e-5);
    expect(parsePpmPerK('±25ppm/K', 't')).toBe(2.5e-5);
    expect(parsePpmPerK('-50', 't', { signed: true })).toBe(-5e-5);
  });
});

describe('ranges LO..HI', () => {
  it('reads both ends; one value gives lo = hi', () => {
    expect(parseRange('1k..10k', parseResistance, 'r')).toEqual({ lo: 1e3, hi: 10e3 });
    expect(parseRange('4K7', parseResistance, 'r')).toEqual({ lo: 4.7e3, hi: 4.7e3 });
    expect(parseRange('-20..70', parseVoltage, 'r')).toEqual({ lo: -20, hi: 70 });
  });
  it('inverted, empty-sided and doubled ranges are InputErrors that say so', () => {
    expect(() => parseRange('10k..1k', parseResistance, '--range')).toThrow(/inverted/);
    expect(() => parseRange('..1k', parseResistance, '--range')).toThrow(/missing its lower end/);
    expect(() => parseRange('1k..', parseResistance, '--range')).toThrow(/missing its upper end/);
    expect(() => parseRange('1..2..3', parseResistance, '--range')).toThrow(/more than one/);
  });
});
