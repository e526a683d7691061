// The bill of materials as the reports show it: the design layer's BOM lines (src/design/bom.ts) formatted into
// cells (shared by the HTML report and the terminal), and the terminal table with the operating point each part's
// power was taken at.
import type { BomLine } from '../design/bom.js';
import { formatEngineering, formatPercent, formatPpmPerK } from '../units/index.js';
import type { BomRow } from './html-report.js';
import { textTable } from './text-table.js';

/** The design layer's BOM lines, formatted for the report. */
export function bomRows(bom: BomLine[]): BomRow[] {
  return bom.map((line) => {
    const row: BomRow = {
      designator: line.designator,
      value: formatEngineering(line.ohms, 'Ω', 4),
      code: line.code,
      series: line.series,
      tolerance: formatPercent(line.tolerance, line.tolerance < 0.01 ? 2 : 1),
      tcr: formatPpmPerK(line.tcrPerK),
      power: `${formatEngineering(line.powerW, 'W')}${line.ratingW !== undefined ? ` of ${formatEngineering(line.ratingW, 'W')} rated` : ''}`,
      note: `${line.role}; power ${/^at /.test(line.powerAt) ? '' : 'at '}${line.powerAt}`,
    };
    return row;
  });
}

/** The BOM as a terminal table. */
export function renderBomText(bom: BomLine[]): string {
  const rows = bomRows(bom).map((row, i) => [row.designator, row.value, row.code, row.series, row.tolerance, row.tcr, row.power, bom[i]!.role]);
  const table = textTable(['part', 'value', 'code', 'series', 'tol', 'TCR', 'power (rating)', 'role'], rows, [false, true, false, false, true, true, true, false]);
  const at = [...new Set(bom.map((l) => `${l.designator}: ${l.powerAt}`))];
  return `bill of materials\n${table}\npower taken ${summarisePowerBasis(at)}\n`;
}

/** "at the nominal output (RTOP, RBOT); at the nominal limit 1.504 A (RS, RF, RG)" from lines "DESIGNATOR: BASIS". */
function summarisePowerBasis(lines: string[]): string {
  const byBasis = new Map<string, string[]>();
  for (const line of lines) {
    const [designator, basis] = line.split(': ') as [string, string];
    byBasis.set(basis, [...(byBasis.get(basis) ?? []), designator]);
  }
  return [...byBasis].map(([basis, names]) => `${basis} (${names.join(', ')})`).join('; ');
}
