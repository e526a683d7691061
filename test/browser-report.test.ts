// The HTML report in a real browser: Chromium driven by playwright-core; Debian's package when installed, else the
// build shipped in the dev dependency @sparticuz/chromium (test/browser-executable.ts; never a download). Checks that the inline SVG charts render with the expected bins and markers, and leaves a screenshot in /tmp.
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
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
import { FIXTURE_PARTS, FIXTURE_RESULT } from './report-fixture.js';
import { BROWSER_ARGS, findChromium } from './browser-executable.js';

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
  it('histograms for both ends of the pot travel, the grade tables, and a screenshot of the whole page', async () => {
    const file = join(PROJECT_ROOT, 'examples', 'bench-adjustable.json');
    const resolved = resolveDesign(loadDesignFile(file));
    const choice = { trials: 20000, seed: 1, workers: 1, progress: false } as const;
    const run = await runSpread(resolved, { ...choice });
    const graded = await runGrades(resolved, { ...choice }, { targetYieldPct: 99, searchTrials: 4000 });
    expect(run.lowEnd).toBeDefined();
    const folder = mkdtempSync(join(tmpdir(), 'trimfree-browser-'));
    const html = join(folder, 'bench.html');
    writeFileSync(
      html,
      renderSpreadRunHtml(run, {
        subject: 'examples/bench-adjustable.json',
        version: VERSION,
        command: 'trimfree design examples/bench-adjustable.json --report bench.html',
        tables: gradesReportTables(graded),
      }),
    );
    const { context, profile } = await launch();
    try {
      const page = await context.newPage();
      await page.goto(`file://${html}`);
      const outputs = Object.keys(run.result.outputs).length + Object.keys(run.lowEnd!.result.outputs).length;
      expect(await page.locator('svg.histogram').count()).toBe(outputs);
      expect(await page.locator('section[id^="lowend-output-"] svg.histogram').count()).toBe(Object.keys(run.lowEnd!.result.outputs).length);
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
    } finally {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    }
  }, 120_000);
});
