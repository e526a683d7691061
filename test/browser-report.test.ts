// The HTML report in a real browser: Chromium driven by playwright-core; Debian's package when installed, else the
// build shipped in the dev dependency @sparticuz/chromium (test/browser-executable.ts; never a download). Checks that the inline SVG charts render with the expected bins and markers, and leaves a screenshot in /tmp.
import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { groupingFactor } from '../src/report/display-bins.js';
import { renderHtmlReport } from '../src/report/html-report.js';
import { HISTOGRAM_MAX_BINS } from '../src/report/svg-histogram.js';
import { runGrades } from '../src/design/grade-study.js';
import { gradesReportTables } from '../src/report/grades-tables.js';
import { runSpread } from '../src/design/spread-study.js';
import { renderSpreadRunHtml } from '../src/report/spread-run-html.js';
import { VERSION } from '../src/cli/version.js';
import { loadDesignFile } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { POT_OUTPUTS } from '../src/report/pot-ends.js';
import { FIXTURE_PARTS, FIXTURE_RESULT } from './report-fixture.js';
import { BROWSER_ARGS, findChromium } from './browser-executable.js';
import { pdfFigures, pdfPageCount } from './pdf-structure.js';
import { readDisplayed } from './report-check.js';
import { fileSha256 } from '../src/cli/file-digest.js';

/** The SVG/DOM geometry used below (the project's TypeScript settings carry no DOM library). */
type Graphic = { getBBox(): { width: number }; getBoundingClientRect(): { left: number; width: number; height: number } };
export const SCREENSHOT = join(tmpdir(), 'trimfree-report.png');
export const EXAMPLE_SCREENSHOT = join(tmpdir(), 'trimfree-report-example.png');

/** A fresh Chromium (test/browser-executable.ts says which) with its own profile folder. */
async function launch(): Promise<{ context: BrowserContext; profile: string }> {
  const browser = await findChromium();
  const profile = mkdtempSync(join(tmpdir(), 'trimfree-chromium-profile-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: browser.path,
    headless: true,
    viewport: { width: 1200, height: 900 },
    args: BROWSER_ARGS,
    env: { ...process.env, ...browser.env } as Record<string, string>,
  });
  return { context, profile };
}

