// Statistics of the engine against hand computations, published rules and repeated experiments.
import { describe, expect, it } from 'vitest';
import seedrandom from 'seedrandom';
import { numericalTolerance } from '../src/analysis/adaptive.js';
import { ChunkRunner, type ChunkConfig } from '../src/analysis/chunk.js';
import { chunkRandom } from '../src/analysis/chunk-random.js';
import { buildSupplyModel } from '../src/analysis/models/supply.js';
import { processCapability } from '../src/analysis/statistics/capability.js';
import { coverageCount, shortestInterval, sortedPercentile, symmetricInterval } from '../src/analysis/statistics/coverage.js';
import {
  coarseHistogram,
  countInto,
  histogramPercentile,
  histogramQuantileBound,
  histogramShortestInterval,
  histogramSymmetricInterval,
  type FineHistogram,
} from '../src/analysis/statistics/histogram.js';
import { chunkMoments, mergeMoments, momentsSigma } from '../src/analysis/statistics/moments.js';
import { wilsonInterval } from '../src/analysis/statistics/wilson.js';
import { OrderStatistics } from '../src/analysis/statistics/order-statistics.js';
import { BENCH_SUPPLY } from '../src/bench/cvcc-spec.js';
import { fillPart } from '../src/tolerance/sample.js';
import { partFromBound } from '../src/tolerance/part.js';
import { evaluateOutputs } from '../src/analysis/model.js';

describe('Wilson score interval (Wilson 1927; NIST/SEMATECH e-Handbook 7.2.4.1)', () => {
  it('0 of 10: [0, z²/(n + z²)] = [0, 0.27753] (hand: with p̂ = 0 the centre equals the half-width)', () => {
    const w = wilsonInterval(0, 10);
    expect(w.low).toBe(0);
    expect(w.high).toBeCloseTo(1.959963984540054 ** 2 / (10 + 1.959963984540054 ** 2), 12);
  });
  it('covers the true yield about 95 % of the time: 4000 experiments of n = 400 at p = 0.95', () => {
    // Brown, Cai & DasGupta (Statistical Science 16, 2001) show Wilson's coverage oscillating close to nominal;
    // the estimate's own standard error here is √(0.95·0.05/4000) ≈ 0.0034, so [0.93, 0.965] is ≈ ±4.5 SE.
    const random = seedrandom.xor128('wilson');
    let covered = 0;
    for (let r = 0; r < 4000; r++) {
      let successes = 0;
      for (let i = 0; i < 400; i++) if (random() < 0.95) successes++;
      const w = wilsonInterval(successes, 400);
      if (w.low <= 0.95 && 0.95 <= w.high) covered++;
    }
    expect(covered / 4000).toBeGreaterThan(0.93);
    expect(covered / 4000).toBeLessThan(0.965);
  });
});

describe('Cp and Cpk (NIST/SEMATECH e-Handbook 6.1.6)', () => {
  it('USL 20, LSL 8, μ 16, σ 2: Cp = 12/12 = 1.00, Cpk = min(4, 8)/6 = 0.667 (the Handbook’s example, from memory; hand-checked)', () => {
    const c = processCapability(8, 20, 16, 2)!;
    expect(c.cp).toBeCloseTo(1, 12);
    expect(c.cpk).toBeCloseTo(4 / 6, 12);
  });
  it('no spread: no index (never Infinity)', () => {
    expect(processCapability(8, 20, 16, 0)).toBeNull();
  });
});

