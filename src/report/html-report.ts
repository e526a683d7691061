// The review report: ONE self-contained HTML file (inline CSS and SVG, no script, no network) with the inputs and
// BOM tables, each output's figures, histogram and contributors chart, how the numbers were obtained and the
// cautions. Renders an AnalysisResult and the design's plain data; computes nothing.
// Each figure cell carries the exact numbers it shows: `td[data-field][data-value]` (space-separated), so a test
// can check the page against the JSON.
import type { AnalysisResult, OutputResult } from '../analysis/result.js';
import type { Part } from '../tolerance/part.js';
import { describeDistribution } from '../tolerance/sample.js';
import { formatEngineering, formatPercent, formatPpmPerK } from '../units/index.js';
import { escapeHtml, exact, htmlDocumentHead } from './html-escape.js';
import { MISSING, formatIndex, formatSpread, formatValue, formatYieldPct, outputDigits, outputTitle } from './format-value.js';
import { groupMethodNotes } from './method-notes.js';
import { POT_OUTPUTS } from './pot-ends.js';
import { renderVerdictBlock } from './html-verdict.js';
import { renderSvgAmbientSweep } from './svg-ambient-sweep.js';
import { outputFigures } from './spread-text.js';
import { renderSvgContributions } from './svg-contributions.js';
import { varianceBudgetLines } from './variance-budget-lines.js';
import { renderSvgHistogram } from './svg-histogram.js';

/** One BOM line as the report shows it (already formatted by the design layer). */
export interface BomRow {
  designator: string;
  value: string;
  code: string;
  series: string;
  tolerance: string;
  tcr: string;
  power: string;
  note?: string;
}

export interface HtmlReportInput {
  title: string;
  /** What was analysed, e.g. the design file's name. */
  subject: string;
  version: string;
  result: AnalysisResult;
  /** The uncertain quantities the model drew (the Model's parts). */
  parts: Part[];
  bom?: BomRow[];
  cautions?: string[];
  /** Notes from filling in the design (which values were picked and why). */
  designNotes?: string[];
  /** The command line that produced the report (for reproduction). */
  command?: string;
  /** A second analysis of the same design (an adjustable output with the pot at the bottom of its travel). */
  lowEnd?: { title: string; result: AnalysisResult };
  /** Further tables (e.g. the grade comparison), shown after the summary; cells already formatted. */
  tables?: ReportTable[];
  /** When the report was made and the design file's digest, shown at the top with version, seed and trials. */
  provenance?: ReportProvenance;
  /** The yield each output must reach to read "meets" in the verdict block, % (default 99.9). */
  targetYieldPct?: number;
}

export interface ReportProvenance {
  generatedAt: Date;
  /** SHA-256 of the design file's bytes, lowercase hex. */
  designSha256?: string;
}

export interface ReportTable {
  title: string;
  head: string[];
  /** Cells; a line break inside a cell starts a new line on the page. */
  rows: string[][];
  notes?: string[];
  /** Stable id for the section (letters, digits, '-'). */
  id: string;
}

