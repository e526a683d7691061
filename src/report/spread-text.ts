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
import { formatShareWithError, varianceBudgetLines } from './variance-budget-lines.js';
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
  /** Only these outputs (default: all), e.g. the pot's bottom end, where the current-limit outputs do not change. */
  outputs?: string[];
  /** Said after each output's title, e.g. 'pot at the top of its travel'. */
  where?: string;
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
  const median = output.percentiles.find((p) => p.pct === 50)?.value;
  let rows: FigureRow[] = [
    { field: 'nominal', label: 'nominal (every part at its nominal value)', text: v(output.nominal), values: [output.nominal] },
    { field: 'spec', label: 'spec window', text: output.spec ? `${v(output.spec[0])} … ${v(output.spec[1])}` : MISSING, values: output.spec ? [...output.spec] : [] },
    { field: 'mean', label: 'Monte Carlo mean', text: v(output.mean), values: [output.mean] },
    ...(median === undefined ? [] : [{ field: 'median', label: 'Monte Carlo median', text: v(median), values: [median] }]),
    { field: 'sigma', label: 'Monte Carlo σ', text: formatSpread(output.sigma, u), values: [output.sigma] },
    { field: 'interval95', label: '95 % coverage interval', text: `${v(output.interval95.low)} … ${v(output.interval95.high)}`, values: [output.interval95.low, output.interval95.high] },
    { field: 'interval9973', label: '99.73 % coverage interval', text: `${v(output.interval9973.low)} … ${v(output.interval9973.high)}`, values: [output.interval9973.low, output.interval9973.high] },
    { field: 'shortest95', label: 'shortest 95 % interval', text: `${v(output.shortest95.low)} … ${v(output.shortest95.high)}`, values: [output.shortest95.low, output.shortest95.high] },
    { field: 'worstCase', label: `worst case (${output.worstCase.method})`, text: `${v(output.worstCase.min)} … ${v(output.worstCase.max)}`, values: [output.worstCase.min, output.worstCase.max] },
    {
      field: 'rss',
      label: 'RSS, first order (JCGM 100 5.1.2): u(y), U = k·u(y)',
      text: `u ${formatSpread(output.rss.sigma, u)}, U ${formatSpread(output.rss.expandedUncertainty, u)} (k = ${output.rss.coverageFactor})`,
      values: [output.rss.sigma, output.rss.expandedUncertainty, output.rss.coverageFactor],
    },
    {
      field: 'yieldPct',
      label: 'yield per unit: inside the window at every ambient checked (95 % Wilson interval)',
      text: output.yield ? `${formatYieldPct(output.yield.pct)} (${formatYieldPct(output.yield.low)} … ${formatYieldPct(output.yield.high)})` : MISSING,
      values: output.yield ? [output.yield.pct, output.yield.low, output.yield.high] : [],
    },
    {
      field: 'yieldAtRandomAmbientPct',
      label: 'yield at a random ambient: a unit at the ambient drawn with it (95 % Wilson interval)',
      text: output.yieldAtRandomAmbient
        ? `${formatYieldPct(output.yieldAtRandomAmbient.pct)} (${formatYieldPct(output.yieldAtRandomAmbient.low)} … ${formatYieldPct(output.yieldAtRandomAmbient.high)})`
        : MISSING,
      values: output.yieldAtRandomAmbient ? [output.yieldAtRandomAmbient.pct, output.yieldAtRandomAmbient.low, output.yieldAtRandomAmbient.high] : [],
    },
    { field: 'ppmOut', label: 'units out of the window at some ambient, ppm', text: formatPpm(output.ppmOut), values: output.ppmOut !== undefined && Number.isFinite(output.ppmOut) ? [output.ppmOut] : [] },
    { field: 'cp', label: `Cp ${capabilityWhere(output)}`, text: formatIndex(output.cp), values: output.cp !== undefined && Number.isFinite(output.cp) ? [output.cp] : [] },
    { field: 'cpk', label: `Cpk ${capabilityWhere(output)}`, text: formatIndex(output.cpk), values: output.cpk !== undefined && Number.isFinite(output.cpk) ? [output.cpk] : [] },
  ];
  // Yield and capability exist only against a window the design gave; Cp only with both of its limits.
  const windowFields = ['yieldPct', 'yieldAtRandomAmbientPct', 'ppmOut', 'cp', 'cpk'];
  if (!output.spec) rows = rows.filter((r) => !windowFields.includes(r.field));
  else if (output.capabilitySides) rows = rows.filter((r) => r.field !== 'cp');
  if (output.quantileMethod === 'histogram') {
    rows.push({ field: 'quantileBound', label: 'quantiles and intervals read from the histogram: each end within ±', text: formatSpread(output.quantileBound, u), values: [output.quantileBound] });
  }
  if (output.numericalTolerance !== undefined) {
    rows.push({ field: 'numericalTolerance', label: 'adaptive stop: numerical tolerance δ of σ reached (JCGM 101:2008 7.9.2)', text: formatSpread(output.numericalTolerance, u), values: [output.numericalTolerance] });
  }
  return rows;
}

