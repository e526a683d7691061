// Worst case bounds Monte Carlo, or the notes say which output passed it, which part and why
// (src/analysis/worst-case-bound.ts). Expected shares: a normal falls outside ±3σ with probability 2·(1 − Φ(3)) =
// 0.26998 % (NIST/SEMATECH e-Handbook 1.3.6.7.1, the standard normal table), so 20 000 draws put about 54 outside
// the band; the chance of none is (1 − 0.0027)^20000 ≈ e^−54, so the tests cannot pass by luck.
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analysis/analyze.js';
import type { Model } from '../src/analysis/model.js';
import type { AnalysisResult } from '../src/analysis/result.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import type { DistributionSpec } from '../src/tolerance/part.js';
import { partFromBound } from '../src/tolerance/part.js';
import { baseDesign } from './design-fixture.js';

/** One part x in 1 ± 0.1, and the outputs y = x and z = (x − 1)² (not monotonic over the band). */
function model(distribution: DistributionSpec): Model {
  return {
    parts: [partFromBound({ name: 'X1', kind: 'offset', nominal: 1, plusMinus: 0.1, distribution })],
    outputs: [
      { name: 'y', unit: 'V', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = p[0]![j]!; } },
      { name: 'z', unit: 'V', evaluate: (p, out, n) => { for (let j = 0; j < n; j++) out[j] = (p[0]![j]! - 1) ** 2; } },
    ],
  };
}

/** The rule itself: every output whose Monte Carlo range passes its worst case has a note naming it. */
function expectEveryExcursionNoted(result: AnalysisResult): void {
  for (const o of Object.values(result.outputs)) {
    const beyond = o.min < o.worstCase.min * (1 - 1e-12) - 1e-300 || o.max > o.worstCase.max * (1 + 1e-12) + 1e-300;
    const noted = result.notes.some((n) => n.startsWith(`${o.name}: Monte Carlo reached`));
    expect(noted).toBe(beyond);
  }
}

const run = (m: Model) => analyze(m, { trials: 20_000, seed: 'bound', workers: 1 });

describe('worst case against Monte Carlo', () => {
  it('an unbounded normal leaves the band: named up front and after the run', async () => {
    const r = await run(model({ kind: 'normal', k: 3 }));
    expect(r.outputs['y']!.max).toBeGreaterThan(1.1);
    expect(r.outputs['y']!.min).toBeLessThan(0.9);
    expect(r.notes.some((n) => /^Worst case does not bound Monte Carlo: X1 is drawn from an unbounded normal .*0\.27 % outside ±3σ/.test(n))).toBe(true);
    expect(r.notes.some((n) => /^y: Monte Carlo reached down to .* and up to .*, beyond the worst case 0\.9 V … 1\.1 V: X1 is drawn from an unbounded normal/.test(n))).toBe(true);
    expectEveryExcursionNoted(r);
  });

  it('a normal cut off at the band stays inside the worst case of the monotonic output, with no note', async () => {
    const r = await run(model({ kind: 'truncated-normal', k: 3 }));
    expect(r.outputs['y']!.max).toBeLessThanOrEqual(1.1);
    expect(r.outputs['y']!.min).toBeGreaterThanOrEqual(0.9);
    expect(r.notes.some((n) => n.startsWith('y: Monte Carlo reached') || n.startsWith('Worst case does not bound'))).toBe(false);
    expectEveryExcursionNoted(r);
  });

  it('an output not monotonic over the band: the band ends miss its minimum, and the note says so', async () => {
    // z = (x − 1)² is 0.01 at both band ends (the worst case by enumeration) but 0 at x = 1.
    const r = await run(model({ kind: 'uniform' }));
    expect(r.outputs['z']!.worstCase.min).toBeCloseTo(0.01, 12);
    expect(r.outputs['z']!.min).toBeLessThan(1e-6);
    expect(r.notes.some((n) => /^z: Monte Carlo reached down to .*: the output is not monotonic in every part over its band/.test(n))).toBe(true);
    expectEveryExcursionNoted(r);
  });
});

describe('a design file\'s "normal" is cut off at the band; "normal-unbounded" is not', () => {
  const kinds = (distribution: string) => {
    const d = baseDesign();
    d.resistors.distribution = distribution;
    return resolveDesign(validateDesign(d)).spec.divider!.top.resistors[0].distribution;
  };
  it.each([
    ['normal', { kind: 'truncated-normal', k: 3 }],
    ['truncated-normal', { kind: 'truncated-normal', k: 3 }],
    ['normal-unbounded', { kind: 'normal', k: 3 }],
    ['uniform', { kind: 'uniform' }],
  ])('%s', (name, expected) => expect(kinds(name)).toEqual(expected));
});
