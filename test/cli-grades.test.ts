// `trimfree grades`: the side-by-side grades (yield must not fall as every grade tightens, same seed), the cheapest
// grade mix against exhaustive search on the real supply model, and the command as a user runs it.
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { gradedSpec } from '../src/analysis/graded-spec.js';
import { directSenseSupply } from './direct-supply-fixture.js';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { jointYield } from '../src/analysis/trial-values.js';
import { runGrades } from '../src/design/grade-study.js';
import { DEFAULT_GRADE_NAMES, GRADES, gradeCosts } from '../src/design/grades.js';
import type { ResolvedDesign } from '../src/design/resolve.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { testSupply } from './report-supply-fixture.js';

function resolvedOf(spec: SupplySpec): ResolvedDesign {
  return { spec, bom: [], notes: [], cautions: [], nominal: {}, costs: gradeCosts(), analysis: {}, cautionLimits: { application: undefined, voutWindow: null } };
}

const CHOICE = { trials: 20000, seed: 3, workers: 1, progress: false } as const;

describe('grades side by side', { timeout: 120_000 }, () => {
  it('with the nominal inside every window, no yield falls as every grade tightens (same seed)', async () => {
    const spec = testSupply(); // vout 8.25 V in [8.1, 8.4] V, ilimit 1.091 A in [1.0, 1.2] A, loss 60 mW of 250 mW
    const model = buildSupplyModel(spec);
    const run = await runGrades(resolvedOf(spec), { ...CHOICE }, { targetYieldPct: 99, searchTrials: 5000 });
    expect(run.rows.map((r) => r.grade.name)).toEqual(['5%', '1%', '0.5%', '0.1%']);
    for (const output of model.outputs.filter((o) => o.spec)) {
      const [lo, hi] = output.spec!;
      const nominal = run.rows[0].result.outputs[output.name].nominal;
      expect(nominal).toBeGreaterThan(lo);
      expect(nominal).toBeLessThan(hi);
      const yields = run.rows.map((r) => r.result.outputs[output.name].yield!.pct);
      for (let i = 1; i < yields.length; i++) expect(yields[i], `${output.name}: ${yields.join(' → ')}`).toBeGreaterThanOrEqual(yields[i - 1]);
    }
    const joint = run.rows.map((r) => r.joint.pct);
    for (let i = 1; i < joint.length; i++) expect(joint[i]).toBeGreaterThanOrEqual(joint[i - 1]);
    // The spread itself shrinks: σ of vout at 0.1 % is below σ at 5 %.
    expect(run.rows[3].result.outputs.vout.sigma).toBeLessThan(run.rows[0].result.outputs.vout.sigma);
  });

  it('the all-specs yield is never above the lowest single-output yield, and equals the joint count of the same trials', async () => {
    const spec = testSupply();
    const run = await runGrades(resolvedOf(spec), { ...CHOICE }, { targetYieldPct: 99, searchTrials: 5000 });
    for (const row of run.rows) {
      const lowest = Math.min(...Object.values(row.result.outputs).filter((o) => o.yield).map((o) => o.yield!.pct));
      expect(row.joint.pct).toBeLessThanOrEqual(lowest);
      expect(row.joint.trials).toBe(row.result.trials);
    }
  });
});

