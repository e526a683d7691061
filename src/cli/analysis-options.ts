// The command-line options every command that runs the analysis (`spread`, `grades`, `design`) shares: --seed,
// --trials and --workers (their parsers and commander options, defined once), what they ask of the study
// (src/design/analysis-choice.ts), and the terminal progress the studies report to.
import { Option } from 'commander';
import type { CommandLineAnalysis, ProgressFactory } from '../design/analysis-choice.js';
import { KERNEL_CHOICES, type KernelChoice } from '../analysis/kernel/kernel-choices.js';
import { InputError } from '../errors.js';
import { LIFE_CONDITIONS, type LifeCondition } from '../tolerance/life-allowances.js';
import { printableText } from '../user-text.js';
import { integerOption } from './option-parsers.js';
import { createProgress } from './progress.js';

/** Largest seed a design file accepts; the command line takes the same range. */
const MAX_SEED = 2 ** 32 - 1;
/** Most Monte Carlo trials a run accepts, in all (src/cli/work-budget.ts counts every grade and the search): at
 * 1–10 million trials a second on two cores (the charger example; npm run bench) this is a quarter of an hour to two
 * hours; more could not finish in any sensible time. */
export const MAX_RUN_TRIALS = 1e10;
const MIN_RUN_TRIALS = 100;

/** A trial count: digits or a whole number in e-notation, 100 to 1e10, or `auto`. */
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
      throw new InputError(name, `'${text}' trials could not finish in any sensible time (1e10 already takes hours); refused before any work`, `${accepted}; past about 1e7 trials the figures change little: compare two seeds instead`);
    }
    if (n < MIN_RUN_TRIALS) throw new InputError(name, `${text} is out of range (too few trials for a spread)`, accepted);
    return n;
  };
}

export const seedOption = (name: string): ((value: string) => number) => integerOption(name, 0, MAX_SEED);
export const workersOption = (name: string): ((value: string) => number) => integerOption(name, 1, 256);

/** `--seed <n>`. */
export function seedFlag(): Option {
  return new Option('--seed <n>', "random seed (default: the file's, else 1)").argParser(seedOption('--seed'));
}

/** `--trials <n|auto>`; `help` says what the count is per command and its default. */
export function trialsFlag(help: string): Option {
  return new Option('--trials <n|auto>', help).argParser(trialsOption('--trials'));
}

/** `--workers <n>`. */
export function workersFlag(): Option {
  return new Option('--workers <n>', "worker threads, capped at the cores; results do not depend on it (default: the file's, else one per 1e6 trials up to every core)").argParser(workersOption('--workers'));
}

/** `--condition as-built|end-of-life`: what the figures describe (life-condition.ts). */
export function conditionOption(name: string): (value: string) => LifeCondition {
  return (value: string) => {
    const text = value.trim().toLowerCase();
    const found = LIFE_CONDITIONS.find((c) => c === text);
    if (!found) throw new InputError(name, text === '' ? 'empty condition' : `no condition ${JSON.stringify(printableText(value))}`, `${LIFE_CONDITIONS.join(' or ')} (as built: tolerances only; end of life: plus the drift allowances)`);
    return found;
  };
}

export function conditionFlag(): Option {
  return new Option('--condition <as-built|end-of-life>', "as-built: tolerances only; end-of-life: plus every drift allowance (load life, damp heat, soldering, reference drift) (default: the file's analysis.condition, else as-built)").argParser(conditionOption('--condition'));
}

/** `--lots <K>` (spread): the lot study with K lots (reel-lot model). */
export function lotsFlag(): Option {
  return new Option('--lots <K>', "also simulate K lots (2 to 1000) of the reel-lot model and report the worst lot's yield beside the overall (default: the file's lots, else none)").argParser(integerOption('--lots', 2, 1000));
}

/** `--kernel <auto|js|wasm>`: which chunk kernel computes the Monte Carlo (src/analysis/kernel/choice.ts). */
export function kernelFlag(): Option {
  return new Option('--kernel <name>', 'Monte Carlo kernel: wasm, js (the reference), or auto (wasm where it covers the design); both give the same numbers (default: auto)')
    .choices(KERNEL_CHOICES);
}

/** The parsed --seed, --trials, --workers and --kernel as commander gives them. */
export interface AnalysisCliOptions {
  seed?: number;
  trials?: number | 'auto';
  workers?: number;
  condition?: LifeCondition;
  lots?: number;
  kernel?: KernelChoice;
}

/** What the command line asks of the analysis (only the options given; the design file and defaults fill the rest). */
export function commandLineAnalysis(options: AnalysisCliOptions): CommandLineAnalysis {
  const cli: CommandLineAnalysis = {};
  if (options.trials !== undefined) cli.trials = options.trials;
  if (options.seed !== undefined) cli.seed = options.seed;
  if (options.workers !== undefined) cli.workers = options.workers;
  if (options.condition !== undefined) cli.condition = options.condition;
  if (options.lots !== undefined) cli.lots = options.lots;
  if (options.kernel !== undefined) cli.kernel = options.kernel;
  return cli;
}

/** Progress of a study's runs, drawn on stderr when it is a terminal (src/cli/progress.ts). */
export const progressToTerminal: ProgressFactory = (label) => createProgress({ label });
