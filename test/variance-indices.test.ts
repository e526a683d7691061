// Variance-based shares (src/analysis/variance-indices.ts) against closed forms: a linear model, a product of two
// zero-mean inputs, the Ishigami function, and a charger's divider whose TCRs act only with the ambient temperature.
// Every tolerance is a multiple of the estimator's own standard error (and the SE itself is checked against the
// spread of repeated estimates), plus, where the model is only close to the closed form, its stated model error.
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analysis/analyze.js';
import type { Model } from '../src/analysis/model.js';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { rss } from '../src/analysis/rss.js';
import { varianceIndices, type PartIndices } from '../src/analysis/variance-indices.js';
import { partFromBound, type DistributionSpec, type Part } from '../src/tolerance/part.js';

/** Standard errors allowed: a normal estimate lands within 4 SE with probability 1 − 6e-5. */
const Z = 4;

function part(name: string, halfWidth: number, distribution: DistributionSpec = { kind: 'uniform' }, nominal = 0): Part {
  return partFromBound({ name, kind: 'offset', nominal, plusMinus: halfWidth, distribution, unit: '' });
}

function byName(parts: PartIndices[]): Record<string, PartIndices> {
  return Object.fromEntries(parts.map((p) => [p.part, p]));
}

function expectWithin(estimate: number, standardError: number, exact: number, modelError = 0): void {
  expect(Math.abs(estimate - exact)).toBeLessThanOrEqual(Z * standardError + modelError);
}

