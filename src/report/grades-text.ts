// The grade study as the terminal report: every resistor in each grade side by side, the design as it stands, the
// cheapest grade mix that reaches the target (or why none does), the best single upgrade and how the search works.
import type { GradesRun } from '../design/grade-study.js';
import { LIFE_CONDITION_SHORT, lifeConditionOr } from '../tolerance/life-allowances.js';
import { gradesSource } from '../design/grades.js';
import { MISSING, formatIndex, formatSpread, formatValue, formatYieldPct, outputDigits } from './format-value.js';
import { costText, gradeLabel, specOutputs } from './grades-cells.js';
import { GRADING_NOTE, searchMethod } from './grades-notes.js';
import { textTable } from './text-table.js';

export interface GradesTextOptions {
  /** What was analysed, e.g. the design file's path. */
  subject: string;
  version: string;
}

export function renderGradesText(run: GradesRun, options: GradesTextOptions): string {
  const { subject, version } = options;
  const names = specOutputs(run);
  const out: string[] = [];
  // One count when every grade ran the same trials, else each grade's own count beside its name.
  const counts = new Set(run.rows.map((r) => r.result.trials));
  const trials = counts.size === 1
    ? `${run.rows[0]!.result.trials.toLocaleString('en-US')} trials per grade`
    : `trials per grade ${run.rows.map((r) => `${r.grade.name} ${r.result.trials.toLocaleString('en-US')}`).join(', ')}`;
  out.push(`${subject}, ${LIFE_CONDITION_SHORT[lifeConditionOr(run.choice.condition)]}: every resistor in each grade; Monte Carlo ${trials}, seed ${JSON.stringify(run.rows[0]!.result.seed)}; trimfree ${version}`);
  out.push(`resistors graded: ${run.parts.map((p) => `${p.name} (as designed ${run.designed[p.name]})`).join(', ')}`);
  out.push('');
  const rows: string[][] = [];
  for (const row of run.rows) {
    names.forEach((name, i) => {
      const o = row.result.outputs[name]!;
      const d = outputDigits(o);
      rows.push([
        i === 0 ? gradeLabel(row.grade) : '',
        i === 0 ? costText(row.cost) : '',
        name,
        formatSpread(o.sigma, o.unit),
        `${formatValue(o.interval95.low, o.unit, d)} … ${formatValue(o.interval95.high, o.unit, d)}`,
        o.yield ? formatYieldPct(o.yield.pct) : MISSING,
        formatIndex(o.cpk),
      ]);
    });
    rows.push(['', '', 'all specs', '', '', formatYieldPct(row.joint.pct), '']);
  }
  out.push(textTable(['grade (TCR)', 'cost', 'output', 'σ', '95 % interval', 'yield', 'Cpk'], rows, [false, true, false, true, true, true, true]));
  out.push(`cost: relative, summed over the ${run.parts.length} graded resistors (${gradesSource(run.allowed)}).`);
  if (run.seriesNotes.length > 0) out.push('grades refused by series (common practice; the grade is refused rather than the value re-picked, which would move the outputs the value was chosen for; the rows above price every part in every grade for comparison only):');
  for (const note of run.seriesNotes) out.push(`  ${note}`);
  out.push('');
  out.push(`as designed: cost ${costText(run.designedCost)}, all-specs yield ${formatYieldPct(run.designedYieldPct)} (${run.options.searchTrials.toLocaleString('en-US')} paired trials)`);
  for (const note of run.designedNotes) out.push(`  ${note}`);
  const target = `${run.options.targetYieldPct} %`;
  if (run.mix.found && run.mix.assignment) {
    out.push(`cheapest grades reaching ${target} of units inside every spec window: cost ${costText(run.mix.cost!)}`);
    out.push(textTable(['part', 'grade', 'as designed'], run.parts.map((p) => [p.name, run.mix.assignment![p.name]!, run.designed[p.name]!])));
    const v = run.mix.verified!;
    out.push(
      `  yield ${formatYieldPct(run.mix.searchYieldPct!)} in the search; re-run with ${v.trials.toLocaleString('en-US')} trials: ${formatYieldPct(v.pct)} (95 % interval ${formatYieldPct(v.interval.low)} … ${formatYieldPct(v.interval.high)})`,
    );
    if (v.interval.low < run.options.targetYieldPct) out.push('  the re-run\'s interval reaches below the target: check with more --trials and --search-trials.');
  } else if (run.mix.reason === 'target-unreachable') {
    out.push(`no grade mix reaches ${target}: even ${run.allowed[run.allowed.length - 1]!.name.replace('%', ' %')} everywhere falls short. The reference, offsets or the spec window limit the yield; no resistor grade can fix that.`);
  } else if (run.mix.reason === 'no-grade-sold') {
    out.push(`no grade mix can be chosen: a part's value is sold in none of the allowed grades (see "grades refused by series" above); allow a tighter grade (--grades, resistors.grades).`);
  } else {
    out.push(`the search stopped after ${run.mix.evaluations} evaluations without reaching ${target}; try fewer parts to grade or a lower target.`);
  }
  out.push(`  search: ${run.mix.evaluations} assignment${run.mix.evaluations === 1 ? '' : 's'} evaluated, ${run.mix.skipped} skipped as no tighter than a failure.`);
  if (run.upgrade) {
    const u = run.upgrade;
    out.push(
      `best single upgrade from the design as it stands: ${u.part} ${u.from} → ${u.to}, all-specs yield ${formatYieldPct(u.yieldBeforePct)} → ${formatYieldPct(u.yieldAfterPct)} for ${costText(u.extraCost)} more` +
        (u.pctPerCost === null ? ' (no extra cost)' : ` (${u.pctPerCost.toPrecision(3)} yield points per unit cost)`),
    );
  } else {
    out.push(
      run.designedYieldPct < 100
        ? 'no single grade upgrade raises the yield of the design as it stands: the units it loses are set by parts that are not resistors (see the contributors in `trimfree spread`).'
        : 'no single grade upgrade raises the yield of the design as it stands (every trial already meets every window).',
    );
  }
  out.push('');
  out.push(`how the search works: ${searchMethod(run.allowed[run.allowed.length - 1]!.name.replace('%', '\u00a0%'))}`);
  out.push(GRADING_NOTE);
  if (run.resolved.cautions.length > 0) {
    out.push('');
    out.push('caution:');
    for (const c of run.resolved.cautions) out.push(`  ! ${c}`);
  }
  return `${out.join('\n')}\n`;
}
