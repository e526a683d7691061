// The terminal report of a spread run: a summary of every output, then for each output its figures, its largest
// contributors and a text histogram with the spec limits marked. Renders an AnalysisResult; computes nothing.
import type { AnalysisResult, OutputResult } from '../analysis/result.js';
import { renderAsciiHistogram } from './ascii-histogram.js';
import {
  MISSING,
  formatIndex,
  formatPpm,
  formatShare,
  formatSpread,
  formatValue,
  formatYieldPct,
  outputDigits,
  outputTitle,
} from './format-value.js';
import { groupMethodNotes } from './method-notes.js';
import { textTable } from './text-table.js';
import { outputVerdict, verdictText } from './verdict-word.js';

export interface SpreadTextOptions {
  version: string;
  /** What was analysed (the design file's name), for the heading. */
  subject: string;
  cautions?: string[];
  /** Names of the model's parts, so the per-part method notes can be grouped (see method-notes.ts). */
  partNames?: string[];
  /** Contributors listed per output (default 5). */
  contributors?: number;
  histogram?: boolean;
  /** Yield an output must reach for "pass" in the summary, % (default DEFAULT_VERDICT_YIELD_PCT). */
  targetYieldPct?: number;
  /** Colour the pass/fail words (only for a terminal that takes colour: src/cli/colour.ts). */
  colour?: boolean;
}

/** The summary's pass/fail target when the command names none (the grade search's default target). */
export const DEFAULT_VERDICT_YIELD_PCT = 99.9;

/** One output's figures as label/value pairs, in the order reports show them (shared by text and HTML). */
export interface FigureRow {
  field: string;
  label: string;
  text: string;
  /** The exact numbers behind the text (for the HTML's data attributes and tests). */
  values: number[];
}

export function outputFigures(output: OutputResult): FigureRow[] {
  const d = outputDigits(output);
  const u = output.unit;
  const v = (x: number): string => formatValue(x, u, d);
  const rows: FigureRow[] = [
    { field: 'nominal', label: 'nominal (every part at its nominal value)', text: v(output.nominal), values: [output.nominal] },
    { field: 'spec', label: 'spec window', text: output.spec ? `${v(output.spec[0])} … ${v(output.spec[1])}` : MISSING, values: output.spec ? [...output.spec] : [] },
    { field: 'mean', label: 'Monte Carlo mean', text: v(output.mean), values: [output.mean] },
    { field: 'sigma', label: 'Monte Carlo σ', text: formatSpread(output.sigma, u), values: [output.sigma] },
    { field: 'interval95', label: '95 % coverage interval', text: `${v(output.interval95.low)} … ${v(output.interval95.high)}`, values: [output.interval95.low, output.interval95.high] },
    { field: 'interval9973', label: '99.73 % coverage interval', text: `${v(output.interval9973.low)} … ${v(output.interval9973.high)}`, values: [output.interval9973.low, output.interval9973.high] },
    { field: 'shortest95', label: 'shortest 95 % interval', text: `${v(output.shortest95.low)} … ${v(output.shortest95.high)}`, values: [output.shortest95.low, output.shortest95.high] },
    { field: 'worstCase', label: `worst case (${output.worstCase.method})`, text: `${v(output.worstCase.min)} … ${v(output.worstCase.max)}`, values: [output.worstCase.min, output.worstCase.max] },
    { field: 'rss', label: 'RSS: σ, ± tolerance half-width', text: `σ ${formatSpread(output.rss.sigma, u)}, ± ${formatSpread(output.rss.halfWidth, u)}`, values: [output.rss.sigma, output.rss.halfWidth] },
    {
      field: 'yieldPct',
      label: 'yield (95 % Wilson interval)',
      text: output.yield ? `${formatYieldPct(output.yield.pct)} (${formatYieldPct(output.yield.low)} … ${formatYieldPct(output.yield.high)})` : MISSING,
      values: output.yield ? [output.yield.pct, output.yield.low, output.yield.high] : [],
    },
    { field: 'ppmOut', label: 'out of spec, ppm', text: formatPpm(output.ppmOut), values: output.ppmOut !== undefined && Number.isFinite(output.ppmOut) ? [output.ppmOut] : [] },
    { field: 'cp', label: 'Cp', text: formatIndex(output.cp), values: output.cp !== undefined && Number.isFinite(output.cp) ? [output.cp] : [] },
    { field: 'cpk', label: 'Cpk', text: formatIndex(output.cpk), values: output.cpk !== undefined && Number.isFinite(output.cpk) ? [output.cpk] : [] },
  ];
  return rows;
}

