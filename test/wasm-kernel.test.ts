// The WebAssembly chunk kernel (src/analysis/kernel/assembly/chunk-kernel.ts) against the JavaScript reference (src/analysis/chunk.ts,
// the readable version the engine keeps):
// - every example (examples/*.json resolved as `design` does, the adjustable one at both ends of its pot, and
//   examples/engine/*.json) gives the same analysis JSON on both kernels, per unit and at a random ambient, for a
//   fixed trial count (three chunks, the last one short, so exact quantiles from kept values) and an adaptive run
//   (JCGM 101:2008 7.9, each chunk's own interval); the only difference allowed is the note naming the kernel;
// - invented supplies that reach every distribution (uniform, normal, truncated normal, triangular, binned, held
//   fixed, no spread), every topology (direct, noninv, diff), self-heating, both threshold kinds, a two-part leg
//   in series and in parallel, a potentiometer and a feedback-pin current give the same chunk summaries;
// - kernelSupports declines a spec with any key it does not know, at every level, so new fields run on js;
// - the .wasm in dist/ is what the build makes from the source: built twice, the same bytes, and those of dist/.
// Tolerance: none. Both kernels run the same IEEE 754 double operations in the same order per trial (+, −, ×, ÷
// and √ are correctly rounded in JavaScript and in WebAssembly alike; the one logarithm is exactLog in both, see
// test/exact-log.test.ts), and every sum runs in trial order, so there is no reordering to allow for: the figures
// must match to the bit, and any difference is a defect of one of them.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyze } from '../src/analysis/analyze.js';
import { ChunkRunner, type ChunkConfig, type ChunkSummary } from '../src/analysis/chunk.js';
import { chooseKernel } from '../src/analysis/kernel/choice.js';
import { kernelSupports } from '../src/analysis/kernel/supports.js';
import { KERNEL_WASM } from '../src/analysis/kernel/wasm-module.js';
import { WasmChunkRunner } from '../src/analysis/kernel/wasm-runner.js';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { InputError } from '../src/errors.js';
import { stringifyReport } from '../src/report/json.js';
import { exampleSpecs } from './example-specs.js';
import { buildKernel, ensureKernelBuilt } from './kernel-build.js';

beforeAll(() => ensureKernelBuilt(), 120_000);

/** The analysis as JSON with the kernel's own note blanked (the one line allowed to differ). */
function withoutKernelNote(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) => (typeof v === 'string' && v.startsWith('Kernel: ') ? 'Kernel: …' : v));
}

const THREE_CHUNKS = 2 * 65_536 + 5_000;

/** Examples that use a field the kernel does not implement yet (kernelSupports declines them), with the field. */
const KERNEL_DECLINES: Record<string, string> = {
  'led-driver-highside-network.json': 'networks (resistor network draws: shared and per-member parts)',
};

describe('every example: the same analysis on the wasm kernel as on the JavaScript reference', { timeout: 240_000 }, () => {
  for (const { name, spec } of exampleSpecs()) {
    it(`${name}: per unit and at a random ambient (${THREE_CHUNKS} trials), and adaptive`, async () => {
      if (KERNEL_DECLINES[name] !== undefined) {
        // A design the kernel does not implement runs on the reference under auto, and forcing wasm is refused.
        expect(kernelSupports(spec)).toBe(false);
        expect(chooseKernel('auto', { kind: 'supply', spec })).toBe('js');
        expect(() => chooseKernel('wasm', { kind: 'supply', spec })).toThrow(InputError);
        return;
      }
      expect(kernelSupports(spec)).toBe(true);
      const runs = [
        { trials: THREE_CHUNKS, seed: 11, workers: 1, perUnit: true },
        { trials: THREE_CHUNKS, seed: 12, workers: 1, perUnit: false },
        { trials: 'auto' as const, maxTrials: 4 * 65_536, seed: 13, workers: 1 },
      ];
      for (const options of runs) {
        const js = await analyze(spec, { ...options, kernel: 'js' });
        const wasm = await analyze(spec, { ...options, kernel: 'wasm' });
        expect(js.notes).toContain('Kernel: js (the JavaScript reference chunk kernel).');
        expect(wasm.notes.some((n) => n.startsWith('Kernel: wasm'))).toBe(true);
        // stringifyReport throws on NaN or Infinity, as the CLI's JSON does.
        expect(withoutKernelNote(JSON.parse(stringifyReport(wasm)))).toBe(withoutKernelNote(JSON.parse(stringifyReport(js))));
      }
    });
  }
});

