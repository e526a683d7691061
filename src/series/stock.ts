// A list of resistor values on hand: one value a line in any resistance notation (4.7k, 4K7, 4700, 4.7 kΩ), blank
// lines and lines starting with '#' ignored; or a CSV (comma, semicolon or tab separated) whose header row names a
// "value" column (other columns, such as quantity or part number, are ignored). Every bad cell is an InputError
// naming the file and line.
import { InputError } from '../errors.js';
import { readInputText } from '../input-file.js';
import { printableText } from '../user-text.js';
import { parseResistance } from '../units/index.js';

/** Most lines a stock list may have. Measured CPU time on the project's two-core machine: parsing costs 4–18 µs a
 * line (plain values to wide CSV rows) and is done in slices with a pause for the event loop between them, so Ctrl-C
 * is answered; the searches after it are synchronous: `nearest --count 50` takes about 0.18 s over 20 000 values and
 * 0.6 s over 100 000, `divider` (two parts, or a pot) under 0.2 s over 100 000. 50 000 keeps every search near
 * 0.3 s. A million-line list took 12.9 s and 930 MB and ignored Ctrl-C. A drawer, or a distributor's whole range of
 * values (E192 over ten decades is 1 920), fits many times over. */
export const MAX_STOCK_LINES = 50_000;
/** Most bytes a stock list may have: 50 000 CSV rows of about 160 characters. */
export const MAX_STOCK_BYTES = 8 * 2 ** 20;
/** Lines parsed between two pauses for the event loop (4–40 ms of work: plain values to wide CSV rows). */
const LINES_PER_SLICE = 1000;

const ACCEPTED = `a readable text file: one value a line, or a CSV with a value column; at most ${MAX_STOCK_LINES} lines and ${MAX_STOCK_BYTES / 2 ** 20} MB`;

/** Ohms, ascending, without duplicates; the parse pauses for the event loop between slices of lines. */
export async function readStockFile(path: string, where: string): Promise<number[]> {
  const text = readInputText(path, { where, maxBytes: MAX_STOCK_BYTES, accepted: ACCEPTED });
  const parse = stockParse(text, `${where} ${printableText(path)}`);
  for (let step = parse.next(); ; step = parse.next()) {
    if (step.done) return step.value;
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
}

/** The stock list in `text` (ascending ohms, without duplicates), all at once. */
export function parseStockText(text: string, where: string): number[] {
  const parse = stockParse(text, where);
  for (let step = parse.next(); ; step = parse.next()) if (step.done) return step.value;
}

/** The parse, yielding after each slice of LINES_PER_SLICE lines so a caller may pause between slices. */
function* stockParse(text: string, where: string): Generator<void, number[]> {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  if (lines.length > MAX_STOCK_LINES + 1 || (lines.length === MAX_STOCK_LINES + 1 && lines[MAX_STOCK_LINES] !== '')) {
    throw new InputError(where, `the stock list has more than ${MAX_STOCK_LINES} lines`, ACCEPTED);
  }
  const firstIndex = lines.findIndex((line) => !isSkipped(line));
  if (firstIndex < 0) throw new InputError(where, 'the stock list is empty', 'one resistance a line, or a CSV with a value column');
  const separator = [',', ';', '\t'].find((s) => lines[firstIndex]!.includes(s));
  const values = new Set<number>();
  let column = -1;
  if (separator !== undefined) {
    const header = splitRow(lines[firstIndex]!, separator).map((cell) => cell.toLowerCase());
    column = header.indexOf('value');
    if (column < 0) {
      throw new InputError(`${where} line ${firstIndex + 1}`, `the CSV header (${printableText(header.join(', '))}) has no "value" column`, 'a header row naming a column "value"');
    }
  }
  for (let i = separator === undefined ? 0 : firstIndex + 1; i < lines.length; i++) {
    if (i % LINES_PER_SLICE === 0 && i > 0) yield;
    const line = lines[i]!;
    if (isSkipped(line)) continue;
    if (separator === undefined) {
      values.add(parseResistance(line.trim(), `${where} line ${i + 1}`));
      continue;
    }
    const cell = splitRow(line, separator)[column];
    if (cell === undefined || cell === '') {
      throw new InputError(`${where} line ${i + 1}`, 'the value column is empty', 'a resistance such as 4.7k or 4K7');
    }
    values.add(parseResistance(cell, `${where} line ${i + 1}`));
  }
  if (values.size === 0) throw new InputError(where, 'the stock list has no values', 'at least one resistance');
  return [...values].sort((a, b) => a - b);
}

function isSkipped(line: string): boolean {
  const trimmed = line.trim();
  return trimmed === '' || trimmed.startsWith('#');
}

/** Cells of one row, trimmed, with surrounding double quotes removed (no separators inside quotes). */
function splitRow(line: string, separator: string): string[] {
  return line.split(separator).map((cell) => cell.trim().replace(/^"(.*)"$/, '$1').trim());
}
