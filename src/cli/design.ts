// `trimfree design FILE`: the everyday flow. Loads the design file, fills every "auto" value with the pickers,
// prints the BOM, runs the spread (worst case, RSS, Monte Carlo) and the grade comparison, and writes the HTML
// report when asked. Thin: src/design resolves, src/analysis computes, src/report renders (through the `spread`
// and `grades` commands' exported pieces, so the three commands agree).
import { Command, Option } from 'commander';
import { loadDesignFile } from '../design/load.js';
import { InputError } from '../errors.js';
import { resolveDesign } from '../design/resolve.js';
import { stringifyReport } from '../report/json.js';
import { parsePercent } from '../units/index.js';
import { analysisChoice, type CommandLineAnalysis } from '../design/analysis-choice.js';
import { DEFAULT_GRADES_TRIALS, DEFAULT_SEARCH_TRIALS, DEFAULT_TARGET_YIELD_PCT, runGrades } from '../design/grade-study.js';
import { runSpread, spreadYields } from '../design/spread-study.js';
import { progressToTerminal } from './analysis-options.js';
import { refuseUnreachableTarget } from './grades.js';
import { designReportJson, renderDesignText } from '../report/design-report.js';
import { gradesReportTables } from '../report/grades-tables.js';
import { VERSION } from './version.js';
import { integerOption } from './option-parsers.js';
import {
  checkOutputPaths,
  refuseExisting,
  seedOption,
  trialsOption,
  workersOption,
  writeSpreadFiles,
  type SpreadFiles,
} from './spread.js';
import { checkYieldGate, failUnderYieldOption, FAIL_UNDER_YIELD_HELP } from './yield-gate.js';

/** Monte Carlo trials for `design` when neither the file nor the command line says: adaptive (JCGM 101:2008 7.9). */
export const DEFAULT_DESIGN_TRIALS = 'auto' as const;

interface DesignCliOptions {
  json?: boolean;
  grades: boolean;
  targetYield: number;
  searchTrials: number;
  report?: string;
  force?: boolean;
  seed?: number;
  trials?: number | 'auto';
  workers?: number;
  failUnderYield?: number;
}

/** A yield target from "99.9%" or "99.9" (percent), strictly between 50 % and 100 %. */
function targetYieldOption(value: string): number {
  const fraction = parsePercent(value, '--target-yield');
  if (!(fraction >= 0.5 && fraction < 1)) throw new InputError('--target-yield', `${value} is out of range`, 'a yield from 50 % up to but not including 100 %, e.g. 99.9%');
  return fraction * 100;
}

async function run(file: string, options: DesignCliOptions, command: Command): Promise<void> {
  const force = options.force ?? false;
  refuseExisting(options.report, '--report', force);
  const files: SpreadFiles = { force, subject: file, command: `trimfree design ${process.argv.slice(3).join(' ')}`.trim() };
  if (options.report !== undefined) files.report = options.report;
  checkOutputPaths(files);

  const resolved = resolveDesign(loadDesignFile(file));
  const cli: CommandLineAnalysis = {};
  if (options.trials !== undefined) cli.trials = options.trials;
  if (options.seed !== undefined) cli.seed = options.seed;
  if (options.workers !== undefined) cli.workers = options.workers;
  const spread = await runSpread(resolved, analysisChoice(resolved, cli, DEFAULT_DESIGN_TRIALS), progressToTerminal);
  const grades = options.grades
    ? await runGrades(resolved, analysisChoice(resolved, cli, DEFAULT_GRADES_TRIALS), { targetYieldPct: options.targetYield, searchTrials: options.searchTrials }, progressToTerminal)
    : undefined;
  if (grades) refuseUnreachableTarget(grades, command.getOptionValueSource('targetYield') === 'cli');
  if (grades) files.tables = gradesReportTables(grades);
  const written = writeSpreadFiles(spread, files);

  process.stdout.write(options.json ? stringifyReport(designReportJson(spread, grades, VERSION)) : renderDesignText(spread, grades, { subject: file, version: VERSION }));
  for (const path of written) process.stderr.write(`wrote ${path}\n`);
  checkYieldGate(options.failUnderYield, spreadYields(spread));
}

export function designCommand(): Command {
  return new Command('design')
    .description('fill "auto" values with the pickers, then BOM, spread and grade comparison, and the HTML report')
    .configureOutput({ outputError: () => undefined })
    .argument('<file>', 'design file (JSON); `trimfree init` writes a starter')
    .option('--json', 'print JSON: { bom: [{ designator, ohms, code, series, tolerance, tcrPerK, powerW, ratingW? }], spread: { seed, trials, outputs, … }, grades: { … } | null }')
    .addOption(new Option('--report <file.html>', 'write the HTML review report (one self-contained file)'))
    .option('--force', 'overwrite an existing report file', false)
    .option('--no-grades', 'skip the grade comparison and the cheapest-grade search')
    .addOption(new Option('--target-yield <pct>', 'share of units the cheapest grade mix must bring inside every spec window').argParser(targetYieldOption).default(DEFAULT_TARGET_YIELD_PCT, '99.9 %'))
    .addOption(new Option('--search-trials <n>', 'Monte Carlo trials per grade assignment the search evaluates').argParser(integerOption('--search-trials', 1000, 10_000_000)).default(DEFAULT_SEARCH_TRIALS, '20000'))
    .addOption(new Option('--seed <n>', "random seed (default: the file's, else 1)").argParser(seedOption('--seed')))
    .addOption(new Option('--trials <n|auto>', "Monte Carlo trials, or auto (JCGM 101:2008 7.9) (default: the file's, else auto)").argParser(trialsOption('--trials')))
    .addOption(new Option('--workers <n>', "worker threads; results do not depend on it (default: the file's, else every core)").argParser(workersOption('--workers')))
    .addOption(new Option('--fail-under-yield <pct>', FAIL_UNDER_YIELD_HELP).argParser(failUnderYieldOption))
    .addHelpText(
      'after',
      `
"auto" values are picked as \`divider\` and \`sense\` pick them (their best candidate); the BOM gives the power each
part handles at the operating point. The spread is the same as \`spread\` gives for the filled-in design.

Exit codes: 0 done; 1 an output's yield (the spread's, per spec window) is below --fail-under-yield, after the full
report; 2 bad input or an impossible design (one line on stderr); 130 Ctrl-C.

Examples:
  $ trimfree design examples/charger-2s-liion.json
  $ trimfree design examples/led-driver-highside.json --report led.html --force
  $ trimfree design examples/bench-adjustable.json --json --trials 100000 --seed 7
  $ trimfree design examples/charger-2s-liion.json --fail-under-yield 99.5%`,
    )
    .action((file: string, options: DesignCliOptions, command: Command) => run(file, options, command));
}
