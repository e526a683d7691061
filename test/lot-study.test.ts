// The lot study (src/analysis/lot-study.ts, reel-lot model) against outside values:
//  - a divider whose only varying part is RTOP: Vout = Vref·(1 + RTOP/RBOT) is monotonic in RTOP, so a unit passes
//    exactly when RTOP's relative deviation x lies in the window's preimage [−a, a]. In lot k, x = δ_k + e with e
//    uniform on ±(1 − f)·t, so the lot's yield is the closed form |[−a − δ_k, a − δ_k] ∩ [−(1−f)t, (1−f)t]| / (2(1−f)t);
//  - pooled over lots, x = δ + e is the sum of two independent uniforms: a plain Monte Carlo of that sum (drawn here
//    with seedrandom, no engine) must agree with the study's overall yield within their combined standard error;
//  - the worst lot's yield is at most the overall; the same seed gives the same lots for 1 and 2 worker threads.
import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';
import { lotOffsets, lotSpec, lotStudy, reelsOf } from '../src/analysis/lot-study.js';
import type { SupplySpec } from '../src/analysis/models/supply.js';

const T = 0.01; // RTOP ±1 %
const SHARE = 0.5;
const A = 0.007; // window: RTOP within ±0.7 % (yield between about 70 % and 100 % per lot)
const VREF = 1.25;
const RT = 30e3;
const RB = 10e3;
const voutAt = (x: number): number => VREF * (1 + (RT * (1 + x)) / RB);

function spec(): SupplySpec {
  return {
    reference: { nominal: VREF, tolerance: 0 },
    divider: { top: { resistors: [{ name: 'RTOP', nominal: RT, tolerance: T }] }, bottom: { resistors: [{ name: 'RBOT', nominal: RB, tolerance: 0 }] } },
    temperature: { minC: 25, maxC: 25, monteCarlo: 'uniform' },
    windows: { vout: [voutAt(-A), voutAt(A)] },
  };
}

/** Closed form: the share of e ~ U(±h) with δ + e in [−a, a]. */
function lotYield(delta: number, h: number, a: number): number {
  const lo = Math.max(-a - delta, -h);
  const hi = Math.min(a - delta, h);
  return Math.max(0, hi - lo) / (2 * h);
}

