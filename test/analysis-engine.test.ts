// Worst case against brute-force enumeration, RSS against Monte Carlo and against closed forms, and the supply
// model's fast loop against a clear per-trial reference written straight from the circuit formulas.
import { describe, expect, it } from 'vitest';
import { cornerExtremes } from '../src/analysis/corners.js';
import { evaluateAt, nominalOutputs, type Model } from '../src/analysis/model.js';
import { buildSupplyModel, hotShunt, type SupplySpec } from '../src/analysis/models/supply.js';
import { monteCarlo } from '../src/analysis/monte-carlo.js';
import { rss } from '../src/analysis/rss.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { chunkState, fillXor128 } from '../src/analysis/chunk-random.js';
import { partFromBound, partHigh, partLow, partVaries } from '../src/tolerance/part.js';
import { partFromUnit } from '../src/tolerance/sample.js';
import { InputError } from '../src/errors.js';

/** A high-side LED driver invented for the tests: diff amplifier at 24 V common mode, divided threshold. */
const DIFF_SUPPLY: SupplySpec = {
  reference: { nominal: 0.8, tolerance: 0.015, tempcoPerK: 30e-6 },
  divider: {
    top: { resistors: [{ name: 'R1', nominal: 200e3, tolerance: 0.01, tcrPerK: 100e-6 }, { name: 'R1B', nominal: 1e6, tolerance: 0.05 }], arrangement: 'parallel' },
    bottom: { resistors: [{ name: 'R2', nominal: 10e3, tolerance: 0.01 }], potentiometer: { name: 'VR1', nominal: 5e3, tolerance: 0.2, wiper: 0.3 } },
    feedbackBias: { nominal: 10e-9, plusMinus: 40e-9 },
  },
  temperature: { minC: -20, maxC: 60, monteCarlo: { fixedC: 25 } },
  sense: {
    topology: 'diff',
    shunt: { name: 'RS', nominal: 0.1, tolerance: 0.01, tcrPerK: 200e-6, thermalResistanceKPerW: 80, powerRatingW: 1 },
    r1: { name: 'R3', nominal: 1e3, tolerance: 0.01 },
    r2: { name: 'R4', nominal: 10e3, tolerance: 0.01 },
    r3: { name: 'R5', nominal: 1e3, tolerance: 0.01 },
    r4: { name: 'R6', nominal: 10e3, tolerance: 0.01 },
    commonModeV: 24,
    amplifier: { offsetMax: 0.5e-3, biasCurrent: { nominal: 0, plusMinus: 50e-9 }, railV: 12 },
    threshold: { kind: 'divided', source: 'regulator-reference', top: { name: 'R7', nominal: 3e3, tolerance: 0.01 }, bottom: { name: 'R8', nominal: 12e3, tolerance: 0.01 } },
    compareOffset: { nominal: 0, plusMinus: 1e-3 },
    limitTarget: 0.64,
  },
  windows: { vout: [14, 16], ilimit: [0.55, 0.75] },
};

