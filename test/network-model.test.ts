// Resistor networks in the supply model: the band split (src/tolerance/network-bands.ts) against the stated bands by
// brute force, worst case against brute force over the corners of the shared and the members' own terms, every
// Monte Carlo unit inside both bands, the moments of a matched pair's ratio against their closed form, and the
// difference amplifier's common-mode error against its first-order form.
import { describe, expect, it } from 'vitest';
import { diffLimit } from '../src/circuits/sense/diff.js';
import { nominalOutputs } from '../src/analysis/model.js';
import { buildSupplyModel, type ResistorSpec, type SupplySpec } from '../src/analysis/models/supply.js';
import type { NetworkSpec } from '../src/analysis/models/network-parts.js';
import { trialChunks } from '../src/analysis/trial-values.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { networkBands } from '../src/tolerance/network-bands.js';
import { InputError } from '../src/errors.js';

const corners = (k: number): number[][] => Array.from({ length: 2 ** k }, (_, v) => Array.from({ length: k }, (_, b) => ((v >>> b) & 1 ? 1 : -1)));

describe('network band split', () => {
  it('every corner and a grid inside hold both bands; the corners reach each band (brute force over 4 members)', () => {
    for (const [tolerance, ratio] of [[1e-3, 5e-4], [1e-2, 1e-3], [1e-3, 1e-3], [5e-2, 0], [0.2, 0.1]] as const) {
      const b = networkBands({ tolerance, ratio, tcrPerK: 0, trackingPerK: 0 });
      let worstAbs = 0;
      let worstRatio = 0;
      const steps = [-1, -0.5, 0, 0.5, 1];
      for (const s of steps) {
        for (let v = 0; v < steps.length ** 4; v++) {
          const m = [0, 1, 2, 3].map((i) => steps[Math.floor(v / steps.length ** i) % steps.length]!);
          const r = m.map((mi) => (1 + s * b.shared) * (1 + mi * b.mismatch));
          for (const ri of r) worstAbs = Math.max(worstAbs, Math.abs(ri - 1));
          for (const ri of r) for (const rj of r) worstRatio = Math.max(worstRatio, Math.abs(ri / rj - 1));
        }
      }
      expect(worstAbs).toBeLessThanOrEqual(tolerance * (1 + 1e-12));
      expect(worstRatio).toBeLessThanOrEqual(ratio * (1 + 1e-12) + 1e-16);
      // Exact at the corners: the split wastes none of either band.
      expect(worstAbs).toBeCloseTo(tolerance, 14);
      expect(worstRatio).toBeCloseTo(ratio, 14);
    }
  });

  it('TCR: |α_i| ≤ T and |α_i − α_j| ≤ τ at every corner, both reached', () => {
    const b = networkBands({ tolerance: 1e-3, ratio: 5e-4, tcrPerK: 25e-6, trackingPerK: 5e-6 });
    let worst = 0;
    let track = 0;
    for (const c of corners(3)) {
      const alpha = [c[0]! * b.sharedTcrPerK + c[1]! * b.memberTcrPerK, c[0]! * b.sharedTcrPerK + c[2]! * b.memberTcrPerK];
      worst = Math.max(worst, ...alpha.map(Math.abs));
      track = Math.max(track, Math.abs(alpha[0]! - alpha[1]!));
    }
    expect(worst).toBeCloseTo(25e-6, 18);
    expect(track).toBeCloseTo(5e-6, 18);
  });

  it('refuses a ratio band wider than the absolute one, and tracking past 2·TCR', () => {
    expect(() => networkBands({ tolerance: 1e-3, ratio: 2e-3, tcrPerK: 0, trackingPerK: 0 })).toThrow(RangeError);
    expect(() => networkBands({ tolerance: 1e-3, ratio: 1e-4, tcrPerK: 1e-5, trackingPerK: 3e-5 })).toThrow(RangeError);
    expect(() => networkBands({ tolerance: Number.NaN, ratio: 0, tcrPerK: 0, trackingPerK: 0 })).toThrow(RangeError);
  });
});

