// Two-resistor divider legs in a design file (src/design/divider-leg.ts): "6R8 + 2K2", "10k ∥ 47k" and the
// structured { series: [a, b] } / { parallel: [a, b] }. Expected values: the closed forms a + b and a·b/(a + b), the
// divider Vout = Vref·(1 + Rtop/Rbottom) (Ifb = 0), Joule's law for each part's power, and vertex enumeration of
// that formula for the worst case. The round trip pastes what `trimfree divider --parts 3` prints into a design file.
import { beforeAll, describe, expect, it } from 'vitest';
import { cornerExtremes } from '../src/analysis/corners.js';
import { gradableResistors } from '../src/analysis/graded-spec.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { runSpread } from '../src/design/spread-study.js';
import { buildIfMissing, runTrimfree } from './cli-subprocess.js';
import { baseDesign } from './design-fixture.js';

beforeAll(buildIfMissing, 120_000);

const VREF = 1.25;
const vout = (rtop: number, rbottom: number): number => VREF * (1 + rtop / rbottom);
const parallel = (a: number, b: number): number => (a * b) / (a + b);

/** The base design at 8.4 V ±2 % with the given divider legs, at one ambient (25 °C: TCR plays no part). */
function design(top: unknown, bottom: unknown, more: (d: Record<string, any>) => void = () => {}): Record<string, any> {
  const d = baseDesign();
  d.voltage = { target: '8.4 V', window: '±2%', divider: { top, bottom } };
  d.temperature = { fixed: 25 };
  more(d);
  return d;
}
const resolve = (d: Record<string, any>) => resolveDesign(validateDesign(d));

describe('a design with a three-part divider', () => {
  it('series bottom leg "820R + 3K9": nominal Vout, both parts in the model and the BOM (closed form, Joule)', () => {
    const r = resolve(design('27K', '820R + 3K9'));
    // Rbottom = 820 + 3900 = 4720 Ω; Vout = 1.25·(1 + 27000/4720) = 8.40042… V.
    expect(r.nominal['vout']).toBeCloseTo(vout(27000, 4720), 12);
    expect(r.spec.divider!.bottom).toMatchObject({ arrangement: 'series', resistors: [{ name: 'RBOT_A', nominal: 820 }, { name: 'RBOT_B', nominal: 3900 }] });
    // The leg current 1.25/4720 A flows through each part: P = I²·R.
    const i = VREF / 4720;
    const bom = Object.fromEntries(r.bom.map((l) => [l.designator, l]));
    expect(Object.keys(bom)).toEqual(expect.arrayContaining(['RTOP', 'RBOT_A', 'RBOT_B']));
    expect(bom['RBOT']).toBeUndefined();
    expect(bom['RBOT_A']!.powerW).toBeCloseTo(i * i * 820, 15);
    expect(bom['RBOT_B']!.powerW).toBeCloseTo(i * i * 3900, 15);
    expect(bom['RBOT_A']!.code).toBe('820R');
    expect(bom['RBOT_B']!.code).toBe('3K9');
    expect(bom['RTOP']!.powerW).toBeCloseTo(i * i * 27000, 15);
    expect(gradableResistors(r.spec).map((g) => g.name)).toEqual(expect.arrayContaining(['RTOP', 'RBOT_A', 'RBOT_B']));
  });

  it('structured parallel bottom leg: Vout and each part at the leg voltage Vref (closed form)', () => {
    const r = resolve(design('180K', { parallel: ['33K', '680K'] }));
    expect(r.nominal['vout']).toBeCloseTo(vout(180e3, parallel(33e3, 680e3)), 12);
    const power = (d: string) => r.bom.find((l) => l.designator === d)!.powerW;
    // Each parallel part has Vref across it: P = Vref²/R (47 µW and 2.3 µW, as `divider` prints for this pair).
    expect(power('RBOT_A')).toBeCloseTo((VREF * VREF) / 33e3, 15);
    expect(power('RBOT_B')).toBeCloseTo((VREF * VREF) / 680e3, 15);
  });

  it('the printed notations and the structured form give the same leg', () => {
    const forms = ['6R8 + 2K2', '6R8+2K2', '6.80 Ω + 2.20 kΩ', { series: ['6R8', 2200] }];
    for (const bottom of forms) {
      const leg = validateDesign(design('10K', bottom)).voltage!.divider;
      expect(leg === 'auto' ? null : leg.bottom).toEqual({ parts: [6.8, 2200], arrangement: 'series', ohms: 2206.8 });
    }
    for (const top of ['10k ∥ 47k', '10K∥47K', '10k || 47k', { parallel: ['10k', '47k'] }]) {
      const leg = validateDesign(design(top, '1K')).voltage!.divider;
      expect(leg === 'auto' ? null : leg.top.ohms).toBeCloseTo(parallel(10e3, 47e3), 9);
    }
  });

  it('grades: a leg override applies to both parts, a part override to that part only', () => {
    const tolerance = (r: ReturnType<typeof resolve>, name: string) => gradableResistors(r.spec).find((g) => g.name === name)!.tolerance;
    const leg = resolve(design('27K', '820R + 3K9', (d) => (d.resistors.overrides = { RBOT: { grade: '0.1%' } })));
    expect([tolerance(leg, 'RBOT_A'), tolerance(leg, 'RBOT_B'), tolerance(leg, 'RTOP')]).toEqual([0.001, 0.001, 0.01]);
    const part = resolve(design('27K', '820R + 3K9', (d) => (d.resistors.overrides = { RBOT: { grade: '0.1%' }, RBOT_B: { grade: '5%' } })));
    expect([tolerance(part, 'RBOT_A'), tolerance(part, 'RBOT_B')]).toEqual([0.001, 0.05]);
  });

  it('spread: worst case equals vertex enumeration over Vref and the three resistors; contributions name both parts', async () => {
    const r = resolve(design('27K', '820R + 3K9'));
    const run = await runSpread(r, { trials: 5000, seed: 1, workers: 1, progress: false });
    const out = run.result.outputs['vout']!;
    // x = [Vref, RTOP, RBOT_A, RBOT_B], each ±1 % (reference 1 %, grade 1 %).
    const nominal = [VREF, 27000, 820, 3900];
    const f = (x: Float64Array) => vout(x[1]!, x[2]! + x[3]!) * (x[0]! / VREF);
    const corners = cornerExtremes(f, nominal.map((x) => x * 0.99), nominal.map((x) => x * 1.01));
    expect(out.worstCase.min).toBeCloseTo(corners.min, 9);
    expect(out.worstCase.max).toBeCloseTo(corners.max, 9);
    expect(out.contributions.map((c) => c.part)).toEqual(expect.arrayContaining(['RTOP', 'RBOT_A', 'RBOT_B']));
  }, 60_000);
});

