// A text histogram for the terminal: one row per display bin, bars of '#' inside the spec window and 'x' outside,
// with a marker line where each spec limit falls. Plain ASCII so it survives any terminal or log file.
import type { Histogram, OutputResult } from '../analysis/result.js';
import { displayBins, type DisplayBin } from './display-bins.js';
import { formatValue, outputDigits } from './format-value.js';

export interface AsciiHistogramOptions {
  rows?: number;
  barWidth?: number;
}

/**
 * Splits the row that straddles a window limit into the part below and the part above it. The counts come from the
 * exact numbers of values below the low end and above the high end (Histogram.belowSpec/aboveSpec), so every '#'
 * is a value inside the window and every 'x' one outside.
 */
function splitAtLimits(bins: DisplayBin[], histogram: Histogram, spec: [number, number] | undefined): Array<DisplayBin & { inside: boolean }> {
  if (!spec || histogram.belowSpec === undefined || histogram.aboveSpec === undefined) {
    return bins.map((b) => ({ ...b, inside: !spec || ((b.low + b.high) / 2 >= spec[0] && (b.low + b.high) / 2 <= spec[1]) }));
  }
  const [lo, hi] = spec;
  const belowRows = bins.filter((b) => b.high <= lo).reduce((sum, b) => sum + b.count, 0);
  const aboveRows = bins.filter((b) => b.low > hi).reduce((sum, b) => sum + b.count, 0);
  const rows: Array<DisplayBin & { inside: boolean }> = [];
  for (const b of bins) {
    if (b.high <= lo || b.low > hi) rows.push({ ...b, inside: false });
    else {
      let start = b.low;
      let count = b.count;
      if (b.low < lo) {
        const out = Math.max(0, Math.min(count, histogram.belowSpec - belowRows));
        rows.push({ low: b.low, high: lo, count: out, inside: false });
        start = lo;
        count -= out;
      }
      if (b.high > hi) {
        const out = Math.max(0, Math.min(count, histogram.aboveSpec - aboveRows));
        rows.push({ low: start, high: hi, count: count - out, inside: true });
        rows.push({ low: hi, high: b.high, count: out, inside: false });
      } else rows.push({ low: start, high: b.high, count, inside: true });
    }
  }
  return rows;
}

export function renderAsciiHistogram(output: OutputResult, options: AsciiHistogramOptions = {}): string {
  const spec = output.spec;
  const bins = splitAtLimits(displayBins(output.histogram, options.rows ?? 16), output.histogram, spec);
  const barWidth = options.barWidth ?? 44;
  const digits = outputDigits(output);
  const peak = Math.max(1, ...bins.map((b) => b.count));
  const labels = bins.map((b) => formatValue(b.low, output.unit, digits));
  const labelWidth = Math.max(...labels.map((l) => l.length));
  const lines: string[] = [];
  const markerLine = (which: string, value: number): string =>
    `${' '.repeat(labelWidth)} ${'-'.repeat(8)} spec ${which} ${formatValue(value, output.unit, digits)} ${'-'.repeat(8)}`;
  const pending = spec ? [{ which: 'low', value: spec[0] }, { which: 'high', value: spec[1] }] : [];
  const emitMarkersBelow = (limit: number): void => {
    while (pending.length > 0 && pending[0]!.value <= limit) {
      const marker = pending.shift()!;
      lines.push(markerLine(marker.which, marker.value));
    }
  };
  bins.forEach((bin, i) => {
    emitMarkersBelow(bin.low);
    const length = bin.count === 0 ? 0 : Math.max(1, Math.round((bin.count / peak) * barWidth));
    const bar = (bin.inside ? '#' : 'x').repeat(length);
    lines.push(`${labels[i]!.padStart(labelWidth)} |${bar.padEnd(barWidth)} ${bin.count.toLocaleString('en-US')}`);
  });
  emitMarkersBelow(Infinity);
  const scale =
    `${' '.repeat(labelWidth)}  each row: trials with a value from its label up to the next row's, each unit at the ambient drawn with it;\n` +
    `${' '.repeat(labelWidth)}  '#' inside the spec window, 'x' outside (a row that crosses a limit is split there)`;
  return [...lines, scale].join('\n');
}
