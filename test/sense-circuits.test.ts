// Current-sense physics against closed forms worked by hand, and the first-order common-mode result.
import { describe, expect, it } from 'vitest';
import { diffCommonModeGain, diffLimit, diffOutput, type DiffSense } from '../src/circuits/sense/diff.js';
import { directLimit } from '../src/circuits/sense/direct.js';
import { noninvGain, noninvLimit, noninvOutput, type NoninvSense } from '../src/circuits/sense/noninv.js';
import { thresholdDividerRatio, thresholdFromReference } from '../src/circuits/sense/threshold-divider.js';
import { largestShuntForLoss, shuntLoss, shuntMaxCurrent } from '../src/circuits/shunt-power.js';

const ideal = { amplifierOffset: 0, biasCurrent: 0, compareOffset: 0 };

describe('diff: four-resistor difference amplifier', () => {
  it('matched ratios give the textbook G·(Vp − Vn), whatever the common mode', () => {
    // R2/R1 = R4/R3 = 10; 0.1 Ω at 1 A gives 0.1 V differential → 1.000 V out at 0 V, 12 V and 48 V common mode.
    for (const commonMode of [0, 12, 48]) {
      const p: DiffSense = { shunt: 0.1, r1: 1e3, r2: 10e3, r3: 2e3, r4: 20e3, commonMode, threshold: 1, ...ideal };
      expect(diffOutput(p, 1)).toBeCloseTo(1.0, 12);
      expect(diffCommonModeGain(p)).toBeCloseTo(0, 15);
      expect(diffLimit(p)).toBeCloseTo(1.0, 12);
    }
  });

  it('a mismatched case by superposition, worked by hand (bc, 12 digits)', () => {
    // R1 = 1 kΩ, R2 = 10 kΩ, R3 = 1.01 kΩ, R4 = 9.9 kΩ; Vn = 24 V, Vp = 24.1 V (0.1 Ω at 1 A).
    // Superposition: V+ = Vp·R4/(R3+R4) = 24.1·9900/10910 = 21.868927589367 V
    //                Vo = V+·(1 + R2/R1) − Vn·R2/R1 = 21.868927589367·11 − 240 = 0.558203483037 V
    // (against 1.000 V with matched parts: the mismatch turns 24 V of common mode into −0.44 V of error).
    const p: DiffSense = { shunt: 0.1, r1: 1000, r2: 10000, r3: 1010, r4: 9900, commonMode: 24, threshold: 0.558203483037, ...ideal };
    expect(diffOutput(p, 1)).toBeCloseTo(0.558203483037, 10);
    // Common-mode gain alone: 9900/10910·11 − 10 = −0.018331805683; × 24 V = −0.439963336393 V (bc).
    expect(diffCommonModeGain(p) * 24).toBeCloseTo(-0.439963336393, 10);
    // The limit solves Vo(I) = Vth; at that threshold it is exactly 1 A.
    expect(diffLimit(p)).toBeCloseTo(1, 9);
  });

  it('offset and bias-current terms by hand: (1 + R2/R1)·(Vos − Ib·R3∥R4) + Ib·R2', () => {
    // R1 = R3 = 1 kΩ, R2 = R4 = 20 kΩ, Vos = 1 mV, Ib = 100 nA, no current:
    // R3∥R4 = 20e6/21e3 = 952.381 Ω; 21·(1e-3 − 100e-9·952.381) = 21·(1e-3 − 95.2381e-6) = 19.0 mV; + 100e-9·20e3 = 2 mV
    // → 21.0 mV: the bias terms cancel (21 × 952.381 Ω = 20 kΩ = R2), as they do whenever R1∥R2 = R3∥R4.
    const p: DiffSense = { shunt: 0.01, r1: 1e3, r2: 20e3, r3: 1e3, r4: 20e3, commonMode: 0, threshold: 1, amplifierOffset: 1e-3, biasCurrent: 100e-9, compareOffset: 0 };
    expect(diffOutput(p, 0)).toBeCloseTo(21e-3, 12);
  });

  it('worst-case common-mode rejection with resistor tolerance t is (1 + G)/(4t) to first order (from memory)', () => {
    // First order: R2/R1 = G(1+e1), R4/R3 = G(1+e2) give Acm ≈ G·(e2 − e1)/(1 + G); the worst |e2 − e1| is 4t,
    // so CMRR = G/|Acm| = (1 + G)/(4t). Compared at t = 1e-4, where the neglected second-order terms are O(t)
    // relative, so a 1e-3 relative tolerance is justified.
    const t = 1e-4;
    for (const gain of [1, 10, 50]) {
      let worst = 0;
      for (let v = 0; v < 16; v++) {
        const s = (bit: number): number => ((v >>> bit) & 1 ? 1 + t : 1 - t);
        const acm = diffCommonModeGain({ r1: 1e3 * s(0), r2: gain * 1e3 * s(1), r3: 1e3 * s(2), r4: gain * 1e3 * s(3) });
        worst = Math.max(worst, Math.abs(acm));
      }
      const cmrr = gain / worst;
      expect(cmrr / ((1 + gain) / (4 * t))).toBeCloseTo(1, 3);
    }
  });
});

