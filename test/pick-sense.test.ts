// The current-limit picker against brute force, hand arithmetic and the physics it must show.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { diffLimit } from '../src/circuits/sense/diff.js';
import { noninvLimit } from '../src/circuits/sense/noninv.js';
import { thresholdFromReference } from '../src/circuits/sense/threshold-divider.js';
import { ImpossibleError } from '../src/errors.js';
import { paretoFront } from '../src/pick/pareto.js';
import { pickSense, type SenseRequest } from '../src/pick/sense.js';
import { nearestRatioPairs } from '../src/pick/sense/ratio-pairs.js';
import { seriesValuesBetween } from '../src/series/enumerate.js';
import { loadShunts } from '../src/series/load.js';

const E24 = seriesValuesBetween('E24', 1e3, 100e3);
const E96 = seriesValuesBetween('E96', 1e3, 1e6);

function request(over: Partial<SenseRequest> = {}): SenseRequest {
  return {
    limit: 3,
    topology: 'noninv',
    threshold: { kind: 'fixed', volts: 1, tolerance: 0.01 },
    shunts: loadShunts().values,
    shuntTolerance: 0.01,
    shuntRatingW: 1,
    derating: 0.5,
    resistorValues: E96,
    resistorTolerance: 0.01,
    rail: 5,
    headroom: 0.2,
    amplifierOffset: 1e-3,
    compareOffset: 0,
    biasCurrent: plusMinus(0),
    commonMode: 0,
    ...over,
  };
}

/** A bias-current band about zero, ±x (src/units/current-band.ts). */
function plusMinus(x: number): SenseRequest['biasCurrent'] {
  return { nominal: 0, lo: -x, hi: x, form: 'plus-minus' };
}

function impossible(run: () => unknown): ImpossibleError {
  try {
    run();
  } catch (error) {
    if (error instanceof ImpossibleError) return error;
    throw error;
  }
  throw new Error('expected an ImpossibleError');
}

describe('ratio search agrees with brute force over all pairs', () => {
  it('E24 1 k–100 k, any target ratio: same least error and the same set of tied pairs', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.02, max: 50, noNaN: true }), (target) => {
        const score = (n: number, d: number): number => Math.abs(n / d / target - 1);
        const fast = nearestRatioPairs(E24, target, score);
        let least = Infinity;
        for (const n of E24) for (const d of E24) least = Math.min(least, score(n, d));
        const ties = new Set<string>();
        for (const n of E24) for (const d of E24) if (score(n, d) <= least + 1e-9) ties.add(`${n}/${d}`);
        expect(fast[0]!.error).toBe(least);
        expect(new Set(fast.map((p) => `${p.numerator}/${p.denominator}`))).toEqual(ties);
      }),
      { numRuns: 200 },
    );
  });
});

describe('pickSense against brute force', () => {
  it('noninv: for each shunt, the picked RF/RG gives the least nominal limit error of all E24 pairs (noninvLimit)', () => {
    const req = request({ resistorValues: E24, amplifierOffset: 0 });
    const pick = pickSense(req);
    expect(pick.candidates.length).toBeGreaterThan(5);
    for (const c of pick.candidates) {
      let least = Infinity;
      for (const rf of E24) {
        for (const rg of E24) {
          const limit = noninvLimit({ shunt: c.parts['RS']!, feedback: rf, ground: rg, threshold: 1, amplifierOffset: 0, biasCurrent: 0, compareOffset: 0 });
          least = Math.min(least, Math.abs(limit / 3 - 1));
        }
      }
      expect(Math.abs(c.errorPct) / 100).toBeCloseTo(least, 12);
    }
  });

  it('diff: same with R2/R1 (R3 = R1, R4 = R2) against diffLimit', () => {
    const pick = pickSense(request({ topology: 'diff', resistorValues: E24, amplifierOffset: 0 }));
    for (const c of pick.candidates) {
      expect(c.parts['R3']).toBe(c.parts['R1']);
      expect(c.parts['R4']).toBe(c.parts['R2']);
      let least = Infinity;
      for (const r2 of E24) {
        for (const r1 of E24) {
          const limit = diffLimit({ shunt: c.parts['RS']!, r1, r2, r3: r1, r4: r2, commonMode: 0, threshold: 1, amplifierOffset: 0, biasCurrent: 0, compareOffset: 0 });
          least = Math.min(least, Math.abs(limit / 3 - 1));
        }
      }
      expect(Math.abs(c.errorPct) / 100).toBeCloseTo(least, 12);
    }
  });

  it('direct with a threshold divider: the picked RT1/RT2 is the best of all E24 pairs for Rs·I', () => {
    const pick = pickSense(request({ topology: 'direct', threshold: { kind: 'divider', reference: 1.25, tolerance: 0.005 }, resistorValues: E24, compareOffset: 0 }));
    for (const c of pick.candidates) {
      const wanted = c.parts['RS']! * 3;
      let least = Infinity;
      for (const rt1 of E24) for (const rt2 of E24) least = Math.min(least, Math.abs(thresholdFromReference(1.25, rt1, rt2) / wanted - 1));
      expect(Math.abs(c.errorPct) / 100).toBeCloseTo(least, 12);
    }
  });

  it('the quick worst case equals a brute-force grid over the tolerance box (diff, high side, 3 levels × 9 variables)', () => {
    // Vertex enumeration is exact for a transfer monotonic in each variable: a 3^9 grid that includes the
    // vertices and every mid-point must find nothing outside it.
    const req = request({ topology: 'diff', shunts: [0.05], commonMode: 12, rail: 20, amplifierOffset: 1e-3, biasCurrent: plusMinus(50e-9), compareOffset: 2e-3 });
    const c = pickSense(req).candidates[0]!;
    const nominal = [c.parts['RS']!, c.parts['R1']!, c.parts['R2']!, c.parts['R3']!, c.parts['R4']!, 1, 0, 0, 0];
    const half = [0.01, 0.01, 0.01, 0.01, 0.01, 0.01].map((t, i) => nominal[i]! * t).concat([1e-3, 50e-9, 2e-3]);
    let min = Infinity;
    let max = -Infinity;
    const x = new Array<number>(9);
    for (let k = 0; k < 3 ** 9; k++) {
      let code = k;
      for (let i = 0; i < 9; i++) {
        x[i] = nominal[i]! + ((code % 3) - 1) * half[i]!;
        code = Math.floor(code / 3);
      }
      const limit = diffLimit({ shunt: x[0]!, r1: x[1]!, r2: x[2]!, r3: x[3]!, r4: x[4]!, threshold: x[5]!, amplifierOffset: x[6]!, biasCurrent: x[7]!, compareOffset: x[8]!, commonMode: 12 });
      min = Math.min(min, limit);
      max = Math.max(max, limit);
    }
    expect(c.worstCase.min).toBeCloseTo(min, 12);
    expect(c.worstCase.max).toBeCloseTo(max, 12);
  });
});

