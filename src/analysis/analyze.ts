// The whole tolerance analysis of a design: nominal, worst case, RSS, each part's share of the variance
// (variance-based indices, interactions included), and Monte Carlo with yield and capability, for every output, in
// one AnalysisResult (plain JSON for the reports).
import { ImpossibleError } from '../errors.js';
import { describeDistribution } from '../tolerance/sample.js';
import { partVaries } from '../tolerance/part.js';
import { chooseKernel, type KernelChoice } from './kernel/choice.js';
import { WasmUnitEvaluator } from './kernel/wasm-evaluator.js';
import { nominalOutputs, type Model, type OutputsEvaluator } from './model.js';
import type { ModelSource } from './model-source.js';
import { buildSupplyModel, type SupplySpec } from './models/supply.js';
import { monteCarlo, startMonteCarloWorkers, widenRange, type MonteCarloOptions } from './monte-carlo.js';
import type { PairedSample } from './paired-trials.js';
import type { AnalysisResult, AnalysisSummary, OutputResult, OutputSummary } from './result.js';
import { rss } from './rss.js';
import { outputBudget } from './variance-budget.js';
import { VARIANCE_BLOCK, varianceIndicesSteps, type VarianceIndicesResult } from './variance-indices.js';
import { WORST_CASE_BLOCK, worstCase, type WorstCaseOptions } from './worst-case.js';
import { beyondWorstCaseNotes, unboundedPartsNote } from './worst-case-bound.js';

export interface AnalyzeOptions extends Omit<MonteCarloOptions, 'source' | 'ranges'> {
  /** Enumerate every vertex up to this many varying parts (default 20), else sensitivity signs then a check. */
  maxEnumerationVariables?: number;
  /** The variance indices' rows drawn once for several variants of one model (variance-indices.ts varianceSample). */
  varianceSample?: PairedSample;
  /** Runs a stage for the caller, who may time it (the design layer reads the clock; this file never does). */
  timeStage?: <T>(stage: 'variance indices', run: () => Promise<T>) => Promise<T>;
}

function isModel(input: SupplySpec | Model): input is Model {
  return Array.isArray((input as Model).parts) && Array.isArray((input as Model).outputs);
}

/**
 * Analyses a supply (SupplySpec: Monte Carlo spreads over worker threads) or any Model (Monte Carlo on this
 * thread, since a Model's functions cannot cross to a worker).
 */
export function analyze(input: SupplySpec | Model, options: AnalyzeOptions): Promise<AnalysisResult> {
  return analyzeWith(input, options, true);
}

/**
 * The same analysis for a side-by-side comparison that shows less (AnalysisSummary): no variance-based shares (the
 * variance indices' N·(k + 2) model evaluations are not made), no shortest coverage intervals (the exact quantiles
 * sort only the bins of the ranks still reported), no per-ambient sweep (its worst case at each grid ambient is not
 * enumerated). Every figure it does give is analyze's, to the bit: the indices draw from a stream of their own, an
 * order statistic does not depend on which other ranks are gathered, and the sweep feeds no other figure (Cpk comes
 * from the Monte Carlo's own per-ambient moments).
 */
export function analyzeSummary(input: SupplySpec | Model, options: Omit<AnalyzeOptions, 'varianceSample' | 'timeStage'>): Promise<AnalysisSummary> {
  return analyzeWith(input, options, false);
}

