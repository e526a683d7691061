// A common-mode voltage that spreads from unit to unit (issue 11, section 5), e.g. an LED string whose forward
// voltage spreads: the design file takes a range or a band, the engine draws it per unit as the part Vcm, and the
// worst case of the limit is the four-resistor closed form at the range's ends.
import { describe, expect, it } from 'vitest';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { baseDesign } from './design-fixture.js';

function diffDesign(commonMode: unknown): Record<string, any> {
  const d = baseDesign();
  d.current.topology = 'diff';
  d.current.commonMode = commonMode;
  d.current.gain = { r1: '1k', r2: '10k', r3: '1k', r4: '10k' };
  d.current.amplifier = { vos: '1 mV', rail: '24 V' };
  return d;
}

describe('reading the common mode', () => {
  it.each([['19 V ±2 V'], ['17..21 V'], [[17, 21]], ['19±2']])('%j is 17..21 V about 19 V', (input) => {
    const sense = resolveDesign(validateDesign(diffDesign(input))).spec.sense as Extract<NonNullable<SupplySpec['sense']>, { topology: 'diff' }>;
    expect(sense.commonModeV).toBeCloseTo(19, 12);
    expect(sense.commonModeBand!.plusMinus).toBeCloseTo(2, 12);
    expect(sense.commonModeBand!.distribution).toEqual({ kind: 'uniform' });
  });
  it('one voltage stays one voltage, with no Vcm part', () => {
    const r = resolveDesign(validateDesign(diffDesign('19 V')));
    expect((r.spec.sense as { commonModeBand?: unknown }).commonModeBand).toBeUndefined();
    expect(buildSupplyModel(r.spec).parts.map((p) => p.name)).not.toContain('Vcm');
  });
  it('a distribution for the range', () => {
    const d = diffDesign('17..21 V');
    d.current.commonModeDistribution = 'normal';
    const sense = resolveDesign(validateDesign(d)).spec.sense as { commonModeBand?: { distribution?: unknown } };
    expect(sense.commonModeBand!.distribution).toEqual({ kind: 'truncated-normal', k: 3 });
  });
});

describe('engine worst case against the four-resistor closed form at the ends of the range', () => {
  it('mismatched R4: I = (Vth − Acm·Vcm)/(a·Rs), lowest at the highest Vcm', () => {
    // Exact resistors R1 1k, R2 20k, R3 1k, R4 20.2k (1 % ratio mismatch), Rs 10 mΩ, Vth 1 V, no offsets.
    // k = R4/(R3 + R4), a = k·(1 + R2/R1), Acm = a − R2/R1 (src/circuits/sense/diff.ts, any analog-electronics text).
    const k = 20.2 / 21.2;
    const a = k * 21;
    const acm = a - 20;
    const at = (vcm: number) => (1 - acm * vcm) / (a * 0.01);
    const exact = (name: string, nominal: number) => ({ name, nominal, tolerance: 0 });
    const spec: SupplySpec = {
      temperature: { minC: 25, maxC: 25, monteCarlo: 'uniform' },
      sense: {
        topology: 'diff',
        shunt: exact('RS', 0.01),
        r1: exact('R1', 1e3),
        r2: exact('R2', 20e3),
        r3: exact('R3', 1e3),
        r4: exact('R4', 20.2e3),
        commonModeV: 19,
        commonModeBand: { plusMinus: 2 },
        threshold: { kind: 'fixed', nominal: 1, tolerance: 0 },
        limitTarget: 5,
        amplifier: { offsetMax: 0 },
      },
    };
    const w = worstCase(buildSupplyModel(spec)).find((o) => o.name === 'ilimit')!;
    expect(w.min).toBeCloseTo(at(21), 12);
    expect(w.max).toBeCloseTo(at(17), 12);
    // The spread the band adds: Acm·(21 − 17)/(a·Rs), about 4·0.00943/0.2 ≈ 0.19 A here.
    expect(w.max - w.min).toBeCloseTo((acm * 4) / (a * 0.01), 12);
  });
});
