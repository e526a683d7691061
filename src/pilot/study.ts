// The pilot study: a pilot build's measurements (src/pilot/measurements.ts) against the design's prediction at the
// measured ambient (prediction.ts): per measured output the tests and capability (compare.ts), the parts that could
// explain a mean shift (diagnosis.ts), and, where the mean sits off-centre, the single resistor swap that best
// re-centres it (recentre.ts) with the yield projected before and after (projected-yield.ts). Renderers in
// src/report/pilot-*.ts; the command in src/cli/pilot.ts.
import { buildSupplyModel } from '../analysis/models/supply.js';
import type { Histogram, Interval } from '../analysis/result.js';
import type { AnalysisChoice, ProgressFactory } from '../design/analysis-choice.js';
import { silentProgress } from '../design/analysis-choice.js';
import { partGrade } from '../design/part-grade.js';
import type { ResolvedDesign } from '../design/resolve.js';
import type { Design } from '../design/schema.js';
import { ImpossibleError } from '../errors.js';
import { testOutput, type OutputTests } from './compare.js';
import { diagnoseShift, type ShiftDiagnosis } from './diagnosis.js';
import type { PilotMeasurements } from './measurements.js';
import { predictPilot, REFERENCE_TRIALS, trialOutputs, type PilotPrediction } from './prediction.js';
import { projectedYieldPct } from './projected-yield.js';
import { bestSwap, swappableResistors } from './recentre.js';

export { DEFAULT_PILOT_TRIALS } from './defaults.js';

export interface Recentring {
  designator: string;
  from: number;
  to: number;
  series: string;
  /** The build's mean expected after the swap (measured mean plus the model's nominal change). */
  expectedMean: number;
  /** The swap brings the expected mean nearer the centre than the measured mean is (else it is shown, not advised). */
  improves: boolean;
  /** Projected yield against the same window, %, before and after the swap. */
  yieldPctNow: number;
  yieldPctAfter: number;
}

export interface PilotOutput {
  name: string;
  unit: string;
  spec?: [number, number];
  values: number[];
  unitIds: string[];
  predicted: { nominal: number; mean: number; sigma: number; interval95: Interval; yieldPct: number | null; histogram: Histogram; kurtosis: number };
  tests: OutputTests;
  /** Measured units outside the spec window (lo ≤ y ≤ hi is inside, as the engine counts), or null without a window. */
  outsideWindow: number | null;
  /** The id of the unit Grubbs' test flags, or null. */
  outlierUnit: string | null;
  diagnosis: ShiftDiagnosis;
  /** The modelled spread is scaled by this (measured σ over predicted, when larger; else 1) for projected yields. */
  sigmaScale: number;
  /** Present when the mean is off-centre by more than its interval and a swap exists; else `recentreNote` says why. */
  recentre: Recentring | null;
  recentreNote: string;
  /** Plain-words reading of the tests. */
  findings: string[];
}

export interface PilotRun {
  choice: AnalysisChoice;
  prediction: PilotPrediction;
  measurements: PilotMeasurements;
  outputs: PilotOutput[];
  targetYieldPct: number;
  notes: string[];
  cautions: string[];
}

export interface PilotOptions {
  targetYieldPct: number;
}

export async function runPilot(design: Design, resolved: ResolvedDesign, measurements: PilotMeasurements, choice: AnalysisChoice, options: PilotOptions, progressFor: ProgressFactory = silentProgress): Promise<PilotRun> {
  if (resolved.lowEnd) {
    throw new ImpossibleError('voltage.pot', 'the design has an adjustable output: a pilot comparison needs the output at one setting', 'measure and compare a fixed-output design, or give the divider without the pot');
  }
  const prediction = await predictPilot(resolved.spec, measurements.ambientC, choice, progressFor);
  const resistors = swappableResistors(prediction.spec, (designator) => partGrade(design, designator).series);
  const outputs = measurements.outputs.map((m): PilotOutput => {
    const p = prediction.outputs[m.name]!;
    const r = p.result;
    if (!(r.sigma > 0)) {
      throw new ImpossibleError(`${measurements.file}, column ${m.name}`, 'the model predicts no spread for this output, so there is nothing to compare the spread with', 'measure outputs the parts\' tolerances move (vout, ilimit)');
    }
    const tests = testOutput(m.values, { mean: r.mean, sigma: r.sigma, kurtosis: p.kurtosis, reference: p.reference }, r.spec, options.targetYieldPct);
    const diagnosis = diagnoseShift(tests.measured.mean - r.mean, r.contributions, prediction.model.parts);
    const sigmaScale = r.sigma > 0 ? Math.max(1, tests.measured.sigma / r.sigma) : 1;
    const out: PilotOutput = {
      name: m.name,
      unit: m.unit,
      values: m.values,
      unitIds: measurements.unitIds,
      predicted: { nominal: r.nominal, mean: r.mean, sigma: r.sigma, interval95: r.interval95, yieldPct: r.yield ? r.yield.pct : null, histogram: r.histogram, kurtosis: p.kurtosis },
      tests,
      outsideWindow: r.spec ? m.values.filter((v) => v < r.spec![0] || v > r.spec![1]).length : null,
      outlierUnit: tests.outlier.outlier ? measurements.unitIds[tests.outlier.index]! : null,
      diagnosis,
      sigmaScale,
      recentre: null,
      recentreNote: '',
      findings: [],
    };
    if (r.spec) out.spec = r.spec;
    recentre(out, prediction, choice, resistors);
    out.findings = findings(out);
    return out;
  });
  return {
    choice,
    prediction,
    measurements,
    outputs,
    targetYieldPct: options.targetYieldPct,
    notes: [...prediction.notes],
    cautions: resolved.cautions,
  };
}

