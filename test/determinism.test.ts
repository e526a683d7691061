// Determinism as a user sees it, on every example, through the built CLI (npm test builds dist/ first):
// - one seed gives byte-identical --json for 1, 2 and 4 workers (spread on every example; design at 1 and 4 and
//   grades at 1 and 2 on one); and the JavaScript reference kernel (--kernel js) gives the same bytes as the default
//   (the WebAssembly kernel on every example) but for the method note that names the kernel;
// - the seed and the version are in every report: spread and grades text, every JSON, the HTML report;
// - two seeds agree within their own stated Monte Carlo uncertainty: the means within 4 standard errors of their
//   difference, 4·σ·√(2/N) (JCGM 101:2008 7.6: the standard error of a Monte Carlo mean is σ/√N; two independent runs
//   differ by √2 of it; 4 of them leave about 6e-5 chance of a false failure per output), and the yields with
//   overlapping 95 % Wilson intervals (the engine's intervals, JSON yieldInterval95).
// And in-process: the chunked, interruptible joint yield (joint-yield-async.ts) equals the engine's jointYield.
import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { jointYieldAsync } from '../src/analysis/joint-yield-async.js';
import { buildSupplyModel } from '../src/analysis/models/supply.js';
import { jointYield } from '../src/analysis/trial-values.js';
import { VERSION } from '../src/cli/version.js';
import { loadDesignFile } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { withoutWallTime } from './wall-time.js';

const MAIN = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');
const EXAMPLES = readdirSync(join(PROJECT_ROOT, 'examples')).filter((f) => f.endsWith('.json')).sort();
/** Three chunks of the engine's 65536 trials, the last one short, so 2 and 4 workers really split the run. */
const N = 2 * 65_536 + 5_000;
const SPREAD = ['--trials', String(N), '--json'];
const DESIGN = ['--trials', String(N), '--no-grades', '--json'];

function cli(args: string[]): Promise<{ status: number | null; stdout: string; stderr: string }> {
  return new Promise((done) => {
    const child = spawn(process.execPath, [MAIN, ...args], { cwd: PROJECT_ROOT });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('close', (status) => done({ status, stdout, stderr }));
  });
}

async function ok(args: string[]): Promise<string> {
  const r = await cli(args);
  expect(r.status, `trimfree ${args.join(' ')}: ${r.stderr}`).toBe(0);
  return r.stdout;
}

interface OutputJson {
  mean: number;
  sigma: number;
  yieldPct: number | null;
  yieldInterval95: { low: number; high: number } | null;
}

describe('every example: byte-identical --json for 1, 2 and 4 workers; two seeds agree within their uncertainty', { timeout: 180_000 }, () => {
  for (const file of EXAMPLES) {
    const path = join('examples', file);
    it(`${file}: spread at 1, 2, 4 workers (seed 3), and on the js kernel; spread at seed 4 against seed 3`, async () => {
      const [s1, s2, s4, other, js] = await Promise.all([
        ...[1, 2, 4].map((w) => ok(['spread', path, ...SPREAD, '--seed', '3', '--workers', String(w)])),
        ok(['spread', path, ...SPREAD, '--seed', '4']),
        ok(['spread', path, ...SPREAD, '--seed', '3', '--workers', '2', '--kernel', 'js']),
      ]);
      expect(withoutWallTime(s2!)).toBe(withoutWallTime(s1!));
      expect(withoutWallTime(s4!)).toBe(withoutWallTime(s1!));
      // Which kernel ran is the spec's choice (kernelSupports); the JS reference gives the same bits either way.
      expect(s1).toMatch(/"Kernel: (wasm|js)/);
      const kernelNote = /"Kernel: [^"]*"/g;
      expect(withoutWallTime(js!).replace(kernelNote, '"Kernel"')).toBe(withoutWallTime(s1!).replace(kernelNote, '"Kernel"'));
      expect(JSON.parse(s1!)).toMatchObject({ seed: '3', trials: N, version: VERSION });
      agreeWithinUncertainty(s1!, other!);
    });
  }
  // design is resolve + the same spread (checked above on every example) + the BOM; one example shows its JSON too.
  it('design at 1 and 4 workers (charger)', async () => {
    const path = join('examples', 'charger-2s-liion.json');
    const [d1, d4] = await Promise.all([1, 4].map((w) => ok(['design', path, ...DESIGN, '--seed', '3', '--workers', String(w)])));
    expect(withoutWallTime(d4!)).toBe(withoutWallTime(d1!));
    expect((JSON.parse(d1!) as { spread: unknown }).spread).toMatchObject({ seed: '3', version: VERSION });
  });
  it('grades (side by side, search, verification) at 1 and 2 workers', async () => {
    const args = ['grades', join('examples', 'charger-2s-liion.json'), '--trials', String(N), '--search-trials', '1000', '--seed', '3', '--json'];
    const [g1, g2] = await Promise.all([1, 2].map((w) => ok([...args, '--workers', String(w)])));
    expect(withoutWallTime(g2!)).toBe(withoutWallTime(g1!));
  });
});