describe('variance indices: closed forms', () => {
  it('linear y = Σ c_i·x_i, independent inputs: first-order = total-effect = c_i²σ_i² / Σ c_j²σ_j²', () => {
    // Uniform ±w has σ² = w²/3; normal with band ±w = 3σ has σ² = w²/9.
    const c = [1, -2, 0.5, 3];
    const parts = [part('X1', 1), part('X2', 0.5), part('X3', 2, { kind: 'normal' }), part('X4', 0.1)];
    const variances = [1 / 3, 0.25 / 3, 4 / 9, 0.01 / 3].map((v, i) => c[i]! * c[i]! * v);
    const total = variances.reduce((s, v) => s + v, 0);
    const model: Model = {
      parts,
      outputs: [{ name: 'y', unit: '', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = 5 + c[0]! * p[0]![j]! + c[1]! * p[1]![j]! + c[2]! * p[2]![j]! + c[3]! * p[3]![j]!; } }],
    };
    const result = varianceIndices(model, { seed: 'linear' });
    const got = result.outputs[0]!.parts;
    expect(got.map((g) => g.part)).toEqual(['X1', 'X2', 'X3', 'X4']);
    got.forEach((g, i) => {
      const exact = variances[i]! / total;
      expectWithin(g.totalEffect, g.totalEffectStandardError, exact);
      expectWithin(g.firstOrder, g.firstOrderStandardError, exact);
      // The SE is small enough for the check to mean something.
      expect(g.totalEffectStandardError).toBeLessThan(0.02);
      expect(g.firstOrderStandardError).toBeLessThan(0.03);
    });
    // V̂ from 2N values has relative SE ≈ √((κ − 1)/2N) ≈ 1.1 % (kurtosis κ ≤ 3 here); ±5 % is over 4 SE.
    expect(result.outputs[0]!.variance / total).toBeGreaterThan(0.95);
    expect(result.outputs[0]!.variance / total).toBeLessThan(1.05);
    expect(result.method.evaluations).toBe(8192 * (4 + 2));
  });

  it('y = x1·x2 with zero-mean inputs: first-order 0, total-effect 1 for each (all variance is interaction)', () => {
    const model: Model = {
      parts: [part('A', 1), part('B', 3, { kind: 'normal' })],
      outputs: [{ name: 'y', unit: '', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = 100 + p[0]![j]! * p[1]![j]!; } }],
    };
    const got = byName(varianceIndices(model, { seed: 'product' }).outputs[0]!.parts);
    for (const name of ['A', 'B']) {
      expectWithin(got[name]!.firstOrder, got[name]!.firstOrderStandardError, 0);
      expectWithin(got[name]!.totalEffect, got[name]!.totalEffectStandardError, 1);
    }
    // RSS sees nothing here: every sensitivity at the means is 0.
    expect(rss(model)[0]!.rss.sigma).toBe(0);
  });

  it('Ishigami function (a = 7, b = 0.1, x_i uniform on [−π, π]): the analytic indices', () => {
    // f = sin x1 + a·sin² x2 + b·x3⁴·sin x1 (Ishigami & Homma 1990). Its partial variances (Sobol' & Levitan 1999,
    // from memory; they reproduce the published S1 = 0.3139, S2 = 0.4424, ST3 = 0.2437):
    //   V1 = (1 + bπ⁴/5)²/2,  V2 = a²/8,  V13 = 8b²π⁸/225,  V3 = V12 = V23 = V123 = 0.
    const a = 7;
    const b = 0.1;
    const v1 = (1 + (b * Math.PI ** 4) / 5) ** 2 / 2;
    const v2 = (a * a) / 8;
    const v13 = (8 * b * b * Math.PI ** 8) / 225;
    const v = v1 + v2 + v13;
    const model: Model = {
      parts: [part('x1', Math.PI), part('x2', Math.PI), part('x3', Math.PI)],
      outputs: [{
        name: 'f',
        unit: '',
        evaluate: (p, out, n) => {
          for (let j = 0; j < n; j++) {
            const s1 = Math.sin(p[0]![j]!);
            const s2 = Math.sin(p[1]![j]!);
            out[j] = s1 + a * s2 * s2 + b * p[2]![j]! ** 4 * s1;
          }
        },
      }],
    };
    const got = byName(varianceIndices(model, { seed: 'ishigami', baseSamples: 32768 }).outputs[0]!.parts);
    expectWithin(got.x1!.firstOrder, got.x1!.firstOrderStandardError, v1 / v);
    expectWithin(got.x2!.firstOrder, got.x2!.firstOrderStandardError, v2 / v);
    expectWithin(got.x3!.firstOrder, got.x3!.firstOrderStandardError, 0);
    expectWithin(got.x1!.totalEffect, got.x1!.totalEffectStandardError, (v1 + v13) / v);
    expectWithin(got.x2!.totalEffect, got.x2!.totalEffectStandardError, v2 / v);
    expectWithin(got.x3!.totalEffect, got.x3!.totalEffectStandardError, v13 / v);
    expect(v1 / v).toBeCloseTo(0.3139, 4);
    expect((v13 / v)).toBeCloseTo(0.2437, 4);
  });

  it('the standard errors match the spread of repeated estimates (product model, 40 seeds, N = 1024)', () => {
    const model: Model = {
      parts: [part('A', 1), part('B', 1)],
      outputs: [{ name: 'y', unit: '', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = p[0]![j]! * p[1]![j]! + 0.5 * p[0]![j]!; } }],
    };
    const reps = 40;
    const total: number[] = [];
    const first: number[] = [];
    const totalSe: number[] = [];
    const firstSe: number[] = [];
    for (let r = 0; r < reps; r++) {
      const a = varianceIndices(model, { seed: `rep${r}`, baseSamples: 1024 }).outputs[0]!.parts[0]!;
      total.push(a.totalEffect);
      first.push(a.firstOrder);
      totalSe.push(a.totalEffectStandardError);
      firstSe.push(a.firstOrderStandardError);
    }
    const sd = (x: number[]) => {
      const m = x.reduce((s, v) => s + v, 0) / x.length;
      return Math.sqrt(x.reduce((s, v) => s + (v - m) ** 2, 0) / (x.length - 1));
    };
    const mean = (x: number[]) => x.reduce((s, v) => s + v, 0) / x.length;
    // A sample SD from 40 values has relative SE ≈ 1/√(2·39) ≈ 11 %; ±35 % is about 3 of those.
    expect(sd(total) / mean(totalSe)).toBeGreaterThan(0.65);
    expect(sd(total) / mean(totalSe)).toBeLessThan(1.35);
    expect(sd(first) / mean(firstSe)).toBeGreaterThan(0.65);
    expect(sd(first) / mean(firstSe)).toBeLessThan(1.35);
    // Closed form (uniform ±1: σ² = 1/3): V = 1/9 + 0.25/3; S_A = (0.25/3)/V, ST_A = 1; the mean of 40 estimates
    // lies within 4 SE/√40 of it.
    const v = 1 / 9 + 0.25 / 3;
    expect(Math.abs(mean(first) - 0.25 / 3 / v)).toBeLessThan((Z * mean(firstSe)) / Math.sqrt(reps));
    expect(Math.abs(mean(total) - 1)).toBeLessThan((Z * mean(totalSe)) / Math.sqrt(reps));
  });
});