const STYLE = `
body{font:14px/1.45 system-ui,-apple-system,"Segoe UI",sans-serif;margin:24px auto;max-width:1100px;color:#1b1f24;padding:0 16px}
h1{font-size:22px;margin:0 0 4px}h2{font-size:18px;margin:28px 0 8px;border-bottom:1px solid #d0d7de;padding-bottom:4px}
h3{font-size:15px;margin:18px 0 6px}
table{border-collapse:collapse;margin:6px 0 12px}th,td{border:1px solid #d0d7de;padding:3px 8px;text-align:left;vertical-align:top}
th{background:#f3f5f7}td.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
.caution{border:2px solid #b35900;background:#fff4e5;padding:8px 12px;margin:12px 0}
.caution li{margin:2px 0}
.meta{color:#57606a}
.output{page-break-inside:avoid}
.charts{display:flex;flex-wrap:wrap;gap:16px;align-items:flex-start}
svg{background:#fff;border:1px solid #e1e4e8}
svg text{font:11px system-ui,sans-serif;fill:#1b1f24}
svg .bin.in-spec{fill:#4878a8}svg .bin.out-of-spec{fill:#c0392b}
svg .interval-band{fill:#f2c94c;fill-opacity:.25}
svg .axis{stroke:#57606a}
svg .marker.spec line{stroke:#c0392b;stroke-width:2;stroke-dasharray:6 3}
svg .marker.interval line{stroke:#b58900;stroke-width:1.5}
svg .marker.nominal line{stroke:#1b1f24;stroke-width:1;stroke-dasharray:2 2}
svg .marker.worst line{stroke:#6f42c1;stroke-width:1.5;stroke-dasharray:3 3}
svg .worst-bracket{stroke:#6f42c1;stroke-width:2}
svg .contribution{fill:#2e8b57}
svg .first-order{fill:#a8d5ba}
svg .tick line{stroke:#57606a}svg .sweep-worst{fill:#dde4ee}svg .sweep-mc{fill:#8fa9c8}svg .sweep-nominal{fill:none;stroke:#1b1f24;stroke-width:1.5}svg .sweep-limit{stroke:#b42318;stroke-dasharray:5 4}svg .axis{stroke:#57606a}
#verdict .overall{font-weight:600}#verdict td.word{font-weight:600}#verdict tr[data-verdict=fail] td.word{text-decoration:underline}svg .axis-title{font-style:italic}
svg{max-width:100%;height:auto;box-sizing:border-box}
section.table table{max-width:100%}td .line{display:block;white-space:nowrap}
#provenance{display:grid;grid-template-columns:max-content 1fr max-content 1fr;gap:2px 12px;margin:8px 0 12px;color:#57606a}
#provenance dt{font-weight:600}#provenance dd{margin:0;overflow-wrap:anywhere}#provenance dd.wide{grid-column:2/-1}#provenance dd[data-field=sha256]{font-family:ui-monospace,monospace}
@page{margin:14mm}
@media print{
body{font-size:11px;max-width:none;margin:0;padding:0}
h2{break-after:avoid}h3{break-after:avoid}
table,svg,.caution,#provenance{break-inside:avoid}
tr{break-inside:avoid}thead{display:table-header-group}
td,th{padding:2px 5px}
.charts{display:block}.charts>*{break-inside:avoid}
svg{display:block;margin:4px 0}
}
`;

/** "2026-12-02 09:55:12 UTC". */
function utcText(date: Date): string {
  return `${date.toISOString().slice(0, 19).replace('T', ' ')} UTC`;
}

/** Where the report came from, so it can be matched to its design file and reproduced. */
function provenanceBlock(input: HtmlReportInput): string {
  const r = input.result;
  // The file and its digest each take a whole row; the short figures pair up two to a row.
  const entries: [string, string, string][] = [['subject', 'design file', input.subject]];
  if (input.provenance?.designSha256) entries.push(['sha256', 'SHA-256 of the design file', input.provenance.designSha256]);
  if (input.provenance) entries.push(['generated', 'generated', utcText(input.provenance.generatedAt)]);
  entries.push(['version', 'trimfree version', input.version], ['seed', 'seed', JSON.stringify(r.seed)], ['trials', 'Monte Carlo trials', r.trials.toLocaleString('en-US')]);
  const wide = new Set(['subject', 'sha256']);
  const items = entries.map(([field, label, value]) => `<dt>${escapeHtml(label)}</dt><dd data-field="${field}"${wide.has(field) ? ' class="wide"' : ''}>${escapeHtml(value)}</dd>`);
  return `<dl id="provenance">${items.join('')}</dl>`;
}

function cell(text: string, cls = ''): string {
  return `<td${cls ? ` class="${cls}"` : ''}>${escapeHtml(text)}</td>`;
}

/** A cell whose text may hold line breaks: each line kept whole, one under the other. */
function multiLineCell(text: string, cls: string): string {
  if (!text.includes('\n')) return cell(text, cls);
  return `<td${cls ? ` class="${cls}"` : ''}>${text.split('\n').map((line) => `<span class="line">${escapeHtml(line)}</span>`).join('')}</td>`;
}

function table(head: string[], rows: string[]): string {
  return `<table><thead><tr>${head.map((h) => `<th>${escapeHtml(h)}</th>`).join('')}</tr></thead><tbody>\n${rows.join('\n')}\n</tbody></table>`;
}

function formatPartValue(value: number, unit: string): string {
  if (unit === '1/K') return formatPpmPerK(value);
  if (unit === '' ) return formatPercent(value, 3);
  if (unit === '°C') return `${value.toFixed(1)} °C`;
  return formatEngineering(value, unit, 4);
}