function recentre(out: PilotOutput, prediction: PilotPrediction, choice: AnalysisChoice, resistors: ReturnType<typeof swappableResistors>): void {
  if (!out.spec) {
    out.recentreNote = 'No spec window for this output: nothing to centre on.';
    return;
  }
  if (!out.tests.offCentre) {
    out.recentreNote = "The window's centre lies inside the measured mean's 95 % interval: no swap is warranted.";
    return;
  }
  const m = out.tests.measured;
  const centre = (out.spec[0] + out.spec[1]) / 2;
  const swap = bestSwap(prediction.spec, out.name, m.mean, centre, resistors);
  if (!swap) {
    out.recentreNote = 'No divider or gain resistor moves this output: a swap cannot re-centre it.';
    return;
  }
  const index = prediction.model.outputs.findIndex((o) => o.name === out.name);
  const before = prediction.outputs[out.name]!.reference;
  const after = trialOutputs(buildSupplyModel(swap.spec), prediction.result, choice, REFERENCE_TRIALS)[index]!;
  const meanOf = (a: Float64Array): number => a.reduce((s, v) => s + v, 0) / a.length;
  out.recentre = {
    designator: swap.designator,
    from: swap.from,
    to: swap.to,
    series: swap.series,
    expectedMean: swap.expectedMean,
    improves: Math.abs(swap.error) < Math.abs(m.mean - centre),
    yieldPctNow: projectedYieldPct(before, m.mean, out.sigmaScale, out.spec),
    yieldPctAfter: projectedYieldPct(after, m.mean + meanOf(after) - meanOf(before), out.sigmaScale, out.spec),
  };
  out.recentreNote = out.recentre.improves
    ? "The swap moves the mean by the model's change and assumes the measured offset stays as it is: build a few units with it and measure again before changing production."
    : `No single swap brings the mean nearer the centre: one step of the nearest standard value moves it further than the offset (${swap.designator} ${swap.series}). A finer series, a two-resistor leg or a trimming step would.`;
}

/** A p-value for a sentence: two significant digits, or '< 0.001'. */
export function formatP(p: number): string {
  return p < 0.001 ? '< 0.001' : `= ${p.toPrecision(2)}`;
}

function findings(out: PilotOutput): string[] {
  const t = out.tests;
  const lines: string[] = [];
  lines.push(
    t.meanShift.significant
      ? `The measured mean differs from the prediction (t test p ${formatP(t.meanShift.p)}): the build does not match the analysis in its centre.`
      : `The measured mean agrees with the prediction (t test p ${formatP(t.meanShift.p)}).`,
  );
  if (t.spread.direction === 'wider') {
    lines.push(
      `The measured σ is ${Math.sqrt(t.spread.ratio).toFixed(2)} times the predicted (p ${formatP(t.spread.p)}): something the model does not hold adds spread, e.g. layout (ground drops, leakage, heating), a wrong datasheet figure or a bad lot.`,
    );
  } else if (t.spread.direction === 'narrower') {
    lines.push(`The measured σ is ${Math.sqrt(t.spread.ratio).toFixed(2)} times the predicted (p ${formatP(t.spread.p)}): these parts sit well inside their bands (one lot); later lots may spread as the model says.`);
  } else {
    lines.push(`The measured spread agrees with the prediction (σ ratio ${Math.sqrt(t.spread.ratio).toFixed(2)}, p ${formatP(t.spread.p)}).`);
  }
  lines.push(
    t.shape.significant
      ? `The values do not follow the predicted distribution (Anderson–Darling p ${formatP(t.shape.p)})${t.meanShift.significant || t.spread.significant ? ', as the shift or spread above already implies' : ''}.`
      : `The values do not contradict the predicted distribution (Anderson–Darling p ${formatP(t.shape.p)}); with few units this is weak evidence that it is right.`,
  );
  if (out.outlierUnit !== null) lines.push(`Unit ${out.outlierUnit} is an outlier by Grubbs' test (G = ${t.outlier.statistic.toFixed(2)} > ${t.outlier.critical.toFixed(2)}): check it before trusting the rest.`);
  const plausible = out.diagnosis.singleParts.filter((s) => s.plausible).map((s) => s.part);
  if (t.meanShift.significant) {
    lines.push(
      plausible.length > 0
        ? `Parts that alone could explain the shift inside their tolerance band: ${plausible.join(', ')}.`
        : 'No single part explains the shift inside its tolerance band: look for a cause outside the model (a wrong value fitted, a measurement offset, layout).',
    );
  }
  return lines;
}