describe('reel-lot model', () => {
  it('groups parts of one kind, value and tolerance into a reel and moves them together', () => {
    const s: SupplySpec = { ...spec(), divider: { top: { resistors: [{ name: 'RTOP', nominal: 10e3, tolerance: 0.01 }] }, bottom: { resistors: [{ name: 'RBOT', nominal: 10e3, tolerance: 0.01 }] } } };
    const reels = reelsOf(s);
    expect(reels).toEqual([{ name: 'RTOP+RBOT', members: ['RTOP', 'RBOT'], tolerance: 0.01 }]);
    const lot = lotSpec(s, reels, [0.004], SHARE);
    for (const leg of [lot.divider!.top, lot.divider!.bottom]) {
      const r = leg.resistors[0];
      expect(r.nominal).toBeCloseTo(10e3 * 1.004, 9);
      // The band about the lot's centre is ±(1 − share)·t of the original nominal: ±50 Ω.
      expect(r.tolerance * r.nominal).toBeCloseTo(50, 9);
    }
  });

  it('offsets lie within ±share·t and do not depend on anything but the seed', () => {
    const reels = reelsOf(spec());
    const rows = lotOffsets(reels, 200, SHARE, '9');
    expect(rows.flat().every((d) => Math.abs(d) <= SHARE * T)).toBe(true);
    expect(lotOffsets(reels, 200, SHARE, '9')).toEqual(rows);
  });

  it('each lot\'s yield matches the closed form for its offset; overall agrees with a plain Monte Carlo of the summed distribution; worst ≤ overall', async () => {
    const count = 40;
    const trialsPerLot = 5000;
    const study = await lotStudy(spec(), { count, share: SHARE, trialsPerLot, seed: 7, workers: 1 });
    const h = (1 - SHARE) * T;
    for (const lot of study.lots) {
      const p = lotYield(lot.offsets[0]!, h, A);
      const se = Math.sqrt(Math.max(p * (1 - p), 1 / trialsPerLot) / trialsPerLot);
      expect(Math.abs(lot.yieldPct['vout']! / 100 - p)).toBeLessThan(4.5 * se + 1e-12);
    }
    // Plain Monte Carlo of x = δ + e, δ ~ U(±share·t), e ~ U(±(1 − share)·t), independent draws (no lots).
    const random = seedrandom.xor128('plain');
    const n = 400_000;
    let pass = 0;
    for (let i = 0; i < n; i++) {
      const x = SHARE * T * (2 * random() - 1) + h * (2 * random() - 1);
      if (Math.abs(x) <= A) pass++;
    }
    const plain = pass / n;
    // The study's overall yield varies with the lot offsets drawn: its standard error is that of the mean of the K lot
    // yields, sd(lot yields)/√K (which includes the within-lot binomial part); the plain run's is binomial.
    const lotYields = study.lots.map((l) => l.yieldPct['vout']! / 100);
    const mean = lotYields.reduce((s, y) => s + y, 0) / count;
    const sdLots = Math.sqrt(lotYields.reduce((s, y) => s + (y - mean) ** 2, 0) / (count - 1));
    const se = Math.sqrt(sdLots ** 2 / count + (plain * (1 - plain)) / n);
    const overall = study.overall['vout']!.pct / 100;
    expect(overall).toBeCloseTo(mean, 12); // equal lots: the pooled yield is the mean of the lots'
    expect(Math.abs(overall - plain)).toBeLessThan(4 * se);
    // And both agree with the closed form of the trapezoid (sum of two uniforms) within the same error.
    const w = SHARE * T;
    const cdf = (x: number): number => {
      // CDF of δ + e for δ ~ U(±w), e ~ U(±h), h ≥ w.
      if (x <= -h - w) return 0;
      if (x >= h + w) return 1;
      if (x < -h + w) return (x + h + w) ** 2 / (8 * h * w);
      if (x <= h - w) return (x + h) / (2 * h);
      return 1 - (h + w - x) ** 2 / (8 * h * w);
    };
    expect(Math.abs(overall - (cdf(A) - cdf(-A)))).toBeLessThan(4 * se);
    expect(study.worst['vout']!.pct).toBeLessThanOrEqual(study.overall['vout']!.pct);
    expect(study.worst['vout']!.pct).toBe(Math.min(...study.lots.map((l) => l.yieldPct['vout']!)));
    expect(study.worst['vout']!.pct).toBeLessThan(study.overall['vout']!.pct); // lots do differ here
  });

  it('the same seed gives the same lots for 1 and 2 worker threads', async () => {
    const options = { count: 2, share: SHARE, trialsPerLot: 70_000, seed: 3 };
    const one = await lotStudy(spec(), { ...options, workers: 1 });
    const two = await lotStudy(spec(), { ...options, workers: 2 });
    expect(two.lots).toEqual(one.lots);
    expect(two.overall).toEqual(one.overall);
  });
});

describe('the lot study in the work plan', () => {
  it('spread --lots K counts K × trialsPerLot beside the spread\'s own trials (by hand: 1000 + 3 × 1000)', async () => {
    const { planWork } = await import('../src/cli/work-budget.js');
    const { resolveDesign } = await import('../src/design/resolve.js');
    const { validateDesign } = await import('../src/design/load.js');
    const { baseDesign } = await import('./design-fixture.js');
    const resolved = resolveDesign(validateDesign(baseDesign()));
    const plan = planWork(resolved, { spread: { trials: 1000, seed: 1, progress: false, lots: { count: 3, share: 0.5, trialsPerLot: 1000 } } }, 1);
    expect(plan.estimate.trials).toBe(4000);
    expect(plan.estimate.basis).toMatch(/3 lots × 1000 trials/);
  });
});

describe('networks in the lot study', () => {
  it('a network’s members get no reel (their values come from the network’s own draws), and the notes say so', async () => {
    // Two equal 10k bottom resistors would share a reel; as members of RN1 they must not (a reel offset moves the
    // member's nominal while the network's band stays whole, which would widen the member's spread).
    const s: SupplySpec = {
      ...spec(),
      divider: {
        top: { resistors: [{ name: 'RTOP', nominal: RT, tolerance: T }] },
        bottom: { resistors: [{ name: 'RBOT_A', nominal: RB, tolerance: T }, { name: 'RBOT_B', nominal: RB, tolerance: T }], arrangement: 'series' },
      },
    };
    expect(reelsOf(s).map((r) => r.name)).toEqual(['RTOP', 'RBOT_A+RBOT_B']);
    const networked: SupplySpec = { ...s, networks: [{ name: 'RN1', members: ['RBOT_A', 'RBOT_B'], tolerance: T, ratio: T / 2 }] };
    expect(reelsOf(networked).map((r) => r.name)).toEqual(['RTOP']);
    const study = await lotStudy(networked, { seed: '5', count: 2, share: SHARE, trialsPerLot: 2000, workers: 1 });
    expect(study.notes.join(' ')).toMatch(/members of RN1 \(a network's lot-to-lot spread is not modelled\)/);
  });
});
