// A pilot build's measurements: one CSV row per unit (RFC 4180, read by csv-parse), columns named after the design's
// outputs (`vout`, `ilimit`, …) plus an optional `unit` (an id) and `ambient` (°C at measurement). Lines starting
// with '#' are comments. Cells take the tool's value notation (`8.41`, `8.41 V`, `1520mA`). Every problem is one
// InputError naming the file, the line and the column, and what is accepted.
import { parse } from 'csv-parse/sync';
import { suggestField } from '../design/suggest-field.js';
import { InputError } from '../errors.js';
import { parseCurrent, parsePower, parseQuantity, parseResistance, parseVoltage, type QuantityKind } from '../units/index.js';
import { ANDERSON_DARLING_MIN_N } from '../analysis/statistics/anderson-darling.js';
import { GRUBBS_MIN_N } from '../analysis/statistics/grubbs.js';

export const UNIT_COLUMN = 'unit';
export const AMBIENT_COLUMN = 'ambient';

/** An output the CSV may hold: its name and SI unit ('V', 'A', 'W'). */
export interface MeasurableOutput {
  name: string;
  unit: string;
}

export interface MeasuredOutput {
  name: string;
  unit: string;
  /** One value per unit, in SI units, in row order. */
  values: number[];
}

export interface PilotMeasurements {
  file: string;
  /** The measured outputs, in the CSV's column order. */
  outputs: MeasuredOutput[];
  /** Each unit's id: the `unit` column, or `line N` without one. */
  unitIds: string[];
  /** CSV line of each unit. */
  lines: number[];
  /** Ambient of each unit, °C, when the CSV has an `ambient` column. */
  ambientC: number[] | null;
}

/** Units the tests need, each with the fewest rows it works with: the largest is what a CSV must hold. */
export const ROWS_NEEDED: Array<{ test: string; rows: number }> = [
  { test: 'the Anderson–Darling shape test', rows: ANDERSON_DARLING_MIN_N },
  { test: "Grubbs' outlier test", rows: GRUBBS_MIN_N },
  { test: 'the t test of the mean and the σ interval', rows: 2 },
];

const TEMPERATURE: QuantityKind = {
  noun: 'temperature',
  units: ['°C', 'degC', 'C'],
  codeLetters: new Map(),
  sign: 'signed',
  accepted: 'a temperature in °C, e.g. 23, 23.5 °C',
};

const PARSERS: Record<string, { parse: (text: string, where: string) => number; noun: string }> = {
  V: { parse: parseVoltage, noun: 'voltage' },
  A: { parse: parseCurrent, noun: 'current' },
  W: { parse: parsePower, noun: 'power' },
};

const OTHER_KINDS: Array<{ parse: (text: string, where: string) => number; noun: string }> = [...Object.values(PARSERS), { parse: parseResistance, noun: 'resistance' }];

/** The outputs a CSV may name: those whose unit the value notation reads. */
export function measurableOutputs(outputs: readonly MeasurableOutput[]): MeasurableOutput[] {
  return outputs.filter((o) => PARSERS[o.unit] !== undefined);
}

function parseCell(text: string, where: string, output: MeasurableOutput): number {
  const parser = PARSERS[output.unit]!;
  if (text.trim() === '') throw new InputError(where, 'empty cell', `the measured ${parser.noun} of this unit, e.g. 1.5 ${output.unit}; remove the row if the unit was not measured`);
  try {
    return parser.parse(text, where);
  } catch (error) {
    // A value that reads as another quantity (1.52 V in a current column) gets its own words.
    const other = OTHER_KINDS.find((k) => k.noun !== parser.noun && canParse(k.parse, text) && /[^0-9.eE+\-\s]/.test(text));
    if (other) {
      throw new InputError(where, `'${text}' is a ${other.noun}, but column ${output.name} holds a ${parser.noun}`, `a ${parser.noun} in ${output.unit} with an optional SI prefix, e.g. 1.5 ${output.unit}, 1500m${output.unit}`);
    }
    throw error;
  }
}

function canParse(parseIt: (text: string, where: string) => number, text: string): boolean {
  try {
    parseIt(text, '');
    return true;
  } catch {
    return false;
  }
}

interface CsvRecord {
  record: string[];
  info: { lines: number };
}

function readRecords(text: string, file: string): CsvRecord[] {
  try {
    return parse(text, { comment: '#', comment_no_infix: true, skip_empty_lines: true, relax_column_count: true, trim: true, bom: true, info: true }) as unknown as CsvRecord[];
  } catch (error) {
    const e = error as { message?: string; lines?: number };
    throw new InputError(`${file}${e.lines ? ` line ${e.lines}` : ''}`, `not a readable CSV: ${String(e.message ?? error).split('\n')[0]}`, 'RFC 4180 CSV: a header row, then one row per unit; quote cells holding commas');
  }
}

