// `trimfree spread FILE`: how far production units of a design will spread. Loads and resolves the design file
// (filling "auto" values the same way `design` does), runs the analysis (worst case, RSS, Monte Carlo) and prints
// the terminal report, or JSON; optionally writes the samples as CSV and the HTML review report.
// Thin: the engine (src/analysis) computes, src/report renders; this module wires options to them. Exports the
// pieces `design` reuses: runSpread, spreadReportJson, renderSpreadRunText, renderSpreadRunHtml, writeSpreadFiles.
import { existsSync, statSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { Command, Option } from 'commander';
import { analysisChoice, type CommandLineAnalysis } from '../design/analysis-choice.js';
import { loadDesignFile } from '../design/load.js';
import { resolveDesign, type ResolvedDesign } from '../design/resolve.js';
import { spreadSamples } from '../design/spread-samples.js';
import { DEFAULT_SPREAD_TRIALS, runSpread, spreadYields, type SpreadRun } from '../design/spread-study.js';
import { InputError } from '../errors.js';
import type { ReportTable } from '../report/html-report.js';
import { stringifyReport } from '../report/json.js';
import { renderSamplesCsv } from '../report/samples-csv.js';
import { spreadReportJson } from '../report/spread-run-json.js';
import { renderSpreadRunHtml } from '../report/spread-run-html.js';
import { renderSpreadRunText } from '../report/spread-run-text.js';
import { integerOption } from './option-parsers.js';
import { writeOutputFile } from './output-file.js';
import { progressToTerminal } from './analysis-options.js';
import { checkYieldGate, failUnderYieldOption, FAIL_UNDER_YIELD_HELP } from './yield-gate.js';
import { VERSION } from './version.js';

/** Rows written to the samples CSV unless --sample-rows says otherwise (about 40 MB for a typical design). */
export const DEFAULT_SAMPLE_ROWS = 100_000;
/** Most rows the samples CSV takes. The CSV is built as one string: 400–700 bytes a row for the examples (up to
 * about 1 kB for the widest design), and a JavaScript string holds at most about 536 million characters; 250 000 rows
 * stay well inside that (about 175 MB of text and 1.5 GB of memory for the widest example). More rows were a crash
 * ("Invalid string length") after minutes of work. */
export const MAX_SAMPLE_ROWS = 250_000;
/** Largest seed a design file accepts; the command line takes the same range. */
const MAX_SEED = 2 ** 32 - 1;

export interface SpreadFiles {
  samples?: string;
  sampleRows?: number;
  report?: string;
  force: boolean;
  subject: string;
  command?: string;
  /** Further tables for the HTML report (e.g. `design` adds the grade comparison: see gradesReportTables). */
  tables?: ReportTable[];
}

/** Writes the CSV and HTML files asked for; refuses to overwrite without force (before any analysis runs). */
export function checkOutputPaths(files: SpreadFiles): void {
  if (files.samples !== undefined && files.report !== undefined && files.samples === files.report) {
    throw new InputError('--report', 'the same file as --samples', 'two different file names');
  }
}

export function writeSpreadFiles(run: SpreadRun, files: SpreadFiles): string[] {
  const written: string[] = [];
  if (files.samples !== undefined) {
    writeOutputFile(files.samples, renderSamplesCsv(spreadSamples(run, files.sampleRows ?? DEFAULT_SAMPLE_ROWS)), { force: files.force, where: '--samples' });
    written.push(files.samples);
  }
  if (files.report !== undefined) {
    const html: Parameters<typeof renderSpreadRunHtml>[1] = { subject: files.subject, version: VERSION };
    if (files.command !== undefined) html.command = files.command;
    if (files.tables !== undefined) html.tables = files.tables;
    writeOutputFile(files.report, renderSpreadRunHtml(run, html), { force: files.force, where: '--report' });
    written.push(files.report);
  }
  return written;
}

/** Loads and resolves a design file (shared with `grades`). */
export function loadResolved(path: string): ResolvedDesign {
  return resolveDesign(loadDesignFile(path));
}

// ---- command-line options ------------------------------------------------------------------------------------

/** Most Monte Carlo trials a run accepts: at the engine's ~10 million trials per second (npm run bench) this is about
 * a quarter of an hour on two cores; more could not finish in any sensible time. */
export const MAX_RUN_TRIALS = 1e10;
const MIN_RUN_TRIALS = 100;

export function trialsOption(name: string): (value: string) => number | 'auto' {
  const accepted = `a whole number from ${MIN_RUN_TRIALS} to 1e10 (10000000000), e.g. 200000 or 1e6, or auto (adaptive, JCGM 101:2008 7.9)`;
  return (value: string) => {
    const text = value.trim();
    if (text === 'auto') return 'auto';
    // Digits, or a whole number in e-notation such as 1e6 or 2.5e7.
    if (!/^(\d+|\d+(\.\d+)?[eE]\+?\d+)$/.test(text)) {
      const bad = /[^0-9]/.exec(text);
      const problem = text === '' ? 'empty trial count' : bad ? `'${text}' is not a trial count (unexpected '${bad[0]}' at position ${bad.index + 1})` : `'${text}' is not a trial count`;
      throw new InputError(name, problem, accepted);
    }
    const n = Number(text);
    if (!Number.isInteger(n)) throw new InputError(name, `'${text}' is not a whole number of trials`, accepted);
    if (n > MAX_RUN_TRIALS) {
      throw new InputError(name, `'${text}' trials could not finish in any sensible time (1e10 already takes about a quarter of an hour); refused before any work`, `${accepted}; past about 1e7 trials the figures change little: compare two seeds instead`);
    }
    if (n < MIN_RUN_TRIALS) throw new InputError(name, `${text} is out of range (too few trials for a spread)`, accepted);
    return n;
  };
}

export const seedOption = (name: string): ((value: string) => number) => integerOption(name, 0, MAX_SEED);
export const workersOption = (name: string): ((value: string) => number) => integerOption(name, 1, 256);

/** Refuses existing output files before the (possibly long) run, so nothing is computed for nothing. */
export function refuseExisting(path: string | undefined, where: string, force: boolean): void {
  if (path === undefined) return;
  const folder = dirname(resolve(path));
  if (!existsSync(folder) || !statSync(folder).isDirectory()) {
    throw new InputError(where, `the folder ${folder} does not exist`, 'a file path in an existing folder');
  }
  if (existsSync(path) && statSync(path).isDirectory()) throw new InputError(where, `${path} is a folder, not a file`, 'a file path');
  if (force) return;
  // writeOutputFile checks again when it writes; this early check only saves a wasted run.
  if (existsSync(path)) throw new InputError(where, `${path} already exists and would be overwritten`, 'a new file name, or --force to replace it');
}

interface SpreadCliOptions {
  json?: boolean;
  samples?: string;
  sampleRows?: number;
  report?: string;
  force?: boolean;
  seed?: number;
  trials?: number | 'auto';
  workers?: number;
  failUnderYield?: number;
}

async function run(file: string, options: SpreadCliOptions): Promise<void> {
  const force = options.force ?? false;
  refuseExisting(options.samples, '--samples', force);
  refuseExisting(options.report, '--report', force);
  const files: SpreadFiles = { force, subject: file, command: `trimfree spread ${process.argv.slice(3).join(' ')}`.trim() };
  if (options.samples !== undefined) files.samples = options.samples;
  if (options.report !== undefined) files.report = options.report;
  if (options.sampleRows !== undefined) files.sampleRows = options.sampleRows;
  checkOutputPaths(files);
  const resolved = loadResolved(file);
  const cli: CommandLineAnalysis = {};
  if (options.trials !== undefined) cli.trials = options.trials;
  if (options.seed !== undefined) cli.seed = options.seed;
  if (options.workers !== undefined) cli.workers = options.workers;
  const result = await runSpread(resolved, analysisChoice(resolved, cli, DEFAULT_SPREAD_TRIALS), progressToTerminal);
  const written = writeSpreadFiles(result, files);
  if (options.json) {
    process.stdout.write(stringifyReport(spreadReportJson(result, VERSION)));
  } else {
    process.stdout.write(renderSpreadRunText(result, { subject: file, version: VERSION }));
  }
  for (const path of written) process.stderr.write(`wrote ${path}\n`);
  checkYieldGate(options.failUnderYield, spreadYields(result));
}

export function spreadCommand(): Command {
  return new Command('spread')
    .description('worst case, RSS and Monte Carlo spread of a design file: yield, Cpk, contributors, histogram')
    .configureOutput({ outputError: () => undefined })
    .argument('<file>', 'design file (JSON); "auto" values are filled as `design` does')
    .option('--json', 'print JSON: { seed, trials, version, outputs: { NAME: { nominal, mean, sigma, interval95, worstCase, rss, yieldPct, cpk, contributions, … } } }')
    .addOption(new Option('--samples <file.csv>', 'write the Monte Carlo trials (parts and outputs, SI units) as CSV'))
    .addOption(new Option('--sample-rows <n>', 'trials written to the samples CSV').argParser(integerOption('--sample-rows', 1, MAX_SAMPLE_ROWS)).default(DEFAULT_SAMPLE_ROWS, '100000'))
    .addOption(new Option('--report <file.html>', 'write the HTML review report (one self-contained file)'))
    .option('--force', 'overwrite existing output files', false)
    .addOption(new Option('--seed <n>', 'random seed (default: the file\'s, else 1)').argParser(seedOption('--seed')))
    .addOption(new Option('--trials <n|auto>', 'Monte Carlo trials, or auto (JCGM 101:2008 7.9) (default: the file\'s, else auto)').argParser(trialsOption('--trials')))
    .addOption(new Option('--workers <n>', 'worker threads; results do not depend on it (default: the file\'s, else every core)').argParser(workersOption('--workers')))
    .addOption(new Option('--fail-under-yield <pct>', FAIL_UNDER_YIELD_HELP).argParser(failUnderYieldOption))
    .addHelpText(
      'after',
      `
Monte Carlo per JCGM 101:2008 (same seed, same numbers for any worker count); worst case over every tolerance
extreme and temperature corner; RSS by JCGM 100:2008 5.1.2. Yield counts the trials inside each output's spec
window, with a 95 % Wilson interval; Cp and Cpk per NIST/SEMATECH e-Handbook 6.1.6.

Exit codes: 0 done; 1 an output's yield is below --fail-under-yield (the report is printed in full first, then one
line naming each such output and its yield); 2 bad input or an impossible design (one line on stderr); 130 Ctrl-C.

Examples:
  $ trimfree spread examples/charger-2s-liion.json
  $ trimfree spread examples/charger-2s-liion.json --trials 1000000 --seed 7 --json
  $ trimfree spread examples/led-driver-highside.json --report led.html --samples led.csv --force
  $ trimfree spread examples/charger-2s-liion.json --fail-under-yield 99.5%`,
    )
    .action((file: string, options: SpreadCliOptions) => run(file, options));
}