function summaryTable(result: AnalysisResult, targetYieldPct: number, colour: boolean): string {
  const rows = Object.values(result.outputs).map((o) => {
    const d = outputDigits(o);
    return [
      o.name,
      formatValue(o.nominal, o.unit, d),
      formatValue(o.mean, o.unit, d),
      formatSpread(o.sigma, o.unit),
      `${formatValue(o.worstCase.min, o.unit, d)} … ${formatValue(o.worstCase.max, o.unit, d)}`,
      o.yield ? formatYieldPct(o.yield.pct) : MISSING,
      formatIndex(o.cpk),
      o.spec ? `${formatValue(o.spec[0], o.unit, d)} … ${formatValue(o.spec[1], o.unit, d)}` : MISSING,
      verdictText(outputVerdict(o, targetYieldPct), colour),
    ];
  });
  return textTable(['output', 'nominal', 'mean', 'σ', 'worst case', 'yield', 'Cpk', 'spec window', `yield ≥ ${targetYieldPct} %`], rows, [false, true, true, true, true, true, true, true, false]);
}

/** A sensitivity coefficient: plain digits between 0.01 and 1000, exponent notation outside. */
function formatCoefficient(value: number): string {
  if (!Number.isFinite(value)) return MISSING;
  const size = Math.abs(value);
  return size !== 0 && (size < 0.01 || size >= 1000) ? value.toExponential(2) : value.toPrecision(3);
}

function contributorsTable(output: OutputResult, count: number): string {
  const rows = output.contributions.slice(0, count).map((c) => [c.part, formatShare(c.varianceShare), formatCoefficient(c.sensitivity)]);
  return textTable(['part', 'share of variance', `sensitivity (${output.unit || '1'} per part unit)`], rows, [false, true, true]);
}

export function renderSpreadText(result: AnalysisResult, options: SpreadTextOptions): string {
  const out: string[] = [];
  out.push(`${options.subject}: Monte Carlo ${result.trials.toLocaleString('en-US')} trials, seed ${JSON.stringify(result.seed)}; trimfree ${options.version}`);
  out.push('');
  out.push(summaryTable(result, options.targetYieldPct ?? DEFAULT_VERDICT_YIELD_PCT, options.colour ?? false));
  for (const output of Object.values(result.outputs)) {
    out.push('');
    out.push(`== ${outputTitle(output.name)} ==`);
    out.push(textTable(['figure', 'value'], outputFigures(output).map((r) => [r.label, r.text]), [false, true]));
    if (output.contributions.length > 0) {
      out.push('largest contributors:');
      out.push(contributorsTable(output, options.contributors ?? 5));
    }
    if (options.histogram ?? true) {
      out.push('');
      out.push(renderAsciiHistogram(output));
    }
  }
  if (result.notes.length > 0) {
    out.push('');
    out.push('how it was obtained:');
    for (const note of groupMethodNotes(result.notes, options.partNames ? new Set(options.partNames) : null)) out.push(`  - ${note}`);
  }
  if (options.cautions && options.cautions.length > 0) {
    out.push('');
    out.push('caution:');
    for (const caution of options.cautions) out.push(`  ! ${caution}`);
  }
  return `${out.join('\n')}\n`;
}
