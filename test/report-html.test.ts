import { describe, expect, it } from 'vitest';
import { renderHtmlReport } from '../src/report/html-report.js';
import { spreadJson } from '../src/report/json.js';
import { groupingFactor } from '../src/report/display-bins.js';
import { HISTOGRAM_MAX_BINS } from '../src/report/svg-histogram.js';
import { FIXTURE_PARTS, FIXTURE_RESULT } from './report-fixture.js';
import { displayedMatches } from './report-check.js';

const html = renderHtmlReport({
  title: 'Spread report',
  subject: 'fixture.json',
  version: '9.9.9',
  result: FIXTURE_RESULT,
  parts: FIXTURE_PARTS,
  cautions: ['A lithium cell’s charge voltage must stay within its datasheet window.'],
  bom: [{ designator: 'R1', value: '7.15 kΩ', code: '7K15', series: 'E96', tolerance: '1 %', tcr: '100 ppm/K', power: '1.0 mW' }],
});
const json = spreadJson(FIXTURE_RESULT, { version: '9.9.9' });

function section(name: string): string {
  const match = new RegExp(`<section class="output" id="output-${name}"[\\s\\S]*?</section>`).exec(html);
  if (!match) throw new Error(`no section for ${name}`);
  return match[0];
}

function attr(tag: string, name: string): string | undefined {
  return new RegExp(`\\b${name}="([^"]*)"`).exec(tag)?.[1];
}

/** Every figure cell of a section: field → { exact numbers, displayed text }. */
function figures(sectionHtml: string): Map<string, { values: number[]; text: string }> {
  const out = new Map<string, { values: number[]; text: string }>();
  for (const m of sectionHtml.matchAll(/<td class="num" data-field="([^"]+)" data-value="([^"]*)">([^<]*)<\/td>/g)) {
    out.set(m[1], { values: m[2] === '' ? [] : m[2].split(' ').map(Number), text: m[3] });
  }
  return out;
}

describe('HTML report: the numbers on the page are the JSON figures', () => {
  for (const name of Object.keys(FIXTURE_RESULT.outputs)) {
    it(`${name}: every figure's exact value equals the JSON, and its text rounds that value`, () => {
      const o = json.outputs[name];
      const f = figures(section(name));
      const expected: Record<string, number[]> = {
        nominal: [o.nominal],
        mean: [o.mean],
        sigma: [o.sigma],
        interval95: [o.interval95.low, o.interval95.high],
        interval9973: [o.interval9973.low, o.interval9973.high],
        worstCase: [o.worstCase.min, o.worstCase.max],
        rss: [o.rss.sigma, o.rss.expandedUncertainty, o.rss.coverageFactor],
        yieldPct: o.yieldPct === null ? [] : [o.yieldPct, o.yieldInterval95!.low, o.yieldInterval95!.high],
        cpk: o.cpk === null ? [] : [o.cpk],
        cp: o.cp === null ? [] : [o.cp],
        ppmOut: o.ppmOut === null ? [] : [o.ppmOut],
      };
      for (const [field, values] of Object.entries(expected)) {
        // An output without a window has no yield or capability rows at all.
        if (o.spec === null && ['yieldPct', 'cpk', 'cp', 'ppmOut'].includes(field)) expect(f.has(field), field).toBe(false);
        else expect(f.get(field)?.values, field).toEqual(values);
      }
      // Displayed texts read back with the units parsers agree within the digits shown.
      expect(displayedMatches(f.get('nominal')!.text, o.unit, o.nominal)).toBe(true);
      expect(displayedMatches(f.get('mean')!.text, o.unit, o.mean)).toBe(true);
      expect(displayedMatches(f.get('sigma')!.text, o.unit, o.sigma)).toBe(true);
      const [lo, hi] = f.get('worstCase')!.text.split(' … ');
      expect(displayedMatches(lo, o.unit, o.worstCase.min) && displayedMatches(hi, o.unit, o.worstCase.max)).toBe(true);
      if (o.cpk === null) expect(f.get('cpk')?.text ?? '—').toBe('—');
      else expect(Math.abs(Number(f.get('cpk')!.text) - o.cpk)).toBeLessThanOrEqual(0.005 + 1e-9); // two decimals shown
    });
  }
});

