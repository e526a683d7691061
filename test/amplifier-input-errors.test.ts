// The sense amplifier's offset current Ios (beside its bias current: Ib the mean of the two input currents, Ios their
// difference) and its own CMRR in the diff topology (issue 11, section 5). The circuit functions are checked against
// the op-amp circuit solved as a linear system (nodal equations, open-loop gain 1e12), not against their own algebra;
// the engine's worst case against the closed forms worked by hand in each test.
import { describe, expect, it } from 'vitest';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { diffLimit, diffOutput, type DiffSense } from '../src/circuits/sense/diff.js';
import { noninvOutput, type NoninvSense } from '../src/circuits/sense/noninv.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { parseDecibel } from '../src/units/decibel.js';
import { baseDesign } from './design-fixture.js';

/** Solves A·x = b by Gaussian elimination with partial pivoting (small dense systems). */
function solve(a: number[][], b: number[]): number[] {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]!]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r]![c]!) > Math.abs(m[p]![c]!)) p = r;
    [m[c], m[p]] = [m[p]!, m[c]!];
    for (let r = c + 1; r < n; r++) {
      const f = m[r]![c]! / m[c]![c]!;
      for (let k = c; k <= n; k++) m[r]![k]! -= f * m[c]![k]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = m[r]![n]!;
    for (let k = r + 1; k < n; k++) s -= m[r]![k]! * x[k]!;
    x[r] = s / m[r]![r]!;
  }
  return x;
}

const GAIN = 1e12;

/**
 * The four-resistor stage as a circuit: unknowns V+, V−, Vo. KCL at + (R3 from Vp, R4 to ground, Ib+ out of the
 * node into the input), KCL at − (R1 from Vn, R2 from Vo, Ib− into the input), and the op amp
 * Vo = A·(V+ + Vos + e·V+ − V−), its offset moved by e times the common-mode voltage at its input.
 */
function diffByNodes(p: DiffSense, current: number): number {
  const vp = p.commonMode + current * p.shunt;
  const vn = p.commonMode;
  const ios = p.offsetCurrent ?? 0;
  const e = p.cmrrError ?? 0;
  const ibPlus = p.biasCurrent + ios / 2;
  const ibMinus = p.biasCurrent - ios / 2;
  const a = [
    [1 / p.r3 + 1 / p.r4, 0, 0],
    [0, 1 / p.r1 + 1 / p.r2, -1 / p.r2],
    [-GAIN * (1 + e), GAIN, 1],
  ];
  const b = [vp / p.r3 - ibPlus, vn / p.r1 - ibMinus, GAIN * p.amplifierOffset];
  return solve(a, b)[2]!;
}

/** The non-inverting stage as a circuit: unknowns V−, Vo; V+ = I·Rs (the shunt), Ib− into the inverting input. */
function noninvByNodes(p: NoninvSense, current: number): number {
  const vPlus = current * p.shunt;
  const ibMinus = p.biasCurrent - (p.offsetCurrent ?? 0) / 2;
  const a = [
    [1 / p.ground + 1 / p.feedback, -1 / p.feedback],
    [GAIN, 1],
  ];
  const b = [-ibMinus, GAIN * (vPlus + p.amplifierOffset)];
  return solve(a, b)[1]!;
}

describe('circuit functions against the nodal solution', () => {
  const diff: DiffSense = { shunt: 0.02, r1: 10e3, r2: 200e3, r3: 10.1e3, r4: 199e3, commonMode: 24, threshold: 1.2, amplifierOffset: 0.5e-3, biasCurrent: 40e-9, offsetCurrent: 6e-9, cmrrError: 3e-5, compareOffset: 0 };
  it.each([0, 1, 3.5])('diff, mismatched, with Ios and CMRR error, at %s A', (current) => {
    expect(diffOutput(diff, current)).toBeCloseTo(diffByNodes(diff, current), 9);
  });
  it('diff limit: the output there equals the threshold', () => {
    const limit = diffLimit(diff);
    expect(diffByNodes(diff, limit)).toBeCloseTo(diff.threshold, 9);
  });
  it('diff without Ios and CMRR error is the former equal-bias-current form', () => {
    const plain = { ...diff, offsetCurrent: 0, cmrrError: 0 };
    expect(diffOutput(plain, 2)).toBeCloseTo(diffByNodes(plain, 2), 9);
  });
  const noninv: NoninvSense = { shunt: 0.05, feedback: 47e3, ground: 2.2e3, threshold: 1, amplifierOffset: -0.3e-3, biasCurrent: 100e-9, offsetCurrent: -30e-9, compareOffset: 0 };
  it.each([0, 0.7])('noninv with Ios at %s A', (current) => {
    expect(noninvOutput(noninv, current)).toBeCloseTo(noninvByNodes(noninv, current), 9);
  });
});