async function analyzeWith(input: SupplySpec | Model, options: AnalyzeOptions, full: true): Promise<AnalysisResult>;
async function analyzeWith(input: SupplySpec | Model, options: AnalyzeOptions, full: false): Promise<AnalysisSummary>;
async function analyzeWith(input: SupplySpec | Model, options: AnalyzeOptions, full: boolean): Promise<AnalysisResult | AnalysisSummary> {
  const model = isModel(input) ? input : buildSupplyModel(input);
  const source: ModelSource | undefined = isModel(input) ? undefined : { kind: 'supply', spec: input };
  // The Monte Carlo worker threads start up while this thread does the worst case and RSS.
  if (source) startMonteCarloWorkers({ ...options, source });
  const nominal = nominalOutputs(model);
  // The worst case's vertices and the variance indices' rows go through the same kernel as the Monte Carlo.
  const evaluate = kernelEvaluator(source, model, options.kernel);
  const wcOptions: WorstCaseOptions = {
    ...(options.maxEnumerationVariables === undefined ? {} : { maxVariables: options.maxEnumerationVariables }),
    ...(evaluate ? { evaluate } : {}),
  };
  const worst = worstCase(model, wcOptions);
  const propagated = rss(model);
  // On this thread, while the workers start: its own sample, seeded from the run's seed, so independent of workers.
  const indicesRun = (): Promise<VarianceIndicesResult> => runVarianceIndices(model, String(options.seed), options.varianceSample, evaluate);
  const indices = full ? await (options.timeStage ? options.timeStage('variance indices', indicesRun) : indicesRun()) : null;
  const ranges: Record<string, { lo: number; hi: number }> = {};
  for (const w of worst) ranges[w.name] = widenRange(w.min, w.max);
  const { maxEnumerationVariables: _ignored, varianceSample: _sample, timeStage: _timer, ...mcOptions } = options;
  const mc = await monteCarlo(model, { ...mcOptions, ranges, ...(source ? { source } : {}), ...(full ? {} : { summary: true }) });

  const atAmbient = full ? (mc.ambientGridC ?? []).map((t) => nominalAndWorstAt(model, t, wcOptions)) : [];
  const budgetOf = (o: number) => {
    if (indices === null) return {};
    const { contributions, budget } = outputBudget(propagated[o]!, indices.outputs[o]!, indices.method, mc.outputs[o]!.sigma);
    return { contributions, varianceBudget: budget };
  };
  // A full analysis gives every output all of OutputResult, a summary none of what OutputSummary leaves out.
  const outputs: Record<string, OutputResult | OutputSummary> = {};
  model.outputs.forEach((output, o) => {
    const m = mc.outputs[o]!;
    const { name: _wcName, ...worstCaseResult } = worst[o]!;
    if (full && (m.shortest95 === undefined || m.shortest9973 === undefined)) throw new Error(`analysis: the Monte Carlo gave no shortest intervals for ${output.name}`);
    const result: OutputSummary & Partial<OutputResult> = {
      name: output.name,
      unit: output.unit,
      nominal: nominal[output.name]!,
      mean: m.mean,
      sigma: m.sigma,
      min: m.min,
      max: m.max,
      percentiles: m.percentiles,
      interval95: m.interval95,
      interval9973: m.interval9973,
      ...(full ? { shortest95: m.shortest95!, shortest9973: m.shortest9973! } : {}),
      quantileMethod: m.quantileMethod,
      quantileBound: m.quantileBound,
      worstCase: worstCaseResult,
      rss: propagated[o]!.rss,
      ...budgetOf(o),
      histogram: m.histogram,
    };
    if (m.spec) result.spec = m.spec;
    if (m.yield) result.yield = m.yield;
    if (m.yieldAtRandomAmbient) result.yieldAtRandomAmbient = m.yieldAtRandomAmbient;
    if (full && m.ambientSweep) result.ambientSweep = m.ambientSweep.map((point, g) => ({ ...point, ...atAmbient[g]![o]! }));
    if (m.capabilityAmbientC !== undefined) result.capabilityAmbientC = m.capabilityAmbientC;
    if (m.capabilitySides) result.capabilitySides = m.capabilitySides;
    if (m.numericalTolerance !== undefined) result.numericalTolerance = m.numericalTolerance;
    if (m.ppmOut !== undefined) result.ppmOut = m.ppmOut;
    if (m.cp !== undefined) result.cp = m.cp;
    if (m.cpk !== undefined) result.cpk = m.cpk;
    outputs[output.name] = result;
  });

  const notes = [
    ...(model.notes ?? []),
    ...model.parts.filter(partVaries).map((part) => `${part.name}: ${describeDistribution(part)}.`),
    worst[0]?.method === 'sensitivity-signs'
      ? 'Worst case: too many varying parts to enumerate; the vertex from the sensitivity signs, checked by single-part flips.'
      : `Worst case: every combination of band ends (${worst[0]?.evaluations ?? 0} vertices).`,
    'RSS: law of propagation of uncertainty, first order, sensitivities by central differences at the parts\' means (JCGM 100:2008 5.1.2); expanded uncertainty U = k·u(y) with k = 2 (JCGM 100:2008 6.2.1, 6.3.3).',
    ...(indices === null
      ? []
      : [
          `Shares of the variance: total-effect indices (Jansen 1999) and first-order indices (Saltelli et al. 2010) on a sample of their own, N = ${indices.method.baseSamples.toLocaleString('en-US')} units in each of two matrices, ${indices.method.evaluations.toLocaleString('en-US')} model evaluations, drawn from a stream of their own seeded "${indices.method.seed}:0"; each share with its standard error.`,
        ]),
    ...mc.notes,
    // Worst case bounds Monte Carlo, or a note says which part and why (src/analysis/worst-case-bound.ts).
    ...unboundedPartsNote(model.parts),
    ...beyondWorstCaseNotes(model.parts, Object.values(outputs)),
  ];
  const ilimit = outputs.ilimit;
  if (ilimit && ilimit.worstCase.min <= 0) {
    notes.push(
      'Caution: at some tolerance corners the current limit falls to zero or below: the offsets or the common-mode error exceed the threshold there. Raise the shunt voltage at the limit or tighten the parts that lead the contributions.',
    );
  }
  const result: AnalysisResult | AnalysisSummary = { seed: mc.seed, trials: mc.trials, workers: mc.workers, chunkSize: mc.chunkSize, notes, outputs, ambientGridC: mc.ambientGridC, allSpecs: mc.allSpecs };
  assertFinite(result, 'analysis');
  return result;
}

