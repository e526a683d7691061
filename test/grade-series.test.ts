// Every IEC 60062 resistor tolerance grade, the series each is sold in, the --grades list and the design file's
// resistors.grades, and the grade search over a custom list against brute force on the real supply model.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { gradedSpec } from '../src/analysis/graded-spec.js';
import { directSenseSupply } from './direct-supply-fixture.js';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { jointYield } from '../src/analysis/trial-values.js';
import { runGrades } from '../src/design/grade-study.js';
import { GRADES, gradeByName, gradeCosts, gradeSoldAt, parseGradeList, type GradeName } from '../src/design/grades.js';
import type { ResolvedDesign } from '../src/design/resolve.js';
import { InputError } from '../src/errors.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { toleranceLetter } from '../src/units/index.js';

function resolvedOf(spec: SupplySpec): ResolvedDesign {
  return { spec, bom: [], notes: [], cautions: [], nominal: {}, costs: gradeCosts(), analysis: {}, cautionLimits: { application: undefined, voutWindow: null } };
}

const CHOICE = { trials: 20000, seed: 3, workers: 1, progress: false } as const;

describe('the grade table', () => {
  // IEC 60062:2016, table of tolerance codes for symmetric tolerances (from memory):
  // L ±0.01 %, P ±0.02 %, W ±0.05 %, B ±0.1 %, C ±0.25 %, D ±0.5 %, F ±1 %, G ±2 %, J ±5 %, K ±10 %, M ±20 %.
  const IEC_60062: Array<[string, number]> = [
    ['L', 0.0001], ['P', 0.0002], ['W', 0.0005], ['B', 0.001], ['C', 0.0025], ['D', 0.005],
    ['F', 0.01], ['G', 0.02], ['J', 0.05], ['K', 0.1], ['M', 0.2],
  ];

  it('the tolerance letter of every IEC 60062 code', () => {
    for (const [letter, tolerance] of IEC_60062) expect(toleranceLetter(tolerance), `${tolerance}`).toBe(letter);
    expect(toleranceLetter(0.0003)).toBeUndefined();
  });

  it('the ten resistor grades are exactly the IEC 60062 codes from L to K, widest first, each named by its percentage', () => {
    const resistorCodes = IEC_60062.filter(([letter]) => letter !== 'M').reverse();
    expect(GRADES.map((g) => [g.letter, g.tolerance])).toEqual(resistorCodes);
    for (const g of GRADES) {
      expect(toleranceLetter(g.tolerance)).toBe(g.letter);
      expect(Number(g.name.replace('%', '')) / 100).toBeCloseTo(g.tolerance, 15);
    }
  });

  it('a tighter grade never comes with a looser TCR, a coarser series or a lower illustrative cost', () => {
    const order = ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192'];
    for (let i = 1; i < GRADES.length; i++) {
      expect(GRADES[i]!.tcrPerK).toBeLessThanOrEqual(GRADES[i - 1]!.tcrPerK);
      expect(order.indexOf(GRADES[i]!.series)).toBeGreaterThanOrEqual(order.indexOf(GRADES[i - 1]!.series));
      expect(GRADES[i]!.relativeCost).toBeGreaterThanOrEqual(GRADES[i - 1]!.relativeCost);
    }
  });
});

describe('which grades are sold at a value (series or coarser)', () => {
  // Membership from the IEC 60063:2015 tables (from memory): 1.5 is an E6 value; 1.2 E12; 1.1 E24; 1.4 E48 (and so
  // E96, E192) but not E24; 1.13 E96 but not E48; 1.01 only E192. Grade series (common practice): 10 % E12, 5 % E24,
  // 2 % E48, 1 % E96, 0.5 % and tighter E192.
  const sold = (ohms: number): GradeName[] => GRADES.filter((g) => gradeSoldAt(g, ohms) === true).map((g) => g.name);
  const all = GRADES.map((g) => g.name);

  it('each value is sold in the grades whose series (or a coarser one) holds it', () => {
    expect(sold(1500)).toEqual(all);
    expect(sold(1200)).toEqual(all);
    expect(sold(1100)).toEqual(all.filter((g) => g !== '10%'));
    expect(sold(1400)).toEqual(all.filter((g) => g !== '10%' && g !== '5%'));
    expect(sold(1130)).toEqual(all.filter((g) => g !== '10%' && g !== '5%' && g !== '2%'));
    expect(sold(1010)).toEqual(['0.5%', '0.25%', '0.1%', '0.05%', '0.02%', '0.01%']);
  });

  it('the decade does not matter, and a value no series holds is reported as non-standard', () => {
    expect(sold(1.4)).toEqual(sold(1400));
    expect(sold(140e3)).toEqual(sold(1400));
    expect(gradeSoldAt(gradeByName('5%'), 1234)).toBe('non-standard');
  });
});

