// `trimfree spread` as a user runs it: a subprocess of the built CLI (npm test builds dist/ first), on every example.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analysis/analyze.js';
import { loadDesignFile } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { expectOneLineError, MAIN, runTrimfree, type CliRun } from './cli-subprocess.js';
import type { SpreadJson } from '../src/report/json.js';
import { displayedMatches } from './report-check.js';
import { withoutWallTime } from './wall-time.js';

const EXAMPLES = readdirSync(join(PROJECT_ROOT, 'examples')).filter((f) => f.endsWith('.json')).map((f) => join(PROJECT_ROOT, 'examples', f));
const CHARGER = join(PROJECT_ROOT, 'examples', 'charger-2s-liion.json');
const FAST = ['--trials', '20000'];

function spread(...args: string[]): CliRun {
  return runTrimfree(['spread', ...args]);
}


describe('trimfree spread on every example (subprocess)', { timeout: 120_000 }, () => {
  it('there are examples to run', () => expect(EXAMPLES.length).toBeGreaterThanOrEqual(3));

  for (const file of EXAMPLES) {
    it(`${file.split('/').pop()}: exit 0, tables, histogram and cautions; --json parses with every number finite`, () => {
      const text = spread(file, ...FAST);
      expect(text.status).toBe(0);
      expect(text.stdout).toMatch(/== vout \(output voltage\)(, pot at the top of its travel)? ==/);
      expect(text.stdout).toMatch(/-------- spec (low|high)/);
      expect(text.stdout).toMatch(/caution:\n {2}! /);
      expect(text.stdout).not.toMatch(/NaN|Infinity|undefined/);

      const json = spread(file, ...FAST, '--json');
      expect(json.status).toBe(0);
      expect(json.stdout).not.toMatch(/NaN|Infinity/);
      const parsed = JSON.parse(json.stdout) as SpreadJson;
      expect(parsed.trials).toBe(20000);
      expect(Object.keys(parsed.outputs)).toEqual(expect.arrayContaining(['vout', 'ilimit']));
      for (const output of Object.values(parsed.outputs)) {
        expect(output.interval95.low).toBeLessThanOrEqual(output.interval95.high);
        expect(output.worstCase.min).toBeLessThanOrEqual(output.worstCase.max);
        if (output.spec === null) expect(output.cpk).toBeNull();
      }
    });
  }
});

describe('help', { timeout: 120_000 }, () => {
  for (const command of ['spread', 'grades']) {
    it(`${command} --help: every example names a file that exists, and runs`, () => {
      const help = spawnSync(process.execPath, [MAIN, command, '--help'], { encoding: 'utf8' }).stdout;
      const examples = [...help.matchAll(/^ {2}\$ trimfree (.+)$/gm)].map((m) => m[1].split(' '));
      expect(examples.length).toBeGreaterThanOrEqual(3);
      for (const args of examples) {
        expect(existsSync(join(PROJECT_ROOT, args[1])), args[1]).toBe(true);
      }
      // The first example runs as written (with fewer trials, from the project folder).
      const first = spawnSync(process.execPath, [MAIN, ...examples[0], '--trials', '5000', ...(command === 'grades' ? ['--search-trials', '2000'] : [])], { encoding: 'utf8', cwd: PROJECT_ROOT });
      expect(first.status).toBe(0);
    });
  }
});

describe('spread agrees with the engine', { timeout: 120_000 }, () => {
  it('the JSON figures are the engine’s, run in-process on the resolved design with the same seed and trials', async () => {
    const r = spread(CHARGER, '--trials', '30000', '--seed', '5', '--json');
    expect(r.status).toBe(0);
    const json = JSON.parse(r.stdout) as SpreadJson;
    const result = await analyze(resolveDesign(loadDesignFile(CHARGER)).spec, { trials: 30000, seed: 5, workers: 1 });
    for (const [name, o] of Object.entries(result.outputs)) {
      const j = json.outputs[name];
      expect([j.nominal, j.mean, j.sigma, j.interval95.low, j.interval95.high, j.worstCase.min, j.worstCase.max, j.rss.sigma]).toEqual([
        o.nominal, o.mean, o.sigma, o.interval95.low, o.interval95.high, o.worstCase.min, o.worstCase.max, o.rss.sigma,
      ]);
      expect(j.yieldPct).toBe(o.yield?.pct ?? null);
    }
  });

  it('the same seed gives byte-identical JSON for 1 and 2 workers', () => {
    const one = spread(CHARGER, '--trials', '150000', '--workers', '1', '--json');
    const two = spread(CHARGER, '--trials', '150000', '--workers', '2', '--json');
    expect(one.status).toBe(0);
    expect(withoutWallTime(two.stdout)).toBe(withoutWallTime(one.stdout));
  });

  it('the terminal summary shows the JSON figures, rounded', () => {
    const text = spread(CHARGER, ...FAST).stdout;
    const json = JSON.parse(spread(CHARGER, ...FAST, '--json').stdout) as SpreadJson;
    for (const [name, o] of Object.entries(json.outputs)) {
      const row = text.split('\n').find((l) => l.startsWith(`│ ${name} `))!;
      const cells = row.split('│').map((c) => c.trim()).filter((c) => c !== '');
      expect(displayedMatches(cells[1], o.unit, o.nominal), `${name} nominal ${cells[1]}`).toBe(true);
      expect(displayedMatches(cells[2], o.unit, o.mean), `${name} mean ${cells[2]}`).toBe(true);
      expect(displayedMatches(cells[3], o.unit, o.sigma), `${name} σ ${cells[3]}`).toBe(true);
    }
  });
});