/** A direct engine spec: only the amplifier's input errors vary; all else exact, 25 °C. */
function spec(sense: SupplySpec['sense']): SupplySpec {
  return { temperature: { minC: 25, maxC: 25, monteCarlo: 'uniform' }, sense: sense! };
}
const exact = (name: string, nominal: number) => ({ name, nominal, tolerance: 0 });

describe('engine worst case against the closed form', () => {
  it('noninv: Ios alone moves the limit by ±(Ios/2)·RF/(G·Rs)', () => {
    // RF 90k, RG 10k: G = 10; Rs 0.1 Ω; Vth 1 V; Ios ±200 nA: the inverting input draws ∓100 nA, 9 mV at RF,
    // 0.9 mV at the shunt after the gain, 9 mA at the limit. Nominal 1 A.
    const s = spec({ topology: 'noninv', shunt: exact('RS', 0.1), rf: exact('RF', 90e3), rg: exact('RG', 10e3), threshold: { kind: 'fixed', nominal: 1, tolerance: 0 }, limitTarget: 1, amplifier: { offsetMax: 0, offsetCurrentMax: 200e-9 } });
    const w = worstCase(buildSupplyModel(s)).find((o) => o.name === 'ilimit')!;
    expect(w.min).toBeCloseTo(1 - 0.009, 12);
    expect(w.max).toBeCloseTo(1 + 0.009, 12);
  });
  it('diff, matched resistors: the CMRR error e = ±10^(−dB/20) gives I = (Vth − G·e·Vcm)/(G·(1 + e)·Rs)', () => {
    // Matched R2/R1 = R4/R3 = G = 20, Rs 10 mΩ, Vth 1 V, Vcm 24 V, CMRR 80 dB: e = ±1e-4.
    // I(+e) = (1 − 20·1e-4·24)/(20·1.0001·0.01) = 0.952/0.20002; I(−e) = 1.048/0.19998. Nominal 5 A.
    const s = spec({ topology: 'diff', shunt: exact('RS', 0.01), r1: exact('R1', 1e3), r2: exact('R2', 20e3), r3: exact('R3', 1e3), r4: exact('R4', 20e3), commonModeV: 24, threshold: { kind: 'fixed', nominal: 1, tolerance: 0 }, limitTarget: 5, amplifier: { offsetMax: 0, cmrrDb: 80 } });
    const w = worstCase(buildSupplyModel(s)).find((o) => o.name === 'ilimit')!;
    expect(w.min).toBeCloseTo(0.952 / 0.20002, 12);
    expect(w.max).toBeCloseTo(1.048 / 0.19998, 12);
    // First-order check: ΔI ≈ ∓e·Vcm/Rs = ∓0.24 A around 5 A (the relative (1 + e) term adds 5e-4 of 5 A).
    expect(5 - w.min).toBeCloseTo(0.24 + 5 * 1e-4, 3);
  });
});

describe('the design file', () => {
  it('reads offsetCurrent and cmrr and names them in the parts', () => {
    const d = baseDesign();
    d.current.topology = 'diff';
    d.current.commonMode = '12 V';
    d.current.gain = { r1: '1k', r2: '9k', r3: '1k', r4: '9k' };
    d.current.amplifier = { vos: '1 mV', rail: '5 V', biasCurrent: '50 nA', offsetCurrent: '10 nA', cmrr: '90 dB' };
    const r = resolveDesign(validateDesign(d));
    const amp = (r.spec.sense as { amplifier: { offsetCurrentMax?: number; cmrrDb?: number } }).amplifier;
    expect(amp.offsetCurrentMax).toBeCloseTo(10e-9, 20);
    expect(amp.cmrrDb).toBe(90);
    const names = buildSupplyModel(r.spec).parts.map((p) => p.name);
    expect(names).toContain('Ios amp');
    expect(names).toContain('CMRR amp');
  });
  it('parses decibels', () => {
    expect(parseDecibel('90 dB', 'x')).toBe(90);
    expect(parseDecibel('80dB', 'x')).toBe(80);
    expect(parseDecibel('72.5', 'x')).toBe(72.5);
    expect(() => parseDecibel('90 dBm', 'x')).toThrow(/unexpected character 'm'/);
  });
});