describe('--grades parsing', () => {
  it('reads names and IEC 60062 letters, widest first, without repeats', () => {
    expect(parseGradeList('5%,1%,0.1%', '--grades')).toEqual(['5%', '1%', '0.1%']);
    expect(parseGradeList('0.1 %, 5% ,J,f', '--grades')).toEqual(['5%', '1%', '0.1%']);
    expect(parseGradeList('L,P,W,B,C,D,F,G,J,K', '--grades')).toEqual(GRADES.map((g) => g.name));
  });

  it('refuses a grade not in the table, naming the option and listing every accepted grade', () => {
    for (const bad of ['3%', '5%,,1%', 'M', '20%', '']) {
      let error: unknown;
      try {
        parseGradeList(bad, '--grades');
      } catch (e) {
        error = e;
      }
      expect(error, bad).toBeInstanceOf(InputError);
      expect((error as InputError).where).toBe('--grades');
      for (const g of GRADES) expect((error as InputError).accepted).toContain(g.name);
    }
  });
});

describe('grade restriction by series in the study', { timeout: 120_000 }, () => {
  // RBOT 1K4 is an E48 value, not E24: a 5 % part is never offered for it. The windows are wide enough that every
  // part at 5 % passes, so without the restriction the cheapest mix would put 5 % on RBOT.
  // Vout = 1.25 × (1 + 2.2/1.4) = 3.214 V (closed form); ±15 % and ±20 % windows hold every 5 % corner.
  const spec: SupplySpec = directSenseSupply(2200, 1400, { vout: [2.73, 3.7], ilimit: [0.8, 1.2] });

  it('a 1K4 part never gets 5 %: the cheapest mix gives it the cheapest grade sold at its value, and says why', async () => {
    const run = await runGrades(resolvedOf(spec), { ...CHOICE }, { targetYieldPct: 99, searchTrials: 4000 });
    expect(run.rows[0]!.grade.name).toBe('5%');
    expect(run.rows[0]!.joint.pct).toBe(100); // every part at 5 % passes: the restriction, not the yield, decides
    expect(run.rows[0]!.notSold).toEqual(['RBOT']);
    expect(run.offered.RBOT).toEqual(['1%', '0.5%', '0.1%']);
    expect(run.offered.RTOP).toEqual(['5%', '1%', '0.5%', '0.1%']);
    expect(run.mix.assignment).toEqual({ RTOP: '5%', RBOT: '1%', RS: '5%' });
    expect(run.seriesNotes).toHaveLength(1);
    expect(run.seriesNotes[0]).toMatch(/^RBOT 1K40 is not an E24 or coarser value: not offered in 5%/);
  });

  it('with only grades not sold at a part\'s value allowed, no mix is chosen and the study says why', async () => {
    const run = await runGrades(resolvedOf(spec), { ...CHOICE }, { targetYieldPct: 99, searchTrials: 2000, grades: ['10%', '5%'] });
    expect(run.rows.map((r) => r.grade.name)).toEqual(['10%', '5%']);
    expect(run.mix.found).toBe(false);
    expect(run.mix.reason).toBe('no-grade-sold');
    expect(run.offered.RBOT).toEqual([]);
  });

  it('the search over a custom grade list (10 %, 2 %, 0.25 %) matches brute force over every sold assignment', async () => {
    // RTOP 30K9 is an E96 value (not E48: IEC 60063 E48 has 3.01 and 3.16): of the list only 0.25 % is sold at it. RBOT 10K and RS 0R1 take any grade.
    const custom: SupplySpec = structuredClone(spec);
    custom.divider!.top.resistors[0]!.nominal = 30900;
    custom.divider!.bottom.resistors[0]!.nominal = 10000;
    custom.windows = { vout: [5.0, 5.22], ilimit: [0.93, 1.07] }; // Vout = 1.25 × 4.09 = 5.1125 V (closed form)
    const list: GradeName[] = ['10%', '2%', '0.25%'];
    const searchTrials = 6000;
    const target = 0.99;
    const run = await runGrades(resolvedOf(custom), { ...CHOICE }, { targetYieldPct: target * 100, searchTrials, grades: list });
    expect(run.rows.map((r) => r.grade.name)).toEqual(list);
    const names = run.parts.map((p) => p.name);
    expect(names).toEqual(['RTOP', 'RBOT', 'RS']);
    // Sold lists from the IEC 60063 tables by hand (see above), not from the code under test.
    const soldBy: Record<string, GradeName[]> = { RTOP: ['0.25%'], RBOT: list, RS: list };
    expect(run.offered).toEqual(soldBy);
    const costs = gradeCosts();
    let best = Infinity;
    let passing = 0;
    let tried = 0;
    for (const a of soldBy.RTOP!) for (const b of soldBy.RBOT!) for (const c of soldBy.RS!) {
      const chosen = [a, b, c].map((n) => gradeByName(n));
      tried++;
      const graded = gradedSpec(custom, Object.fromEntries(names.map((n, i) => [n, { tolerance: chosen[i]!.tolerance, tcrPerK: chosen[i]!.tcrPerK }])));
      const y = jointYield(buildSupplyModel(graded), { seed: '3', runTrials: searchTrials }, searchTrials).pct / 100;
      if (y < target) continue;
      passing++;
      best = Math.min(best, chosen.reduce((s, g) => s + costs[g.name], 0));
    }
    // Not trivial: some sold assignments pass and some fail.
    expect(tried).toBe(9);
    expect(passing).toBeGreaterThan(0);
    expect(passing).toBeLessThan(9);
    expect(run.mix.found).toBe(true);
    expect(run.mix.cost).toBeCloseTo(best, 12);
    expect(run.mix.assignment!.RTOP).toBe('0.25%');
  });
});

