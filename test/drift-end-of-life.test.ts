// Drift allowances and the analysis condition (src/tolerance/life-allowances.ts, src/design/life-condition.ts) on a
// feedback divider, against closed forms worked here: Vout = Vref·(1 + Rtop/Rbot), monotonic in every part, so its
// worst case is every band at the end that raises (or lowers) it. At 25 °C only (no temperature range) TCRs play no
// part. Each drift allowance multiplies its part: R·(1 + d_load life)·(1 + d_damp heat)·(1 + d_soldering).
// Grade defaults for 1 % (common practice, life-allowances.ts): load life 1 %, damp heat 0.5 %, soldering 0.25 %.
import { describe, expect, it } from 'vitest';
import { gradedSpec } from '../src/analysis/graded-spec.js';
import { buildSupplyModel } from '../src/analysis/models/supply.js';
import { rss } from '../src/analysis/rss.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { analysisChoice, resolvedForCondition } from '../src/design/analysis-choice.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { defaultAllowances } from '../src/tolerance/life-allowances.js';
import { baseDesign } from './design-fixture.js';

const VREF = 1.25;
const RT = 30e3;
const RB = 10e3;

function design(mutate: (d: Record<string, any>) => void = () => undefined) {
  const d = baseDesign();
  delete d.temperature; // 25 °C only
  d.reference = { voltage: '1.25 V', tolerance: '1%', drift: '0.2%' };
  mutate(d);
  return resolveDesign(validateDesign(d));
}

function voutWorst(spec: Parameters<typeof buildSupplyModel>[0]): { min: number; max: number } {
  const w = worstCase(buildSupplyModel(spec)).find((o) => o.name === 'vout')!;
  return { min: w.min, max: w.max };
}

const prod = (bands: number[], sign: 1 | -1): number => bands.reduce((f, b) => f * (1 + sign * b), 1);
const divider = (vref: number, rt: number, rb: number): number => vref * (1 + rt / rb);

describe('end of life against the closed form of a divider', () => {
  const grade1 = [0.01, 0.005, 0.0025];

  it('grade defaults: worst case = every tolerance and allowance at its end, reference drift included', () => {
    const resolved = design();
    const eol = resolvedForCondition(resolved, 'end-of-life').spec;
    const w = voutWorst(eol);
    const max = divider(VREF * 1.01 * 1.002, RT * 1.01 * prod(grade1, 1), RB * 0.99 * prod(grade1, -1));
    const min = divider(VREF * 0.99 * 0.998, RT * 0.99 * prod(grade1, -1), RB * 1.01 * prod(grade1, 1));
    expect(w.max / max).toBeCloseTo(1, 12);
    expect(w.min / min).toBeCloseTo(1, 12);
  });

  it('as built: tolerances only, the reference drift left out', () => {
    const w = voutWorst(resolvedForCondition(design(), 'as-built').spec);
    expect(w.max / divider(VREF * 1.01, RT * 1.01, RB * 0.99)).toBeCloseTo(1, 12);
    expect(w.min / divider(VREF * 0.99, RT * 0.99, RB * 1.01)).toBeCloseTo(1, 12);
  });

  it('RSS at end of life: u² = v²(t² + d²)/3 for Vref plus (v − Vref)²·2·Σband²/3 for the resistors (uniform bands, first order)', () => {
    const eol = resolvedForCondition(design(), 'end-of-life').spec;
    const model = buildSupplyModel(eol);
    const v = divider(VREF, RT, RB);
    const bands = [0.01, ...grade1];
    const expected = Math.sqrt((v * v * (0.01 ** 2 + 0.002 ** 2)) / 3 + ((v - VREF) ** 2 * 2 * bands.reduce((s, b) => s + b * b, 0)) / 3);
    const vout = rss(model)[model.outputs.findIndex((o) => o.name === 'vout')]!;
    // Central differences on a product of factors: relative error of order band² (≈1e-4), far inside 1e-3.
    expect(vout.rss.sigma / expected).toBeCloseTo(1, 3);
  });

  it('each allowance is its own part (its own contributor), named after the resistor and the allowance', () => {
    const parts = buildSupplyModel(resolvedForCondition(design(), 'end-of-life').spec).parts;
    const rtop = parts.filter((p) => p.name.startsWith('RTOP '));
    expect(rtop.map((p) => [p.name, p.kind, p.plus])).toEqual([
      ['RTOP TCR', 'temperature coefficient', 1e-4],
      ['RTOP load life', 'drift', 0.01],
      ['RTOP damp heat', 'drift', 0.005],
      ['RTOP soldering', 'drift', 0.0025],
    ]);
    expect(parts.some((p) => p.name === 'Vref drift')).toBe(true);
    const asBuilt = buildSupplyModel(resolvedForCondition(design(), 'as-built').spec).parts;
    expect(asBuilt.some((p) => p.kind === 'drift')).toBe(false);
  });

  it('a drift block in the file replaces the grade defaults (an allowance left out is 0); a part override wins', () => {
    const resolved = design((d) => {
      d.resistors.drift = { loadLife: '0.1%' };
      d.resistors.overrides = { RBOT: { drift: { dampHeat: '0.3%', soldering: '0.05%' } } };
    });
    const w = voutWorst(resolvedForCondition(resolved, 'end-of-life').spec);
    const max = divider(VREF * 1.01 * 1.002, RT * 1.01 * 1.001, RB * 0.99 * 0.997 * 0.9995);
    expect(w.max / max).toBeCloseTo(1, 12);
  });

  it('the design file\'s analysis.condition is the default; the command line overrides it', () => {
    const resolved = design((d) => (d.analysis = { condition: 'end-of-life' }));
    expect(analysisChoice(resolved, {}, 1000).condition).toBe('end-of-life');
    expect(analysisChoice(resolved, { condition: 'as-built' }, 1000).condition).toBe('as-built');
    expect(analysisChoice(design(), {}, 1000).condition).toBe('as-built');
  });

  it('a graded copy takes the new grade\'s defaults (grades compares grades at end of life fairly)', () => {
    const eol = resolvedForCondition(design(), 'end-of-life').spec;
    const graded = gradedSpec(eol, { RTOP: { tolerance: 0.001, tcrPerK: 25e-6 } });
    expect(graded.divider!.top.resistors[0].allowances).toEqual(defaultAllowances(0.001));
    expect(eol.divider!.top.resistors[0].allowances).toEqual(defaultAllowances(0.01));
  });

  it('a fixed threshold takes its own allowances: the direct limit Vth/Rs moves by their product', () => {
    const resolved = design((d) => {
      d.current = {
        target: '1 A',
        window: '±10%',
        topology: 'direct',
        shunt: { value: 'R10', rating: '1 W', tolerance: '1%', drift: { loadLife: '0.5%' } },
        threshold: { voltage: '0.1 V', tolerance: '1%', drift: { loadLife: '0.2%', dampHeat: '0.1%' } },
      };
    });
    const model = buildSupplyModel(resolvedForCondition(resolved, 'end-of-life').spec);
    const w = worstCase(model).find((o) => o.name === 'ilimit')!;
    expect(w.max / ((0.1 * 1.01 * 1.002 * 1.001) / (0.1 * 0.99 * 0.995))).toBeCloseTo(1, 12);
    expect(w.min / ((0.1 * 0.99 * 0.998 * 0.999) / (0.1 * 1.01 * 1.005))).toBeCloseTo(1, 12);
  });
});
