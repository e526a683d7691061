// The current-limit threshold's own temperature coefficient, and the reference it is divided from as its own part
// or as the regulator's (issue 11, section 5). Worst cases against the closed forms worked by hand; the shared
// reference moves vout and the limit together (one part), which a separate reference does not.
import { describe, expect, it } from 'vitest';
import { buildSupplyModel } from '../src/analysis/models/supply.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { baseDesign } from './design-fixture.js';

/** The fixture's current loop alone (noninv, G = 10, RS 100 mΩ) with every resistor exact and no offsets, at `ambient`. */
function exactCurrentLoop(threshold: Record<string, unknown>, ambientC: number): Record<string, any> {
  const d = baseDesign();
  delete d.voltage;
  delete d.reference;
  d.current.amplifier = { vos: 0, rail: '5 V' };
  d.current.threshold = threshold;
  d.resistors = { tolerance: 0, tcr: 0 };
  d.current.shunt = { value: 'R10', rating: '1 W', tolerance: 0, tcr: 0 };
  d.temperature = { fixed: ambientC };
  return d;
}

const ilimit = (d: Record<string, any>) => worstCase(buildSupplyModel(resolveDesign(validateDesign(d)).spec)).find((o) => o.name === 'ilimit')!;

describe('threshold tempco', () => {
  it('fixed threshold 1 V ±1 %, 100 ppm/K at 75 °C: I = Vth·(1 ± 1 %)·(1 ± 100e-6·50)/(G·Rs)', () => {
    const w = ilimit(exactCurrentLoop({ voltage: '1 V', tolerance: '1%', tempco: '100ppm' }, 75));
    expect(w.max).toBeCloseTo((1.01 * 1.005) / (10 * 0.1), 12);
    expect(w.min).toBeCloseTo((0.99 * 0.995) / (10 * 0.1), 12);
  });
  it('divided from its own 2.5 V reference, ±0.5 %, 50 ppm/K: Vth = Vref·RT2/(RT1 + RT2) with that reference\'s band', () => {
    // RT1 1k5, RT2 1k exact: Vth nominal 1.0 V; at 85 °C the reference reaches 2.5·(1 ± 0.005)·(1 ± 50e-6·60).
    const w = ilimit(exactCurrentLoop({ reference: '2.5 V', tolerance: '0.5%', tempco: '50ppm', top: '1k5', bottom: '1k' }, 85));
    expect(w.max).toBeCloseTo((2.5 * 1.005 * 1.003 * 0.4) / 1, 12);
    expect(w.min).toBeCloseTo((2.5 * 0.995 * 0.997 * 0.4) / 1, 12);
    const names = buildSupplyModel(resolveDesign(validateDesign(exactCurrentLoop({ reference: '2.5 V', tolerance: '0.5%', tempco: '50ppm', top: '1k5', bottom: '1k' }, 85))).spec).parts.map((p) => p.name);
    expect(names).toEqual(expect.arrayContaining(['Vref threshold', 'Vref threshold tempco']));
  });
});

describe('threshold divided from the regulator reference', () => {
  function shared(): Record<string, any> {
    const d = baseDesign();
    d.current.threshold = { reference: 'regulator', top: '1k', bottom: '4k' }; // Vth = 1.25·4/5 = 1.0 V
    delete d.temperature;
    return d;
  }
  it('uses the one Vref part: no Vref threshold, and the nominal limit from 1.25 V·RT2/(RT1 + RT2)', () => {
    const r = resolveDesign(validateDesign(shared()));
    const names = buildSupplyModel(r.spec).parts.map((p) => p.name);
    expect(names).toContain('Vref');
    expect(names).not.toContain('Vref threshold');
    expect(r.nominal['ilimit']).toBeCloseTo(1.0 / (10 * 0.1), 12);
  });
  it('a reference at its top moves vout and the limit up together (one part), by its own ±1 %', () => {
    const model = buildSupplyModel(resolveDesign(validateDesign(shared())).spec);
    const vref = model.parts.findIndex((p) => p.name === 'Vref');
    const at = (value: number) => {
      const values = model.parts.map((p) => p.nominal);
      values[vref] = value;
      const p = values.map((v) => Float64Array.of(v));
      const outs = model.outputs.map(() => new Float64Array(1));
      model.evaluateAll!(p, outs, 1);
      return Object.fromEntries(model.outputs.map((o, i) => [o.name, outs[i]![0]!]));
    };
    const nominal = at(1.25);
    const high = at(1.25 * 1.01);
    expect(high['vout']! / nominal['vout']!).toBeCloseTo(1.01, 12);
    expect(high['ilimit']! / nominal['ilimit']!).toBeCloseTo(1.01, 12);
  });
});