describe('supply model: the fast loop against a per-trial reference from the circuit formulas', () => {
  const model = buildSupplyModel(DIFF_SUPPLY);
  const index = (name: string): number => model.parts.findIndex((p) => p.name === name);

  /** Reference: one trial, straight formulas, self-heating by plain fixed-point iteration to convergence. */
  function reference(v: (name: string) => number): Record<string, number> {
    const dT = v('T ambient') - 25;
    const r = (name: string, tcr = true): number => v(name) * (model.parts[index(`${name} TCR`)] && tcr ? 1 + v(`${name} TCR`) * dT : 1);
    const vref = v('Vref') * (1 + v('Vref tempco') * dT);
    const r1 = r('R1');
    const r1b = r('R1B');
    const top = (r1 * r1b) / (r1 + r1b);
    const bottom = r('R2') + 0.3 * r('VR1');
    const vout = vref * (1 + top / bottom) + v('Ifb') * top;
    const vth = (vref * r('R8')) / (r('R7') + r('R8'));
    const [a1, a2, a3, a4] = [r('R3'), r('R4'), r('R5'), r('R6')];
    const ib = v('Ib amp');
    const plus = (a4 / (a3 + a4)) * (1 + a2 / a1);
    const offset = (1 + a2 / a1) * (v('Vos amp') - ib * ((a3 * a4) / (a3 + a4))) + ib * a2;
    const rsAmbient = r('RS');
    let rs = rsAmbient;
    let current = 0;
    for (let k = 0; k < 200; k++) {
      // Vo = plus·(Vcm + I·Rs) − (R4/R3)·Vcm + offset = Vth − Vos_cmp, solved for I.
      current = (vth - v('Vos cmp') - (plus - a2 / a1) * 24 - offset) / (plus * rs);
      // The shunt at its own temperature Tamb + θ·P: R25·(1 + α·(Tamb + θ·P − 25)), θ = 80 K/W, P = I²·Rs.
      rs = r('RS', false) * (1 + v('RS TCR') * (dT + 80 * current * current * rs));
    }
    const ampOutput = plus * (24 + current * rs) - (a2 / a1) * 24 + offset;
    return { vout, dividerCurrent: vref / bottom, ilimit: current, shuntLoss: current * current * rs, ampOutput };
  }

  it('2000 random trials: every output agrees to 1e-12 relative', () => {
    const n = 2000;
    const p = model.parts.map(() => new Float64Array(n));
    const state = chunkState('reference', 0);
    model.parts.forEach((part, i) => {
      fillXor128(state, p[i]!, n);
      partFromUnit(part, p[i]!, n);
    });
    // Spread the temperature over the range too (Monte Carlo holds it fixed in this design).
    for (let j = 0; j < n; j++) p[index('T ambient')]![j] = -20 + (80 * j) / (n - 1);
    const outs = model.outputs.map(() => new Float64Array(n));
    model.evaluateAll!(p, outs, n);
    for (let j = 0; j < n; j += 7) {
      const expected = reference((name) => p[index(name)]![j]!);
      model.outputs.forEach((o, k) => expect(outs[k]![j]! / expected[o.name]! - 1).toBeCloseTo(0, 12));
    }
    // Each output's own evaluate gives the same numbers as evaluateAll.
    model.outputs.forEach((o, k) => {
      const single = new Float64Array(n);
      o.evaluate(p, single, n);
      expect(single).toEqual(outs[k]);
    });
  });

  it('nominal output by hand: 0.8·(1 + (200k∥1M)/(10k + 0.3·5k)) + 10 nA·166.67 kΩ = 12.3971 V', () => {
    const top = (200e3 * 1e6) / 1.2e6;
    expect(nominalOutputs(model).vout).toBeCloseTo(0.8 * (1 + top / 11.5e3) + 10e-9 * top, 10);
    // Threshold 0.8·12/15 = 0.64 V, gain 10, 0.1 Ω: 0.64 A when everything is nominal, less the heating (α = 0 at nominal).
    expect(nominalOutputs(model).ilimit).toBeCloseTo(0.64, 10);
  });

  it('hotShunt solves R = R25·(1 + α·(Tamb + θ·K²/R − 25)) exactly: a case worked by hand', () => {
    // By hand: R25 = 50 mΩ, α = 200 ppm/K, θ = 60 K/W, Tamb = 85 °C, K = I·R = 0.1 V.
    // R_amb = 0.05·(1 + 200e-6·60) = 0.0506 Ω; R² − 0.0506·R − 0.05·200e-6·60·0.01 = R² − 0.0506·R − 6e-6 = 0;
    // R = (0.0506 + √(0.00256036 + 0.000024))/2 = (0.0506 + √0.00258436)/2 = 0.0507183005 Ω;
    // P = 0.01/R = 0.19717 W, rise θ·P = 11.830 K, shunt at 96.830 °C.
    const r25 = 0.05;
    const rAmbient = r25 * (1 + 200e-6 * (85 - 25));
    const r = hotShunt(rAmbient, r25, 200e-6, 60, 0.1);
    expect(r).toBeCloseTo(0.0507183005, 10);
    expect(60 * (0.01 / r)).toBeCloseTo(11.830, 3);
    // The stated formula holds at the root, to rounding.
    expect(r).toBeCloseTo(r25 * (1 + 200e-6 * (85 + (60 * 0.01) / r - 25)), 15);
    // An independent solver: fixed-point iteration of the shunt temperature T = Tamb + θ·K²/R(T) (a contraction here,
    // |dT'/dT| = θ·K²·R25·α/R² ≈ 2.8e-3) converges to the same resistance.
    let t = 85;
    for (let i = 0; i < 50; i++) t = 85 + (60 * 0.01) / (r25 * (1 + 200e-6 * (t - 25)));
    expect(r25 * (1 + 200e-6 * (t - 25))).toBeCloseTo(r, 15);
    // The former form R(Tamb)·(1 + α·θ·P) puts the ambient TCR factor on the rise too: 2.8e-5 relative higher here.
    const former = (rAmbient + Math.sqrt(rAmbient * rAmbient + 4 * rAmbient * 200e-6 * 60 * 0.01)) / 2;
    expect((former - r) / r).toBeCloseTo(2.79e-5, 7);
  });

  it('bad values name the field: a wiper outside 0..1, two resistors without arrangement, reversed temperatures', () => {
    const bad = structuredClone(DIFF_SUPPLY);
    bad.divider!.bottom.potentiometer!.wiper = 1.5;
    expect(() => buildSupplyModel(bad)).toThrow(InputError);
    expect(() => buildSupplyModel(bad)).toThrow(/wiper|track/);
    const two = structuredClone(DIFF_SUPPLY);
    delete two.divider!.top.arrangement;
    expect(() => buildSupplyModel(two)).toThrowError(expect.objectContaining({ where: 'supply.divider.top.arrangement' }));
    const reversed = structuredClone(DIFF_SUPPLY);
    reversed.temperature = { minC: 50, maxC: 0, monteCarlo: 'uniform' };
    expect(() => buildSupplyModel(reversed)).toThrowError(expect.objectContaining({ where: 'supply.temperature' }));
  });
});

