// The purchase BOM: CSV per RFC 4180 read back by csv-parse (a general-purpose reader, not ours), plain SI numbers,
// IEC 60062 tolerance letters, the chip-size pick against a brute force, the worst-case bound against its closed
// form, and `design --bom` as a user runs it (atomic, never over a file without --force, one-line errors).
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadChipSizes, smallestChip, type ChipSizeTable } from '../src/design/chip-sizes.js';
import { loadDesignFile } from '../src/design/load.js';
import { purchaseBom, type PurchaseBomLine } from '../src/design/purchase-bom.js';
import { resolveDesign } from '../src/design/resolve.js';
import { runSpread, type SpreadRun } from '../src/design/spread-study.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { BOM_CSV_COLUMNS, renderBomCsv } from '../src/report/bom-csv.js';
import { csvRecord, plainNumber } from '../src/report/csv.js';
import { toleranceLetter } from '../src/units/index.js';
import { buildIfMissing, expectOneLineError, runTrimfree } from './cli-subprocess.js';

const CHARGER = join(PROJECT_ROOT, 'examples', 'charger-2s-liion.json');
const LED = join(PROJECT_ROOT, 'examples', 'led-driver-highside.json');

function parseCsv(text: string): string[][] {
  // csv-parse in strict RFC 4180 mode: quoted fields, CRLF records, no trimming, every record the same width.
  return parse(text, { record_delimiter: '\r\n', relax_column_count: false, relax_quotes: false }) as string[][];
}

describe('CSV writer (RFC 4180, section 2)', () => {
  it('any text survives a round trip through csv-parse, commas, quotes and line breaks included', () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.string({ unit: fc.constantFrom('a', ',', '"', '\r', '\n', ' ', 'Ω', '1') }), { minLength: 2, maxLength: 2 }), { minLength: 1, maxLength: 6 }), (rows) => {
        const text = rows.map((r) => csvRecord(r)).join('');
        expect(parseCsv(text)).toEqual(rows);
      }),
    );
  });

  it('quotes only what needs quoting (RFC 4180 2.6, 2.7)', () => {
    expect(csvRecord(['RTOP', 'feedback divider, top', 'say "hi"', '2 lines\nhere'])).toBe('RTOP,"feedback divider, top","say ""hi""","2 lines\nhere"\r\n');
  });

  it('numbers are plain decimals: no exponent, no thousands separator, and read back within the digits kept', () => {
    expect(plainNumber(4700)).toBe('4700');
    expect(plainNumber(1_000_000)).toBe('1000000');
    expect(plainNumber(5e-5)).toBe('0.00005');
    expect(plainNumber(0.1 + 0.2)).toBe('0.3');
    expect(plainNumber(-0.000123456789)).toBe('-0.000123457');
    expect(() => plainNumber(Number.NaN)).toThrow(RangeError);
    fc.assert(
      fc.property(fc.double({ min: -1e15, max: 1e15, noNaN: true }).filter((x) => x === 0 || Math.abs(x) > 1e-15), (x) => {
        const text = plainNumber(x);
        expect(text).toMatch(/^-?[0-9]+(\.[0-9]+)?$/);
        expect(Math.abs(Number(text) - x)).toBeLessThanOrEqual(Math.abs(x) * 5e-6);
      }),
    );
  });
});

describe('IEC 60062:2016 tolerance letters', () => {
  it('the usual resistor letters, and none for a tolerance the code does not list', () => {
    expect([0.0005, 0.001, 0.0025, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2].map((t) => toleranceLetter(t))).toEqual(['W', 'B', 'C', 'D', 'F', 'G', 'J', 'K', 'M']);
    expect(toleranceLetter(0.03)).toBeUndefined();
    expect(toleranceLetter(0.1 * 0.1)).toBe('F'); // 0.010000000000000002
  });
});

