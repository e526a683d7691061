// The verdict block at the top of the HTML report: one row per output with a window (the window, the per-unit
// yield and its interval, whether the worst case stays inside, and the yield against the target), then one overall
// line in plain words. The words carry the verdict; the style only supports them. Renders the AnalysisResult's own
// figures; computes no statistic.
import type { AnalysisResult, OutputResult } from '../analysis/result.js';
import { escapeHtml } from './html-escape.js';
import { formatValue, formatYieldPct, outputDigits, outputTitle } from './format-value.js';

const cell = (text: string, cls = ''): string => `<td${cls ? ` class="${cls}"` : ''}>${escapeHtml(text)}</td>`;

/** Where the worst case lies against the window, in words. */
function worstCaseWords(o: OutputResult): string {
  const [lo, hi] = o.spec!;
  const d = outputDigits(o);
  const below = o.worstCase.min < lo;
  const above = o.worstCase.max > hi;
  if (!below && !above) return 'inside';
  const parts: string[] = [];
  if (below) parts.push(`down to ${formatValue(o.worstCase.min, o.unit, d)}`);
  if (above) parts.push(`up to ${formatValue(o.worstCase.max, o.unit, d)}`);
  return `outside: ${parts.join(', ')}`;
}

function targetWords(o: OutputResult, targetYieldPct: number): { text: string; pass: boolean } {
  const pass = o.yield!.pct >= targetYieldPct;
  return { text: pass ? `meets ${targetYieldPct} %` : `below ${targetYieldPct} %`, pass };
}

/** The overall line: every window met in N of 1,000,000 units, or what fails. */
function overallLine(result: AnalysisResult, checked: OutputResult[], targetYieldPct: number): { text: string; pass: boolean } {
  const failing = checked.filter((o) => o.yield!.pct < targetYieldPct).map((o) => `${o.name} yield ${formatYieldPct(o.yield!.pct)} per unit is below the ${targetYieldPct} % target`);
  const outside = checked.filter((o) => worstCaseWords(o) !== 'inside').map((o) => `${o.name} worst case ${worstCaseWords(o)}`);
  const all = result.allSpecs;
  const perMillion = all ? `Meets every window in ${Math.round(all.pct * 1e4).toLocaleString('en-US')} of 1,000,000 units (per unit, all specs, over the ambient range; 95 % interval ${formatYieldPct(all.low)} … ${formatYieldPct(all.high)}).` : '';
  if (failing.length > 0) return { text: `Fails: ${failing.join('; ')}. ${perMillion}`.trim(), pass: false };
  const note = outside.length > 0 ? ` Worst case not guaranteed: ${outside.join('; ')}.` : '';
  return { text: `${perMillion}${note}`.trim(), pass: true };
}

export function renderVerdictBlock(result: AnalysisResult, targetYieldPct: number): string {
  const checked = Object.values(result.outputs).filter((o) => o.spec && o.yield);
  if (checked.length === 0) return '';
  const rows = checked.map((o) => {
    const d = outputDigits(o);
    const target = targetWords(o, targetYieldPct);
    return `<tr data-output="${escapeHtml(o.name)}" data-verdict="${target.pass ? 'pass' : 'fail'}">${cell(outputTitle(o.name))}${cell(`${formatValue(o.spec![0], o.unit, d)} … ${formatValue(o.spec![1], o.unit, d)}`, 'num')}${cell(`${formatYieldPct(o.yield!.pct)} (${formatYieldPct(o.yield!.low)} … ${formatYieldPct(o.yield!.high)})`, 'num')}${cell(worstCaseWords(o))}${cell(target.text, target.pass ? 'word pass' : 'word fail')}</tr>`;
  });
  const overall = overallLine(result, checked, targetYieldPct);
  const head = ['output', 'spec window', 'yield per unit (95 % interval)', 'worst case', `target ${targetYieldPct} %`];
  return `<section id="verdict" data-verdict="${overall.pass ? 'pass' : 'fail'}">
<h2>Verdict</h2>
<p class="overall">${escapeHtml(overall.text)}</p>
<table><thead><tr>${head.map((h) => `<th>${escapeHtml(h)}</th>`).join('')}</tr></thead><tbody>
${rows.join('\n')}
</tbody></table>
<p class="meta">Yield per unit: the share of units inside the window at every ambient checked over the range. Worst case: every combination of band ends and ambient corners.</p>
</section>`;
}