describe('spread output files', { timeout: 120_000 }, () => {
  it('--report and --samples write an HTML page whose figures equal the JSON, and a CSV of the first trials', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trimfree-spread-'));
    const html = join(dir, 'r.html');
    const csv = join(dir, 's.csv');
    const r = spread(CHARGER, ...FAST, '--json', '--report', html, '--samples', csv, '--sample-rows', '250');
    expect(r.status).toBe(0);
    expect(r.stderr).toContain(`wrote ${html}`);
    const json = JSON.parse(r.stdout) as SpreadJson;
    const page = readFileSync(html, 'utf8');
    for (const [name, o] of Object.entries(json.outputs)) {
      const section = new RegExp(`<section class="output" id="output-${name}"[\\s\\S]*?</section>`).exec(page)![0];
      const value = (field: string): number[] =>
        new RegExp(`data-field="${field}" data-value="([^"]*)"`).exec(section)![1].split(' ').filter((v) => v !== '').map(Number);
      expect(value('mean')).toEqual([o.mean]);
      expect(value('sigma')).toEqual([o.sigma]);
      expect(value('interval95')).toEqual([o.interval95.low, o.interval95.high]);
      expect(value('worstCase')).toEqual([o.worstCase.min, o.worstCase.max]);
      // No capability row against a window the design never gave.
      if (o.cpk === null) expect(section).not.toContain('data-field="cpk"');
      else expect(value('cpk')).toEqual([o.cpk]);
    }
    expect(page).not.toMatch(/NaN|Infinity|<script/);
    const rows = readFileSync(csv, 'utf8').trimEnd().split('\r\n');
    expect(rows).toHaveLength(251);
    expect(rows[0]).toMatch(/^trial,.*vout \(V\)/);
    // Every vout in the CSV lies within the run's observed range.
    const column = rows[0].split(',').indexOf('vout (V)');
    for (const row of rows.slice(1)) {
      const v = Number(row.split(',')[column]);
      expect(v).toBeGreaterThanOrEqual(json.outputs.vout.min);
      expect(v).toBeLessThanOrEqual(json.outputs.vout.max);
    }
  });

  it('refuses to overwrite an existing report without --force (exit 2, one line naming --force), file untouched', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trimfree-spread-'));
    const html = join(dir, 'r.html');
    writeFileSync(html, 'keep me');
    expectOneLineError(spread(CHARGER, ...FAST, '--report', html), /^trimfree: --report: .*already exists.*--force/);
    expect(readFileSync(html, 'utf8')).toBe('keep me');
    const forced = spread(CHARGER, ...FAST, '--report', html, '--force');
    expect(forced.status).toBe(0);
    expect(readFileSync(html, 'utf8')).toMatch(/^<!DOCTYPE html>/);
    expect(readdirSync(dir)).toEqual(['r.html']);
  });

  it('bad input: one line, exit 2, naming the option or file', () => {
    expectOneLineError(spread(CHARGER, '--trials', '5x'), /--trials: .*auto/);
    expectOneLineError(spread(CHARGER, '--trials', '10'), /--trials: 10 is out of range/);
    expectOneLineError(spread(CHARGER, '--seed', '-1'), /--seed/);
    expectOneLineError(spread(CHARGER, '--workers', '0'), /--workers/);
    expectOneLineError(spread(join(tmpdir(), 'no-such-design.json')), /no-such-design\.json/);
    const dir = mkdtempSync(join(tmpdir(), 'trimfree-spread-'));
    expectOneLineError(spread(CHARGER, '--report', join(dir, 'missing', 'r.html')), /--report: .*does not exist/);
    expect(existsSync(join(dir, 'missing'))).toBe(false);
  });
});
