// The WebAssembly evaluation of given part columns (src/analysis/kernel/wasm-evaluator.ts) against the JavaScript
// reference it replaces in the grade search: evaluateOutputs and UnitChecker (src/analysis/model.ts,
// src/analysis/unit-check.ts), on every example the kernel supports (examples/*.json resolved as `design` does, the
// adjustable one at both ends of its pot, and examples/engine/*.json), each also with every resistor in another
// grade (a variant the same evaluator serves). Compared: every output at the drawn values, every output at each
// ambient of the grid, each output's pass flags and the all-specs flags, with windows narrowed so that about half
// the units fail (a comparison where every unit passes would prove little). Then the paired sample's counts with
// and without the evaluator, the joint yield of the re-run, and `grades --json` with --kernel js and --kernel wasm.
// Tolerance: none. The kernel's evaluate is the JavaScript model's operations in the same order per trial (see
// test/wasm-kernel.test.ts), so outputs must match to the bit and flags exactly.
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { drawChunkParts } from '../src/analysis/chunk.js';
import { gradableResistors } from '../src/analysis/graded-spec.js';
import { jointYieldAsync } from '../src/analysis/joint-yield-async.js';
import { kernelSupports } from '../src/analysis/kernel/supports.js';
import { sameKernelLayout, variantEvaluator, WasmUnitEvaluator } from '../src/analysis/kernel/wasm-evaluator.js';
import { evaluateOutputs, type Model } from '../src/analysis/model.js';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { PAIRED_BLOCK, PairedSample } from '../src/analysis/paired-trials.js';
import { UnitChecker } from '../src/analysis/unit-check.js';
import { gradedModels, specWithGrades } from '../src/design/graded-models.js';
import { GRADES, type Grade } from '../src/design/grades.js';
import { loadDesignFile } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { InputError } from '../src/errors.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { buildIfMissing, runTrimfree } from './cli-subprocess.js';
import { exampleSpecs } from './example-specs.js';
import { ensureKernelBuilt } from './kernel-build.js';
import { withoutWallTime } from './wall-time.js';

beforeAll(() => {
  ensureKernelBuilt();
  buildIfMissing();
}, 120_000);

/** Examples the kernel declines (test/wasm-kernel.test.ts lists the same), with the field it does not implement. */
const KERNEL_DECLINES: Record<string, string> = {
  'led-driver-highside-network.json': 'networks (resistor network draws: shared and per-member parts)',
};

const grade = (name: string): Grade => GRADES.find((g) => g.name === name)!;

/** The bits of a column, for comparisons that tell −0 from +0 and compare NaNs by payload. */
function bits(x: Float64Array): string {
  return Buffer.from(x.buffer, x.byteOffset, x.byteLength).toString('hex');
}

/** The model with each checked window moved to the middle half of its output's drawn values, so about half fail. */
function narrowed(model: Model, p: Float64Array[], n: number): Model {
  const outs = model.outputs.map(() => new Float64Array(n));
  evaluateOutputs(model, p, outs, n);
  return {
    ...model,
    outputs: model.outputs.map((o, i) => {
      if (!o.spec) return o;
      const sorted = outs[i]!.slice().sort();
      return { ...o, spec: [sorted[Math.floor(n * 0.15)]!, sorted[Math.floor(n * 0.85)]!] as [number, number] };
    }),
  };
}

/** Compares outputs at the drawn values, at every grid ambient, and all flags, between the kernel and the reference. */
function expectSameAsReference(evaluator: WasmUnitEvaluator, model: Model, p: Float64Array[], n: number, label: string): { failed: number } {
  const reference = model.outputs.map(() => new Float64Array(n));
  evaluateOutputs(model, p, reference, n);
  const kernel = model.outputs.map(() => new Float64Array(n));
  evaluator.evaluate(model, p, kernel, n);
  model.outputs.forEach((o, i) => expect(bits(kernel[i]!), `${label}: ${o.name} as drawn`).toBe(bits(reference[i]!)));

  const checker = new UnitChecker(model, n);
  const atAmbientJs: string[][] = [];
  checker.check(p, n, reference, (g, outs) => (atAmbientJs[g] = outs.map((x) => bits(x.subarray(0, n)))));
  const atAmbientWasm: string[][] = [];
  const all = evaluator.check(model, p, n, (g, outs) => (atAmbientWasm[g] = outs.map(bits))).slice();
  expect(atAmbientWasm, `${label}: outputs at each grid ambient`).toEqual(atAmbientJs);
  expect(atAmbientWasm.length, label).toBe(model.ambient?.gridC.length ?? 0);
  checker.checked.forEach((c, i) => expect(Array.from(evaluator.passOf(i, n)), `${label}: pass flags of ${model.outputs[c.index]!.name}`).toEqual(Array.from(checker.pass[i]!.subarray(0, n))));
  expect(Array.from(all), `${label}: all-specs flags`).toEqual(Array.from(checker.all.subarray(0, n)));
  const passed = all.reduce((s, f) => s + f, 0);
  expect(evaluator.countAll(n)).toBe(passed);
  return { failed: n - passed };
}

