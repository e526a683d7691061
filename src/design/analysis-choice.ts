// How a study runs the engine: the trial count, seed and workers chosen (the command line over the design file's
// `analysis` section over the defaults), and one engine run with that choice, reporting progress to whatever sink
// the caller passes in (the CLI draws it on a terminal; tests and library callers pass nothing).
import { analyze, analyzeSummary, type AnalyzeOptions } from '../analysis/analyze.js';
import { DEFAULT_LOT_SHARE, DEFAULT_TRIALS_PER_LOT } from '../analysis/lot-study.js';
import type { KernelChoice } from '../analysis/kernel/kernel-choices.js';
import type { SupplySpec } from '../analysis/models/supply.js';
import type { AnalysisResult, AnalysisSummary } from '../analysis/result.js';
import { cappedWorkerCount } from '../analysis/worker-count.js';
import { DEFAULT_LIFE_CONDITION, lifeConditionOr, type LifeCondition } from '../tolerance/life-allowances.js';
import { specForCondition } from './life-condition.js';
import { DEFAULT_SEED, type ResolvedDesign } from './resolve.js';

export interface AnalysisChoice {
  trials: number | 'auto';
  seed: number;
  workers?: number;
  /** Which Monte Carlo kernel (default auto: src/analysis/kernel/choice.ts). */
  kernel?: KernelChoice;
  /** Notes for the user about the choice (e.g. workers capped at the cores), printed by the CLI. */
  notes?: string[];
  /** Report the engine's progress to the progress sink (the CLI draws it only on a terminal, after a second). */
  progress: boolean;
  /** As built (no drift) or end of life (with the drift allowances): what the figures describe (absent: as built). */
  condition?: LifeCondition;
  /** The lot study (reel-lot model, src/analysis/lot-study.ts) the spread study adds, when asked for. */
  lots?: LotChoice;
}

export interface LotChoice {
  count: number;
  share: number;
  trialsPerLot: number;
}

/** What the command line asked for; anything left out comes from the design file, then the defaults. */
export interface CommandLineAnalysis {
  trials?: number | 'auto';
  seed?: number;
  workers?: number;
  condition?: LifeCondition;
  /** --lots K: run the lot study with K lots. */
  lots?: number;
  kernel?: KernelChoice;
}

/** Where a long run reports how far it has got. */
export interface ProgressSink {
  /** Trials (or evaluations) done so far out of the total (the total may grow for 'auto'). */
  update(done: number, total: number): void;
  /** The run has ended (also on failure). */
  finish(): void;
}

/** Makes a progress sink for a run with this label. */
export type ProgressFactory = (label: string) => ProgressSink;

const SILENT_SINK: ProgressSink = { update: () => undefined, finish: () => undefined };

/** Progress that goes nowhere (the default). */
export const silentProgress: ProgressFactory = () => SILENT_SINK;

/** The command line wins over the design file's `analysis` section, which wins over the defaults. */
export function analysisChoice(resolved: ResolvedDesign, cli: CommandLineAnalysis, defaultTrials: number | 'auto'): AnalysisChoice {
  const choice: AnalysisChoice = {
    trials: cli.trials ?? resolved.analysis.trials ?? defaultTrials,
    seed: cli.seed ?? resolved.analysis.seed ?? DEFAULT_SEED,
    progress: true,
    condition: cli.condition ?? resolved.life?.condition ?? DEFAULT_LIFE_CONDITION,
  };
  const lotCount = cli.lots ?? resolved.lots?.count;
  if (lotCount !== undefined) {
    choice.lots = { count: lotCount, share: resolved.lots?.share ?? DEFAULT_LOT_SHARE, trialsPerLot: resolved.lots?.trialsPerLot ?? DEFAULT_TRIALS_PER_LOT };
  }
  if (cli.kernel !== undefined) choice.kernel = cli.kernel;
  const workers = cli.workers ?? resolved.analysis.workers;
  if (workers !== undefined) {
    const capped = cappedWorkerCount(workers, cli.workers !== undefined ? '--workers' : 'analysis.workers');
    choice.workers = capped.workers;
    if (capped.note !== undefined) choice.notes = [capped.note];
  }
  return choice;
}

/** One engine run (worst case, RSS, Monte Carlo) of `spec` as `choice` says, with its progress sent to a new sink.
 *  The variance indices' wall time is measured here (the engine reads no clock) and set in each output's
 *  varianceBudget.method.seconds. */
export async function analyzeAsChosen(spec: SupplySpec, choice: AnalysisChoice, label: string, progressFor: ProgressFactory): Promise<AnalysisResult> {
  const progress = progressFor(label);
  try {
    let indicesSeconds: number | undefined;
    const options: Parameters<typeof analyze>[1] = {
      trials: choice.trials,
      seed: choice.seed,
      timeStage: async (_stage, run) => {
        const start = performance.now();
        try {
          return await run();
        } finally {
          indicesSeconds = (performance.now() - start) / 1000;
        }
      },
    };
    if (choice.workers !== undefined) options.workers = choice.workers;
    if (choice.kernel !== undefined) options.kernel = choice.kernel;
    if (choice.progress) options.onProgress = (p) => progress.update(p.trialsDone, p.trialsPlanned);
    const result = await analyze(spec, options);
    if (indicesSeconds !== undefined) for (const output of Object.values(result.outputs)) output.varianceBudget.method.seconds = indicesSeconds;
    return result;
  } finally {
    progress.finish();
  }
}

/** One engine run as analyzeAsChosen makes it, as a summary (analyzeSummary: no variance-based shares, shortest
 *  intervals or per-ambient sweep) for a comparison that never shows those (the grade study's side-by-side rows).
 *  Every figure it gives is the same. */
export async function analyzeSummaryAsChosen(spec: SupplySpec, choice: AnalysisChoice, label: string, progressFor: ProgressFactory): Promise<AnalysisSummary> {
  const progress = progressFor(label);
  try {
    const options: Omit<AnalyzeOptions, 'varianceSample' | 'timeStage'> = { trials: choice.trials, seed: choice.seed };
    if (choice.workers !== undefined) options.workers = choice.workers;
    if (choice.kernel !== undefined) options.kernel = choice.kernel;
    if (choice.progress) options.onProgress = (p) => progress.update(p.trialsDone, p.trialsPlanned);
    return await analyzeSummary(spec, options);
  } finally {
    progress.finish();
  }
}

/** The condition a choice analyses (as built when it names none). */
export function conditionOf(choice: AnalysisChoice): LifeCondition {
  return lifeConditionOr(choice.condition);
}

/**
 * The resolved design for the chosen condition: its spec (and low end) with the drift allowances the condition
 * takes (life-condition.ts), and a note saying which condition the figures describe.
 */
export function resolvedForCondition(resolved: ResolvedDesign, condition: LifeCondition = DEFAULT_LIFE_CONDITION): ResolvedDesign {
  const plan = resolved.life ?? { resistors: {} };
  const main = specForCondition(resolved.spec, plan, condition);
  const out: ResolvedDesign = { ...resolved, spec: main.spec, notes: [...resolved.notes, ...main.notes] };
  if (resolved.lowEnd) out.lowEnd = specForCondition(resolved.lowEnd, plan, condition).spec;
  return out;
}
