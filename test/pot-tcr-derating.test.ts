// The adjustment pot's TCR and its power rating derated by the share of track in circuit (issue 11, section 5;
// the derating rule is common practice). The load ratio is checked against a brute-force sweep of the travel with
// the current taken from the divider's own output (adjustableVout), the TCR against the closed form by hand.
import { describe, expect, it } from 'vitest';
import { buildSupplyModel } from '../src/analysis/models/supply.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { adjustableVout } from '../src/circuits/adjustable-divider.js';
import { deratedPotRating, potRatedCurrent, potTrackLoadRatio, potTrackPeakCurrent } from '../src/circuits/pot-track-power.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { ImpossibleError } from '../src/errors.js';
import { baseDesign } from './design-fixture.js';

/** Highest dissipation / derated rating over the travel, by sweeping w on a fine grid (w > 0). */
function bruteForceRatio(vref: number, rtop: number, rbottom: number, rpot: number, leg: 'top' | 'bottom', ifb: number, rating: number): number {
  let worst = 0;
  for (let i = 1; i <= 100000; i++) {
    const w = i / 100000;
    const vout = adjustableVout(vref, rtop, rbottom, rpot, leg, w, ifb);
    // Current through the pot: the top leg carries (Vout − Vref)/Rtop_total, the bottom leg Vref/Rbottom_total.
    const current = leg === 'top' ? (vout - vref) / (rtop + w * rpot) : vref / (rbottom + w * rpot);
    const power = current * current * w * rpot;
    worst = Math.max(worst, power / deratedPotRating(rating, w));
  }
  return worst;
}

describe('pot track load against the derated rating', () => {
  it.each([
    ['top', 1e3, 1e3, 10e3, 100e-9, 0.25],
    ['bottom', 30e3, 1e3, 5e3, 0, 0.1],
  ] as const)('%s leg: the closed form I_max²·Rpot/rating matches the sweep', (leg, rtop, rbottom, rpot, ifb, rating) => {
    const closed = potTrackLoadRatio(potTrackPeakCurrent(1.25, rbottom, leg, ifb), rpot, rating);
    // The bottom-leg peak is approached as w → 0, so the grid's first point (w = 1e-5) is within Rpot·1e-5/Rbottom of it.
    expect(bruteForceRatio(1.25, rtop, rbottom, rpot, leg, ifb, rating)).toBeCloseTo(closed, leg === 'top' ? 12 : 3);
  });
  it('the rated current is the whole track\'s: √(rating/Rpot)', () => {
    expect(potRatedCurrent(0.25, 10e3)).toBeCloseTo(5e-3, 15);
  });
});

function adjustable(pot: Record<string, unknown>, temperature: Record<string, unknown>): Record<string, any> {
  const d = baseDesign();
  delete d.current;
  d.voltage = { target: '1.5..12 V', pot: { value: '10k', tolerance: '20%', leg: 'top', ...pot }, divider: { top: '1k', bottom: '1k' } };
  d.temperature = temperature;
  return d;
}

describe('pot TCR', () => {
  it('at 85 °C the top of travel reaches Vref·(1 + (Rtop + Rpot·(1 ± 20 %)·(1 ± 300e-6·60))/Rbot) with the rest exact', () => {
    const d = adjustable({ tcr: '300ppm' }, { fixed: 85 });
    d.reference.tolerance = 0;
    d.resistors = { tolerance: 0, tcr: 0 };
    const spec = resolveDesign(validateDesign(d)).spec;
    const w = worstCase(buildSupplyModel(spec)).find((o) => o.name === 'vout')!;
    expect(w.max).toBeCloseTo(1.25 * (1 + (1e3 + 10e3 * 1.2 * (1 + 300e-6 * 60)) / 1e3), 9);
    expect(w.min).toBeCloseTo(1.25 * (1 + (1e3 + 10e3 * 0.8 * (1 - 300e-6 * 60)) / 1e3), 9);
    expect(buildSupplyModel(spec).parts.map((p) => p.name)).toContain('RV TCR');
  });
});

describe('pot rating in the design file', () => {
  it('a rating that holds gives a note with the figures', () => {
    // Top leg: the track carries Vref/Rbot = 1.25 mA; 0.25 W over 10k allows 5 mA; load 1.25²/5² = 6 %.
    const r = resolveDesign(validateDesign(adjustable({ rating: '0.25 W' }, { min: 0, max: 50 })));
    expect(r.notes.join(' ')).toMatch(/track carries up to 1\.25 mA over its travel; .*250 mW rating is derated by that share \(common practice\), which allows 5\.00 mA at any setting \(6 % of the derated rating at worst\)/);
    expect(r.bom.find((l) => l.designator === 'RV')).toMatchObject({ ratingW: 0.25 });
  });
  it('a rating that does not hold is refused on voltage.pot.rating', () => {
    // 1 mW over 10k allows 316 µA, below 1.25 mA.
    try {
      resolveDesign(validateDesign(adjustable({ rating: '1 mW' }, { min: 0, max: 50 })));
      throw new Error('expected an error');
    } catch (error) {
      expect(error).toBeInstanceOf(ImpossibleError);
      expect((error as ImpossibleError).where).toBe('voltage.pot.rating');
      expect((error as ImpossibleError).message).toMatch(/allows 316 µA at any setting: 1563 % of the derated rating/);
    }
  });
});
