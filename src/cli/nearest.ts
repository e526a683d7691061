// `trimfree nearest VALUE`: the standard values around a target, and the best two-part combinations.
import { Argument, Command, Option } from 'commander';
import Table from 'cli-table3';
import { InputError } from '../errors.js';
import { bestCombinations, PART_MAX_OHMS, PART_MIN_OHMS, POOL_DECADES, type Combination } from '../series/combos.js';
import { loadSeries, SERIES_NAMES, type SeriesName } from '../series/load.js';
import { nearestStandard } from '../series/nearest.js';
import { seriesDigits } from '../series/series-digits.js';
import { readStockFile } from '../series/stock.js';
import { formatEngineering, formatEngineeringShortest, formatRkmDigits, formatSignedPercent, parseResistance } from '../units/index.js';
import { integerOption, seriesOption } from './option-parsers.js';
import { COMPACT_TABLE, shortSource } from './values.js';

interface NearestOptions {
  series: SeriesName;
  count: number;
  stock?: string;
  json?: boolean;
}

/** Where the values come from: an E-series, or the user's stock list (ascending ohms, read once). */
interface ValueSource {
  values: SeriesName | readonly number[];
  label: string;
  digits: number;
  origin: string;
}

async function valueSource(options: NearestOptions): Promise<ValueSource> {
  if (options.stock === undefined) {
    const series = options.series;
    return { values: series, label: series, digits: seriesDigits(series), origin: shortSource(loadSeries(series).source) };
  }
  const values = await readStockFile(options.stock, '--stock');
  return { values, label: 'stock', digits: 3, origin: `${values.length} values from ${options.stock}` };
}

function optionalEngineering(v: number | null): string {
  return v === null ? '—' : formatEngineering(v, 'Ω');
}

/** An error in percent for the table: "exact" when zero to 1e-9 %; small errors keep two significant digits. */
function errorText(errorPct: number): string {
  const size = Math.abs(errorPct);
  if (size < 1e-9) return 'exact';
  const decimals = Math.min(9, Math.max(3, Math.ceil(-Math.log10(size)) + 1));
  return formatSignedPercent(errorPct / 100, decimals);
}

function comboRow(combo: Combination, digits: number): string[] {
  const [a, b] = combo.parts;
  const joint = combo.kind === 'series' ? ' + ' : ' ∥ ';
  return [
    combo.kind,
    `${formatEngineering(a, 'Ω')}${joint}${formatEngineering(b, 'Ω')}`,
    `${formatRkmDigits(a, digits)}${joint}${formatRkmDigits(b, digits)}`,
    formatEngineeringShortest(combo.value, 'Ω', 4, 6),
    errorText(combo.errorPct),
  ];
}

async function run(value: number, options: NearestOptions): Promise<void> {
  const { count } = options;
  const source = await valueSource(options);
  const bracket = typeof source.values === 'string' ? nearestStandard(value, source.values) : nearestStandard(value, source.values);
  const combos = bestCombinations(value, source.values, count);
  if (options.json) {
    const result = {
      value,
      series: source.label,
      below: bracket.below,
      above: bracket.above,
      nearest: bracket.nearest,
      errorPct: { below: bracket.belowErrorPct, above: bracket.aboveErrorPct, nearest: bracket.nearestErrorPct },
      combos: combos.map(({ kind, parts, value: combined, errorPct }) => ({ kind, parts, value: combined, errorPct })),
    };
    process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);
    return;
  }
  const single = new Table({
    head: ['', 'value', 'RKM', 'error'],
    colAligns: ['left', 'right', 'left', 'right'],
    ...COMPACT_TABLE,
  });
  for (const [label, v, e] of [
    ['below', bracket.below, bracket.belowErrorPct],
    ['above', bracket.above, bracket.aboveErrorPct],
    ['nearest', bracket.nearest, bracket.nearestErrorPct],
  ] as const) {
    single.push([label, optionalEngineering(v), v === null ? '—' : formatRkmDigits(v, source.digits), e === null ? '—' : errorText(e)]);
  }
  const pairs = new Table({
    head: ['kind', 'parts', 'RKM', 'value', 'error'],
    colAligns: ['left', 'left', 'left', 'right', 'right'],
    ...COMPACT_TABLE,
  });
  for (const combo of combos) pairs.push(comboRow(combo, source.digits));
  const best = combos[0];
  const note =
    best !== undefined && Math.abs(best.errorPct) >= Math.abs(bracket.nearestErrorPct)
      ? 'The single nearest value is at least as close as any pair.\n'
      : '';
  process.stdout.write(
    `target ${formatEngineeringShortest(value, 'Ω')} (${formatRkmDigits(value, source.digits)}) in ${source.label}, ${source.origin}\n` +
      `${single.toString()}\n` +
      `best two-part combinations from ${source.label} (${count} per kind; parts within ${POOL_DECADES} decades of the target)\n` +
      `${pairs.toString()}\n${note}` +
      'error: (value / target − 1); a pair also adds the tolerance of both parts.\n',
  );
}

/** The target within the span bestCombinations takes, checked before any search (1 mΩ to 1 GΩ, common practice). */
function orderableValue(ohms: number): number {
  if (ohms < PART_MIN_OHMS || ohms > PART_MAX_OHMS) {
    throw new InputError('value', `target ${formatEngineering(ohms, 'Ω')} is outside the span of orderable resistors`, '1 mΩ to 1 GΩ (common practice)');
  }
  return ohms;
}

export function nearestCommand(): Command {
  return new Command('nearest')
    .description('standard values below, above and nearest a target resistance, and the best two-part series or parallel pairs')
    .addArgument(new Argument('<value>', 'target resistance, e.g. 28.38k, 4K7, 10 mΩ').argParser((text: string) => orderableValue(parseResistance(text, 'value'))))
    .addOption(new Option('--series <name>', `E-series, ${SERIES_NAMES[0]} to ${SERIES_NAMES.at(-1)}`).argParser(seriesOption('--series')).default('E24', 'E24'))
    .addOption(new Option('--stock <file>', 'pick from the values in a stock list instead (one value a line in any notation, or a CSV with a value column)'))
    .addOption(new Option('--count <n>', 'pairs listed per kind (series, parallel)').argParser(integerOption('--count', 1, 50)).default(3))
    .option('--json', 'print JSON: below, above, nearest (ohms), errorPct, combos')
    .addHelpText(
      'after',
      `
Combinations are searched exhaustively over the series' values within ${POOL_DECADES} decades of the target.

Examples:
  $ trimfree nearest 28.38k --series E96
  $ trimfree nearest 4K7
  $ trimfree nearest 0.0123 --series E24 --count 5 --json
  $ trimfree nearest 6.2k --stock my-drawer.txt`,
    )
    .action((value: number, options: NearestOptions) => run(value, options));
}
