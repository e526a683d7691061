// RSS: the law of propagation of uncertainty for uncorrelated inputs (JCGM 100:2008, 5.1.2),
//   u²(y) = Σ c_i²·u²(x_i),
// with c_i the sensitivity coefficients (central differences at the parts' means) and u(x_i) the standard deviation
// of each part's distribution as Monte Carlo draws it; the expanded uncertainty U = k·u(y) with k = 2 (JCGM 100:2008,
// 6.2.1 and 6.3.3: about 95 % coverage when y is close to normal); and each part's first-order share of u²(y),
// ranked. A first-order figure at the parts' means: it cannot see interactions (a TCR times a temperature range
// centred on 25 °C has zero sensitivity there); variance-indices.ts gives the shares that do.
import { partMean, partSigma } from '../tolerance/sample.js';
import { partVaries } from '../tolerance/part.js';
import { evaluateAt, type Model } from './model.js';
import type { RssContribution, RssResult } from './result.js';
import { sensitivities } from './sensitivity.js';

/** Coverage factor of the expanded uncertainty (JCGM 100:2008, 6.3.3: k = 2 for about 95 %). */
export const RSS_COVERAGE_FACTOR = 2;

export interface RssOutput {
  name: string;
  rss: RssResult;
  contributions: RssContribution[];
}

export function rss(model: Model): RssOutput[] {
  const means = model.parts.map(partMean);
  const u = model.parts.map(partSigma);
  const c = sensitivities(model, means);
  return model.outputs.map((output, o) => {
    let variance = 0;
    const terms = model.parts.map((_part, i) => {
      const term = c[o]![i]! * u[i]!;
      variance += term * term;
      return term * term;
    });
    const contributions: RssContribution[] = model.parts
      .map((part, i) => ({
        part: part.name,
        sensitivity: c[o]![i]!,
        standardUncertainty: u[i]!,
        varianceShare: variance > 0 ? terms[i]! / variance : 0,
        varies: partVaries(part),
      }))
      .filter((entry) => entry.varies)
      .map(({ varies: _varies, ...entry }) => entry)
      .sort((a, b) => b.varianceShare - a.varianceShare || a.part.localeCompare(b.part));
    return {
      name: output.name,
      rss: {
        sigma: Math.sqrt(variance),
        expandedUncertainty: RSS_COVERAGE_FACTOR * Math.sqrt(variance),
        coverageFactor: RSS_COVERAGE_FACTOR,
        center: evaluateAt(output, means),
      },
      contributions,
    };
  });
}
