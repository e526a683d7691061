// The divider picker against hand arithmetic, the bias-current term, stock lists, impossible requests and the
// adjustable-output guarantee checked by enumerating every tolerance corner independently of the code.
import { describe, expect, it } from 'vitest';
import { ImpossibleError, InputError } from '../src/errors.js';
import { DIVIDER_DEFAULTS, pickDivider, type DividerRequest, type FixedDividerResult, type AdjustableDividerResult } from '../src/pick/divider.js';

const base: DividerRequest = {
  vref: 1.25,
  vout: { lo: 12, hi: 12 },
  ifb: 0,
  series: ['E24', 'E96'],
  maxParts: 2,
  bottom: { lo: 3300, hi: 3300 },
  minOhms: 1,
  maxOhms: 1e6,
  biasRatio: 100,
  vrefTolerance: 0.01,
  maxError: 0.05,
  count: 4,
};
const fixed = (r: Partial<DividerRequest>): FixedDividerResult => pickDivider({ ...base, ...r }) as FixedDividerResult;

describe('hand-worked example: Vref 1.25 V, Rbottom 3.3 kΩ, Vout 12 V', () => {
  // Ideal Rtop = 3.3k × (12/1.25 − 1) = 3.3k × 8.6 = 28.38 kΩ, between the E96 values 28.0 k and 28.7 k
  // (IEC 60063:2015 Table 2 has 2.80 and 2.87); the next E96 values out are 27.4 k and 29.4 k.
  //   28.7 k: 1.25 × (1 + 28.7/3.3) = 1.25 × 9.696970 = 12.121212 V, error +1.0101 %
  //   28.0 k: 1.25 × (1 + 28.0/3.3) = 1.25 × 9.484848 = 11.856061 V, error −1.1995 %
  //   27.4 k: 1.25 × (1 + 27.4/3.3) = 1.25 × 9.303030 = 11.628788 V, error −3.0934 %
  //   29.4 k: 1.25 × (1 + 29.4/3.3) = 1.25 × 9.909091 = 12.386364 V, error +3.2197 %
  //   (E24's 27 k and 30 k give 11.477273 V and 12.613636 V: further out, −4.36 % and +5.11 %.)
  const result = fixed({});
  it('ranks 28.7 k, 28.0 k, 27.4 k, 29.4 k (all E96; 3.3 k is E24)', () => {
    expect(result.candidates.map((c) => c.top)).toEqual([28700, 28000, 27400, 29400]);
    expect(result.candidates.map((c) => c.vout)).toEqual([12.121212, 11.856061, 11.628788, 12.386364].map((v) => expect.closeTo(v, 6)));
    expect(result.candidates.map((c) => c.errorPct)).toEqual([1.0101, -1.1995, -3.0934, 3.2197].map((v) => expect.closeTo(v, 4)));
    expect(result.candidates[0]!.series).toBe('E96');
    expect(result.candidates[0]!.parts.find((p) => p.leg === 'bottom')!.series).toBe('E24');
  });
  it('divider current, dissipation and worst case of 28.7 k / 3.3 k by hand', () => {
    const c = result.candidates[0]!;
    // I = 1.25/3300 = 378.79 µA; P(bottom) = 1.25²/3300 = 473.5 µW; P(top) = (12.121212 − 1.25)²/28700 = 10.871212²/28700 = 4.11788 mW.
    expect(c.dividerCurrent).toBeCloseTo(378.788e-6, 9);
    expect(c.parts.find((p) => p.leg === 'bottom')!.powerW).toBeCloseTo(473.485e-6, 9);
    expect(c.parts.find((p) => p.leg === 'top')!.powerW).toBeCloseTo(4.11788e-3, 8);
    // Worst case, ±1 % resistors (E96 default) and ±1 % Vref: Vout rises with Vref and Rtop and falls with Rbottom.
    // max = 1.2625 × (1 + 28.987/3.267) = 12.464242 V; min = 1.2375 × (1 + 28.413/3.333) = 11.786937 V.
    expect(c.worstCase.max).toBeCloseTo(1.2625 * (1 + 28.987 / 3.267), 9);
    expect(c.worstCase.min).toBeCloseTo(1.2375 * (1 + 28.413 / 3.333), 9);
  });
  it('with the default limit (the 1 % resistor tolerance) 28.7 k at +1.01 % is too far: an impossible request', () => {
    expect(() => fixed({ maxError: undefined })).toThrow(ImpossibleError);
    expect(() => fixed({ maxError: undefined })).toThrow(/no divider within ±1\.00 % of 12\.00 V \(best 1\.01 %\)/);
  });
});

