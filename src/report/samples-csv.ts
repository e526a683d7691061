// The Monte Carlo samples as CSV (RFC 4180): one row per trial, the trial number, every part's drawn value and
// every output, in SI base units with full precision (the shortest text that reads back to the same double), lines
// ended by CRLF. Rendered in pieces so the file can be written as it is made (src/cli/spread-files.ts): the header
// once, then the rows of each chunk of trials, so no more than one piece is ever in memory. Concatenated in order,
// the pieces are the whole file.

/** The columns: parts, then outputs, each with its unit. */
export interface SampleColumns {
  partNames: string[];
  /** Unit of each part column ('Ω', 'V', …), shown in the header. */
  partUnits: string[];
  outputNames: string[];
  outputUnits: string[];
}

/** Some consecutive trials: parts[i][j] and outputs[o][j] are trial offset + j. */
export interface SampleRows {
  parts: ArrayLike<number>[];
  outputs: ArrayLike<number>[];
  /** Trial number of index 0. */
  offset: number;
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

/** The header line (with its CRLF): `trial`, then `name (unit)` for every part and output. */
export function samplesCsvHeader(columns: SampleColumns): string {
  const names = [
    'trial',
    ...columns.partNames.map((n, i) => heading(n, columns.partUnits[i] ?? '')),
    ...columns.outputNames.map((n, i) => heading(n, columns.outputUnits[i] ?? '')),
  ];
  return `${names.join(',')}\r\n`;
}

/** The lines (each with its CRLF) of indexes [from, to) of `rows`, numbered from rows.offset + from. */
export function samplesCsvRows(rows: SampleRows, from: number, to: number): string {
  const { parts, outputs, offset } = rows;
  // Arrays joined once beat growing strings here (about 6 against 9–13 µs a row of 25 columns, measured).
  const lines: string[] = [];
  for (let j = from; j < to; j++) {
    const row: string[] = [String(offset + j)];
    for (let i = 0; i < parts.length; i++) row.push(number(parts[i]![j]!));
    for (let o = 0; o < outputs.length; o++) row.push(number(outputs[o]![j]!));
    lines.push(row.join(','));
  }
  return lines.length === 0 ? '' : `${lines.join('\r\n')}\r\n`;
}
