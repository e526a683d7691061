// The spread study of a resolved design: the engine's analysis (worst case, RSS, Monte Carlo) of the design as
// resolved and, for an adjustable output, of the same design with the pot at the bottom of its travel; and the
// yields that study reports (what `--fail-under-yield` gates). `spread` and `design` run it; src/report renders it.
import type { Model } from '../analysis/model.js';
import { buildSupplyModel } from '../analysis/models/supply.js';
import type { AnalysisResult } from '../analysis/result.js';
import { lotStudy, type LotStudyResult } from '../analysis/lot-study.js';
import { analyzeAsChosen, resolvedForCondition, silentProgress, type AnalysisChoice, type ProgressFactory } from './analysis-choice.js';
import { outputCautions } from './output-cautions.js';
import type { ResolvedDesign } from './resolve.js';

/** Monte Carlo trials when neither the file nor the command line says: the adaptive procedure of JCGM 101:2008 7.9. */
export const DEFAULT_SPREAD_TRIALS = 'auto' as const;

export interface SpreadRun {
  resolved: ResolvedDesign;
  choice: AnalysisChoice;
  model: Model;
  result: AnalysisResult;
  /** Adjustable output: the same analysis with the pot at the bottom of its travel. */
  lowEnd?: { model: Model; result: AnalysisResult };
  /** The lot study (reel-lot model), when asked for: each lot's yield, the worst lot's and the overall. */
  lots?: LotStudyResult;
}

/** Runs the analysis of a resolved design (and of its low end when the output is adjustable). */
export async function runSpread(asResolved: ResolvedDesign, choice: AnalysisChoice, progressFor: ProgressFactory = silentProgress): Promise<SpreadRun> {
  // The condition (as built, or end of life with the drift allowances) decides which parts the spec carries.
  const resolved = resolvedForCondition(asResolved, choice.condition);
  const model = buildSupplyModel(resolved.spec);
  const result = await analyzeAsChosen(resolved.spec, choice, 'spread', progressFor);
  // The cautions that quote analysed figures go first in the caution box.
  const cautions = [...outputCautions(resolved.cautionLimits, result), ...resolved.cautions];
  const run: SpreadRun = { resolved: { ...resolved, cautions }, choice, model, result };
  if (resolved.lowEnd) {
    run.lowEnd = { model: buildSupplyModel(resolved.lowEnd), result: await analyzeAsChosen(resolved.lowEnd, choice, 'spread, low end', progressFor) };
  }
  if (choice.lots) {
    const progress = progressFor('lots');
    try {
      const { count, share, trialsPerLot } = choice.lots;
      run.lots = await lotStudy(resolved.spec, { count, share, trialsPerLot, seed: choice.seed, ...(choice.workers !== undefined ? { workers: choice.workers } : {}), onLot: (done, all) => progress.update(done, all) });
      if (resolved.lowEnd) run.lots.notes.push('Adjustable output: the lots are studied with the pot at the top of its travel.');
    } finally {
      progress.finish();
    }
  }
  return run;
}

/** Every output's yield against its spec window, as the report prints it (the low end of an adjustable output too). */
export function spreadYields(run: SpreadRun): { name: string; pct: number }[] {
  const out: { name: string; pct: number }[] = [];
  for (const o of Object.values(run.result.outputs)) if (o.yield) out.push({ name: o.name, pct: o.yield.pct });
  if (run.lowEnd) {
    for (const o of Object.values(run.lowEnd.result.outputs)) if (o.yield) out.push({ name: `${o.name} (pot at the bottom of its travel)`, pct: o.yield.pct });
  }
  return out;
}
