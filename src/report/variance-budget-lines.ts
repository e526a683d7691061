// The one-line explanations shown wherever the shares of the variance are (text, HTML, JSON): what the total-effect
// shares sum to for this output and why that can pass 100 %, and, when the first-order RSS σ is more than 10 % off
// the Monte Carlo σ, that it is and why. Words only: every number is a field of the AnalysisResult.
import type { OutputResult } from '../analysis/result.js';
import { formatPercent } from '../units/index.js';
import { formatShare, formatSpread } from './format-value.js';

/** A share with its standard error: "49.1 % ± 0.9 %"; an error below 0.1 % gets two decimals ("± 0.04 %"). */
export function formatShareWithError(share: number, standardError: number): string {
  const error = Number.isFinite(standardError) && standardError < 0.001 ? formatPercent(standardError, 2) : formatShare(standardError);
  return `${formatShare(share)} ± ${error}`;
}

export function varianceBudgetLines(output: OutputResult): string[] {
  const b = output.varianceBudget;
  const lines = [
    b.totalEffectSum > 1
      ? `Total-effect shares sum to ${formatShare(b.totalEffectSum)} (first-order ${formatShare(b.firstOrderSum)}): past 100 % because a variance that parts cause together (an interaction, such as a TCR with the ambient temperature) counts in each of their shares.`
      : `Total-effect shares sum to ${formatShare(b.totalEffectSum)} (first-order ${formatShare(b.firstOrderSum)}): they pass 100 % only through interactions (a variance parts cause together counts in each of their shares), and none shows here beyond the estimator's noise.`,
  ];
  if (b.rssAgreement !== 'agrees') {
    const rss = formatSpread(output.rss.sigma, output.unit);
    const mc = formatSpread(output.sigma, output.unit);
    const compared = `RSS σ (first order) ${rss} differs from the Monte Carlo σ ${mc} by more than 10 %`;
    lines.push(
      b.rssAgreement === 'interaction'
        ? `${compared}: parts interact (first-order shares sum to only ${formatShare(b.firstOrderSum)}), which a first-order sum at the parts' means cannot see; go by the total-effect shares.`
        : `${compared}: the output is not linear across the parts' bands (first-order shares sum to ${formatShare(b.firstOrderSum)}, so interactions are not why); the sensitivities at the parts' means misstate the spread.`,
    );
  }
  return lines;
}
