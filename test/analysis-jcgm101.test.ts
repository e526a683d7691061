// JCGM 101:2008 clause 9.2, the additive model Y = X1 + X2 + X3 + X4 (all sensitivity coefficients 1).
// Published results (Tables 2 and 3 of JCGM 101:2008; recalled from memory, to the two decimals printed there):
//   9.2.2, Xi ~ N(0, 1):                         y = 0.00, u(y) = 2.00, 95 % interval [−3.92, 3.92]
//   9.2.3, Xi rectangular, mean 0, σ 1:          y = 0.00, u(y) = 2.00, 95 % interval [−3.88, 3.88]
//                                                (the law of propagation with a normal assumption gives ±3.92)
// The rectangular case's interval is also checked against the exact distribution of the sum (Irwin–Hall CDF).
// Tolerances: the published figures carry ±0.005 rounding; with M = 1e6 trials the standard error of the mean is
// 2/√M = 0.002, of u about 0.0015, of a 2.5 % / 97.5 % quantile about √(0.025·0.975/M)/f(q) ≈ 0.0054 (f the
// output's density there, ≈ 0.029 for σ = 2). So 0.01 for y and u and 0.03 for the interval ends (≈ 5 standard
// errors), tighter than the clause's own numerical tolerance δ = 0.05 for two significant digits of u(y) = 2.0.
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analysis/analyze.js';
import type { Model } from '../src/analysis/model.js';
import { monteCarlo } from '../src/analysis/monte-carlo.js';
import { rss } from '../src/analysis/rss.js';
import type { DistributionSpec } from '../src/tolerance/part.js';
import { partFromBound } from '../src/tolerance/part.js';

function additiveModel(distribution: DistributionSpec, halfWidth: number): Model {
  const parts = [1, 2, 3, 4].map((i) => partFromBound({ name: `X${i}`, kind: 'offset', nominal: 0, plusMinus: halfWidth, distribution, unit: '' }));
  return {
    parts,
    outputs: [
      {
        name: 'y',
        unit: '',
        evaluate(p, out, n) {
          for (let j = 0; j < n; j++) out[j] = p[0]![j]! + p[1]![j]! + p[2]![j]! + p[3]![j]!;
        },
      },
    ],
  };
}

/** Irwin–Hall CDF of the sum of 4 independent U(0, 1): F(s) = (1/4!)·Σ_{k ≤ s} (−1)^k·C(4, k)·(s − k)^4. */
function irwinHall4(s: number): number {
  const binomial = [1, 4, 6, 4, 1];
  let sum = 0;
  for (let k = 0; k <= Math.floor(s) && k <= 4; k++) sum += (-1) ** k * binomial[k]! * (s - k) ** 4;
  return sum / 24;
}

describe('JCGM 101:2008 9.2 additive model', () => {
  it('9.2.2 normal inputs: y = 0.00, u(y) = 2.00, 95 % interval [−3.92, 3.92] (Table 2)', async () => {
    const model = additiveModel({ kind: 'normal', k: 3 }, 3); // band ±3 = 3σ → σ = 1
    const result = await analyze(model, { trials: 1_000_000, seed: 'jcgm-9.2.2', workers: 1 });
    const y = result.outputs.y!;
    expect(Math.abs(y.mean)).toBeLessThan(0.01);
    expect(y.sigma).toBeCloseTo(2, 1);
    expect(Math.abs(y.sigma - 2)).toBeLessThan(0.01);
    expect(Math.abs(y.interval95.low + 3.92)).toBeLessThan(0.03);
    expect(Math.abs(y.interval95.high - 3.92)).toBeLessThan(0.03);
    // The shortest interval's width is what is minimised; its position sits on a flat minimum (for a symmetric
    // density the width grows only to second order as the interval slides), so its ends scatter more than a
    // quantile's (standard error of a 97.5 % quantile here ≈ 0.0053): the width to 0.03, each end to 0.06.
    expect(Math.abs(y.shortest95.high - y.shortest95.low - 7.84)).toBeLessThan(0.03);
    expect(Math.abs(y.shortest95.low + 3.92)).toBeLessThan(0.06);
    expect(Math.abs(y.shortest95.high - 3.92)).toBeLessThan(0.06);
    // Law of propagation: exact for a linear model, u(y) = √4 = 2; contributions 1/4 each.
    expect(y.rss.sigma).toBeCloseTo(2, 9);
    for (const c of y.contributions) expect(c.varianceShare).toBeCloseTo(0.25, 9);
  });

  it('9.2.3 rectangular inputs: u(y) = 2.00 and 95 % interval [−3.88, 3.88] (Table 3), not the ±3.92 of a normal', async () => {
    const model = additiveModel({ kind: 'uniform' }, Math.sqrt(3)); // σ = 1
    const mc = await monteCarlo(model, { trials: 1_000_000, seed: 'jcgm-9.2.3', workers: 1 });
    const y = mc.outputs[0]!;
    expect(Math.abs(y.mean)).toBeLessThan(0.01);
    expect(Math.abs(y.sigma - 2)).toBeLessThan(0.01);
    expect(Math.abs(y.interval95.low + 3.88)).toBeLessThan(0.03);
    expect(Math.abs(y.interval95.high - 3.88)).toBeLessThan(0.03);
    expect(y.interval95.high).toBeLessThan(3.92 - 0.01);
    // Exact 97.5 % point of the sum: Y = 2√3·(S − 2) with S ~ Irwin–Hall(4); bisection on its CDF.
    let lo = 2;
    let hi = 4;
    for (let i = 0; i < 100; i++) {
      const mid = (lo + hi) / 2;
      if (irwinHall4(mid) < 0.975) lo = mid;
      else hi = mid;
    }
    const exact = 2 * Math.sqrt(3) * (lo - 2);
    expect(exact).toBeCloseTo(3.88, 2);
    expect(Math.abs(y.interval95.high - exact)).toBeLessThan(0.03);
    expect(rss(model)[0]!.rss.sigma).toBeCloseTo(2, 9);
  });

  it('adaptive run (JCGM 101:2008 7.9, two significant digits) reproduces the 9.2.2 figures', async () => {
    const model = additiveModel({ kind: 'normal', k: 3 }, 3);
    const result = await analyze(model, { trials: 'auto', seed: 'jcgm-adaptive', workers: 1, significantDigits: 2 });
    const y = result.outputs.y!;
    // δ = 0.05 for u = 2.0 at two digits: the procedure stops when results are stable to about that.
    expect(Math.abs(y.sigma - 2)).toBeLessThan(0.05);
    expect(Math.abs(y.interval95.high - 3.92)).toBeLessThan(0.05);
    expect(result.trials % 65536).toBe(0);
    expect(result.trials).toBeGreaterThanOrEqual(2 * 65536);
    expect(result.notes.some((n) => n.includes('7.9') && n.includes('stopped after'))).toBe(true);
  });
});