describe('every example the kernel supports: the same outputs and flags as the JavaScript model and UnitChecker', () => {
  // An odd block (the kernel works two trials at a time) that is not the evaluator's capacity.
  const n = 3001;
  for (const { name, spec } of exampleSpecs()) {
    const declined = KERNEL_DECLINES[name.replace(/ \(low end\)$/, '')];
    it(declined ? `${name}: declined by the kernel (${declined})` : name, () => {
      if (declined) {
        expect(kernelSupports(spec)).toBe(false);
        return;
      }
      expect(kernelSupports(spec)).toBe(true);
      // The design as it is, and every resistor in 5 % and in 0.1 % (the grade study's variants). The graded variants
      // share one layout (the grade search asks that of every candidate grade); the design as it is may not (a
      // resistor without a TCR in the file gets its grade's TCR part when graded), and then has an evaluator of its own.
      const resistors = gradableResistors(spec);
      const graded = ['5%', '0.1%'].map((g) => specWithGrades(spec, resistors, resistors.map(() => grade(g))));
      const gradedModel = buildSupplyModel(graded[0]!);
      expect(sameKernelLayout({ spec: graded[0]!, model: gradedModel }, { spec: graded[1]!, model: buildSupplyModel(graded[1]!) })).toBe(true);
      expect(variantEvaluator(graded, 'auto', PAIRED_BLOCK)).toBeInstanceOf(WasmUnitEvaluator);
      const designed = buildSupplyModel(spec);
      const groups: Array<{ layoutSpec: SupplySpec; base: Model; variants: SupplySpec[] }> = sameKernelLayout({ spec, model: designed }, { spec: graded[0]!, model: gradedModel })
        ? [{ layoutSpec: spec, base: designed, variants: [spec, ...graded] }]
        : [
            { layoutSpec: spec, base: designed, variants: [spec] },
            { layoutSpec: graded[0]!, base: gradedModel, variants: graded },
          ];
      for (const [groupIndex, group] of groups.entries()) {
        const p = group.base.parts.map(() => new Float64Array(n));
        drawChunkParts(group.base.parts, `evaluator:${name}`, 3, p, n);
        const tight = narrowed(group.base, p, n);
        // Per unit over the grid, and (an evaluator of the model without its grid) at the drawn values.
        const { ambient: _grid, ...asDrawnModel } = tight;
        for (const [kind, model] of [['per unit', tight], ['as drawn', asDrawnModel as Model]] as const) {
          const evaluator = new WasmUnitEvaluator(group.layoutSpec, model, 4096);
          for (const [v, variantSpec] of group.variants.entries()) {
            // Each variant's own parts (drawn in its bands) under the base model's windows, by the one evaluator.
            const built = buildSupplyModel(variantSpec);
            const variant: Model = { ...model, parts: built.parts };
            const q = built.parts.map(() => new Float64Array(n));
            drawChunkParts(built.parts, `evaluator:${name}`, 3, q, n);
            const { failed } = expectSameAsReference(evaluator, variant, q, n, `${name}, group ${groupIndex} variant ${v}, ${kind}`);
            if (v === 0) {
              // The narrowed windows make the comparison of flags mean something: units both pass and fail.
              expect(failed, `${name} ${kind}: failing units`).toBeGreaterThan(n * 0.2);
              expect(failed, `${name} ${kind}: failing units`).toBeLessThan(n * 0.98);
            }
          }
        }
      }
    });
  }
});

