// resolveDesign: "auto" values filled with the pickers' best, grades and overrides applied, the SupplySpec the
// engine gets, and the BOM power at the operating point. Expected values come from hand arithmetic (written out
// beside each), a brute-force search over the E96 series (IEC 60063:2015 Table 2) and vertex enumeration of the
// divider formula Vout = Vref·(1 + Rtop/Rbottom) + Ifb·Rtop.
import { describe, expect, it } from 'vitest';
import { cornerExtremes } from '../src/analysis/corners.js';
import { dividerVout } from '../src/circuits/divider.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { ImpossibleError, InputError } from '../src/errors.js';
import { pickSense } from '../src/pick/sense.js';
import { loadShunts } from '../src/series/load.js';
import { seriesValuesBetween } from '../src/series/enumerate.js';
import { baseDesign } from './design-fixture.js';

const resolve = (d: Record<string, unknown>) => resolveDesign(validateDesign(d));
const line = (r: ReturnType<typeof resolve>, designator: string) => r.bom.find((l) => l.designator === designator)!;

describe('BOM power at the operating point (hand arithmetic)', () => {
  it('noninv: divider at 5 V, shunt and gain resistors at the 1 A limit', () => {
    // Vref 1.25 V, RTOP 30k, RBOT 10k: Vout = 1.25·(1 + 3) = 5 V; I = 1.25/10k = 125 µA;
    // P(RTOP) = (125e-6)²·30e3 = 4.6875e-4 W; P(RBOT) = (125e-6)²·10e3 = 1.5625e-4 W.
    // Gain 1 + 9k/1k = 10, threshold 1.0 V, RS 0.1 Ω: limit = 1.0/(10·0.1) = 1 A; P(RS) = 1²·0.1 = 0.1 W.
    // Amplifier output at the limit 1.0 V across RF + RG = 10k: 100 µA; P(RF) = 1e-8·9e3 = 9e-5 W, P(RG) = 1e-5 W.
    const r = resolve(baseDesign());
    expect(r.nominal['vout']).toBeCloseTo(5, 12);
    expect(r.nominal['ilimit']).toBeCloseTo(1, 12);
    expect(line(r, 'RTOP').powerW).toBeCloseTo(4.6875e-4, 15);
    expect(line(r, 'RBOT').powerW).toBeCloseTo(1.5625e-4, 15);
    expect(line(r, 'RS').powerW).toBeCloseTo(0.1, 12);
    expect(line(r, 'RS').ratingW).toBe(1);
    expect(line(r, 'RF').powerW).toBeCloseTo(9e-5, 15);
    expect(line(r, 'RG').powerW).toBeCloseTo(1e-5, 15);
    expect(line(r, 'RTOP').code).toBe('30K');
    expect(line(r, 'RS').code).toBe('R10');
    expect(line(r, 'RTOP').series).toBe('E24'); // 3.0 is in E24 (IEC 60063 Table 1), not in E12
    // 1.0 is in E3 (IEC 60063 Table 1), but E3 is not sold at 1 %: the first series commonly sold at 1 % is E24
    expect(line(r, 'RBOT').series).toBe('E24');
  });

  it('diff, high side at 12 V: each branch current by hand', () => {
    // RS 0.1 Ω, R1 = R3 = 1k, R2 = R4 = 10k (gain 10), Vcm 12 V, threshold 1.0 V: limit 1 A.
    // Vp = 12 + 1·0.1 = 12.1 V; I(R3,R4) = 12.1/11k = 1.1 mA; P(R3) = 1.21e-6·1e3 = 1.21e-3 W; P(R4) = 1.21e-2 W.
    // V− = V+ = 1.1 mA·10k = 11 V; I(R1,R2) = (12 − 11)/1k = 1 mA; P(R1) = 1e-3 W; P(R2) = 1e-2 W.
    // Output 11 − 1 mA·10k = 1.0 V = threshold, as it must be at the limit.
    const d = baseDesign();
    d.current.topology = 'diff';
    d.current.commonMode = '12 V';
    d.current.amplifier.rail = '24 V';
    d.current.gain = { r1: '1k', r2: '10k', r3: '1k', r4: '10k' };
    const r = resolve(d);
    expect(r.nominal['ilimit']).toBeCloseTo(1, 12);
    expect(r.nominal['ampOutput']).toBeCloseTo(1, 12);
    expect(line(r, 'R1').powerW).toBeCloseTo(1e-3, 12);
    expect(line(r, 'R2').powerW).toBeCloseTo(1e-2, 12);
    expect(line(r, 'R3').powerW).toBeCloseTo(1.21e-3, 12);
    expect(line(r, 'R4').powerW).toBeCloseTo(1.21e-2, 12);
  });

  it('threshold divider from a 2.5 V reference', () => {
    // RT1 15k, RT2 10k from 2.5 V: threshold 2.5·10/25 = 1.0 V; I = 2.5/25k = 100 µA;
    // P(RT1) = 1e-8·15e3 = 1.5e-4 W; P(RT2) = 1e-4 W.
    const d = baseDesign();
    d.current.threshold = { reference: '2.5 V', tolerance: '0.5%', top: '15k', bottom: '10k' };
    const r = resolve(d);
    expect(r.nominal['ilimit']).toBeCloseTo(1, 12);
    expect(line(r, 'RT1').powerW).toBeCloseTo(1.5e-4, 15);
    expect(line(r, 'RT2').powerW).toBeCloseTo(1e-4, 15);
  });
});

