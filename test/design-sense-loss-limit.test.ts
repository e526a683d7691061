// The design's own limits as the windows of the shunt loss and the amplifier output, and one feasibility rule for
// `sense` ("!") and `design` (never picks a flagged candidate). The rule is checked here by hand arithmetic on the
// picker's own candidates: a candidate is flagged when I_wc,max²·RS exceeds the loss limit, the lower of
// derating × rating and the loss budget (Joule's law P = I²R at the quick worst-case highest limit).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildSupplyModel } from '../src/analysis/models/supply.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { ImpossibleError, describeError } from '../src/errors.js';
import { pickSense, type SenseCandidate, type SenseRequest } from '../src/pick/sense.js';
import { exceedsLossLimit } from '../src/pick/sense/feasibility.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { seriesValuesBetween } from '../src/series/enumerate.js';
import { loadShunts } from '../src/series/load.js';
import { formatEngineering } from '../src/units/index.js';
import { baseDesign } from './design-fixture.js';

const example = (name: string): Record<string, any> => JSON.parse(readFileSync(join(PROJECT_ROOT, 'examples', name), 'utf8')) as Record<string, any>;
const worstLoss = (c: SenseCandidate): number => c.worstCase.max ** 2 * c.parts['RS']!;
const partsOf = (r: ReturnType<typeof resolveDesign>): Record<string, number> =>
  Object.fromEntries(r.bom.filter((l) => !['RTOP', 'RBOT'].includes(l.designator)).map((l) => [l.designator, l.ohms]));