describe('the command line and the design file', { timeout: 120_000 }, () => {
  const MAIN = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');
  const example = join(PROJECT_ROOT, 'examples', 'charger-2s-liion.json');
  const run = (...args: string[]) => spawnSync(process.execPath, [MAIN, ...args], { encoding: 'utf8' });

  it('grades and design refuse an unknown grade in --grades: one line naming the option and the accepted grades, exit 2', () => {
    for (const command of ['grades', 'design']) {
      const r = run(command, example, '--grades', '5%,3%');
      expect(r.status).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(/^trimfree: --grades: no grade "3%"; accepted: a comma-separated list of 10%, 5%, 2%, 1%, 0.5%, 0.25%, 0.1%, 0.05%, 0.02%, 0.01%/);
    }
  });

  it('--grades sets the rows; the design file\'s resistors.grades does when the option is absent; a bad entry names the field', () => {
    const r = run('grades', example, '--grades', '2%,0.25%', '--trials', '4000', '--search-trials', '2000', '--json');
    expect(r.status).toBe(0);
    const parsed = JSON.parse(r.stdout) as { grades: Array<{ grade: string }>; costs: Record<string, number> };
    expect(parsed.grades.map((g) => g.grade)).toEqual(['2%', '0.25%']);
    expect(Object.keys(parsed.costs)).toEqual(['2%', '0.25%']);

    const dir = mkdtempSync(join(tmpdir(), 'trimfree-grades-'));
    const design = JSON.parse(readFileSync(example, 'utf8')) as { resistors: Record<string, unknown> };
    design.resistors.grades = ['0.05%', '1%'];
    const file = join(dir, 'd.json');
    writeFileSync(file, JSON.stringify(design));
    const fromFile = run('grades', file, '--trials', '4000', '--search-trials', '2000', '--json');
    expect(fromFile.status).toBe(0);
    expect((JSON.parse(fromFile.stdout) as { grades: Array<{ grade: string }> }).grades.map((g) => g.grade)).toEqual(['1%', '0.05%']);

    design.resistors.grades = ['1%', '3%'];
    writeFileSync(file, JSON.stringify(design));
    const bad = run('grades', file);
    expect(bad.status).toBe(2);
    expect(bad.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(bad.stderr).toMatch(/resistors\.grades(\[1\]|\.1)/);
    expect(bad.stderr).toMatch(/0\.01%/);
  });
});
