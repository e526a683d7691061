// The grade study as tables for the HTML review report (`design` passes them to the spread report): the grades side
// by side (σ · yield · Cpk per output, the all-specs yield) and, when found, the cheapest grade mix.
import type { GradesRun } from '../design/grade-study.js';
import { LIFE_CONDITION_SHORT, lifeConditionOr } from '../tolerance/life-allowances.js';
import { gradesSource } from '../design/grades.js';
import { MISSING, formatIndex, formatSpread, formatYieldPct } from './format-value.js';
import { costText, gradeLabel, specOutputs } from './grades-cells.js';
import { GRADING_NOTE, searchMethod } from './grades-notes.js';
import type { ReportTable } from './html-report.js';

/** The grade comparison and the search's answer as tables for the HTML report (`design` passes them to writeSpreadFiles). */
export function gradesReportTables(run: GradesRun): ReportTable[] {
  const names = specOutputs(run);
  const rows = run.rows.map((row) => [
    gradeLabel(row.grade),
    costText(row.cost),
    ...names.map((name) => {
      const o = row.result.outputs[name]!;
      return `σ ${formatSpread(o.sigma, o.unit)}\nyield ${o.yield ? formatYieldPct(o.yield.pct) : MISSING}\nCpk ${formatIndex(o.cpk)}`;
    }),
    formatYieldPct(row.joint.pct),
    `${row.result.trials.toLocaleString('en-US')} at ${row.grade.name}`,
  ]);
  const tables: ReportTable[] = [
    {
      id: 'grades',
      title: `Tolerance grades side by side (every resistor in one grade), ${LIFE_CONDITION_SHORT[lifeConditionOr(run.choice.condition)]}`,
      head: ['grade (TCR)', 'relative cost', ...names, 'all specs yield', 'Monte Carlo trials (this grade)'],
      rows,
      notes: [`Cells per output: σ, yield, Cpk, from that row's own Monte Carlo run (trials in the last column). Costs: ${gradesSource(run.allowed)}.`, GRADING_NOTE, ...run.seriesNotes],
    },
  ];
  if (run.mix.found && run.mix.assignment) {
    const v = run.mix.verified!;
    tables.push({
      id: 'grade-mix',
      title: `Cheapest grades reaching ${run.options.targetYieldPct} % (cost ${costText(run.mix.cost!)}; as designed ${costText(run.designedCost)})`,
      head: ['part', 'grade', 'as designed'],
      rows: run.parts.map((p) => [p.name, run.mix.assignment![p.name]!, run.designed[p.name]!]),
      notes: [`All-specs yield ${formatYieldPct(v.pct)} (95 % interval ${formatYieldPct(v.interval.low)} … ${formatYieldPct(v.interval.high)}, from ${v.trials.toLocaleString('en-US')} trials of this grade mix).`, searchMethod(run.allowed[run.allowed.length - 1]!.name.replace('%', '\u00a0%'))],
    });
  }
  return tables;
}