/** Kinds whose band reads naturally as ± a percentage of the nominal value. */
const RELATIVE_KINDS = new Set<Part['kind']>(['resistor', 'shunt', 'potentiometer', 'reference', 'threshold']);

function partsTable(parts: Part[]): string {
  const rows = parts.map((p) => {
    const band = p.minus === 0 && p.plus === 0
      ? 'exact'
      : `${formatPartValue(p.nominal - p.minus, p.unit)} … ${formatPartValue(p.nominal + p.plus, p.unit)}`;
    const relative = RELATIVE_KINDS.has(p.kind) && p.nominal !== 0 && p.minus === p.plus && p.minus > 0
      ? ` (±${formatPercent(p.plus / Math.abs(p.nominal), 3)})`
      : '';
    return `<tr data-part="${escapeHtml(p.name)}">${cell(p.name)}${cell(p.kind)}${cell(formatPartValue(p.nominal, p.unit), 'num')}${cell(band + relative, 'num')}${cell(describeDistribution(p))}${cell(p.tcrPerK !== undefined ? formatPpmPerK(p.tcrPerK) : MISSING)}</tr>`;
  });
  return table(['part', 'kind', 'nominal', 'band', 'distribution', 'TCR'], rows);
}

function bomTable(bom: BomRow[]): string {
  const rows = bom.map(
    (b) =>
      `<tr data-designator="${escapeHtml(b.designator)}">${cell(b.designator)}${cell(b.value, 'num')}${cell(b.code)}${cell(b.series)}${cell(b.tolerance, 'num')}${cell(b.tcr, 'num')}${cell(b.power, 'num')}${cell(b.note ?? '')}</tr>`,
  );
  return table(['designator', 'value', 'IEC 60062 code', 'series', 'tolerance', 'TCR', 'power it must handle', 'note'], rows);
}

function summaryTable(result: AnalysisResult): string {
  const rows = Object.values(result.outputs).map((o) => {
    const d = outputDigits(o);
    const wc = `${formatValue(o.worstCase.min, o.unit, d)} … ${formatValue(o.worstCase.max, o.unit, d)}`;
    return `<tr data-output="${escapeHtml(o.name)}">${cell(outputTitle(o.name))}${cell(formatValue(o.nominal, o.unit, d), 'num')}${cell(formatValue(o.mean, o.unit, d), 'num')}${cell(formatSpread(o.sigma, o.unit), 'num')}${cell(wc, 'num')}${cell(o.yield ? formatYieldPct(o.yield.pct) : MISSING, 'num')}${cell(formatIndex(o.cpk), 'num')}</tr>`;
  });
  return table(['output', 'nominal', 'mean', 'σ', 'worst case', 'yield per unit', 'Cpk'], rows);
}

function extraTable(t: ReportTable): string {
  const rows = t.rows.map((r) => `<tr>${r.map((c, i) => multiLineCell(c, i === 0 ? '' : 'num')).join('')}</tr>`);
  const notes = (t.notes ?? []).map((n) => `<p class="meta">${escapeHtml(n)}</p>`).join('\n');
  return `<section class="table" id="${escapeHtml(t.id)}"><h2>${escapeHtml(t.title)}</h2>\n${table(t.head, rows)}\n${notes}</section>`;
}

function outputSection(output: OutputResult, idPrefix = '', titleSuffix = ''): string {
  const figures = outputFigures(output).map(
    (f) =>
      `<tr><th scope="row">${escapeHtml(f.label)}</th><td class="num" data-field="${f.field}" data-value="${f.values.map(exact).join(' ')}">${escapeHtml(f.text)}</td></tr>`,
  );
  const quantileNote = output.quantileMethod === 'exact'
    ? 'Quantiles and intervals from every sample (exact).'
    : `Quantiles and intervals from a fine histogram, each within ±${escapeHtml(formatSpread(output.quantileBound, output.unit))}.`;
  return `<section class="output" id="${idPrefix}output-${escapeHtml(output.name)}" data-output="${escapeHtml(output.name)}">
<h2>${escapeHtml(outputTitle(output.name) + titleSuffix)}</h2>
<table class="figures"><tbody>
${figures.join('\n')}
</tbody></table>
<p class="meta">${quantileNote} Histogram: trials per bar against the output's value, each unit at the ambient drawn with it; bars in red lie outside the spec window; dashed red lines are the spec limits, the shaded band the 95 % coverage interval, the purple bracket the worst-case range.</p>
<div class="charts">
${renderSvgHistogram(output)}
${sweepFigure(output)}
<div><h3>Share of the variance by part</h3>
${renderSvgContributions(output)}
<p class="meta">Bars: total-effect share ± its standard error (the part alone and through its interactions); the thin inner bar: first-order share (the part alone).</p>
${varianceBudgetLines(output).map((line) => `<p class="meta variance-budget">${escapeHtml(line)}</p>`).join('\n')}</div>
</div>
</section>`;
}

