// `trimfree grades FILE`: the design's resistors ordered in each tolerance grade side by side (spread, yield, Cpk
// for each output with a spec window, and the yield of a unit that must meet every window at once), then the
// cheapest per-part grade assignment that reaches --target-yield, and the single upgrade that buys the most yield
// per unit cost. Thin: src/analysis computes (analyze, jointYield, gradedSpec), src/pick/grade-mix.ts searches,
// this module wires them and prints. `design` reuses runGrades, gradesJson and renderGradesText.
import { Command, Option } from 'commander';
import { analysisChoice, type CommandLineAnalysis } from '../design/analysis-choice.js';
import { DEFAULT_GRADES_TRIALS, DEFAULT_SEARCH_TRIALS, DEFAULT_TARGET_YIELD_PCT, gradesYields, runGrades, type GradesRun } from '../design/grade-study.js';
import { GRADES_SOURCE } from '../design/grades.js';
import { ImpossibleError, InputError } from '../errors.js';
import { MISSING, formatIndex, formatSpread, formatValue, formatYieldPct, outputDigits } from '../report/format-value.js';
import type { ReportTable } from '../report/html-report.js';
import { stringifyReport } from '../report/json.js';
import { textTable } from '../report/text-table.js';
import { parsePercent } from '../units/index.js';
import { integerOption } from './option-parsers.js';
import { progressToTerminal } from './analysis-options.js';
import { loadResolved, seedOption, trialsOption, workersOption } from './spread.js';
import { VERSION } from './version.js';
import { checkYieldGate, failUnderYieldOption, FAIL_UNDER_YIELD_HELP } from './yield-gate.js';

// ---- output ----------------------------------------------------------------------------------------------------

export const GRADING_NOTE =
  "Each grade brings its usual TCR (common practice); the shunt takes the grade's tolerance and keeps its own TCR; " +
  "resistor values stay as designed (a looser grade's usual series may not stock them).";

export const SEARCH_METHOD =
  'Every assignment is evaluated by Monte Carlo on the same seed and trials, so any two are compared on paired ' +
  'trials. Taking yield not to fall when a part is tightened (the usual case with the nominal inside the window): ' +
  'if every part at 0.1 % fails, nothing passes; for each part, grades that fail even with every other part at ' +
  '0.1 % are ruled out; the remaining assignments are then visited in order of total cost, cheapest first, and the ' +
  'first that reaches the target is the cheapest (assignments no tighter than a known failure are skipped). The ' +
  'answer is re-run with the full trial count.';

function specOutputs(run: GradesRun): string[] {
  const first = run.rows[0]!.result;
  return Object.values(first.outputs).filter((o) => o.spec !== undefined).map((o) => o.name);
}

