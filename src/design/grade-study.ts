// The grade study of a resolved design: the design's resistors in each tolerance grade side by side (a full engine
// run per grade, plus the yield of a unit that must meet every spec window at once), the cheapest per-part grade
// assignment that reaches a yield target (src/pick/grade-mix.ts searches; each assignment is a paired same-seed
// Monte Carlo), and the single upgrade that buys the most yield per unit cost. `grades` and `design` run it;
// src/report renders it.
import { gradableResistors, type GradableResistor } from '../analysis/graded-spec.js';
import { buildSupplyModel, type SupplySpec } from '../analysis/models/supply.js';
import type { AnalysisSummary } from '../analysis/result.js';
import { jointYieldAsync } from '../analysis/joint-yield-async.js';
import { PAIRED_BLOCK, PairedSample, type BlockChecker } from '../analysis/paired-trials.js';
import { variantEvaluator } from '../analysis/kernel/wasm-evaluator.js';
import type { JointYield } from '../analysis/trial-values.js';
import { bestSingleUpgrade, cheapestGradeMix, type GradeOption } from '../pick/grade-mix.js';
import { analyzeSummaryAsChosen, resolvedForCondition, silentProgress, type AnalysisChoice, type ProgressFactory } from './analysis-choice.js';
import { DEFAULT_GRADE_NAMES, GRADES, gradeSoldAt, type Grade, type GradeName } from './grades.js';
import { gradedModels, specWithGrades, type GradedModels } from './graded-models.js';
import type { ResolvedDesign } from './resolve.js';
import { formatRkmDigits } from '../units/index.js';

/** Trials of each side-by-side run when neither the file nor the command line says. */
export const DEFAULT_GRADES_TRIALS = 100_000;
/** Trials of each assignment the search evaluates (same seed for all, so the comparisons are paired). */
export const DEFAULT_SEARCH_TRIALS = 20_000;
/** Yield the cheapest mix must reach unless --target-yield says otherwise, %. */
export const DEFAULT_TARGET_YIELD_PCT = 99.9;
/** Assignments the search may evaluate in full before it gives up (and says so). A full evaluation that fails stops
 *  as soon as the failures pass what the target allows, so most cost a small part of the search trials. */
export const MAX_SEARCH_EVALUATIONS = 400;
/** Units a screen of a partial step of the search checks at most (our choice: measured on the LED example with all ten
 *  grades, 2048 rejected as many steps as 4096 and 8192, and 1024 too few for the search to finish in its limit). */
export const SCREEN_UNITS = 2048;

/** The most failing units out of `trials` that still reach `target` (fraction), with the search's own comparison
 *  (yield = (100·inSpec/trials)/100 ≥ target), so a stop at more failures never changes a verdict. */
export function allowedFailures(trials: number, target: number): number {
  const passes = (failures: number): boolean => (100 * (trials - failures)) / trials / 100 >= target;
  if (!passes(0)) return -1;
  let f = Math.max(0, Math.floor(trials * (1 - target)) - 2);
  while (f > 0 && !passes(f)) f -= 1;
  while (f + 1 <= trials && passes(f + 1)) f += 1;
  return f;
}

/** How the grade search was done, for the JSON: model evaluations and wall time, with what they count. */
export interface SearchMethod {
  /** Model evaluations (every output of the model for one unit at one ambient) in the search, the best upgrade and
   *  the re-run of the answer. */
  evaluations: number;
  /** Wall time of the search, the upgrade and the re-run, s (measured here, in the design layer). */
  seconds: number;
  /** Assignments evaluated in full or until they failed, partial steps screened, models put together. */
  assignments: number;
  screened: number;
  /** Of those screened: rejected (certainly below the target), and open (descended into). */
  screenedRejected: number;
  /** Units of the one drawn sample every assignment was judged on (paired trials: common random numbers). */
  pairedTrials: number;
  /** Wall time of the whole grade study (side-by-side rows included), s. */
  studySeconds: number;
  /** The same two figures for each step: the cheapest-mix search, the re-run of its answer, the best upgrade. */
  steps: Record<'search' | 'verify' | 'upgrade', { evaluations: number; seconds: number }>;
}

