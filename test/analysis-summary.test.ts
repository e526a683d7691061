// analyzeSummary (the grade study's side-by-side rows) against analyze: every figure a summary gives is the full
// analysis's, to the bit, and it leaves out exactly the variance-based shares, the shortest intervals and the
// per-ambient sweep. On every example (examples/*.json resolved as `design` does, both ends of a pot, and
// examples/engine/*.json; the kernel runs those it supports, the JavaScript reference the others), over two chunks
// with exact quantiles from the kept values, and with quantiles read from the histogram (a memory cap of one byte),
// and on a model without an ambient grid. The reference is the full analysis, whose figures the other tests check
// against closed forms and published values.
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyze, analyzeSummary } from '../src/analysis/analyze.js';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import type { Model } from '../src/analysis/model.js';
import { loadDesignFile } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { exampleSpecs } from './example-specs.js';
import { ensureKernelBuilt } from './kernel-build.js';

beforeAll(() => ensureKernelBuilt(), 120_000);

/** What a summary's output leaves out of the full one. */
const LEFT_OUT = ['ambientSweep', 'contributions', 'shortest95', 'shortest9973', 'varianceBudget'];

/** The figures of the full analysis a summary must give, and the summary, as JSON text (bits of every double kept:
 *  JSON.stringify writes the shortest text that reads back to the same double). */
async function bothAnalyses(input: SupplySpec | Model, options: Parameters<typeof analyze>[1]): Promise<void> {
  const full = await analyze(input, options);
  const summary = await analyzeSummary(input, options);
  const { outputs: fullOutputs, notes: fullNotes, ...fullRest } = full;
  const { outputs: summaryOutputs, notes: summaryNotes, ...summaryRest } = summary;
  expect(summaryRest).toEqual(fullRest);
  expect(Object.keys(summaryOutputs)).toEqual(Object.keys(fullOutputs));
  for (const [name, output] of Object.entries(fullOutputs)) {
    const kept = Object.fromEntries(Object.entries(output).filter(([key]) => !LEFT_OUT.includes(key)));
    expect(JSON.stringify(summaryOutputs[name]), name).toBe(JSON.stringify(kept));
    for (const key of LEFT_OUT) expect(summaryOutputs[name]!, `${name} has no ${key}`).not.toHaveProperty(key);
  }
  // The notes: the full run's, less the one on the variance-based shares it did not compute.
  expect(summaryNotes).toEqual(fullNotes.filter((n) => !n.startsWith('Shares of the variance:')));
  expect(fullNotes.length - summaryNotes.length).toBe(1);
}

describe('analyzeSummary: the full analysis less what a side-by-side row never shows', { timeout: 240_000 }, () => {
  for (const { name, spec } of exampleSpecs()) {
    it(`${name}: exact quantiles (two chunks) and quantiles from the histogram`, async () => {
      await bothAnalyses(spec, { trials: 70_000, seed: 3, workers: 1 });
      await bothAnalyses(spec, { trials: 20_000, seed: 4, workers: 1, sampleMemoryBytes: 1 });
    });
  }

  it('a model without an ambient grid (Cp/Cpk from the drawn units)', async () => {
    const spec = resolveDesign(loadDesignFile(join(PROJECT_ROOT, 'examples', 'charger-2s-liion.json'))).spec;
    const { ambient: _grid, ...model } = buildSupplyModel(spec);
    expect(_grid).toBeDefined();
    await bothAnalyses(model, { trials: 30_000, seed: 5, workers: 1 });
  });
});
