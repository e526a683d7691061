// An output's Monte Carlo histogram as inline SVG, with the spec limits, the 95 % coverage interval, the worst-case
// range and the nominal value marked. Every element a test or a reader may look for has a stable class and data
// attributes: bars `rect.bin[data-bin][data-count]`, markers `[data-marker="spec-low" | "spec-high" |
// "interval95-low" | "interval95-high" | "worst-min" | "worst-max" | "nominal"]` with `data-value` (exact number),
// axis ticks `g.tick.x[data-value]` (the output's value, labelled with its unit) and `g.tick.y[data-count]` (trials
// per bar).
import type { OutputResult } from '../analysis/result.js';
import { formatEngineering } from '../units/index.js';
import { axisTicks } from './axis-ticks.js';
import { displayBins } from './display-bins.js';
import { formatValue, outputDigits } from './format-value.js';
import { coordinate, escapeHtml, exact } from './html-escape.js';

export const HISTOGRAM_MAX_BINS = 60;

const WIDTH = 720;
const HEIGHT = 340;
const LEFT = 72; // room for the count ticks and the vertical axis title
const RIGHT = 24;
const TOP = 46; // room for the worst-case bracket and the interval band's label
const BOTTOM = 70; // tick labels, then two rows of marker labels
/** Marker label rows start below the tick labels. */
const MARKER_ROW0 = 32;
/** A spec limit further than this many spans of the spread beyond it is drawn off-scale at the axis end. */
const OFF_SCALE_REACH = 1;