describe('one evaluator for the variants of a design', () => {
  const spec = resolveDesign(loadDesignFile(join(PROJECT_ROOT, 'examples', 'led-driver-highside.json'))).spec;
  const resistors = gradableResistors(spec);
  const everyGrade = GRADES.map((g) => specWithGrades(spec, resistors, resistors.map(() => g)));

  it('every grade of the LED example gives the kernel the same layout, so variantEvaluator returns one', () => {
    const base = { spec: everyGrade[0]!, model: buildSupplyModel(everyGrade[0]!) };
    for (const s of everyGrade) expect(sameKernelLayout(base, { spec: s, model: buildSupplyModel(s) })).toBe(true);
    expect(variantEvaluator(everyGrade, 'auto', PAIRED_BLOCK)).toBeInstanceOf(WasmUnitEvaluator);
    expect(variantEvaluator(everyGrade, 'wasm', PAIRED_BLOCK)).toBeInstanceOf(WasmUnitEvaluator);
  });

  it('--kernel js keeps the JavaScript model; a design the kernel declines too (auto), or an input error (wasm)', () => {
    expect(variantEvaluator(everyGrade, 'js', PAIRED_BLOCK)).toBeNull();
    const network = resolveDesign(loadDesignFile(join(PROJECT_ROOT, 'examples', 'led-driver-highside-network.json'))).spec;
    expect(kernelSupports(network)).toBe(false);
    expect(variantEvaluator([network], 'auto', PAIRED_BLOCK)).toBeNull();
    expect(() => variantEvaluator([network], 'wasm', PAIRED_BLOCK)).toThrow(InputError);
  });

  it('a different wiring is not the same layout (another common-mode voltage, or the threshold from another source)', () => {
    if (spec.sense?.topology !== 'diff') throw new Error('the LED example is expected to sense with a difference amplifier');
    const model = buildSupplyModel(spec);
    const moved: SupplySpec = { ...spec, sense: { ...spec.sense, commonModeV: spec.sense.commonModeV + 1 } };
    expect(sameKernelLayout({ spec, model }, { spec: moved, model: buildSupplyModel(moved) })).toBe(false);
    expect(variantEvaluator([spec, moved], 'auto', PAIRED_BLOCK)).toBeNull();
  });

  it('checkRange (columns kept in the kernel while the same arrays come back) gives check\'s flags, across variants and lengths', () => {
    const models = GRADES.filter((g) => ['10%', '1%', '0.1%'].includes(g.name)).map((g) => buildSupplyModel(specWithGrades(spec, resistors, resistors.map(() => g))));
    const evaluator = variantEvaluator(everyGrade, 'auto', PAIRED_BLOCK)!;
    const variant = (m: number): Model => ({ ...models[0]!, parts: models[m]!.parts });
    for (const length of [100, 1500, 3001, 20_000]) {
      // Each variant's columns, drawn once (arrays that never change, as the paired sample's).
      const columns = models.map((m) => {
        const p = m.parts.map(() => new Float64Array(length));
        drawChunkParts(m.parts, `range ${length}`, 0, p, length);
        return p;
      });
      let failing = 0;
      // Variants and blocks interleaved, so kept columns are replaced and reused, at starts that are not block-aligned.
      for (const [m, start, n] of [[0, 0, 64], [1, 0, 64], [0, 37, 63], [2, length - 64, 64], [1, 5, Math.min(4096, length - 5)], [0, 0, Math.min(4096, length)], [2, 1, 1]] as const) {
        const model = variant(m);
        const expected = Array.from(evaluator.check(model, columns[m]!.map((c) => c.subarray(start, start + n)), n));
        const got = Array.from(evaluator.checkRange(model, columns[m]!, start, n));
        expect(got, `length ${length}, variant ${m}, units ${start}..${start + n}`).toEqual(expected);
        failing += expected.filter((f) => f === 0).length;
      }
      expect(failing, `length ${length}: some units fail`).toBeGreaterThan(0);
    }
  });

  it('throws for a model with other parts, other windows, or a block past its capacity', () => {
    const model = buildSupplyModel(spec);
    const evaluator = new WasmUnitEvaluator(spec, model, 64);
    const p = model.parts.map(() => new Float64Array(64));
    drawChunkParts(model.parts, 'throws', 0, p, 64);
    expect(() => evaluator.check({ ...model, parts: model.parts.slice().reverse() }, p.slice().reverse(), 64)).toThrow(/not the parts/);
    expect(() => evaluator.check({ ...model, outputs: model.outputs.map((o) => (o.spec ? { ...o, spec: [o.spec[0], o.spec[1] * 2] as [number, number] } : o)) }, p, 64)).toThrow(/windows/);
    expect(() => evaluator.check(model, p, 65)).toThrow(/capacity/);
  });
});

