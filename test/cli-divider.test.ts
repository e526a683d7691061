// `trimfree divider` as a user runs it: a subprocess of the built CLI (npm test builds dist/ first).
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { expectOneLineError, runTrimfree, type CliRun } from './cli-subprocess.js';


function divider(...args: string[]): CliRun {
  return runTrimfree(['divider', ...args]);
}


describe('trimfree divider (subprocess)', () => {
  it('the hand-worked 12 V example: 28.7 k over 3.3 k first, 12.121 V, +1.010 %', () => {
    // 1.25 × (1 + 28.7/3.3) = 12.121212 V (see test/pick-divider.test.ts for the arithmetic).
    const r = divider('--vref', '1.25', '--vout', '12', '--bottom', '3k3..3k3', '--series', 'E24,E96', '--max-error', '2%', '--top', '2');
    expect(r.status).toBe(0);
    const rows = r.stdout.split('\n').filter((line) => /^│ [12] /.test(line));
    expect(rows[0]).toMatch(/28\.7 kΩ 28K7 .*3\.30 kΩ 3K3 .*12\.121 V .*\+1\.010 %/);
    expect(rows[1]).toMatch(/28\.0 kΩ 28K0 .*11\.856 V .*-1\.199 %/);
    expect(r.stdout).toMatch(/regulator's datasheet/);
    expect(r.stdout).not.toMatch(/NaN|Infinity/);
  });

  it('--ifb in the band notation: the header says what was assumed, and the picker aims at the nominal', () => {
    // "max 2u" is anywhere in 0..2 µA, nominal 1 µA: the same candidates as a typical 1 µA (Vout's Ifb·Rtop term
    // at the nominal), and its own line in the header.
    const band = divider('--vref', '1.25', '--vout', '12', '--ifb', 'max 2u', '--json', '--top', '3');
    const typical = divider('--vref', '1.25', '--vout', '12', '--ifb', '1u', '--json', '--top', '3');
    expect(band.status).toBe(0);
    const candidates = (r: CliRun) => (JSON.parse(r.stdout) as { candidates: unknown[] }).candidates;
    expect(candidates(band)).toEqual(candidates(typical));
    expect((JSON.parse(band.stdout) as { settings: { ifbBand: unknown } }).settings.ifbBand).toEqual({ nominal: 1e-6, lo: 0, hi: 2e-6, form: 'max' });
    const text = divider('--vref', '1.25', '--vout', '12', '--ifb', 'max 2u', '--top', '1');
    expect(text.stdout.split('\n')[0]).toMatch(/Ifb max 2\.00 µA: uniform over 0\.\.2\.00 µA, nominal 1\.00 µA \(aimed at its nominal\)/);
  }, 30_000); // three subprocesses

  it('--json gives candidates with top/bottom in ohms and the physical parts', () => {
    const r = divider('--vref', '0.8', '--vout', '5', '--parts', '3', '--series', 'E24', '--json', '--top', '3');
    expect(r.status).toBe(0);
    const result = JSON.parse(r.stdout) as { candidates: Array<{ top: number; bottom: number; vout: number; errorPct: number; parts: Array<{ ohms: number }> }> };
    expect(result.candidates).toHaveLength(3);
    for (const c of result.candidates) {
      expect(c.vout).toBeCloseTo(0.8 * (1 + c.top / c.bottom), 12);
      expect(c.parts.length).toBeGreaterThanOrEqual(2);
      expect(c.parts.length).toBeLessThanOrEqual(3);
    }
  });

  it('an adjustable output with a pot', () => {
    const r = divider('--vref', '1.25', '--vout', '3.3..24', '--pot', '100k');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/every unit covers/);
    expect(r.stdout).not.toMatch(/NaN|Infinity/);
  });

  it('a stock file', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trimfree-divider-'));
    const path = join(dir, 'stock.csv');
    writeFileSync(path, 'value,qty\n10k,5\n1k,10\n4K7,3\n47k,2\n');
    const r = divider('--vref', '1.25', '--vout', '13.75', '--stock', path, '--json');
    expect(r.status).toBe(0);
    // 1.25 × (1 + 47k/4.7k) = 13.75 V exactly, and 1.25 × (1 + 10k/1k) too: both are exact.
    const result = JSON.parse(r.stdout) as { candidates: Array<{ errorPct: number; parts: Array<{ ohms: number }> }> };
    expect(Math.abs(result.candidates[0]!.errorPct)).toBeLessThan(1e-9);
    for (const c of result.candidates) for (const p of c.parts) expect([1000, 4700, 10000, 47000]).toContain(p.ohms);
  });

  it('bad input: one line, exit 2, no stack trace', () => {
    expectOneLineError(divider('--vref', '1.25', '--vout', '1.2'), /--vout: .*at or below the reference.*to fix:/);
    expectOneLineError(divider('--vref', '1.25', '--vout', '12x'), /--vout: .*accepted:/);
    expectOneLineError(divider('--vref', '1.25', '--vout', '12', '--series', 'E25'), /--series: unknown series 'E25'/);
    expectOneLineError(divider('--vref', '1.25', '--vout', '12', '--ifb', '10u', '--bottom', '10k..100k'), /feedback-pin rule/);
    expectOneLineError(divider('--vref', '1.25', '--vout', '3.3..24', '--pot', '10k'), /--pot: no fixed resistors/);
    expectOneLineError(divider('--vref', '1.25', '--vout', '12', '--stock', '/nonexistent.txt'), /--stock: cannot read/);
    expectOneLineError(divider('--vout', '12'), /vref/);
  });
});
