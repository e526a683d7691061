// `trimfree nearest --stock FILE`: the same search over the user's own values. Expectations by hand from the list.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../src/project-root.js';
import { buildIfMissing } from './cli-subprocess.js';

const CLI = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');
let stock = '';

function cli(...args: string[]) {
  return spawnSync('node', [CLI, ...args], { cwd: PROJECT_ROOT, encoding: 'utf8' });
}

beforeAll(() => {
  // Build only when dist/ is missing: rebuilding it here raced the other test files' subprocesses (half-written
  // dist files gave them exit 1 and timeouts on a loaded machine).
  buildIfMissing();
  const dir = mkdtempSync(join(tmpdir(), 'trimfree-stock-'));
  stock = join(dir, 'drawer.txt');
  writeFileSync(stock, '4.7k\n10k\n1k\n2K2\n');
}, 120_000); // a full tsc build when dist/ is missing: well over the 10 s default on a loaded two-core machine

describe('nearest --stock', () => {
  it('20 kΩ from {1k, 2.2k, 4.7k, 10k}: nothing above, 10k below (−50 %), and 10k + 10k is exact', () => {
    const r = cli('nearest', '20k', '--stock', stock, '--json');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as { below: number; above: number | null; combos: { kind: string; parts: number[]; errorPct: number }[] };
    expect(out.below).toBe(10e3);
    expect(out.above).toBeNull();
    expect(out.combos[0]).toMatchObject({ kind: 'series', parts: [10e3, 10e3] });
    expect(Math.abs(out.combos[0]!.errorPct)).toBeLessThan(1e-9);
  });
  it('the text table shows a dash where the list has no value above, and no NaN', () => {
    const r = cli('nearest', '20k', '--stock', stock);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/above\s+│\s+—/);
    expect(r.stdout).not.toMatch(/NaN|Infinity/);
  });
  it('a missing stock file is one line naming --stock, exit 2', () => {
    const r = cli('nearest', '20k', '--stock', join(tmpdir(), 'no-such-trimfree-stock.txt'));
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/^trimfree: --stock: /);
  });
});
