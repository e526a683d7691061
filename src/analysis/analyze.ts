// The whole tolerance analysis of a design: nominal, worst case, RSS with contributions, and Monte Carlo with
// yield and capability, for every output, in one AnalysisResult (plain JSON for the reports).
import { ImpossibleError } from '../errors.js';
import { describeDistribution } from '../tolerance/sample.js';
import { partVaries } from '../tolerance/part.js';
import { nominalOutputs, type Model } from './model.js';
import type { ModelSource } from './model-source.js';
import { buildSupplyModel, type SupplySpec } from './models/supply.js';
import { monteCarlo, startMonteCarloWorkers, widenRange, type MonteCarloOptions } from './monte-carlo.js';
import type { AnalysisResult, OutputResult } from './result.js';
import { rss } from './rss.js';
import { worstCase } from './worst-case.js';
import { beyondWorstCaseNotes, unboundedPartsNote } from './worst-case-bound.js';

export interface AnalyzeOptions extends Omit<MonteCarloOptions, 'source' | 'ranges'> {
  /** Enumerate every vertex up to this many varying parts (default 20), else sensitivity signs then a check. */
  maxEnumerationVariables?: number;
}

function isModel(input: SupplySpec | Model): input is Model {
  return Array.isArray((input as Model).parts) && Array.isArray((input as Model).outputs);
}

/**
 * Analyses a supply (SupplySpec: Monte Carlo spreads over worker threads) or any Model (Monte Carlo on this
 * thread, since a Model's functions cannot cross to a worker).
 */
export async function analyze(input: SupplySpec | Model, options: AnalyzeOptions): Promise<AnalysisResult> {
  const model = isModel(input) ? input : buildSupplyModel(input);
  const source: ModelSource | undefined = isModel(input) ? undefined : { kind: 'supply', spec: input };
  // The Monte Carlo worker threads start up while this thread does the worst case and RSS.
  if (source) startMonteCarloWorkers({ ...options, source });
  const nominal = nominalOutputs(model);
  const wcOptions = options.maxEnumerationVariables === undefined ? {} : { maxVariables: options.maxEnumerationVariables };
  const worst = worstCase(model, wcOptions);
  const propagated = rss(model);
  const ranges: Record<string, { lo: number; hi: number }> = {};
  for (const w of worst) ranges[w.name] = widenRange(w.min, w.max);
  const { maxEnumerationVariables: _ignored, ...mcOptions } = options;
  const mc = await monteCarlo(model, { ...mcOptions, ranges, ...(source ? { source } : {}) });

  const outputs: Record<string, OutputResult> = {};
  model.outputs.forEach((output, o) => {
    const m = mc.outputs[o]!;
    const { name: _wcName, ...worstCaseResult } = worst[o]!;
    const result: OutputResult = {
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
      shortest95: m.shortest95,
      shortest9973: m.shortest9973,
      quantileMethod: m.quantileMethod,
      quantileBound: m.quantileBound,
      worstCase: worstCaseResult,
      rss: propagated[o]!.rss,
      contributions: propagated[o]!.contributions,
      histogram: m.histogram,
    };
    if (m.spec) result.spec = m.spec;
    if (m.yield) result.yield = m.yield;
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
    'RSS: law of propagation of uncertainty, first order, sensitivities by central differences (JCGM 100:2008 5.1.2).',
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
  const result: AnalysisResult = { seed: mc.seed, trials: mc.trials, workers: mc.workers, chunkSize: mc.chunkSize, notes, outputs };
  assertFinite(result, 'analysis');
  return result;
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