describe('coverage intervals (JCGM 101:2008 7.7) on hand-checkable samples', () => {
  const hundred = Float64Array.from({ length: 100 }, (_, i) => i + 1);
  it('M = 100, p = 0.95: q = 95, r = int((100 − 95 + 1)/2) = 3 → [y(3), y(98)] = [3, 98]', () => {
    expect(coverageCount(0.95, 100)).toBe(95);
    expect(symmetricInterval(hundred, 0.95)).toEqual({ low: 3, high: 98 });
  });
  it('M = 1000, p = 0.95: q = 950, r = 25 → [y(25), y(975)]', () => {
    const thousand = Float64Array.from({ length: 1000 }, (_, i) => i + 1);
    expect(symmetricInterval(thousand, 0.95)).toEqual({ low: 25, high: 975 });
  });
  it('shortest interval of a skewed sample starts at the dense end', () => {
    // 1..50 densely (step 1) then 60..500 sparsely (step 10), M = 95: q = int(47.5 + 1/2) = 48 and the interval
    // [y(r), y(r+q)] spans q + 1 values; the shortest is r = 1: [y(1), y(49)] = [1, 49].
    const values = [...Array.from({ length: 50 }, (_, i) => i + 1), ...Array.from({ length: 45 }, (_, i) => 60 + 10 * i)];
    const sorted = Float64Array.from(values).sort();
    const q = coverageCount(0.5, sorted.length); // 47.5 → 48
    expect(q).toBe(48);
    expect(shortestInterval(sorted, 0.5)).toEqual({ low: 1, high: 49 });
    expect(symmetricInterval(sorted, 0.5).low).toBeGreaterThan(1);
  });
  it('nearest-rank percentiles: 50th of 1..100 is 50, 2.5th is 3', () => {
    expect(sortedPercentile(hundred, 50)).toBe(50);
    expect(sortedPercentile(hundred, 2.5)).toBe(3);
  });
});

describe('quantiles from the fine histogram stay within the stated bound of the exact ones', () => {
  it('200 000 normal values, 8192 bins over a ±8σ range', () => {
    const n = 200_000;
    const x = new Float64Array(n);
    fillPart(partFromBound({ name: 'x', kind: 'offset', nominal: 5, plusMinus: 3, distribution: { kind: 'normal' } }), x, n, chunkRandom('h', 0));
    const bins = 8192;
    const h: FineHistogram = { lo: -3, hi: 13, bins, counts: new Float64Array(bins + 2), min: x.reduce((a, b) => Math.min(a, b)), max: x.reduce((a, b) => Math.max(a, b)) };
    countInto(h.counts, bins, h.lo, h.hi, x, n);
    const sorted = x.slice().sort();
    const bound = histogramQuantileBound(h);
    expect(bound).toBeCloseTo(16 / 8192, 12);
    for (const pct of [0.135, 2.5, 50, 97.5, 99.865]) expect(Math.abs(histogramPercentile(h, pct) - sortedPercentile(sorted, pct))).toBeLessThanOrEqual(bound);
    for (const p of [0.95, 0.9973]) {
      const exact = symmetricInterval(sorted, p);
      const approx = histogramSymmetricInterval(h, p);
      expect(Math.abs(approx.low - exact.low)).toBeLessThanOrEqual(bound);
      expect(Math.abs(approx.high - exact.high)).toBeLessThanOrEqual(bound);
      const s = shortestInterval(sorted, p);
      const hs = histogramShortestInterval(h, p);
      expect(Math.abs(hs.high - hs.low - (s.high - s.low))).toBeLessThanOrEqual(2 * bound);
    }
    const coarse = coarseHistogram(h);
    expect(coarse.counts.reduce((a, b) => a + b, 0)).toBe(n);
    expect(coarse.edges.length).toBe(coarse.counts.length + 1);
    expect(coarse.edges[0]).toBe(h.min);
    expect(coarse.edges[coarse.edges.length - 1]).toBe(h.max);
    expect(coarse.counts.length).toBeLessThanOrEqual(61);
  });
});

describe('exact order statistics from the gathered bins equal a full sort', () => {
  it('triangular values in 7 uneven pieces, some outside the histogram range: every requested rank', () => {
    const n = 50_000;
    const x = new Float64Array(n);
    fillPart(partFromBound({ name: 'x', kind: 'offset', nominal: 0, plusMinus: 1, distribution: { kind: 'triangular' } }), x, n, chunkRandom('order', 0));
    const bins = 512;
    // A deliberately narrow range, so both outer bins hold values too.
    const h: FineHistogram = { lo: -0.8, hi: 0.7, bins, counts: new Float64Array(bins + 2), min: x.reduce((a, b) => Math.min(a, b)), max: x.reduce((a, b) => Math.max(a, b)) };
    countInto(h.counts, bins, h.lo, h.hi, x, n);
    const pieces = [0, 100, 7000, 7001, 20000, 33333, 49999, n].slice(1).map((end, i, ends) => x.subarray(i === 0 ? 0 : ends[i - 1]!, end));
    const ranges: Array<[number, number]> = [[1, 2500], [47_501, n], [25_000, 25_000], [12_345, 12_400]];
    const order = new OrderStatistics(pieces, h, ranges);
    const sorted = x.slice().sort();
    for (const [a, b] of ranges) for (let r = a; r <= b; r++) expect(order.at(r)).toBe(sorted[r - 1]);
    expect(() => order.at(30_000)).toThrow(/not gathered/);
  });
});