describe('worst case against brute-force enumeration (corners.ts, one scalar evaluation per vertex)', () => {
  const model = buildSupplyModel(DIFF_SUPPLY);
  const varying = model.parts.map((p, i) => (partVaries(p) ? i : -1)).filter((i) => i >= 0);

  it(`every output: the same min, max and vertices (${2 ** 18} vertices)`, () => {
    // Drop the TCRs and the temperature from the brute force to keep it quick: hold them at nominal in both.
    const reduced: Model = {
      ...model,
      parts: model.parts.map((p) => (p.kind === 'temperature coefficient' || p.kind === 'temperature' ? { ...p, minus: 0, plus: 0 } : p)),
    };
    const vary = reduced.parts.map((p, i) => (partVaries(p) ? i : -1)).filter((i) => i >= 0);
    const fast = worstCase(reduced);
    reduced.outputs.forEach((output, o) => {
      const values = reduced.parts.map((p) => p.nominal);
      const brute = cornerExtremes(
        (x) => {
          vary.forEach((i, v) => (values[i] = x[v]!));
          return evaluateAt(output, values);
        },
        vary.map((i) => partLow(reduced.parts[i]!)),
        vary.map((i) => partHigh(reduced.parts[i]!)),
      );
      expect(fast[o]!.min).toBe(brute.min);
      expect(fast[o]!.max).toBe(brute.max);
      const bits = (vertex: number): Record<string, 'low' | 'high'> =>
        Object.fromEntries(vary.map((i, v) => [reduced.parts[i]!.name, (vertex >>> v) & 1 ? 'high' : 'low'])) as Record<string, 'low' | 'high'>;
      expect(fast[o]!.minVertex).toEqual(bits(brute.minVertex));
      expect(fast[o]!.maxVertex).toEqual(bits(brute.maxVertex));
    });
  });

  it('the sensitivity-sign vertex, checked by single flips, finds the enumerated extremes (low-side, monotonic)', () => {
    // At 24 V common mode this design's limit can cross zero, where the loss I²R is not monotonic (its minimum is
    // inside the box, which no vertex method finds); low-side sensing keeps every output monotonic in every part.
    const lowSide = structuredClone(DIFF_SUPPLY);
    if (lowSide.sense?.topology === 'diff') lowSide.sense.commonModeV = 0;
    const monotonic = buildSupplyModel(lowSide);
    expect(varying.length).toBe(20); // 2^20 vertices enumerated, against the sign vertex plus flips
    const enumerated = worstCase(monotonic, { maxVariables: 30 });
    const signs = worstCase(monotonic, { maxVariables: 0 });
    expect(enumerated[0]!.method).toBe('enumeration');
    expect(signs[0]!.method).toBe('sensitivity-signs');
    model.outputs.forEach((_o, k) => {
      expect(signs[k]!.min / enumerated[k]!.min - 1).toBeCloseTo(0, 12);
      expect(signs[k]!.max / enumerated[k]!.max - 1).toBeCloseTo(0, 12);
    });
  }, 60_000);

  it('worst case of the limit falls as the threshold divider top goes high (a sign a designer can check)', () => {
    const wc = worstCase(model);
    const ilimit = wc[model.outputs.findIndex((o) => o.name === 'ilimit')]!;
    expect(ilimit.minVertex.R7).toBe('high');
    expect(ilimit.maxVertex.R7).toBe('low');
    expect(ilimit.min).toBeLessThan(nominalOutputs(model).ilimit!);
  });
});

