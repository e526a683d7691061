// A small direct-sense supply for grade tests (invented figures): 1 % resistors with 100 ppm/K, a 100 mΩ shunt
// against a 0.1 V threshold, 0…50 °C. The divider's two values and the windows are the caller's.
import type { SupplySpec } from '../src/analysis/models/supply.js';

export function directSenseSupply(rtop: number, rbot: number, windows: NonNullable<SupplySpec['windows']>): SupplySpec {
  return {
    reference: { nominal: 1.25, tolerance: 0.002 },
    divider: {
      top: { resistors: [{ name: 'RTOP', nominal: rtop, tolerance: 0.01, tcrPerK: 100e-6 }] },
      bottom: { resistors: [{ name: 'RBOT', nominal: rbot, tolerance: 0.01, tcrPerK: 100e-6 }] },
    },
    temperature: { minC: 0, maxC: 50, monteCarlo: 'uniform' },
    sense: {
      topology: 'direct',
      shunt: { name: 'RS', nominal: 0.1, tolerance: 0.01, tcrPerK: 50e-6 },
      threshold: { kind: 'fixed', nominal: 0.1, tolerance: 0.01 },
      limitTarget: 1,
    },
    windows,
  };
}