describe('figures by hand', () => {
  it('noninv, 50 mΩ at 3 A: loss 0.45 W, shunt voltage 150 mV, offset error 1 mV/150 mV = 0.667 %', () => {
    const c = pickSense(request({ shunts: [0.05] })).candidates[0]!;
    // Gain 1 V/0.15 V = 6.667: 113 k/20 k gives 1 + 5.65 = 6.65, limit 3·6.6667/6.65 = 3.00752 A (hand arithmetic).
    expect(c.parts).toEqual({ RS: 0.05, RF: 113e3, RG: 20e3 });
    expect(c.limit).toBeCloseTo(3.0075188, 6);
    expect(c.shuntLossW).toBeCloseTo(c.limit ** 2 * 0.05, 12);
    expect(c.shuntLossW).toBeCloseTo(0.4523, 4);
    // Vos moves the limit by Vos/Rs = 1 mV/50 mΩ = 20 mA, i.e. 0.667 % of 3 A.
    expect(c.offsetErrorPct).toBeCloseTo(0.6667, 4);
  });

  it('noninv bias current: the picker moves to the lower-value pair of the same ratio, and Ib·RF/(G·Rs) by hand', () => {
    const c = pickSense(request({ shunts: [0.05], biasCurrent: plusMinus(100e-9) })).candidates[0]!;
    // 113 k/20 k and 11.3 k/2 k give the same gain 6.65; with bias current the lower pair has a tenth of the error.
    expect(c.parts).toEqual({ RS: 0.05, RF: 11.3e3, RG: 2e3 });
    // Ib·RF = 100e-9·11.3e3 = 1.13 mV; / 6.65 = 0.16992 mV; / 0.05 Ω = 3.398 mA; / 3 A = 0.11328 %;
    // plus Vos's 0.66667 % = 0.77995 % (hand arithmetic).
    expect(c.offsetErrorPct).toBeCloseTo(0.77995, 4);
  });

  it('√20 ≈ 4.47 A: a 0.1 Ω 2 W shunt at full rating passes 4.47 A and fails 4.48 A on its rating', () => {
    const base = { topology: 'direct' as const, threshold: { kind: 'fixed' as const, volts: 0.447, tolerance: 0.01 }, shunts: [0.1], shuntRatingW: 2, derating: 1, compareOffset: 0 };
    expect(pickSense(request({ ...base, limit: 4.47 })).candidates).toHaveLength(1);
    const error = impossible(() => pickSense(request({ ...base, limit: 4.48 })));
    expect(error.where).toBe('--shunt-rating');
    // At the common-practice 50 % derating the same shunt stops at √10 ≈ 3.16 A.
    expect(impossible(() => pickSense(request({ ...base, derating: 0.5, limit: 3.17 }))).where).toBe('--shunt-rating');
  });
});

