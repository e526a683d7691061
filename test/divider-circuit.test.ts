import { describe, expect, it } from 'vitest';
import { dividerCurrent, dividerRtopFor, dividerVout } from '../src/circuits/divider.js';

describe('feedback divider (Kirchhoff current law at the feedback node)', () => {
  it('Vref 1.25 V, 28.7 kΩ over 3.3 kΩ: 1.25·(1 + 28.7/3.3) = 12.1212… V (hand arithmetic)', () => {
    // 28.7 / 3.3 = 8.69697; 1.25 × 9.69697 = 12.12121
    expect(dividerVout(1.25, 28.7e3, 3.3e3, 0)).toBeCloseTo(12.121212, 5);
  });
  it('a bias current into the pin raises Vout by Ifb·Rtop: 100 nA × 28.7 kΩ = 2.87 mV', () => {
    const shift = dividerVout(1.25, 28.7e3, 3.3e3, 100e-9) - dividerVout(1.25, 28.7e3, 3.3e3, 0);
    expect(shift).toBeCloseTo(2.87e-3, 9);
  });
  it('dividerRtopFor inverts dividerVout (round trip over a grid, with and without bias current)', () => {
    for (const vout of [1.3, 3.3, 5, 12, 24, 48]) {
      for (const ifb of [0, 50e-9, -50e-9]) {
        const rtop = dividerRtopFor(0.8, vout, 10e3, ifb);
        expect(dividerVout(0.8, rtop, 10e3, ifb)).toBeCloseTo(vout, 10);
      }
    }
  });
  it('divider current is Vref/Rbottom: 1.25 V / 3.3 kΩ = 378.8 µA', () => {
    expect(dividerCurrent(1.25, 3.3e3)).toBeCloseTo(378.7879e-6, 9);
  });
});
