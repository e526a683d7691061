// `trimfree sense` as a user runs it: a subprocess of the built CLI (npm test builds dist/ first).
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { expectOneLineError, MAIN, runTrimfree, type CliRun } from './cli-subprocess.js';


function sense(...args: string[]): CliRun {
  return runTrimfree(['sense', ...args]);
}


describe('trimfree sense (subprocess)', () => {
  it('--ib in the band notation: the header says what was assumed', () => {
    // 10n±10n is 0..20 nA about a nominal 10 nA (src/units/current-band.ts).
    const r = sense('--limit', '3A', '--threshold', '1V', '--ib', '10n±10n', '--top', '1');
    expect(r.status).toBe(0);
    expect(r.stdout.split('\n')[2]).toMatch(/Ib 10\.0 nA ±10\.0 nA: uniform over 0 A\.\.20\.0 nA, comparing offset/);
  });

  it('prints ranked candidates, the Pareto front and the shunt caution', () => {
    const r = sense('--limit', '3A', '--threshold', '1V', '--top', '3');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/candidates \(best 3 of \d+/);
    expect(r.stdout).toMatch(/Pareto front/);
    expect(r.stdout).toMatch(/Caution: a shunt at the current limit runs hot/);
    // The 40 mΩ shunt with 110 k/15 k (gain 8.333 = 1 V/(40 mΩ·3 A) exactly) ranks first with the default options.
    expect(r.stdout).toMatch(/│ 1 │ 40\.0 mΩ │ 110 kΩ \/ 15\.0 kΩ/);
    expect(r.stdout).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('--json gives candidates and pareto in SI numbers, every number finite', () => {
    const r = sense('--limit', '3A', '--threshold', '1V', '--shunts', '20m,R033,50m', '--json');
    expect(r.status).toBe(0);
    const json = JSON.parse(r.stdout) as {
      candidates: Array<{ parts: Record<string, number>; limit: number; errorPct: number; shuntLossW: number; worstCase: { min: number; max: number } }>;
      pareto: Array<{ parts: Record<string, number>; shuntLossW: number; worstCaseSpreadPct: number }>;
    };
    expect(json.candidates.map((c) => c.parts['RS']).sort()).toEqual([0.02, 0.033, 0.05]);
    for (const c of json.candidates) {
      // Loss at the nominal limit is I²·Rs (Joule).
      expect(c.shuntLossW).toBeCloseTo(c.limit ** 2 * c.parts['RS']!, 12);
      expect(c.worstCase.min).toBeLessThan(c.limit);
      expect(c.worstCase.max).toBeGreaterThan(c.limit);
    }
    expect(json.pareto.length).toBeGreaterThan(0);
    expect(r.stdout).not.toMatch(/NaN|Infinity|null/);
  });

  it('direct with a threshold divider lists RT1/RT2', () => {
    const r = sense('--limit', '2A', '--topology', 'direct', '--threshold-from', '1.25V', '--top', '2');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/RT1 \/ RT2/);
  });

  it('a threshold above what the amplifier can reach: exit 2, one line naming --threshold and the remedy', () => {
    expectOneLineError(sense('--limit', '3A', '--threshold', '4.5V'), /^trimfree: --threshold: .*4\.50 V threshold.*; to fix: lower --threshold/);
  });

  it('a limit under 10× the offset: exit 2, one line', () => {
    expectOneLineError(sense('--limit', '10mA', '--threshold', '1V', '--vos', '5mV'), /^trimfree: --limit: .*10× .*offset/);
  });

  it('no shunt within the loss budget: exit 2, one line', () => {
    expectOneLineError(sense('--limit', '10A', '--threshold', '1V', '--max-loss', '50mW'), /^trimfree: --max-loss: /);
  });

  it('bad notation and missing or unknown options: exit 2, one line', () => {
    expectOneLineError(sense('--limit', '3Q', '--threshold', '1V'), /^trimfree: --limit: .*accepted:/);
    expectOneLineError(sense('--limit', '3A', '--threshold', '1V', '--shunts', '10m,,20m'), /^trimfree: --shunts: empty entry/);
    expectOneLineError(sense('--limit', '3A'), /^trimfree: --threshold: no threshold given/);
    expectOneLineError(sense('--threshold', '1V'), /--limit/);
    expectOneLineError(sense('--limit', '3A', '--threshold', '1V', '--topology', 'bridge'), /topology/);
    expectOneLineError(sense('--limit', '-3A', '--threshold', '1V'), /^trimfree: --limit: /);
    expectOneLineError(sense('--limit', '3A', '--threshold', '1V', '--common-mode', '24V'), /^trimfree: --common-mode: .*low side/);
  });
});

describe('trimfree sense --help', () => {
  it('every example in the help runs and exits 0', () => {
    const help = spawnSync(process.execPath, [MAIN, 'sense', '--help'], { encoding: 'utf8' }).stdout;
    const examples = help.split('\n').filter((line) => line.trim().startsWith('$ trimfree sense '));
    expect(examples.length).toBeGreaterThanOrEqual(4);
    for (const line of examples) {
      const args = line.trim().replace('$ trimfree sense ', '').split(/\s+/);
      const r = sense(...args);
      expect(r.stderr).toBe('');
      expect(r.status).toBe(0);
    }
  });
});
