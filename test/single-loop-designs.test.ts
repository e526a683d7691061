// Single-loop designs (issue 11, section 5): a voltage-only design (a fixed-voltage regulator, no current section)
// and a current-only design (an LED driver with no voltage loop). Each resolves without a dummy section, the engine
// gives only its loop's outputs, the worst case matches the closed form worked by hand, and every command that
// reads a design file (spread, grades, design with its BOM and report, pilot) handles the missing outputs.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildSupplyModel } from '../src/analysis/models/supply.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { starterText } from '../src/design/templates.js';
import { buildIfMissing, runTrimfree } from './cli-subprocess.js';
import { baseDesign } from './design-fixture.js';

/** The fixture without its current section, at 25 °C only (no temperature: TCRs play no part). */
function voltageOnly(): Record<string, any> {
  const d = baseDesign();
  delete d.current;
  delete d.temperature;
  return d;
}

/** The fixture without its voltage section and reference, at 25 °C only. */
function currentOnly(): Record<string, any> {
  const d = baseDesign();
  delete d.voltage;
  delete d.reference;
  delete d.temperature;
  return d;
}

describe('voltage-only design', () => {
  const resolved = resolveDesign(validateDesign(voltageOnly()));
  it('has no sense path, no current outputs and only the divider in its BOM', () => {
    expect(resolved.spec.sense).toBeUndefined();
    expect(buildSupplyModel(resolved.spec).outputs.map((o) => o.name)).toEqual(['vout', 'dividerCurrent']);
    expect(resolved.bom.map((l) => l.designator)).toEqual(['RTOP', 'RBOT']);
    expect(resolved.notes.join(' ')).toMatch(/Voltage-only design/);
  });
  it('worst-case vout is the closed form Vref·(1 + Rtop/Rbot) at the band ends', () => {
    // Hand arithmetic: Vref 1.25 V ±1 %, RTOP 30k ±1 %, RBOT 10k ±1 %, no Ifb; vout rises with Vref and RTOP and falls with RBOT.
    const high = 1.25 * 1.01 * (1 + (30e3 * 1.01) / (10e3 * 0.99));
    const low = 1.25 * 0.99 * (1 + (30e3 * 0.99) / (10e3 * 1.01));
    const vout = worstCase(buildSupplyModel(resolved.spec)).find((w) => w.name === 'vout')!;
    expect(vout.max).toBeCloseTo(high, 12);
    expect(vout.min).toBeCloseTo(low, 12);
    expect(resolved.nominal['vout']).toBeCloseTo(5, 12);
  });
  it('gives the same vout worst case as the two-loop design it was cut from (the sense path never reaches vout)', () => {
    const both = baseDesign();
    delete both.temperature;
    const full = worstCase(buildSupplyModel(resolveDesign(validateDesign(both)).spec)).find((w) => w.name === 'vout')!;
    const single = worstCase(buildSupplyModel(resolved.spec)).find((w) => w.name === 'vout')!;
    expect([single.min, single.max]).toEqual([full.min, full.max]);
  });
});