export interface GradesOptions {
  targetYieldPct: number;
  searchTrials: number;
  /** The grades to compare and choose from (--grades); absent: the design file's resistors.grades, else the default four. */
  grades?: readonly GradeName[];
}

export interface GradeRow {
  grade: Grade;
  /** Parts whose value is not in this grade's series or a coarser one: the row prices them in this grade for
   * comparison, but the search never gives them this grade. */
  notSold: string[];
  cost: number;
  /** The row's engine run, as a summary (no variance-based shares, shortest intervals or per-ambient sweep, which
   *  no grade report shows: the type lets a report read only what the row has). */
  result: AnalysisSummary;
  joint: JointYield;
}

export interface GradeMixAnswer {
  found: boolean;
  reason?: string;
  /** Designator → grade, when found. */
  assignment?: Record<string, GradeName>;
  cost?: number;
  /** Joint yield in the search's paired trials, %. */
  searchYieldPct?: number;
  /** The answer re-run with the full trial count, %. */
  verified?: JointYield;
  evaluations: number;
  skipped: number;
}

export interface UpgradeAnswer {
  part: string;
  from: GradeName;
  to: GradeName;
  yieldBeforePct: number;
  yieldAfterPct: number;
  extraCost: number;
  /** Yield points (%) per unit of extra cost; null when the upgrade costs nothing extra. */
  pctPerCost: number | null;
}

export interface GradesRun {
  resolved: ResolvedDesign;
  choice: AnalysisChoice;
  options: GradesOptions;
  parts: GradableResistor[];
  /** The grades compared and allowed in the search, widest first. */
  allowed: Grade[];
  /** Per part, the allowed grades it may be ordered in (its value is in the grade's series or a coarser one). */
  offered: Record<string, GradeName[]>;
  /** One line per part that some allowed grade is refused for, saying why; empty when none is. */
  seriesNotes: string[];
  /** Each part's grade as designed (nearest table grade where the design's tolerance is not in the table). */
  designed: Record<string, GradeName>;
  designedNotes: string[];
  rows: GradeRow[];
  mix: GradeMixAnswer;
  upgrade: UpgradeAnswer | null;
  /** Yield of the design as graded (table TCRs), in the search's paired trials, %. */
  designedYieldPct: number;
  designedCost: number;
  /** How the search was done: model evaluations and wall time. */
  method: SearchMethod;
}

/** The allowed grades: the command line's, else the design file's, else the default four; widest first. */
export function allowedGrades(resolved: ResolvedDesign, options: { grades?: readonly GradeName[] | undefined }): Grade[] {
  const names = options.grades ?? resolved.allowedGrades ?? DEFAULT_GRADE_NAMES;
  return GRADES.filter((g) => names.includes(g.name));
}

/**
 * The allowed grades a part may be ordered in: those whose usual series (or a coarser one) holds its value. Refusing
 * the grade keeps the value the design chose for accuracy; re-picking a value would move the output it sets.
 */
function offeredGrades(part: GradableResistor, allowed: readonly Grade[]): { offered: Grade[]; note?: string } {
  const refused: Grade[] = [];
  const offered = allowed.filter((g) => {
    const sold = gradeSoldAt(g, part.nominal);
    if (sold === false) refused.push(g);
    return sold !== false;
  });
  if (refused.length === 0) return { offered };
  const widest = refused[refused.length - 1]!;
  const kept = offered.length > 0 ? `; it may take ${offered.map((g) => g.name).join(', ')}` : '; no allowed grade is sold at this value, so no grade mix can be chosen';
  return {
    offered,
    note: `${part.name} ${formatRkmDigits(part.nominal, 3)} is not an ${widest.series} or coarser value: not offered in ${refused.map((g) => g.name).join(', ')}${kept}.`,
  };
}

