// A hand-made AnalysisResult for the report tests (invented figures, not a real analysis): one output with a spec
// window, one with a spec and zero-width histogram edge cases, one without a spec (no yield, no Cpk).
import type { AnalysisResult, OutputResult } from '../src/analysis/result.js';
import type { Part } from '../src/tolerance/part.js';

/** A bell-shaped histogram of `bins` bins over [lo, hi] holding `trials` counts in total. */
function bell(lo: number, hi: number, bins: number, trials: number): { edges: number[]; counts: number[] } {
  const edges = Array.from({ length: bins + 1 }, (_, i) => lo + ((hi - lo) * i) / bins);
  const weights = Array.from({ length: bins }, (_, i) => Math.exp(-(((i + 0.5) / bins - 0.5) ** 2) * 18));
  const total = weights.reduce((a, b) => a + b, 0);
  const counts = weights.map((w) => Math.floor((w / total) * trials));
  counts[Math.floor(bins / 2)] += trials - counts.reduce((a, b) => a + b, 0);
  return { edges, counts };
}

function output(partial: Partial<OutputResult> & Pick<OutputResult, 'name' | 'unit' | 'nominal' | 'mean' | 'sigma'>): OutputResult {
  const { nominal, sigma } = partial;
  return {
    min: nominal - 4 * sigma,
    max: nominal + 4 * sigma,
    percentiles: [{ pct: 2.5, value: nominal - 1.96 * sigma }, { pct: 97.5, value: nominal + 1.96 * sigma }],
    interval95: { low: nominal - 1.96 * sigma, high: nominal + 1.96 * sigma },
    interval9973: { low: nominal - 3 * sigma, high: nominal + 3 * sigma },
    shortest95: { low: nominal - 1.95 * sigma, high: nominal + 1.97 * sigma },
    shortest9973: { low: nominal - 3 * sigma, high: nominal + 3 * sigma },
    quantileMethod: 'exact',
    quantileBound: 0,
    worstCase: { min: nominal - 6 * sigma, max: nominal + 6.5 * sigma, minVertex: { R1: 'low', R2: 'high' }, maxVertex: { R1: 'high', R2: 'low' }, method: 'enumeration', evaluations: 16 },
    rss: { sigma: sigma * 1.01, expandedUncertainty: sigma * 2.02, coverageFactor: 2, center: nominal },
    contributions: [
      { part: 'Vref', sensitivity: 6.72, standardUncertainty: 0.0036, varianceShare: 0.61, totalEffectShare: 0.62, totalEffectStandardError: 0.011, firstOrderShare: 0.6, firstOrderStandardError: 0.013 },
      { part: 'R1', sensitivity: 2.1e-4, standardUncertainty: 12, varianceShare: 0.3, totalEffectShare: 0.31, totalEffectStandardError: 0.006, firstOrderShare: 0.29, firstOrderStandardError: 0.012 },
      { part: 'R2 <bottom>', sensitivity: -1.1e-3, standardUncertainty: 1.7, varianceShare: 0.09, totalEffectShare: 0.095, totalEffectStandardError: 0.002, firstOrderShare: 0.088, firstOrderStandardError: 0.01 },
    ],
    varianceBudget: {
      method: { estimator: 'fixture estimator', baseSamples: 8192, evaluations: 40960, seed: 'variance-indices:fixture' },
      totalEffectSum: 1.025,
      firstOrderSum: 0.978,
      rssToMonteCarloSigma: 1.01,
      rssAgreement: 'agrees',
    },
    histogram: bell(nominal - 4 * sigma, nominal + 4 * sigma, 200, 100000),
    ...partial,
  };
}

export const FIXTURE_RESULT: AnalysisResult = {
  seed: 'fixture',
  trials: 100000,
  workers: 2,
  chunkSize: 65536,
  notes: ['Monte Carlo holds the ambient at 25 °C; worst case takes both ends of 0..40 °C.'],
  outputs: {
    vout: output({
      name: 'vout', unit: 'V', nominal: 8.4, mean: 8.4003, sigma: 0.012, spec: [8.37, 8.43],
      yield: { pct: 98.76, low: 98.69, high: 98.83 }, ppmOut: 12400, cp: 0.833, cpk: 0.825,
    }),
    ilimit: output({
      name: 'ilimit', unit: 'A', nominal: 1.5, mean: 1.4991, sigma: 0.021, spec: [1.4, 1.6],
      yield: { pct: 99.999, low: 99.995, high: 100 }, ppmOut: 10, cp: 1.587, cpk: 1.573,
    }),
    shuntLoss: output({ name: 'shuntLoss', unit: 'W', nominal: 0.1125, mean: 0.1124, sigma: 0.003 }),
  },
  ambientGridC: null,
  allSpecs: { pct: 98.75, low: 98.68, high: 98.82, outputs: ['vout', 'ilimit'] },
};

export const FIXTURE_PARTS: Part[] = [
  { name: 'Vref', kind: 'reference', nominal: 1.2, minus: 0.006, plus: 0.006, distribution: { kind: 'uniform' }, unit: 'V' },
  { name: 'R1', kind: 'resistor', nominal: 7.15e3, minus: 71.5, plus: 71.5, distribution: { kind: 'normal', k: 3 }, tcrPerK: 1e-4, unit: 'Ω' },
  { name: 'R2 <bottom>', kind: 'resistor', nominal: 1.18e3, minus: 11.8, plus: 11.8, distribution: { kind: 'uniform' }, unit: 'Ω' },
  { name: 'T ambient', kind: 'temperature', nominal: 25, minus: 25, plus: 15, distribution: { kind: 'fixed', value: 25 }, unit: '°C' },
];
