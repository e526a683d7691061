// A design held at one ambient other than 25 °C (temperature: { fixed }, issue 11 section 5): every analysis runs at
// that ambient, the worst case takes the TCRs and tempco through the full distance from 25 °C (closed form worked by
// hand), it is the same as a range of one temperature, and a pilot build without an ambient column is predicted at
// the design's ambient, not at 25 °C.
import { describe, expect, it } from 'vitest';
import { buildSupplyModel } from '../src/analysis/models/supply.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { predictPilot } from '../src/pilot/prediction.js';
import { baseDesign } from './design-fixture.js';

/** The fixture's voltage loop alone: Vref 1.25 V ±1 % with 50 ppm/K, RTOP 30k / RBOT 10k at 1 % (100 ppm/K, the grade's). */
function heldAt(temperature: Record<string, unknown>): Record<string, any> {
  const d = baseDesign();
  delete d.current;
  d.reference.tempco = '50ppm';
  d.temperature = temperature;
  return d;
}

const voutWorst = (d: Record<string, any>) => worstCase(buildSupplyModel(resolveDesign(validateDesign(d)).spec)).find((w) => w.name === 'vout')!;

describe('ambient held at 85 °C', () => {
  const d = heldAt({ fixed: '85 °C' });
  it('worst case is the closed form with every temperature coefficient through 60 K', () => {
    // vout = Vref·(1 + tc·ΔT)·(1 + RTOP·(1 + α·ΔT)/(RBOT·(1 + α·ΔT))) with ΔT = 60 K; highest with Vref, its tempco and
    // RTOP with its TCR at the top, RBOT with its TCR at the bottom (the TCRs of one unit are unknown within ±bound).
    const dT = 60;
    const high = 1.25 * 1.01 * (1 + 50e-6 * dT) * (1 + (30e3 * 1.01 * (1 + 100e-6 * dT)) / (10e3 * 0.99 * (1 - 100e-6 * dT)));
    const low = 1.25 * 0.99 * (1 - 50e-6 * dT) * (1 + (30e3 * 0.99 * (1 - 100e-6 * dT)) / (10e3 * 1.01 * (1 + 100e-6 * dT)));
    const w = voutWorst(d);
    expect(w.max).toBeCloseTo(high, 12);
    expect(w.min).toBeCloseTo(low, 12);
  });
  it('is the same analysis as a range of one temperature, and wider than at 25 °C', () => {
    const range = voutWorst(heldAt({ min: 85, max: 85 }));
    const held = voutWorst(d);
    expect([held.min, held.max]).toEqual([range.min, range.max]);
    const at25 = voutWorst(heldAt({ fixed: 25 }));
    expect(held.max - held.min).toBeGreaterThan(at25.max - at25.min);
  });
  it('the model says where the ambient is held, not "uniformly over 85..85"', () => {
    const notes = buildSupplyModel(resolveDesign(validateDesign(d)).spec).notes!.join(' ');
    expect(notes).toMatch(/ambient is held at 85 °C for every analysis; TCRs and tempcos act through the 60 K from 25 °C/);
    expect(notes).not.toMatch(/85\.\.85/);
  });
});

describe('pilot prediction of a design held at one ambient', () => {
  const choice = { trials: 4000, seed: 1, progress: false } as const;
  it('without an ambient column, predicts at the design ambient (40 °C), not 25 °C', async () => {
    const spec = resolveDesign(validateDesign(heldAt({ fixed: 40 }))).spec;
    const prediction = await predictPilot(spec, null, { ...choice });
    expect(prediction.ambientC).toBe(40);
    expect(prediction.ambientSource).toBe('design');
    expect(prediction.notes.join(' ')).toMatch(/design's one ambient, 40 °C/);
    expect(prediction.notes.join(' ')).not.toMatch(/outside the design's range/);
  });
  it('a measured ambient still wins, and a design over a range still defaults to 25 °C', async () => {
    const held = resolveDesign(validateDesign(heldAt({ fixed: 40 }))).spec;
    expect((await predictPilot(held, [38, 42], { ...choice })).ambientSource).toBe('measured');
    const ranged = resolveDesign(validateDesign(heldAt({ min: 0, max: 50 }))).spec;
    const p = await predictPilot(ranged, null, { ...choice });
    expect([p.ambientC, p.ambientSource]).toEqual([25, 'default']);
  });
});