describe('streaming moments (Chan, Golub & LeVeque 1979)', () => {
  it('merging chunks equals the two-pass moments of all values, to 1e-12', () => {
    const random = seedrandom.xor128('chan');
    const x = Float64Array.from({ length: 100_003 }, () => 1e6 + random());
    let merged = { n: 0, mean: 0, m2: 0 };
    for (let start = 0; start < x.length; start += 4096) {
      const part = x.subarray(start, Math.min(x.length, start + 4096));
      merged = mergeMoments(merged, chunkMoments(part, part.length));
    }
    const whole = chunkMoments(x, x.length);
    expect(merged.n).toBe(x.length);
    expect(merged.mean / whole.mean - 1).toBeCloseTo(0, 12);
    expect(momentsSigma(merged) / momentsSigma(whole) - 1).toBeCloseTo(0, 10);
    // Uniform(0, 1) offset by 1e6: σ = 1/√12 despite the large offset (the naive Σx² formula fails here).
    expect(momentsSigma(whole)).toBeCloseTo(1 / Math.sqrt(12), 2);
  });

  it('the chunk runner’s fused reduction equals the clear reference (chunkMoments, countInto, plain counts)', () => {
    const model = buildSupplyModel(BENCH_SUPPLY);
    const n = 10_000;
    const config: ChunkConfig = {
      seed: 'fused',
      chunkSize: n,
      trials: n,
      ranges: model.outputs.map(() => ({ lo: -1, hi: 20 })),
      bins: 1000,
      specs: model.outputs.map((o) => o.spec ?? null),
      keepSamples: true,
      chunkIntervals: false,
      perUnit: false,
    };
    const summary = new ChunkRunner(model, config).run(0);
    // Reference: draw with the one-call-per-draw generator, evaluate, reduce with the plain functions.
    const p = model.parts.map(() => new Float64Array(n));
    const random = chunkRandom('fused', 0);
    model.parts.forEach((part, i) => fillPart(part, p[i]!, n, random));
    const outs = model.outputs.map(() => new Float64Array(n));
    evaluateOutputs(model, p, outs, n);
    model.outputs.forEach((output, o) => {
      const c = summary.outputs[o]!;
      expect(c.samples).toEqual(outs[o]);
      const m = chunkMoments(outs[o]!, n);
      expect(c.mean).toBe(m.mean);
      expect(c.m2).toBe(m.m2);
      const counts = new Uint32Array(1002);
      countInto(counts, 1000, -1, 20, outs[o]!, n);
      // A summary keeps only the bins from its min's to its max's (keepCountedBins): put them back in place.
      const placed = new Uint32Array(1002);
      placed.set(c.counts, c.countsFrom ?? 0);
      expect(placed).toEqual(counts);
      expect(c.counts.length).toBeLessThan(1002);
      const [lo, hi] = output.spec ?? [-Infinity, Infinity];
      expect(c.inSpec).toBe(outs[o]!.filter((v) => v >= lo && v <= hi).length);
      expect(c.min).toBe(outs[o]!.reduce((a, b) => Math.min(a, b)));
      expect(c.max).toBe(outs[o]!.reduce((a, b) => Math.max(a, b)));
    });
  });
});

describe('adaptive numerical tolerance (JCGM 101:2008 7.9.2)', () => {
  it('u = 0.001236 at two digits: 12 × 10⁻⁴, δ = 0.5 × 10⁻⁴ (hand, by the clause’s rule)', () => {
    expect(numericalTolerance(0.001236, 2)).toBeCloseTo(0.5e-4, 15);
    expect(numericalTolerance(2.0, 2)).toBeCloseTo(0.05, 15);
    expect(numericalTolerance(2.0, 1)).toBeCloseTo(0.5, 15);
  });
});
