// The machine-readable form of a spread run: `{ seed, trials, version, outputs: { NAME: { … } } }`.
// The worker count is left out on purpose: the same seed gives byte-identical JSON for any number of workers.
// Every number is finite: a figure that does not exist for an output (Cpk without a spec window) is null, and the
// output's `notes` say why. Nothing is recomputed: each figure is copied from the AnalysisResult.
import type { AnalysisResult, OutputResult } from '../analysis/result.js';
import { varianceBudgetLines } from './variance-budget-lines.js';

export interface SpreadJsonOutput {
  name: string;
  unit: string;
  nominal: number;
  spec: { low: number; high: number } | null;
  mean: number;
  sigma: number;
  min: number;
  max: number;
  interval95: { low: number; high: number };
  interval9973: { low: number; high: number };
  shortest95: { low: number; high: number };
  quantileMethod: string;
  quantileBound: number;
  worstCase: { min: number; max: number; minVertex: Record<string, string>; maxVertex: Record<string, string>; method: string };
  /** First order (JCGM 100:2008 5.1.2): u(y) as sigma, U = k·u(y) with k = coverageFactor. */
  rss: { sigma: number; expandedUncertainty: number; coverageFactor: number; center: number };
  /** Per unit: share of units inside the window at every ambient checked. */
  yieldPct: number | null;
  yieldInterval95: { low: number; high: number } | null;
  /** Share of trials inside the window at the ambient drawn with each (a random unit at a random ambient). */
  yieldAtRandomAmbientPct: number | null;
  yieldAtRandomAmbientInterval95: { low: number; high: number } | null;
  /** Units out of the window at some ambient, per million. */
  ppmOut: number | null;
  cp: number | null;
  cpk: number | null;
  /** The ambient whose units gave Cp and Cpk (the worst one), °C; null when from all trials. */
  capabilityAmbientC: number | null;
  median: number | null;
  /** Adaptive runs: the numerical tolerance δ of σ reached (JCGM 101:2008 7.9.2). */
  numericalTolerance: number | null;
  /** The units held at each ambient checked. */
  ambientSweep: Array<{
    ambientC: number;
    nominal: number | null;
    mean: number;
    sigma: number;
    band9973: { low: number; high: number };
    bandBound: number;
    worstCase: { low: number; high: number } | null;
    yieldPct: number | null;
    cpk: number | null;
  }>;
  /** Ranked by total-effect share; firstOrderRssShare is the first-order (RSS) share at the parts' means. */
  contributions: Array<{
    part: string;
    totalEffectShare: number;
    totalEffectStandardError: number;
    firstOrderShare: number;
    firstOrderStandardError: number;
    firstOrderRssShare: number;
    sensitivity: number;
    standardUncertainty: number;
  }>;
  varianceBudget: {
    estimator: string;
    baseSamples: number;
    evaluations: number;
    seed: string;
    /** Model evaluations the indices took and their wall time, s (null when the run was not timed). */
    method: { evaluations: number; seconds: number | null };
    totalEffectSum: number;
    firstOrderSum: number;
    rssToMonteCarloSigma: number | null;
    rssAgreement: string;
    /** The one-line explanations the text and HTML reports print. */
    explanation: string[];
  };
  histogram: { edges: number[]; counts: number[]; belowSpec: number | null; aboveSpec: number | null };
  notes: string[];
}

export interface SpreadJson {
  seed: string;
  trials: number;
  version: string;
  /** Per unit: share of units meeting every window at every ambient checked. */
  allSpecsYieldPct: number | null;
  allSpecsYieldInterval95: { low: number; high: number } | null;
  allSpecsOutputs: string[];
  /** The ambients each unit was checked at, °C (null: at the ambient drawn with it). */
  ambientGridC: number[] | null;
  method: string[];
  cautions: string[];
  outputs: Record<string, SpreadJsonOutput>;
}

export interface SpreadJsonMeta {
  version: string;
  /** Safety cautions and design notes to carry along (from the design's resolution). */
  cautions?: string[];
}

