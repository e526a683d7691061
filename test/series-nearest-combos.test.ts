// nearestStandard and bestCombinations, checked against outside references: hand arithmetic on worked examples,
// the series data itself (brackets are neighbours in the series), and an O(n²) brute-force double loop over the
// same pool of parts that the fast binary-search version must agree with exactly.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bestCombinations, combinationPool, combine, POOL_DECADES, type Combination, type ComboKind } from '../src/series/combos.js';
import { seriesValuesBetween } from '../src/series/enumerate.js';
import { SERIES_NAMES, type SeriesName } from '../src/series/load.js';
import { nearestStandard } from '../src/series/nearest.js';

const seriesArb = fc.constantFrom<SeriesName>(...SERIES_NAMES);
/** Targets log-uniform over 10 mΩ … 100 MΩ. */
const targetArb = fc.double({ min: -2, max: 8, noNaN: true }).map((e) => 10 ** e);

describe('nearestStandard', () => {
  it('28.38 kΩ in E96: 28.0 k below (−1.339 %), 28.7 k above (+1.128 %), nearest 28.7 k (hand arithmetic)', () => {
    const b = nearestStandard(28380, 'E96');
    expect([b.below, b.above, b.nearest]).toEqual([28000, 28700, 28700]);
    expect(b.belowErrorPct).toBeCloseTo(-1.33897, 4); // 28000 / 28380 − 1
    expect(b.aboveErrorPct).toBeCloseTo(1.12755, 4); // 28700 / 28380 − 1
  });
  it('a value exactly on the series gives itself three times, error 0 (4.7 kΩ in E24, 10 kΩ in E192)', () => {
    expect(nearestStandard(4700, 'E24')).toMatchObject({ below: 4700, above: 4700, nearest: 4700, nearestErrorPct: 0 });
    expect(nearestStandard(10e3, 'E192')).toMatchObject({ below: 10e3, above: 10e3, nearest: 10e3 });
  });
  it('across a decade edge: 9.9 k in E96 lies between 9.76 k and 10.0 k', () => {
    expect(nearestStandard(9900, 'E96')).toMatchObject({ below: 9760, above: 10000, nearest: 10000 });
    expect(nearestStandard(1.001, 'E3')).toMatchObject({ below: 1, above: 2.2, nearest: 1 });
  });
  it('property: below ≤ value ≤ above, they are neighbours in the series, nearest is the closer one', () => {
    fc.assert(
      fc.property(seriesArb, targetArb, (series, value) => {
        const b = nearestStandard(value, series);
        expect(b.below).toBeLessThanOrEqual(value);
        expect(b.above).toBeGreaterThanOrEqual(value);
        // Neighbours: no series value strictly between them (the series data, enumerated independently).
        const inside = seriesValuesBetween(series, b.below, b.above).filter((v) => v > b.below && v < b.above);
        expect(inside).toEqual([]);
        expect(Math.abs(b.nearest - value)).toBe(Math.min(value - b.below, b.above - value));
        // And no gap wider than the series' largest step (E3: 2.2/1.0 → ratio at most 2.2).
        expect(b.above / b.below).toBeLessThanOrEqual(2.2 + 1e-12);
      }),
      { numRuns: 3000, seed: 7 },
    );
  });
  it('an ascending list (stock) may have nothing below or above', () => {
    const stock = [100, 220, 470];
    expect(nearestStandard(50, stock)).toMatchObject({ below: null, above: 100, nearest: 100, belowErrorPct: null });
    expect(nearestStandard(1000, stock)).toMatchObject({ below: 470, above: null, nearest: 470 });
    expect(nearestStandard(300, stock)).toMatchObject({ below: 220, above: 470, nearest: 220 });
  });
  it('zero, negative and non-finite targets are InputErrors', () => {
    for (const bad of [0, -1, Number.NaN, Number.POSITIVE_INFINITY]) expect(() => nearestStandard(bad, 'E24')).toThrow(/positive finite/);
  });
});

