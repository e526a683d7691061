// A small CV/CC supply for the tests of the report layer (invented values): Vref 1.25 V ±1 %, divider 56 kΩ over
// 10 kΩ (8.25 V), a 50 mΩ shunt with a non-inverting gain of 11 against a 0.6 V threshold (about 1.09 A).
import type { SupplySpec } from '../src/analysis/models/supply.js';

export function testSupply(tolerance = 0.01, tcrPerK = 100e-6): SupplySpec {
  const r = (name: string, nominal: number) => ({ name, nominal, tolerance, tcrPerK, distribution: { kind: 'normal' as const } });
  return {
    reference: { nominal: 1.25, tolerance: 0.01, tempcoPerK: 50e-6 },
    divider: { top: { resistors: [r('R1', 56e3)] }, bottom: { resistors: [r('R2', 10e3)] } },
    temperature: { minC: 0, maxC: 50, monteCarlo: 'uniform' },
    sense: {
      topology: 'noninv',
      shunt: { name: 'RS', nominal: 0.05, tolerance: 0.01, tcrPerK: 75e-6, powerRatingW: 0.25 },
      rf: r('R3', 10e3),
      rg: r('R4', 1e3),
      amplifier: { offsetMax: 1e-3 },
      threshold: { kind: 'fixed', nominal: 0.6, tolerance: 0.01 },
      limitTarget: 1.09,
    },
    windows: { vout: [8.1, 8.4], ilimit: [1.0, 1.2] },
  };
}
