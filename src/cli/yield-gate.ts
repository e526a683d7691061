// `--fail-under-yield PCT`: a gate for designers' own CI. After the report is printed, the command fails with exit
// code 1 (not 2: the input was fine, the design is not) when any output's yield is below PCT, naming each such output
// and its yield. The yields are the ones printed in the report (Monte Carlo share of trials inside the spec window).
import { Option } from 'commander';
import { InputError } from '../errors.js';
import { formatYieldPct } from '../report/format-value.js';
import { parsePercent } from '../units/index.js';
import { YieldGateFailure, type GatedYield } from './yield-gate-failure.js';

export { EXIT_YIELD_GATE, YieldGateFailure, type GatedYield } from './yield-gate-failure.js';

export const FAIL_UNDER_YIELD_HELP = 'exit with code 1 when any output\'s yield is below this, e.g. 99.5% (default: never)';

/** The gate's threshold in percent, from "99.5%", "99.5" or "99.5 %" (0 % to 100 % inclusive). */
export function failUnderYieldOption(value: string): number {
  const accepted = 'a yield from 0 % to 100 %, e.g. 99.5% or 99.5';
  const fraction = parsePercent(value, '--fail-under-yield');
  if (!(fraction >= 0 && fraction <= 1)) throw new InputError('--fail-under-yield', `'${value}' is out of range`, accepted);
  return fraction * 100;
}

/** The `--fail-under-yield <pct>` option, with the help phrase given (the default phrase speaks of every output). */
export function failUnderYieldOptionWith(help: string = FAIL_UNDER_YIELD_HELP): Option {
  return new Option('--fail-under-yield <pct>', help).argParser(failUnderYieldOption);
}

/** The gate's one line: each output below the threshold with its yield as the report shows it. */
function gateMessage(thresholdPct: number, failing: GatedYield[]): string {
  return `--fail-under-yield ${thresholdPct} %: ${failing.map((f) => `${f.name} yield ${formatYieldPct(f.pct)}`).join(', ')} ${failing.length === 1 ? 'is' : 'are'} below ${thresholdPct} %`;
}

/** Throws YieldGateFailure when a yield is below the threshold; does nothing when no threshold was given. */
export function checkYieldGate(thresholdPct: number | undefined, yields: GatedYield[]): void {
  if (thresholdPct === undefined) return;
  const failing = yields.filter((y) => y.pct < thresholdPct);
  if (failing.length > 0) throw new YieldGateFailure(gateMessage(thresholdPct, failing), failing);
}
