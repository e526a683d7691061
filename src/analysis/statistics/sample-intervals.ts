// A sample's mean and standard deviation with their confidence intervals, for a normal population:
//   mean   x̄ ± t_{1−α/2, n−1}·s/√n                                   (NIST/SEMATECH e-Handbook 1.3.5.2)
//   σ      [ s·√((n−1)/χ²_{1−α/2, n−1}),  s·√((n−1)/χ²_{α/2, n−1}) ]    (NIST/SEMATECH e-Handbook 1.3.5.8)
import type { Interval } from '../result.js';
import { chiSquareQuantile } from './chi-square.js';
import { studentTQuantile } from './student-t.js';

export interface SampleSummary {
  n: number;
  mean: number;
  /** Sample standard deviation (n − 1 in the denominator). */
  sigma: number;
  min: number;
  max: number;
  meanInterval: Interval;
  sigmaInterval: Interval;
  /** Confidence of both intervals, e.g. 0.95. */
  confidence: number;
}

export function sampleMean(values: readonly number[]): number {
  let sum = 0;
  for (const v of values) sum += v;
  return sum / values.length;
}

/** Sample standard deviation by the two-pass formula. */
export function sampleSigma(values: readonly number[]): number {
  const mean = sampleMean(values);
  let sq = 0;
  for (const v of values) sq += (v - mean) * (v - mean);
  return values.length > 1 ? Math.sqrt(sq / (values.length - 1)) : 0;
}

/** Needs n ≥ 2. */
export function summarizeSample(values: readonly number[], confidence = 0.95): SampleSummary {
  const n = values.length;
  if (n < 2) throw new RangeError(`summarizeSample: ${n} values, at least 2 needed`);
  const mean = sampleMean(values);
  const sigma = sampleSigma(values);
  const alpha = 1 - confidence;
  const t = studentTQuantile(1 - alpha / 2, n - 1);
  const half = (t * sigma) / Math.sqrt(n);
  const chiHigh = chiSquareQuantile(1 - alpha / 2, n - 1);
  const chiLow = chiSquareQuantile(alpha / 2, n - 1);
  return {
    n,
    mean,
    sigma,
    min: Math.min(...values),
    max: Math.max(...values),
    meanInterval: { low: mean - half, high: mean + half },
    sigmaInterval: { low: sigma * Math.sqrt((n - 1) / chiHigh), high: sigma * Math.sqrt((n - 1) / chiLow) },
    confidence,
  };
}