/** Reads and checks the CSV text. `outputs`: the design's outputs (name and unit). */
export function readPilotCsv(text: string, file: string, outputs: readonly MeasurableOutput[]): PilotMeasurements {
  const measurable = measurableOutputs(outputs);
  const known = [...measurable.map((o) => o.name), UNIT_COLUMN, AMBIENT_COLUMN];
  const acceptedColumns = `columns named after the design's outputs (${measurable.map((o) => o.name).join(', ')}), optionally ${UNIT_COLUMN} (an id) and ${AMBIENT_COLUMN} (°C)`;
  const records = readRecords(text, file);
  if (records.length === 0) throw new InputError(file, 'no header row', acceptedColumns);
  const header = records[0]!.record;
  const headerLine = records[0]!.info.lines;
  header.forEach((name, i) => {
    const where = `${file} line ${headerLine}, column ${i + 1}`;
    if (name === '') throw new InputError(where, 'empty column name', acceptedColumns);
    if (!known.includes(name)) {
      const hint = suggestField(name, known);
      throw new InputError(where, `unknown column '${name}'${hint ? `; did you mean '${hint}'?` : ''}`, acceptedColumns);
    }
    if (header.indexOf(name) !== i) throw new InputError(where, `column '${name}' appears twice`, acceptedColumns);
  });
  const outputColumns = measurable.map((o) => ({ output: o, index: header.indexOf(o.name) })).filter((c) => c.index >= 0).sort((a, b) => a.index - b.index);
  if (outputColumns.length === 0) {
    throw new InputError(`${file} line ${headerLine}`, `no measured output column (the header has ${header.join(', ')})`, acceptedColumns);
  }
  const unitIndex = header.indexOf(UNIT_COLUMN);
  const ambientIndex = header.indexOf(AMBIENT_COLUMN);

  const measured: MeasuredOutput[] = outputColumns.map((c) => ({ name: c.output.name, unit: c.output.unit, values: [] }));
  const unitIds: string[] = [];
  const lines: number[] = [];
  const ambient: number[] = [];
  const seen = new Map<string, number>();
  for (const { record, info } of records.slice(1)) {
    const line = info.lines;
    if (record.length > header.length) {
      throw new InputError(`${file} line ${line}`, `${record.length} cells where the header has ${header.length}`, `one cell per column: ${header.join(', ')}`);
    }
    const cell = (i: number): string => record[i] ?? '';
    outputColumns.forEach((c, k) => measured[k]!.values.push(parseCell(cell(c.index), `${file} line ${line}, column ${c.output.name}`, c.output)));
    let id = `line ${line}`;
    if (unitIndex >= 0) {
      id = cell(unitIndex);
      const where = `${file} line ${line}, column ${UNIT_COLUMN}`;
      if (id === '') throw new InputError(where, 'empty cell', 'an id for the unit, e.g. U7 or a serial number');
      const earlier = seen.get(id);
      if (earlier !== undefined) throw new InputError(where, `unit id '${id}' already used on line ${earlier}`, 'a different id for each unit');
      seen.set(id, line);
    }
    if (ambientIndex >= 0) {
      const where = `${file} line ${line}, column ${AMBIENT_COLUMN}`;
      const t = parseQuantity(cell(ambientIndex), where, TEMPERATURE);
      if (t < -60 || t > 200) throw new InputError(where, `${t} °C is not a plausible bench ambient`, 'a temperature from −60 to 200 °C');
      ambient.push(t);
    }
    unitIds.push(id);
    lines.push(line);
  }
  const n = unitIds.length;
  const needed = ROWS_NEEDED.reduce((a, b) => (b.rows > a.rows ? b : a));
  if (n < needed.rows) {
    const others = ROWS_NEEDED.filter((r) => r !== needed).map((r) => `${r.test} ${r.rows}`).join(', ');
    throw new InputError(file, `${n} unit${n === 1 ? '' : 's'} measured: ${needed.test} needs at least ${needed.rows} (${others})`, `a CSV with one row per unit and at least ${needed.rows} rows`);
  }
  for (const o of measured) {
    if (o.values.every((v) => v === o.values[0])) {
      throw new InputError(`${file}, column ${o.name}`, `every unit reads ${o.values[0]} ${o.unit}: no spread to compare with the prediction`, "each unit's reading at the meter's full resolution (more digits)");
    }
  }
  return { file, outputs: measured, unitIds, lines, ambientC: ambientIndex >= 0 ? ambient : null };
}