describe('cheapest grade mix on the real supply model against exhaustive search', { timeout: 120_000 }, () => {
  // A direct-sense supply: three graded resistors (RTOP, RBOT, RS) → 4³ = 64 assignments, few enough to try all.
  const spec: SupplySpec = directSenseSupply(30e3, 10e3, { vout: [4.95, 5.05], ilimit: [0.96, 1.04] });
  const searchTrials = 8000;

  it('the search returns the cost of the cheapest passing assignment found by trying all 64', async () => {
    const target = 0.97;
    const run = await runGrades(resolvedOf(spec), { ...CHOICE }, { targetYieldPct: target * 100, searchTrials });
    const costs = gradeCosts();
    const names = run.parts.map((p) => p.name);
    expect(names).toEqual(['RTOP', 'RBOT', 'RS']);
    // Brute force with the same evaluation: joint yield over the same seed and trials.
    let best = Infinity;
    let bestAssignment = '';
    let passing = 0;
    const four = GRADES.filter((g) => DEFAULT_GRADE_NAMES.includes(g.name)); // the default list: 5 %, 1 %, 0.5 %, 0.1 %
    for (const a of four) for (const b of four) for (const c of four) {
      const grades = [a, b, c];
      const graded = gradedSpec(spec, Object.fromEntries(names.map((n, i) => [n, { tolerance: grades[i].tolerance, tcrPerK: grades[i].tcrPerK }])));
      const y = jointYield(buildSupplyModel(graded), { seed: '3', runTrials: searchTrials }, searchTrials).pct / 100;
      if (y < target) continue;
      passing++;
      const cost = grades.reduce((s, g) => s + costs[g.name], 0);
      if (cost < best) {
        best = cost;
        bestAssignment = grades.map((g) => g.name).join(' ');
      }
    }
    // The case is not trivial: some assignments pass, some fail, and the cheapest is neither extreme.
    expect(passing).toBeGreaterThan(0);
    expect(passing).toBeLessThan(64);
    expect(bestAssignment).not.toBe('5% 5% 5%');
    expect(bestAssignment).not.toBe('0.1% 0.1% 0.1%');
    expect(run.mix.found).toBe(true);
    expect(run.mix.cost).toBeCloseTo(best, 12);
    expect(run.mix.evaluations).toBeLessThan(64);
    expect(run.mix.searchYieldPct! / 100).toBeGreaterThanOrEqual(target);
  });
});

const MAIN = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');
const EXAMPLES = readdirSync(join(PROJECT_ROOT, 'examples')).filter((f) => f.endsWith('.json')).map((f) => join(PROJECT_ROOT, 'examples', f));

function grades(...args: string[]): { status: number | null; stdout: string; stderr: string } {
  const run = spawnSync(process.execPath, [MAIN, 'grades', ...args], { encoding: 'utf8' });
  return { status: run.status, stdout: run.stdout, stderr: run.stderr };
}

describe('trimfree grades (subprocess)', { timeout: 120_000 }, () => {
  for (const file of EXAMPLES) {
    it(`${file.split('/').pop()}: exit 0, the table, the search's answer and how it works; --json parses, all finite`, () => {
      const text = grades(file, '--trials', '20000', '--search-trials', '4000');
      expect(text.status).toBe(0);
      expect(text.stdout).toMatch(/grade \(TCR\)/);
      expect(text.stdout).toMatch(/all specs/);
      expect(text.stdout).toMatch(/how the search works: /);
      expect(text.stdout).toMatch(/cheapest grades reaching|no grade mix reaches|the search stopped/);
      expect(text.stdout).not.toMatch(/NaN|Infinity|undefined/);
      const json = grades(file, '--trials', '20000', '--search-trials', '4000', '--json');
      expect(json.status).toBe(0);
      expect(json.stdout).not.toMatch(/NaN|Infinity/);
      // Costs are sums of decimal figures: no binary tail (e.g. 67.80000000000001) reaches the JSON.
      for (const m of json.stdout.matchAll(/"\w*[cC]ost\w*": *(-?[0-9.eE+-]+)/g)) expect(m[1]!.replace(/^-?0?\.?0*|[eE].*$|\./g, '').length).toBeLessThanOrEqual(12);
      const parsed = JSON.parse(json.stdout) as { grades: Array<{ grade: string; allSpecsYieldPct: number }>; cheapest: { found: boolean; method: string } };
      expect(parsed.grades.map((g) => g.grade)).toEqual(['5%', '1%', '0.5%', '0.1%']);
      expect(parsed.cheapest.method).toMatch(/cheapest/);
    });
  }

  it('bad --target-yield: one line, exit 2', () => {
    const r = grades(EXAMPLES[0], '--target-yield', '120%');
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/--target-yield: 120% is out of range; accepted: a yield between 50 % and 100 %/);
  });
});
