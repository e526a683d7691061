// The grade study as one JSON document: every grade side by side (per output with a spec window: sigma, 95 %
// interval, worst case, yield, Cpk; the all-specs yield), the design as it stands, the cheapest grade mix and the
// best single upgrade, with the notes on how they were obtained.
import type { GradesRun } from '../design/grade-study.js';
import { LIFE_CONDITION_LABEL, lifeConditionOr } from '../tolerance/life-allowances.js';
import { gradesSource } from '../design/grades.js';
import { specOutputs } from './grades-cells.js';
import { GRADING_NOTE, searchMethod } from './grades-notes.js';

/**
 * Relative costs are sums of the user's per-grade figures, so binary floating point leaves tails such as
 * 67.80000000000001; every number under a key naming a cost is given to 12 significant digits.
 */
function withRoundCosts(value: unknown, key = ''): unknown {
  if (typeof value === 'number') return /cost/i.test(key) && Number.isFinite(value) ? Number(value.toPrecision(12)) : value;
  if (Array.isArray(value)) return value.map((v) => withRoundCosts(v, key));
  if (value !== null && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, withRoundCosts(v, /cost/i.test(key) ? key : k)]));
  }
  return value;
}

export function gradesJson(run: GradesRun, version: string): unknown {
  return withRoundCosts(gradesDocument(run, version));
}

function gradesDocument(run: GradesRun, version: string): unknown {
  const names = specOutputs(run);
  return {
    seed: run.rows[0]!.result.seed,
    condition: lifeConditionOr(run.choice.condition),
    conditionLabel: LIFE_CONDITION_LABEL[lifeConditionOr(run.choice.condition)],
    trials: run.rows.map((r) => r.result.trials),
    version,
    parts: run.parts.map((p) => ({ name: p.name, kind: p.kind, nominal: p.nominal, designedGrade: run.designed[p.name], offeredGrades: run.offered[p.name] ?? [] })),
    costs: Object.fromEntries(run.allowed.map((g) => [g.name, run.resolved.costs[g.name]])),
    costsSource: gradesSource(run.allowed),
    seriesNotes: run.seriesNotes,
    grades: run.rows.map((row) => ({
      grade: row.grade.name,
      tolerance: row.grade.tolerance,
      tcrPerK: row.grade.tcrPerK,
      cost: row.cost,
      notSold: row.notSold,
      trials: row.result.trials,
      allSpecsYieldPct: row.joint.pct,
      allSpecsYieldInterval95: row.joint.interval,
      outputs: Object.fromEntries(
        names.map((name) => {
          const o = row.result.outputs[name]!;
          return [name, { sigma: o.sigma, interval95: o.interval95, worstCase: { min: o.worstCase.min, max: o.worstCase.max }, yieldPct: o.yield?.pct ?? null, yieldAtRandomAmbientPct: o.yieldAtRandomAmbient?.pct ?? null, cpk: o.cpk !== undefined && Number.isFinite(o.cpk) ? o.cpk : null }];
        }),
      ),
    })),
    targetYieldPct: run.options.targetYieldPct,
    searchTrials: run.options.searchTrials,
    designed: { grades: run.designed, cost: run.designedCost, allSpecsYieldPct: run.designedYieldPct, notes: run.designedNotes },
    cheapest: {
      found: run.mix.found,
      reason: run.mix.reason ?? null,
      grades: run.mix.assignment ?? null,
      cost: run.mix.cost ?? null,
      searchYieldPct: run.mix.searchYieldPct ?? null,
      verifiedYieldPct: run.mix.verified?.pct ?? null,
      verifiedYieldInterval95: run.mix.verified?.interval ?? null,
      verifiedTrials: run.mix.verified?.trials ?? null,
      evaluations: run.mix.evaluations,
      skipped: run.mix.skipped,
      method: searchMethod(run.allowed[run.allowed.length - 1]!.name.replace('%', '\u00a0%')),
    },
    bestUpgrade: run.upgrade,
    method: {
      evaluations: run.method.evaluations,
      seconds: run.method.seconds,
      counts: 'model evaluations (every output for one unit at one ambient) and wall time of the cheapest-mix search, the best upgrade and the re-run of the answer',
      assignments: run.method.assignments,
      screened: run.method.screened,
      screenedRejected: run.method.screenedRejected,
      pairedTrials: run.method.pairedTrials,
      studySeconds: run.method.studySeconds,
      steps: run.method.steps,
    },
    notes: [
      GRADING_NOTE,
      `"all specs" yield: share of trials in which every output with a spec window (${names.join(', ')}) is inside it.`,
    ],
  };
}