/** Reference: every unordered pair of the pool, double loop, sorted by |error|. */
function bruteForce(value: number, pool: readonly number[], kind: ComboKind, count: number): Combination[] {
  const all: Combination[] = [];
  for (let i = 0; i < pool.length; i++) {
    for (let j = 0; j < pool.length; j++) {
      const a = pool[i] as number;
      const b = pool[j] as number;
      if (kind === 'series' ? b > a : b < a) continue;
      const combined = kind === 'series' ? a + b : 1 / (1 / a + 1 / b);
      all.push({ kind, parts: [a, b], value: combined, errorPct: (combined / value - 1) * 100 });
    }
  }
  all.sort((x, y) => Math.abs(x.errorPct) - Math.abs(y.errorPct));
  return all.slice(0, count);
}

describe('bestCombinations', () => {
  it('28.38 kΩ from E96: 24.9 k + 3.48 k is exact; 30.9 k ∥ 348 k = 28.3800475 k (hand arithmetic)', () => {
    const combos = bestCombinations(28380, 'E96', 3);
    expect(combos[0]).toMatchObject({ kind: 'series', parts: [24900, 3480], value: 28380, errorPct: 0 });
    const parallel = combos.find((c) => c.kind === 'parallel');
    expect(parallel?.parts).toEqual([30900, 348000]);
    expect(parallel?.value).toBeCloseTo((30900 * 348000) / (30900 + 348000), 9);
    expect(combos.filter((c) => c.kind === 'series')).toHaveLength(3);
    expect(combos.filter((c) => c.kind === 'parallel')).toHaveLength(3);
  });
  it('every reported value is the series or parallel formula of its parts, error consistent', () => {
    for (const c of bestCombinations(1234, 'E24', 5)) {
      const [a, b] = c.parts;
      expect(c.value).toBeCloseTo(c.kind === 'series' ? a + b : (a * b) / (a + b), 9);
      expect(c.errorPct).toBeCloseTo((c.value / 1234 - 1) * 100, 9);
    }
  });
  it('property: agrees with the brute-force double loop over the same pool (E6/E12/E24, top 4 of each kind)', () => {
    fc.assert(
      fc.property(fc.constantFrom<SeriesName>('E6', 'E12', 'E24'), targetArb, (series, value) => {
        const pool = combinationPool(value, series);
        const fast = bestCombinations(value, series, 4);
        for (const kind of ['series', 'parallel'] as const) {
          const reference = bruteForce(value, pool, kind, 4);
          const mine = fast.filter((c) => c.kind === kind);
          // Same errors in the same order (ties may list different but equally good pairs).
          expect(mine.map((c) => Math.abs(c.errorPct))).toEqual(reference.map((c) => expect.closeTo(Math.abs(c.errorPct), 9)));
          for (const c of mine) expect(combine(kind, c.parts[0], c.parts[1])).toBeCloseTo(c.value, 9);
        }
      }),
      { numRuns: 300, seed: 11 },
    );
  }, 60_000);
  it('property: never worse than the nearest single value once that is off by more than 0.11 %', () => {
    // Why 0.11 %: partners are drawn from within 10^3 of the target, so a partner can correct an error no smaller
    // than about 1/1000 of the target; above that a pair (nearest single + the right partner) always improves.
    // Targets 1 Ω … 1 MΩ keep the whole pool inside the orderable span 1 mΩ … 1 GΩ (near its ends partners are cut).
    expect(POOL_DECADES).toBe(3);
    const inner = fc.double({ min: 0, max: 6, noNaN: true }).map((e) => 10 ** e);
    fc.assert(
      fc.property(seriesArb, inner, (series, value) => {
        const single = nearestStandard(value, series);
        fc.pre(Math.abs(single.nearestErrorPct) > 0.11);
        const [best] = bestCombinations(value, series, 1);
        expect(Math.abs(best?.errorPct ?? Infinity)).toBeLessThanOrEqual(Math.abs(single.nearestErrorPct));
      }),
      { numRuns: 600, seed: 13 },
    );
  }, 60_000);
  it('targets outside 1 mΩ … 1 GΩ (orderable parts, common practice) are refused', () => {
    expect(() => bestCombinations(1e-6, 'E24')).toThrow(/outside the span/);
    expect(() => bestCombinations(1e10, 'E24')).toThrow(/outside the span/);
  });
});