describe('RSS (JCGM 100:2008 5.1.2) against closed forms and Monte Carlo', () => {
  it('sum of uniforms: mean Σ(a+b)/2, variance Σ(b−a)²/12, exactly by RSS and within MC error', async () => {
    const widths = [1, 2, 3, 5];
    const parts = widths.map((w, i) => partFromBound({ name: `U${i}`, kind: 'offset', nominal: i, plusMinus: w / 2 }));
    const model: Model = {
      parts,
      outputs: [{ name: 's', unit: 'V', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = p[0]![j]! + p[1]![j]! + p[2]![j]! + p[3]![j]!; } }],
    };
    const variance = widths.reduce((s, w) => s + (w * w) / 12, 0); // 39/12 = 3.25
    expect(rss(model)[0]!.rss.sigma).toBeCloseTo(Math.sqrt(variance), 10);
    expect(rss(model)[0]!.rss.center).toBeCloseTo(6, 12);
    // Expanded uncertainty U = k·u(y) with k = 2 (JCGM 100:2008 6.2.1, 6.3.3).
    expect(rss(model)[0]!.rss.coverageFactor).toBe(2);
    expect(rss(model)[0]!.rss.expandedUncertainty).toBeCloseTo(2 * Math.sqrt(variance), 10);
    const mc = await monteCarlo(model, { trials: 500_000, seed: 'sum', workers: 1 });
    // SE of the mean √(3.25/5e5) = 2.5e-3; of σ about σ/√(2n) = 1.8e-3.
    expect(Math.abs(mc.outputs[0]!.mean - 6)).toBeLessThan(0.0125);
    expect(Math.abs(mc.outputs[0]!.sigma - Math.sqrt(variance))).toBeLessThan(0.01);
    // Worst case of a sum: every part at its band end, Σ w/2 = 5.5 either side of 6.
    const wc = worstCase(model)[0]!;
    expect(wc.min).toBeCloseTo(0.5, 12);
    expect(wc.max).toBeCloseTo(11.5, 12);
  });

  it('near-linear divider with 0.1 % parts: RSS σ within 1 % of the Monte Carlo σ, shares add to 1', async () => {
    const spec: SupplySpec = {
      reference: { nominal: 1.25, tolerance: 0.002, distribution: { kind: 'normal' } },
      divider: { top: { resistors: [{ name: 'R1', nominal: 28.7e3, tolerance: 0.001 }] }, bottom: { resistors: [{ name: 'R2', nominal: 3.3e3, tolerance: 0.001 }] } },
      temperature: { minC: 25, maxC: 25, monteCarlo: 'uniform' },
    };
    const model = buildSupplyModel(spec);
    const propagated = rss(model)[0]!;
    const mc = await monteCarlo(model, { trials: 1_000_000, seed: 'divider', workers: 1 });
    // MC σ has relative standard error 1/√(2n) ≈ 7e-4; linearisation error is second order in 0.1 %: ~1e-3 relative.
    expect(mc.outputs[0]!.sigma / propagated.rss.sigma - 1).toBeLessThan(0.01);
    expect(mc.outputs[0]!.sigma / propagated.rss.sigma - 1).toBeGreaterThan(-0.01);
    expect(propagated.contributions.reduce((s, c) => s + c.varianceShare, 0)).toBeCloseTo(1, 12);
    // Ranked largest first; R1 and R2 have the same relative sensitivity magnitude (Rtop/Rbottom ratio).
    const shares = propagated.contributions.map((c) => c.varianceShare);
    expect([...shares].sort((a, b) => b - a)).toEqual(shares);
    // Hand: ∂V/∂R1·u(R1) = (Vref/R2)·R1·0.001/√3; same magnitude for R2.
    const r1 = propagated.contributions.find((c) => c.part === 'R1')!;
    expect(Math.abs(r1.sensitivity * r1.standardUncertainty)).toBeCloseTo((1.25 / 3.3e3) * 28.7 / Math.sqrt(3), 8);
  });
});

