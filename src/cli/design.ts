// `trimfree design FILE`: the everyday flow. Loads the design file, fills every "auto" value with the pickers,
// runs the spread study and (unless --no-grades) the grade study (src/design/spread-study.ts, grade-study.ts: the
// same ones `spread` and `grades` run, so the three commands agree), prints the BOM and both reports
// (src/report/design-report.ts), and writes the HTML report when asked (src/cli/spread-files.ts).
import { Command, Option } from 'commander';
import { analysisChoice } from '../design/analysis-choice.js';
import { loadChipSizes } from '../design/chip-sizes.js';
import { purchaseBom } from '../design/purchase-bom.js';
import { renderBomCsv } from '../report/bom-csv.js';
import { InputError } from '../errors.js';
import { allowedGrades, DEFAULT_GRADES_TRIALS, runGrades } from '../design/grade-study.js';
import type { GradeName } from '../design/grades.js';
import { gradesFlag } from './grades.js';
import { loadDesignFile } from '../design/load.js';
import { resolveDesign } from '../design/resolve.js';
import { DEFAULT_SPREAD_TRIALS, runSpread, spreadYields } from '../design/spread-study.js';
import { designReportJson, renderDesignText } from '../report/design-report.js';
import { gradesReportTables } from '../report/grades-tables.js';
import { stringifyReport } from '../report/json.js';
import { commandLineAnalysis, progressToTerminal, kernelFlag, seedFlag, trialsFlag, workersFlag, conditionFlag, type AnalysisCliOptions } from './analysis-options.js';
import { colourWanted } from './colour.js';
import { checkOutputTarget, sameOutputFile, writeOutputFile } from './output-file.js';
import { checkSpreadFiles, reportFileFlag, writeSpreadFiles, type SpreadFiles } from './spread-files.js';
import { refuseUnreachableTarget, searchTrialsFlag, targetYieldFlag } from './target-yield.js';
import { VERSION } from './version.js';
import { startWork } from './work-budget.js';
import { checkYieldGate, failUnderYieldOptionWith } from './yield-gate.js';

interface DesignCliOptions extends AnalysisCliOptions {
  json?: boolean;
  /** false with --no-grades; the allowed grades with --grades; undefined otherwise. */
  grades?: GradeName[] | false;
  targetYield: number;
  searchTrials: number;
  report?: string;
  bom?: string;
  chipSizes?: string;
  force?: boolean;
  failUnderYield?: number;
}

async function run(file: string, options: DesignCliOptions, command: Command): Promise<void> {
  const files: SpreadFiles = { force: options.force ?? false, subject: file, command: `trimfree design ${process.argv.slice(3).join(' ')}`.trim(), targetYieldPct: options.targetYield };
  if (options.report !== undefined) files.report = options.report;
  checkSpreadFiles(files);
  if (options.bom !== undefined) {
    checkOutputTarget(options.bom, { force: files.force, where: '--bom' });
    if (options.report !== undefined && sameOutputFile(options.bom, options.report)) throw new InputError('--bom', 'the same file as --report', 'two different files');
  }
  const chips = options.chipSizes !== undefined ? loadChipSizes(options.chipSizes, '--chip-sizes') : loadChipSizes();
  const resolved = resolveDesign(loadDesignFile(file));
  const cli = commandLineAnalysis(options);
  // The spread as `spread` runs it (same default trial count), then the grade study as `grades` runs it.
  const spreadChoice = analysisChoice(resolved, cli, DEFAULT_SPREAD_TRIALS);
  const gradesChoice = analysisChoice(resolved, cli, DEFAULT_GRADES_TRIALS);
  const wantGrades = options.grades !== false;
  const allowed = options.grades ? { grades: options.grades } : {};
  const estimate = startWork(resolved, wantGrades ? { spread: spreadChoice, grades: { choice: gradesChoice, searchTrials: options.searchTrials, gradeCount: allowedGrades(resolved, allowed).length } } : { spread: spreadChoice });
  const spread = await runSpread(resolved, spreadChoice, progressToTerminal);
  const grades = wantGrades
    ? await runGrades(resolved, gradesChoice, { targetYieldPct: options.targetYield, searchTrials: options.searchTrials, ...allowed }, progressToTerminal)
    : undefined;
  if (grades) {
    refuseUnreachableTarget(grades, command);
    files.tables = gradesReportTables(grades);
  }
  const bom = purchaseBom(resolved.bom, spread.result, chips);
  const written = await writeSpreadFiles(spread, files);
  if (options.bom !== undefined) {
    writeOutputFile(options.bom, renderBomCsv(bom), { force: files.force, where: '--bom' });
    written.push(options.bom);
  }
  process.stdout.write(options.json ? stringifyReport({ ...(designReportJson(spread, grades, VERSION, bom) as object), workEstimate: estimate }) : renderDesignText(spread, grades, { subject: file, version: VERSION, targetYieldPct: options.targetYield, colour: colourWanted(process.stdout) }));
  for (const path of written) process.stderr.write(`wrote ${path}\n`);
  checkYieldGate(options.failUnderYield, spreadYields(spread));
}

export function designCommand(): Command {
  return new Command('design')
    .description('fill "auto" values with the pickers, then BOM, spread and grade comparison, and the HTML report')
    .configureOutput({ outputError: () => undefined })
    .argument('<file>', 'design file (JSON); `trimfree init` writes a starter')
    .option('--json', 'print JSON: { bom: [{ designator, members, ohms, code, series, tolerance, toleranceLetter, tcrPerK, powerW, powerWorstCaseW, voltageWorstCaseV, chipSize, … }], spread: { seed, trials, outputs, … }, grades: { … } | null }')
    .addOption(reportFileFlag())
    .addOption(new Option('--bom <file.csv>', 'write the bill of materials as CSV (RFC 4180, SI units) for a purchasing import'))
    .addOption(new Option('--chip-sizes <file.json>', 'chip-size table the BOM picks sizes from (default: series/chip-sizes.json, common practice)'))
    .option('--force', 'overwrite existing output files', false)
    .addOption(gradesFlag())
    .option('--no-grades', 'skip the grade comparison and the cheapest-grade search')
    .addOption(targetYieldFlag('share of units the cheapest grade mix must bring inside every spec window, and each output\'s yield must reach to read "pass" in the summary'))
    .addOption(searchTrialsFlag('Monte Carlo trials per grade assignment the search evaluates'))
    .addOption(seedFlag())
    .addOption(trialsFlag("Monte Carlo trials, or auto (JCGM 101:2008 7.9) (default: the file's, else auto)"))
    .addOption(workersFlag())
    .addOption(conditionFlag())
    .addOption(kernelFlag())
    .addOption(failUnderYieldOptionWith())
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
  $ trimfree design examples/charger-2s-liion.json --bom charger-bom.csv
  $ trimfree design examples/bench-adjustable.json --json --trials 100000 --seed 7
  $ trimfree design examples/charger-2s-liion.json --fail-under-yield 99.5%`,
    )
    .action((file: string, options: DesignCliOptions, command: Command) => run(file, options, command));
}
