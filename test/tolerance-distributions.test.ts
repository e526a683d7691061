// Distributions: the drawn values' moments against closed forms and numerical integration of the density, the
// inverse normal CDF against standard normal tables, and the fast block path against the one-call-per-draw path.
import { describe, expect, it } from 'vitest';
import seedrandom from 'seedrandom';
import { chunkRandom, chunkState, fillXor128 } from '../src/analysis/chunk-random.js';
import { binnedSigma } from '../src/tolerance/distributions/binned.js';
import { erfc, inverseNormalCdf, normalCdf } from '../src/tolerance/distributions/normal.js';
import { triangularSigma } from '../src/tolerance/distributions/triangular.js';
import { truncatedNormalSigma } from '../src/tolerance/distributions/truncated-normal.js';
import type { DistributionSpec, Part } from '../src/tolerance/part.js';
import { partFromTolerance } from '../src/tolerance/part.js';
import { fillPart, partFromUnit, partMean, partSigma } from '../src/tolerance/sample.js';

function part(distribution: DistributionSpec, nominal = 100, tolerance = 0.05): Part {
  return partFromTolerance({ name: 'R', kind: 'resistor', nominal, tolerance, distribution });
}

function sampleMoments(p: Part, n = 1_000_000): { mean: number; sigma: number; min: number; max: number } {
  const x = new Float64Array(n);
  fillPart(p, x, n, seedrandom.xor128('moments'));
  let s = 0;
  let min = Infinity;
  let max = -Infinity;
  for (const v of x) {
    s += v;
    min = Math.min(min, v);
    max = Math.max(max, v);
  }
  const mean = s / n;
  let ss = 0;
  for (const v of x) ss += (v - mean) ** 2;
  return { mean, sigma: Math.sqrt(ss / (n - 1)), min, max };
}

/** σ of a density on [a, b] by composite Simpson's rule (an independent check of the closed forms). */
function integratedSigma(pdf: (x: number) => number, a: number, b: number, steps = 20000): number {
  const h = (b - a) / steps;
  let m0 = 0;
  let m1 = 0;
  let m2 = 0;
  for (let i = 0; i <= steps; i++) {
    const x = a + i * h;
    const w = i === 0 || i === steps ? 1 : i % 2 ? 4 : 2;
    const f = pdf(x) * w;
    m0 += f;
    m1 += f * x;
    m2 += f * x * x;
  }
  const mean = m1 / m0;
  return Math.sqrt(m2 / m0 - mean * mean);
}

const phi = (z: number): number => Math.exp(-z * z / 2);

describe('inverse normal CDF (Acklam 2003) against standard normal tables', () => {
  // Φ⁻¹ values from standard normal tables (e.g. NIST/SEMATECH e-Handbook 1.3.6.7.1), to the digits tabulated.
  it.each([
    [0.5, 0],
    [0.975, 1.959963985],
    [0.995, 2.575829304],
    [0.99865, 3.000],
    [0.8413447461, 1.0],
    [0.001, -3.090232306],
    [1e-9, -5.997807015],
  ])('Φ⁻¹(%d) = %d', (u, z) => {
    expect(inverseNormalCdf(u)).toBeCloseTo(z, u === 0.99865 ? 3 : 7);
  });
  it('Φ(Φ⁻¹(u)) = u over (0, 1), within erfc’s 1.2e-7 fractional error', () => {
    for (let u = 0.0005; u < 1; u += 0.0137) expect(Math.abs(normalCdf(inverseNormalCdf(u)) - u)).toBeLessThan(2e-7 * Math.max(u, 1 - u));
  });
  it('erfc at tabulated points (Abramowitz & Stegun Table 7.1): erfc(0.5) = 0.4795001222, erfc(1) = 0.1572992071, erfc(2) = 0.004677734981', () => {
    expect(Math.abs(erfc(0.5) / 0.4795001222 - 1)).toBeLessThan(1.2e-7);
    expect(Math.abs(erfc(1) / 0.1572992071 - 1)).toBeLessThan(1.2e-7);
    expect(Math.abs(erfc(2) / 0.004677734981 - 1)).toBeLessThan(1.2e-7);
    expect(Math.abs(erfc(-1) - (2 - 0.1572992071))).toBeLessThan(1e-7);
  });
  it('an exact 0 from the source does not give −∞', () => {
    expect(Number.isFinite(inverseNormalCdf(0))).toBe(true);
  });
});

