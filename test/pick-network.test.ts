// The quick pickers with a resistor network (`sense --topology diff --ratio-tol`, `divider --ratio-tol`): the worst
// case against brute force over the network's corners and, for the divider, against its closed form; the Pareto
// front and ranking reflect the narrower spread.
import { describe, expect, it } from 'vitest';
import { diffLimit } from '../src/circuits/sense/diff.js';
import { InputError } from '../src/errors.js';
import { pickDivider } from '../src/pick/divider.js';
import { pickSense, type SenseRequest } from '../src/pick/sense.js';
import { seriesValuesBetween } from '../src/series/enumerate.js';
import { networkBands } from '../src/tolerance/network-bands.js';

const corners = (k: number): number[][] => Array.from({ length: 2 ** k }, (_, v) => Array.from({ length: k }, (_, b) => ((v >>> b) & 1 ? 1 : -1)));

function highSide(over: Partial<SenseRequest> = {}): SenseRequest {
  return {
    limit: 0.7,
    topology: 'diff',
    threshold: { kind: 'fixed', volts: 1, tolerance: 0.01 },
    shunts: [0.1, 0.22, 0.33],
    shuntTolerance: 0.01,
    shuntRatingW: 0.5,
    derating: 0.5,
    resistorValues: seriesValuesBetween('E96', 1e3, 200e3),
    resistorTolerance: 0.001,
    rail: 24,
    headroom: 0.5,
    amplifierOffset: 1e-3,
    compareOffset: 0.5e-3,
    biasCurrent: { nominal: 0, lo: -50e-9, hi: 50e-9, form: 'plus-minus' },
    commonMode: 19,
    ...over,
  };
}