describe('noninv: low-side shunt into a non-inverting amplifier', () => {
  const p: NoninvSense = { shunt: 0.05, feedback: 49.9e3, ground: 2.49e3, threshold: 1.0, amplifierOffset: 1e-3, biasCurrent: 100e-9, compareOffset: 2e-3 };

  it('gain 1 + RF/RG: 1 + 49.9k/2.49k = 21.040160642570 (bc)', () => {
    expect(noninvGain(49.9e3, 2.49e3)).toBeCloseTo(21.04016064257, 10);
  });

  it('offset and bias-current terms at the output: G·Vos and Ib·RF', () => {
    // Ib·RF = 100 nA × 49.9 kΩ = 4.99 mV; G·Vos = 21.04016 mV.
    const noBias = { ...p, biasCurrent: 0 };
    expect(noninvOutput(p, 0) - noninvOutput(noBias, 0)).toBeCloseTo(4.99e-3, 12);
    expect(noninvOutput({ ...noBias, amplifierOffset: 0 }, 0)).toBe(0);
    expect(noninvOutput(noBias, 0)).toBeCloseTo(21.04016064257e-3, 12);
  });

  it('limit by hand: ((Vth − Vos_cmp − Ib·RF)/G − Vos)/Rs', () => {
    // (1.0 − 0.002 − 0.00499) = 0.99301; / 21.04016064257 = 0.047195932429; − 0.001 = 0.046195932429;
    // / 0.05 = 0.92391864858 A (bc).
    expect(noninvLimit(p)).toBeCloseTo(0.92391864858, 10);
    // And the output at that current plus the compare offset meets the threshold (closes the loop).
    expect(noninvOutput(p, noninvLimit(p)) + p.compareOffset).toBeCloseTo(p.threshold, 12);
  });
});

describe('direct and the threshold divider', () => {
  it('direct: (Vth − Vos_cmp)/Rs: (0.1 − 0.002)/0.02 = 4.9 A', () => {
    expect(directLimit({ shunt: 0.02, threshold: 0.1, compareOffset: 0.002 })).toBeCloseTo(4.9, 12);
  });
  it('threshold from a reference: 1.25 V through 30 kΩ over 10 kΩ is 0.3125 V (Ohm)', () => {
    expect(thresholdFromReference(1.25, 30e3, 10e3)).toBeCloseTo(0.3125, 14);
    expect(thresholdDividerRatio(1.25, 0.3125)).toBeCloseTo(3, 14);
  });
});

describe('shunt power', () => {
  it('0.1 Ω rated 2 W carries at most √20 ≈ 4.472 A (common practice trade check)', () => {
    expect(shuntMaxCurrent(0.1, 2)).toBeCloseTo(Math.sqrt(20), 12);
    expect(shuntMaxCurrent(0.1, 2)).toBeCloseTo(4.4721, 4);
    // At 50 % derating: √(1/0.1) = √10 ≈ 3.162 A.
    expect(shuntMaxCurrent(0.1, 2, 0.5)).toBeCloseTo(3.16228, 5);
  });
  it('loss at the limit I²R: 3 A in 50 mΩ is 0.45 W; 4.472 A in 0.1 Ω is the full 2 W', () => {
    expect(shuntLoss(3, 0.05)).toBeCloseTo(0.45, 14);
    expect(shuntLoss(Math.sqrt(20), 0.1)).toBeCloseTo(2, 12);
    expect(largestShuntForLoss(3, 0.45)).toBeCloseTo(0.05, 14);
  });
});
