// `trimfree grades FILE`: the design's resistors ordered in each tolerance grade side by side (spread, yield, Cpk
// for each output with a spec window, and the yield of a unit that must meet every window at once), then the
// cheapest per-part grade assignment that reaches --target-yield, and the single upgrade that buys the most yield
// per unit cost. The grade study (src/design/grade-study.ts) computes and searches; src/report/grades-*.ts render.
import { Command, Option } from 'commander';
import { analysisChoice } from '../design/analysis-choice.js';
import { allowedGrades, DEFAULT_GRADES_TRIALS, gradesYields, runGrades } from '../design/grade-study.js';
import { parseGradeList, type GradeName } from '../design/grades.js';
import { loadDesignFile } from '../design/load.js';
import { resolveDesign } from '../design/resolve.js';
import { gradesJson } from '../report/grades-json.js';
import { SEARCH_METHOD } from '../report/grades-notes.js';
import { renderGradesText } from '../report/grades-text.js';
import { stringifyReport } from '../report/json.js';
import { wrapText } from '../report/wrap-text.js';
import { commandLineAnalysis, progressToTerminal, kernelFlag, seedFlag, trialsFlag, workersFlag, conditionFlag, type AnalysisCliOptions } from './analysis-options.js';
import { refuseUnreachableTarget, searchTrialsFlag, targetYieldFlag } from './target-yield.js';
import { VERSION } from './version.js';
import { startWork } from './work-budget.js';
import { checkYieldGate, failUnderYieldOptionWith, FAIL_UNDER_YIELD_HELP } from './yield-gate.js';

interface GradesCliOptions extends AnalysisCliOptions {
  json?: boolean;
  targetYield: number;
  searchTrials: number;
  failUnderYield?: number;
  grades?: GradeName[];
}

async function run(file: string, options: GradesCliOptions, command: Command): Promise<void> {
  const resolved = resolveDesign(loadDesignFile(file));
  const choice = analysisChoice(resolved, commandLineAnalysis(options), DEFAULT_GRADES_TRIALS);
  const estimate = startWork(resolved, { grades: { choice, searchTrials: options.searchTrials, gradeCount: allowedGrades(resolved, gradesChoice(options)).length } });
  const study = await runGrades(resolved, choice, { targetYieldPct: options.targetYield, searchTrials: options.searchTrials, ...gradesChoice(options) }, progressToTerminal);
  refuseUnreachableTarget(study, command);
  process.stdout.write(options.json ? stringifyReport({ ...(gradesJson(study, VERSION) as object), workEstimate: estimate }) : renderGradesText(study, { subject: file, version: VERSION }));
  checkYieldGate(options.failUnderYield, gradesYields(study));
}

/** --grades, shared with `design`: the grades to compare and choose from. */
export function gradesFlag(): Option {
  return new Option('--grades <list>', 'grades to compare and choose from, e.g. 5%,1%,0.1% (default: the file\'s resistors.grades, else 5%,1%,0.5%,0.1%)')
    .argParser((text: string) => parseGradeList(text, '--grades'));
}

/** The --grades part of the study's options, present only when the option was given. */
export function gradesChoice(options: { grades?: GradeName[] }): { grades?: GradeName[] } {
  return options.grades ? { grades: options.grades } : {};
}

export function gradesCommand(): Command {
  return new Command('grades')
    .description('tolerance grades side by side; the cheapest per-part grade mix that meets a yield target')
    .configureOutput({ outputError: () => undefined })
    .argument('<file>', 'design file (JSON); "auto" values are filled as `design` does')
    .addOption(gradesFlag())
    .addOption(targetYieldFlag('share of units that must meet every spec window at every ambient of the range'))
    .addOption(searchTrialsFlag('Monte Carlo trials per assignment the search evaluates'))
    .addOption(seedFlag())
    .addOption(trialsFlag("Monte Carlo trials per grade (default: the file's, else 100000)"))
    .addOption(workersFlag())
    .addOption(conditionFlag())
    .addOption(kernelFlag())
    .addOption(failUnderYieldOptionWith(FAIL_UNDER_YIELD_HELP.replace("any output's yield", 'the all-specs yield of the design as it stands')))
    .option('--json', 'print JSON: grades[] (per output sigma, interval95, yieldPct per unit, yieldAtRandomAmbientPct, cpk; allSpecsYieldPct), cheapest, bestUpgrade')
    .addHelpText(
      'after',
      `
Grades: 5 %, 1 %, 0.5 %, 0.1 % (IEC 60062:2016 letters J, F, D, B) unless --grades or the design file's
resistors.grades names others of 10 %, 5 %, 2 %, 1 %, 0.5 %, 0.25 %, 0.1 %, 0.05 %, 0.02 %, 0.01 % (K, J, G, F, D, C,
B, W, P, L), each with the TCR and series it usually comes in (common practice); a part is offered a grade only
when that series or a coarser one holds its value. Relative costs are illustrative unless the design file's
"costs" gives yours.
Every yield here is per unit: the share of units (parts drawn once) inside the windows at every ambient checked
over the design's range; "all specs" asks that of every window at once.

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
