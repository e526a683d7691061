// The benchmark's design: a CV/CC bench-supply module we invented for the benchmark (not a real product):
// 12.0 V out from a 1.25 V reference, 1 % divider, 2.0 A limit through a 50 mΩ low-side shunt and a
// non-inverting amplifier (gain 9.2) against a 0.92 V threshold. Eleven uncertain parts plus temperature.
import type { SupplySpec } from '../analysis/models/supply.js';

export const BENCH_SUPPLY: SupplySpec = {
  reference: { nominal: 1.25, tolerance: 0.01, tempcoPerK: 50e-6, distribution: { kind: 'normal', k: 3 } },
  divider: {
    top: { resistors: [{ name: 'R1', nominal: 105e3, tolerance: 0.01, tcrPerK: 100e-6 }] },
    bottom: { resistors: [{ name: 'R2', nominal: 12.1e3, tolerance: 0.01, tcrPerK: 100e-6 }] },
    feedbackBias: { nominal: 0, plusMinus: 50e-9 },
  },
  temperature: { minC: 0, maxC: 50, monteCarlo: 'uniform' },
  sense: {
    topology: 'noninv',
    shunt: { name: 'RS', nominal: 0.05, tolerance: 0.01, tcrPerK: 75e-6, powerRatingW: 0.5, thermalResistanceKPerW: 60 },
    rf: { name: 'RF', nominal: 8.2e3, tolerance: 0.01 },
    rg: { name: 'RG', nominal: 1e3, tolerance: 0.01 },
    amplifier: { offsetMax: 1e-3, offsetDistribution: { kind: 'normal', k: 3 }, biasCurrent: { nominal: 20e-9, plusMinus: 20e-9 }, railV: 5 },
    threshold: { kind: 'fixed', nominal: 0.92, tolerance: 0.01, distribution: { kind: 'truncated-normal', k: 3 } },
    compareOffset: { nominal: 0, plusMinus: 2e-3 },
    limitTarget: 2,
  },
  windows: { vout: [11.76, 12.24], ilimit: [1.8, 2.2] },
  voutTarget: 12,
};
