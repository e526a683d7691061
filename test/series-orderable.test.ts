import { describe, expect, it } from 'vitest';
import { orderableSeries } from '../src/series/orderable-series.js';

// Expected series read off the IEC 60063:2015 tables (which series' decade holds the significand) and the
// tolerances each series is commonly sold in (series/*.json commonTolerances: common practice).
describe('orderableSeries: the series to order a part from', () => {
  it('1.00 kΩ at 5 % or 1 % is an E24 part (E3 holds 1.0 but is not sold at 1 %)', () => {
    expect(orderableSeries(1000, 0.05)).toBe('E24');
    expect(orderableSeries(1000, 0.01)).toBe('E24');
  });
  it('10.7 kΩ is E96 at 1 % and E192 at 0.1 % (E96 is commonly sold down to 0.5 %)', () => {
    expect(orderableSeries(10.7e3, 0.01)).toBe('E96');
    expect(orderableSeries(10.7e3, 0.001)).toBe('E192');
  });
  it('53.6 Ω at 1 % is E48 (5.36 is in E48, not E24)', () => {
    expect(orderableSeries(53.6, 0.01)).toBe('E48');
  });
  it('a 10 kΩ pot at 20 % is E3; 4.7 kΩ at 10 % is E12', () => {
    expect(orderableSeries(10e3, 0.2)).toBe('E3');
    expect(orderableSeries(4.7e3, 0.1)).toBe('E12');
  });
  it('a value in no series is undefined; 9.20 is only in E192 (IEC 60063:2015 Table 2)', () => {
    expect(orderableSeries(28.38e3, 0.01)).toBeUndefined();
    expect(orderableSeries(9.2e3, 0.01)).toBe('E192');
    expect(orderableSeries(0, 0.01)).toBeUndefined();
  });
  it('a value held only by a series too coarse for the tolerance falls back to the finest series holding it (a 2.2 kΩ 0.1 % part: 2.2 is in E3…E24, but E48+ have 2.21, not 2.20)', () => {
    expect(orderableSeries(2.2e3, 0.001)).toBe('E24');
  });
});
