// The HTML report in a real browser: Debian's chromium driven by playwright-core (CI installs it in .ci/run).
// Checks that the inline SVG charts render with the expected bins and markers, and leaves a screenshot in /tmp.
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { groupingFactor } from '../src/report/display-bins.js';
import { renderHtmlReport } from '../src/report/html-report.js';
import { HISTOGRAM_MAX_BINS } from '../src/report/svg-histogram.js';
import { FIXTURE_PARTS, FIXTURE_RESULT } from './report-fixture.js';

const CHROMIUM = '/usr/bin/chromium';
/** The SVG/DOM geometry used below (the project's TypeScript settings carry no DOM library). */
type Graphic = { getBBox(): { width: number }; getBoundingClientRect(): { left: number; width: number; height: number } };
export const SCREENSHOT = join(tmpdir(), 'trimfree-report.png');

describe('HTML report in headless Chromium', () => {
  let context: BrowserContext | undefined;
  let profile = '';
  let page: Awaited<ReturnType<BrowserContext['newPage']>>;

  beforeAll(async () => {
    if (!existsSync(CHROMIUM)) {
      throw new Error(`${CHROMIUM} is missing: install it with 'apt-get install -y chromium' (.ci/run does this under CI=true)`);
    }
    const folder = mkdtempSync(join(tmpdir(), 'trimfree-browser-'));
    const file = join(folder, 'report.html');
    writeFileSync(
      file,
      renderHtmlReport({ title: 'Spread report', subject: 'fixture.json', version: '0.0.0', result: FIXTURE_RESULT, parts: FIXTURE_PARTS, cautions: ['test caution'] }),
    );
    profile = mkdtempSync(join(tmpdir(), 'trimfree-chromium-profile-'));
    context = await chromium.launchPersistentContext(profile, {
      executablePath: CHROMIUM,
      headless: true,
      viewport: { width: 1200, height: 900 },
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
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