describe('LED example: design passes over the candidates sense flags', () => {
  // The request as the LED file states it: 700 mA, diff high side at 19 V, threshold 1.0 V from a 2.5 V ±0.5 %
  // reference, shunts ±1 % rated 0.5 W (derating default 50 %: loss limit 0.25 W by hand), gain resistors 0.1 %
  // E192 1k..200k, amplifier on 24 V with 0.5 V headroom, Vos 2 mV, Ib ±50 nA, comparing offset 1 mV.
  const request: SenseRequest = {
    limit: 0.7,
    topology: 'diff',
    threshold: { kind: 'divider', reference: 2.5, tolerance: 0.005, volts: 1.0 },
    shunts: loadShunts().values,
    shuntTolerance: 0.01,
    shuntRatingW: 0.5,
    derating: 0.5,
    resistorValues: seriesValuesBetween('E192', 1e3, 200e3),
    resistorTolerance: 0.001,
    rail: 24,
    headroom: 0.5,
    amplifierOffset: 2e-3,
    compareOffset: 1e-3,
    biasCurrent: { nominal: 0, lo: -50e-9, hi: 50e-9, form: 'plus-minus' },
    commonMode: 19,
  };
  const candidates = pickSense(request).candidates;
  const resolved = resolveDesign(validateDesign(example('led-driver-highside.json')));

  it('the flag is I²R at the worst-case highest limit above 0.25 W, and the best-ranked candidate has it', () => {
    for (const c of candidates) expect(exceedsLossLimit(c)).toBe(worstLoss(c) > 0.25 * (1 + 1e-9));
    // Without the rule the design would take the first: 0.5 Ω whose worst case reaches about 0.286 W.
    expect(worstLoss(candidates[0]!)).toBeGreaterThan(0.25);
  });

  it('design takes the best-ranked candidate within the limit', () => {
    const expected = candidates.find((c) => worstLoss(c) <= 0.25)!;
    expect(partsOf(resolved)).toEqual(expected.parts);
    expect(resolved.notes.join(' ')).toMatch(/passed over: .*exceeds the 250 mW loss limit \(50 % of the 500 mW rating/);
  });

  it('the engine windows are the design limits: shunt loss 0..0.25 W, amplifier output 0..(24 − 0.5) V', () => {
    expect(resolved.spec.sense!.shunt.lossLimitW).toBeCloseTo(0.25, 15);
    const model = buildSupplyModel(resolved.spec);
    expect(model.outputs.find((o) => o.name === 'shuntLoss')!.spec).toEqual([0, 0.25]);
    expect(model.outputs.find((o) => o.name === 'ampOutput')!.spec).toEqual([0, 23.5]);
    expect(model.notes!.join(' ')).toMatch(/shuntLoss is judged against 0\.\.0\.25 W \(50 % of the 500 mW rating\)/);
  });
});

describe('a constructed case: the loss budget below the derated rating', () => {
  // The charger example (1.5 A, shunt rated 1 W, budget 0.25 W < 50 % × 1 W) with three shunts to choose from.
  // The quick worst cases, by the picker: R11 up to 1.571 A → 1.571²·0.11 = 0.271 W; R10 up to 1.584 A →
  // 1.584²·0.1 = 0.251 W; 68 mΩ up to 1.589 A → 1.589²·0.068 = 0.172 W. Only 68 mΩ stays within 0.25 W.
  const charger = (candidates: string[]): Record<string, any> => {
    const d = example('charger-2s-liion.json');
    d.current.shunt.candidates = candidates;
    return d;
  };

  it('design picks 68 mΩ, the only one within the budget, though it ranks last', () => {
    const r = resolveDesign(validateDesign(charger(['R10', 'R11', '68m'])));
    expect(partsOf(r)['RS']).toBeCloseTo(0.068, 15);
    expect(r.spec.sense!.shunt.lossLimitW).toBe(0.25);
    expect(r.spec.sense!.shunt.lossLimitFrom).toMatch(/maxLoss/);
  });

  it('every candidate flagged: refused in one line with what to change', () => {
    let error: unknown;
    try {
      resolveDesign(validateDesign(charger(['R10', 'R11'])));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ImpossibleError);
    const line = describeError(error as ImpossibleError);
    expect((error as ImpossibleError).where).toBe('current.shunt.maxLoss');
    expect(line).toMatch(/every one of the 2 current-sense candidates loads its shunt past the 250 mW loss limit.*RS R10, reaches 251 mW; to fix: raise current\.shunt\.maxLoss to at least 251 mW/);
    expect(line).not.toMatch(/\n|NaN|Infinity|undefined/);
  });

  it('the derated rating below the budget: the rating is what to raise', () => {
    const d = charger(['R10', 'R11']);
    d.current.shunt.maxLoss = '1 W';
    d.current.shunt.rating = '0.5 W';
    let error: unknown;
    try {
      resolveDesign(validateDesign(d));
    } catch (e) {
      error = e;
    }
    // R11 at 1.5 A: 0.2475 W nominal, within 50 % of 0.5 W; R10 0.225 W; both reach past 0.25 W at the worst case.
    expect((error as ImpossibleError).where).toBe('current.shunt.rating');
    // Needed rating by hand: 0.251 W / 50 % = 0.502 W.
    expect(describeError(error as ImpossibleError)).toMatch(/to fix: raise current\.shunt\.rating to at least 502 mW/);
  });
});

describe('the shunt-heat caution takes the worst-case loss', () => {
  it('base design at 25 °C: the worst case by hand, not the nominal', () => {
    // noninv, RS 0.1 Ω ±1 %, RF 9k / RG 1k ±1 %, threshold 1.0 V ±1 %, Vos ±1 mV, no bias current, 25 °C only.
    // Loss at the limit = K²/Rs with K = Vth/G − Vos (I = K/Rs): largest at Vth high, G and Rs low, Vos negative.
    const gMin = 1 + (9e3 * 0.99) / (1e3 * 1.01);
    const worst = (1.01 / gMin + 1e-3) ** 2 / (0.1 * 0.99); // 0.10890 W
    const d = baseDesign();
    delete d.temperature;
    const r = resolveDesign(validateDesign(d));
    const caution = r.cautions.find((c) => c.startsWith('Shunt:'))!;
    expect(worst).toBeCloseTo(0.1089, 4);
    expect(caution).toMatch(/^Shunt: up to 109 mW at the current limit \(worst case over tolerances and temperature; 100 mW nominal\) is 11 % of its 1\.00 W rating/);
  });
});

describe('the caution\'s worst-case loss is the worst case of the whole model', () => {
  // The caution holds the divider exact (it never enters the sense path); the whole model's worst case by vertex
  // enumeration must give the same figure.
  it.each(['charger-2s-liion.json', 'bench-adjustable.json'])('%s', (file) => {
    const r = resolveDesign(validateDesign(example(file)));
    const whole = worstCase(buildSupplyModel(r.spec)).find((w) => w.name === 'shuntLoss')!;
    expect(whole.method).toBe('enumeration');
    expect(r.cautions.find((c) => c.startsWith('Shunt:'))).toContain(`Shunt: up to ${formatEngineering(whole.max, 'W')} at the current limit`);
  });
});

describe('an engine SupplySpec states its own windows', () => {
  const spec = () => resolveDesign(validateDesign(baseDesign())).spec;
  const windowOf = (s: ReturnType<typeof spec>, name: string) => buildSupplyModel(s).outputs.find((o) => o.name === name)!.spec;

  it('the base design: 50 % of its 1 W rating, 5 V rail less the default 0.2 V headroom', () => {
    expect(windowOf(spec(), 'shuntLoss')).toEqual([0, 0.5]);
    expect(windowOf(spec(), 'ampOutput')).toEqual([0, 4.8]);
  });

  it('a bare spec with a rating and no loss limit keeps [0, rating] and says so', () => {
    const s = spec();
    delete s.sense!.shunt.lossLimitW;
    delete s.sense!.shunt.lossLimitFrom;
    expect(windowOf(s, 'shuntLoss')).toEqual([0, 1]);
    expect(buildSupplyModel(s).notes!.join(' ')).toMatch(/shuntLoss is judged against 0\.\.1 W, the full power rating \(no derated loss limit given\)/);
  });

  it('a headroom that leaves no swing is refused with the field path', () => {
    const s = spec();
    if (s.sense!.topology !== 'noninv') throw new Error('the base design is noninv');
    s.sense!.amplifier.headroomV = 5;
    expect(() => buildSupplyModel(s)).toThrowError(expect.objectContaining({ where: 'supply.sense.amplifier.headroomV' }));
  });
});