/** The model with its ambient held at t °C: the nominal output and the worst case over every other part's band. */
function nominalAndWorstAt(model: Model, t: number, wcOptions: WorstCaseOptions): Array<{ nominal: number; worstCase: { low: number; high: number } }> {
  const ambient = model.ambient!.part;
  const parts = model.parts.map((part, i) => (i === ambient ? { ...part, nominal: t, minus: 0, plus: 0, distribution: { kind: 'fixed' as const, value: t } } : part));
  const held: Model = { ...model, parts };
  const nominal = nominalOutputs(held);
  return worstCase(held, wcOptions).map((w) => ({ nominal: nominal[w.name]!, worstCase: { low: w.min, high: w.max } }));
}

/**
 * The WebAssembly kernel's evaluator of a supply whose Monte Carlo runs on the kernel (the same choice as
 * monteCarlo makes), for the worst case's vertices and the variance indices' rows: the same bits as evaluateOutputs
 * (test/wasm-evaluator.test.ts), in 32 ns an evaluation of every output of the bench model against 59 for the
 * JavaScript model (copies in and out included; best of 200 blocks of 8192). None for a bare Model or the JavaScript
 * kernel.
 */
function kernelEvaluator(source: ModelSource | undefined, model: Model, choice: KernelChoice | undefined): OutputsEvaluator | undefined {
  if (!source || source.kind !== 'supply' || chooseKernel(choice ?? 'auto', source) !== 'wasm') return undefined;
  const evaluator = new WasmUnitEvaluator(source.spec, model, Math.max(WORST_CASE_BLOCK, VARIANCE_BLOCK));
  return (variant, p, outs, n) => evaluator.evaluate(variant, p, outs, n);
}

const pause = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

/** The variance indices, pausing for the event loop after each part's evaluations (Ctrl-C is answered at once). */
async function runVarianceIndices(model: Model, seed: string, sample: PairedSample | undefined, evaluate: OutputsEvaluator | undefined): Promise<VarianceIndicesResult> {
  const steps = varianceIndicesSteps(model, { seed, ...(sample ? { sample } : {}), ...(evaluate ? { evaluate } : {}) });
  for (;;) {
    const step = steps.next();
    if (step.done) return step.value;
    await pause();
  }
}

/** Fails loudly, naming the field, rather than hand a NaN or an infinity to a report. */
function assertFinite(value: unknown, path: string): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) {
      throw new ImpossibleError(path, `the analysis produced ${value}`, 'check for a part whose band reaches 0 Ω or a gain or threshold that leaves no signal');
    }
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => assertFinite(v, `${path}[${i}]`));
  } else if (value !== null && typeof value === 'object') {
    for (const [key, v] of Object.entries(value)) assertFinite(v, `${path}.${key}`);
  }
}
