// `trimfree grades FILE`: the design's resistors ordered in each tolerance grade side by side (spread, yield, Cpk
// for each output with a spec window, and the yield of a unit that must meet every window at once), then the
// cheapest per-part grade assignment that reaches --target-yield, and the single upgrade that buys the most yield
// per unit cost. Thin: src/analysis computes (analyze, jointYield, gradedSpec), src/pick/grade-mix.ts searches,
// this module wires them and prints. `design` reuses runGrades, gradesJson and renderGradesText.
import { Command, Option } from 'commander';
import { analysisChoice, type CommandLineAnalysis } from '../design/analysis-choice.js';
import { DEFAULT_GRADES_TRIALS, DEFAULT_SEARCH_TRIALS, DEFAULT_TARGET_YIELD_PCT, gradesYields, runGrades, type GradesRun } from '../design/grade-study.js';
import { ImpossibleError, InputError } from '../errors.js';
import { formatYieldPct } from '../report/format-value.js';
import { gradesJson } from '../report/grades-json.js';
import { SEARCH_METHOD } from '../report/grades-notes.js';
import { renderGradesText } from '../report/grades-text.js';
import { stringifyReport } from '../report/json.js';
import { wrapText } from '../report/wrap-text.js';
import { parsePercent } from '../units/index.js';
import { integerOption } from './option-parsers.js';
import { progressToTerminal } from './analysis-options.js';
import { loadResolved, seedOption, trialsOption, workersOption } from './spread.js';
import { VERSION } from './version.js';
import { checkYieldGate, failUnderYieldOption, FAIL_UNDER_YIELD_HELP } from './yield-gate.js';

// ---- command ---------------------------------------------------------------------------------------------------

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
  process.stdout.write(options.json ? stringifyReport(gradesJson(result, VERSION)) : renderGradesText(result, { subject: file, version: VERSION }));
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

${wrapText(SEARCH_METHOD, 112)}

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
