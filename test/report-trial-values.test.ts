import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analysis/analyze.js';
import { ChunkRunner } from '../src/analysis/chunk.js';
import { buildSupplyModel } from '../src/analysis/models/supply.js';
import { firstTrials, jointYield } from '../src/analysis/trial-values.js';
import { samplesCsvHeader, samplesCsvRows } from '../src/report/samples-csv.js';
import { testSupply } from './report-supply-fixture.js';

describe('trial values drawn as the engine draws them', { timeout: 120_000 }, () => {
  const spec = testSupply();
  const model = buildSupplyModel(spec);

  it("equal the engine's own chunk values bit for bit, across a short last chunk", () => {
    const chunkSize = 1000;
    const runTrials = 1500; // chunk 0: 1000 trials, chunk 1: 500
    const mine = firstTrials(model, { seed: 's', chunkSize, runTrials }, 1500);
    const runner = new ChunkRunner(model, {
      seed: 's', chunkSize, trials: runTrials, ranges: model.outputs.map(() => ({ lo: -1e9, hi: 1e9 })), bins: 4,
      specs: model.outputs.map(() => null), keepSamples: true, chunkIntervals: false, perUnit: false,
    });
    const engine = [runner.run(0), runner.run(1)];
    model.outputs.forEach((_, o) => {
      const theirs = Float64Array.from([...engine[0].outputs[o].samples!.subarray(0, 1000), ...engine[1].outputs[o].samples!.subarray(0, 500)]);
      expect(mine.outputs[o]).toEqual(theirs);
    });
  });

  it("over a whole run: min and max equal analyze()'s exactly, the mean to rounding (summation order differs)", async () => {
    const result = await analyze(spec, { trials: 20000, seed: 42, workers: 1, chunkSize: 4096 });
    const mine = firstTrials(model, { seed: '42', chunkSize: 4096, runTrials: 20000 }, 20000);
    model.outputs.forEach((output, o) => {
      const values = mine.outputs[o];
      const r = result.outputs[output.name];
      expect(Math.min(...values)).toBe(r.min);
      expect(Math.max(...values)).toBe(r.max);
      const mean = values.reduce((a, b) => a + b, 0) / values.length;
      expect(Math.abs(mean - r.mean)).toBeLessThanOrEqual(Math.abs(r.mean) * 1e-12);
    });
  });

  it("joint yield: with one spec window it is that output's yield exactly; with two it is no more than either", async () => {
    const single = testSupply();
    delete single.windows!.ilimit;
    delete single.sense!.shunt.powerRatingW;
    const r1 = await analyze(single, { trials: 30000, seed: 'j', workers: 1 });
    const j1 = jointYield(buildSupplyModel(single), { seed: 'j', runTrials: 30000 }, 30000);
    expect(j1.outputs).toEqual(['vout']);
    expect(j1.pct).toBe(r1.outputs.vout.yield!.pct);

    const r2 = await analyze(spec, { trials: 30000, seed: 'j', workers: 1 });
    const j2 = jointYield(model, { seed: 'j', runTrials: 30000 }, 30000);
    expect(j2.outputs).toEqual(['vout', 'ilimit', 'shuntLoss']);
    for (const name of j2.outputs) expect(j2.pct).toBeLessThanOrEqual(r2.outputs[name].yield!.pct);
    // Independent-ish outputs: the joint yield is at least the union bound 100 − Σ(100 − yield_i).
    const union = 100 - j2.outputs.reduce((s, n) => s + (100 - r2.outputs[n].yield!.pct), 0);
    expect(j2.pct).toBeGreaterThanOrEqual(union - 1e-9);
    expect(j2.interval.low).toBeLessThanOrEqual(j2.pct);
    expect(j2.interval.high).toBeGreaterThanOrEqual(j2.pct);
  });

  it('CSV: a header with units, one row per trial, numbers that read back to the same doubles', () => {
    const values = firstTrials(model, { seed: 'c', runTrials: 100 }, 5);
    const header = samplesCsvHeader({ ...values, partUnits: model.parts.map((p) => p.unit), outputUnits: model.outputs.map((o) => o.unit) });
    const csv = header + samplesCsvRows({ ...values, offset: 0 }, 0, values.count);
    const lines = csv.trimEnd().split('\r\n');
    expect(lines).toHaveLength(6);
    expect(lines[0].split(',')).toEqual(['trial', ...model.parts.map((p) => (p.unit ? `${p.name} (${p.unit})` : p.name)), ...model.outputs.map((o) => `${o.name} (${o.unit})`)]);
    const row3 = lines[3].split(',').map(Number);
    expect(row3[0]).toBe(2);
    expect(row3.slice(1, 1 + model.parts.length)).toEqual(values.parts.map((p) => p[2]));
    expect(row3.slice(1 + model.parts.length)).toEqual(values.outputs.map((o) => o[2]));
    expect(csv).not.toMatch(/NaN|Infinity/);
  });
});