describe('HTML report in headless Chromium', () => {
  let context: BrowserContext | undefined;
  let profile = '';
  let page: Awaited<ReturnType<BrowserContext['newPage']>>;

  beforeAll(async () => {
    const folder = mkdtempSync(join(tmpdir(), 'trimfree-browser-'));
    const file = join(folder, 'report.html');
    writeFileSync(
      file,
      renderHtmlReport({ title: 'Spread report', subject: 'fixture.json', version: '0.0.0', result: FIXTURE_RESULT, parts: FIXTURE_PARTS, cautions: ['test caution'] }),
    );
    ({ context, profile } = await launch());
    page = await context.newPage();
    const requests: string[] = [];
    page.on('request', (r) => requests.push(r.url()));
    await page.goto(`file://${file}`);
    // A self-contained report asks for nothing but itself.
    expect(requests.filter((u) => !u.startsWith('file://'))).toEqual([]);
  }, 60_000);

  afterAll(async () => {
    await context?.close();
    if (profile) rmSync(profile, { recursive: true, force: true });
  });

  it('one histogram per output, each with the expected number of visible bars', async () => {
    const histograms = await page.$$eval('svg.histogram', (svgs) =>
      svgs.map((svg) => ({
        output: svg.getAttribute('data-output'),
        bars: svg.querySelectorAll('rect.bin').length,
        visible: [...svg.querySelectorAll('rect.bin')].filter((r) => (r as unknown as Graphic).getBBox().width > 0).length,
        width: (svg as unknown as Graphic).getBoundingClientRect().width,
      })),
    );
    expect(histograms.map((h) => h.output)).toEqual(Object.keys(FIXTURE_RESULT.outputs));
    for (const h of histograms) {
      const fine = FIXTURE_RESULT.outputs[h.output!].histogram.counts.length;
      const expected = Math.ceil(fine / groupingFactor(fine, HISTOGRAM_MAX_BINS));
      expect(h.bars).toBe(expected);
      expect(h.visible).toBe(expected);
      expect(h.width).toBeGreaterThan(300);
    }
  });

  it('spec, 95 % interval and worst-case markers are drawn where the result says, in order along the axis', async () => {
    for (const [name, output] of Object.entries(FIXTURE_RESULT.outputs)) {
      const markers = await page.$$eval(`svg.histogram[data-output="${name}"] [data-marker]`, (nodes) =>
        nodes.map((n) => ({ marker: n.getAttribute('data-marker'), box: (n as unknown as Graphic).getBoundingClientRect() })),
      );
      const x = (m: string): number => {
        const found = markers.find((k) => k.marker === m);
        if (!found) throw new Error(`${name}: marker ${m} missing`);
        expect(found.box.height, `${name} ${m} is drawn`).toBeGreaterThan(10);
        return found.box.left + found.box.width / 2;
      };
      expect(x('worst-min')).toBeLessThan(x('interval95-low'));
      expect(x('interval95-low')).toBeLessThan(x('nominal'));
      expect(x('nominal')).toBeLessThan(x('interval95-high'));
      expect(x('interval95-high')).toBeLessThan(x('worst-max'));
      if (output.spec) {
        expect(x('spec-low')).toBeLessThan(x('spec-high'));
      } else {
        expect(markers.some((m) => m.marker?.startsWith('spec'))).toBe(false);
      }
    }
  });

  it('the contributors chart and the caution box render; a screenshot is saved', async () => {
    expect(await page.locator('svg.contributions').count()).toBe(Object.keys(FIXTURE_RESULT.outputs).length);
    expect(await page.locator('svg.contributions[data-output="vout"] rect.contribution').count()).toBe(3);
    expect(await page.locator('.caution').isVisible()).toBe(true);
    await page.screenshot({ path: SCREENSHOT, fullPage: true });
    expect(existsSync(SCREENSHOT)).toBe(true);
  });
});

