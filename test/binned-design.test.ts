// The binned distribution (src/tolerance/distributions/binned.ts) as the design file exposes it: a wider grade's
// normal production (band = 3σ) with the tighter grade named by `sortedOut` removed (common practice). Its moments
// are checked against numeric integration of the density, which is written here from its definition:
//   f(x) ∝ φ((x − c)/σ) on I ≤ |x − c| ≤ W, 0 elsewhere (W = band half-width, I = sortedOut·nominal).
// Integration: composite Simpson's rule on each piece with 20 000 panels (error far below the 1e-6 relative used).
import { describe, expect, it } from 'vitest';
import { buildSupplyModel } from '../src/analysis/models/supply.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { binnedFromUnit, binnedSigma } from '../src/tolerance/distributions/binned.js';
import { partMean, partSigma } from '../src/tolerance/sample.js';
import { baseDesign } from './design-fixture.js';

const phi = (z: number): number => Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);

function simpson(f: (x: number) => number, a: number, b: number, panels = 20000): number {
  const h = (b - a) / panels;
  let sum = f(a) + f(b);
  for (let i = 1; i < panels; i++) sum += (i % 2 === 1 ? 4 : 2) * f(a + i * h);
  return (sum * h) / 3;
}

/** Mass, mean, variance and 4th central moment of the binned density by integration over its two pieces. */
function integratedMoments(c: number, sigma: number, inner: number, outer: number): { mean: number; variance: number; m4: number } {
  const pdf = (x: number): number => phi((x - c) / sigma);
  const both = (g: (x: number) => number): number => simpson(g, c - outer, c - inner) + simpson(g, c + inner, c + outer);
  const mass = both(pdf);
  const mean = both((x) => x * pdf(x)) / mass;
  const variance = both((x) => (x - mean) ** 2 * pdf(x)) / mass;
  const m4 = both((x) => (x - mean) ** 4 * pdf(x)) / mass;
  return { mean, variance, m4 };
}

/** The same moments from the inverse-CDF draw on a fine midpoint grid of uniforms (a deterministic quadrature). */
function gridMoments(c: number, sigma: number, inner: number, outer: number, n = 400000): { mean: number; variance: number; m4: number } {
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = (i + 0.5) / n;
  binnedFromUnit(x, n, c, sigma, inner, outer);
  let mean = 0;
  for (let i = 0; i < n; i++) mean += x[i]!;
  mean /= n;
  let v = 0;
  let m4 = 0;
  for (let i = 0; i < n; i++) {
    const d = x[i]! - mean;
    v += d * d;
    m4 += d ** 4;
  }
  return { mean, variance: v / n, m4: m4 / n };
}

describe('binned distribution moments against numeric integration', () => {
  // A 2 % grade of a 10 kΩ part with 1 % sorted out, a 5 % grade with 1 % out, and a nearly empty middle.
  it.each([
    [0.02, 0.01],
    [0.05, 0.01],
    [0.01, 0.009],
    [0.05, 0.0001],
  ])('±%s band with ±%s sorted out: mean, σ and the 4th moment', (tol, sorted) => {
    const c = 10e3;
    const outer = tol * c;
    const inner = sorted * c;
    const sigma = outer / 3;
    const integrated = integratedMoments(c, sigma, inner, outer);
    const grid = gridMoments(c, sigma, inner, outer);
    expect(grid.mean / integrated.mean).toBeCloseTo(1, 9);
    expect(grid.variance / integrated.variance).toBeCloseTo(1, 4);
    expect(grid.m4 / integrated.m4).toBeCloseTo(1, 3);
    // The engine's σ (used by RSS) is a closed form (Johnson, Kotz & Balakrishnan §10.1); it must equal the integral.
    expect(binnedSigma(sigma, inner, outer) / Math.sqrt(integrated.variance)).toBeCloseTo(1, 7);
  });
});

describe('the design file exposes it: distribution "binned" with sortedOut', () => {
  function resolvedWith(mutate: (d: Record<string, any>) => void) {
    const d = baseDesign();
    mutate(d);
    return resolveDesign(validateDesign(d));
  }

  it('a 2 % resistor with 1 % sorted out becomes binned with the inner half removed; its σ is the integral\'s', () => {
    const resolved = resolvedWith((d) => {
      d.resistors = { grade: '2%', overrides: { RTOP: { distribution: 'binned', sortedOut: '1%' } } };
    });
    const part = buildSupplyModel(resolved.spec).parts.find((p) => p.name === 'RTOP')!;
    expect(part.distribution).toEqual({ kind: 'binned', k: 3, innerFraction: 0.5 });
    const c = 30e3;
    const integrated = integratedMoments(c, (0.02 * c) / 3, 0.01 * c, 0.02 * c);
    expect(partSigma(part) / Math.sqrt(integrated.variance)).toBeCloseTo(1, 6);
    expect(partMean(part)).toBeCloseTo(c, 9);
    // The other parts keep the default (uniform).
    expect(buildSupplyModel(resolved.spec).parts.find((p) => p.name === 'RBOT')!.distribution).toEqual({ kind: 'uniform' });
  });

  it('the reference can be binned, and offsets and bias currents choose their distribution', () => {
    const resolved = resolvedWith((d) => {
      d.reference = { voltage: '1.25 V', tolerance: '1%', distribution: 'binned', sortedOut: '0.5%' };
      d.current.amplifier.vosDistribution = 'normal';
      d.current.amplifier.biasCurrent = '±50 nA';
      d.current.amplifier.biasDistribution = 'triangular';
      d.current.compareOffset = '1 mV';
      d.current.compareOffsetDistribution = 'normal-unbounded';
      d.current.threshold.distribution = 'normal';
    });
    const parts = Object.fromEntries(buildSupplyModel(resolved.spec).parts.map((p) => [p.name, p.distribution]));
    expect(parts['Vref']).toEqual({ kind: 'binned', k: 3, innerFraction: 0.5 });
    expect(parts['Vos amp']).toEqual({ kind: 'truncated-normal', k: 3 });
    expect(parts['Ib amp']).toEqual({ kind: 'triangular' });
    expect(parts['Vos cmp']).toEqual({ kind: 'normal', k: 3 });
    expect(parts['Vth']).toEqual({ kind: 'truncated-normal', k: 3 });
  });

  it('without any of these fields the reference stays uniform (as before)', () => {
    const resolved = resolvedWith(() => undefined);
    expect(buildSupplyModel(resolved.spec).parts.find((p) => p.name === 'Vref')!.distribution).toEqual({ kind: 'uniform' });
  });
});
