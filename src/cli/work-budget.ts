// The total Monte Carlo work a command will do, known before it starts: refused past MAX_RUN_TRIALS in all (a grade
// comparison runs its trial count once per grade, so `grades --trials 1e10` was 4e10 and more), and estimated in time
// so a run of more than about a minute says so before it begins. The estimate is deliberately simple: trials in all
// divided by a fixed rate per computing thread, measured on the charger example (a design with more parts or outputs
// runs slower, a smaller one faster), so it is a rough guide, not a promise.
import { availableParallelism } from 'node:os';
import { MAX_SEARCH_EVALUATIONS } from '../design/grade-study.js';
import type { AnalysisChoice } from '../design/analysis-choice.js';
import type { ResolvedDesign } from '../design/resolve.js';
import { InputError } from '../errors.js';
import { MAX_RUN_TRIALS } from './analysis-options.js';

/** Trials a second one computing thread evaluates, measured on the charger example (examples/charger-2s-liion.json,
 * 2e7 trials on the project's two-core machine: 12.8 s with 2 threads, start-up included). */
export const TRIALS_PER_SECOND_PER_THREAD = 800_000;
/** Runs estimated to take longer than this print the estimate first. */
export const ANNOUNCE_ABOVE_SECONDS = 60;

/** What a command will run. */
export interface PlannedWork {
  /** Trials of the spread study (twice for an adjustable output: the pot at each end), when it runs. */
  spread?: AnalysisChoice;
  /** The grade study: its trial count per grade and the search's trials per evaluated assignment. */
  grades?: { choice: AnalysisChoice; searchTrials: number; gradeCount: number };
}

export interface WorkEstimate {
  /** Trials evaluated in all (the grade search counted at its most evaluations); null for an adaptive ('auto') run. */
  trials: number | null;
  /** Estimated time on one computing thread, seconds (the same for any --workers and machine, so the JSON stays
   * byte-identical across worker counts); null when the trials are not known in advance. */
  estimatedSecondsOnOneThread: number | null;
  /** What the estimate is based on. */
  basis: string;
}

/** The work's trial count and time estimate; InputError when it is past MAX_RUN_TRIALS in all. */
export function planWork(resolved: ResolvedDesign, work: PlannedWork, threads: number): { estimate: WorkEstimate; wallSeconds: number | null } {
  const parts: string[] = [];
  // Monte Carlo runs spread over the threads; the all-specs yields and the grade search run on the calling thread.
  let parallel = 0;
  let serial = 0;
  let known = true;
  if (work.spread) {
    const runs = resolved.lowEnd ? 2 : 1;
    if (work.spread.trials === 'auto') known = false;
    else {
      parallel += runs * work.spread.trials;
      parts.push(`${runs > 1 ? `${runs} × ` : ''}${work.spread.trials} spread trials`);
    }
    const lots = work.spread.lots;
    if (lots) {
      parallel += lots.count * lots.trialsPerLot;
      parts.push(`${lots.count} lots × ${lots.trialsPerLot} trials`);
    }
  }
  if (work.grades) {
    const perGrade = work.grades.choice.trials;
    if (perGrade === 'auto') known = false;
    else {
      // Each grade: one Monte Carlo run (its all-specs yield is the run's own count); then the cheapest mix re-run.
      parallel += work.grades.gradeCount * perGrade;
      serial += perGrade;
      parts.push(`${work.grades.gradeCount} grades × ${perGrade} trials + a ${perGrade}-trial re-run`);
    }
    // The search: at most MAX_SEARCH_EVALUATIONS assignments, and screens within a budget of as many units.
    serial += 2 * MAX_SEARCH_EVALUATIONS * work.grades.searchTrials;
    parts.push(`at most ${MAX_SEARCH_EVALUATIONS} search evaluations × ${work.grades.searchTrials} trials and as many in screens`);
  }
  const trials = parallel + serial;
  if (trials > MAX_RUN_TRIALS) {
    throw new InputError(
      work.grades ? '--trials/--search-trials' : '--trials',
      `this run would evaluate about ${trials.toExponential(1)} trials in all (${parts.join(' + ')}), more than the 1e10 that can finish in any sensible time; refused before any work`,
      'fewer trials: past about 1e7 trials the figures change little (compare two seeds instead)',
    );
  }
  const basis = `${parts.join(' + ') || 'an adaptive run (length not known in advance)'}, at about ${TRIALS_PER_SECOND_PER_THREAD} trials a second a thread (measured on the charger example; larger designs are slower)`;
  if (!known) return { estimate: { trials: null, estimatedSecondsOnOneThread: null, basis }, wallSeconds: null };
  const wall = parallel / (TRIALS_PER_SECOND_PER_THREAD * Math.max(1, threads)) + serial / TRIALS_PER_SECOND_PER_THREAD;
  return { estimate: { trials, estimatedSecondsOnOneThread: Math.round(trials / TRIALS_PER_SECOND_PER_THREAD), basis }, wallSeconds: Math.round(wall) };
}

/** Plans the work of a command (refusing too much), and prints the choice's notes (e.g. workers capped) and, for a
 * run of more than about a minute, the estimate, on stderr before the run starts. */
export function startWork(resolved: ResolvedDesign, work: PlannedWork): WorkEstimate {
  const choice = work.spread ?? work.grades!.choice;
  const threads = choice.workers ?? availableParallelism();
  const { estimate, wallSeconds } = planWork(resolved, work, threads);
  const notes = new Set([...(work.spread?.notes ?? []), ...(work.grades?.choice.notes ?? [])]);
  for (const note of notes) process.stderr.write(`note: ${note}\n`);
  const line = estimateLine(wallSeconds, threads, estimate);
  if (line !== undefined) process.stderr.write(`${line}\n`);
  return estimate;
}

/** The line printed before a long run, or undefined for a run under about a minute. Wall time: Monte Carlo runs on
 * `threads` threads, the all-specs yields and the grade search on one. */
export function estimateLine(wallSeconds: number | null, threads: number, estimate: WorkEstimate): string | undefined {
  if (wallSeconds === null || wallSeconds <= ANNOUNCE_ABOVE_SECONDS) return undefined;
  const time = wallSeconds < 3600 ? `${Math.round(wallSeconds / 60)} min` : `${(wallSeconds / 3600).toFixed(1)} h`;
  return `note: this run will take about ${time} (estimate: ${estimate.basis}; Monte Carlo on ${threads} threads, yields and the grade search on one); Ctrl-C stops it`;
}
