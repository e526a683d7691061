// The fast divider search against a brute-force enumeration of every allowed pair of legs.
// The brute force builds every leg (single, a + b, a ∥ b with a ≤ b), every (top, bottom) pair within the parts limit,
// ranks them all and keeps the first `count` distinct leg-value pairs. Ranking uses the same key as the picker
// (ranking.ts: a rule, not a computed result), so the two must produce the same key sequence exactly.
import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';
import { dividerVout } from '../src/circuits/divider.js';
import { parallelResistance, seriesResistance } from '../src/circuits/combine.js';
import { allowedFromSeries, allowedFromStock, type AllowedValues } from '../src/pick/divider/allowed-values.js';
import { bottomWindow, type BottomWindow } from '../src/pick/divider/bottom-window.js';
import { searchFixedDividers } from '../src/pick/divider/fixed-search.js';
import { compareKeys, quantize, type RankKey } from '../src/pick/divider/ranking.js';
import type { SeriesName } from '../src/series/load.js';

interface BruteLeg {
  ohms: number;
  parts: number;
  rank: number;
}

function allLegs(allowed: AllowedValues, withPairs: boolean): BruteLeg[] {
  const { ohms, sourceRank } = allowed;
  const legs: BruteLeg[] = [];
  for (let i = 0; i < ohms.length; i++) legs.push({ ohms: ohms[i]!, parts: 1, rank: sourceRank[i]! });
  if (withPairs) {
    for (let i = 0; i < ohms.length; i++) {
      for (let j = i; j < ohms.length; j++) {
        const rank = Math.max(sourceRank[i]!, sourceRank[j]!);
        legs.push({ ohms: seriesResistance(ohms[i]!, ohms[j]!), parts: 2, rank });
        legs.push({ ohms: parallelResistance(ohms[i]!, ohms[j]!), parts: 2, rank });
      }
    }
  }
  return legs;
}

function bruteForce(vref: number, target: number, ifb: number, allowed: AllowedValues, window: BottomWindow, maxParts: number, count: number) {
  const legs = allLegs(allowed, maxParts >= 3);
  const all: Array<{ key: RankKey; top: number; bottom: number }> = [];
  for (const bottom of legs) {
    if (bottom.ohms < window.lo || bottom.ohms > window.hi) continue;
    const centre = quantize(Math.abs(Math.log(bottom.ohms / window.middle)));
    for (const top of legs) {
      if (top.parts + bottom.parts > maxParts) continue;
      const error = Math.abs(dividerVout(vref, top.ohms, bottom.ohms, ifb) - target) / target;
      all.push({ key: { score: quantize(error), parts: top.parts + bottom.parts, sourceRank: Math.max(top.rank, bottom.rank), centre }, top: top.ohms, bottom: bottom.ohms });
    }
  }
  all.sort((a, b) => compareKeys(a.key, b.key));
  const same = (x: number, y: number): boolean => Math.abs(x - y) <= 1e-9 * Math.max(x, y);
  const kept: typeof all = [];
  for (const entry of all) {
    if (kept.length >= count) break;
    if (!kept.some((k) => same(k.top, entry.top) && same(k.bottom, entry.bottom))) kept.push(entry);
  }
  return kept;
}

const SERIES: SeriesName[][] = [['E6'], ['E12'], ['E24'], ['E48'], ['E96'], ['E24', 'E96'], ['E12', 'E48']];

