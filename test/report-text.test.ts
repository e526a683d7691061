import { describe, expect, it } from 'vitest';
import { renderAsciiHistogram } from '../src/report/ascii-histogram.js';
import { displayBins } from '../src/report/display-bins.js';
import { spreadJson } from '../src/report/json.js';
import { renderSpreadText } from '../src/report/spread-text.js';
import { formatYieldPct, outputDigits } from '../src/report/format-value.js';
import { FIXTURE_RESULT } from './report-fixture.js';
import { displayedMatches } from './report-check.js';

describe('display bins', () => {
  it('sums runs of adjacent fine bins; total count and outer edges unchanged (brute-force sum)', () => {
    const histogram = { edges: [0, 1, 2, 3, 4, 5, 6, 7], counts: [1, 2, 3, 4, 5, 6, 7] };
    const bins = displayBins(histogram, 3); // factor ⌈7/3⌉ = 3 → [1+2+3, 4+5+6, 7]
    expect(bins).toEqual([
      { low: 0, high: 3, count: 6 },
      { low: 3, high: 6, count: 15 },
      { low: 6, high: 7, count: 7 },
    ]);
    expect(displayBins(histogram, 100)).toHaveLength(7);
  });
});

describe('terminal report', () => {
  const text = renderSpreadText(FIXTURE_RESULT, { version: '1.0.0', subject: 'fixture.json', cautions: ['mind the cell voltage'] });
  const json = spreadJson(FIXTURE_RESULT, { version: '1.0.0' });

  it('the summary row of each output shows the JSON figures, rounded', () => {
    for (const [name, o] of Object.entries(json.outputs)) {
      const row = text.split('\n').find((l) => l.startsWith(`│ ${name} `));
      expect(row, name).toBeDefined();
      const cells = row!.split('│').map((c) => c.trim()).filter((c) => c !== '');
      expect(displayedMatches(cells[1], o.unit, o.nominal)).toBe(true);
      expect(displayedMatches(cells[2], o.unit, o.mean)).toBe(true);
      expect(displayedMatches(cells[3], o.unit, o.sigma)).toBe(true);
      expect(cells[5]).toBe(o.yieldPct === null ? '—' : formatYieldPct(o.yieldPct));
    }
  });

  it('no NaN or Infinity anywhere; the caution and the seed are printed', () => {
    expect(text).not.toMatch(/NaN|Infinity/);
    expect(text).toContain('! mind the cell voltage');
    expect(text).toContain('seed "fixture"');
  });

  it('a yield short of 100 % never rounds to 100 % (99.99996 % keeps its digits)', () => {
    expect(formatYieldPct(99.99996)).toBe('99.999960 %');
    expect(formatYieldPct(100)).toBe('100.00 %');
    expect(formatYieldPct(99.99999999999999)).toBe('100.00 %'); // a Wilson bound of 1 − 1e-16, not a shortfall
    expect(formatYieldPct(98.764)).toBe('98.76 %');
  });

  it('contributors: ranked by total-effect share with its standard error, the three shares labelled, the sum explained', () => {
    const lines = text.split('\n');
    const at = lines.indexOf('largest contributors (ranked by total-effect share of the variance):');
    expect(at).toBeGreaterThan(0);
    const header = lines[at + 2]!.split('│').map((c) => c.trim()).filter((c) => c !== '');
    expect(header.slice(0, 4)).toEqual(['part', 'total-effect share ± std. error', 'first-order share ± std. error', 'first-order (RSS) share']);
    // Fixture: Vref total-effect 0.62 ± 0.011, first-order 0.60 ± 0.013, RSS 0.61.
    const vref = lines[at + 3]!.split('│').map((c) => c.trim()).filter((c) => c !== '');
    expect(vref.slice(0, 4)).toEqual(['Vref', '62.0 % ± 1.1 %', '60.0 % ± 1.3 %', '61.0 %']);
    expect(text).toContain('Total-effect shares sum to 102.5 % (first-order 97.8 %): past 100 % because');
    // The fixture's RSS σ is within 10 % of Monte Carlo's: no RSS note.
    expect(text).not.toContain('differs from the Monte Carlo σ');
    expect(text).toMatch(/RSS, first order \(JCGM 100 5\.1\.2\): u\(y\), U = k·u\(y\) *│ *u 12\.1 mV, U 24\.2 mV \(k = 2\)/);
  });

  it('an RSS σ more than 10 % off the Monte Carlo σ is said, with the reason the budget found', () => {
    const vout = FIXTURE_RESULT.outputs.vout;
    const budget = { ...vout.varianceBudget, firstOrderSum: 0.03, totalEffectSum: 1.97, rssToMonteCarloSigma: 0.18, rssAgreement: 'interaction' as const };
    const interacting = { ...FIXTURE_RESULT, outputs: { vout: { ...vout, varianceBudget: budget } } };
    const shown = renderSpreadText(interacting, { version: '1.0.0', subject: 'fixture.json' });
    expect(shown).toContain('RSS σ (first order) 12.1 mV differs from the Monte Carlo σ 12.0 mV by more than 10 %: parts interact (first-order shares sum to only 3.0 %)');
    const nonlinear = { ...FIXTURE_RESULT, outputs: { vout: { ...vout, varianceBudget: { ...budget, firstOrderSum: 0.97, rssAgreement: 'nonlinearity' as const } } } };
    expect(renderSpreadText(nonlinear, { version: '1.0.0', subject: 'fixture.json' })).toContain('the output is not linear across the parts\' bands (first-order shares sum to 97.0 %');
  });

  it('shows enough digits to resolve a tenth of σ: 8.4 V with σ = 12 mV → 4 significant digits', () => {
    expect(outputDigits(FIXTURE_RESULT.outputs.vout)).toBe(4); // 8.400 V: last digit 1 mV ≤ σ/10 = 1.2 mV
  });
});

describe('ASCII histogram', () => {
  const output = FIXTURE_RESULT.outputs.vout;
  const lines = renderAsciiHistogram(output, { rows: 16 }).split('\n');

  it('one row per display bin, with both spec-limit lines in order between the rows', () => {
    const rows = lines.filter((l) => l.includes('|'));
    expect(rows).toHaveLength(displayBins(output.histogram, 16).length); // 200 fine bins, factor 13 → 16 rows
    const low = lines.findIndex((l) => l.includes('spec low'));
    const high = lines.findIndex((l) => l.includes('spec high'));
    expect(low).toBeGreaterThan(0);
    expect(high).toBeGreaterThan(low);
  });

  it("rows whose middle lies outside the window are drawn with 'x', inside with '#'", () => {
    const bins = displayBins(output.histogram, 16);
    const rows = lines.filter((l) => l.includes('|'));
    bins.forEach((bin, i) => {
      if (bin.count === 0) return;
      const middle = (bin.low + bin.high) / 2;
      const inside = middle >= output.spec![0] && middle <= output.spec![1];
      expect(rows[i]).toContain(inside ? '#' : 'x');
    });
  });

  it('each row ends with its exact trial count', () => {
    const bins = displayBins(output.histogram, 16);
    const rows = lines.filter((l) => l.includes('|'));
    rows.forEach((row, i) => expect(row.trim().endsWith(bins[i].count.toLocaleString('en-US'))).toBe(true));
  });
});
