// An output's variance budget: the RSS (first-order) figures of each part joined with its variance-based shares,
// ranked by total-effect share, and the verdict on the first-order RSS σ: whether it tells the Monte Carlo σ, and if
// not, whether interactions or nonlinearity are why. Pure; the numbers come from rss.ts, variance-indices.ts and
// the Monte Carlo.
import type { RssOutput } from './rss.js';
import type { Contribution, RssAgreement, VarianceBudget, VarianceIndicesMethod } from './result.js';
import type { OutputIndices } from './variance-indices.js';

/** RSS σ and Monte Carlo σ differing by more than this fraction get a note (our threshold: 10 %). */
export const RSS_AGREEMENT = 0.1;

/**
 * A tenth or more of the variance outside the first-order terms (Σ S_i ≤ 0.9) counts as interaction. In the Sobol'
 * decomposition of independent inputs 1 − Σ S_i is exactly the interactions' share; below a tenth, a gap between
 * RSS and Monte Carlo comes from each part's own nonlinearity across its band (our threshold).
 */
export const INTERACTION_SHARE = 0.1;

export interface OutputBudget {
  contributions: Contribution[];
  budget: VarianceBudget;
}

export function outputBudget(propagated: RssOutput, indices: OutputIndices, method: VarianceIndicesMethod, monteCarloSigma: number): OutputBudget {
  const byPart = new Map(indices.parts.map((p) => [p.part, p]));
  const contributions: Contribution[] = propagated.contributions
    .map((c) => {
      const index = byPart.get(c.part);
      if (!index) throw new Error(`variance indices of ${indices.name} have no entry for part ${c.part}`);
      return {
        ...c,
        totalEffectShare: index.totalEffect,
        totalEffectStandardError: index.totalEffectStandardError,
        firstOrderShare: index.firstOrder,
        firstOrderStandardError: index.firstOrderStandardError,
      };
    })
    .sort((a, b) => b.totalEffectShare - a.totalEffectShare || b.varianceShare - a.varianceShare || a.part.localeCompare(b.part));
  const totalEffectSum = contributions.reduce((sum, c) => sum + c.totalEffectShare, 0);
  const firstOrderSum = contributions.reduce((sum, c) => sum + c.firstOrderShare, 0);
  const rssSigma = propagated.rss.sigma;
  const ratio = monteCarloSigma > 0 ? rssSigma / monteCarloSigma : rssSigma > 0 ? null : 1;
  return {
    contributions,
    budget: {
      method: { ...method },
      totalEffectSum,
      firstOrderSum,
      rssToMonteCarloSigma: ratio,
      rssAgreement: rssAgreement(ratio, firstOrderSum),
    },
  };
}

function rssAgreement(ratio: number | null, firstOrderSum: number): RssAgreement {
  if (ratio !== null && Math.abs(ratio - 1) <= RSS_AGREEMENT) return 'agrees';
  return 1 - firstOrderSum >= INTERACTION_SHARE ? 'interaction' : 'nonlinearity';
}
