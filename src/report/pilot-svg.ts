// One measured output over its prediction as inline SVG: the predicted Monte Carlo histogram (bars), each measured
// unit as a dot in a strip below it, the spec limits, the predicted and measured means (the measured mean with its
// 95 % interval as a band) and, when a swap is suggested, the mean expected after it. Stable hooks for tests:
// bars `rect.bin[data-bin][data-count]`, units `circle.unit[data-unit][data-value]` (class out-of-spec outside the window), markers `[data-marker=…]` with
// `data-value` ("spec-low", "spec-high", "predicted-mean", "measured-mean", "recentred-mean").
import type { PilotOutput } from '../pilot/study.js';
import { displayBins } from './display-bins.js';
import { formatEngineering } from '../units/index.js';
import { coordinate, escapeHtml, exact } from './html-escape.js';
import { pilotDigits } from './pilot-figures.js';

const WIDTH = 720;
const HEIGHT = 300;
const LEFT = 16;
const RIGHT = 16;
const TOP = 30;
const HIST_HEIGHT = 150;
const STRIP_TOP = TOP + HIST_HEIGHT + 14;
const STRIP_HEIGHT = 50;
const MAX_BINS = 60;

export function renderPilotSvg(out: PilotOutput): string {
  const d = pilotDigits(out);
  const label = (v: number): string => escapeHtml(formatEngineering(v, out.unit, d));
  const m = out.tests.measured;
  const bins = displayBins(out.predicted.histogram, MAX_BINS).filter((b) => b.count > 0);
  const marks = [m.min, m.max, out.predicted.interval95.low, out.predicted.interval95.high, ...(out.spec ?? []), ...(out.recentre ? [out.recentre.expectedMean] : [])];
  let lo = Math.min(...marks, ...bins.map((b) => b.low));
  let hi = Math.max(...marks, ...bins.map((b) => b.high));
  if (!(hi > lo)) {
    lo -= Math.abs(lo) * 1e-6 || 1e-12;
    hi += Math.abs(hi) * 1e-6 || 1e-12;
  }
  const pad = (hi - lo) * 0.03;
  lo -= pad;
  hi += pad;
  const plotW = WIDTH - LEFT - RIGHT;
  const x = (v: number): number => LEFT + ((v - lo) / (hi - lo)) * plotW;
  const peak = Math.max(1, ...bins.map((b) => b.count));
  const parts: string[] = [];
  const title = `${out.name}: ${m.n} measured units over the predicted distribution`;
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" class="pilot" data-output="${escapeHtml(out.name)}" viewBox="0 0 ${WIDTH} ${HEIGHT}" width="${WIDTH}" height="${HEIGHT}" role="img" aria-label="${escapeHtml(title)}">`);
  parts.push(`<title>${escapeHtml(title)}</title>`);
  parts.push(`<rect class="interval-band" data-marker="measured-mean-interval" x="${coordinate(x(m.meanInterval.low))}" y="${TOP}" width="${coordinate(Math.max(0.5, x(m.meanInterval.high) - x(m.meanInterval.low)))}" height="${STRIP_TOP + STRIP_HEIGHT - TOP}"/>`);
  bins.forEach((b, i) => {
    const h = (b.count / peak) * HIST_HEIGHT;
    parts.push(`<rect class="bin predicted" data-bin="${i}" data-low="${exact(b.low)}" data-high="${exact(b.high)}" data-count="${b.count}" x="${coordinate(x(b.low))}" y="${coordinate(TOP + HIST_HEIGHT - h)}" width="${coordinate(Math.max(0.5, x(b.high) - x(b.low) - 0.5))}" height="${coordinate(h)}"><title>predicted ${label(b.low)} … ${label(b.high)}: ${b.count.toLocaleString('en-US')} trials</title></rect>`);
  });
  parts.push(`<line class="axis" x1="${LEFT}" y1="${TOP + HIST_HEIGHT}" x2="${WIDTH - RIGHT}" y2="${TOP + HIST_HEIGHT}"/>`);
  // Units: dots in a strip, stacked where they would overlap.
  const rows: number[][] = [];
  out.values.forEach((value, i) => {
    const px = x(value);
    let row = rows.findIndex((r) => r.every((other) => Math.abs(other - px) >= 7));
    if (row < 0) {
      rows.push([]);
      row = rows.length - 1;
    }
    rows[row]!.push(px);
    const y = STRIP_TOP + STRIP_HEIGHT - 6 - (row % 6) * 7;
    const outlier = out.outlierUnit === out.unitIds[i];
    const outside = out.spec !== undefined && (value < out.spec[0] || value > out.spec[1]);
    parts.push(`<circle class="unit${outlier ? ' outlier' : ''}${outside ? ' out-of-spec' : ''}" data-unit="${escapeHtml(out.unitIds[i]!)}" data-value="${exact(value)}" cx="${coordinate(px)}" cy="${coordinate(y)}" r="3"><title>${escapeHtml(out.unitIds[i]!)}: ${label(value)}</title></circle>`);
  });
  const vertical = (marker: string, value: number, cls: string, text: string, row: number): void => {
    const px = coordinate(x(value));
    parts.push(`<g class="marker ${cls}" data-marker="${marker}" data-value="${exact(value)}"><line x1="${px}" y1="${TOP - 4}" x2="${px}" y2="${STRIP_TOP + STRIP_HEIGHT}"/><text x="${px}" y="${STRIP_TOP + STRIP_HEIGHT + 14 + row * 13}" text-anchor="middle">${text}</text></g>`);
  };
  if (out.spec) {
    vertical('spec-low', out.spec[0], 'spec', `spec ${label(out.spec[0])}`, 1);
    vertical('spec-high', out.spec[1], 'spec', `spec ${label(out.spec[1])}`, 1);
  }
  vertical('predicted-mean', out.predicted.mean, 'nominal', 'predicted', 0);
  vertical('measured-mean', m.mean, 'measured', 'measured', 0);
  if (out.recentre?.improves) vertical('recentred-mean', out.recentre.expectedMean, 'recentred', `after ${escapeHtml(out.recentre.designator)} swap`, 2);
  parts.push(`<text x="${LEFT}" y="${TOP - 12}">bars: predicted (${out.predicted.histogram.counts.reduce((a, b) => a + b, 0).toLocaleString('en-US')} trials); dots: measured units (red: outside the window); band: 95 % interval of the measured mean</text>`);
  parts.push('</svg>');
  return parts.join('\n');
}
