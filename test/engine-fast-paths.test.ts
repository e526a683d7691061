// The Monte Carlo engine's fast loops against their clear reference versions, value for value (Object.is: the same
// bits, so a seed's numbers do not move when a loop is made faster). The references are written here plainly,
// one draw or one trial at a time, straight from the formulas named beside each.
import { describe, expect, it } from 'vitest';
import { chunkRandom, chunkState, fillXor128, fillXor128Affine, skipXor128 } from '../src/analysis/chunk-random.js';
import { ChunkRunner, drawChunkParts, type ChunkConfig } from '../src/analysis/chunk.js';
import { evaluateAt } from '../src/analysis/model.js';
import { symmetricInterval } from '../src/analysis/statistics/coverage.js';
import { buildSupplyModel, hotShunt, type SupplySpec } from '../src/analysis/models/supply.js';
import { BENCH_SUPPLY } from '../src/bench/cvcc-spec.js';
import { parallelResistance, seriesResistance } from '../src/circuits/combine.js';
import { dividerVout } from '../src/circuits/divider.js';
import { diffLimit, diffOutput } from '../src/circuits/sense/diff.js';
import { directLimit, directSignal } from '../src/circuits/sense/direct.js';
import { noninvLimit, noninvOutput } from '../src/circuits/sense/noninv.js';
import { partFromBound } from '../src/tolerance/part.js';
import { fillPart, partFromUnit } from '../src/tolerance/sample.js';
import { binnedFromUnit } from '../src/tolerance/distributions/binned.js';
import { clampInPlace, inverseNormalCdf, normalCdf, normalQuantilesInPlace } from '../src/tolerance/distributions/normal.js';
import { truncatedNormalFromUnit } from '../src/tolerance/distributions/truncated-normal.js';
import { ALLOWANCE_NAMES } from '../src/tolerance/life-allowances.js';

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

  it('the clamp writes only values outside the band and leaves the rest exactly as they were (reference: x < lo ? lo : x > hi ? hi : x)', () => {
    // Half of these fall outside [−0.5, 0.5]; the edges themselves, signed zeros at a zero edge, ±∞ and NaN too.
    const spread = uniforms(10_000, 'clamp').map((v) => 2 * v - 1);
    const special = [-0.5, 0.5, -0.5 - 2 ** -53, 0.5 + 2 ** -53, 0, -0, -Infinity, Infinity, NaN];
    for (const [lo, hi] of [[-0.5, 0.5], [0, 0.5], [-0.5, -0]] as const) {
      const values = Float64Array.from([...special, ...spread]);
      const fast = values.slice();
      clampInPlace(fast, fast.length, lo, hi);
      const reference = values.map((x) => (x < lo ? lo : x > hi ? hi : x));
      expect(sameBits(fast, reference)).toBe(0);
      expect(fast.filter((x) => x === lo || x === hi).length).toBeGreaterThan(4000);
    }
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

// ---------------------------------------------------------------------------------------------------------------
// The supply model's column-by-column block evaluation against a plain per-trial reference: one trial at a time,
// each value read by part name and built by the formulas in src/analysis/models/supply.ts's header (resistor at
// temperature R·(1 + drift)·(1 + α·ΔT), legs, reference, threshold, offsets) and the circuit functions of
// src/circuits, with self-heating R25·(1 + α·(Tamb + θ·P − 25)) by the closed form hotShunt. Same operations in the same order, so equal bits.

/** A resistor at ΔT from 25 °C; `withTcr` false gives its value at 25 °C (drift only). */
function resistorAt(v: (name: string) => number | undefined, name: string, dT: number, withTcr = true): number {
  let r = v(name)!;
  const drift = v(`${name} drift`);
  const tcr = v(`${name} TCR`);
  if (drift !== undefined) r *= 1 + drift;
  r = withAllowances(v, name, r);
  if (tcr !== undefined && withTcr) r *= 1 + tcr * dT;
  return r;
}

/** r·Π(1 + d) over the part's named drift allowances (`${name} load life` …), in their order. */
function withAllowances(v: (name: string) => number | undefined, name: string, value: number): number {
  let r = value;
  for (const allowance of ALLOWANCE_NAMES) {
    const d = v(`${name} ${allowance}`);
    if (d !== undefined) r *= 1 + d;
  }
  return r;
}

function referenceAt(v: (name: string) => number | undefined, name: string, dT: number): number {
  let r = v(name)!;
  const drift = v(`${name} drift`);
  const tempco = v(`${name} tempco`);
  if (drift !== undefined) r *= 1 + drift;
  if (tempco !== undefined) r *= 1 + tempco * dT;
  return r;
}

function legAt(v: (name: string) => number | undefined, leg: NonNullable<SupplySpec['divider']>['top'], dT: number): number {
  let r = resistorAt(v, leg.resistors[0].name, dT);
  if (leg.resistors[1]) {
    const b = resistorAt(v, leg.resistors[1].name, dT);
    r = leg.arrangement === 'parallel' ? parallelResistance(r, b) : seriesResistance(r, b);
  }
  if (leg.potentiometer) r += leg.potentiometer.wiper * resistorAt(v, leg.potentiometer.name, dT);
  return r;
}

/** Every output of one trial, in OUTPUT_NAMES order. */
function referenceTrial(spec: SupplySpec, v: (name: string) => number | undefined): number[] {
  const dT = v('T ambient')! - 25;
  const vref = referenceAt(v, 'Vref', dT);
  const rBottom = legAt(v, spec.divider!.bottom, dT);
  const out = [dividerVout(vref, legAt(v, spec.divider!.top, dT), rBottom, v('Ifb') ?? 0), vref / rBottom];
  const sense = spec.sense;
  if (!sense) return out;
  const th = sense.threshold;
  let threshold: number;
  if (th.kind === 'fixed') {
    threshold = withAllowances(v, 'Vth', v('Vth')!);
    const tempco = v('Vth tempco');
    if (tempco !== undefined) threshold *= 1 + tempco * dT;
  } else {
    const source = th.source === 'regulator-reference' ? vref : referenceAt(v, 'Vref threshold', dT);
    const rt = resistorAt(v, th.top.name, dT);
    const rb = resistorAt(v, th.bottom.name, dT);
    threshold = (source * rb) / (rt + rb);
  }
  const q = { shunt: 0, feedback: 0, ground: 0, r1: 0, r2: 0, r3: 0, r4: 0, commonMode: 0, threshold, amplifierOffset: 0, biasCurrent: 0, compareOffset: v('Vos cmp') ?? 0 };
  if (sense.topology !== 'direct') {
    q.amplifierOffset = v('Vos amp')! + (v('Vos amp drift') !== undefined ? v('Vos amp drift')! * dT : 0);
    q.biasCurrent = v('Ib amp') ?? 0;
  }
  if (sense.topology === 'noninv') {
    q.feedback = resistorAt(v, sense.rf.name, dT);
    q.ground = resistorAt(v, sense.rg.name, dT);
  } else if (sense.topology === 'diff') {
    [q.r1, q.r2, q.r3, q.r4] = [sense.r1, sense.r2, sense.r3, sense.r4].map((r) => resistorAt(v, r.name, dT)) as [number, number, number, number];
    q.commonMode = sense.commonModeV;
  }
  const limit = sense.topology === 'noninv' ? noninvLimit : sense.topology === 'diff' ? diffLimit : directLimit;
  const signal = sense.topology === 'noninv' ? noninvOutput : sense.topology === 'diff' ? diffOutput : directSignal;
  const rAmbient = resistorAt(v, sense.shunt.name, dT);
  q.shunt = rAmbient;
  let current = limit(q);
  const alpha = v(`${sense.shunt.name} TCR`);
  const theta = sense.shunt.thermalResistanceKPerW ?? 0;
  if (theta > 0 && alpha !== undefined) {
    // R_hot = R25·(1 + α·(Tamb + θ·P − 25)) with R25 the shunt at 25 °C (drift included), solved by hotShunt.
    q.shunt = hotShunt(rAmbient, resistorAt(v, sense.shunt.name, 0, false), alpha, theta, current * rAmbient);
    current = limit(q);
  }
  return [...out, current, current * current * q.shunt, signal(q, current)];
}

const DIFF_HIGH_SIDE: SupplySpec = {
  reference: { nominal: 0.8, tolerance: 0.015, tempcoPerK: 30e-6, drift: 0.002 },
  divider: {
    top: { resistors: [{ name: 'R1', nominal: 200e3, tolerance: 0.01, tcrPerK: 100e-6, drift: 0.001 }, { name: 'R1B', nominal: 1e6, tolerance: 0.05 }], arrangement: 'parallel' },
    bottom: { resistors: [{ name: 'R2', nominal: 10e3, tolerance: 0.01 }, { name: 'R2B', nominal: 100, tolerance: 0.05 }], arrangement: 'series', potentiometer: { name: 'VR1', nominal: 5e3, tolerance: 0.2, wiper: 0.3, tcrPerK: 1e-4 } },
    feedbackBias: { nominal: 10e-9, plusMinus: 40e-9 },
  },
  temperature: { minC: -20, maxC: 60, monteCarlo: 'uniform' },
  sense: {
    topology: 'diff',
    shunt: { name: 'RS', nominal: 0.1, tolerance: 0.01, tcrPerK: 200e-6, thermalResistanceKPerW: 80 },
    r1: { name: 'R3', nominal: 1e3, tolerance: 0.01, tcrPerK: 25e-6 },
    r2: { name: 'R4', nominal: 10e3, tolerance: 0.01 },
    r3: { name: 'R5', nominal: 1e3, tolerance: 0.01 },
    r4: { name: 'R6', nominal: 10e3, tolerance: 0.01 },
    commonModeV: 24,
    amplifier: { offsetMax: 0.5e-3, offsetDriftPerK: 5e-6, biasCurrent: { nominal: 0, plusMinus: 50e-9 } },
    threshold: { kind: 'divided', source: 'regulator-reference', top: { name: 'R7', nominal: 3e3, tolerance: 0.01 }, bottom: { name: 'R8', nominal: 12e3, tolerance: 0.01 } },
    compareOffset: { nominal: 0, plusMinus: 1e-3 },
    limitTarget: 0.64,
  },
};

const DIRECT_SEPARATE_REFERENCE: SupplySpec = {
  reference: { nominal: 0.6, tolerance: 0.01 },
  divider: { top: { resistors: [{ name: 'R1', nominal: 100e3, tolerance: 0.01 }] }, bottom: { resistors: [{ name: 'R2', nominal: 10e3, tolerance: 0.01 }] } },
  temperature: { minC: 0, maxC: 40, monteCarlo: { fixedC: 30 } },
  sense: {
    topology: 'direct',
    shunt: { name: 'RS', nominal: 0.05, tolerance: 0.01, drift: 0.005 },
    threshold: { kind: 'divided', source: { nominal: 2.5, tolerance: 0.005, tempcoPerK: 20e-6 }, top: { name: 'R7', nominal: 22e3, tolerance: 0.01, tcrPerK: 50e-6 }, bottom: { name: 'R8', nominal: 1e3, tolerance: 0.01 } },
    limitTarget: 2,
  },
};

/** The benchmark design with drift allowances (life-allowances.ts) on a divider resistor, the self-heating shunt
 * (its R25 includes them) and a fixed threshold, one with a normal drift. */
const WITH_ALLOWANCES: SupplySpec = (() => {
  const spec = structuredClone(BENCH_SUPPLY);
  spec.divider!.top.resistors[0].drift = 0.001;
  spec.divider!.top.resistors[0].allowances = [{ name: 'load life', band: 0.01 }, { name: 'soldering', band: 0.002, distribution: { kind: 'normal', k: 3 } }];
  const sense = spec.sense!;
  sense.shunt.allowances = [{ name: 'load life', band: 0.005 }, { name: 'damp heat', band: 0.003 }];
  sense.threshold = { kind: 'fixed', nominal: 1.0, tolerance: 0.01, tempcoPerK: 50e-6, allowances: [{ name: 'damp heat', band: 0.002 }] };
  return spec;
})();

describe('supply model: the block evaluation equals a plain per-trial reference, bit for bit', () => {
  const cases: Array<[string, SupplySpec]> = [
    ['noninv with self-heating (the benchmark design)', BENCH_SUPPLY],
    ['diff, high side, divided threshold from the regulator reference, parallel and series legs with a pot', DIFF_HIGH_SIDE],
    ['direct, threshold divided from its own reference, fixed temperature, shunt drift', DIRECT_SEPARATE_REFERENCE],
    ['divider only', { ...BENCH_SUPPLY, sense: undefined } as unknown as SupplySpec],
    ['named drift allowances on resistors, the self-heating shunt and a fixed threshold', WITH_ALLOWANCES],
  ];
  for (const [name, spec] of cases) {
    it(name, () => {
      const model = buildSupplyModel(spec);
      const n = 5000;
      const state = chunkState('supply', 3);
      const p = model.parts.map((part) => {
        const column = new Float64Array(n);
        fillXor128(state, column, n);
        partFromUnit(part, column, n);
        return column;
      });
      const outs = model.outputs.map(() => new Float64Array(n));
      // Twice: the second block reuses the model's scratch columns.
      model.evaluateAll!(p, outs, n);
      model.evaluateAll!(p, outs, n);
      const index = new Map(model.parts.map((part, i) => [part.name, i]));
      let differ = 0;
      let nonFinite = 0;
      for (let j = 0; j < n; j++) {
        const expected = referenceTrial(spec, (partName) => (index.has(partName) ? p[index.get(partName)!]![j]! : undefined));
        expect(expected.length).toBe(model.outputs.length);
        expected.forEach((value, o) => {
          if (!Object.is(outs[o]![j], value)) differ++;
          if (!Number.isFinite(value)) nonFinite++;
        });
      }
      expect(differ).toBe(0);
      expect(nonFinite).toBe(0);
    });
  }
});

describe('drawing a chunk: fused draw-and-scale and skipped draws equal one call per draw then the transform', () => {
  it('uniform, normal, truncated, triangular, binned, fixed and zero-spread parts, in one stream (seedrandom xor128 reference)', () => {
    const parts = [
      partFromBound({ name: 'u', kind: 'offset', nominal: 1, plusMinus: 0.5 }),
      partFromBound({ name: 'fixed', kind: 'temperature', nominal: 25, plusMinus: 20, distribution: { kind: 'fixed', value: 40 } }),
      partFromBound({ name: 'n', kind: 'offset', nominal: 0, plusMinus: 1e-3, distribution: { kind: 'normal' } }),
      partFromBound({ name: 'none', kind: 'offset', nominal: 3, plusMinus: 0 }),
      partFromBound({ name: 'tn', kind: 'offset', nominal: 2, plusMinus: 0.1, distribution: { kind: 'truncated-normal' } }),
      partFromBound({ name: 'tri', kind: 'offset', nominal: 5, plusMinus: 1, distribution: { kind: 'triangular' } }),
      partFromBound({ name: 'bin', kind: 'offset', nominal: 10, plusMinus: 1, distribution: { kind: 'binned', innerFraction: 0.4 } }),
      partFromBound({ name: 'u2', kind: 'offset', nominal: -4, plusMinus: 2 }),
    ];
    const n = 3000;
    const fast = parts.map(() => new Float64Array(n));
    drawChunkParts(parts, 'draw', 2, fast, n);
    const random = chunkRandom('draw', 2);
    const reference = parts.map((part) => {
      const values = new Float64Array(n);
      fillPart(part, values, n, random);
      return values;
    });
    parts.forEach((_, i) => expect(sameBits(fast[i]!, reference[i]!)).toBe(0));
    expect(fast[1]![0]).toBe(40);
    expect(fast[3]![0]).toBe(3);
  });
});

describe('adaptive runs: each chunk’s 95 % interval from its histogram equals the full sort (JCGM 101:2008 7.7.1)', () => {
  it('every output of the benchmark design, a full and a short chunk, with a histogram range that cuts off part of the values', () => {
    const model = buildSupplyModel(BENCH_SUPPLY);
    const chunkSize = 20_000;
    const config: ChunkConfig = {
      seed: 'interval',
      chunkSize,
      trials: chunkSize + 7_777,
      // Deliberately narrow ranges about the nominal values, so some values land in the outer bins.
      ranges: model.outputs.map((o) => {
        const nominal = evaluateAt(o, model.parts.map((part) => part.nominal));
        return { lo: nominal * 0.995, hi: nominal * 1.004 };
      }),
      bins: 512,
      specs: model.outputs.map((o) => o.spec ?? null),
      keepSamples: true,
      chunkIntervals: true,
      perUnit: false,
    };
    const runner = new ChunkRunner(model, config);
    for (const k of [0, 1]) {
      const summary = runner.run(k);
      summary.outputs.forEach((c) => {
        const sorted = c.samples!.slice().sort();
        expect(sorted.length).toBe(k === 0 ? chunkSize : 7_777);
        const full = symmetricInterval(sorted, 0.95);
        expect(c.low95).toBe(full.low);
        expect(c.high95).toBe(full.high);
      });
      const outside = summary.outputs.some((c) => c.counts[0]! > 0 || c.counts[config.bins + 1]! > 0);
      if (k === 0) expect(outside).toBe(true);
    }
  });
});

describe('xor128 fill loops: the state ring comes back in order for every length', () => {
  it('fills of 0 to 9 draws, one after another, continue seedrandom’s xor128 call by call (plain, scaled, skipped)', () => {
    const reference = chunkRandom('ring', 5);
    const state = chunkState('ring', 5);
    for (let n = 0; n <= 9; n++) {
      const plain = new Float64Array(n);
      fillXor128(state, plain, n);
      for (let j = 0; j < n; j++) expect(plain[j]).toBe(reference());
      const scaled = new Float64Array(n);
      fillXor128Affine(state, scaled, n, -2, 3);
      for (let j = 0; j < n; j++) expect(scaled[j]).toBe(-2 + 3 * reference());
      skipXor128(state, n);
      for (let j = 0; j < n; j++) reference();
    }
    const next = new Float64Array(1);
    fillXor128(state, next, 1);
    expect(next[0]).toBe(reference());
  });
});