describe('"auto" values come from the pickers', () => {
  it('auto divider: no E96 pair with the bottom in the window lands closer (brute force)', () => {
    const d = baseDesign();
    d.voltage.target = '3.3 V';
    d.voltage.divider = 'auto';
    d.voltage.search = { series: 'E96', bottom: '10k..20k' };
    const r = resolve(d);
    const top = line(r, 'RTOP').ohms;
    const bottom = line(r, 'RBOT').ohms;
    const picked = Math.abs(dividerVout(1.25, top, bottom, 0) - 3.3);
    let best = Infinity;
    for (const b of seriesValuesBetween('E96', 10e3, 20e3)) {
      for (const t of seriesValuesBetween('E96', 1, 1e6)) best = Math.min(best, Math.abs(dividerVout(1.25, t, b, 0) - 3.3));
    }
    expect(picked).toBeLessThanOrEqual(best * (1 + 1e-12));
    expect(bottom).toBeGreaterThanOrEqual(10e3);
    expect(bottom).toBeLessThanOrEqual(20e3);
  });

  it('auto sense: the sense picker\'s best candidate within the shunt\'s loss limit, landing inside the window', () => {
    const d = baseDesign();
    d.current.shunt = { value: 'auto', rating: '1 W' };
    d.current.gain = 'auto';
    const r = resolve(d);
    const best = pickSense({
      limit: 1,
      topology: 'noninv',
      threshold: { kind: 'fixed', volts: 1, tolerance: 0.01 },
      shunts: loadShunts().values,
      shuntTolerance: 0.01,
      shuntRatingW: 1,
      derating: 0.5,
      resistorValues: seriesValuesBetween('E96', 1e3, 1e6),
      resistorTolerance: 0.01,
      rail: 5,
      headroom: 0.2,
      amplifierOffset: 1e-3,
      compareOffset: 0,
      biasCurrent: { nominal: 0, lo: 0, hi: 0, form: 'typical' },
      commonMode: 0,
      // The best-ranked candidate whose worst-case highest limit keeps I²·RS within 50 % of the 1 W rating (by hand).
    }).candidates.find((c) => c.worstCase.max ** 2 * c.parts['RS']! <= 0.5)!;
    for (const [name, ohms] of Object.entries(best.parts)) expect(line(r, name).ohms).toBe(ohms);
    expect(r.nominal['ilimit']).toBeGreaterThan(0.9);
    expect(r.nominal['ilimit']).toBeLessThan(1.1);
    expect(r.notes.join(' ')).toMatch(/Current sense picked/);
  });

  it('an "auto" shunt needs a rating', () => {
    const d = baseDesign();
    d.current.shunt = { value: 'auto' };
    d.current.gain = 'auto';
    expect(() => resolve(d)).toThrow(/current.shunt.rating|rating/);
  });

  it('an adjustable output covers its range at every tolerance corner (vertex enumeration)', () => {
    const d = baseDesign();
    d.voltage = { target: '2..12 V', pot: { value: '10k', tolerance: '20%' }, divider: 'auto', search: { bottom: '500..5k' } };
    const r = resolve(d);
    const top = r.bom.find((l) => l.designator === 'RTOP')?.ohms ?? 0;
    const bottom = line(r, 'RBOT').ohms;
    const pot = line(r, 'RV').ohms;
    // x = [Vref, RTOP, RBOT, RV] at ±1 %, ±1 %, ±1 %, ±20 %.
    const lo = [1.25 * 0.99, top * 0.99, bottom * 0.99, pot * 0.8];
    const hi = [1.25 * 1.01, top * 1.01, bottom * 1.01, pot * 1.2];
    const lowEnd = cornerExtremes((x) => dividerVout(x[0]!, x[1]!, x[2]!, 0), lo, hi);
    const highEnd = cornerExtremes((x) => dividerVout(x[0]!, x[1]! + x[3]!, x[2]!, 0), lo, hi);
    expect(lowEnd.max).toBeLessThanOrEqual(2);
    expect(highEnd.min).toBeGreaterThanOrEqual(12);
    expect(r.lowEnd).toBeDefined();
    expect(r.spec.windows!.vout![0]).toBe(12);
    expect(r.lowEnd!.windows!.vout![1]).toBe(2);
  });
});