// Invented supplies (figures chosen to reach every branch of the kernel, not a real design).
const resistor = (name: string, nominal: number, extra: object = {}): NonNullable<SupplySpec['divider']>['top']['resistors'][0] => ({ name, nominal, tolerance: 0.01, tcrPerK: 100e-6, ...extra });

const DIFF_SUPPLY: SupplySpec = {
  reference: { nominal: 2.5, tolerance: 0.002, tempcoPerK: 20e-6, drift: 0.001, distribution: { kind: 'truncated-normal', k: 2 } },
  divider: {
    top: {
      resistors: [resistor('RT1', 47e3, { drift: 0.002, distribution: { kind: 'triangular' } }), resistor('RT2', 100e3, { distribution: { kind: 'binned', k: 3, innerFraction: 0.5 } })],
      arrangement: 'parallel',
      potentiometer: { name: 'VR1', nominal: 5e3, tolerance: 0.2, tcrPerK: 300e-6, wiper: 0.3 },
    },
    bottom: { resistors: [resistor('RB1', 4.7e3, { tcrPerK: 0 }), resistor('RB2', 330, { distribution: { kind: 'normal' } })], arrangement: 'series' },
    feedbackBias: { nominal: 20e-9, plusMinus: 30e-9, distribution: { kind: 'normal', k: 3 } },
  },
  temperature: { minC: -20, maxC: 70, monteCarlo: 'uniform', unitPoints: 4 },
  sense: {
    topology: 'diff',
    shunt: { name: 'RS', nominal: 0.02, tolerance: 0.01, tcrPerK: 75e-6, drift: 0.005, thermalResistanceKPerW: 80, powerRatingW: 1, lossLimitW: 0.5 },
    threshold: { kind: 'divided', source: { nominal: 1.2, tolerance: 0.005, tempcoPerK: 30e-6, distribution: { kind: 'triangular' } }, top: resistor('RTH1', 10e3), bottom: resistor('RTH2', 2.2e3, { distribution: { kind: 'fixed', value: 2.2e3 } }) },
    compareOffset: { nominal: 0, plusMinus: 1e-3, distribution: { kind: 'binned', innerFraction: 0.3 } },
    r1: resistor('R1', 1e3),
    r2: resistor('R2', 20e3, { distribution: { kind: 'truncated-normal' } }),
    r3: resistor('R3', 1e3, { tolerance: 0 }),
    r4: resistor('R4', 20e3),
    commonModeV: 12,
    amplifier: { offsetMax: 0.5e-3, offsetDriftPerK: 5e-6, offsetDistribution: { kind: 'normal' }, biasCurrent: { nominal: 1e-9, plusMinus: 5e-9 }, railV: 5, headroomV: 0.2 },
    limitTarget: 3,
  },
  windows: { vout: [9.5, 10.5], ilimit: [2.5, 3.5] },
};

const NONINV_SUPPLY: SupplySpec = {
  reference: { name: 'VREF', nominal: 1.25, tolerance: 0.01 },
  divider: { top: { resistors: [resistor('RTOP', 100e3)] }, bottom: { resistors: [resistor('RBOT', 11.3e3)], potentiometer: { name: 'VR2', nominal: 1e3, tolerance: 0.1, wiper: 1 } } },
  temperature: { minC: 0, maxC: 50, monteCarlo: { fixedC: 40 } },
  sense: {
    topology: 'noninv',
    shunt: { name: 'RS', nominal: 0.05, tolerance: 0.01, tcrPerK: 50e-6, thermalResistanceKPerW: 60 },
    threshold: { kind: 'fixed', nominal: 0.92, tolerance: 0.01, tempcoPerK: 40e-6, distribution: { kind: 'normal', k: 2.5 } },
    rf: resistor('RF', 8.2e3),
    rg: resistor('RG', 1e3, { drift: 0.003 }),
    amplifier: { offsetMax: 1e-3 },
    limitTarget: 2,
  },
  windows: { vout: [12.8, 13.6], voutSides: 'low' },
};

