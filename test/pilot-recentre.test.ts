// Re-centring with one resistor swap, checked by brute force: every other standard value of every swappable
// resistor's series within a decade either side is tried, and the best expected mean must be the one bestSwap finds.
import { describe, expect, it } from 'vitest';
import { nominalOutputs } from '../src/analysis/model.js';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { seriesValuesBetween } from '../src/series/enumerate.js';
import type { SeriesName } from '../src/series/load.js';
import { bestSwap, swappableResistors, SWAP_REACH } from '../src/pilot/recentre.js';
import { projectedYieldPct } from '../src/pilot/projected-yield.js';
import { testSupply } from './report-supply-fixture.js';

function bruteForce(spec: SupplySpec, output: string, measuredMean: number, centre: number, seriesOf: (d: string) => SeriesName): { designator: string; to: number; error: number } {
  const base = nominalOutputs(buildSupplyModel(spec))[output]!;
  let best = { designator: '', to: 0, error: Infinity };
  for (const r of swappableResistors(spec, seriesOf)) {
    for (const to of seriesValuesBetween(r.series, r.ohms / SWAP_REACH, r.ohms * SWAP_REACH)) {
      if (to === r.ohms) continue;
      const moved = nominalOutputs(buildSupplyModel(r.withValue(to)))[output]! - base;
      if (moved === 0) continue; // a resistor that does not set this output (the gain resistors for vout) is no swap for it
      const error = measuredMean + moved - centre;
      if (Math.abs(error) < Math.abs(best.error)) best = { designator: r.designator, to, error };
    }
  }
  return best;
}

describe('bestSwap against brute force over every single swap (small invented supply: R1/R2 divider, R3/R4 gain)', () => {
  const spec = testSupply();
  const seriesCases: Array<[string, (d: string) => SeriesName]> = [
    ['all E24', () => 'E24'],
    ['divider E96, gain E12', (d) => (d === 'R1' || d === 'R2' ? 'E96' : 'E12')],
  ];
  const base = nominalOutputs(buildSupplyModel(spec));
  for (const [label, seriesOf] of seriesCases) {
    it(`${label}: the swappable resistors are the divider and gain resistors, not the shunt`, () => {
      expect(swappableResistors(spec, seriesOf).map((r) => r.designator)).toEqual(['R1', 'R2', 'R3', 'R4']);
    });
    for (const output of ['vout', 'ilimit'] as const) {
      // Offsets from a fraction of one series step to several steps, either side.
      for (const offsetFraction of [-0.08, -0.021, -0.004, 0.003, 0.012, 0.05]) {
        it(`${label}, ${output} measured ${offsetFraction * 100} % off the centre`, () => {
          const centre = base[output]!;
          const measured = centre * (1 + offsetFraction);
          const found = bestSwap(spec, output, measured, centre, swappableResistors(spec, seriesOf))!;
          const brute = bruteForce(spec, output, measured, centre, seriesOf);
          expect(Math.abs(found.error)).toBeCloseTo(Math.abs(brute.error), 12);
          expect(found.error).toBeCloseTo(found.expectedMean - centre, 12);
          if (Math.abs(Math.abs(found.error) - Math.abs(brute.error)) > 1e-12) expect({ d: found.designator, to: found.to }).toEqual({ d: brute.designator, to: brute.to });
        });
      }
    }
  }
  it('an output no swappable resistor moves (the shunt loss moves with the gain, so use the divider current against only the gain resistors)', () => {
    const gainOnly = swappableResistors(spec, () => 'E24').filter((r) => r.designator === 'R3' || r.designator === 'R4');
    expect(bestSwap(spec, 'dividerCurrent', 1e-4, 1.1e-4, gainOnly)).toBeNull();
  });
});

describe('projected yield (the model moved to the measured mean, widened by the scale)', () => {
  it('an evenly spread grid on [0, 1) moved to mean 2 inside [1.75, 2.25] keeps half (closed form for a uniform)', () => {
    const n = 100000;
    const grid = Float64Array.from({ length: n }, (_, i) => (i + 0.5) / n);
    expect(projectedYieldPct(grid, 2, 1, [1.75, 2.25])).toBeCloseTo(50, 6);
    // Widened 2×: spans [1, 3), so [1.75, 2.25] holds a quarter.
    expect(projectedYieldPct(grid, 2, 2, [1.75, 2.25])).toBeCloseTo(25, 6);
  });
});