describe('the paired sample and the re-run with the evaluator: the same counts as with the JavaScript model', { timeout: 120_000 }, () => {
  const spec = resolveDesign(loadDesignFile(join(PROJECT_ROOT, 'examples', 'led-driver-highside.json'))).spec;
  const resistors = gradableResistors(spec);
  const candidates = ['10%', '1%', '0.1%'].map(grade);
  const models = gradedModels(spec, resistors, candidates);
  const evaluator = variantEvaluator(candidates.map((g) => specWithGrades(spec, resistors, resistors.map(() => g))), 'auto', PAIRED_BLOCK)!;

  it('every count, complete or stopped, on a sample of two chunks (count and countAsync alike)', async () => {
    const trials = 70_000; // 65536 + 4464: a chunk boundary inside the sample
    const js = new PairedSample(models.modelFor(resistors.map(() => candidates[0]!)).parts.length, { seed: 'paired', trials });
    const wasm = new PairedSample(js.partCount, { seed: 'paired', trials, blockChecker: evaluator });
    const paused = new PairedSample(js.partCount, { seed: 'paired', trials, blockChecker: evaluator });
    const assignments = [
      resistors.map(() => grade('10%')),
      resistors.map(() => grade('1%')),
      resistors.map((_, i) => (i % 2 === 0 ? grade('0.1%') : grade('1%'))),
      resistors.map(() => grade('0.1%')),
      resistors.map((_, i) => (i < 3 ? grade('10%') : grade('0.1%'))),
    ];
    let stopped = 0;
    let failing = 0;
    // The same sequence of calls on both samples, so their lists of earlier failures (checked first) stay alike.
    for (const chosen of assignments) {
      const model = models.modelFor(chosen);
      for (const limits of [{}, { maxFailures: 70 }, { maxFailures: 7000 }, { maxFailures: 70, maxUnits: 2048 }]) {
        const a = js.count(model, limits);
        const b = wasm.count(model, limits);
        expect(b, `${chosen.map((g) => g.name).join(' ')} ${JSON.stringify(limits)}`).toEqual(a);
        expect(await paused.countAsync(model, limits)).toEqual(a);
        if (!a.complete) stopped++;
        if (a.failures > 0) failing++;
      }
    }
    expect(stopped).toBeGreaterThan(0);
    expect(failing).toBeGreaterThan(0);
  });

  it('the joint yield of a re-run: the same count as jointYieldAsync on the JavaScript model', async () => {
    const trials = 70_000;
    for (const chosen of [resistors.map(() => grade('10%')), resistors.map(() => grade('1%'))]) {
      const model = buildSupplyModel(specWithGrades(spec, resistors, chosen));
      const a = await jointYieldAsync(model, { seed: '4', runTrials: trials }, trials);
      const b = await jointYieldAsync(model, { seed: '4', runTrials: trials }, trials, evaluator);
      expect(b).toEqual(a);
      expect(a.inSpec).toBeLessThan(trials);
    }
  });
});

describe('grades --json: the same document with --kernel js and --kernel wasm', { timeout: 240_000 }, () => {
  it('LED example, all ten grades (seconds blanked)', () => {
    const args = ['grades', join(PROJECT_ROOT, 'examples', 'led-driver-highside.json'), '--trials', '20000', '--search-trials', '10000', '--grades', GRADES.map((g) => g.name).join(','), '--json'];
    const js = runTrimfree([...args, '--kernel', 'js']);
    const wasm = runTrimfree([...args, '--kernel', 'wasm']);
    expect(js.status, js.stderr).toBe(0);
    expect(wasm.status, wasm.stderr).toBe(0);
    const doc = JSON.parse(js.stdout) as { method: { assignments: number; screened: number }; cheapest: { found: boolean } };
    // A search that did some work, so the comparison covers the search, the re-run and the upgrade.
    expect(doc.method.assignments + doc.method.screened).toBeGreaterThan(10);
    expect(withoutWallTime(wasm.stdout)).toBe(withoutWallTime(js.stdout));
  });
});
