// RSS: the law of propagation of uncertainty for uncorrelated inputs (JCGM 100:2008, 5.1.2),
//   u²(y) = Σ c_i²·u²(x_i),
// with c_i the sensitivity coefficients (central differences at the parts' means) and u(x_i) the standard deviation
// of each part's distribution as Monte Carlo draws it. Also the tolerance half-widths combined in quadrature,
// √Σ(c_i·w_i)² (common practice for "RSS tolerance"), and each part's share of u²(y), ranked.
import { partMean, partSigma } from '../tolerance/sample.js';
import { partVaries } from '../tolerance/part.js';
import { evaluateAt, type Model } from './model.js';
import type { Contribution, RssResult } from './result.js';
import { sensitivities } from './sensitivity.js';

export interface RssOutput {
  name: string;
  rss: RssResult;
  contributions: Contribution[];
}

export function rss(model: Model): RssOutput[] {
  const means = model.parts.map(partMean);
  const u = model.parts.map(partSigma);
  const c = sensitivities(model, means);
  return model.outputs.map((output, o) => {
    let variance = 0;
    let halfWidthSquared = 0;
    const terms = model.parts.map((part, i) => {
      const ci = c[o]![i]!;
      const term = ci * u[i]!;
      variance += term * term;
      const halfWidth = ci * ((part.minus + part.plus) / 2);
      halfWidthSquared += halfWidth * halfWidth;
      return term * term;
    });
    const contributions: Contribution[] = model.parts
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
      rss: { sigma: Math.sqrt(variance), halfWidth: Math.sqrt(halfWidthSquared), center: evaluateAt(output, means) },
      contributions,
    };
  });
}