describe('analyze: cautions and loud failures', () => {
  it('a high-side design whose limit can reach zero carries a caution note', async () => {
    const { analyze } = await import('../src/analysis/analyze.js');
    const result = await analyze(DIFF_SUPPLY, { trials: 20_000, seed: 1, workers: 1 });
    expect(result.outputs.ilimit!.worstCase.min).toBeLessThanOrEqual(0);
    expect(result.notes.some((n) => n.startsWith('Caution: at some tolerance corners the current limit falls to zero'))).toBe(true);
    // The fixed Monte Carlo temperature is reported.
    expect(result.notes.some((n) => n.includes('holds the ambient at 25 °C'))).toBe(true);
  });
  it('a resistor tolerance of 100 % is refused with the field path', () => {
    const bad = structuredClone(DIFF_SUPPLY);
    bad.divider!.bottom.resistors[0].tolerance = 1;
    expect(() => buildSupplyModel(bad)).toThrowError(expect.objectContaining({ where: 'supply.divider.bottom.resistors[0].tolerance' }));
  });
  it('a model that yields NaN fails with ImpossibleError instead of reporting NaN', async () => {
    const { analyze } = await import('../src/analysis/analyze.js');
    const model: Model = {
      parts: [partFromBound({ name: 'x', kind: 'offset', nominal: 0, plusMinus: 1 })],
      outputs: [{ name: 'y', unit: 'V', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = Math.sqrt(p[0]![j]!); } }],
    };
    await expect(analyze(model, { trials: 1000, seed: 1, workers: 1 })).rejects.toThrow(/finite|NaN/);
  });
});

