// The ambient sweep of one output as an SVG chart: against ambient temperature, the worst-case band (light), the
// Monte Carlo 0.135 … 99.865 % band (darker), the nominal (line) and the window's limits (dashed). Plain SVG, no
// script. Hooks for tests: svg.sweep[data-output], path.sweep-worst, path.sweep-mc, polyline.sweep-nominal,
// line.sweep-limit[data-value], g.tick.x[data-value] (°C) and g.tick.y[data-value] (output unit). Reads the
// result's sweep; computes no statistic.
import type { AmbientPoint, OutputResult } from '../analysis/result.js';
import { axisTicks } from './axis-ticks.js';
import { coordinate, escapeHtml, exact } from './html-escape.js';
import { formatEngineering } from '../units/index.js';

const WIDTH = 520;
const HEIGHT = 260;
const LEFT = 86;
const RIGHT = 16;
const TOP = 14;
const BOTTOM = 46;

const c = coordinate;

/** The sweep chart, or '' when the output has fewer than two ambients or no worst case per ambient. */
export function renderSvgAmbientSweep(output: OutputResult): string {
  const sweep = output.ambientSweep;
  if (!sweep || sweep.length < 2 || sweep.some((p) => !p.worstCase || p.nominal === undefined)) return '';
  const points = sweep as Array<AmbientPoint & { worstCase: { low: number; high: number }; nominal: number }>;
  const t0 = points[0]!.ambientC;
  const t1 = points[points.length - 1]!.ambientC;
  let yLow = Math.min(...points.map((p) => p.worstCase.low));
  let yHigh = Math.max(...points.map((p) => p.worstCase.high));
  if (output.spec) {
    yLow = Math.min(yLow, output.spec[0]);
    yHigh = Math.max(yHigh, output.spec[1]);
  }
  const pad = (yHigh - yLow) * 0.06 || Math.abs(yHigh) * 1e-6 || 1e-12;
  yLow -= pad;
  yHigh += pad;
  const plotW = WIDTH - LEFT - RIGHT;
  const plotH = HEIGHT - TOP - BOTTOM;
  const x = (t: number): number => LEFT + ((t - t0) / (t1 - t0)) * plotW;
  const y = (v: number): number => TOP + (1 - (v - yLow) / (yHigh - yLow)) * plotH;
  const band = (lo: (p: (typeof points)[number]) => number, hi: (p: (typeof points)[number]) => number): string =>
    `M${points.map((p) => `${c(x(p.ambientC))},${c(y(hi(p)))}`).join(' L')} L${[...points].reverse().map((p) => `${c(x(p.ambientC))},${c(y(lo(p)))}`).join(' L')} Z`;
  const xTicks = axisTicks(t0, t1, 5);
  const yTicks = axisTicks(yLow, yHigh, 5);
  const parts: string[] = [];
  parts.push(`<path class="sweep-worst" d="${band((p) => p.worstCase.low, (p) => p.worstCase.high)}"><title>worst case with the ambient held</title></path>`);
  parts.push(`<path class="sweep-mc" d="${band((p) => p.band9973.low, (p) => p.band9973.high)}"><title>Monte Carlo 0.135 … 99.865 % of units</title></path>`);
  parts.push(`<polyline class="sweep-nominal" points="${points.map((p) => `${c(x(p.ambientC))},${c(y(p.nominal))}`).join(' ')}"><title>nominal</title></polyline>`);
  if (output.spec) {
    for (const limit of output.spec) {
      parts.push(`<line class="sweep-limit" data-value="${exact(limit)}" x1="${LEFT}" x2="${LEFT + plotW}" y1="${c(y(limit))}" y2="${c(y(limit))}"><title>spec limit ${escapeHtml(formatEngineering(limit, output.unit, 5))}</title></line>`);
    }
  }
  for (const t of xTicks.values) {
    parts.push(`<g class="tick x" data-value="${exact(t)}"><line x1="${c(x(t))}" x2="${c(x(t))}" y1="${TOP + plotH}" y2="${TOP + plotH + 5}"/><text x="${c(x(t))}" y="${TOP + plotH + 17}" text-anchor="middle">${escapeHtml(`${t} °C`)}</text></g>`);
  }
  for (const v of yTicks.values) {
    parts.push(`<g class="tick y" data-value="${exact(v)}"><line x1="${LEFT - 5}" x2="${LEFT}" y1="${c(y(v))}" y2="${c(y(v))}"/><text x="${LEFT - 8}" y="${c(y(v) + 4)}" text-anchor="end">${escapeHtml(formatEngineering(v, output.unit, yTicks.digits))}</text></g>`);
  }
  parts.push(`<line class="axis" x1="${LEFT}" x2="${LEFT + plotW}" y1="${TOP + plotH}" y2="${TOP + plotH}"/><line class="axis" x1="${LEFT}" x2="${LEFT}" y1="${TOP}" y2="${TOP + plotH}"/>`);
  parts.push(`<text class="axis-title" x="${LEFT + plotW / 2}" y="${HEIGHT - 8}" text-anchor="middle">ambient temperature</text>`);
  return `<svg class="sweep" data-output="${escapeHtml(output.name)}" viewBox="0 0 ${WIDTH} ${HEIGHT}" width="${WIDTH}" height="${HEIGHT}" role="img" aria-label="${escapeHtml(`${output.name} against ambient temperature`)}">
${parts.join('\n')}
</svg>`;
}
