// The Monte Carlo engine's fast loops against their clear reference versions, value for value (Object.is: the same
// bits, so a seed's numbers do not move when a loop is made faster). The references are written here plainly,
// one draw or one trial at a time, straight from the formulas named beside each.
import { describe, expect, it } from 'vitest';
import { chunkState, fillXor128 } from '../src/analysis/chunk-random.js';
import { binnedFromUnit } from '../src/tolerance/distributions/binned.js';
import { inverseNormalCdf, normalCdf, normalQuantilesInPlace } from '../src/tolerance/distributions/normal.js';
import { truncatedNormalFromUnit } from '../src/tolerance/distributions/truncated-normal.js';

/** Uniforms from a chunk's stream, plus the edge values of inverseNormalCdf's regions (0, P_LOW, P_HIGH, 1 − 2⁻³²). */
function uniforms(n: number, seed: string): Float64Array {
  const u = new Float64Array(n);
  fillXor128(chunkState(seed, 0), u, n);
  const edges = [0, 2 ** -33, 2 ** -32, 0.02425, 0.02425 - 1e-17, 0.02425 + 1e-17, 1 - 0.02425, 0.97575, 0.97575 + 1e-16, 0.5, 1 - 2 ** -32];
  edges.forEach((e, i) => (u[i * 7] = e));
  return u;
}

function sameBits(fast: Float64Array, reference: Float64Array): number {
  let differ = 0;
  for (let j = 0; j < fast.length; j++) if (!Object.is(fast[j], reference[j])) differ++;
  return differ;
}

describe('normal draws: the two-pass Φ⁻¹ loop equals Acklam’s function draw by draw', () => {
  it('μ + σ·Φ⁻¹(u) for 200 000 uniforms and the region edges (Acklam 2003; reference: inverseNormalCdf per draw)', () => {
    const u = uniforms(200_000, 'normal');
    const fast = u.slice();
    normalQuantilesInPlace(fast, fast.length, 1.25, 0.0125 / 3);
    const reference = u.map((v) => 1.25 + (0.0125 / 3) * inverseNormalCdf(v));
    expect(sameBits(fast, reference)).toBe(0);
    // About 4.85 % of uniform draws fall in the tails (2 × 0.02425): the slow path was really exercised.
    const tails = u.filter((v) => v < 0.02425 || v > 1 - 0.02425).length;
    expect(tails / u.length).toBeGreaterThan(0.045);
  });

  it('only part of the buffer (n < length) is touched', () => {
    const u = uniforms(1000, 'part');
    const fast = u.slice();
    normalQuantilesInPlace(fast, 600, 0, 1);
    expect(sameBits(fast.subarray(600), u.subarray(600))).toBe(0);
    expect(sameBits(fast.subarray(0, 600), u.subarray(0, 600).map((v) => inverseNormalCdf(v)))).toBe(0);
  });

  it('truncated normal: Φ⁻¹(Φ(α) + u·(Φ(β) − Φ(α))) clamped to the band, per draw', () => {
    const u = uniforms(100_000, 'truncated');
    const [mean, sigma, lo, hi] = [0.92, 0.0092 / 3, 0.92 - 0.0092, 0.92 + 0.0092];
    const fast = u.slice();
    truncatedNormalFromUnit(fast, fast.length, mean, sigma, lo, hi);
    const pLo = normalCdf((lo - mean) / sigma);
    const span = normalCdf((hi - mean) / sigma) - pLo;
    const reference = u.map((v) => Math.min(hi, Math.max(lo, mean + sigma * inverseNormalCdf(pLo + span * v))));
    expect(sameBits(fast, reference)).toBe(0);
  });

  it('binned: the two pieces of [Φ(−W/σ), Φ(W/σ)] outside ±I, per draw', () => {
    const u = uniforms(100_000, 'binned');
    const [center, sigma, inner, outer] = [100, 2 / 3, 1, 2];
    const fast = u.slice();
    binnedFromUnit(fast, fast.length, center, sigma, inner, outer);
    const lowStart = normalCdf(-outer / sigma);
    const pieceMass = normalCdf(-inner / sigma) - lowStart;
    const highStart = normalCdf(inner / sigma);
    const reference = u.map((v) => {
      const w = 2 * pieceMass * v;
      const p = w < pieceMass ? lowStart + w : highStart + (w - pieceMass);
      return Math.min(center + outer, Math.max(center - outer, center + sigma * inverseNormalCdf(p)));
    });
    expect(sameBits(fast, reference)).toBe(0);
  });
});
