// `trimfree values` and `trimfree nearest` as a user runs them: subprocesses of the built CLI (npm test builds
// dist/ first; this file builds it if it is missing). Expected values: IEC 60063:2015 Table 1 (E24, E6) and
// Table 2 (E96), hand arithmetic for errors and pairs.
import { beforeAll, describe, expect, it } from 'vitest';
import { buildIfMissing, expectOneLineError, runTrimfree, type CliRun } from './cli-subprocess.js';


beforeAll(buildIfMissing, 120_000);

function cli(...args: string[]): CliRun {
  return runTrimfree(args);
}


describe('trimfree values (subprocess)', () => {
  it('E24 from 1k to 10k: the 24 values of IEC 60063:2015 Table 1 plus 10k, as a table with RKM codes', () => {
    const r = cli('values', 'E24', '--from', '1k', '--to', '10k');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/E24: 25 values from 1\.00 kΩ to 10\.0 kΩ/);
    expect(r.stdout).toMatch(/│ +17 │ 4\.70 kΩ │ 4K7 +│/);
    expect(r.stdout).toMatch(/IEC 60063:2015 Table 1/);
    expect(r.stdout).not.toMatch(/NaN|Infinity|undefined/);
  });
  it('--json gives the values in ohms (E6, 1 Ω to 100 Ω: 13 values)', () => {
    const r = cli('values', 'e6', '--from', '1R0', '--to', '100R', '--json');
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual([1, 1.5, 2.2, 3.3, 4.7, 6.8, 10, 15, 22, 33, 47, 68, 100]);
  });
  it('the default range is one decade, 1 kΩ to 10 kΩ (E96: 96 values + 10 k)', () => {
    const values = JSON.parse(cli('values', 'E96', '--json').stdout) as number[];
    expect(values).toHaveLength(97);
    expect(values[0]).toBe(1000);
    expect(values.at(-2)).toBe(9760);
    expect(values.at(-1)).toBe(10000);
  });
  it('--help shows the default range and examples', () => {
    const r = cli('values', '--help');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/default: 1k/);
    expect(r.stdout).toMatch(/Examples:/);
  });
  it('an unknown series lists the valid names', () => {
    expectOneLineError(cli('values', 'E25'), /unknown series 'E25'; accepted: E3, E6, E12, E24, E48, E96, E192/);
  });
  it('an inverted range says so', () => {
    expectOneLineError(cli('values', 'E24', '--from', '10k', '--to', '1k'), /--from\/--to: range is inverted/);
  });
  it('a range holding no value says so', () => {
    expectOneLineError(cli('values', 'E6', '--from', '4.8k', '--to', '4.9k'), /no E6 value lies between 4\.80 kΩ and 4\.90 kΩ/);
  });
  it('a malformed bound names the character and the option', () => {
    expectOneLineError(cli('values', 'E24', '--from', '1meg'), /--from: unexpected character 'e' at position 3 in '1meg'/);
  });
  it('a zero bound is refused', () => {
    expectOneLineError(cli('values', 'E24', '--from', '0'), /--from: resistance must be greater than zero/);
  });
});

describe('trimfree nearest (subprocess)', () => {
  it('28.38k in E96: 28.0 k below, 28.7 k above and nearest, and 24.9 k + 3.48 k exact (hand arithmetic)', () => {
    const r = cli('nearest', '28.38k', '--series', 'E96');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/│ below +│ 28\.0 kΩ │ 28K0 │ -1\.339 % │/);
    expect(r.stdout).toMatch(/│ nearest │ 28\.7 kΩ │ 28K7 │ \+1\.128 % │/);
    expect(r.stdout).toMatch(/series +│ 24\.9 kΩ \+ 3\.48 kΩ │ 24K9 \+ 3K48 │ +28\.38 kΩ │ +exact │/);
    expect(r.stdout).not.toMatch(/NaN|Infinity|undefined/);
  });
  it('--json: below, above, nearest in ohms; combos with kind, parts, value, errorPct', () => {
    const r = cli('nearest', '4K7', '--json', '--count', '2');
    expect(r.status).toBe(0);
    const json = JSON.parse(r.stdout) as {
      below: number;
      above: number;
      nearest: number;
      series: string;
      combos: Array<{ kind: string; parts: [number, number]; value: number; errorPct: number }>;
    };
    expect(json).toMatchObject({ series: 'E24', below: 4700, above: 4700, nearest: 4700 });
    expect(json.combos).toHaveLength(4);
    for (const c of json.combos) {
      expect(['series', 'parallel']).toContain(c.kind);
      const [a, b] = c.parts;
      expect(c.value).toBeCloseTo(c.kind === 'series' ? a + b : (a * b) / (a + b), 6);
      expect(Number.isFinite(c.errorPct)).toBe(true);
    }
  });
  it('milliohm targets in the RKM code: 12.3 mΩ in E24 → 12 mΩ (R012) nearest, −2.439 %', () => {
    const r = cli('nearest', '12m3', '--count', '1');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/│ nearest │ 12\.0 mΩ │ R012 +│ -2\.439 % │/);
  });
  it('--help shows the default series and examples', () => {
    const r = cli('nearest', '--help');
    expect(r.stdout).toMatch(/default: E24/);
    expect(r.stdout).toMatch(/Examples:/);
  });
  it('a malformed value names the character', () => {
    expectOneLineError(cli('nearest', '4x7'), /value: unexpected character 'x' at position 2 in '4x7'/);
  });
  it('zero and negative resistances are refused', () => {
    expectOneLineError(cli('nearest', '0'), /value: resistance must be greater than zero/);
    expectOneLineError(cli('nearest', '--', '-1k'), /value: resistance must be greater than zero/);
  });
  it('an unknown --series lists the valid names', () => {
    expectOneLineError(cli('nearest', '1k', '--series', 'E7'), /--series: unknown series 'E7'; accepted: E3, E6, E12, E24, E48, E96, E192/);
  });
  it('a target beyond orderable parts is refused', () => {
    expectOneLineError(cli('nearest', '1p'), /outside the span of orderable resistors/);
  });
  it("commander's own errors are one line too: missing argument, unknown option", () => {
    expectOneLineError(cli('nearest'), /missing required argument 'value'/);
    expectOneLineError(cli('values', 'E24', '--bogus'), /unknown option '--bogus'/);
  });
  it('a bad --count is refused', () => {
    expectOneLineError(cli('nearest', '1k', '--count', '0'), /--count: 0 is out of range/);
  });
});
