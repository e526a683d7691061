// Per-unit yield: a trial is one unit, evaluated over the ambient grid, and counts only if it is inside the window at
// every grid ambient (src/analysis/unit-check.ts). The references here are computed without the engine: midpoint
// quadrature over the parts' uniform bands of a divider whose transfer is known in closed form.
import { describe, expect, it } from 'vitest';
import { ambientGrid } from '../src/analysis/ambient-grid.js';
import { monteCarlo } from '../src/analysis/monte-carlo.js';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { evaluateOutputs } from '../src/analysis/model.js';
import { drawChunkParts } from '../src/analysis/chunk.js';
import { jointYield } from '../src/analysis/trial-values.js';
import { loadDesignFile } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { join } from 'node:path';

/** Vref exact 1.25 V; 30k/10k at ±0.1 % uniform, TCR within ±200 ppm/K uniform; window ±0.3 % about 5 V. */
function plainDivider(minC: number, maxC: number): SupplySpec {
  const r = (name: string, nominal: number) => ({ name, nominal, tolerance: 0.001, tcrPerK: 200e-6 });
  return {
    reference: { nominal: 1.25, tolerance: 0 },
    divider: { top: { resistors: [r('RTOP', 30e3)] }, bottom: { resistors: [r('RBOT', 10e3)] } },
    temperature: { minC, maxC, monteCarlo: 'uniform' },
    windows: { vout: [5 * 0.997, 5 * 1.003] },
  };
}

/**
 * Share of units inside ±0.3 % at both ends of minC..maxC, by midpoint quadrature over (RTOP, RBOT, αTOP, αBOT),
 * each uniform on its band, m points per axis. Vout = 1.25·(1 + Rt(1 + αt·ΔT)/(Rb(1 + αb·ΔT))) is monotonic in ΔT
 * (a ratio of two linear functions), so the two ends decide a unit. With ends equal, one temperature.
 */
function dividerYieldByQuadrature(minC: number, maxC: number, m: number): number {
  const mid = (i: number) => (i + 0.5) / m * 2 - 1; // midpoints of [−1, 1]
  const lo = 5 * 0.997;
  const hi = 5 * 1.003;
  const ends = minC === maxC ? [minC - 25] : [minC - 25, maxC - 25];
  let pass = 0;
  let total = 0;
  for (let a = 0; a < m; a++) {
    const rt = 30e3 * (1 + 0.001 * mid(a));
    for (let b = 0; b < m; b++) {
      const rb = 10e3 * (1 + 0.001 * mid(b));
      for (let c = 0; c < m; c++) {
        const at = 200e-6 * mid(c);
        for (let d = 0; d < m; d++) {
          const ab = 200e-6 * mid(d);
          let ok = true;
          for (const dT of ends) {
            const v = 1.25 * (1 + (rt * (1 + at * dT)) / (rb * (1 + ab * dT)));
            if (v < lo || v > hi) ok = false;
          }
          if (ok) pass++;
          total++;
        }
      }
    }
  }
  return pass / total;
}

/** Monte Carlo standard error of a yield p from n units: √(p(1 − p)/n). */
const standardError = (p: number, n: number): number => Math.sqrt((p * (1 - p)) / n);

