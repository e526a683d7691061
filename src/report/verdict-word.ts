// The pass/fail word of an output in the terminal summary: "pass" when its yield (as the analysis result reports
// it) reaches the target yield, "fail" below it, the em dash without a spec window. The word carries the meaning;
// colour (only when the caller says the terminal takes it) merely supports it.
import type { OutputResult } from '../analysis/result.js';
import { MISSING } from './format-value.js';

export type Verdict = 'pass' | 'fail';

export function outputVerdict(output: OutputResult, targetYieldPct: number): Verdict | undefined {
  if (!output.yield) return undefined;
  return output.yield.pct >= targetYieldPct ? 'pass' : 'fail';
}

const SGR = { pass: '\u001b[32m', fail: '\u001b[1;31m', reset: '\u001b[0m' } as const;

/** The word, wrapped in ANSI SGR colour codes (ECMA-48 8.3.117) only when `colour` is true. */
export function verdictText(verdict: Verdict | undefined, colour: boolean): string {
  if (verdict === undefined) return MISSING;
  return colour ? `${SGR[verdict]}${verdict}${SGR.reset}` : verdict;
}