describe('feedback-pin bias current: Vout = Vref·(1 + Rtop/Rbottom) + Ifb·Rtop', () => {
  it('a current into the pin raises the output by Ifb·Rtop: +100 nA × 28.7 kΩ = +2.87 mV (+0.0239 % of 12 V)', () => {
    const c = fixed({ ifb: 100e-9 }).candidates.find((x) => x.top === 28700)!;
    expect(c.vout).toBeCloseTo(12.121212 + 2.87e-3, 6);
    expect(c.ifbShiftPct).toBeCloseTo((2.87e-3 / 12) * 100, 8);
  });
  it('a current out of the pin lowers it: −100 nA gives 12.121212 − 0.00287 V', () => {
    const c = fixed({ ifb: -100e-9 }).candidates.find((x) => x.top === 28700)!;
    expect(c.vout).toBeCloseTo(12.121212 - 2.87e-3, 6);
    expect(c.ifbShiftPct).toBeLessThan(0);
  });
  it('the search compensates: a large Ifb moves the best top value down (ideal 10.75 V/(I + Ifb))', () => {
    // Ifb = 3 µA with a 3.3 k bottom: ideal Rtop = 10.75/(378.79 µA + 3 µA) = 28.157 kΩ, so 28.0 k now wins over 28.7 k.
    const result = fixed({ ifb: 3e-6, biasRatio: 0 });
    expect(result.candidates[0]!.top).toBe(28000);
  });
  it('the 100× rule caps the bottom resistor: Ifb 1 µA with Vref 1.25 V allows at most 12.5 kΩ', () => {
    const result = fixed({ ifb: 1e-6, bottom: { lo: 1e3, hi: 100e3 } });
    expect(result.settings.window.hi).toBeCloseTo(12500, 6);
    for (const c of result.candidates) expect(c.bottom).toBeLessThanOrEqual(12500);
    expect(() => fixed({ ifb: 1e-6, bottom: { lo: 20e3, hi: 100e3 } })).toThrow(/feedback-pin rule/);
  });
});

describe('stock list', () => {
  it('uses only stocked values', () => {
    const stock = [1000, 2200, 4700, 10000, 22000, 47000, 100000];
    const result = fixed({ stock, bottom: { lo: 1e3, hi: 100e3 }, maxError: 0.2, count: 10 });
    expect(result.candidates.length).toBeGreaterThan(3);
    for (const c of result.candidates) for (const p of c.parts) expect(stock).toContain(p.ohms);
    // The best error against a scan of all 49 (top, bottom) pairs of the list.
    let bestError = Infinity;
    for (const top of stock) for (const bottom of stock) bestError = Math.min(bestError, Math.abs(1.25 * (1 + top / bottom) - 12) / 12);
    expect(Math.abs(result.candidates[0]!.errorPct) / 100).toBeCloseTo(bestError, 12);
  });
});

describe('impossible and malformed requests', () => {
  it('Vout at or below Vref', () => {
    expect(() => fixed({ vout: { lo: 1.25, hi: 1.25 } })).toThrow(/at or below the reference/);
    expect(() => fixed({ vout: { lo: 1, hi: 1 } })).toThrow(ImpossibleError);
  });
  it('an empty window', () => {
    expect(() => fixed({ bottom: { lo: 1e3, hi: 2e3 }, current: { lo: 10e-3, hi: 20e-3 } })).toThrow(/no bottom resistor/);
    // 10 mA … 20 mA from 1.25 V needs 62.5 Ω … 125 Ω, outside 1 k … 2 k.
  });
  it('a range without a pot, and a pot without a range', () => {
    expect(() => fixed({ vout: { lo: 3, hi: 12 } })).toThrow(InputError);
    expect(() => fixed({ pot: { ohms: 1e4, tolerance: 0.2, leg: 'top' } })).toThrow(InputError);
  });
});

// Independent corner enumeration: Vout at a wiper end for every ± combination of Vref, Rtop, Rbottom and the pot.
function cornerRange(vref: number, rt: number, rb: number, pot: number, leg: 'top' | 'bottom', t: number, tp: number, tv: number) {
  let lowWorst = -Infinity;
  let highWorst = Infinity;
  for (const sv of [-1, 1]) for (const st of [-1, 1]) for (const sb of [-1, 1]) for (const sp of [-1, 1]) {
    const v = vref * (1 + sv * tv);
    const top = rt * (1 + st * t);
    const bottom = rb * (1 + sb * t);
    const p = pot * (1 + sp * tp);
    const out = (rtop: number, rbot: number): number => v * (1 + rtop / rbot);
    const low = leg === 'top' ? out(top, bottom) : out(top, bottom + p);
    const high = leg === 'top' ? out(top + p, bottom) : out(top, bottom);
    lowWorst = Math.max(lowWorst, low);
    highWorst = Math.min(highWorst, high);
  }
  return { low: lowWorst, high: highWorst };
}

