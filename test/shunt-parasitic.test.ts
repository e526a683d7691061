// The shunt's parasitic series resistance of pads and traces (issue 11, section 5; a common-practice concern):
// it adds to the sensed resistance with its own tolerance and TCR. The limit's shift and worst case are checked
// against the closed form I = (Vth/G)/(Rs + Rp) worked by hand; the design says Kelvin sensing removes most of it.
import { describe, expect, it } from 'vitest';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { nominalOutputs } from '../src/analysis/model.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { COPPER_TCR_PER_K } from '../src/design/shunt-parasitic.js';
import { baseDesign } from './design-fixture.js';

/** noninv, G = 10, Vth 1 V, Rs 10 mΩ exact (no TCR): only the parasitic varies, ambient held at `ambientC`. */
function spec(parasitic: { nominal: number; tolerance: number; tcrPerK?: number } | undefined, ambientC = 25): SupplySpec {
  const exact = (name: string, nominal: number) => ({ name, nominal, tolerance: 0 });
  return {
    temperature: { minC: ambientC, maxC: ambientC, monteCarlo: 'uniform' },
    sense: {
      topology: 'noninv',
      shunt: { ...exact('RS', 0.01), ...(parasitic ? { parasitic: { name: 'RS pads', ...parasitic } } : {}) },
      rf: exact('RF', 9e3),
      rg: exact('RG', 1e3),
      threshold: { kind: 'fixed', nominal: 1, tolerance: 0 },
      limitTarget: 10,
      amplifier: { offsetMax: 0 },
    },
  };
}

const limits = (s: SupplySpec) => worstCase(buildSupplyModel(s)).find((o) => o.name === 'ilimit')!;

describe('parasitic series resistance in the engine', () => {
  it('shifts the nominal limit from Vth/(G·Rs) = 10 A to Vth/(G·(Rs + Rp)) = 0.1/0.012 A with 2 mΩ', () => {
    expect(nominalOutputs(buildSupplyModel(spec(undefined)))['ilimit']).toBeCloseTo(10, 12);
    const with2m = nominalOutputs(buildSupplyModel(spec({ nominal: 2e-3, tolerance: 0 })))['ilimit']!;
    expect(with2m).toBeCloseTo(0.1 / 0.012, 12);
    // Relative shift −Rp/(Rs + Rp) = −1/6.
    expect(with2m / 10 - 1).toBeCloseTo(-1 / 6, 12);
  });
  it('worst case at 85 °C: Rp·(1 ± 30 %)·(1 ± 3930 ppm/K · 60 K) at the band ends', () => {
    const dT = 60;
    const rpHigh = 2e-3 * 1.3 * (1 + COPPER_TCR_PER_K * dT);
    const rpLow = 2e-3 * 0.7 * (1 - COPPER_TCR_PER_K * dT);
    const w = limits(spec({ nominal: 2e-3, tolerance: 0.3, tcrPerK: COPPER_TCR_PER_K }, 85));
    expect(w.min).toBeCloseTo(0.1 / (0.01 + rpHigh), 12);
    expect(w.max).toBeCloseTo(0.1 / (0.01 + rpLow), 12);
  });
  it('the loss at the limit is I²·(Rs + Rp): the pads dissipate too', () => {
    const loss = nominalOutputs(buildSupplyModel(spec({ nominal: 2e-3, tolerance: 0 })))['shuntLoss']!;
    const i = 0.1 / 0.012;
    expect(loss).toBeCloseTo(i * i * 0.012, 12);
  });
});

describe('parasitic series resistance in the design file', () => {
  it('defaults its TCR to copper\'s and says Kelvin sensing removes most of it', () => {
    const d = baseDesign();
    d.current.shunt.parasitic = { value: '5m', tolerance: '30%' };
    const r = resolveDesign(validateDesign(d));
    expect(r.spec.sense!.shunt.parasitic).toMatchObject({ name: 'RS pads', nominal: 5e-3, tolerance: 0.3, tcrPerK: COPPER_TCR_PER_K });
    // The fixture: RS 100 mΩ, so 5 mΩ moves the limit by −5/105 = −4.8 %.
    expect(r.notes.join(' ')).toMatch(/moving the limit by -4\.8 % nominal \(common practice concern\)\. Kelvin \(four-terminal\) sensing of the shunt removes most of it/);
    expect(r.nominal['ilimit']).toBeCloseTo((1 / 10) / 0.105, 9);
    expect(r.bom.map((l) => l.designator)).not.toContain('RS pads');
  });
  it('with an "auto" shunt, says the picker chose it without the parasitic', () => {
    const d = baseDesign();
    d.current.shunt = { value: 'auto', rating: '1 W', parasitic: { value: '1m', tolerance: '30%' } };
    d.current.gain = 'auto';
    const notes = resolveDesign(validateDesign(d)).notes.join(' ');
    expect(notes).toMatch(/Kelvin \(four-terminal\) sensing of the shunt removes most of it\. The current-sense picker chose RS without it/);
  });
});