const DIRECT_SUPPLY: SupplySpec = {
  reference: { nominal: 0.8, tolerance: 0.01, distribution: { kind: 'binned', k: 3, innerFraction: 0.4 } },
  divider: { top: { resistors: [resistor('RTOP', 10e3)] }, bottom: { resistors: [resistor('RBOT', 2e3)] } },
  temperature: { minC: 25, maxC: 25, monteCarlo: 'uniform' },
  sense: {
    topology: 'direct',
    shunt: { name: 'RS', nominal: 0.1, tolerance: 0.01, tcrPerK: 50e-6, thermalResistanceKPerW: 100 },
    threshold: { kind: 'divided', source: 'regulator-reference', top: resistor('RTH1', 7e3), bottom: resistor('RTH2', 1e3) },
    limitTarget: 1,
  },
};

const DIVIDER_ONLY: SupplySpec = {
  reference: { nominal: 1.25, tolerance: 0.01, distribution: { kind: 'triangular' } },
  divider: { top: { resistors: [resistor('RTOP', 10e3, { drift: 0.001 })] }, bottom: { resistors: [resistor('RBOT', 1e3)] } },
  temperature: { minC: -40, maxC: 85, monteCarlo: 'uniform' },
  windows: { vout: [13.5, 14] },
};

function sameSummary(wasm: ChunkSummary, js: ChunkSummary): void {
  // toEqual compares typed arrays value by value and numbers with Object.is (NaN equals NaN, 0 differs from −0).
  expect(wasm).toEqual(js);
}

describe('invented supplies that reach every branch: the same chunk summaries', () => {
  const cases: Array<[string, SupplySpec]> = [
    ['diff, self-heating, divided threshold from its own reference, parallel + pot, series, Ifb', DIFF_SUPPLY],
    ['noninv, self-heating, fixed threshold with tempco, ambient held fixed, pot in the bottom leg', NONINV_SUPPLY],
    ['direct, self-heating, threshold divided from the regulator reference, one-point ambient range', DIRECT_SUPPLY],
    ['divider only (no sense path)', DIVIDER_ONLY],
  ];
  for (const [name, spec] of cases) {
    it(name, () => {
      expect(kernelSupports(spec)).toBe(true);
      const model = buildSupplyModel(spec);
      for (const perUnit of [true, false]) {
        const config: ChunkConfig = {
          seed: `branches ${name}`,
          chunkSize: 4096,
          trials: 4096 + 1001,
          ranges: model.outputs.map((_, i) => ({ lo: -1 - i, hi: 20 + 3 * i })),
          bins: 512,
          specs: model.outputs.map((o) => o.spec ?? null),
          keepSamples: true,
          chunkIntervals: true,
          perUnit,
        };
        const js = new ChunkRunner(model, config);
        const wasm = new WasmChunkRunner(spec, model, { ...config, kernel: 'wasm' });
        for (const k of [0, 1]) {
          const a = js.run(k);
          const b = wasm.run(k);
          sameSummary(b, a);
          expect(b.outputs[0]!.n).toBe(k === 0 ? 4096 : 1001);
        }
      }
    });
  }
});

