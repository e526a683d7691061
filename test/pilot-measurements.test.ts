// Reading a pilot build's CSV: every bad input is one line naming the file, line and column (unit tests on the
// reader), and through the command: exit 2, one stderr line, nothing written.
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { describeError, InputError } from '../src/errors.js';
import { readPilotCsv } from '../src/pilot/measurements.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { buildIfMissing, expectOneLineError, runTrimfree } from './cli-subprocess.js';

const OUTPUTS = [
  { name: 'vout', unit: 'V' },
  { name: 'ilimit', unit: 'A' },
  { name: 'shuntLoss', unit: 'W' },
];

const HEADER = 'unit,vout,ilimit,ambient';
function rows(n: number, first = 1): string[] {
  return Array.from({ length: n }, (_, i) => `U${first + i},8.4${i % 10},1.5${i % 10},23`);
}
const csv = (...lines: string[]): string => `${lines.join('\n')}\n`;

/** The one line the command would print for this CSV. */
function errorOf(text: string): { message: string } {
  try {
    readPilotCsv(text, 'm.csv', OUTPUTS);
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    return { message: describeError(error as InputError) };
  }
  throw new Error('no error');
}

describe('readPilotCsv: good input', () => {
  it('reads notation in cells, skips comment and blank lines, keeps ids and ambient; SI values', () => {
    const m = readPilotCsv(csv('# invented', HEADER, '', 'A,8.41,1.52A,22', '# a note', 'B,"8.40 V",1520mA,23.5 °C', ...rows(3)), 'm.csv', OUTPUTS);
    expect(m.outputs.map((o) => o.name)).toEqual(['vout', 'ilimit']);
    expect(m.outputs[0]!.values.slice(0, 2)).toEqual([8.41, 8.4]);
    expect(m.outputs[1]!.values.slice(0, 2)).toEqual([1.52, 1.52]);
    expect(m.unitIds.slice(0, 2)).toEqual(['A', 'B']);
    expect(m.lines.slice(0, 2)).toEqual([4, 6]);
    expect(m.ambientC!.slice(0, 2)).toEqual([22, 23.5]);
  });
  it('without unit and ambient columns: ids are line numbers, ambient null', () => {
    const m = readPilotCsv(csv('vout', '8.4', '8.41', '8.39', '8.42', '8.38'), 'm.csv', OUTPUTS);
    expect(m.unitIds[0]).toBe('line 2');
    expect(m.ambientC).toBeNull();
  });
});