/** The table grade a tolerance belongs to: the exact one, else the nearest on a log scale. */
function nearestGrade(tolerance: number): { grade: Grade; exact: boolean } {
  const exact = GRADES.find((g) => Math.abs(g.tolerance - tolerance) <= 1e-9);
  if (exact) return { grade: exact, exact: true };
  const distance = (g: Grade): number => Math.abs(Math.log(g.tolerance) - Math.log(Math.max(tolerance, 1e-9)));
  return { grade: [...GRADES].sort((a, b) => distance(a) - distance(b))[0]!, exact: false };
}

function costOf(grades: readonly Grade[], costs: Record<GradeName, number>): number {
  return grades.reduce((sum, g) => sum + costs[g.name], 0);
}

/** Joint yield of a spec over the same trials an engine run with this seed and trial count uses (pausing for the
 * event loop between chunks, so Ctrl-C stops a long search at once). */
function jointOf(spec: SupplySpec, seed: string, trials: number, openEnded: boolean, checker: BlockChecker | null = null): Promise<JointYield> {
  return jointYieldAsync(buildSupplyModel(spec), { seed, runTrials: openEnded ? 0 : trials }, trials, checker);
}

/** A row's all-specs yield: the engine's own count over the row's trials (the same units, the same test in
 *  unit-check.ts, the same formulas as jointCounter), so it is not counted a second time. */
function jointFromResult(result: AnalysisSummary): JointYield | null {
  const all = result.allSpecs;
  if (all === null) return null;
  const inSpec = Math.round((all.pct * result.trials) / 100);
  return { outputs: all.outputs, trials: result.trials, inSpec, pct: all.pct, interval: { low: all.low, high: all.high } };
}

const pause = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

/** Wall clock, s: read here in the design layer (never in src/analysis/). */
const seconds = (): number => performance.now() / 1000;