export function renderSvgHistogram(output: OutputResult): string {
  const bins = displayBins(output.histogram, HISTOGRAM_MAX_BINS);
  const digits = outputDigits(output);
  const label = (v: number): string => escapeHtml(formatValue(v, output.unit, digits));
  // The axis spans the histogram, the worst-case range, the 95 % interval and the nominal value; a spec limit far
  // outside that (a 1 W rating for a 0.2 W loss) is drawn at the axis end, marked off-scale, so the spread stays
  // readable.
  const marks = [output.worstCase.min, output.worstCase.max, output.interval95.low, output.interval95.high, output.nominal];
  let lo = Math.min(bins[0].low, ...marks);
  let hi = Math.max(bins[bins.length - 1].high, ...marks);
  const reach = Math.max(hi - lo, Math.abs(hi) * 1e-9);
  if (output.spec) {
    for (const limit of output.spec) {
      if (limit < lo && limit >= lo - OFF_SCALE_REACH * reach) lo = limit;
      if (limit > hi && limit <= hi + OFF_SCALE_REACH * reach) hi = limit;
    }
  }
  if (!(hi > lo)) {
    const pad = Math.abs(lo) * 1e-6 || 1e-12;
    lo -= pad;
    hi += pad;
  }
  const pad = (hi - lo) * 0.03;
  lo -= pad;
  hi += pad;
  const plotW = WIDTH - LEFT - RIGHT;
  const plotH = HEIGHT - TOP - BOTTOM;
  const x = (v: number): number => LEFT + ((Math.min(hi, Math.max(lo, v)) - lo) / (hi - lo)) * plotW;
  const peak = Math.max(1, ...bins.map((b) => b.count));
  const y = (count: number): number => TOP + plotH - (count / peak) * plotH;
  const parts: string[] = [];
  const title = `${output.name}: Monte Carlo histogram`;
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" class="histogram" data-output="${escapeHtml(output.name)}" data-bins="${bins.length}" viewBox="0 0 ${WIDTH} ${HEIGHT}" width="${WIDTH}" height="${HEIGHT}" role="img" aria-label="${escapeHtml(title)}">`,
  );
  parts.push(`<title>${escapeHtml(title)}</title>`);
  // 95 % coverage interval: a light band behind the bars.
  parts.push(
    `<rect class="interval-band" data-marker="interval95" x="${coordinate(x(output.interval95.low))}" y="${TOP}" width="${coordinate(Math.max(0.5, x(output.interval95.high) - x(output.interval95.low)))}" height="${plotH}"/>`,
  );
  bins.forEach((bin, i) => {
    const middle = (bin.low + bin.high) / 2;
    const inside = !output.spec || (middle >= output.spec[0] && middle <= output.spec[1]);
    const x0 = x(bin.low);
    const w = Math.max(0.5, x(bin.high) - x0 - 0.5);
    parts.push(
      `<rect class="bin ${inside ? 'in-spec' : 'out-of-spec'}" data-bin="${i}" data-low="${exact(bin.low)}" data-high="${exact(bin.high)}" data-count="${bin.count}" x="${coordinate(x0)}" y="${coordinate(y(bin.count))}" width="${coordinate(w)}" height="${coordinate(TOP + plotH - y(bin.count))}"><title>${label(bin.low)} … ${label(bin.high)}: ${trialsText(bin.count)}</title></rect>`,
    );
  });
  // Axes: the output's value along the bottom (ticks labelled with the unit), trials per bar up the left side.
  parts.push(`<line class="axis" x1="${LEFT}" y1="${TOP + plotH}" x2="${WIDTH - RIGHT}" y2="${TOP + plotH}"/>`);
  parts.push(`<line class="axis" x1="${LEFT}" y1="${TOP}" x2="${LEFT}" y2="${TOP + plotH}"/>`);
  const xTicks = axisTicks(lo, hi, 6);
  for (const v of xTicks.values) {
    const px = coordinate(x(v));
    parts.push(
      `<g class="tick x" data-value="${exact(v)}"><line x1="${px}" y1="${TOP + plotH}" x2="${px}" y2="${TOP + plotH + 5}"/><text x="${px}" y="${TOP + plotH + 17}" text-anchor="middle">${escapeHtml(formatEngineering(v, output.unit, xTicks.digits))}</text></g>`,
    );
  }
  for (const c of countTicks(peak)) {
    const py = coordinate(y(c));
    parts.push(
      `<g class="tick y" data-count="${c}"><line x1="${LEFT - 5}" y1="${py}" x2="${LEFT}" y2="${py}"/><text x="${LEFT - 8}" y="${coordinate(y(c) + 4)}" text-anchor="end">${c.toLocaleString('en-US')}</text></g>`,
    );
  }
  parts.push(
    `<text class="axis-title y" x="14" y="${coordinate(TOP + plotH / 2)}" text-anchor="middle" transform="rotate(-90 14 ${coordinate(TOP + plotH / 2)})">trials per bar</text>`,
  );
  const vertical = (marker: string, value: number, cls: string, text: string, row: number): void => {
    const px = coordinate(x(value));
    const offScale = value < lo || value > hi;
    const shown = offScale ? `${value < lo ? '← ' : ''}${text} (off scale)${value > hi ? ' →' : ''}` : text;
    const anchor = offScale ? (value < lo ? 'start' : 'end') : 'middle';
    parts.push(
      `<g class="marker ${cls}${offScale ? ' off-scale' : ''}" data-marker="${marker}" data-value="${exact(value)}"${offScale ? ' data-off-scale="true"' : ''}><line x1="${px}" y1="${TOP - 4}" x2="${px}" y2="${TOP + plotH}"/><text x="${px}" y="${TOP + plotH + MARKER_ROW0 + row * 14}" text-anchor="${anchor}">${shown}</text></g>`,
    );
  };
  if (output.spec) {
    vertical('spec-low', output.spec[0], 'spec', `spec ${label(output.spec[0])}`, 1);
    vertical('spec-high', output.spec[1], 'spec', `spec ${label(output.spec[1])}`, 1);
  }
  vertical('interval95-low', output.interval95.low, 'interval', '', 0);
  vertical('interval95-high', output.interval95.high, 'interval', '', 0);
  vertical('nominal', output.nominal, 'nominal', `nominal ${label(output.nominal)}`, 0);
  // Worst case: a bracket above the plot from min to max.
  const wy = 18;
  const x1 = coordinate(x(output.worstCase.min));
  const x2 = coordinate(x(output.worstCase.max));
  parts.push(
    `<g class="marker worst" data-marker="worst-min" data-value="${exact(output.worstCase.min)}"><line x1="${x1}" y1="${wy - 6}" x2="${x1}" y2="${TOP + plotH}"/></g>`,
    `<g class="marker worst" data-marker="worst-max" data-value="${exact(output.worstCase.max)}"><line x1="${x2}" y1="${wy - 6}" x2="${x2}" y2="${TOP + plotH}"/></g>`,
    `<line class="worst-bracket" x1="${x1}" y1="${wy}" x2="${x2}" y2="${wy}"/>`,
    `<text class="worst-label" x="${coordinate((x(output.worstCase.min) + x(output.worstCase.max)) / 2)}" y="${wy - 4}" text-anchor="middle">worst case ${label(output.worstCase.min)} … ${label(output.worstCase.max)}</text>`,
    `<text class="interval-label" x="${coordinate((x(output.interval95.low) + x(output.interval95.high)) / 2)}" y="${TOP - 8}" text-anchor="middle">95 % interval</text>`,
  );
  parts.push('</svg>');
  return parts.join('\n');
}

/** "1 trial", "2,500 trials". */
export function trialsText(count: number): string {
  return `${count.toLocaleString('en-US')} ${count === 1 ? 'trial' : 'trials'}`;
}

/** Whole-number ticks from 0 up to the tallest bar's count. */
function countTicks(peak: number): number[] {
  const ticks = axisTicks(0, peak, 4);
  const step = Math.max(1, ticks.step);
  const out: number[] = [];
  for (let c = 0; c <= peak; c += step) out.push(c);
  return out;
}
