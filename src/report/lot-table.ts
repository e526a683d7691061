// The lot study (src/analysis/lot-study.ts, reel-lot model) as one table: per output with a window, the overall
// yield over every unit of every lot with its interval, the worst lot's yield and which lot; then its notes. The
// terminal report and the HTML report show the same rows. Computes nothing: the study's figures as given.
import type { LotStudyResult } from '../analysis/lot-study.js';
import { formatYieldPct } from './format-value.js';
import type { ReportTable } from './html-report.js';
import { textTable } from './text-table.js';

const HEAD = ['output', 'overall yield (all lots)', '95 % Wilson interval', 'worst lot', 'worst lot\'s yield'];

function rows(lots: LotStudyResult): string[][] {
  const out = Object.entries(lots.overall).map(([name, y]) => [
    name,
    formatYieldPct(y.pct),
    `${formatYieldPct(y.low)} … ${formatYieldPct(y.high)}`,
    `lot ${lots.worst[name]!.lot + 1} of ${lots.count}`,
    formatYieldPct(lots.worst[name]!.pct),
  ]);
  if (lots.overallAllSpecs && lots.worstAllSpecs) {
    const y = lots.overallAllSpecs;
    out.push(['all specs', formatYieldPct(y.pct), `${formatYieldPct(y.low)} … ${formatYieldPct(y.high)}`, `lot ${lots.worstAllSpecs.lot + 1} of ${lots.count}`, formatYieldPct(lots.worstAllSpecs.pct)]);
  }
  return out;
}

function title(lots: LotStudyResult): string {
  return `Lot to lot: ${lots.count} lots of ${lots.trialsPerLot.toLocaleString('en-US')} units (reel-lot model, lot offset within ±${Math.round(lots.share * 100)} % of each band: common practice)`;
}

export function renderLotText(lots: LotStudyResult): string {
  return `\n${title(lots)}\n${textTable(HEAD, rows(lots), [false, true, true, false, true])}\n${lots.notes.map((n) => `  ${n}`).join('\n')}\n`;
}

export function lotReportTable(lots: LotStudyResult): ReportTable {
  return { id: 'lots', title: title(lots), head: HEAD, rows: rows(lots), notes: lots.notes };
}