describe('"auto" with voltage.search.parts 3', () => {
  it('fills a leg of two parts when one value per leg cannot hit the target (E12, 8.4 V from 1.25 V)', () => {
    const auto = (parts?: number) => resolve(design('x', 'x', (d) => {
      d.voltage.divider = 'auto';
      d.voltage.search = { series: 'E12', ...(parts ? { parts } : {}) };
    }));
    const two = auto();
    const three = auto(3);
    // 1.25·(1 + 5.72) = 8.4 exactly with a leg ratio of 5.72 (e.g. (1K2 + 56K)/10K): a 3-part divider has it,
    // no E12 pair does (the nearest E12 ratios are 47/8.2 = 5.732 and 56/10 = 5.6, 14 mV and 150 mV off).
    expect(three.nominal['vout']).toBeCloseTo(8.4, 9);
    expect(Math.abs(two.nominal['vout']! - 8.4)).toBeGreaterThan(1e-3);
    const names = three.bom.map((l) => l.designator);
    expect(names.filter((n) => /^R(TOP|BOT)_[AB]$/.test(n))).toHaveLength(2);
    expect(three.notes.join('\n')).toMatch(/up to 3 parts/);
  });
});

describe('round trip: what `trimfree divider --parts 3` prints, pasted into a design file', () => {
  it('gives the same nominal Vout as the printed one', () => {
    const r = runTrimfree(['divider', '--vref', '1.25', '--vout', '8.4', '--parts', '3', '--series', 'E12']);
    expect(r.status).toBe(0);
    // Each two-part leg prints "a + b" (or "a ∥ b") on its row and "= R (codes)" on the next: take the codes.
    const rows = r.stdout.split('\n').filter((l) => l.startsWith('│'));
    let checked = 0;
    for (let k = 0; k + 1 < rows.length; k++) {
      const cells = rows[k]!.split('│').map((c) => c.trim());
      const next = rows[k + 1]!.split('│').map((c) => c.trim());
      if (!/^\d+$/.test(cells[1] ?? '')) continue;
      const leg = (cell: string, codes: string): string => (/[+∥]/.test(cell) ? /\(([^)]*)\)/.exec(codes)![1]! : cell.split(' ').at(-1)!);
      const top = leg(cells[2]!, next[2]!);
      const bottom = leg(cells[3]!, next[3]!);
      const printed = Number(/([\d.]+) V/.exec(cells[5]!)![1]);
      // Both printed forms: the codes ("1K2+56K") and the values ("1.20 kΩ + 56.0 kΩ").
      const resolved = resolve(design(top, bottom));
      expect(resolved.nominal['vout']).toBeCloseTo(printed, 4);
      if (/[+∥]/.test(cells[2]!)) expect(resolve(design(cells[2]!, bottom)).nominal['vout']).toBeCloseTo(resolved.nominal['vout']!, 12);
      if (/[+∥]/.test(cells[3]!)) expect(resolve(design(top, cells[3]!)).nominal['vout']).toBeCloseTo(resolved.nominal['vout']!, 12);
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(5);
  });
});
