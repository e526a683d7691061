// A list of resistor values on hand: one value a line in any resistance notation (4.7k, 4K7, 4700, 4.7 kΩ), blank
// lines and lines starting with '#' ignored; or a CSV (comma, semicolon or tab separated) whose header row names a
// "value" column (other columns, such as quantity or part number, are ignored). Every bad cell is an InputError
// naming the file and line.
import { readFileSync } from 'node:fs';
import { InputError } from '../errors.js';
import { parseResistance } from '../units/index.js';

/** Ohms, ascending, without duplicates. */
export function readStockFile(path: string, where: string): number[] {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch {
    throw new InputError(where, `cannot read '${path}'`, 'a readable text file: one value a line, or a CSV with a value column');
  }
  return parseStockText(text, `${where} ${path}`);
}

export function parseStockText(text: string, where: string): number[] {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  const firstIndex = lines.findIndex((line) => !isSkipped(line));
  if (firstIndex < 0) throw new InputError(where, 'the stock list is empty', 'one resistance a line, or a CSV with a value column');
  const separator = [',', ';', '\t'].find((s) => lines[firstIndex]!.includes(s));
  const values = new Set<number>();
  if (separator === undefined) {
    lines.forEach((line, i) => {
      if (!isSkipped(line)) values.add(parseResistance(line.trim(), `${where} line ${i + 1}`));
    });
  } else {
    const header = splitRow(lines[firstIndex]!, separator).map((cell) => cell.toLowerCase());
    const column = header.indexOf('value');
    if (column < 0) {
      throw new InputError(`${where} line ${firstIndex + 1}`, `the CSV header (${header.join(', ')}) has no "value" column`, 'a header row naming a column "value"');
    }
    for (let i = firstIndex + 1; i < lines.length; i++) {
      if (isSkipped(lines[i]!)) continue;
      const cell = splitRow(lines[i]!, separator)[column];
      if (cell === undefined || cell === '') {
        throw new InputError(`${where} line ${i + 1}`, 'the value column is empty', 'a resistance such as 4.7k or 4K7');
      }
      values.add(parseResistance(cell, `${where} line ${i + 1}`));
    }
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