describe('distribution moments: 1e6 draws against closed forms (σ/√n ≈ 1e-3 σ, so 5e-3 relative)', () => {
  it('uniform 100 Ω ±5 %: mean 100, σ = 5/√3 = 2.88675 (JCGM 101:2008 6.4.2)', () => {
    const m = sampleMoments(part({ kind: 'uniform' }));
    expect(m.mean).toBeCloseTo(100, 1);
    expect(m.sigma / (5 / Math.sqrt(3))).toBeCloseTo(1, 2);
    expect(m.min).toBeGreaterThanOrEqual(95);
    expect(m.max).toBeLessThan(105);
    expect(partSigma(part({ kind: 'uniform' }))).toBeCloseTo(5 / Math.sqrt(3), 12);
  });
  it('normal, band = 3σ: σ = 5/3; k = 2: σ = 2.5', () => {
    expect(sampleMoments(part({ kind: 'normal' })).sigma / (5 / 3)).toBeCloseTo(1, 2);
    expect(sampleMoments(part({ kind: 'normal', k: 2 })).sigma / 2.5).toBeCloseTo(1, 2);
    expect(partSigma(part({ kind: 'normal' }))).toBeCloseTo(5 / 3, 12);
  });
  it('truncated normal at ±3σ: σ² = 1 − 6φ(3)/(2Φ(3) − 1) = 0.97334 (hand computation) and by integration', () => {
    const s = 5 / 3;
    const expected = s * Math.sqrt(1 - (6 * 0.004431848411938) / 0.997300203936740); // φ(3), 2Φ(3)−1 from tables
    expect(partSigma(part({ kind: 'truncated-normal' }))).toBeCloseTo(expected, 6);
    expect(integratedSigma((x) => phi((x - 100) / s), 95, 105)).toBeCloseTo(expected, 6);
    const m = sampleMoments(part({ kind: 'truncated-normal' }));
    expect(m.sigma / expected).toBeCloseTo(1, 2);
    expect(m.min).toBeGreaterThanOrEqual(95);
    expect(m.max).toBeLessThanOrEqual(105);
  });
  it('triangular peaked at nominal: σ = half-width/√6; asymmetric band mean (lo + c + hi)/3', () => {
    expect(partSigma(part({ kind: 'triangular' }))).toBeCloseTo(5 / Math.sqrt(6), 12);
    expect(sampleMoments(part({ kind: 'triangular' })).sigma / (5 / Math.sqrt(6))).toBeCloseTo(1, 2);
    const skew = partFromTolerance({ name: 'R', kind: 'resistor', nominal: 100, tolerance: 0.05, minusFraction: 0.15, distribution: { kind: 'triangular' } });
    const m = sampleMoments(skew);
    expect(m.mean).toBeCloseTo((85 + 100 + 105) / 3, 1);
    expect(partMean(skew)).toBeCloseTo((85 + 100 + 105) / 3, 12);
    // Integration of the triangle density on [85, 105] with peak at 100.
    const tri = (x: number): number => (x < 100 ? (x - 85) / 15 : (105 - x) / 5);
    expect(triangularSigma(85, 100, 105)).toBeCloseTo(integratedSigma(tri, 85, 105), 5);
  });
  it('binned 5 % grade with the 1 % grade removed: no value within ±1 %, σ by integration of the two pieces', () => {
    const spec: DistributionSpec = { kind: 'binned', innerFraction: 0.2 };
    const s = 5 / 3;
    const m = sampleMoments(part(spec));
    const pdf = (x: number): number => (Math.abs(x - 100) >= 1 ? phi((x - 100) / s) : 0);
    const expected = integratedSigma(pdf, 95, 105, 200000);
    expect(binnedSigma(s, 1, 5)).toBeCloseTo(expected, 4);
    expect(m.sigma / expected).toBeCloseTo(1, 2);
    expect(m.mean).toBeCloseTo(100, 1);
    const x = new Float64Array(100000);
    fillPart(part(spec), x, x.length, seedrandom.xor128('hole'));
    expect(x.every((v) => Math.abs(v - 100) >= 1 - 1e-6 && Math.abs(v - 100) <= 5)).toBe(true);
  });
  it('fixed: every value is the fixed one, σ 0', () => {
    const p = part({ kind: 'fixed', value: 101 });
    const x = new Float64Array(10);
    fillPart(p, x, 10, seedrandom.xor128('f'));
    expect([...x]).toEqual(new Array(10).fill(101));
    expect(partSigma(p)).toBe(0);
  });
  it('zero tolerance: the nominal value, σ 0', () => {
    const p = part({ kind: 'normal' }, 100, 0);
    const x = new Float64Array(4);
    fillPart(p, x, 4, seedrandom.xor128('z'));
    expect([...x]).toEqual([100, 100, 100, 100]);
    expect(partSigma(p)).toBe(0);
  });
});

describe('fast block path against the one-call-per-draw reference', () => {
  it('fillXor128 reproduces seedrandom.xor128 call by call', () => {
    const reference = chunkRandom('seed', 3);
    const fast = new Float64Array(1000);
    fillXor128(chunkState('seed', 3), fast, 1000);
    for (let j = 0; j < 1000; j++) expect(fast[j]).toBe(reference());
  });
  it.each<DistributionSpec>([{ kind: 'uniform' }, { kind: 'normal' }, { kind: 'truncated-normal' }, { kind: 'triangular' }, { kind: 'binned', innerFraction: 0.2 }])(
    '%o: block uniforms + in-place transform equal fillPart value for value',
    (spec) => {
      const p = part(spec);
      const reference = new Float64Array(5000);
      fillPart(p, reference, 5000, chunkRandom('s', 0));
      const fast = new Float64Array(5000);
      fillXor128(chunkState('s', 0), fast, 5000);
      partFromUnit(p, fast, 5000);
      expect(fast).toEqual(reference);
    },
  );
  it('truncated-normal σ formula matches the integrated density for an off-centre cut', () => {
    // N(0, 1) cut to [−1, 2].
    expect(truncatedNormalSigma(0, 1, -1, 2)).toBeCloseTo(integratedSigma(phi, -1, 2), 6);
  });
});