export async function runGrades(asResolved: ResolvedDesign, choice: AnalysisChoice, options: GradesOptions, progressFor: ProgressFactory = silentProgress): Promise<GradesRun> {
  const studyStart = seconds();
  // The condition (as built, or end of life with the drift allowances) first: every graded copy starts from it.
  const resolved = resolvedForCondition(asResolved, choice.condition);
  const spec = resolved.spec;
  const parts = gradableResistors(spec);
  const costs = resolved.costs;
  const seed = String(choice.seed);
  const allowed = allowedGrades(resolved, options);
  const offered: Record<string, GradeName[]> = {};
  const seriesNotes: string[] = [];
  const offeredPerPart = parts.map((p) => {
    const o = offeredGrades(p, allowed);
    offered[p.name] = o.offered.map((g) => g.name);
    if (o.note) seriesNotes.push(o.note);
    return o.offered;
  });

  // Side by side: every resistor in one grade. No grade report shows a row's variance-based shares, shortest
  // intervals or per-ambient sweep, so the rows are summaries that leave them out (analyzeSummary).
  const rows: GradeRow[] = [];
  for (const grade of allowed) {
    const graded = specWithGrades(spec, parts, parts.map(() => grade));
    const result = await analyzeSummaryAsChosen(graded, choice, `grades ${grade.name}`, progressFor);
    const notSold = parts.filter((_, i) => !offeredPerPart[i]!.includes(grade)).map((p) => p.name);
    const joint = jointFromResult(result) ?? (await jointOf(graded, result.seed, result.trials, choice.trials === 'auto'));
    rows.push({ grade, notSold, cost: costOf(parts.map(() => grade), costs), result, joint });
  }

  // The design as it stands, mapped onto the table.
  const designedNotes: string[] = [];
  const designedGrades = parts.map((p) => {
    const { grade, exact } = nearestGrade(p.tolerance);
    if (!exact) designedNotes.push(`${p.name}: ±${(p.tolerance * 100).toPrecision(3)} % is not a table grade; taken as ${grade.name}.`);
    return grade;
  });
  const designed: Record<string, GradeName> = {};
  parts.forEach((p, i) => {
    designed[p.name] = designedGrades[i]!.name;
  });

  // The search, on paired trials: one sample of units drawn once (src/analysis/paired-trials.ts), every assignment
  // judged on it, so comparing assignments costs model evaluations only. The search chooses among each part's
  // offered grades; the upgrade starts from the design's own grades, so each part's list there also holds its
  // designed grade.
  const searchStart = seconds();
  const optionsOf = (lists: Grade[][]): GradeOption[][] => lists.map((list) => list.map((g) => ({ name: g.name, cost: costs[g.name], tightness: GRADES.indexOf(g) })));
  const searchLists = offeredPerPart;
  const upgradeLists = parts.map((_, i) => GRADES.filter((g) => searchLists[i]!.includes(g) || g === designedGrades[i]));
  const candidates = GRADES.filter((g) => upgradeLists.some((list) => list.includes(g)));
  const models = gradedModels(spec, parts, candidates);
  // The units are checked by the run's kernel: the WebAssembly evaluator where the kernel implements the design and
  // every candidate grade gives it the same layout (wasm-evaluator.ts), the JavaScript model otherwise; the same flags.
  const evaluator = variantEvaluator(candidates.map((g) => specWithGrades(spec, parts, parts.map(() => g))), choice.kernel ?? 'auto', PAIRED_BLOCK);
  const searchTrials = options.searchTrials;
  const target = options.targetYieldPct / 100;
  const maxFailures = allowedFailures(searchTrials, target);
  let sample: PairedSample | null = null;
  const sampleFor = (partCount: number): PairedSample => (sample ??= new PairedSample(partCount, { seed, trials: searchTrials, ...(evaluator ? { blockChecker: evaluator } : {}) }));
  let evaluations = 0;
  let assignments = 0;
  let screenedCount = 0;
  let screenedRejected = 0;
  let screenUnits = 0;
  // Known yields by grade names: exact (every unit counted) or, for an assignment stopped early, an upper bound.
  const known = new Map<string, { y: number; exact: boolean }>();
  const progress = progressFor('grade search');
  const modelOf = (lists: Grade[][], assignment: readonly number[]): { key: string; model: ReturnType<GradedModels['modelFor']> } => {
    const chosen = assignment.map((option, p) => lists[p]![option]!);
    return { key: chosen.map((g) => g.name).join(','), model: models.modelFor(chosen) };
  };
  // The yield of an assignment when it reaches `floor` (a fraction), else an upper bound below it: the count stops
  // once more units fail than `floor` allows. The search's floor is the target; the upgrade's, what a change must
  // beat; -Infinity asks for the exact yield.
  const yieldAbove = async (lists: Grade[][], assignment: readonly number[], floor: number): Promise<number> => {
    const { key, model } = modelOf(lists, assignment);
    const cached = known.get(key);
    if (cached !== undefined && (cached.exact || cached.y < floor)) return cached.y;
    await pause();
    const limit = floor === -Infinity ? Infinity : allowedFailures(searchTrials, floor);
    const counted = await sampleFor(model.parts.length).countAsync(model, { maxFailures: limit });
    evaluations += counted.evaluations;
    assignments += 1;
    // Stopped early: more failures than the target allows among the units counted, so the yield is below
    // (trials − failures)/trials < target.
    const y = (100 * (counted.complete ? counted.inSpec : searchTrials - counted.failures)) / searchTrials / 100;
    known.set(key, { y, exact: counted.complete });
    progress.update(assignments, MAX_SEARCH_EVALUATIONS);
    return y;
  };
  const evaluatorFor = (lists: Grade[][], exactOnly: boolean) => (assignment: readonly number[]): Promise<number> =>
    yieldAbove(lists, assignment, exactOnly ? -Infinity : target);
  const screenFor = (lists: Grade[][]) => async (assignment: readonly number[]): Promise<boolean> => {
    const { key, model } = modelOf(lists, assignment);
    const cached = known.get(key);
    if (cached !== undefined) return cached.y < target;
    // The screens share a budget as large as the evaluations' (MAX_SEARCH_EVALUATIONS × the search trials, in
    // units); past it a screen says nothing, which only leaves more to the evaluations and their limit.
    if (screenUnits >= MAX_SEARCH_EVALUATIONS * searchTrials) return false;
    const counted = await sampleFor(model.parts.length).countAsync(model, { maxFailures, maxUnits: SCREEN_UNITS });
    evaluations += counted.evaluations;
    screenUnits += counted.evaluations / (model.ambient?.gridC.length ?? 1);
    screenedCount += 1;
    if (screenedCount % 16 === 0) await pause();
    if (counted.failures > maxFailures) screenedRejected += 1;
    return counted.failures > maxFailures;
  };
  let mix: GradeMixAnswer;
  let upgrade: UpgradeAnswer | null = null;
  const base = designedGrades.map((g, i) => upgradeLists[i]!.indexOf(g));
  let designedYieldPct: number;
  const steps: SearchMethod['steps'] = { search: { evaluations: 0, seconds: 0 }, verify: { evaluations: 0, seconds: 0 }, upgrade: { evaluations: 0, seconds: 0 } };
  let mark = { evaluations: 0, seconds: seconds() };
  const step = (name: keyof SearchMethod['steps']): void => {
    const now = seconds();
    steps[name] = { evaluations: evaluations - mark.evaluations, seconds: now - mark.seconds };
    mark = { evaluations, seconds: now };
  };
  try {
    const unsold = parts.filter((_, i) => searchLists[i]!.length === 0);
    const found = unsold.length > 0
      ? { found: false, assignment: null, cost: null, yield: null, evaluations: 0, skipped: 0, reason: 'no-grade-sold' as const }
      : await cheapestGradeMix({ options: optionsOf(searchLists), target, evaluate: evaluatorFor(searchLists, false), screen: screenFor(searchLists), maxEvaluations: MAX_SEARCH_EVALUATIONS });
    step('search');
    mix = { found: found.found, evaluations: found.evaluations, skipped: found.skipped };
    if (found.reason) mix.reason = found.reason;
    if (found.found && found.assignment) {
      const chosen = found.assignment.map((option, p) => searchLists[p]![option]!);
      mix.assignment = {};
      parts.forEach((p, i) => {
        mix.assignment![p.name] = chosen[i]!.name;
      });
      mix.cost = found.cost!;
      mix.searchYieldPct = found.yield! * 100;
      const verifyTrials = typeof choice.trials === 'number' ? choice.trials : DEFAULT_GRADES_TRIALS;
      const verified = await jointOf(specWithGrades(spec, parts, chosen), seed, verifyTrials, false, evaluator);
      evaluations += verifyTrials * (models.modelFor(chosen).ambient?.gridC.length ?? 1);
      mix.verified = verified;
    }
    step('verify');
    const up = await bestSingleUpgrade({
      options: optionsOf(upgradeLists),
      base,
      evaluate: evaluatorFor(upgradeLists, true),
      evaluateAbove: (assignment, floor) => yieldAbove(upgradeLists, assignment, floor),
    });
    step('upgrade');
    designedYieldPct = up.baseYield * 100;
    if (up.best) {
      upgrade = {
        part: parts[up.best.part]!.name,
        from: designedGrades[up.best.part]!.name,
        to: upgradeLists[up.best.part]![up.best.option]!.name,
        yieldBeforePct: up.baseYield * 100,
        yieldAfterPct: up.best.yield * 100,
        extraCost: up.best.extraCost,
        pctPerCost: up.best.yieldPerCost === null ? null : up.best.yieldPerCost * 100,
      };
    }
  } finally {
    progress.finish();
  }
  const end = seconds();
  const method: SearchMethod = {
    evaluations,
    seconds: end - searchStart,
    assignments,
    screened: screenedCount,
    screenedRejected,
    pairedTrials: searchTrials,
    studySeconds: end - studyStart,
    steps,
  };
  return {
    resolved,
    choice,
    options,
    parts,
    allowed,
    offered,
    seriesNotes,
    designed,
    designedNotes,
    rows,
    mix,
    upgrade,
    designedYieldPct,
    designedCost: costOf(designedGrades, costs),
    method,
  };
}

/** The design as it stands: its all-specs yield is what --fail-under-yield gates in `grades`. */
export function gradesYields(run: GradesRun): { name: string; pct: number }[] {
  return [{ name: 'all specs as designed', pct: run.designedYieldPct }];
}
