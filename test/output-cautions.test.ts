// Cautions that quote the analysed figures (src/design/output-cautions.ts), and the one-ambient design mode. The
// expected numbers are the analysis's own worst case and sweep, read back: the test checks that the caution quotes
// them and fires exactly when the worst case crosses the limit the design gave.
import { describe, expect, it } from 'vitest';
import { validateDesign } from '../src/design/load.js';
import { InputError } from '../src/errors.js';
import { resolveDesign } from '../src/design/resolve.js';
import { runSpread } from '../src/design/spread-study.js';
import { formatEngineering } from '../src/units/index.js';
import { baseDesign } from './design-fixture.js';

const CHOICE = { trials: 20_000, seed: 5, workers: 1, progress: false } as const;

async function spreadOf(design: Record<string, any>) {
  return runSpread(resolveDesign(validateDesign(design)), CHOICE);
}

describe('cautions with numbers', () => {
  it('a 1S charger: the caution quotes the worst case, the 99.865 % figure and the window; says ABOVE when the worst case passes its top', async () => {
    const design = baseDesign();
    design.application = 'charger';
    design.reference = { voltage: '1.25 V', tolerance: '0.5%' };
    design.voltage = { target: '4.2 V', window: '4.17..4.23 V', divider: { top: '30K1', bottom: '12K7' } };
    const run = await spreadOf(design);
    const worst = run.result.outputs.vout!.worstCase.max;
    expect(worst).toBeGreaterThan(4.23); // 0.5 % reference alone reaches past the window
    const caution = run.resolved.cautions.find((c) => c.startsWith('Charge voltage:'))!;
    expect(caution).toContain(formatEngineering(worst, 'V', 4));
    expect(caution).toContain('4.170 V … 4.230 V');
    expect(caution).toContain('ABOVE');
    expect(caution).toMatch(/99\.865 % of units at -?\d+(\.\d+)? °C/);
  });

  it('absoluteMax: a caution only when the worst case exceeds it', async () => {
    const design = baseDesign();
    const probe = await spreadOf(design);
    const worst = probe.result.outputs.vout!.worstCase.max;
    design.voltage.absoluteMax = `${worst * 0.999} V`;
    expect((await spreadOf(design)).resolved.cautions.some((c) => c.includes('exceeds the absolute maximum'))).toBe(true);
    design.voltage.absoluteMax = `${worst * 1.001} V`;
    expect((await spreadOf(design)).resolved.cautions.some((c) => c.includes('absolute maximum'))).toBe(false);
  });
});

describe('one ambient: temperature { fixed }', () => {
  it('every unit is checked at that ambient only, so the per-unit and random-ambient yields are one count', async () => {
    const design = baseDesign();
    design.temperature = { fixed: '40 °C' };
    const run = await spreadOf(design);
    expect(run.result.ambientGridC).toEqual([40]);
    const vout = run.result.outputs.vout!;
    expect(vout.yield!.pct).toBe(vout.yieldAtRandomAmbient!.pct);
    expect(run.resolved.notes.some((n) => n.includes('every figure is at 40 °C'))).toBe(true);
  });

  it('fixed with min or max, or min without max, is refused with the field named', () => {
    const whereOf = (temperature: unknown): string => {
      const design = baseDesign();
      design.temperature = temperature;
      try {
        validateDesign(design);
      } catch (error) {
        expect(error).toBeInstanceOf(InputError);
        return `${(error as InputError).where}: ${(error as InputError).accepted}`;
      }
      return 'accepted';
    };
    expect(whereOf({ fixed: 40, min: 0 })).toMatch(/^temperature\.fixed: \{ min, max \} for a range, or \{ fixed \}/);
    expect(whereOf({ min: 0 })).toMatch(/^temperature\.max: /);
    expect(whereOf({ fixed: '40 °C' })).toBe('accepted');
  });
});