// A high-side difference amplifier where only R1..R4 vary (shunt, threshold and offsets exact, 25 °C): the limit then
// moves only through the resistor ratios.
const G = 10;
const VCM = 19;
const VTH = 1.0;
const RS = 0.1;
function diffSupply(network: Omit<NetworkSpec, 'members' | 'name'> | null, resistorTolerance = 0): SupplySpec {
  const r = (name: string, nominal: number): ResistorSpec => ({ name, nominal, tolerance: resistorTolerance });
  const spec: SupplySpec = {
    reference: { nominal: 0.8, tolerance: 0 },
    divider: { top: { resistors: [r('RTOP', 290e3)] }, bottom: { resistors: [r('RBOT', 10e3)] } },
    temperature: { minC: 25, maxC: 25, monteCarlo: 'uniform' },
    sense: {
      topology: 'diff',
      shunt: { name: 'RS', nominal: RS, tolerance: 0 },
      threshold: { kind: 'fixed', nominal: VTH, tolerance: 0 },
      limitTarget: VTH / (G * RS),
      r1: r('R1', 10e3),
      r2: r('R2', G * 10e3),
      r3: r('R3', 10e3),
      r4: r('R4', G * 10e3),
      commonModeV: VCM,
      amplifier: { offsetMax: 0 },
    },
  };
  spec.divider!.top.resistors[0]!.tolerance = 0;
  spec.divider!.bottom.resistors[0]!.tolerance = 0;
  if (network) spec.networks = [{ name: 'RN1', members: ['R1', 'R2', 'R3', 'R4'], ...network }];
  return spec;
}

const limitAt = (r: number[]): number =>
  diffLimit({ shunt: RS, r1: r[0]!, r2: r[1]!, r3: r[2]!, r4: r[3]!, commonMode: VCM, threshold: VTH, amplifierOffset: 0, biasCurrent: 0, compareOffset: 0 });
const NOMINALS = [10e3, G * 10e3, 10e3, G * 10e3];

describe('network worst case', () => {
  const tolerance = 1e-3;
  const ratio = 5e-4;
  const model = buildSupplyModel(diffSupply({ tolerance, ratio }));
  const wc = worstCase(model).find((w) => w.name === 'ilimit')!;

  it('equals brute force over the corners of the shared term × the corners of the members\' own terms', () => {
    const b = networkBands({ tolerance, ratio, tcrPerK: 0, trackingPerK: 0 });
    let min = Infinity;
    let max = -Infinity;
    for (const c of corners(5)) {
      const y = limitAt(NOMINALS.map((n, i) => n * (1 + c[0]! * b.shared) * (1 + c[i + 1]! * b.mismatch)));
      min = Math.min(min, y);
      max = Math.max(max, y);
    }
    expect(wc.min).toBeCloseTo(min, 14);
    expect(wc.max).toBeCloseTo(max, 14);
    // The vertex names the network's parts.
    expect(Object.keys(wc.maxVertex).sort()).toEqual(['RN1 absolute', 'RN1 ratio R1', 'RN1 ratio R2', 'RN1 ratio R3', 'RN1 ratio R4']);
  });

  it('is no narrower than brute force over the stated constraints themselves (a grid of units inside both bands)', () => {
    // Every member on a grid of ±A in steps of A/10, kept when each pairwise ratio is within ±ρ: the true set of
    // units the datasheet allows. The model's corners must reach (nearly) its extremes and never pass them.
    let min = Infinity;
    let max = -Infinity;
    const k = 10;
    for (let v = 0; v < (2 * k + 1) ** 4; v++) {
      const d = [0, 1, 2, 3].map((i) => ((Math.floor(v / (2 * k + 1) ** i) % (2 * k + 1)) - k) * (tolerance / k));
      let ok = true;
      for (let i = 0; i < 4 && ok; i++) for (let j = 0; j < 4 && ok; j++) if (Math.abs((1 + d[i]!) / (1 + d[j]!) - 1) > ratio * (1 + 1e-9)) ok = false;
      if (!ok) continue;
      const y = limitAt(NOMINALS.map((n, i) => n * (1 + d[i]!)));
      min = Math.min(min, y);
      max = Math.max(max, y);
    }
    const nominal = limitAt(NOMINALS);
    expect(wc.max).toBeLessThanOrEqual(max + 1e-12);
    expect(wc.min).toBeGreaterThanOrEqual(min - 1e-12);
    // The grid steps by A/10 = ρ/5 and cannot land on the exact ratio corners: within 25 % of the half-spread.
    expect((wc.max - nominal) / (max - nominal)).toBeGreaterThan(0.75);
    expect((nominal - wc.min) / (nominal - min)).toBeGreaterThan(0.75);
  });

  it('is narrower than four independent full-band corners (the same parts bought loose)', () => {
    const loose = worstCase(buildSupplyModel(diffSupply(null, tolerance))).find((w) => w.name === 'ilimit')!;
    expect(loose.max - loose.min).toBeGreaterThan(1.5 * (wc.max - wc.min));
  });

  it('first order: CMRR = (1 + G)/(4μ) with each member\'s own band μ = ρ/(2 + ρ); the limit half-spread follows', () => {
    // Derivation. Write R2/R1 = G(1 + e1), R4/R3 = G(1 + e2). The exact transfer (src/circuits/sense/diff.ts) gives
    //   plus gain  a = (R4/(R3 + R4))·(1 + R2/R1) ≈ G·(1 + (e2 + G·e1)/(1 + G))
    //   Acm = a − R2/R1 ≈ G·(e2 − e1)/(1 + G)       (the common-mode gain, first order)
    // and the limit I = (Vth − Acm·Vcm)/(a·Rs), so with I0 = Vth/(G·Rs) and k = G·Vcm/Vth
    //   ΔI/I0 ≈ −[k·(e2 − e1) + e2 + G·e1]/(1 + G).
    // With members R_i(1 + s)(1 + m_i): e1 = m2 − m1, e2 = m4 − m3 (s cancels in every ratio), so
    //   ΔI/I0 ≈ −[(k − G)(m1 − m2) + (k + 1)(m4 − m3)]/(1 + G),
    // whose worst case over |m_i| ≤ μ is ±2μ·(|k − G| + |k + 1|)/(1 + G). The common-mode part alone is
    // 4μ·k/(1 + G) = (Vcm/Vth)·G/CMRR, i.e. CMRR = (1 + G)/(4μ): the same form as the from-memory (1 + G)/(4t) for
    // loose parts (test/sense-circuits.test.ts) with the member's own band μ in place of the full tolerance t.
    // Second-order terms are O(μ) relative (μ ≈ 2.5e-4 here): a 1e-3 relative tolerance.
    const b = networkBands({ tolerance, ratio, tcrPerK: 0, trackingPerK: 0 });
    const mu = b.mismatch;
    const nominal = nominalOutputs(model)['ilimit']!;
    const k = (G * VCM) / VTH;
    const predicted = (2 * mu * (Math.abs(k - G) + Math.abs(k + 1))) / (1 + G);
    expect(((wc.max - wc.min) / 2 / nominal) / predicted).toBeCloseTo(1, 3);
    // CMRR from the model's own worst-case common-mode gain, against (1 + G)/(4μ).
    let worstAcm = 0;
    for (const c of corners(4)) {
      const r = NOMINALS.map((n, i) => n * (1 + c[i]! * mu));
      const acm = (r[3]! / (r[2]! + r[3]!)) * (1 + r[1]! / r[0]!) - r[1]! / r[0]!;
      worstAcm = Math.max(worstAcm, Math.abs(acm));
    }
    expect((G / worstAcm) / ((1 + G) / (4 * mu))).toBeCloseTo(1, 3);
  });
});