describe('HTML report: histograms and markers', () => {
  for (const [name, output] of Object.entries(FIXTURE_RESULT.outputs)) {
    it(`${name}: the expected number of bins, holding every trial, and the markers at the JSON values`, () => {
      const s = section(name);
      const fine = output.histogram.counts.length; // 200 fine bins in the fixture
      const expectedBins = Math.ceil(fine / groupingFactor(fine, HISTOGRAM_MAX_BINS)); // 200 / ⌈200/60⌉ = 50
      expect(expectedBins).toBe(50);
      const bins = [...s.matchAll(/<rect class="bin [^"]*"[^>]*>/g)].map((m) => m[0]);
      expect(bins).toHaveLength(expectedBins);
      expect(bins.map((b) => Number(attr(b, 'data-bin')))).toEqual(Array.from({ length: expectedBins }, (_, i) => i));
      expect(bins.reduce((sum, b) => sum + Number(attr(b, 'data-count')), 0)).toBe(FIXTURE_RESULT.trials);
      const marker = (m: string): number | undefined => {
        const tag = new RegExp(`<g class="marker[^"]*" data-marker="${m}" data-value="([^"]+)"`).exec(s);
        return tag ? Number(tag[1]) : undefined;
      };
      const o = json.outputs[name];
      expect(marker('interval95-low')).toBe(o.interval95.low);
      expect(marker('interval95-high')).toBe(o.interval95.high);
      expect(marker('worst-min')).toBe(o.worstCase.min);
      expect(marker('worst-max')).toBe(o.worstCase.max);
      expect(marker('nominal')).toBe(o.nominal);
      expect(marker('spec-low')).toBe(o.spec?.low);
      expect(marker('spec-high')).toBe(o.spec?.high);
      // A bar is marked out-of-spec exactly when its middle lies outside the window (none without a window).
      for (const b of bins) {
        const middle = (Number(attr(b, 'data-low')) + Number(attr(b, 'data-high'))) / 2;
        const outside = o.spec !== null && (middle < o.spec.low || middle > o.spec.high);
        expect(b.includes('out-of-spec')).toBe(outside);
      }
      if (name === 'vout') expect(bins.some((b) => b.includes('out-of-spec'))).toBe(true); // fixture's tails cross the window
    });
  }

  it('the contributors chart has one bar per contribution with its exact shares (total-effect, first-order, RSS)', () => {
    const s = section('vout');
    const bars = [...s.matchAll(/<rect class="contribution" data-part="([^"]+)" data-share="([^"]+)" data-first-order="([^"]+)" data-rss-share="([^"]+)"/g)];
    expect(bars.map((b) => [b[1], Number(b[2]), Number(b[3]), Number(b[4])])).toEqual(
      json.outputs.vout.contributions
        .filter((c) => c.totalEffectShare >= 0.001)
        .map((c) => [c.part.replace('<', '&lt;').replace('>', '&gt;'), c.totalEffectShare, c.firstOrderShare, c.firstOrderRssShare]),
    );
  });

  it('the shares carry their one-line explanation: what the total-effect shares sum to for that output', () => {
    const lines = [...section('vout').matchAll(/<p class="meta variance-budget">([^<]+)<\/p>/g)].map((m) => m[1]);
    // The fixture's Σ total-effect is 1.025: past 100 %, said with the figure.
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^Total-effect shares sum to 102\.5 % \(first-order 97\.8 %\): past 100 %/);
  });
});

describe('HTML report: self-contained and clean', () => {
  it('no script, no external resource, no NaN or Infinity', () => {
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/\b(src|href)=/i);
    expect(html.replace(/xmlns="http:\/\/www\.w3\.org\/2000\/svg"/g, '')).not.toMatch(/https?:/);
    expect(html).not.toMatch(/NaN|Infinity/);
  });
  it('escapes text (a part named "R2 <bottom>")', () => {
    expect(html).toContain('R2 &lt;bottom&gt;');
    expect(html).not.toContain('R2 <bottom>');
  });
  it('states how it was obtained: method, trials, seed, version, and the cautions', () => {
    expect(html).toContain('data-seed="fixture"');
    expect(html).toContain('data-trials="100000"');
    expect(html).toContain('trimfree 9.9.9');
    expect(html).toMatch(/JCGM 101:2008/);
    expect(html).toMatch(/class="caution"[\s\S]*charge voltage/);
    expect(html).toMatch(/<tr data-designator="R1">/);
    expect(html).toMatch(/<tr data-part="Vref">/);
  });
});