describe('adjustable output: every unit covers the range', () => {
  for (const [leg, pot] of [['top', 100e3], ['bottom', 100e3], ['top', 50e3]] as const) {
    it(`3.3 … 24 V with a ${pot / 1e3} k pot in the ${leg} leg: each candidate's corners cover the range`, () => {
      const result = pickDivider({
        ...base,
        series: ['E96'],
        vout: { lo: 3.3, hi: 24 },
        bottom: DIVIDER_DEFAULTS.bottom,
        maxError: undefined,
        count: 10,
        pot: { ohms: pot, tolerance: 0.2, leg },
      }) as AdjustableDividerResult;
      expect(result.candidates.length).toBeGreaterThan(0);
      for (const c of result.candidates) {
        const corners = cornerRange(1.25, c.top, c.bottom, pot, leg, 0.01, 0.2, 0.01);
        expect(corners.low).toBeLessThanOrEqual(3.3 * (1 + 1e-12));
        expect(corners.high).toBeGreaterThanOrEqual(24 * (1 - 1e-12));
        expect(c.guaranteed.low).toBeCloseTo(corners.low, 9);
        expect(c.guaranteed.high).toBeCloseTo(corners.high, 9);
        expect(c.travelUsedPct).toBeLessThanOrEqual(100);
      }
      // Ranked by travel used (less waste first).
      const used = result.candidates.map((c) => c.travelUsedPct);
      expect([...used].sort((a, b) => b - a)).toEqual(used);
    });
  }

  it('the best travel used equals a brute force over every (top, bottom) pair of E96 values', () => {
    const request = { ...base, series: ['E96' as const], vout: { lo: 3.3, hi: 24 }, bottom: DIVIDER_DEFAULTS.bottom, maxError: undefined, count: 1 };
    for (const leg of ['top', 'bottom'] as const) {
      const pot = 100e3;
      const result = pickDivider({ ...request, pot: { ohms: pot, tolerance: 0.2, leg } }) as AdjustableDividerResult;
      const e96 = [1.0, 1.02, 1.05, 1.07, 1.1, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.3, 1.33, 1.37, 1.4, 1.43, 1.47, 1.5, 1.54, 1.58, 1.62, 1.65, 1.69, 1.74, 1.78, 1.82, 1.87, 1.91, 1.96, 2.0, 2.05, 2.1, 2.15, 2.21, 2.26, 2.32, 2.37, 2.43, 2.49, 2.55, 2.61, 2.67, 2.74, 2.8, 2.87, 2.94, 3.01, 3.09, 3.16, 3.24, 3.32, 3.4, 3.48, 3.57, 3.65, 3.74, 3.83, 3.92, 4.02, 4.12, 4.22, 4.32, 4.42, 4.53, 4.64, 4.75, 4.87, 4.99, 5.11, 5.23, 5.36, 5.49, 5.62, 5.76, 5.9, 6.04, 6.19, 6.34, 6.49, 6.65, 6.81, 6.98, 7.15, 7.32, 7.5, 7.68, 7.87, 8.06, 8.25, 8.45, 8.66, 8.87, 9.09, 9.31, 9.53, 9.76];
      // IEC 60063:2015 Table 2, typed here independently of series/E96.json; 1 Ω … 1 MΩ.
      const values = [1e6];
      for (let e = 0; e < 6; e++) for (const s of e96) values.push(Math.round(s * 100) * 10 ** (e - 2));
      let best = 0;
      for (const rb of values) {
        if (rb < 1e3 || rb > 100e3) continue;
        for (const rt of [0, ...values]) {
          if (leg === 'bottom' && rt === 0) continue;
          const g = cornerRange(1.25, rt, rb, pot, leg, 0.01, 0.2, 0.01);
          if (g.low > 3.3 * (1 + 1e-12) || g.high < 24 * (1 - 1e-12)) continue;
          const span = leg === 'top' ? 1.25 * (1 + (rt + pot) / rb) - 1.25 * (1 + rt / rb) : 1.25 * (1 + rt / rb) - 1.25 * (1 + rt / (rb + pot));
          best = Math.max(best, (24 - 3.3) / span);
        }
      }
      expect(best).toBeGreaterThan(0);
      expect(result.candidates[0]!.travelUsedPct / 100).toBeCloseTo(best, 9);
    }
  });

  it('a pot too small for the range is an impossible request', () => {
    expect(() => pickDivider({ ...base, series: ['E96'], vout: { lo: 3.3, hi: 24 }, bottom: DIVIDER_DEFAULTS.bottom, pot: { ohms: 10e3, tolerance: 0.2, leg: 'top' } })).toThrow(
      /no fixed resistors let a 10\.0 kΩ/,
    );
  });
});
