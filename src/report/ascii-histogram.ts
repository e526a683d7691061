// A text histogram for the terminal: one row per display bin, bars of '#' inside the spec window and 'x' outside,
// with a marker line where each spec limit falls. Plain ASCII so it survives any terminal or log file.
import type { OutputResult } from '../analysis/result.js';
import { displayBins } from './display-bins.js';
import { formatValue, outputDigits } from './format-value.js';

export interface AsciiHistogramOptions {
  rows?: number;
  barWidth?: number;
}

export function renderAsciiHistogram(output: OutputResult, options: AsciiHistogramOptions = {}): string {
  const bins = displayBins(output.histogram, options.rows ?? 16);
  const barWidth = options.barWidth ?? 44;
  const digits = outputDigits(output);
  const peak = Math.max(1, ...bins.map((b) => b.count));
  const labels = bins.map((b) => formatValue(b.low, output.unit, digits));
  const labelWidth = Math.max(...labels.map((l) => l.length));
  const lines: string[] = [];
  const spec = output.spec;
  const markerLine = (which: string, value: number): string =>
    `${' '.repeat(labelWidth)} ${'-'.repeat(8)} spec ${which} ${formatValue(value, output.unit, digits)} ${'-'.repeat(8)}`;
  const pending = spec ? [{ which: 'low', value: spec[0] }, { which: 'high', value: spec[1] }] : [];
  const emitMarkersBelow = (limit: number): void => {
    while (pending.length > 0 && pending[0].value <= limit) {
      const marker = pending.shift()!;
      lines.push(markerLine(marker.which, marker.value));
    }
  };
  bins.forEach((bin, i) => {
    emitMarkersBelow(bin.low);
    const length = bin.count === 0 ? 0 : Math.max(1, Math.round((bin.count / peak) * barWidth));
    const middle = (bin.low + bin.high) / 2;
    const inside = !spec || (middle >= spec[0] && middle <= spec[1]);
    const bar = (inside ? '#' : 'x').repeat(length);
    lines.push(`${labels[i].padStart(labelWidth)} |${bar.padEnd(barWidth)} ${bin.count.toLocaleString('en-US')}`);
  });
  emitMarkersBelow(Infinity);
  const scale = `${' '.repeat(labelWidth)}  each row: trials with a value from its label up to the next row's; '#' inside the spec window, 'x' outside`;
  return [...lines, scale].join('\n');
}
