// The design-file fields of drift allowances, the analysis condition, production distributions and lots
// (src/design/life-fields.ts, life-condition.ts, production-spread.ts): each bad value answered with one InputError
// naming the field path and what is accepted (a typo gets "did you mean"), and the command-line options
// --condition and --lots likewise (exit 2, one line). The accepted texts are the fields' own descriptions.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { InputError, describeError } from '../src/errors.js';
import { validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { baseDesign } from './design-fixture.js';

function errorOf(mutate: (d: Record<string, any>) => void, resolve = false): InputError {
  const design = baseDesign();
  mutate(design);
  try {
    const valid = validateDesign(design, 'test.json');
    if (resolve) resolveDesign(valid);
  } catch (error) {
    if (error instanceof InputError) return error;
    throw error;
  }
  throw new Error('expected an InputError');
}

// [label, change, resolve too, field path, pattern of the one line]
const BAD: Array<[string, (d: Record<string, any>) => void, boolean, string, RegExp]> = [
  ['condition not one of the two', (d) => (d.analysis = { condition: 'end of life' }), false, 'analysis.condition', /as-built.*end-of-life/],
  ['typo in a drift block', (d) => (d.resistors.drift = { loadlife: '0.1%' }), false, 'resistors.drift.loadlife', /did you mean 'loadLife'/],
  ['typo in the shunt\'s drift', (d) => (d.current.shunt.drift = { dampheat: '0.1%' }), false, 'current.shunt.drift.dampheat', /did you mean 'dampHeat'/],
  ['drift allowance out of range', (d) => (d.resistors.drift = { soldering: '60%' }), false, 'resistors.drift.soldering', /out of range.*0 % to 50 %/],
  ['drift allowance not a percentage', (d) => (d.current.threshold.drift = { loadLife: '1 V' }), false, 'current.threshold.drift.loadLife', /percentage/],
  ['drift distribution unknown', (d) => (d.resistors.overrides = { RS: { drift: { loadLife: '1%', distribution: 'binned' } } }), false, 'resistors.overrides.RS.drift.distribution', /accepted: "uniform", "normal", "truncated-normal", "normal-unbounded", "triangular"$/],
  ['typo in lots', (d) => (d.lots = { count: 5, shares: '30%' }), false, 'lots.shares', /did you mean 'share'/],
  ['one lot is no lot study', (d) => (d.lots = { count: 1 }), false, 'lots.count', /2 to 1000/],
  ['lot share of the whole band', (d) => (d.lots = { count: 5, share: '100%' }), false, 'lots.share', /0 % to 95 %/],
  ['offset cannot be binned', (d) => (d.current.amplifier.vosDistribution = 'binned'), false, 'current.amplifier.vosDistribution', /"binned" is not one of the choices; accepted: "uniform"/],
  ['typo of the reference distribution field', (d) => (d.reference.distrbution = 'normal'), false, 'reference.distrbution', /did you mean 'distribution'/],
  ['binned without what was sorted out', (d) => (d.resistors = { grade: '2%', distribution: 'binned' }), true, 'resistors.distribution', /needs the tighter grade sorted out.*sortedOut/],
  ['sortedOut without binned', (d) => (d.resistors = { grade: '2%', sortedOut: '1%' }), true, 'resistors.sortedOut', /only with distribution "binned"/],
  ['sorted out as wide as the part', (d) => (d.resistors = { grade: '1%', overrides: { RTOP: { distribution: 'binned', sortedOut: '1%' } } }), true, 'resistors.overrides.RTOP.sortedOut', /leaves nothing.*below the part's own ±1 %/],
  ['reference sorted out past its tolerance', (d) => (d.reference = { voltage: '1.25 V', tolerance: '0.5%', distribution: 'binned', sortedOut: '1%' }), true, 'reference.sortedOut', /leaves nothing/],
  ['a divided threshold takes no distribution', (d) => (d.current.threshold = { reference: '2.5 V', tolerance: '1%', top: '15k', bottom: '10k', distribution: 'normal' }), true, 'current.threshold.distribution', /divided from a reference/],
];

describe('bad drift, condition, distribution and lot fields', () => {
  for (const [label, mutate, resolve, path, pattern] of BAD) {
    it(label, () => {
      const error = errorOf(mutate, resolve);
      expect(error.where).toBe(path);
      const line = describeError(error);
      expect(line).toMatch(pattern);
      expect(line).not.toMatch(/\n|NaN|Infinity|undefined/);
    });
  }

  it('the good forms are read in SI units', () => {
    const d = baseDesign();
    d.resistors.drift = { loadLife: '0.1%', dampHeat: 0.05, distribution: 'normal' };
    d.analysis = { condition: 'end-of-life' };
    d.lots = { count: 12, share: '30%', trialsPerLot: 5000 };
    const design = validateDesign(d);
    expect(design.resistors.drift).toEqual({ loadLife: 0.001, dampHeat: 0.0005, distribution: 'normal' });
    expect(design.lots).toEqual({ count: 12, share: 0.3, trialsPerLot: 5000 });
  });
});

const MAIN = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');

beforeAll(() => {
  if (!existsSync(MAIN)) spawnSync('npx', ['tsc', '-p', PROJECT_ROOT], { cwd: PROJECT_ROOT });
});

function cli(args: string[]): { code: number | null; stdout: string; stderr: string } {
  const r = spawnSync('node', [MAIN, ...args], { cwd: PROJECT_ROOT, encoding: 'utf8' });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('--condition and --lots on the command line', () => {
  it.each([
    [['spread', 'examples/charger-2s-liion.json', '--condition', 'aged'], '--condition', /no condition "aged"; accepted: as-built or end-of-life/],
    [['grades', 'examples/charger-2s-liion.json', '--condition', ''], '--condition', /empty condition; accepted: as-built or end-of-life/],
    [['design', 'examples/charger-2s-liion.json', '--condition', 'EOL'], '--condition', /accepted: as-built or end-of-life/],
    [['spread', 'examples/charger-2s-liion.json', '--lots', '1'], '--lots', /2/],
  ])('%j exits 2 with one line', (args, where, says) => {
    const r = cli(args);
    expect(r.code).toBe(2);
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]!.startsWith(`trimfree: ${where}: `)).toBe(true);
    expect(lines[0]).toMatch(says);
  });

  it('spread --json says the condition and carries the lot study', () => {
    const r = cli(['spread', 'examples/charger-2s-liion.json', '--trials', '5000', '--condition', 'end-of-life', '--lots', '3', '--json']);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout) as Record<string, any>;
    expect(json['condition']).toBe('end-of-life');
    expect(json['conditionLabel']).toMatch(/end of life/);
    expect(json['lots'].count).toBe(3);
    expect(json['lots'].lots).toHaveLength(3);
    expect(json['lots'].worstAllSpecs.pct).toBeLessThanOrEqual(json['lots'].overallAllSpecs.pct);
    expect(json['notes'].join(' ')).toMatch(/Analysed at end of life/);
  }, 120_000);

  it('the text heading names the condition: as built by default', () => {
    const r = cli(['spread', 'examples/charger-2s-liion.json', '--trials', '2000']);
    expect(r.stdout.split('\n')[0]).toMatch(/^examples\/charger-2s-liion\.json, as built: Monte Carlo 2,000 trials/);
  }, 120_000);
});