describe('readPilotCsv: each bad input is one InputError naming line and column', () => {
  it('unknown column, with did you mean', () => {
    const e = errorOf(csv('unit,vuot,ilimit', ...rows(6)));
    expect(e.message).toMatch(/m\.csv line 1, column 2: unknown column 'vuot'; did you mean 'vout'\?/);
  });
  it('no output column at all (the outputs missing)', () => {
    const e = errorOf(csv('unit,ambient', 'A,23', 'B,23', 'C,23', 'D,23', 'E,23'));
    expect(e.message).toMatch(/m\.csv line 1: no measured output column .*accepted: columns named after the design's outputs \(vout, ilimit, shuntLoss\)/);
  });
  it('a column named twice', () => {
    expect(errorOf(csv('vout,vout', '1,2')).message).toMatch(/column 2: column 'vout' appears twice/);
  });
  it('an empty cell', () => {
    expect(errorOf(csv(HEADER, ...rows(3), 'U9,,1.5,23', ...rows(3, 20))).message).toMatch(/m\.csv line 5, column vout: empty cell/);
  });
  it('a short row counts as empty cells', () => {
    expect(errorOf(csv(HEADER, ...rows(5), 'U9,8.4')).message).toMatch(/line 7, column ilimit: empty cell/);
  });
  it('text in a number cell', () => {
    expect(errorOf(csv(HEADER, ...rows(2), 'U9,eight,1.5,23', ...rows(3, 20))).message).toMatch(/line 4, column vout: unexpected character 'e'.*accepted: a number with an optional SI prefix/);
  });
  it('a unit that does not fit the output', () => {
    expect(errorOf(csv(HEADER, ...rows(2), 'U9,8.4,1.52 V,23', ...rows(3, 20))).message).toMatch(/line 4, column ilimit: '1\.52 V' is a voltage, but column ilimit holds a current/);
  });
  it('duplicate unit ids', () => {
    expect(errorOf(csv(HEADER, 'U1,8.4,1.5,23', 'U2,8.4,1.5,23', 'U1,8.4,1.5,23', ...rows(3, 20))).message).toMatch(/line 4, column unit: unit id 'U1' already used on line 2/);
  });
  it('too few rows, saying which test needs how many', () => {
    expect(errorOf(csv(HEADER, ...rows(4))).message).toMatch(/m\.csv: 4 units measured: the Anderson–Darling shape test needs at least 5 \(Grubbs' outlier test 3, the t test of the mean and the σ interval 2\)/);
  });
  it('an implausible ambient', () => {
    expect(errorOf(csv(HEADER, ...rows(2), 'U9,8.4,1.5,900', ...rows(3, 20))).message).toMatch(/line 4, column ambient: 900 °C is not a plausible bench ambient/);
  });
  it('every unit reading the same value (no spread to test)', () => {
    expect(errorOf(csv('vout', '8.4', '8.4', '8.4', '8.4', '8.4')).message).toMatch(/m\.csv, column vout: every unit reads 8\.4 V: no spread/);
  });
  it('more cells than the header', () => {
    expect(errorOf(csv(HEADER, ...rows(2), 'U9,8.4,1.5,23,7', ...rows(3, 20))).message).toMatch(/line 4: 5 cells where the header has 4/);
  });
  it('an unclosed quote', () => {
    expect(errorOf(csv(HEADER, 'U1,"8.4,1.5,23')).message).toMatch(/m\.csv.*not a readable CSV/);
  });
});

describe('trimfree pilot: bad CSV input through the command (exit 2, one line, no report written)', () => {
  const dir = mkdtempSync(join(tmpdir(), 'trimfree-pilot-'));
  const design = join(PROJECT_ROOT, 'examples', 'charger-2s-liion.json');
  beforeAll(buildIfMissing);
  const cases: Array<[string, string, RegExp]> = [
    ['unknown column', csv('unit,vuot', ...rows(6).map((r) => r.split(',').slice(0, 2).join(','))), /column 2: unknown column 'vuot'; did you mean 'vout'\?/],
    ['empty cell', csv(HEADER, ...rows(5), 'U9,,1.5,23'), /line 7, column vout: empty cell/],
    ['text in a number cell', csv(HEADER, ...rows(5), 'U9,8.4,lots,23'), /line 7, column ilimit: unexpected character 'l'/],
    ['a unit that does not fit', csv(HEADER, ...rows(5), 'U9,1.5 A,1.5,23'), /line 7, column vout: '1\.5 A' is a current, but column vout holds a voltage/],
    ['duplicate ids', csv(HEADER, ...rows(5), 'U2,8.4,1.5,23'), /line 7, column unit: unit id 'U2' already used on line 3/],
    ['too few rows', csv(HEADER, ...rows(3)), /3 units measured: the Anderson–Darling shape test needs at least 5/],
  ];
  for (const [name, text, pattern] of cases) {
    it(name, () => {
      const file = join(dir, `${name.replace(/\W+/g, '-')}.csv`);
      const report = join(dir, `${name.replace(/\W+/g, '-')}.html`);
      writeFileSync(file, text);
      expectOneLineError(runTrimfree(['pilot', design, file, '--report', report]), pattern);
      expect(existsSync(report)).toBe(false);
    });
  }
  it('a missing CSV file', () => {
    expectOneLineError(runTrimfree(['pilot', design, join(dir, 'nothing.csv')]), /nothing\.csv: no such file; accepted: the path of a CSV/);
  });
  it('an existing report without --force is refused before any work', () => {
    const report = join(dir, 'exists.html');
    writeFileSync(report, 'keep me');
    expectOneLineError(runTrimfree(['pilot', design, join(PROJECT_ROOT, 'examples', 'pilot-charger.csv'), '--report', report]), /--report: .* already exists/);
  });
});