describe('variance indices: parts and seeds', () => {
  const model: Model = {
    parts: [part('A', 1), part('held', 1, { kind: 'fixed', value: 0.3 }), { ...part('exact', 0), minus: 0, plus: 0 }],
    outputs: [{ name: 'y', unit: '', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = p[0]![j]! * (1 + p[1]![j]!) + p[2]![j]!; } }],
  };

  it('a part Monte Carlo holds fixed gets 0 without an evaluation; a part without spread is left out', () => {
    const result = varianceIndices(model, { seed: 's', baseSamples: 256 });
    expect(result.outputs[0]!.parts.map((p) => p.part)).toEqual(['A', 'held']);
    expect(result.outputs[0]!.parts[1]).toEqual({ part: 'held', totalEffect: 0, totalEffectStandardError: 0, firstOrder: 0, firstOrderStandardError: 0 });
    // Only A varies (y = 1.3·A): all of the variance is A's.
    const a = result.outputs[0]!.parts[0]!;
    expectWithin(a.totalEffect, a.totalEffectStandardError, 1);
    expectWithin(a.firstOrder, a.firstOrderStandardError, 1);
    expect(result.method.evaluations).toBe(256 * 3);
  });

  it('the same seed gives the same figures; another seed other figures; the stream has a name of its own', () => {
    const one = varianceIndices(model, { seed: '7', baseSamples: 512 });
    expect(varianceIndices(model, { seed: '7', baseSamples: 512 })).toEqual(one);
    expect(one.method.seed).toBe('variance-indices:7');
    const lin: Model = { ...model, outputs: [{ name: 'y', unit: '', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = p[0]![j]! ** 3; } }] };
    expect(varianceIndices(lin, { seed: '8', baseSamples: 512 }).outputs[0]!.variance).not.toBe(varianceIndices(lin, { seed: '7', baseSamples: 512 }).outputs[0]!.variance);
  });

  it('a constant output has every share 0, never NaN', () => {
    const flat: Model = { parts: [part('A', 1)], outputs: [{ name: 'c', unit: '', evaluate: (_p, out, n) => out.fill(2, 0, n) }] };
    expect(varianceIndices(flat, { seed: 'c', baseSamples: 64 }).outputs[0]!.parts[0]).toEqual({ part: 'A', totalEffect: 0, totalEffectStandardError: 0, firstOrder: 0, firstOrderStandardError: 0 });
  });
});

describe('a 1S charger with 200 ppm/K resistors over −40…90 °C (range centred on 25 °C)', () => {
  // Vout = Vref·(1 + Rt/Rb), Vref exact at 1.2 V, Rt/Rb = 2.5 (4.2 V), both 0.1 % uniform and TCR uniform within
  // ±200 ppm/K, ambient uniform over −40…90 °C. To first order in the small terms, with a = Rt/(Rt + Rb) = 5/7,
  //   Vout ≈ V0·(1 + a·(r_t − r_b) + a·(α_t − α_b)·ΔT),
  // r the relative tolerance draws (σ_r² = 0.001²/3), α the TCRs (σ_α² = (200e-6)²/3), ΔT uniform ±65 K
  // (σ_T² = 65²/3), all independent and zero-mean. Each α·ΔT term is a product of zero-mean inputs: first-order 0
  // for α and for T, its whole variance V_αT = (V0·a)²σ_α²σ_T² an interaction. So, with V = (V0·a)²·2(σ_r² + σ_α²σ_T²),
  //   ST(TCR) = σ_α²σ_T² / (2(σ_r² + σ_α²σ_T²)) ≈ 0.491,  ST(T ambient) ≈ 0.983,  S(R) = ST(R) ≈ 0.0087,
  // and the first-order RSS share of each TCR is exactly 0 (no sensitivity at ΔT = 0).
  // The terms dropped are second order in 1e-3 and 1.3e-2 (αΔT): about 1 % of a share at most; 0.01 is allowed.
  const spec: SupplySpec = {
    reference: { nominal: 1.2, tolerance: 0 },
    divider: {
      top: { resistors: [{ name: 'RTOP', nominal: 25e3, tolerance: 0.001, tcrPerK: 200e-6 }] },
      bottom: { resistors: [{ name: 'RBOT', nominal: 10e3, tolerance: 0.001, tcrPerK: 200e-6 }] },
    },
    temperature: { minC: -40, maxC: 90, monteCarlo: 'uniform' },
    windows: { vout: [4.17, 4.23] },
  };
  const sr2 = 0.001 ** 2 / 3;
  const sat2 = ((200e-6) ** 2 / 3) * (65 ** 2 / 3);
  const modelError = 0.01;

  it('the TCRs and the ambient take the variance that the first-order RSS shares miss', () => {
    const model = buildSupplyModel(spec);
    const rssShares = Object.fromEntries(rss(model)[0]!.contributions.map((c) => [c.part, c.varianceShare]));
    expect(rssShares['RTOP TCR']).toBe(0);
    expect(rssShares['RBOT TCR']).toBe(0);
    expect(rssShares['T ambient']).toBe(0);
    const got = byName(varianceIndices(model, { seed: '1' }).outputs[0]!.parts);
    const tcr = sat2 / (2 * (sr2 + sat2));
    for (const name of ['RTOP TCR', 'RBOT TCR']) {
      expectWithin(got[name]!.totalEffect, got[name]!.totalEffectStandardError, tcr, modelError);
      expectWithin(got[name]!.firstOrder, got[name]!.firstOrderStandardError, 0, modelError);
      expect(got[name]!.totalEffect - Z * got[name]!.totalEffectStandardError).toBeGreaterThan(0.4);
    }
    expectWithin(got['T ambient']!.totalEffect, got['T ambient']!.totalEffectStandardError, 2 * tcr, modelError);
    expectWithin(got['T ambient']!.firstOrder, got['T ambient']!.firstOrderStandardError, 0, modelError);
    for (const name of ['RTOP', 'RBOT']) expectWithin(got[name]!.totalEffect, got[name]!.totalEffectStandardError, sr2 / (2 * (sr2 + sat2)), 0.002);
  });

  it('analyze ranks by total-effect share, shows the ambient, and says why RSS σ falls short of Monte Carlo σ', async () => {
    const one = await analyze(spec, { trials: 65536, seed: 1, workers: 1 });
    const vout = one.outputs.vout!;
    expect(vout.contributions[0]!.part).toBe('T ambient');
    expect(new Set(vout.contributions.slice(1, 3).map((c) => c.part))).toEqual(new Set(['RTOP TCR', 'RBOT TCR']));
    // RSS σ: V0·a·√(2σ_r²) = 4.2·(5/7)·√(2e-6/3) ≈ 2.45 mV; Monte Carlo σ ≈ 4.2·(5/7)·√(2(σ_r² + σ_α²σ_T²)) ≈ 18.5 mV.
    expect(vout.rss.sigma).toBeCloseTo(4.2 * (5 / 7) * Math.sqrt(2 * sr2), 5);
    expect(vout.varianceBudget.rssAgreement).toBe('interaction');
    expect(vout.varianceBudget.totalEffectSum).toBeGreaterThan(1.8);
    expect(vout.varianceBudget.firstOrderSum).toBeLessThan(0.1);
    // Same figures on two workers: the sample is seeded from the run's seed, not from the workers.
    const two = await analyze(spec, { trials: 65536, seed: 1, workers: 2 });
    expect(two.outputs.vout!.contributions).toEqual(vout.contributions);
    expect(two.outputs.vout!.varianceBudget.method).toEqual(vout.varianceBudget.method);
  });
});

