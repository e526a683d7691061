// The Monte Carlo samples as CSV (RFC 4180): one row per trial, the trial number, every part's drawn value and
// every output, in SI base units with full precision (the shortest text that reads back to the same double).
export interface SampleTable {
  partNames: string[];
  /** Unit of each part column ('Ω', 'V', …), shown in the header. */
  partUnits: string[];
  outputNames: string[];
  outputUnits: string[];
  parts: ArrayLike<number>[];
  outputs: ArrayLike<number>[];
  count: number;
}

function field(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

function heading(name: string, unit: string): string {
  return field(unit ? `${name} (${unit})` : name);
}

function number(value: number): string {
  // A trial whose output is not a number (a model hitting a pole) is left empty rather than written as NaN.
  return Number.isFinite(value) ? String(value) : '';
}

export function renderSamplesCsv(table: SampleTable): string {
  const lines: string[] = [
    ['trial', ...table.partNames.map((n, i) => heading(n, table.partUnits[i] ?? '')), ...table.outputNames.map((n, i) => heading(n, table.outputUnits[i] ?? ''))].join(','),
  ];
  for (let j = 0; j < table.count; j++) {
    const row: string[] = [String(j)];
    for (const column of table.parts) row.push(number(column[j]));
    for (const column of table.outputs) row.push(number(column[j]));
    lines.push(row.join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}