describe('kernelSupports: only the spec shapes the kernel implements', () => {
  const clone = (): SupplySpec => structuredClone(DIFF_SUPPLY);
  it('accepts the invented supplies', () => {
    for (const spec of [DIFF_SUPPLY, NONINV_SUPPLY, DIRECT_SUPPLY, DIVIDER_ONLY]) expect(kernelSupports(spec)).toBe(true);
  });
  const additions: Array<[string, (s: Record<string, any>) => void]> = [
    ['the spec', (s) => (s.networks = [])],
    ['the reference', (s) => (s.reference.lot = 0.001)],
    ['a distribution', (s) => (s.reference.distribution.skew = 1)],
    ['a divider', (s) => (s.divider.network = 'R1,R2')],
    ['a leg', (s) => (s.divider.top.ratioTolerance = 0.001)],
    ['a resistor', (s) => (s.divider.top.resistors[0].parasitic = 0.01)],
    ['a potentiometer', (s) => (s.divider.top.potentiometer.endResistance = 50)],
    ['the feedback bias', (s) => (s.divider.feedbackBias.tempcoPerK = 1e-9)],
    ['the temperature', (s) => (s.temperature.grid = [0, 25])],
    ['the sense path', (s) => (s.sense.cmrrDb = 80)],
    ['the shunt', (s) => (s.sense.shunt.kelvinResistance = 1e-4)],
    ['the threshold', (s) => (s.sense.threshold.loading = true)],
    ['the threshold source', (s) => (s.sense.threshold.source.noise = 1e-6)],
    ['the amplifier', (s) => (s.sense.amplifier.offsetCurrent = 1e-9)],
    ['the amplifier bias', (s) => (s.sense.amplifier.biasCurrent.offsetCurrent = 1e-9)],
    ['the windows', (s) => (s.windows.shuntLoss = [0, 1])],
  ];
  for (const [where, add] of additions) {
    it(`declines an unknown key in ${where}`, () => {
      const spec = clone();
      add(spec as unknown as Record<string, any>);
      expect(kernelSupports(spec)).toBe(false);
    });
  }
  it('declines unknown values: a distribution kind, a topology, a threshold kind, an arrangement', () => {
    const changes: Array<(s: Record<string, any>) => void> = [
      (s) => (s.reference.distribution = { kind: 'lognormal' }),
      (s) => (s.sense.topology = 'hall'),
      (s) => (s.sense.threshold.kind = 'window'),
      (s) => (s.divider.top.arrangement = 'bridge'),
      (s) => (s.divider.top.resistors = [s.divider.top.resistors[0], s.divider.top.resistors[0], s.divider.top.resistors[0]]),
    ];
    for (const change of changes) {
      const spec = clone();
      change(spec as unknown as Record<string, any>);
      expect(kernelSupports(spec)).toBe(false);
    }
  });
  it('a key holding undefined counts as absent', () => {
    const spec = clone() as unknown as Record<string, unknown>;
    spec.voutTarget = undefined;
    expect(kernelSupports(spec as unknown as SupplySpec)).toBe(true);
  });
});

describe('chooseKernel: from the spec only', () => {
  const unknown = { ...structuredClone(DIRECT_SUPPLY), laterField: 1 } as unknown as SupplySpec;
  it('auto runs wasm where the kernel covers the design and js where it does not, or without a spec', () => {
    expect(chooseKernel('auto', { kind: 'supply', spec: DIRECT_SUPPLY })).toBe('wasm');
    expect(chooseKernel('auto', { kind: 'supply', spec: unknown })).toBe('js');
    expect(chooseKernel('auto', undefined)).toBe('js');
    expect(chooseKernel('js', { kind: 'supply', spec: DIRECT_SUPPLY })).toBe('js');
  });
  it('wasm asked for a design it does not cover is an input error naming --kernel', () => {
    expect(() => chooseKernel('wasm', { kind: 'supply', spec: unknown })).toThrow(InputError);
  });
  it('a run of a design the kernel declines says js in its notes', async () => {
    const result = await analyze(unknown, { trials: 1000, seed: 1, workers: 1 });
    expect(result.notes).toContain('Kernel: js (the JavaScript reference chunk kernel).');
  });
});

describe('the built kernel is rebuilt from its source', () => {
  it('two builds of src/analysis/kernel/assembly/chunk-kernel.ts give the same bytes, and those of dist/', { timeout: 240_000 }, () => {
    const dir = mkdtempSync(join(tmpdir(), 'trimfree-kernel-'));
    try {
      const a = join(dir, 'a.wasm');
      const b = join(dir, 'b.wasm');
      buildKernel(a);
      buildKernel(b);
      const bytes = readFileSync(a);
      expect(bytes.subarray(0, 4)).toEqual(Buffer.from([0x00, 0x61, 0x73, 0x6d])); // "\0asm", the module magic
      expect(readFileSync(b).equals(bytes)).toBe(true);
      expect(readFileSync(KERNEL_WASM).equals(bytes)).toBe(true);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