describe('sense, diff with R1–R4 as one network', () => {
  const network = { name: 'RN1', tolerance: 0.001, ratio: 0.0005 };
  const pick = pickSense(highSide({ gainNetwork: network }));
  const loose = pickSense(highSide());

  it('each candidate\'s worst case equals brute force over shared × own corners and every other band end', () => {
    const b = networkBands({ tolerance: network.tolerance, ratio: network.ratio, tcrPerK: 0, trackingPerK: 0 });
    for (const c of pick.candidates.slice(0, 5)) {
      const p = c.parts;
      let min = Infinity;
      let max = -Infinity;
      // RS, threshold, Vos, Ib, Vos_cmp, s, m1..m4: 10 band ends, 1024 corners.
      for (const x of corners(10)) {
        const r = (k: number, nominal: number): number => nominal * (1 + x[5]! * b.shared) * (1 + x[6 + k]! * b.mismatch);
        const y = diffLimit({
          shunt: p['RS']! * (1 + 0.01 * x[0]!),
          r1: r(0, p['R1']!),
          r2: r(1, p['R2']!),
          r3: r(2, p['R3']!),
          r4: r(3, p['R4']!),
          commonMode: 19,
          threshold: 1 + 0.01 * x[1]!,
          amplifierOffset: 1e-3 * x[2]!,
          biasCurrent: 50e-9 * x[3]!,
          compareOffset: 0.5e-3 * x[4]!,
        });
        min = Math.min(min, y);
        max = Math.max(max, y);
      }
      expect(c.worstCase.min).toBeCloseTo(min, 12);
      expect(c.worstCase.max).toBeCloseTo(max, 12);
    }
  });

  it('with the TCRs counted (--tcr, --tracking, --delta-t): brute force over every corner, both ends of the ambient included', () => {
    // Member k at temperature: R_k·(1 + s)·(1 + m_k)·(1 + (a + t_k)·ΔT), |a| ≤ T − τ/2, |t_k| ≤ τ/2, ΔT = ±45 K; loose:
    // R_k·(1 ± t)·(1 + α_k·ΔT), |α_k| ≤ T. 16 and 14 band ends: 65 536 and 16 384 corners per candidate.
    const tcr = { tcrPerK: 25e-6, deltaT: 45 };
    const tracked = pickSense(highSide({ gainNetwork: { ...network, trackingPerK: 5e-6 }, gainTcr: tcr, shunts: [0.33] }));
    const looseTcr = pickSense(highSide({ gainTcr: tcr, shunts: [0.33] }));
    const b = networkBands({ tolerance: network.tolerance, ratio: network.ratio, tcrPerK: 25e-6, trackingPerK: 5e-6 });
    const common = (x: number[], p: Record<string, number>) => ({
      shunt: p['RS']! * (1 + 0.01 * x[0]!),
      commonMode: 19,
      threshold: 1 + 0.01 * x[1]!,
      amplifierOffset: 1e-3 * x[2]!,
      biasCurrent: 50e-9 * x[3]!,
      compareOffset: 0.5e-3 * x[4]!,
    });
    const extremes = (k: number, limit: (x: number[]) => number) => {
      let min = Infinity;
      let max = -Infinity;
      for (const x of corners(k)) {
        const y = limit(x);
        min = Math.min(min, y);
        max = Math.max(max, y);
      }
      return { min, max };
    };
    for (const c of tracked.candidates.slice(0, 2)) {
      const p = c.parts;
      const nominals = [p['R1']!, p['R2']!, p['R3']!, p['R4']!];
      const e = extremes(16, (x) => {
        const r = nominals.map((n, k) => n * (1 + x[5]! * b.shared) * (1 + x[6 + k]! * b.mismatch) * (1 + (x[10]! * b.sharedTcrPerK + x[11 + k]! * b.memberTcrPerK) * 45 * x[15]!));
        return diffLimit({ ...common(x, p), r1: r[0]!, r2: r[1]!, r3: r[2]!, r4: r[3]! });
      });
      expect(c.worstCase.min).toBeCloseTo(e.min, 12);
      expect(c.worstCase.max).toBeCloseTo(e.max, 12);
    }
    for (const c of looseTcr.candidates.slice(0, 2)) {
      const p = c.parts;
      const nominals = [p['R1']!, p['R2']!, p['R3']!, p['R4']!];
      const e = extremes(14, (x) => {
        const r = nominals.map((n, k) => n * (1 + 0.001 * x[5 + k]!) * (1 + 25e-6 * x[9 + k]! * 45 * x[13]!));
        return diffLimit({ ...common(x, p), r1: r[0]!, r2: r[1]!, r3: r[2]!, r4: r[3]! });
      });
      expect(c.worstCase.min).toBeCloseTo(e.min, 12);
      expect(c.worstCase.max).toBeCloseTo(e.max, 12);
    }
    // Tracking narrows the spread against the loose parts at the same TCR.
    expect(tracked.candidates[0]!.worstCaseSpreadPct).toBeLessThan(0.5 * looseTcr.candidates[0]!.worstCaseSpreadPct);
  });

  it('narrows every candidate\'s spread against four loose parts of the same absolute tolerance, and the Pareto front moves with it', () => {
    const key = (c: { parts: Record<string, number> }) => `${c.parts['RS']} ${c.parts['R1']} ${c.parts['R2']}`;
    const looseByKey = new Map(loose.candidates.map((c) => [key(c), c]));
    for (const c of pick.candidates) {
      const l = looseByKey.get(key(c))!;
      expect(c.worstCaseSpreadPct).toBeLessThan(l.worstCaseSpreadPct);
    }
    // The front is the candidates no other beats on both loss and spread, with the network's spreads.
    for (const f of pick.pareto) {
      expect(pick.candidates.some((c) => c.shuntLossW <= f.shuntLossW && c.worstCaseSpreadPct < f.worstCaseSpreadPct && (c.shuntLossW < f.shuntLossW || c.worstCaseSpreadPct < f.worstCaseSpreadPct))).toBe(false);
    }
    expect(Math.min(...pick.pareto.map((c) => c.worstCaseSpreadPct))).toBeLessThan(0.6 * Math.min(...loose.pareto.map((c) => c.worstCaseSpreadPct)));
  });

  it('a zero ratio band leaves only the shared term, which cancels in every ratio: the resistors add nothing', () => {
    const exact = pickSense(highSide({ gainNetwork: { name: 'RN1', tolerance: 0.001, ratio: 0 }, resistorTolerance: 0.001 }));
    const perfect = pickSense(highSide({ resistorTolerance: 0 }));
    const key = (c: { parts: Record<string, number> }) => `${c.parts['RS']} ${c.parts['R1']} ${c.parts['R2']}`;
    const perfectByKey = new Map(perfect.candidates.map((c) => [key(c), c]));
    for (const c of exact.candidates) {
      const q = perfectByKey.get(key(c))!;
      // Only the bias currents see the absolute value (Ib·R terms): 50 nA through ~30 kΩ at 0.1 %, far below 1e-6 A.
      expect(Math.abs(c.worstCase.max - q.worstCase.max)).toBeLessThan(1e-6);
      expect(Math.abs(c.worstCase.min - q.worstCase.min)).toBeLessThan(1e-6);
    }
  });
});