describe('chip-size table', () => {
  const table = loadChipSizes();

  it('series/chip-sizes.json is marked common practice and lists sizes in order of rated power', () => {
    expect(table.source).toMatch(/^Common practice/);
    expect(table.sizes.map((s) => s.size)).toEqual(['0201', '0402', '0603', '0805', '1206', '1210', '2010', '2512']);
    expect(table.powerDerating).toBe(0.5);
  });

  it('smallestChip is the first size a brute force over the table accepts', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1.2, noNaN: true }), fc.double({ min: 0, max: 250, noNaN: true }), (power, voltage) => {
        const fits = (t: ChipSizeTable, i: number): boolean => t.sizes[i]!.ratedPowerW * t.powerDerating >= power && t.sizes[i]!.maxVoltageV >= voltage;
        const index = table.sizes.findIndex((_, i) => fits(table, i));
        expect(smallestChip(table, power, voltage)?.size).toBe(index < 0 ? undefined : table.sizes[index]!.size);
      }),
    );
    // Hand check: 0.2 W derated by half needs 0.4 W of rating: 1210 (0.5 W) is the first.
    expect(smallestChip(table, 0.2, 5)?.size).toBe('1210');
    expect(smallestChip(table, 0.6, 5)).toBeUndefined();
  });

  it("a user's table with a bad field names the field; one out of order is refused", () => {
    const folder = mkdtempSync(join(tmpdir(), 'trimfree-chips-'));
    const bad = join(folder, 'bad.json');
    writeFileSync(bad, JSON.stringify({ source: 'mine', powerDerating: 0.5, sizes: [{ size: '0603', ratedPowerW: -1, maxVoltageV: 50 }] }));
    expect(() => loadChipSizes(bad, '--chip-sizes')).toThrow(expect.objectContaining({ where: '--chip-sizes: sizes.0.ratedPowerW' }));
    const order = join(folder, 'order.json');
    writeFileSync(order, JSON.stringify({ source: 'mine', powerDerating: 0.5, sizes: [{ size: '1206', ratedPowerW: 0.25, maxVoltageV: 200 }, { size: '0603', ratedPowerW: 0.1, maxVoltageV: 75 }] }));
    expect(() => loadChipSizes(order, '--chip-sizes')).toThrow(expect.objectContaining({ where: '--chip-sizes: sizes.1.ratedPowerW' }));
  });
});

describe('the purchase BOM of the charger example', () => {
  let run: SpreadRun;
  let lines: PurchaseBomLine[];
  const table = loadChipSizes();

  beforeAll(async () => {
    run = await runSpread(resolveDesign(loadDesignFile(CHARGER)), { trials: 20000, seed: 1, workers: 1, progress: false });
    lines = purchaseBom(run.resolved.bom, run.result, table);
  }, 60_000);

  it('the shunt at worst case: I²R with the worst-case maximum limit current and the shunt at the top of its tolerance (closed form)', () => {
    const rs = lines.find((l) => l.designator === 'RS')!;
    const iMax = run.result.outputs['ilimit']!.worstCase.max;
    const rHigh = rs.ohms * (1 + rs.tolerance);
    expect(rs.powerWorstCaseW).toBeCloseTo(iMax * iMax * rHigh, 12);
    expect(rs.voltageWorstCaseV).toBeCloseTo(iMax * rHigh, 12);
    expect(rs.toleranceLetter).toBe('F');
  });

  it('every worst-case power is at least the operating-point power, and each chip covers it with the derating', () => {
    for (const l of lines) {
      expect(l.powerWorstCaseW).toBeGreaterThanOrEqual(l.powerW);
      const chip = table.sizes.find((s) => s.size === l.chipSize);
      if (chip) {
        expect(chip.ratedPowerW * table.powerDerating).toBeGreaterThanOrEqual(l.powerWorstCaseW);
        expect(chip.maxVoltageV).toBeGreaterThanOrEqual(l.voltageWorstCaseV);
      }
    }
  });

  it('the CSV reads back through csv-parse to the same lines: one record per part, every figure within its digits', () => {
    const records = parseCsv(renderBomCsv(lines));
    expect(records[0]).toEqual([...BOM_CSV_COLUMNS]);
    expect(records).toHaveLength(lines.length + 1);
    const column = (name: (typeof BOM_CSV_COLUMNS)[number]): number => BOM_CSV_COLUMNS.indexOf(name);
    lines.forEach((l, i) => {
      const r = records[i + 1]!;
      expect(r[column('designator')]).toBe(l.designator);
      expect(r[column('role')]).toBe(l.role);
      expect(r[column('IEC 60062 code')]).toBe(l.code);
      expect(Number(r[column('value (ohm)')])).toBeCloseTo(l.ohms, 6);
      expect(Number(r[column('tolerance (fraction)')])).toBe(l.tolerance);
      expect(Number(r[column('TCR (1/K)')]) / l.tcrPerK).toBeCloseTo(1, 5);
      expect(Number(r[column('power at worst case (W)')]) / l.powerWorstCaseW).toBeCloseTo(1, 3);
      expect(Number(r[column('voltage at worst case (V)')]) / l.voltageWorstCaseV).toBeCloseTo(1, 3);
      expect(r[column('members')]).toBe('');
    });
  });

  it('a network line (the hook for resistor networks) is one record listing its members', () => {
    const network: PurchaseBomLine = { ...lines[0]!, designator: 'RN1', members: ['RTOP', 'RBOT'], role: 'divider network, "matched", 2 resistors' };
    const records = parseCsv(renderBomCsv([network]));
    expect(records).toHaveLength(2);
    expect(records[1]![BOM_CSV_COLUMNS.indexOf('members')]).toBe('RTOP RBOT');
    expect(records[1]![BOM_CSV_COLUMNS.indexOf('role')]).toBe(network.role);
  });
});