describe('current-only design', () => {
  const resolved = resolveDesign(validateDesign(currentOnly()));
  it('has no divider, no reference, no voltage outputs and only the sense parts in its BOM', () => {
    expect(resolved.spec.divider).toBeUndefined();
    expect(resolved.spec.reference).toBeUndefined();
    expect(buildSupplyModel(resolved.spec).outputs.map((o) => o.name)).toEqual(['ilimit', 'shuntLoss', 'ampOutput']);
    expect(resolved.bom.map((l) => l.designator)).toEqual(['RS', 'RF', 'RG']);
    expect(resolved.notes.join(' ')).toMatch(/Current-only design/);
  });
  it('worst-case limit is the closed form ((Vth − Ib·RF)/G − Vos)/Rs at the band ends', () => {
    // Hand arithmetic (src/circuits/sense/noninv.ts header): Vth 1.0 V ±1 %, G = 1 + RF/RG with RF 9k, RG 1k ±1 %,
    // Vos ±1 mV, Ib 0, RS 100 mΩ ±1 %. The limit rises with Vth, falls with G, falls with Vos and with RS.
    const gMin = 1 + (9e3 * 0.99) / (1e3 * 1.01);
    const gMax = 1 + (9e3 * 1.01) / (1e3 * 0.99);
    const high = ((1.0 * 1.01) / gMin + 1e-3) / (0.1 * 0.99);
    const low = ((1.0 * 0.99) / gMax - 1e-3) / (0.1 * 1.01);
    const ilimit = worstCase(buildSupplyModel(resolved.spec)).find((w) => w.name === 'ilimit')!;
    expect(ilimit.max).toBeCloseTo(high, 12);
    expect(ilimit.min).toBeCloseTo(low, 12);
    expect(resolved.nominal['ilimit']).toBeCloseTo(1, 12);
  });
  it('refuses a threshold divided from a regulator reference it does not have (engine level)', () => {
    const spec = structuredClone(resolved.spec);
    spec.sense!.threshold = { kind: 'divided', source: 'regulator-reference', top: { name: 'RT1', nominal: 1e3, tolerance: 0.01 }, bottom: { name: 'RT2', nominal: 1e3, tolerance: 0.01 } };
    expect(() => buildSupplyModel(spec)).toThrow(/regulator reference, but the supply has none/);
  });
});

describe('every command that reads a design handles a single loop', () => {
  let dir = '';
  beforeAll(() => {
    buildIfMissing();
    dir = mkdtempSync(join(tmpdir(), 'trimfree-single-loop-'));
  });
  const cases = [
    { kind: 'voltage-only', outputs: ['vout', 'dividerCurrent'], absent: ['ilimit', 'shuntLoss', 'ampOutput'], measured: 'vout', value: (i: number) => 3.3 + 0.01 * (i - 2) },
    { kind: 'current-only', outputs: ['ilimit', 'shuntLoss', 'ampOutput'], absent: ['vout', 'dividerCurrent'], measured: 'ilimit', value: (i: number) => 0.35 + 0.002 * (i - 2) },
  ] as const;
  for (const c of cases) {
    it(`${c.kind}: the init starter through spread, grades, design (BOM, report) and pilot`, () => {
      const file = join(dir, `${c.kind}.json`);
      writeFileSync(file, starterText(c.kind));
      const spread = runTrimfree(['spread', file, '--trials', '4000', '--json']);
      expect(spread.status, spread.stderr).toBe(0);
      const outputs = Object.keys(JSON.parse(spread.stdout).outputs);
      expect(outputs).toEqual([...c.outputs]);

      const grades = runTrimfree(['grades', file, '--trials', '4000', '--json']);
      expect(grades.status, grades.stderr).toBe(0);
      for (const name of c.absent) expect(grades.stdout).not.toContain(`"${name}"`);

      const bom = join(dir, `${c.kind}-bom.csv`);
      const report = join(dir, `${c.kind}.html`);
      const design = runTrimfree(['design', file, '--trials', '4000', '--bom', bom, '--report', report]);
      expect(design.status, design.stderr).toBe(0);
      expect(design.stdout).not.toMatch(/NaN|Infinity|undefined/);
      const bomText = readFileSync(bom, 'utf8');
      expect(bomText).toMatch(c.kind === 'voltage-only' ? /^RTOP,/m : /^RS,/m);
      expect(bomText).not.toMatch(c.kind === 'voltage-only' ? /^RS,/m : /^RTOP,/m);
      expect(readFileSync(report, 'utf8')).not.toMatch(/NaN|undefined/);

      const csv = join(dir, `${c.kind}-pilot.csv`);
      writeFileSync(csv, `unit,${c.measured}\n${[0, 1, 2, 3, 4].map((i) => `U${i},${c.value(i)}`).join('\n')}\n`);
      const pilot = runTrimfree(['pilot', file, csv, '--json']);
      expect(pilot.status, pilot.stderr).toBe(0);
      expect(Object.keys(JSON.parse(pilot.stdout).outputs)).toEqual([c.measured]);
    });
  }
});