describe('per-unit yield against quadrature', () => {
  it('a wide range (−40…90 °C): the share of units in spec at every ambient, not a random unit at a random ambient', async () => {
    const spec = plainDivider(-40, 90);
    const trials = 200_000;
    const mc = await monteCarlo(buildSupplyModel(spec), { trials, seed: 'unit-wide', workers: 1 });
    const vout = mc.outputs.find((o) => o.name === 'vout')!;
    // 48 points per axis: the pass region's boundary cuts ~4·48³ of 48⁴ cells, an error well below 0.5 % absolute.
    const reference = dividerYieldByQuadrature(-40, 90, 48);
    expect(reference).toBeGreaterThan(0.2);
    expect(reference).toBeLessThan(0.3);
    const se = standardError(reference, trials);
    expect(Math.abs(vout.yield!.pct / 100 - reference)).toBeLessThan(4 * se + 0.005);
    // The random-ambient figure is far higher (a unit at one random ambient is out less often).
    expect(vout.yieldAtRandomAmbient!.pct).toBeGreaterThan(vout.yield!.pct + 20);
    expect(mc.allSpecs!.pct).toBe(vout.yield!.pct);
    expect(mc.ambientGridC).toEqual(ambientGrid(-40, 90));
  });

  it('no temperature range (25 °C only): per-unit and random-ambient yields are the same count, and match quadrature', async () => {
    const spec = plainDivider(25, 25);
    const trials = 200_000;
    const mc = await monteCarlo(buildSupplyModel(spec), { trials, seed: 'unit-fixed', workers: 1 });
    const vout = mc.outputs.find((o) => o.name === 'vout')!;
    expect(vout.yield!.pct).toBe(vout.yieldAtRandomAmbient!.pct);
    const reference = dividerYieldByQuadrature(25, 25, 64);
    expect(Math.abs(vout.yield!.pct / 100 - reference)).toBeLessThan(4 * standardError(reference, trials) + 0.003);
    expect(mc.ambientGridC).toEqual([25]);
  });

  it('the grade search’s joint counter counts the same units as the engine’s all-specs yield (a divider with feedback-pin bias, a full and a short chunk)', async () => {
    const spec: SupplySpec = { ...plainDivider(-40, 90), windows: { vout: [5 * 0.996, 5 * 1.004] } };
    spec.divider!.feedbackBias = { nominal: 0, plusMinus: 50e-9 };
    const model = buildSupplyModel(spec);
    const trials = 70_000; // a full chunk and a short one
    const mc = await monteCarlo(model, { trials, seed: 'joint', workers: 1 });
    const joint = jointYield(buildSupplyModel(spec), { seed: 'joint', runTrials: trials }, trials);
    expect(joint.inSpec).toBe(Math.round((mc.allSpecs!.pct / 100) * trials));
    expect(joint.pct).toBe(mc.allSpecs!.pct);
  });

  it('the same numbers for 1 and 2 workers', async () => {
    const spec = plainDivider(-40, 90);
    // The same source for both, so both runs take the same kernel (its note is part of the result).
    const one = await monteCarlo(buildSupplyModel(spec), { trials: 150_000, seed: 'w', workers: 1, source: { kind: 'supply', spec } });
    const two = await monteCarlo(buildSupplyModel(spec), { trials: 150_000, seed: 'w', workers: 2, source: { kind: 'supply', spec } });
    expect(JSON.stringify({ ...two, workers: 0 })).toBe(JSON.stringify({ ...one, workers: 0 }));
  });
});

describe('the ambient grid', () => {
  it('evenly spaced, ends included, 25 °C added inside the range; one point for a single temperature', () => {
    expect(ambientGrid(0, 40)).toEqual([0, 10, 20, 25, 30, 40]);
    expect(ambientGrid(-40, 90)).toEqual([-40, -7.5, 25, 57.5, 90]);
    expect(ambientGrid(-40, 90, 2)).toEqual([-40, 25, 90]);
    expect(ambientGrid(30, 60, 2)).toEqual([30, 60]);
    expect(ambientGrid(25, 25)).toEqual([25]);
  });

  it.each(['charger-2s-liion.json', 'bench-adjustable.json', 'led-driver-highside.json'])(
    '%s: every unit’s extremes over the default grid are within 1e-3 of the window half-width of those over 129 points',
    (file) => {
      const resolved = resolveDesign(loadDesignFile(join(PROJECT_ROOT, 'examples', file)));
      const model = buildSupplyModel(resolved.spec);
      const n = 4000;
      const p = model.parts.map(() => new Float64Array(n));
      drawChunkParts(model.parts, 'grid-check', 0, p, n);
      const outs = model.outputs.map(() => new Float64Array(n));
      const extremes = (grid: number[]) => {
        const lo = model.outputs.map(() => new Float64Array(n).fill(Infinity));
        const hi = model.outputs.map(() => new Float64Array(n).fill(-Infinity));
        for (const t of grid) {
          p[model.ambient!.part]!.fill(t);
          evaluateOutputs(model, p, outs, n);
          outs.forEach((x, o) => {
            for (let j = 0; j < n; j++) {
              lo[o]![j] = Math.min(lo[o]![j]!, x[j]!);
              hi[o]![j] = Math.max(hi[o]![j]!, x[j]!);
            }
          });
        }
        return { lo, hi };
      };
      const { minC, maxC } = resolved.spec.temperature;
      const coarse = extremes(model.ambient!.gridC);
      const fine = extremes(ambientGrid(minC, maxC, 129));
      model.outputs.forEach((output, o) => {
        if (!output.spec) return;
        const half = (output.spec[1] - output.spec[0]) / 2;
        let miss = 0;
        for (let j = 0; j < n; j++) miss = Math.max(miss, fine.hi[o]![j]! - coarse.hi[o]![j]!, coarse.lo[o]![j]! - fine.lo[o]![j]!);
        expect(miss / half).toBeLessThan(1e-3);
      });
    },
  );
});