export function gradesJson(run: GradesRun): unknown {
  const names = specOutputs(run);
  return {
    seed: run.rows[0]!.result.seed,
    trials: run.rows.map((r) => r.result.trials),
    version: VERSION,
    parts: run.parts.map((p) => ({ name: p.name, kind: p.kind, nominal: p.nominal, designedGrade: run.designed[p.name] })),
    costs: run.resolved.costs,
    costsSource: GRADES_SOURCE,
    grades: run.rows.map((row) => ({
      grade: row.grade.name,
      tolerance: row.grade.tolerance,
      tcrPerK: row.grade.tcrPerK,
      cost: row.cost,
      trials: row.result.trials,
      allSpecsYieldPct: row.joint.pct,
      allSpecsYieldInterval95: row.joint.interval,
      outputs: Object.fromEntries(
        names.map((name) => {
          const o = row.result.outputs[name]!;
          return [name, { sigma: o.sigma, interval95: o.interval95, worstCase: { min: o.worstCase.min, max: o.worstCase.max }, yieldPct: o.yield?.pct ?? null, cpk: o.cpk !== undefined && Number.isFinite(o.cpk) ? o.cpk : null }];
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
      method: SEARCH_METHOD,
    },
    bestUpgrade: run.upgrade,
    notes: [
      GRADING_NOTE,
      `"all specs" yield: share of trials in which every output with a spec window (${names.join(', ')}) is inside it.`,
    ],
  };
}

function costText(cost: number): string {
  return Number.isInteger(cost) ? String(cost) : cost.toFixed(2);
}

export function renderGradesText(run: GradesRun, subject: string): string {
  const names = specOutputs(run);
  const out: string[] = [];
  const trials = [...new Set(run.rows.map((r) => r.result.trials))].map((t) => t.toLocaleString('en-US')).join('/');
  out.push(`${subject}: every resistor in each grade; Monte Carlo ${trials} trials, seed ${JSON.stringify(run.rows[0]!.result.seed)}; trimfree ${VERSION}`);
  out.push(`resistors graded: ${run.parts.map((p) => `${p.name} (as designed ${run.designed[p.name]})`).join(', ')}`);
  out.push('');
  const rows: string[][] = [];
  for (const row of run.rows) {
    names.forEach((name, i) => {
      const o = row.result.outputs[name]!;
      const d = outputDigits(o);
      rows.push([
        i === 0 ? `${row.grade.name} (${Math.round(row.grade.tcrPerK * 1e6)} ppm/K)` : '',
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
  out.push(`cost: relative, summed over the ${run.parts.length} graded resistors (${GRADES_SOURCE}).`);
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
    out.push(`no grade mix reaches ${target}: even 0.1 % everywhere falls short. The reference, offsets or the spec window limit the yield; no resistor grade can fix that.`);
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
  out.push(`how the search works: ${SEARCH_METHOD}`);
  out.push(GRADING_NOTE);
  if (run.resolved.cautions.length > 0) {
    out.push('');
    out.push('caution:');
    for (const c of run.resolved.cautions) out.push(`  ! ${c}`);
  }
  return `${out.join('\n')}\n`;
}

/** The grade comparison and the search's answer as tables for the HTML report (`design` passes them to writeSpreadFiles). */
export function gradesReportTables(run: GradesRun): ReportTable[] {
  const names = specOutputs(run);
  const rows = run.rows.map((row) => [
    `${row.grade.name} (${Math.round(row.grade.tcrPerK * 1e6)} ppm/K)`,
    costText(row.cost),
    ...names.map((name) => {
      const o = row.result.outputs[name]!;
      return `σ ${formatSpread(o.sigma, o.unit)} · ${o.yield ? formatYieldPct(o.yield.pct) : MISSING} · Cpk ${formatIndex(o.cpk)}`;
    }),
    formatYieldPct(row.joint.pct),
  ]);
  const tables: ReportTable[] = [
    {
      id: 'grades',
      title: 'Tolerance grades side by side (every resistor in one grade)',
      head: ['grade (TCR)', 'relative cost', ...names, 'all specs yield'],
      rows,
      notes: [`Cells: σ · yield · Cpk. Costs: ${GRADES_SOURCE}.`, GRADING_NOTE],
    },
  ];
  if (run.mix.found && run.mix.assignment) {
    const v = run.mix.verified!;
    tables.push({
      id: 'grade-mix',
      title: `Cheapest grades reaching ${run.options.targetYieldPct} % (cost ${costText(run.mix.cost!)}; as designed ${costText(run.designedCost)})`,
      head: ['part', 'grade', 'as designed'],
      rows: run.parts.map((p) => [p.name, run.mix.assignment![p.name]!, run.designed[p.name]!]),
      notes: [`All-specs yield ${formatYieldPct(v.pct)} (95 % interval ${formatYieldPct(v.interval.low)} … ${formatYieldPct(v.interval.high)}, ${v.trials.toLocaleString('en-US')} trials).`, SEARCH_METHOD],
    });
  }
  return tables;
}

// ---- command ---------------------------------------------------------------------------------------------------

/** Breaks text into lines of at most `width` characters at spaces (for the help text). */
function wrap(text: string, width: number): string {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    if (line !== '' && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line === '' ? word : `${line} ${word}`;
  }
  if (line !== '') lines.push(line);
  return lines.join('\n');
}

function targetYieldOption(value: string): number {
  const accepted = 'a yield between 50 % and 100 % (exclusive), e.g. 99.9% or 99.9';
  const fraction = parsePercent(value, '--target-yield');
  if (!(fraction >= 0.5 && fraction < 1)) throw new InputError('--target-yield', `${value} is out of range`, accepted);
  return fraction * 100;
}

interface GradesCliOptions {
  json?: boolean;
  targetYield: number;
  searchTrials: number;
  seed?: number;
  trials?: number | 'auto';
  workers?: number;
  failUnderYield?: number;
}

/**
 * A grade search the user asked for by naming --target-yield that no grade mix can satisfy is an impossible
 * request (exit 2), stated with the best any resistor grade achieves; with the default target the report says so.
 */
export function refuseUnreachableTarget(run: GradesRun, targetGiven: boolean): void {
  if (!targetGiven || run.mix.reason !== 'target-unreachable') return;
  const tightest = run.rows.reduce((best, row) => (row.grade.tolerance < best.grade.tolerance ? row : best));
  const limits = run.resolved.limits ?? [];
  throw new ImpossibleError(
    '--target-yield',
    `no resistor grade mix reaches ${run.options.targetYieldPct} % of units inside every spec window: even every resistor at ${tightest.grade.name} gives ${formatYieldPct(tightest.joint.pct)}${limits.length > 0 ? ' (the output window is narrower than the reference alone allows)' : ''}`,
    `lower --target-yield below ${formatYieldPct(tightest.joint.pct)}, or change what resistors cannot: a tighter reference, lower-offset amplifier or wider spec window (see the contributors in \`trimfree spread\`)`,
  );
}

async function run(file: string, options: GradesCliOptions, command: Command): Promise<void> {
  const resolved = loadResolved(file);
  const cli: CommandLineAnalysis = {};
  if (options.trials !== undefined) cli.trials = options.trials;
  if (options.seed !== undefined) cli.seed = options.seed;
  if (options.workers !== undefined) cli.workers = options.workers;
  const result = await runGrades(
    resolved,
    analysisChoice(resolved, cli, DEFAULT_GRADES_TRIALS),
    { targetYieldPct: options.targetYield, searchTrials: options.searchTrials },
    progressToTerminal,
  );
  refuseUnreachableTarget(result, command.getOptionValueSource('targetYield') === 'cli');
  process.stdout.write(options.json ? stringifyReport(gradesJson(result)) : renderGradesText(result, file));
  checkYieldGate(options.failUnderYield, gradesYields(result));
}

export function gradesCommand(): Command {
  return new Command('grades')
    .description('tolerance grades side by side; the cheapest per-part grade mix that meets a yield target')
    .configureOutput({ outputError: () => undefined })
    .argument('<file>', 'design file (JSON); "auto" values are filled as `design` does')
    .addOption(new Option('--target-yield <pct>', 'share of units that must meet every spec window').argParser(targetYieldOption).default(DEFAULT_TARGET_YIELD_PCT, '99.9 %'))
    .addOption(new Option('--search-trials <n>', 'Monte Carlo trials per assignment the search evaluates').argParser(integerOption('--search-trials', 1000, 10_000_000)).default(DEFAULT_SEARCH_TRIALS, '20000'))
    .addOption(new Option('--seed <n>', 'random seed (default: the file\'s, else 1)').argParser(seedOption('--seed')))
    .addOption(new Option('--trials <n|auto>', 'Monte Carlo trials per grade (default: the file\'s, else 100000)').argParser(trialsOption('--trials')))
    .addOption(new Option('--workers <n>', 'worker threads; results do not depend on it (default: the file\'s, else every core)').argParser(workersOption('--workers')))
    .addOption(new Option('--fail-under-yield <pct>', `${FAIL_UNDER_YIELD_HELP.replace("any output's yield", 'the all-specs yield of the design as it stands')}`).argParser(failUnderYieldOption))
    .option('--json', 'print JSON: grades[] (per output sigma, interval95, yieldPct, cpk; allSpecsYieldPct), cheapest, bestUpgrade')
    .addHelpText(
      'after',
      `
Grades: 5 %, 1 %, 0.5 %, 0.1 % (IEC 60062:2016 letters J, F, D, B), each with the TCR it usually comes with
(common practice); relative costs are illustrative unless the design file's "costs" gives yours.

${wrap(SEARCH_METHOD, 112)}

Exit codes: 0 done; 1 the all-specs yield of the design as it stands (its own grades, paired search trials) is below
--fail-under-yield, after the full report; 2 bad input, or a --target-yield you gave that no grade mix can reach;
130 Ctrl-C.

Examples:
  $ trimfree grades examples/charger-2s-liion.json
  $ trimfree grades examples/charger-2s-liion.json --target-yield 99.99% --search-trials 50000
  $ trimfree grades examples/led-driver-highside.json --json`,
    )
    .action((file: string, options: GradesCliOptions, command: Command) => run(file, options, command));
}