/** A finite number, or null with a note saying which figure is missing and why. */
function finiteOrNull(value: number | undefined, label: string, why: string, notes: string[]): number | null {
  if (value !== undefined && Number.isFinite(value)) return value;
  notes.push(`${label}: ${why}`);
  return null;
}

/** Throws when a figure the engine must always give is not finite (a bug upstream, never printed as NaN). */
function mustBeFinite(value: number, label: string, output: string): number {
  if (!Number.isFinite(value)) throw new Error(`analysis result for ${output}: ${label} is not a finite number (${value})`);
  return value;
}

export function outputJson(output: OutputResult): SpreadJsonOutput {
  const notes: string[] = [];
  const name = output.name;
  const f = (value: number, label: string): number => mustBeFinite(value, label, name);
  const interval = (i: { low: number; high: number }, label: string) => ({ low: f(i.low, `${label}.low`), high: f(i.high, `${label}.high`) });
  const hasSpec = output.spec !== undefined;
  const noSpec = 'no spec window for this output';
  const noSpread = hasSpec ? 'σ is zero, so the capability index is unbounded' : noSpec;
  return {
    name,
    unit: output.unit,
    nominal: f(output.nominal, 'nominal'),
    spec: output.spec ? { low: f(output.spec[0], 'spec.low'), high: f(output.spec[1], 'spec.high') } : null,
    mean: f(output.mean, 'mean'),
    sigma: f(output.sigma, 'sigma'),
    min: f(output.min, 'min'),
    max: f(output.max, 'max'),
    interval95: interval(output.interval95, 'interval95'),
    interval9973: interval(output.interval9973, 'interval9973'),
    shortest95: interval(output.shortest95, 'shortest95'),
    quantileMethod: output.quantileMethod,
    quantileBound: f(output.quantileBound, 'quantileBound'),
    worstCase: {
      min: f(output.worstCase.min, 'worstCase.min'),
      max: f(output.worstCase.max, 'worstCase.max'),
      minVertex: { ...output.worstCase.minVertex },
      maxVertex: { ...output.worstCase.maxVertex },
      method: output.worstCase.method,
    },
    rss: {
      sigma: f(output.rss.sigma, 'rss.sigma'),
      expandedUncertainty: f(output.rss.expandedUncertainty, 'rss.expandedUncertainty'),
      coverageFactor: f(output.rss.coverageFactor, 'rss.coverageFactor'),
      center: f(output.rss.center, 'rss.center'),
    },
    yieldPct: finiteOrNull(output.yield?.pct, 'yieldPct', noSpec, notes),
    yieldInterval95: output.yield && Number.isFinite(output.yield.low) && Number.isFinite(output.yield.high)
      ? { low: output.yield.low, high: output.yield.high }
      : null,
    yieldAtRandomAmbientPct: output.yieldAtRandomAmbient ? f(output.yieldAtRandomAmbient.pct, 'yieldAtRandomAmbientPct') : null,
    yieldAtRandomAmbientInterval95: output.yieldAtRandomAmbient ? interval(output.yieldAtRandomAmbient, 'yieldAtRandomAmbientInterval95') : null,
    ppmOut: hasSpec ? finiteOrNull(output.ppmOut, 'ppmOut', 'not given by the analysis', notes) : null,
    cp: finiteOrNull(output.cp, 'cp', noSpread, notes),
    cpk: finiteOrNull(output.cpk, 'cpk', noSpread, notes),
    capabilityAmbientC: output.capabilityAmbientC ?? null,
    median: output.percentiles.find((p) => p.pct === 50)?.value ?? null,
    numericalTolerance: output.numericalTolerance ?? null,
    ambientSweep: (output.ambientSweep ?? []).map((p) => ({
      ambientC: f(p.ambientC, 'ambientSweep.ambientC'),
      nominal: p.nominal ?? null,
      mean: f(p.mean, 'ambientSweep.mean'),
      sigma: f(p.sigma, 'ambientSweep.sigma'),
      band9973: interval(p.band9973, 'ambientSweep.band9973'),
      bandBound: f(p.bandBound, 'ambientSweep.bandBound'),
      worstCase: p.worstCase ? interval(p.worstCase, 'ambientSweep.worstCase') : null,
      yieldPct: p.yield ? f(p.yield.pct, 'ambientSweep.yieldPct') : null,
      cpk: p.cpk !== undefined && Number.isFinite(p.cpk) ? p.cpk : null,
    })),
    contributions: output.contributions.map((c) => ({
      part: c.part,
      totalEffectShare: f(c.totalEffectShare, `contributions[${c.part}].totalEffectShare`),
      totalEffectStandardError: f(c.totalEffectStandardError, `contributions[${c.part}].totalEffectStandardError`),
      firstOrderShare: f(c.firstOrderShare, `contributions[${c.part}].firstOrderShare`),
      firstOrderStandardError: f(c.firstOrderStandardError, `contributions[${c.part}].firstOrderStandardError`),
      firstOrderRssShare: f(c.varianceShare, `contributions[${c.part}].firstOrderRssShare`),
      sensitivity: f(c.sensitivity, `contributions[${c.part}].sensitivity`),
      standardUncertainty: f(c.standardUncertainty, `contributions[${c.part}].standardUncertainty`),
    })),
    varianceBudget: {
      estimator: output.varianceBudget.method.estimator,
      baseSamples: output.varianceBudget.method.baseSamples,
      evaluations: output.varianceBudget.method.evaluations,
      seed: output.varianceBudget.method.seed,
      method: { evaluations: output.varianceBudget.method.evaluations, seconds: output.varianceBudget.method.seconds ?? null },
      totalEffectSum: f(output.varianceBudget.totalEffectSum, 'varianceBudget.totalEffectSum'),
      firstOrderSum: f(output.varianceBudget.firstOrderSum, 'varianceBudget.firstOrderSum'),
      rssToMonteCarloSigma: finiteOrNull(output.varianceBudget.rssToMonteCarloSigma ?? undefined, 'varianceBudget.rssToMonteCarloSigma', 'the Monte Carlo σ is 0', notes),
      rssAgreement: output.varianceBudget.rssAgreement,
      explanation: varianceBudgetLines(output),
    },
    histogram: {
      edges: output.histogram.edges.map((e, i) => f(e, `histogram.edges[${i}]`)),
      counts: output.histogram.counts.slice(),
      belowSpec: output.histogram.belowSpec ?? null,
      aboveSpec: output.histogram.aboveSpec ?? null,
    },
    notes,
  };
}

export function spreadJson(result: AnalysisResult, meta: SpreadJsonMeta): SpreadJson {
  const outputs: Record<string, SpreadJsonOutput> = {};
  for (const [name, output] of Object.entries(result.outputs)) outputs[name] = outputJson(output);
  return {
    seed: result.seed,
    trials: result.trials,
    version: meta.version,
    allSpecsYieldPct: result.allSpecs ? result.allSpecs.pct : null,
    allSpecsYieldInterval95: result.allSpecs ? { low: result.allSpecs.low, high: result.allSpecs.high } : null,
    allSpecsOutputs: result.allSpecs ? result.allSpecs.outputs.slice() : [],
    ambientGridC: result.ambientGridC ? result.ambientGridC.slice() : null,
    method: result.notes.slice(),
    cautions: meta.cautions ? meta.cautions.slice() : [],
    outputs,
  };
}

/** Serialises with two-space indentation; a non-finite number anywhere is a bug and throws rather than print null silently. */
export function stringifyReport(value: unknown): string {
  return `${JSON.stringify(value, (key, v: unknown) => {
    if (typeof v === 'number' && !Number.isFinite(v)) throw new Error(`report field ${key} is not a finite number (${v})`);
    return v;
  }, 2)}\n`;
}