/** Which distribution Cp and Cpk describe, and against which limits. */
function capabilityWhere(output: OutputResult): string {
  const sides = output.capabilitySides === 'low' ? 'one-sided Cpl: only the low limit is the design’s; ' : output.capabilitySides === 'high' ? 'one-sided Cpu: only the high limit is the design’s; ' : '';
  if (output.capabilityAmbientC === undefined) return `(${sides}all trials; assumes normality)`;
  return `(${sides}units at ${formatAmbient(output.capabilityAmbientC)}, the worst ambient; assumes normality)`;
}

/** An ambient temperature for a label: '25 °C', '-7.5 °C'. */
export function formatAmbient(t: number): string {
  return `${Number(t.toFixed(2))} °C`;
}

/** The units over the range: nominal, Monte Carlo 0.135 … 99.865 % band and worst case at the coldest, 25 °C and hottest ambients. */
export function ambientSweepTable(output: OutputResult): string | null {
  const sweep = output.ambientSweep;
  if (!sweep || sweep.length < 2) return null;
  const d = outputDigits(output);
  const v = (x: number | undefined): string => (x === undefined ? MISSING : formatValue(x, output.unit, d));
  const shown = sweep.filter((p, i) => i === 0 || i === sweep.length - 1 || p.ambientC === 25);
  const rows = shown.map((p) => [
    formatAmbient(p.ambientC),
    v(p.nominal),
    `${v(p.band9973.low)} … ${v(p.band9973.high)}`,
    p.worstCase ? `${v(p.worstCase.low)} … ${v(p.worstCase.high)}` : MISSING,
    p.yield ? formatYieldPct(p.yield.pct) : MISSING,
  ]);
  return textTable(['ambient', 'nominal', 'Monte Carlo 0.135 … 99.865 %', 'worst case', 'in window'], rows, [true, true, true, true, true]);
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
  return textTable(['output', 'nominal', 'mean', 'σ', 'worst case', 'yield per unit', 'Cpk', 'spec window', `yield ≥ ${targetYieldPct} %`], rows, [false, true, true, true, true, true, true, true, false]);
}

/** The all-specs yield and what a unit was checked at, under the summary. */
function unitYieldLines(result: AnalysisResult): string[] {
  const lines: string[] = [];
  const grid = result.ambientGridC;
  if (grid) lines.push(`each unit checked at ${grid.length === 1 ? formatAmbient(grid[0]!) : `${grid.length} ambients, ${grid.map(formatAmbient).join(', ')}`}; yield = share of units inside the window at every one`);
  const all = result.allSpecs;
  if (all) {
    lines.push(
      `all specs (${all.outputs.join(', ')}): ${formatYieldPct(all.pct)} of units meet every window at every ambient (95 % Wilson interval ${formatYieldPct(all.low)} … ${formatYieldPct(all.high)})`,
    );
  }
  return lines;
}

/** A sensitivity coefficient: plain digits between 0.01 and 1000, exponent notation outside. */
function formatCoefficient(value: number): string {
  if (!Number.isFinite(value)) return MISSING;
  const size = Math.abs(value);
  return size !== 0 && (size < 0.01 || size >= 1000) ? value.toExponential(2) : value.toPrecision(3);
}

function contributorsTable(output: OutputResult, count: number): string {
  const rows = output.contributions
    .slice(0, count)
    .map((c) => [
      c.part,
      formatShareWithError(c.totalEffectShare, c.totalEffectStandardError),
      formatShareWithError(c.firstOrderShare, c.firstOrderStandardError),
      formatShare(c.varianceShare),
      formatCoefficient(c.sensitivity),
    ]);
  return textTable(
    ['part', 'total-effect share ± std. error', 'first-order share ± std. error', 'first-order (RSS) share', `sensitivity at nominal (${output.unit || '1'} per part unit)`],
    rows,
    [false, true, true, true, true],
  );
}

export function renderSpreadText(result: AnalysisResult, options: SpreadTextOptions): string {
  const out: string[] = [];
  out.push(`${options.subject}: Monte Carlo ${result.trials.toLocaleString('en-US')} trials, seed ${JSON.stringify(result.seed)}; trimfree ${options.version}`);
  out.push('');
  const shown = Object.values(result.outputs).filter((o) => !options.outputs || options.outputs.includes(o.name));
  out.push(summaryTable({ ...result, outputs: Object.fromEntries(shown.map((o) => [o.name, o])) }, options.targetYieldPct ?? DEFAULT_VERDICT_YIELD_PCT, options.colour ?? false));
  out.push(...unitYieldLines(result));
  for (const output of shown) {
    out.push('');
    out.push(`== ${outputTitle(output.name)}${options.where ? `, ${options.where}` : ''} ==`);
    out.push(textTable(['figure', 'value'], outputFigures(output).map((r) => [r.label, r.text]), [false, true]));
    const sweep = ambientSweepTable(output);
    if (sweep) {
      out.push('over the ambient range (units held at each ambient):');
      out.push(sweep);
    }
    if (output.contributions.length > 0) {
      out.push('largest contributors (ranked by total-effect share of the variance):');
      out.push(contributorsTable(output, options.contributors ?? 5));
      for (const line of varianceBudgetLines(output)) out.push(`  ${line}`);
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