describe('the seed and the version in every report', { timeout: 120_000 }, () => {
  const example = join('examples', EXAMPLES[0]!);
  it('spread text, grades text and JSON, and the HTML report', async () => {
    const seedAndVersion = new RegExp(`seed "11".*trimfree ${VERSION.replace(/\./g, '\\.')}`);
    const dir = mkdtempSync(join(tmpdir(), 'trimfree-det-'));
    const report = join(dir, 'r.html');
    const [spreadText, gradesText, gradesJson] = await Promise.all([
      ok(['spread', example, '--trials', '1000', '--seed', '11', '--report', report]),
      ok(['grades', example, '--trials', '1000', '--search-trials', '1000', '--seed', '11']),
      ok(['grades', example, '--trials', '1000', '--search-trials', '1000', '--seed', '11', '--json']),
    ]);
    expect(spreadText).toMatch(seedAndVersion);
    expect(gradesText).toMatch(seedAndVersion);
    expect(JSON.parse(gradesJson!)).toMatchObject({ seed: '11', version: VERSION });
    const html = readFileSync(report, 'utf8');
    expect(html).toContain(VERSION);
    expect(html).toMatch(/seed[^<]{0,40}(<[^>]*>\s*)*[^<]{0,10}11/i);
  });
});

/** Two runs of one design at different seeds agree within their own stated Monte Carlo uncertainty. */
function agreeWithinUncertainty(a: string, b: string): void {
  expect(a).not.toBe(b);
  const one = JSON.parse(a) as { outputs: Record<string, OutputJson> };
  const two = JSON.parse(b) as { outputs: Record<string, OutputJson> };
  expect(Object.keys(two.outputs)).toEqual(Object.keys(one.outputs));
  let checkedYields = 0;
  for (const [name, x] of Object.entries(one.outputs)) {
    const y = two.outputs[name]!;
    const sigma = Math.max(x.sigma, y.sigma);
    expect(Math.abs(x.mean - y.mean), `${name} means`).toBeLessThanOrEqual(4 * sigma * Math.sqrt(2 / N));
    // σ itself: its standard error is about σ/√(2N) for a near-normal output; 6·σ/√N is generous for the uniform
    // and skewed outputs here (a σ that is 0 in one run must be 0 in both).
    expect(Math.abs(x.sigma - y.sigma), `${name} sigmas`).toBeLessThanOrEqual(6 * sigma * Math.sqrt(1 / N));
    if (x.yieldInterval95 && y.yieldInterval95) {
      expect(x.yieldInterval95.low, `${name} yield intervals overlap`).toBeLessThanOrEqual(y.yieldInterval95.high);
      expect(y.yieldInterval95.low, `${name} yield intervals overlap`).toBeLessThanOrEqual(x.yieldInterval95.high);
      checkedYields++;
    } else {
      expect(x.yieldPct).toBeNull();
      expect(y.yieldPct).toBeNull();
    }
  }
  // vout and ilimit carry spec windows in every example.
  expect(checkedYields).toBeGreaterThanOrEqual(2);
}

describe('the interruptible joint yield equals the engine’s', { timeout: 120_000 }, () => {
  it('every example, two seeds, a run length with a short last chunk and an open-ended one', async () => {
    for (const file of EXAMPLES) {
      const model = buildSupplyModel(resolveDesign(loadDesignFile(join(PROJECT_ROOT, 'examples', file))).spec);
      for (const [seed, trials, runTrials] of [['1', 140_000, 140_000], ['9', 70_000, 0]] as const) {
        const stream = { seed, runTrials };
        expect(await jointYieldAsync(model, stream, trials)).toEqual(jointYield(model, stream, trials));
      }
    }
  });
});