describe('the report of an example design (adjustable bench module) in headless Chromium', () => {
  const designFile = join(PROJECT_ROOT, 'examples', 'bench-adjustable.json');
  const generatedAt = new Date();
  let context: BrowserContext | undefined;
  let profile = '';
  let page: Awaited<ReturnType<BrowserContext['newPage']>>;
  let run: Awaited<ReturnType<typeof runSpread>>;
  let graded: Awaited<ReturnType<typeof runGrades>>;

  beforeAll(async () => {
    const resolved = resolveDesign(loadDesignFile(designFile));
    const choice = { trials: 20000, seed: 1, workers: 1, progress: false } as const;
    run = await runSpread(resolved, { ...choice });
    graded = await runGrades(resolved, { ...choice }, { targetYieldPct: 99, searchTrials: 4000 });
    const folder = mkdtempSync(join(tmpdir(), 'trimfree-browser-'));
    const html = join(folder, 'bench.html');
    writeFileSync(
      html,
      renderSpreadRunHtml(run, {
        subject: 'examples/bench-adjustable.json',
        version: VERSION,
        command: 'trimfree design examples/bench-adjustable.json --report bench.html',
        tables: gradesReportTables(graded),
        // The digest as the CLI computes it (src/cli/file-digest.ts); the test checks it against node:crypto below.
        provenance: { generatedAt, designSha256: fileSha256(designFile) },
      }),
    );
    ({ context, profile } = await launch());
    page = await context.newPage();
    await page.goto(`file://${html}`);
  }, 120_000);

  afterAll(async () => {
    await context?.close();
    if (profile) rmSync(profile, { recursive: true, force: true });
  });

  it('histograms for both ends of the pot travel, the grade tables, and a screenshot of the whole page', async () => {
    expect(run.lowEnd).toBeDefined();
    // The bottom of the travel shows only what the pot moves (src/report/pot-ends.ts).
    const lowEndShown = Object.keys(run.lowEnd!.result.outputs).filter((name) => POT_OUTPUTS.includes(name)).length;
    expect(lowEndShown).toBe(2);
    expect(await page.locator('svg.histogram').count()).toBe(Object.keys(run.result.outputs).length + lowEndShown);
    expect(await page.locator('section[id^="lowend-output-"] svg.histogram').count()).toBe(lowEndShown);
    for (const svg of await page.locator('svg.histogram').all()) {
      const bins = await svg.locator('rect.bin').count();
      expect(bins).toBe(Number(await svg.getAttribute('data-bins')));
      expect(bins).toBeGreaterThan(10);
      expect(await svg.locator('[data-marker="interval95-low"]').count()).toBe(1);
      expect(await svg.locator('[data-marker="worst-max"]').count()).toBe(1);
    }
    expect(await page.locator('#grades tbody tr').count()).toBe(4);
    expect(await page.locator('tr[data-designator="RS"]').count()).toBe(1);
    await page.screenshot({ path: EXAMPLE_SCREENSHOT, fullPage: true });
    expect(existsSync(EXAMPLE_SCREENSHOT)).toBe(true);
  });

  it('the verdict block comes first: a row per output with a window, its words matching the result, and the overall line', async () => {
    const verdict = page.locator('#verdict');
    const box = await verdict.boundingBox();
    const summary = await page.locator('h2', { hasText: 'Summary' }).boundingBox();
    expect(box!.y).toBeLessThan(summary!.y);
    const windowed = Object.values(run.result.outputs).filter((o) => o.spec);
    const rows = await verdict.locator('tbody tr').evaluateAll((nodes) => nodes.map((n) => ({ output: n.getAttribute('data-output'), verdict: n.getAttribute('data-verdict'), cells: Array.from(n.querySelectorAll('td') as ArrayLike<{ textContent: string | null }>).map((td) => td.textContent ?? '') })));
    expect(rows.map((r) => r.output)).toEqual(windowed.map((o) => o.name));
    for (const row of rows) {
      const o = run.result.outputs[row.output!]!;
      const inside = o.worstCase.min >= o.spec![0] && o.worstCase.max <= o.spec![1];
      expect(row.cells[3]!.startsWith(inside ? 'inside' : 'outside'), row.output!).toBe(true);
      // The word says it; the default target is 99.9 %.
      expect(row.cells[4]).toBe(o.yield!.pct >= 99.9 ? 'meets 99.9 %' : 'below 99.9 %');
      expect(row.verdict).toBe(o.yield!.pct >= 99.9 ? 'pass' : 'fail');
    }
    const overall = (await verdict.locator('p.overall').textContent()) ?? '';
    const perMillion = Math.round(run.result.allSpecs!.pct * 1e4).toLocaleString('en-US');
    expect(overall).toContain(`in ${perMillion} of 1,000,000 units`);
  });

  it('an ambient sweep chart per output: bands ordered worst case ⊇ Monte Carlo, nominal inside, ticks in °C over the range', async () => {
    const grid = run.result.ambientGridC!;
    expect(grid.length).toBeGreaterThan(2);
    for (const [name, output] of Object.entries(run.result.outputs)) {
      const svg = page.locator(`section#output-${name} svg.sweep`);
      expect(await svg.count(), name).toBe(1);
      const worst = await svg.locator('path.sweep-worst').boundingBox();
      const mc = await svg.locator('path.sweep-mc').boundingBox();
      const nominal = await svg.locator('polyline.sweep-nominal').boundingBox();
      // On screen y grows downwards: the worst-case band encloses the Monte Carlo band, which encloses the nominal.
      expect(worst!.y).toBeLessThanOrEqual(mc!.y + 0.5);
      expect(worst!.y + worst!.height, name).toBeGreaterThanOrEqual(mc!.y + mc!.height - 0.5);
      expect(worst!.width).toBeGreaterThan(100);
      // The nominal line's box includes its stroke: compare its middle (a flat line's own height) with the band.
      const middle = nominal!.y + nominal!.height / 2;
      expect(middle, name).toBeGreaterThanOrEqual(worst!.y - 1);
      expect(middle, name).toBeLessThanOrEqual(worst!.y + worst!.height + 1);
      const ticks = await svg.locator('g.tick.x').evaluateAll((nodes) => nodes.map((n) => ({ value: Number(n.getAttribute('data-value')), label: n.querySelector('text')!.textContent ?? '' })));
      expect(ticks.length, name).toBeGreaterThanOrEqual(2);
      for (const t of ticks) {
        expect(t.label).toBe(`${t.value} °C`);
        expect(t.value).toBeGreaterThanOrEqual(grid[0]!);
        expect(t.value).toBeLessThanOrEqual(grid[grid.length - 1]!);
      }
      expect(await svg.locator('line.sweep-limit').count(), name).toBe(output.spec ? 2 : 0);
    }
  });

  it('provenance at the top: the SHA-256 node:crypto gives for the design file, the time, version, seed and trials', async () => {
    const field = async (name: string): Promise<string> => (await page.locator(`#provenance dd[data-field="${name}"]`).textContent()) ?? '';
    expect(await field('sha256')).toBe(createHash('sha256').update(readFileSync(designFile)).digest('hex'));
    expect(await field('generated')).toBe(`${generatedAt.toISOString().slice(0, 19).replace('T', ' ')} UTC`);
    expect(await field('version')).toBe(VERSION);
    expect(await field('seed')).toBe(JSON.stringify(run.result.seed));
    expect(Number((await field('trials')).replace(/,/g, ''))).toBe(run.result.trials);
    // It comes before every section of figures.
    const top = await page.locator('#provenance').boundingBox();
    const firstTable = await page.locator('table').first().boundingBox();
    expect(top!.y).toBeLessThan(firstTable!.y);
  });

  it('histogram axes: tick labels read back (with their unit) to the value at their position, and the markers sit where the ticks say', async () => {
    for (const [name, output] of Object.entries(run.result.outputs)) {
      const svg = page.locator(`section#output-${name} svg.histogram`);
      const ticks = await svg.locator('g.tick.x').evaluateAll((nodes) =>
        nodes.map((n) => ({ value: Number(n.getAttribute('data-value')), label: n.querySelector('text')!.textContent ?? '', x: Number(n.querySelector('line')!.getAttribute('x1')) })),
      );
      expect(ticks.length, name).toBeGreaterThanOrEqual(3);
      for (const t of ticks) {
        const { value, halfStep } = readDisplayed(t.label, output.unit);
        expect(Math.abs(value - t.value), `${name} tick ${t.label}`).toBeLessThanOrEqual(halfStep * (1 + 1e-9));
      }
      // Evenly spaced values at evenly spaced positions (a linear axis).
      const dv = ticks[1]!.value - ticks[0]!.value;
      const dx = ticks[1]!.x - ticks[0]!.x;
      for (let i = 1; i < ticks.length; i += 1) {
        expect(ticks[i]!.value - ticks[i - 1]!.value).toBeCloseTo(dv, 9);
        expect(Math.abs(ticks[i]!.x - ticks[i - 1]!.x - dx)).toBeLessThanOrEqual(0.02);
      }
      // The nominal marker's position, read through the ticks, is the nominal value within a pixel's worth.
      const nominalX = Number(await svg.locator('[data-marker="nominal"] line').getAttribute('x1'));
      const readValue = ticks[0]!.value + ((nominalX - ticks[0]!.x) / dx) * dv;
      expect(Math.abs(readValue - output.nominal), name).toBeLessThanOrEqual(Math.abs(dv / dx) * 1.01);
      // Count axis: a bar's top, read through the count ticks, is its count within a pixel's worth.
      const counts = await svg.locator('g.tick.y').evaluateAll((nodes) =>
        nodes.map((n) => ({ count: Number(n.getAttribute('data-count')), label: n.querySelector('text')!.textContent ?? '', y: Number(n.querySelector('line')!.getAttribute('y1')) })),
      );
      expect(counts[0]!.count).toBe(0);
      expect(counts.map((c) => Number(c.label.replace(/,/g, '')))).toEqual(counts.map((c) => c.count));
      const top = counts[counts.length - 1]!;
      const perPixel = top.count / (counts[0]!.y - top.y);
      const bars = await svg.locator('rect.bin').evaluateAll((nodes) => nodes.map((n) => ({ count: Number(n.getAttribute('data-count')), y: Number(n.getAttribute('y')), title: n.querySelector('title')!.textContent ?? '' })));
      for (const bar of bars) {
        expect(Math.abs((counts[0]!.y - bar.y) * perPixel - bar.count), `${name} bar`).toBeLessThanOrEqual(perPixel * 1.01);
        expect(bar.title).toMatch(bar.count === 1 ? /: 1 trial$/ : /: [0-9,]+ trials$/);
      }
      expect(await svg.locator('text.axis-title.y').textContent()).toBe('trials per bar');
    }
  });

  it('the grades table fits the text column, and each row names the grade its trial count belongs to', async () => {
    const column = await page.evaluate(() => {
      const body = (globalThis as unknown as { document: { body: Graphic & { clientWidth: number } } }).document.body;
      const box = body.getBoundingClientRect();
      return { left: box.left, right: box.left + box.width };
    });
    const table = (await page.locator('#grades table').boundingBox())!;
    expect(table.x + table.width).toBeLessThanOrEqual(column.right + 0.5);
    const lastCells = await page.locator('#grades tbody tr td:last-child').allTextContents();
    expect(lastCells).toEqual(graded.rows.map((r) => `${r.result.trials.toLocaleString('en-US')} at ${r.grade.name}`));
  });

  it('prints to A4 and Letter: nothing wider than the page, no chart cut across pages, a sensible page count', async () => {
    const charts = await page.locator('svg[role="img"]').evaluateAll((nodes) => nodes.map((n) => n.getAttribute('aria-label') ?? ''));
    await page.emulateMedia({ media: 'print' });
    try {
      for (const paper of [{ format: 'A4', widthMm: 210, heightMm: 297 }, { format: 'Letter', widthMm: 215.9, heightMm: 279.4 }] as const) {
        // The print layout width: the paper less the 14 mm margins of the report's @page rule, at 96 CSS px per inch.
        const mm = 96 / 25.4;
        const width = Math.floor((paper.widthMm - 28) * mm);
        const height = Math.floor((paper.heightMm - 28) * mm);
        await page.setViewportSize({ width, height: 900 });
        const layout = await page.evaluate(() => {
          const doc = (globalThis as unknown as { document: { documentElement: { scrollWidth: number; scrollHeight: number }; querySelectorAll(s: string): ArrayLike<Graphic> } }).document;
          const rights = Array.from(doc.querySelectorAll('svg, table')).map((e) => { const b = e.getBoundingClientRect(); return b.left + b.width; });
          return { scrollWidth: doc.documentElement.scrollWidth, scrollHeight: doc.documentElement.scrollHeight, widest: Math.max(...rights) };
        });
        expect(layout.scrollWidth, paper.format).toBeLessThanOrEqual(width);
        expect(layout.widest, paper.format).toBeLessThanOrEqual(width + 0.5);
        const pdf = await page.pdf({ format: paper.format, tagged: true });
        const pages = pdfPageCount(pdf);
        // At least the flowing length over one page's height; each chart or table kept whole can push at most one
        // page's worth of blank space, so the count stays well under one page per chart on top of that.
        expect(pages, paper.format).toBeGreaterThanOrEqual(Math.ceil(layout.scrollHeight / height));
        expect(pages, paper.format).toBeLessThanOrEqual(Math.ceil(layout.scrollHeight / height) + Math.ceil(charts.length / 2));
        const figures = pdfFigures(pdf);
        expect(figures.map((f) => f.alt).sort(), paper.format).toEqual([...charts].sort());
        for (const f of figures) expect(f.pages, `${paper.format}: ${f.alt}`).toHaveLength(1);
        if (paper.format === 'A4') writeFileSync(join(tmpdir(), 'trimfree-report-a4.pdf'), pdf);
      }
    } finally {
      await page.emulateMedia({ media: 'screen' });
      await page.setViewportSize({ width: 1200, height: 900 });
    }
  });
});