/** The ambient sweep chart with its caption, when the output has one. */
function sweepFigure(output: OutputResult): string {
  const svg = renderSvgAmbientSweep(output);
  if (svg === '') return '';
  return `<div><h3>Against ambient temperature</h3>
${svg}
<p class="meta">Light band: worst case with the ambient held; darker band: 0.135 … 99.865 % of Monte Carlo units at that ambient; line: nominal; dashed: the spec limits.</p></div>`;
}

export function renderHtmlReport(input: HtmlReportInput): string {
  const r = input.result;
  const cautions = input.cautions ?? [];
  const method = [
    `Monte Carlo propagation of distributions (JCGM 101:2008): ${r.trials.toLocaleString('en-US')} trials, seed ${JSON.stringify(r.seed)}, ${r.workers} worker(s), chunks of ${r.chunkSize.toLocaleString('en-US')} trials each seeded on its own so the numbers do not depend on the worker count.`,
    'Worst case: the extremes over the tolerance band ends and temperature corners (method per output in its table).',
    'RSS: law of propagation of uncertainty, first order, with numerical sensitivity coefficients at the parts\' means (JCGM 100:2008, 5.1.2); U = k·u(y) with k = 2 (JCGM 100:2008, 6.2.1, 6.3.3).',
    'Yield per unit: share of units (a trial is one unit, its parts drawn once) inside the spec window at every ambient checked over the range, with its 95 % Wilson score interval; the yield at a random ambient is a second figure, never in its place. Cp and Cpk per NIST/SEMATECH e-Handbook 6.1.6, from the units at the worst ambient.',
    ...groupMethodNotes(r.notes, new Set(input.parts.map((p) => p.name))),
  ];
  return `${htmlDocumentHead(input.title, input.version, STYLE)}
<body data-seed="${escapeHtml(r.seed)}" data-trials="${r.trials}" data-version="${escapeHtml(input.version)}">
<h1>${escapeHtml(input.title)}</h1>
${provenanceBlock(input)}
${cautions.length > 0 ? `<div class="caution" id="caution"><strong>Caution</strong><ul>${cautions.map((c) => `<li>${escapeHtml(c)}</li>`).join('')}</ul></div>` : ''}
${renderVerdictBlock(r, input.targetYieldPct ?? 99.9)}
<h2>Summary</h2>
${summaryTable(r)}
<h2>Inputs</h2>
${partsTable(input.parts)}
${input.bom && input.bom.length > 0 ? `<h2>Bill of materials</h2>\n${bomTable(input.bom)}` : ''}
${input.designNotes && input.designNotes.length > 0 ? `<h2>Design notes</h2><ul>${input.designNotes.map((n) => `<li>${escapeHtml(n)}</li>`).join('')}</ul>` : ''}
${(input.tables ?? []).map(extraTable).join('\n')}
${Object.values(r.outputs).map((o) => outputSection(o)).join('\n')}
${input.lowEnd ? `<h2>${escapeHtml(input.lowEnd.title)}</h2>\n${summaryTable({ ...input.lowEnd.result, outputs: Object.fromEntries(Object.entries(input.lowEnd.result.outputs).filter(([name]) => POT_OUTPUTS.includes(name))) })}\n${Object.values(input.lowEnd.result.outputs).filter((o) => POT_OUTPUTS.includes(o.name)).map((o) => outputSection(o, 'lowend-', `, ${input.lowEnd!.title}`)).join('\n')}\n<p class="meta">The current-limit outputs are the same at both ends of the travel: shown once above.</p>` : ''}
<h2>How it was obtained</h2>
<ul id="method">${method.map((m) => `<li>${escapeHtml(m)}</li>`).join('')}</ul>
${input.command ? `<p class="meta">Command: <code>${escapeHtml(input.command)}</code></p>` : ''}
<p class="meta">Results describe the model and its stated tolerances only; check every part against its datasheet.</p>
</body>
</html>
`;
}
