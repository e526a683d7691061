// The terminal summary's window column and pass/fail word, checked against the JSON report's own figures (the spec
// window and yield it prints), and the colour rule: ANSI codes only for a terminal, never with NO_COLOR (no-color.org).
import { describe, expect, it } from 'vitest';
import { colourWanted } from '../src/cli/colour.js';
import { spreadJson } from '../src/report/json.js';
import { renderSpreadText } from '../src/report/spread-text.js';
import { FIXTURE_RESULT } from './report-fixture.js';
import { displayedMatches } from './report-check.js';
import { buildIfMissing, runTrimfree } from './cli-subprocess.js';
import { join } from 'node:path';
import { PROJECT_ROOT } from '../src/project-root.js';

/** ECMA-48 control sequence introducer. */
const ESC = '\u001b[';

function summaryRows(text: string, names: string[]): Map<string, string[]> {
  const rows = new Map<string, string[]>();
  for (const name of names) {
    const row = text.split('\n').find((l) => l.startsWith(`│ ${name} `));
    if (!row) throw new Error(`no summary row for ${name}`);
    rows.set(name, row.split('│').map((c) => c.trim()).filter((c) => c !== ''));
  }
  return rows;
}

describe('summary window and verdict', () => {
  const json = spreadJson(FIXTURE_RESULT, { version: '1.0.0' }) as { outputs: Record<string, { unit: string; spec: { low: number; high: number } | null; yieldPct: number | null }> };
  const names = Object.keys(json.outputs);

  it('the window column shows the JSON spec window, rounded; — without one', () => {
    const rows = summaryRows(renderSpreadText(FIXTURE_RESULT, { version: '1.0.0', subject: 'f' }), names);
    for (const [name, o] of Object.entries(json.outputs)) {
      const window = rows.get(name)![7]!;
      if (!o.spec) {
        expect(window).toBe('—');
        continue;
      }
      const [low, high] = window.split(' … ');
      expect(displayedMatches(low!, o.unit, o.spec.low), `${name} ${window}`).toBe(true);
      expect(displayedMatches(high!, o.unit, o.spec.high), `${name} ${window}`).toBe(true);
    }
  });

  it('pass when the JSON yield reaches the target, fail below, and the header names the target', () => {
    const withSpec = Object.entries(json.outputs).filter(([, o]) => o.yieldPct !== null);
    expect(withSpec.length).toBeGreaterThan(0);
    // Targets on both sides of each output's yield, so every output is seen passing and failing.
    for (const [name, o] of withSpec) {
      for (const target of [o.yieldPct! - 0.01, o.yieldPct!, Math.min(99.999999, o.yieldPct! + 0.01)]) {
        const text = renderSpreadText(FIXTURE_RESULT, { version: '1.0.0', subject: 'f', targetYieldPct: target });
        expect(text).toContain(`yield ≥ ${target} %`);
        expect(summaryRows(text, names).get(name)![8]).toBe(o.yieldPct! >= target ? 'pass' : 'fail');
      }
    }
    for (const [name, o] of Object.entries(json.outputs)) {
      if (o.yieldPct === null) expect(summaryRows(renderSpreadText(FIXTURE_RESULT, { version: '1.0.0', subject: 'f' }), names).get(name)![8]).toBe('—');
    }
  });

  it('colour codes only when asked; the words stay the same with and without', () => {
    const plain = renderSpreadText(FIXTURE_RESULT, { version: '1.0.0', subject: 'f', targetYieldPct: 50 });
    const coloured = renderSpreadText(FIXTURE_RESULT, { version: '1.0.0', subject: 'f', targetYieldPct: 50, colour: true });
    expect(plain).not.toContain(ESC);
    expect(coloured).toContain(`${ESC}32mpass${ESC}0m`);
    expect(coloured.replace(/\u001b\[[0-9;]*m/g, '')).toBe(plain);
  });

  it('colour is wanted on a terminal only, and never with NO_COLOR set to something', () => {
    expect(colourWanted({ isTTY: true }, {})).toBe(true);
    expect(colourWanted({ isTTY: false }, {})).toBe(false);
    expect(colourWanted({}, {})).toBe(false);
    expect(colourWanted({ isTTY: true }, { NO_COLOR: '1' })).toBe(false);
    expect(colourWanted({ isTTY: true }, { NO_COLOR: '' })).toBe(true); // no-color.org: an empty value does not count
  });

  it('spread to a pipe prints the words without colour codes', () => {
    buildIfMissing();
    const r = runTrimfree(['spread', join(PROJECT_ROOT, 'examples', 'led-driver-highside.json'), '--trials', '5000', '--workers', '1', '--target-yield', '99%']);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('yield ≥ 99 %');
    expect(r.stdout).toMatch(/│ vout .*│ pass +│/);
    expect(r.stdout).not.toContain(ESC);
  }, 60_000);
});