describe('grades and overrides', () => {
  it('default grade, an override grade and an override field, most specific first', () => {
    const d = baseDesign();
    d.resistors = { grade: '1%', overrides: { RTOP: { grade: '0.1%' }, RBOT: { tolerance: '0.5%' }, RS: { tcr: '50ppm' } } };
    const r = resolve(d);
    expect(line(r, 'RTOP').tolerance).toBeCloseTo(0.001, 15);
    expect(line(r, 'RTOP').tcrPerK).toBeCloseTo(25e-6, 15); // the 0.1 % grade's usual TCR (src/design/grades.ts)
    expect(line(r, 'RBOT').tolerance).toBeCloseTo(0.005, 15);
    expect(line(r, 'RBOT').tcrPerK).toBeCloseTo(100e-6, 15); // the default 1 % grade's
    expect(line(r, 'RS').tcrPerK).toBeCloseTo(50e-6, 15);
    expect(line(r, 'RF').tolerance).toBeCloseTo(0.01, 15);
    const top = r.spec.divider!.top.resistors[0];
    expect(top.name).toBe('RTOP');
    expect(top.tolerance).toBeCloseTo(0.001, 15);
  });

  it('the shunt section\'s own tolerance and TCR apply unless overridden', () => {
    const d = baseDesign();
    d.current.shunt.tolerance = '0.5%';
    d.current.shunt.tcr = '75ppm';
    let r = resolve(d);
    expect(line(r, 'RS').tolerance).toBeCloseTo(0.005, 15);
    expect(line(r, 'RS').tcrPerK).toBeCloseTo(75e-6, 15);
    d.resistors.overrides = { RS: { tolerance: '0.1%' } };
    r = resolve(d);
    expect(line(r, 'RS').tolerance).toBeCloseTo(0.001, 15);
  });

  it('costs: the illustrative defaults, replaced per grade by the file', () => {
    const d = baseDesign();
    d.costs = { '0.1%': 12 };
    const r = resolve(d);
    // The illustrative defaults as the schema's description states them; the file's 0.1 % replaces one.
    expect(r.costs).toEqual({ '10%': 1, '5%': 1, '2%': 1.1, '1%': 1.2, '0.5%': 3, '0.25%': 5, '0.1%': 12, '0.05%': 15, '0.02%': 30, '0.01%': 60 });
    expect(r.allowedGrades).toBeUndefined();
    d.resistors.grades = ['0.01%', '5%', '1%'];
    expect(resolve(d).allowedGrades).toEqual(['5%', '1%', '0.01%']);
  });
});

describe('impossible designs are explained', () => {
  it('an output at or below the reference', () => {
    const d = baseDesign();
    d.voltage.target = '1.2 V';
    d.voltage.window = '±2%';
    try {
      resolve(d);
      throw new Error('expected an error');
    } catch (error) {
      expect(error).toBeInstanceOf(ImpossibleError);
      expect((error as ImpossibleError).where).toBe('voltage.target');
    }
  });
  it('a shunt above its derated rating', () => {
    // 0.5 Ω at 1 A: 0.5 W, above 50 % of a 0.5 W rating.
    const d = baseDesign();
    d.current.shunt = { value: 'R50', rating: '0.5 W' };
    d.current.gain = { feedback: '1k', ground: '1k' }; // gain 2: limit 1.0/(2·0.5) = 1 A
    expect(() => resolve(d)).toThrow(ImpossibleError);
  });
  it('an amplifier output beyond its rail at 120 % of the limit', () => {
    const d = baseDesign();
    d.current.threshold.voltage = '4.5 V';
    d.current.gain = { feedback: '44k', ground: '1k' }; // gain 45: 4.5/(45·0.1) = 1 A; 1.2·4.5 = 5.4 V > 4.8 V
    expect(() => resolve(d)).toThrow(/rail/);
  });
  it('a picker\'s complaint names the design-file field, not a command-line option', () => {
    const d = baseDesign();
    d.current.shunt = { value: 'auto', rating: '1 W', candidates: ['100'] };
    d.current.gain = 'auto';
    try {
      resolve(d);
      throw new Error('expected an error');
    } catch (error) {
      expect(error instanceof ImpossibleError || error instanceof InputError).toBe(true);
      const text = `${(error as Error & { where: string }).where} ${(error as Error).message}`;
      expect(text).not.toMatch(/--[a-z]/);
    }
  });
  it('a window narrower than the reference tolerance gets a note', () => {
    const d = baseDesign();
    d.voltage.window = '±0.5%';
    expect(resolve(d).notes.join(' ')).toMatch(/narrower than the reference/);
  });
});