// A divider whose two legs are one network: vout/Vref − 1 = RTOP/RBOT and dividerCurrent = Vref/RBOT, so the
// outputs show each unit's ratio and its bottom member without reading the model's parts.
function networkDivider(tolerance: number, ratio: number, distribution?: NetworkSpec['distribution']): SupplySpec {
  const network: NetworkSpec = { name: 'RN1', members: ['RTOP', 'RBOT'], tolerance, ratio };
  if (distribution) network.distribution = distribution;
  return {
    reference: { nominal: 1, tolerance: 0 },
    divider: { top: { resistors: [{ name: 'RTOP', nominal: 30e3, tolerance: 0.05 }] }, bottom: { resistors: [{ name: 'RBOT', nominal: 10e3, tolerance: 0.05 }] } },
    temperature: { minC: 25, maxC: 25, monteCarlo: 'uniform' },
    networks: [network],
  };
}

describe('network Monte Carlo', () => {
  it.each([['uniform', undefined], ['truncated normal', { kind: 'truncated-normal', k: 3 } as const]])('every drawn unit holds both the absolute and the ratio band (%s draws, 200 000 trials)', (_label, distribution) => {
    const tolerance = 1e-2;
    const ratio = 1e-3;
    const model = buildSupplyModel(networkDivider(tolerance, ratio, distribution));
    let worstAbs = 0;
    let worstRatio = 0;
    for (const chunk of trialChunks(model, { seed: '7', runTrials: 200_000 }, 200_000)) {
      const [vout, current] = chunk.outputs;
      for (let j = 0; j < chunk.n; j++) {
        const rBottom = 1 / current![j]!;
        const rTop = (vout![j]! - 1) * rBottom;
        worstAbs = Math.max(worstAbs, Math.abs(rBottom / 10e3 - 1), Math.abs(rTop / 30e3 - 1));
        worstRatio = Math.max(worstRatio, Math.abs(rTop / rBottom / 3 - 1));
      }
    }
    expect(worstAbs).toBeLessThanOrEqual(tolerance * (1 + 1e-9));
    expect(worstRatio).toBeLessThanOrEqual(ratio * (1 + 1e-9));
    // And the draws use the bands, not a sliver of them: uniform draws come within 5 % of each end here, normal ones
    // (σ = a third of each half-width) reach past half the band.
    expect(worstRatio).toBeGreaterThan((distribution ? 0.5 : 0.95) * ratio);
  });

  it('var(R1/R2) of a matched pair matches its closed form for uniform own draws', () => {
    // R1/R2 = (R1,nom/R2,nom)·(1 + m1)/(1 + m2) with m1, m2 independent uniform on ±μ (the shared s cancels). For
    // X = 1 + m1, Y = 1 + m2: E[X] = 1, E[X²] = 1 + μ²/3, E[1/Y] = ln((1 + μ)/(1 − μ))/(2μ), E[1/Y²] = 1/(1 − μ²)
    // (integrals of 1/y and 1/y² over [1 − μ, 1 + μ], divided by 2μ), so the relative variance of the ratio is
    //   E[X²]·E[1/Y²] − (E[X]·E[1/Y])² = (1 + μ²/3)/(1 − μ²) − (ln((1 + μ)/(1 − μ))/(2μ))²   (≈ 2μ²/3 first order).
    // μ = ρ/(2 + ρ) with ρ = 4 % (a wide band, to test the draw well away from zero). Monte Carlo with
    // N = 400 000: the sample variance's relative standard error is √((κ − 1)/N) with κ ≈ 2.4 (the kurtosis of a
    // sum of two uniforms), 1.9e-3; 1 % is over 5 standard errors.
    const ratio = 0.04;
    const mu = ratio / (2 + ratio);
    const model = buildSupplyModel(networkDivider(0.05, ratio));
    let n = 0;
    let mean = 0;
    let m2 = 0;
    for (const chunk of trialChunks(model, { seed: '3', runTrials: 400_000 }, 400_000)) {
      const vout = chunk.outputs[0]!;
      for (let j = 0; j < chunk.n; j++) {
        const r = (vout[j]! - 1) / 3;
        n++;
        const delta = r - mean;
        mean += delta / n;
        m2 += delta * (r - mean);
      }
    }
    const variance = m2 / (n - 1);
    const exact = (1 + (mu * mu) / 3) / (1 - mu * mu) - (Math.log((1 + mu) / (1 - mu)) / (2 * mu)) ** 2;
    expect(Math.abs(variance / exact - 1)).toBeLessThan(0.01);
    // The mean of the ratio: E[X]·E[1/Y] = ln((1 + μ)/(1 − μ))/(2μ); σ/√N = 1.8e-5 here, checked to 1e-4.
    expect(Math.abs(mean - Math.log((1 + mu) / (1 - mu)) / (2 * mu))).toBeLessThan(1e-4);
  });
});

describe('network spec checks', () => {
  it('names the field for a missing member, a member twice, a shunt member and a ratio above the tolerance', () => {
    const base = diffSupply(null);
    const withNetworks = (networks: NetworkSpec[]): SupplySpec => ({ ...base, networks });
    const ok = { tolerance: 1e-3, ratio: 5e-4 };
    expect(() => buildSupplyModel(withNetworks([{ name: 'RN1', members: ['R1', 'R9'], ...ok }]))).toThrow(/R9/);
    expect(() => buildSupplyModel(withNetworks([{ name: 'RN1', members: ['R1', 'R2'], ...ok }, { name: 'RN2', members: ['R2', 'R3'], ...ok }]))).toThrow(/already a member of RN1/);
    expect(() => buildSupplyModel(withNetworks([{ name: 'RN1', members: ['RS', 'R1'], ...ok }]))).toThrow(/shunt/);
    expect(() => buildSupplyModel(withNetworks([{ name: 'RN1', members: ['R1', 'R2'], tolerance: 1e-3, ratio: 2e-3 }]))).toThrow(InputError);
    expect(() => buildSupplyModel(withNetworks([{ name: 'RN1', members: ['R1'], ...ok }]))).toThrow(/at least two/);
  });
});
