// `trimfree pilot DESIGN CSV`: a pilot build's measured units against the design's prediction. Loads and resolves
// the design as `spread` does, reads the measurements (src/pilot/measurements.ts), checks the report file before any
// work, runs the pilot study (src/pilot/study.ts) and prints its terminal report or JSON; optionally writes the HTML
// report. Nothing is written when any input is wrong.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { Command } from 'commander';
import { buildSupplyModel } from '../analysis/models/supply.js';
import { analysisChoice } from '../design/analysis-choice.js';
import { parseDesignText } from '../design/load.js';
import { resolveDesign } from '../design/resolve.js';
import { InputError } from '../errors.js';
import { DEFAULT_PILOT_TRIALS } from '../pilot/defaults.js';
import { stringifyReport } from '../report/json.js';
import type { PilotProvenance } from '../report/pilot-figures.js';
import { commandLineAnalysis, progressToTerminal, seedFlag, trialsFlag, workersFlag, type AnalysisCliOptions } from './analysis-options.js';
import { writeOutputFile } from './output-file.js';
import { checkSpreadFiles, reportFileFlag } from './spread-files.js';
import { targetYieldFlag } from './target-yield.js';
import { VERSION } from './version.js';

interface PilotCliOptions extends AnalysisCliOptions {
  json?: boolean;
  report?: string;
  force?: boolean;
  targetYield: number;
}

/** The bytes of an input file, or one line saying why it cannot be read. */
function readInput(path: string, what: string): Buffer {
  try {
    return readFileSync(path);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code ?? 'unreadable';
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, not a file' : `cannot read it (${code})`;
    throw new InputError(path, reason, what);
  }
}

const sha256 = (bytes: Buffer): string => createHash('sha256').update(bytes).digest('hex');

async function run(designFile: string, csvFile: string, options: PilotCliOptions): Promise<void> {
  // The study, its statistics, the CSV reader and the renderers load only when this command runs (about 0.1 s that
  // every other command would otherwise pay at start-up).
  const [{ readPilotCsv }, { runPilot }, { renderPilotHtml }, { pilotJson }, { renderPilotText }] = await Promise.all([
    import('../pilot/measurements.js'),
    import('../pilot/study.js'),
    import('../report/pilot-html.js'),
    import('../report/pilot-json.js'),
    import('../report/pilot-text.js'),
  ]);
  const force = options.force ?? false;
  if (options.report !== undefined) checkSpreadFiles({ report: options.report, force, subject: designFile });
  const designBytes = readInput(designFile, 'the path of a design file (JSON); `trimfree init` writes a starter');
  const csvBytes = readInput(csvFile, 'the path of a CSV of measured units (one row per unit)');
  const design = parseDesignText(designBytes.toString('utf8'), designFile);
  const resolved = resolveDesign(design);
  const measurements = readPilotCsv(csvBytes.toString('utf8'), csvFile, buildSupplyModel(resolved.spec).outputs);
  const choice = analysisChoice(resolved, commandLineAnalysis(options), DEFAULT_PILOT_TRIALS);
  const study = await runPilot(design, resolved, measurements, choice, { targetYieldPct: options.targetYield }, progressToTerminal);
  const provenance: PilotProvenance = {
    version: VERSION,
    designFile: { path: designFile, sha256: sha256(designBytes) },
    measurementsFile: { path: csvFile, sha256: sha256(csvBytes) },
    command: `trimfree pilot ${process.argv.slice(3).join(' ')}`.trim(),
  };
  const dated: PilotProvenance = { ...provenance, date: new Date().toISOString() };
  if (options.report !== undefined) writeOutputFile(options.report, renderPilotHtml(study, dated), { force, where: '--report' });
  process.stdout.write(options.json ? stringifyReport(pilotJson(study, dated)) : renderPilotText(study, provenance));
  if (options.report !== undefined) process.stderr.write(`wrote ${options.report}\n`);
}

export function pilotCommand(): Command {
  return new Command('pilot')
    .description("a pilot build's measured units against the design's prediction: tests, capability, diagnosis, one-resistor re-centring")
    .configureOutput({ outputError: () => undefined })
    .argument('<design.json>', 'design file (JSON); "auto" values are filled as `design` does')
    .argument('<measured.csv>', "CSV, one row per unit: columns named after the outputs (vout, ilimit, …), optional unit and ambient (°C); '#' starts a comment line")
    .option('--json', 'print JSON: { files: { design, measurements: { path, sha256 } }, outputs: { NAME: { measured, predicted, tests, capability, diagnosis, recentre, … } } }')
    .addOption(reportFileFlag())
    .option('--force', 'overwrite an existing report file', false)
    .addOption(targetYieldFlag('yield the measured capability is judged against'))
    .addOption(seedFlag())
    .addOption(trialsFlag(`Monte Carlo trials of the prediction, or auto (default: the file's, else ${DEFAULT_PILOT_TRIALS})`))
    .addOption(workersFlag())
    .addHelpText(
      'after',
      `
The prediction is the design's model with the ambient held at the mean of the CSV's ambient column (without
one: the design's temperature.fixed, else 25 °C). Tests at α = 0.05: one-sample t test of the mean, chi-square test of σ allowing for the predicted kurtosis,
Anderson–Darling against the Monte Carlo distribution, Grubbs' test for one outlier. Capability: Cpk with Bissell's
interval, a 99 % / 95 % normal tolerance interval (Howe's k, NIST/SEMATECH e-Handbook 7.2.6.3) and the yield the
units support. Where the mean is off-centre, the single divider or gain resistor swap that best re-centres it.

Exit codes: 0 done; 2 bad input (one line on stderr naming the file, line and column; nothing written); 130 Ctrl-C.

Examples:
  $ trimfree pilot examples/charger-2s-liion.json examples/pilot-charger.csv
  $ trimfree pilot examples/charger-2s-liion.json examples/pilot-charger.csv --json
  $ trimfree pilot examples/charger-2s-liion.json examples/pilot-charger.csv --report pilot.html --force`,
    )
    .action((designFile: string, csvFile: string, options: PilotCliOptions) => run(designFile, csvFile, options));
}