function randomCase(random: () => number, maxParts: 2 | 3) {
  const vref = 0.5 + random() * 2;
  const target = vref * (1.02 + random() * 40);
  const bottomLo = 10 ** (2 + random() * 2);
  const bottomHi = bottomLo * 10 ** (random() * 1.5);
  // Bias current either way, small enough that Vref/Rbottom + Ifb stays positive over the window.
  const ifb = random() < 0.3 ? 0 : (random() - 0.4) * (vref / bottomHi) * 0.5;
  const window = bottomWindow({ vref, ifb, bottom: { lo: bottomLo, hi: bottomHi }, biasRatio: 0 });
  const count = 1 + Math.floor(random() * 8);
  let allowed: AllowedValues;
  if (random() < 0.25) {
    // A random stock list: 6 to 25 values spread over 10 Ω … 1 MΩ.
    const values = Array.from({ length: 6 + Math.floor(random() * 20) }, () => Number((10 ** (1 + random() * 5)).toPrecision(3)));
    allowed = allowedFromStock(values, 1, 1e6);
  } else {
    const names = maxParts === 3 ? SERIES[Math.floor(random() * 3)]! : SERIES[Math.floor(random() * SERIES.length)]!;
    // Fewer decades for three-part legs keep the brute force (legs² pairs) quick.
    const decades = maxParts === 3 ? 1.5 : 3;
    const from = bottomLo / 10 ** (random() * 0.5);
    allowed = allowedFromSeries(names, from, from * 10 ** decades);
  }
  return { vref, target, ifb, window, count, allowed };
}

describe('fixed divider search equals brute force', () => {
  for (const maxParts of [2, 3] as const) {
    // Three-part brute force is legs² ≈ 10^5–10^6 pairs a target: fewer targets, and a generous time limit.
    const trials = maxParts === 2 ? 60 : 25;
    it(`agrees on ${trials} random targets, series, stock lists and windows (parts ≤ ${maxParts})`, { timeout: 120_000 }, () => {
      const random = seedrandom(`divider-${maxParts}`);
      let compared = 0;
      for (let trial = 0; trial < trials; trial++) {
        const c = randomCase(random, maxParts);
        const fast = searchFixedDividers({ vref: c.vref, vout: c.target, ifb: c.ifb, allowed: c.allowed, window: c.window, maxParts, count: c.count });
        const brute = bruteForce(c.vref, c.target, c.ifb, c.allowed, c.window, maxParts, c.count);
        expect(fast.map((e) => e.key)).toEqual(brute.map((e) => e.key));
        for (const e of fast) expect(e.item.vout).toBe(dividerVout(c.vref, e.item.top.ohms, e.item.bottom.ohms, c.ifb));
        compared += brute.length;
      }
      expect(compared).toBeGreaterThan(trials); // the comparison was not vacuous
    });
  }

  it('three-part legs beat or equal one-resistor legs on every random target', () => {
    const random = seedrandom('three-beats-two');
    for (let trial = 0; trial < 40; trial++) {
      const c = randomCase(random, 3);
      const two = searchFixedDividers({ vref: c.vref, vout: c.target, ifb: c.ifb, allowed: c.allowed, window: c.window, maxParts: 2, count: 1 });
      const three = searchFixedDividers({ vref: c.vref, vout: c.target, ifb: c.ifb, allowed: c.allowed, window: c.window, maxParts: 3, count: 1 });
      if (two.length === 0) continue;
      expect(three[0]!.key.score).toBeLessThanOrEqual(two[0]!.key.score);
    }
  });

  it('a value exactly on the ideal ratio is found with zero error (E96: 1.25 V, 11.8 k over 1.37 k → 12.016 V)', () => {
    // 1.25 × (1 + 11800/1370) = 12.016423…: ask for exactly that and the pair must come back with score 0.
    const target = 1.25 * (1 + 11800 / 1370);
    const allowed = allowedFromSeries(['E96'], 100, 1e6);
    const window = bottomWindow({ vref: 1.25, ifb: 0, bottom: { lo: 1e3, hi: 2e3 }, biasRatio: 0 });
    const [first] = searchFixedDividers({ vref: 1.25, vout: target, ifb: 0, allowed, window, maxParts: 2, count: 1 });
    expect(first!.key.score).toBe(0);
    expect(first!.item.top.ohms / first!.item.bottom.ohms).toBeCloseTo(11800 / 1370, 12);
  });
});