describe('the purchase BOM of the adjustable example', () => {
  it('the pot gets no chip size (not a chip resistor), with the reason in its place', async () => {
    const run = await runSpread(resolveDesign(loadDesignFile(join(PROJECT_ROOT, 'examples', 'bench-adjustable.json'))), { trials: 5000, seed: 1, workers: 1, progress: false });
    const lines = purchaseBom(run.resolved.bom, run.result, loadChipSizes());
    const pot = lines.find((l) => l.designator === 'RV')!;
    expect(pot.chipSize).toBeNull();
    expect(pot.chipSizeNote).toMatch(/not a chip resistor/);
    const records = parseCsv(renderBomCsv(lines));
    expect(records.find((r) => r[0] === 'RV')![BOM_CSV_COLUMNS.indexOf('chip size')]).toBe(pot.chipSizeNote);
  }, 60_000);
});

describe('design --bom as a user runs it', () => {
  beforeAll(buildIfMissing, 120_000);

  it('writes the CSV, refuses to overwrite it without --force, and the --json BOM carries the same lines', () => {
    const folder = mkdtempSync(join(tmpdir(), 'trimfree-bom-'));
    const file = join(folder, 'bom.csv');
    const args = ['design', LED, '--no-grades', '--trials', '5000', '--seed', '3', '--workers', '1'];
    const first = runTrimfree([...args, '--bom', file]);
    expect(first.status).toBe(0);
    expect(first.stderr).toContain(`wrote ${file}`);
    const records = parseCsv(readFileSync(file, 'utf8'));
    const json = JSON.parse(runTrimfree([...args, '--json']).stdout) as { bom: PurchaseBomLine[] };
    expect(records.slice(1).map((r) => r[0])).toEqual(json.bom.map((l) => l.designator));
    expect(json.bom.every((l) => typeof l.powerWorstCaseW === 'number' && (l.chipSize !== null) !== (l.chipSizeNote !== null))).toBe(true);
    const before = readFileSync(file, 'utf8');
    expectOneLineError(runTrimfree([...args, '--bom', file]), /^trimfree: --bom: .*already exists.*--force/);
    expect(readFileSync(file, 'utf8')).toBe(before);
    expect(runTrimfree([...args, '--bom', file, '--force']).status).toBe(0);
  }, 120_000);

  it('a missing --chip-sizes file is one line naming the option', () => {
    const folder = mkdtempSync(join(tmpdir(), 'trimfree-bom-'));
    expectOneLineError(runTrimfree(['design', LED, '--no-grades', '--chip-sizes', join(folder, 'none.json')]), /^trimfree: --chip-sizes: no such file: .*none\.json; accepted: a JSON object/);
  });
});
