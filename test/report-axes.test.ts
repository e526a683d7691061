// Histogram axes and tooltips: the 1-2-5 tick rule checked against a brute force over the interval, tick labels
// read back by the units parser (not the formatter under test), and the tooltip's count with its noun in the
// singular for one trial.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { axisTicks } from '../src/report/axis-ticks.js';
import { renderSvgHistogram, trialsText } from '../src/report/svg-histogram.js';
import { formatEngineering } from '../src/units/index.js';
import { FIXTURE_RESULT } from './report-fixture.js';
import { readDisplayed } from './report-check.js';

describe('axis ticks', () => {
  it('a 1-2-5 step, every multiple of it inside the range and nothing else (brute force), about the target count', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e4, max: 1e4, noNaN: true }), fc.double({ min: 1e-6, max: 1e4, noNaN: true }), fc.integer({ min: 2, max: 10 }), (low, span, target) => {
        const high = low + span;
        fc.pre(high > low);
        const ticks = axisTicks(low, high, target);
        // A multiple within rounding of either end may fall either way: such ranges prove nothing, so skip them.
        const near = (edge: number): boolean => Math.abs(edge / ticks.step - Math.round(edge / ticks.step)) < 1e-6;
        fc.pre(!near(low) && !near(high));
        const mantissa = ticks.step / 10 ** Math.floor(Math.log10(ticks.step) + 1e-12);
        expect([1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-9)).toBe(true);
        // Brute force: the whole multiples k·step with low ≤ k·step ≤ high, found by walking k.
        const expected: number[] = [];
        for (let k = Math.ceil(low / ticks.step - 1e-9) - 1; k * ticks.step <= high + ticks.step; k += 1) {
          const v = k * ticks.step;
          if (v >= low && v <= high) expected.push(v);
        }
        expect(ticks.values.length).toBe(expected.length);
        ticks.values.forEach((v, i) => expect(Math.abs(v - expected[i]!)).toBeLessThanOrEqual(Math.max(ticks.step * 1e-9, Math.abs(v) * 4e-16)));
        expect(ticks.values.length).toBeGreaterThanOrEqual(2);
        expect(ticks.values.length).toBeLessThanOrEqual(2 * target + 1);
      }),
      { numRuns: Number(process.env['TRIMFREE_PROP_RUNS'] ?? 100) },
    );
  }, 120_000);

  it('labels at the digits given read back to the tick exactly, and adjacent labels differ', () => {
    for (const [low, high, unit] of [[8.3473, 8.4551, 'V'], [0.98901, 1.0110, 'V'], [1.4172, 1.594, 'A'], [0.2031, 0.251, 'W'], [116.22e-6, 117.42e-6, 'A'], [0, 1e6, 'V']] as const) {
      const ticks = axisTicks(low, high, 6);
      const labels = ticks.values.map((v) => formatEngineering(v, unit, ticks.digits));
      ticks.values.forEach((v, i) => {
        const { value, halfStep } = readDisplayed(labels[i]!, unit);
        expect(Math.abs(value - v), labels[i]).toBeLessThanOrEqual(Math.max(halfStep * 1e-6, Math.abs(v) * 1e-12));
      });
      expect(new Set(labels).size).toBe(labels.length);
    }
  });

  it('refuses an empty or non-finite range rather than draw nonsense', () => {
    expect(() => axisTicks(1, 1)).toThrow(RangeError);
    expect(() => axisTicks(0, Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });
});

describe('histogram tooltips', () => {
  it('"1 trial" for one, "N trials" otherwise, with thousands separators', () => {
    expect(trialsText(1)).toBe('1 trial');
    expect(trialsText(0)).toBe('0 trials');
    expect(trialsText(2500)).toBe('2,500 trials');
  });

  it('each bar title ends in its own count with the right noun', () => {
    const vout = FIXTURE_RESULT.outputs['vout']!;
    // Fine bins are summed in groups for display; one non-empty fine bin per group sets each bar's count.
    const factor = vout.histogram.counts.length / Number(/data-bins="(\d+)"/.exec(renderSvgHistogram(vout))![1]);
    const counts = vout.histogram.counts.map((_, i) => (i % factor === 0 ? ((i / factor) % 3 === 0 ? 1 : i) : 0));
    const svg = renderSvgHistogram({ ...vout, histogram: { ...vout.histogram, counts } });
    const bars = [...svg.matchAll(/data-count="(\d+)"[^>]*><title>[^<]*: ([0-9,]+ trials?)<\/title>/g)];
    expect(bars.length).toBe(Number(/data-bins="(\d+)"/.exec(svg)![1]));
    for (const [, count, text] of bars) expect(text).toBe(Number(count) === 1 ? '1 trial' : `${Number(count).toLocaleString('en-US')} trials`);
    expect(bars.some(([, count]) => count === '1')).toBe(true);
  });
});
