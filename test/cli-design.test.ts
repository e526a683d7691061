// `trimfree init`, `schema` and `design` as a user runs them: subprocesses of the built CLI (npm test builds dist/
// first; this file builds it if it is missing). Checks exit codes, one-line errors naming the field path or option,
// the refusal to overwrite without --force, atomic writes (no temporary file left), and that the JSON output
// carries the BOM the design layer computed.
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { validateDesign } from '../src/design/load.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { buildIfMissing, expectOneLineError, runTrimfree, type CliRun } from './cli-subprocess.js';
import { baseDesign } from './design-fixture.js';

const EXAMPLES = join(PROJECT_ROOT, 'examples');

beforeAll(buildIfMissing, 120_000);

function cli(...args: string[]): CliRun {
  return runTrimfree(args, PROJECT_ROOT);
}


const dir = mkdtempSync(join(tmpdir(), 'trimfree-cli-design-'));
const FAST = ['--trials', '2000', '--no-grades'];

describe('trimfree init', () => {
  it.each(['charger', 'bench', 'led'])('--kind %s prints a valid starter to stdout', (kind) => {
    const r = cli('init', '--kind', kind);
    expect(r.status).toBe(0);
    const design = validateDesign(JSON.parse(r.stdout));
    expect(design.application).toBe(kind);
  });

  it('writes --out, refuses to overwrite it without --force, replaces it with --force, leaves no temporary file', () => {
    const out = join(dir, 'starter.json');
    expect(cli('init', '--out', out).status).toBe(0);
    writeFileSync(out, '{"mine": true}');
    expectOneLineError(cli('init', '--kind', 'led', '--out', out), /--out: .*already exists.*--force/);
    expect(readFileSync(out, 'utf8')).toBe('{"mine": true}');
    const forced = cli('init', '--kind', 'led', '--out', out, '--force');
    expect(forced.status).toBe(0);
    expect(JSON.parse(readFileSync(out, 'utf8')).application).toBe('led');
    expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  });

  it('rejects an unknown kind in one line', () => {
    const r = cli('init', '--kind', 'toaster');
    expect(r.status).toBe(2);
    expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/toaster/);
  });
});

describe('trimfree schema', () => {
  it('prints the JSON Schema', () => {
    const r = cli('schema');
    expect(r.status).toBe(0);
    const schema = JSON.parse(r.stdout);
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    expect(Object.keys(schema.properties)).toEqual(expect.arrayContaining(['reference', 'voltage', 'current', 'resistors']));
  });
});

describe('trimfree design', () => {
  it('prints the BOM, the spread, notes and cautions for the charger example', () => {
    const r = cli('design', join(EXAMPLES, 'charger-2s-liion.json'), ...FAST);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/bill of materials/);
    expect(r.stdout).toMatch(/RTOP .*61\.20 kΩ.*61K2/);
    // 100 mΩ ranks first but its worst-case limit 1.584 A loads it to 1.584²·0.1 = 251 mW, past the 250 mW budget
    // (sense marks it "!"), so design takes the next, 75 mΩ.
    expect(r.stdout).toMatch(/RS .*R075 .*shunt/);
    expect(r.stdout).toMatch(/vout/);
    expect(r.stdout).toMatch(/Lithium cells/);
    expect(r.stdout).not.toMatch(/NaN|Infinity/);
  });

  it('--json carries the BOM with power figures and the spread', () => {
    const r = cli('design', join(EXAMPLES, 'led-driver-highside.json'), ...FAST, '--json');
    expect(r.status).toBe(0);
    const json = JSON.parse(r.stdout);
    const names = json.bom.map((l: { designator: string }) => l.designator);
    expect(names).toEqual(expect.arrayContaining(['RS', 'R1', 'R2', 'R3', 'R4', 'RT1', 'RT2']));
    const rs = json.bom.find((l: { designator: string }) => l.designator === 'RS');
    // I²R at the nominal limit (the picked 330 mΩ with the nearest E192 gain lands within 0.01 % of 700 mA).
    const limit = json.spread.outputs.ilimit.nominal;
    expect(limit / 0.7 - 1).toBeCloseTo(0, 4);
    expect(rs.powerW).toBeCloseTo(limit * limit * rs.ohms, 12);
    // The window ±5 % of 700 mA: 665 mA … 735 mA.
    expect(json.spread.outputs.ilimit.spec.low).toBeCloseTo(0.665, 12);
    expect(json.spread.outputs.ilimit.spec.high).toBeCloseTo(0.735, 12);
    expect(json.grades).toBeNull();
  });

  it('runs the grade comparison unless --no-grades, and puts it in the report', () => {
    const report = join(dir, 'graded.html');
    const r = cli('design', join(EXAMPLES, 'charger-2s-liion.json'), '--trials', '2000', '--search-trials', '1000', '--json', '--report', report);
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).grades).not.toBeNull();
    expect(readFileSync(report, 'utf8')).toMatch(/id="grades"/);
  }, 60_000);

  it('writes the report, refuses to overwrite it without --force', () => {
    const report = join(dir, 'report.html');
    const first = cli('design', join(EXAMPLES, 'bench-adjustable.json'), ...FAST, '--report', report);
    expect(first.status).toBe(0);
    expect(readFileSync(report, 'utf8')).toMatch(/<svg/);
    expectOneLineError(cli('design', join(EXAMPLES, 'bench-adjustable.json'), ...FAST, '--report', report), /--report: .*already exists/);
    expect(cli('design', join(EXAMPLES, 'bench-adjustable.json'), ...FAST, '--report', report, '--force').status).toBe(0);
    expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  }, 60_000);

  it('a bad design file: one line with the field path, exit 2', () => {
    const d = baseDesign();
    d.current.amplifier.vos = '2mX';
    const file = join(dir, 'bad.json');
    writeFileSync(file, JSON.stringify(d));
    expectOneLineError(cli('design', file, ...FAST), /^trimfree: current\.amplifier\.vos: unexpected character 'X'.*accepted: /);
  });

  it('an unknown field gets the closest name', () => {
    const d = baseDesign();
    d.voltage.windw = '±1%';
    const file = join(dir, 'typo.json');
    writeFileSync(file, JSON.stringify(d));
    expectOneLineError(cli('design', file, ...FAST), /voltage\.windw: unknown field 'windw' \(did you mean 'window'\?\)/);
  });

  it('bad JSON gives the line and column', () => {
    const file = join(dir, 'broken.json');
    writeFileSync(file, '{\n  "reference": {\n    "voltage": "1.25 V",\n  }\n}\n');
    expectOneLineError(cli('design', file, ...FAST), /broken\.json:4:3: not valid JSON/);
  });

  it('a missing file and an impossible design', () => {
    expectOneLineError(cli('design', join(dir, 'nope.json'), ...FAST), /nope\.json: no such file/);
    const d = baseDesign();
    d.voltage.target = '1 V';
    const file = join(dir, 'below.json');
    writeFileSync(file, JSON.stringify(d));
    expectOneLineError(cli('design', file, ...FAST), /voltage\.target: .*below the reference.*to fix: /);
  });

  it('a bad option value names the option', () => {
    expectOneLineError(cli('design', join(EXAMPLES, 'charger-2s-liion.json'), '--target-yield', '120%'), /--target-yield/);
  });
});