describe('every report says which condition it shows', () => {
  it('spread HTML h1 and text heading, grades text heading, JSON and the HTML grade table, at end of life', async () => {
    const { runSpread } = await import('../src/design/spread-study.js');
    const { runGrades } = await import('../src/design/grade-study.js');
    const { renderSpreadRunHtml } = await import('../src/report/spread-run-html.js');
    const { renderSpreadRunText } = await import('../src/report/spread-run-text.js');
    const { renderGradesText } = await import('../src/report/grades-text.js');
    const { gradesJson } = await import('../src/report/grades-json.js');
    const { gradesReportTables } = await import('../src/report/grades-tables.js');
    const resolved = resolveDesign(validateDesign(baseDesign()));
    const choice = { trials: 2000, seed: 1, workers: 1, progress: false, condition: 'end-of-life' as const };
    const spread = await runSpread(resolved, choice);
    expect(renderSpreadRunHtml(spread, { subject: 'd.json', version: '0' })).toContain('<h1>trimfree spread report: d.json, end of life</h1>');
    expect(renderSpreadRunText(spread, { subject: 'd.json', version: '0' }).split('\n')[0]).toMatch(/^d\.json, end of life: Monte Carlo/);
    const grades = await runGrades(resolved, choice, { targetYieldPct: 90, searchTrials: 1000, grades: ['1%', '0.1%'] });
    expect(renderGradesText(grades, { subject: 'd.json', version: '0' }).split('\n')[0]).toMatch(/^d\.json, end of life: every resistor in each grade/);
    expect((gradesJson(grades, '0') as { condition: string }).condition).toBe('end-of-life');
    expect(gradesReportTables(grades)[0]!.title).toMatch(/, end of life$/);
    // The drift parts were in the graded runs: the 0.1 % row's model carries the 0.1 % grade's allowances (the run's
    // notes describe every varying part; the rows leave out the contributions, which no grade report shows).
    expect(grades.rows.find((r) => r.grade.name === '0.1%')!.result.notes.some((n) => n.startsWith('RTOP load life: '))).toBe(true);
  }, 120_000);
});
