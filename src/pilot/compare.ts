// One measured output against its prediction: the measured summary with 95 % intervals, the tests (mean, spread,
// shape, outliers) at α = 0.05, and the measured capability. Pure: numbers in, numbers out.
import type { Interval } from '../analysis/result.js';
import { andersonDarlingTest, type AndersonDarlingTest } from '../analysis/statistics/anderson-darling.js';
import { processCapability } from '../analysis/statistics/capability.js';
import { cpkInterval } from '../analysis/statistics/cpk-interval.js';
import { empiricalCdf } from '../analysis/statistics/empirical-cdf.js';
import { grubbsTest, type GrubbsTest } from '../analysis/statistics/grubbs.js';
import { meanShiftTest, type MeanShiftTest } from '../analysis/statistics/mean-shift-test.js';
import { summarizeSample, type SampleSummary } from '../analysis/statistics/sample-intervals.js';
import { supportedCoverage, twoSidedToleranceFactor, unitsNeededForCoverage } from '../analysis/statistics/tolerance-factor.js';
import { varianceRatioTest, type VarianceRatioTest } from '../analysis/statistics/variance-ratio-test.js';

/** Level of every test, and 1 − the confidence of every interval. */
export const ALPHA = 0.05;
/** Proportion the tolerance interval covers. */
export const TOLERANCE_COVERAGE = 0.99;

export interface PredictedOutput {
  mean: number;
  sigma: number;
  kurtosis: number;
  /** Predicted trials, ascending. */
  reference: Float64Array;
}

export interface MeasuredCapability {
  cp: number;
  cpk: number;
  /** 95 % interval of Cpk (Bissell 1990). */
  cpkInterval: Interval;
  /** Two-sided normal tolerance interval x̄ ± k·s covering TOLERANCE_COVERAGE at 95 % confidence (Howe's k). */
  tolerance: { coverage: number; confidence: number; k: number; low: number; high: number; insideWindow: boolean };
  /** Largest proportion inside the window these units support at 95 % confidence, %. */
  supportedYieldPct: number;
  /** The target yield, %, and the units that would support it with the same mean and σ (null: no number can). */
  target: { yieldPct: number; supported: boolean; unitsNeeded: number | null };
}

export interface OutputTests {
  measured: SampleSummary;
  meanShift: MeanShiftTest & { significant: boolean };
  spread: VarianceRatioTest & { significant: boolean; direction: 'wider' | 'narrower' | 'as predicted' };
  shape: AndersonDarlingTest & { significant: boolean };
  outlier: GrubbsTest;
  capability: MeasuredCapability | null;
  /** The window's centre lies outside the mean's 95 % interval. */
  offCentre: boolean;
}

export function testOutput(values: readonly number[], predicted: PredictedOutput, spec: [number, number] | undefined, targetYieldPct: number): OutputTests {
  const measured = summarizeSample(values, 1 - ALPHA);
  const n = measured.n;
  const mean = meanShiftTest(measured.mean, measured.sigma, n, predicted.mean);
  const spread = varianceRatioTest(measured.sigma, n, predicted.sigma, predicted.kurtosis);
  const shape = andersonDarlingTest(values.map((v) => empiricalCdf(predicted.reference, v)));
  const outlier = grubbsTest(values, measured.mean, measured.sigma, ALPHA);
  let capability: MeasuredCapability | null = null;
  let offCentre = false;
  if (spec) {
    const centre = (spec[0] + spec[1]) / 2;
    offCentre = centre < measured.meanInterval.low || centre > measured.meanInterval.high;
    const pc = processCapability(spec[0], spec[1], measured.mean, measured.sigma);
    if (pc) {
      const k = twoSidedToleranceFactor(n, TOLERANCE_COVERAGE, 1 - ALPHA);
      const low = measured.mean - k * measured.sigma;
      const high = measured.mean + k * measured.sigma;
      const supported = supportedCoverage(measured.mean, measured.sigma, n, spec, 1 - ALPHA);
      const target = targetYieldPct / 100;
      capability = {
        cp: pc.cp,
        cpk: pc.cpk,
        cpkInterval: cpkInterval(pc.cpk, n, 1 - ALPHA),
        tolerance: { coverage: TOLERANCE_COVERAGE, confidence: 1 - ALPHA, k, low, high, insideWindow: low >= spec[0] && high <= spec[1] },
        supportedYieldPct: 100 * supported,
        target: { yieldPct: targetYieldPct, supported: supported >= target, unitsNeeded: supported >= target ? n : unitsNeededForCoverage(measured.mean, measured.sigma, spec, target, 1 - ALPHA) },
      };
    }
  }
  return {
    measured,
    meanShift: { ...mean, significant: mean.p < ALPHA },
    spread: { ...spread, significant: spread.p < ALPHA, direction: spread.p >= ALPHA ? 'as predicted' : spread.ratio > 1 ? 'wider' : 'narrower' },
    shape: { ...shape, significant: shape.p < ALPHA },
    outlier,
    capability,
    offCentre,
  };
}