describe('supply model, noninv and direct topologies, against per-trial formulas', () => {
  const sample = (model: Model, n: number): Float64Array[] => {
    const p = model.parts.map(() => new Float64Array(n));
    const state = chunkState('topologies', 0);
    model.parts.forEach((part, i) => {
      fillXor128(state, p[i]!, n);
      partFromUnit(part, p[i]!, n);
    });
    return p;
  };

  it('noninv with self-heating (the benchmark design): I = ((Vth − Vcmp − Ib·RF)/G − Vos)/Rs, Rs heated by θ·I²Rs', async () => {
    const { BENCH_SUPPLY } = await import('../src/bench/cvcc-spec.js');
    const model = buildSupplyModel(BENCH_SUPPLY);
    const n = 1000;
    const p = sample(model, n);
    const outs = model.outputs.map(() => new Float64Array(n));
    model.evaluateAll!(p, outs, n);
    const v = (name: string, j: number): number => p[model.parts.findIndex((x) => x.name === name)]![j]!;
    for (let j = 0; j < n; j += 13) {
      const dT = v('T ambient', j) - 25;
      const rf = v('RF', j);
      const g = 1 + rf / v('RG', j);
      const vth = v('Vth', j);
      const vos = v('Vos amp', j);
      const ib = v('Ib amp', j);
      const rsAmbient = v('RS', j) * (1 + v('RS TCR', j) * dT);
      let rs = rsAmbient;
      let current = 0;
      for (let k = 0; k < 100; k++) {
        current = ((vth - v('Vos cmp', j) - ib * rf) / g - vos) / rs;
        // The shunt at its own temperature Tamb + θ·P: R25·(1 + α·(Tamb + θ·P − 25)), θ = 60 K/W, P = I²·Rs.
        rs = v('RS', j) * (1 + v('RS TCR', j) * (dT + 60 * current * current * rs));
      }
      const vref = v('Vref', j) * (1 + v('Vref tempco', j) * dT);
      const r1 = v('R1', j) * (1 + v('R1 TCR', j) * dT);
      const r2 = v('R2', j) * (1 + v('R2 TCR', j) * dT);
      expect(outs[0]![j]! / (vref * (1 + r1 / r2) + v('Ifb', j) * r1) - 1).toBeCloseTo(0, 12);
      expect(outs[2]![j]! / current - 1).toBeCloseTo(0, 12);
      expect(outs[3]![j]! / (current * current * rs) - 1).toBeCloseTo(0, 12);
      expect(outs[4]![j]! / (g * (current * rs + vos) + ib * rf) - 1).toBeCloseTo(0, 12);
    }
  });

  it('direct: I = (Vth − Vcmp)/Rs, the amplifier output is the shunt voltage; no spec on ampOutput without a rail', () => {
    const spec: SupplySpec = {
      reference: { nominal: 0.6, tolerance: 0.01 },
      divider: { top: { resistors: [{ name: 'R1', nominal: 100e3, tolerance: 0.01 }] }, bottom: { resistors: [{ name: 'R2', nominal: 10e3, tolerance: 0.01 }] } },
      temperature: { minC: 0, maxC: 40, monteCarlo: 'uniform' },
      sense: {
        topology: 'direct',
        shunt: { name: 'RS', nominal: 0.05, tolerance: 0.01, drift: 0.005 },
        threshold: { kind: 'fixed', nominal: 0.1, tolerance: 0.02, tempcoPerK: 100e-6, distribution: { kind: 'binned', innerFraction: 0.5 } },
        compareOffset: { nominal: 0, plusMinus: 2e-3, distribution: { kind: 'triangular' } },
        limitTarget: 2,
      },
    };
    const model = buildSupplyModel(spec);
    expect(model.outputs.find((o) => o.name === 'ampOutput')!.spec).toBeUndefined();
    expect(nominalOutputs(model).ilimit).toBeCloseTo(2, 12);
    const n = 500;
    const p = sample(model, n);
    const outs = model.outputs.map(() => new Float64Array(n));
    model.evaluateAll!(p, outs, n);
    const v = (name: string, j: number): number => p[model.parts.findIndex((x) => x.name === name)]![j]!;
    for (let j = 0; j < n; j += 11) {
      const dT = v('T ambient', j) - 25;
      const rs = v('RS', j) * (1 + v('RS drift', j));
      const vth = v('Vth', j) * (1 + v('Vth tempco', j) * dT);
      const current = (vth - v('Vos cmp', j)) / rs;
      expect(outs[2]![j]! / current - 1).toBeCloseTo(0, 12);
      expect(outs[4]![j]! / (current * rs) - 1).toBeCloseTo(0, 12);
    }
  });
});
