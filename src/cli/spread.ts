// `trimfree spread FILE`: how far production units of a design will spread. Loads and resolves the design file
// (filling "auto" values the same way `design` does), runs the spread study (src/design/spread-study.ts: worst
// case, RSS, Monte Carlo) and prints its terminal report or JSON (src/report/spread-run-*.ts); optionally writes
// the samples as CSV and the HTML review report (src/cli/spread-files.ts).
import { Command, Option } from 'commander';
import { analysisChoice } from '../design/analysis-choice.js';
import { loadDesignFile } from '../design/load.js';
import { resolveDesign } from '../design/resolve.js';
import { DEFAULT_SPREAD_TRIALS, runSpread, spreadYields } from '../design/spread-study.js';
import { stringifyReport } from '../report/json.js';
import { spreadReportJson } from '../report/spread-run-json.js';
import { renderSpreadRunText } from '../report/spread-run-text.js';
import { commandLineAnalysis, progressToTerminal, kernelFlag, seedFlag, trialsFlag, workersFlag, conditionFlag, lotsFlag, type AnalysisCliOptions } from './analysis-options.js';
import { colourWanted } from './colour.js';
import { integerOption } from './option-parsers.js';
import { startWork } from './work-budget.js';
import { checkSpreadFiles, noteSampleRows, DEFAULT_SAMPLE_ROWS, MAX_SAMPLE_ROWS, reportFileFlag, writeSpreadFiles, type SpreadFiles } from './spread-files.js';
import { targetYieldFlag } from './target-yield.js';
import { VERSION } from './version.js';
import { checkYieldGate, failUnderYieldOptionWith } from './yield-gate.js';

interface SpreadCliOptions extends AnalysisCliOptions {
  json?: boolean;
  samples?: string;
  sampleRows?: number;
  report?: string;
  force?: boolean;
  failUnderYield?: number;
  targetYield: number;
}

async function run(file: string, options: SpreadCliOptions, command: Command): Promise<void> {
  const files: SpreadFiles = { force: options.force ?? false, subject: file, command: `trimfree spread ${process.argv.slice(3).join(' ')}`.trim(), targetYieldPct: options.targetYield };
  if (options.samples !== undefined) files.samples = options.samples;
  if (options.report !== undefined) files.report = options.report;
  if (options.sampleRows !== undefined) files.sampleRows = options.sampleRows;
  checkSpreadFiles(files);
  const resolved = resolveDesign(loadDesignFile(file));
  const choice = analysisChoice(resolved, commandLineAnalysis(options), DEFAULT_SPREAD_TRIALS);
  const estimate = startWork(resolved, { spread: choice });
  const study = await runSpread(resolved, choice, progressToTerminal);
  if (files.samples !== undefined && command.getOptionValueSource('sampleRows') === 'cli') noteSampleRows(study, files.sampleRows ?? DEFAULT_SAMPLE_ROWS);
  const written = await writeSpreadFiles(study, files);
  process.stdout.write(options.json ? stringifyReport({ ...spreadReportJson(study, VERSION), workEstimate: estimate }) : renderSpreadRunText(study, { subject: file, version: VERSION, targetYieldPct: options.targetYield, colour: colourWanted(process.stdout) }));
  for (const path of written) process.stderr.write(`wrote ${path}\n`);
  checkYieldGate(options.failUnderYield, spreadYields(study));
}

export function spreadCommand(): Command {
  return new Command('spread')
    .description('worst case, RSS and Monte Carlo spread of a design file: yield, Cpk, contributors, histogram')
    .configureOutput({ outputError: () => undefined })
    .argument('<file>', 'design file (JSON); "auto" values are filled as `design` does')
    .option('--json', 'print JSON: { seed, trials, version, allSpecsYieldPct, ambientGridC, outputs: { NAME: { nominal, mean, median, sigma, interval95, worstCase, rss, yieldPct, yieldAtRandomAmbientPct, cpk, ambientSweep, contributions, … } } }')
    .addOption(new Option('--samples <file.csv>', 'write the Monte Carlo trials (parts and outputs, SI units) as CSV'))
    .addOption(new Option('--sample-rows <n>', `trials written to the samples CSV: 1 to ${MAX_SAMPLE_ROWS}, no more than the run's trials (about 0.5 kB a row)`).argParser(integerOption('--sample-rows', 1, MAX_SAMPLE_ROWS)).default(DEFAULT_SAMPLE_ROWS, '100000'))
    .addOption(reportFileFlag())
    .option('--force', 'overwrite existing output files', false)
    .addOption(seedFlag())
    .addOption(trialsFlag("Monte Carlo trials, or auto (JCGM 101:2008 7.9) (default: the file's, else auto)"))
    .addOption(workersFlag())
    .addOption(conditionFlag())
    .addOption(lotsFlag())
    .addOption(kernelFlag())
    .addOption(failUnderYieldOptionWith())
    .addOption(targetYieldFlag('yield each output must reach to read "pass" in the summary (the exit code is set by --fail-under-yield only)'))
    .addHelpText(
      'after',
      `
Monte Carlo per JCGM 101:2008 (same seed, same numbers for any worker count); worst case over every tolerance
extreme and temperature corner; RSS by JCGM 100:2008 5.1.2, first order.
What each figure means:
  yield per unit          share of units (a trial = one unit, parts drawn once) inside the window at every ambient
                          checked (the range's ends, points between and 25 °C), with a 95 % Wilson interval
  all specs               share of units inside every window at every ambient; what --fail-under-yield gates too
  yield at random ambient a second figure: a unit at one ambient drawn uniformly over the range
  ppm out                 units out of the window at some ambient, per million
  Cp, Cpk                 NIST/SEMATECH e-Handbook 6.1.6, from the units at the worst ambient; they assume normality
  mean, σ, intervals      over the trials at the ambient drawn with each (the histogram shows the same values)

Exit codes: 0 done; 1 an output's per-unit yield is below --fail-under-yield (the report is printed in full first, then one
line naming each such output and its yield); 2 bad input or an impossible design (one line on stderr); 130 Ctrl-C.

Contributors are ranked by total-effect share of the variance (the part alone and through its interactions, e.g. a
TCR with the ambient; Jansen 1999), shown with the first-order share (Saltelli et al. 2010) and the first-order (RSS)
share; total-effect shares sum past 100 % by what interactions add. RSS gives u(y) and U = 2·u(y) (JCGM 100 6.2.1).

Examples:
  $ trimfree spread examples/charger-2s-liion.json
  $ trimfree spread examples/charger-2s-liion.json --trials 1000000 --seed 7 --json
  $ trimfree spread examples/led-driver-highside.json --report led.html --samples led.csv --force
  $ trimfree spread examples/charger-2s-liion.json --fail-under-yield 99.5%
  $ trimfree spread examples/charger-2s-liion.json --condition end-of-life
  $ trimfree spread examples/led-driver-highside.json --lots 20`,
    )
    .action((file: string, options: SpreadCliOptions, command: Command) => run(file, options, command));
}