describe('high side against low side', () => {
  it('1 % resistors at 24 V common mode spread the limit far more than low-side at the same gain', () => {
    const low = pickSense(request({ topology: 'diff', shunts: [0.05], rail: 30 })).candidates[0]!;
    const high = pickSense(request({ topology: 'diff', shunts: [0.05], rail: 30, commonMode: 24 })).candidates[0]!;
    expect(high.gain).toBe(low.gain);
    // First order: worst common-mode gain 4t·G/(1+G) = 0.04·6.667/7.667 = 0.0348 (from memory, see
    // sense-circuits.test.ts); × 24 V = 0.835 V against a 1 V threshold, i.e. about 83 % on top of the ~4.9 %.
    expect(low.worstCaseSpreadPct).toBeLessThan(6);
    expect(high.worstCaseSpreadPct).toBeGreaterThan(80);
    expect(high.worstCaseSpreadPct).toBeLessThan(95);
  });
});

describe('impossible requests', () => {
  it('a threshold above what the amplifier output can reach', () => {
    const error = impossible(() => pickSense(request({ threshold: { kind: 'fixed', volts: 4.5, tolerance: 0.01 } })));
    expect(error.where).toBe('--threshold');
    expect(error.message).toMatch(/5\.40 V/);
  });
  it('a limit whose shunt voltage is under 10× the offset', () => {
    const error = impossible(() => pickSense(request({ limit: 0.01, amplifierOffset: 5e-3 })));
    expect(error.where).toBe('--limit');
  });
  it('no shunt within the loss budget', () => {
    const error = impossible(() => pickSense(request({ limit: 10, maxLossW: 0.05 })));
    expect(error.where).toBe('--max-loss');
    // Smallest shunt 1 mΩ at 10 A: 0.1 W; the budget needs 0.05/100 = 0.5 mΩ.
    expect(error.message).toMatch(/100 mW/);
    expect(error.remedy).toMatch(/500 µΩ/);
  });
  it('high side with the amplifier powered below the common mode', () => {
    expect(impossible(() => pickSense(request({ topology: 'diff', commonMode: 24 }))).where).toBe('--common-mode');
  });
});

describe('Pareto front of two minimised objectives', () => {
  it('agrees with the definition (no item is ≤ in both and < in one) on random sets', () => {
    const point = fc.record({ a: fc.integer({ min: 0, max: 20 }), b: fc.integer({ min: 0, max: 20 }) });
    fc.assert(
      fc.property(fc.array(point, { maxLength: 40 }), (items) => {
        const front = new Set(paretoFront(items, (p) => p.a, (p) => p.b));
        for (const p of items) {
          const dominated = items.some((q) => q.a <= p.a && q.b <= p.b && (q.a < p.a || q.b < p.b));
          expect(front.has(p)).toBe(!dominated);
        }
      }),
    );
  });
  it('the picker front is sorted by loss with spread falling', () => {
    const pick = pickSense(request());
    for (let i = 1; i < pick.pareto.length; i++) {
      expect(pick.pareto[i]!.shuntLossW).toBeGreaterThan(pick.pareto[i - 1]!.shuntLossW);
      expect(pick.pareto[i]!.worstCaseSpreadPct).toBeLessThan(pick.pareto[i - 1]!.worstCaseSpreadPct);
    }
  });
});

describe('edge cases', () => {
  it('zero tolerances and offsets: the worst case collapses onto the nominal, and loss decides the ranking', () => {
    const pick = pickSense(request({ shuntTolerance: 0, resistorTolerance: 0, threshold: { kind: 'fixed', volts: 1, tolerance: 0 }, amplifierOffset: 0 }));
    for (const c of pick.candidates) {
      expect(c.worstCase.min).toBe(c.limit);
      expect(c.worstCase.max).toBe(c.limit);
    }
    const exact = pick.candidates.filter((c) => Math.abs(c.errorPct) < 1e-9);
    const losses = exact.map((c) => c.shuntLossW);
    expect(losses).toEqual([...losses].sort((x, y) => x - y));
  });
  it('a window holding one value: only that gain is reachable, and the request says so', () => {
    const error = impossible(() => pickSense(request({ resistorValues: [1.5e3] })));
    expect(error.where).toBe('--threshold');
    expect(error.message).toMatch(/2\.000–2\.000/);
  });
  it('a threshold from a reference below it is impossible', () => {
    expect(impossible(() => pickSense(request({ threshold: { kind: 'divider', reference: 0.8, tolerance: 0.01, volts: 1 } }))).where).toBe('--threshold');
  });
});

describe('loss at the worst-case limit', () => {
  it('is I²R at the worst-case highest limit (Joule), above the nominal loss', () => {
    for (const c of pickSense(request()).candidates) {
      expect(c.worstCaseLossW).toBeCloseTo(c.worstCase.max ** 2 * c.parts['RS']!, 12);
      expect(c.worstCaseLossW).toBeGreaterThan(c.shuntLossW);
    }
  });
});