describe('divider with both legs one network', () => {
  it('worst case equals its closed form: the shared term cancels, the ratio reaches 1 ± ρ', () => {
    // With Ifb = 0, Vout = Vref·(1 + Rt/Rb) and Rt/Rb = (Rt,nom/Rb,nom)·(1 + m_t)/(1 + m_b): its highest value is
    // r·(1 + μ)/(1 − μ) = r·(1 + ρ), its lowest r·(1 − μ)/(1 + μ) (network-bands.ts), so
    //   max = Vref·(1 + v)·(1 + r·(1 + ρ)),  min = Vref·(1 − v)·(1 + r·(1 − μ)/(1 + μ)).
    const tolerance = 0.001;
    const ratio = 0.0005;
    const vrefTolerance = 0.005;
    const result = pickDivider({ vref: 1.25, vout: { lo: 8.4, hi: 8.4 }, ifb: 0, series: ['E96'], maxParts: 2, bottom: { lo: 1e3, hi: 100e3 }, minOhms: 1, maxOhms: 1e6, biasRatio: 0, tolerance, ratioTolerance: ratio, vrefTolerance, count: 5 });
    if (result.mode !== 'fixed') throw new Error('fixed expected');
    expect(result.settings.ratioTolerance).toBe(ratio);
    const mu = networkBands({ tolerance, ratio, tcrPerK: 0, trackingPerK: 0 }).mismatch;
    for (const c of result.candidates) {
      const r = c.top / c.bottom;
      expect(c.worstCase.max).toBeCloseTo(1.25 * (1 + vrefTolerance) * (1 + r * (1 + ratio)), 12);
      expect(c.worstCase.min).toBeCloseTo(1.25 * (1 - vrefTolerance) * (1 + (r * (1 - mu)) / (1 + mu)), 12);
    }
  });

  it('with TCR tracking over 25 °C ± ΔT: the closed form again, with each member own TCR in the ratio', () => {
    // Rt/Rb = r·(1 + m_t)(1 + (a + t_t)·ΔT)/((1 + m_b)(1 + (a + t_b)·ΔT)): s cancels, the shared TCR a only to first
    // order. With u = a·ΔT within ±A (A = (T − τ/2)·45 K) and h = (τ/2)·45 K, (1 + u + h)/(1 + u − h) is largest at
    // u = −A, so
    //   max = Vref·(1 + v)·(1 + r·(1 + ρ)·(1 − A + h)/(1 − A − h)),
    //   min = Vref·(1 − v)·(1 + r·((1 − μ)/(1 + μ))·(1 − A − h)/(1 − A + h)).
    const tolerance = 0.001;
    const ratio = 0.0005;
    const vrefTolerance = 0.005;
    const result = pickDivider({ vref: 1.25, vout: { lo: 8.4, hi: 8.4 }, ifb: 0, series: ['E96'], maxParts: 2, bottom: { lo: 1e3, hi: 100e3 }, minOhms: 1, maxOhms: 1e6, biasRatio: 0, tolerance, ratioTolerance: ratio, vrefTolerance, count: 3, temperature: { tcrPerK: 25e-6, trackingPerK: 5e-6, deltaT: 45 } });
    if (result.mode !== 'fixed') throw new Error('fixed expected');
    const mu = networkBands({ tolerance, ratio, tcrPerK: 0, trackingPerK: 0 }).mismatch;
    const h = 2.5e-6 * 45;
    const A = 22.5e-6 * 45;
    for (const c of result.candidates) {
      const r = c.top / c.bottom;
      expect(c.worstCase.max).toBeCloseTo(1.25 * (1 + vrefTolerance) * (1 + r * (1 + ratio) * ((1 - A + h) / (1 - A - h))), 12);
      expect(c.worstCase.min).toBeCloseTo(1.25 * (1 - vrefTolerance) * (1 + r * ((1 - mu) / (1 + mu)) * ((1 - A - h) / (1 - A + h))), 12);
    }
    // Loose parts at the same TCR: each ±(t, T) on its own, so the ratio reaches ((1 + t)(1 + TΔT))/((1 − t)(1 − TΔT)).
    const loose = pickDivider({ vref: 1.25, vout: { lo: 8.4, hi: 8.4 }, ifb: 0, series: ['E96'], maxParts: 2, bottom: { lo: 1e3, hi: 100e3 }, minOhms: 1, maxOhms: 1e6, biasRatio: 0, tolerance, vrefTolerance, count: 3, temperature: { tcrPerK: 25e-6, deltaT: 45 } });
    if (loose.mode !== 'fixed') throw new Error('fixed expected');
    const H = 25e-6 * 45;
    for (const c of loose.candidates) {
      const r = c.top / c.bottom;
      expect(c.worstCase.max).toBeCloseTo(1.25 * (1 + vrefTolerance) * (1 + (r * (1 + tolerance) * (1 + H)) / ((1 - tolerance) * (1 - H))), 12);
    }
  });

  it('refuses a ratio band wider than the absolute one, and a network with a pot', () => {
    const base = { vref: 1.25, ifb: 0, series: ['E96' as const], maxParts: 2 as const, bottom: { lo: 1e3, hi: 100e3 }, minOhms: 1, maxOhms: 1e6, biasRatio: 0, tolerance: 0.001, vrefTolerance: 0.01, count: 5 };
    expect(() => pickDivider({ ...base, vout: { lo: 8.4, hi: 8.4 }, ratioTolerance: 0.002 })).toThrow(InputError);
    expect(() => pickDivider({ ...base, vout: { lo: 3, hi: 12 }, ratioTolerance: 0.0005, pot: { ohms: 10e3, tolerance: 0.2, leg: 'top' } })).toThrow(/fixed divider only/);
  });
});