describe('the verdict on the first-order RSS σ (variance-budget.ts)', () => {
  it('y = exp(x), x uniform ±1.5: one part (no interaction), RSS σ 25 % short of Monte Carlo → nonlinearity', async () => {
    // Closed form: RSS σ = e⁰·1.5/√3 = 0.866; Var(eˣ) = sinh(3)/3 − (sinh(1.5)/1.5)² = 1.324, σ = 1.151; ratio 0.753.
    const model: Model = { parts: [part('x', 1.5)], outputs: [{ name: 'y', unit: '', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = Math.exp(p[0]![j]!); } }] };
    const y = (await analyze(model, { trials: 65536, seed: 'exp', workers: 1 })).outputs.y!;
    expect(y.rss.sigma).toBeCloseTo(1.5 / Math.sqrt(3), 6);
    const sigma = Math.sqrt(Math.sinh(3) / 3 - (Math.sinh(1.5) / 1.5) ** 2);
    // MC σ relative SE ≈ √((κ − 1)/4n) ≈ 0.4 % at n = 65536 (κ ≈ 4 here): the ratio is known to ±0.003; 0.05 allowed.
    expect(y.varianceBudget.rssToMonteCarloSigma!).toBeCloseTo((1.5 / Math.sqrt(3)) / sigma, 1);
    expect(y.varianceBudget.rssAgreement).toBe('nonlinearity');
    // One part: all of the variance is its own, both ways.
    expectWithin(y.contributions[0]!.totalEffectShare, y.contributions[0]!.totalEffectStandardError, 1);
    expectWithin(y.contributions[0]!.firstOrderShare, y.contributions[0]!.firstOrderStandardError, 1);
  });

  it('a linear sum: RSS σ equals the Monte Carlo σ within its error → agrees', async () => {
    const model: Model = { parts: [part('a', 1), part('b', 2)], outputs: [{ name: 'y', unit: '', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = p[0]![j]! - 0.5 * p[1]![j]!; } }] };
    const y = (await analyze(model, { trials: 65536, seed: 'sum', workers: 1 })).outputs.y!;
    expect(y.varianceBudget.rssAgreement).toBe('agrees');
    expect(y.varianceBudget.method.evaluations).toBe(8192 * 4);
  });
});
