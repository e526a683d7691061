// `--target-yield PCT` and `--search-trials N`, the grade search's options in `grades` and `design` (parser and
// commander options, defined once), and the refusal of a target the user named that no grade mix can reach.
import { Command, Option } from 'commander';
import { DEFAULT_SEARCH_TRIALS, DEFAULT_TARGET_YIELD_PCT, type GradesRun } from '../design/grade-study.js';
import { ImpossibleError, InputError } from '../errors.js';
import { formatYieldPct } from '../report/format-value.js';
import { parsePercent } from '../units/index.js';
import { integerOption } from './option-parsers.js';

/** A yield target in percent from "99.9%" or "99.9", strictly between 50 % and 100 %. */
export function targetYieldOption(value: string): number {
  const accepted = 'a yield between 50 % and 100 % (exclusive), e.g. 99.9% or 99.9';
  const fraction = parsePercent(value, '--target-yield');
  if (!(fraction >= 0.5 && fraction < 1)) throw new InputError('--target-yield', `${value} is out of range`, accepted);
  return fraction * 100;
}

/** `--target-yield <pct>` with its default; `help` says what the target is for in this command. */
export function targetYieldFlag(help: string): Option {
  return new Option('--target-yield <pct>', help).argParser(targetYieldOption).default(DEFAULT_TARGET_YIELD_PCT, '99.9 %');
}

/** `--search-trials <n>` with its default. */
export function searchTrialsFlag(help: string): Option {
  return new Option('--search-trials <n>', help).argParser(integerOption('--search-trials', 1000, 10_000_000)).default(DEFAULT_SEARCH_TRIALS, '20000');
}

/**
 * A grade search the user asked for by naming --target-yield that no grade mix can satisfy is an impossible
 * request (exit 2), stated with the best any resistor grade achieves; with the default target the report says so.
 */
export function refuseUnreachableTarget(run: GradesRun, command: Command): void {
  if (command.getOptionValueSource('targetYield') !== 'cli' || run.mix.reason !== 'target-unreachable') return;
  const tightest = run.rows.reduce((best, row) => (row.grade.tolerance < best.grade.tolerance ? row : best));
  const limits = run.resolved.limits ?? [];
  throw new ImpossibleError(
    '--target-yield',
    `no resistor grade mix reaches ${run.options.targetYieldPct} % of units inside every spec window: even every resistor at ${tightest.grade.name} gives ${formatYieldPct(tightest.joint.pct)}${limits.length > 0 ? ' (the output window is narrower than the reference alone allows)' : ''}`,
    `lower --target-yield below ${formatYieldPct(tightest.joint.pct)}, or change what resistors cannot: a tighter reference, lower-offset amplifier or wider spec window (see the contributors in \`trimfree spread\`)`,
  );
}
