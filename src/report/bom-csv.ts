// The purchase BOM (src/design/purchase-bom.ts) as CSV for a buyer's import: one record per line of the BOM (a
// resistor network, once the design file has them, is one record listing its members), the header naming each
// column's unit, numbers in plain SI base units (ohm, W, V, 1/K, tolerance as a fraction), text quoted per RFC 4180.
import type { PurchaseBomLine } from '../design/purchase-bom.js';
import { csvRecord, plainNumber } from './csv.js';

export const BOM_CSV_COLUMNS = [
  'designator',
  'members',
  'value (ohm)',
  'IEC 60062 code',
  'series',
  'tolerance (fraction)',
  'tolerance letter',
  'TCR (1/K)',
  'role',
  'power at operating point (W)',
  'operating point',
  'power at worst case (W)',
  'voltage at worst case (V)',
  'worst case basis',
  'rating given (W)',
  'chip size',
] as const;

export function renderBomCsv(lines: PurchaseBomLine[]): string {
  const records = lines.map((l) =>
    csvRecord([
      l.designator,
      l.members.join(' '),
      plainNumber(l.ohms, 7),
      l.code,
      l.series,
      plainNumber(l.tolerance),
      l.toleranceLetter ?? '',
      plainNumber(l.tcrPerK),
      l.role,
      plainNumber(l.powerW, 4),
      l.powerAt,
      plainNumber(l.powerWorstCaseW, 4),
      plainNumber(l.voltageWorstCaseV, 4),
      l.worstCaseBasis,
      l.ratingW === null ? '' : plainNumber(l.ratingW),
      l.chipSize ?? l.chipSizeNote ?? '',
    ]),
  );
  return csvRecord([...BOM_CSV_COLUMNS]) + records.join('');
}
