// `trimfree values SERIES`: the values of an IEC 60063 series within a range, across decades.
import { Argument, Command, Option } from 'commander';
import Table from 'cli-table3';
import { InputError } from '../errors.js';
import { seriesValuesBetween } from '../series/enumerate.js';
import { loadSeries, SERIES_NAMES, type SeriesName } from '../series/load.js';
import { seriesDigits } from '../series/series-digits.js';
import { formatEngineering, formatRkmDigits, formatSignedPercent } from '../units/index.js';
import { resistanceOption, seriesOption } from './option-parsers.js';

interface ValuesOptions {
  from: number;
  to: number;
  json?: boolean;
}

/** "IEC 60063:2015 Table 1" from the data file's source line (its first clause when it names no table). */
export function shortSource(source: string): string {
  const match = /^(IEC [0-9:]+).*?(Table [0-9]+)/.exec(source);
  return match ? `${match[1]} ${match[2]}` : (source.split(': ')[0] ?? source);
}

/** Options for compact cli-table3 tables: no rule between body rows, no colour codes. */
export const COMPACT_TABLE = {
  style: { head: [] as string[], border: [] as string[] },
  chars: { mid: '', 'left-mid': '', 'mid-mid': '', 'right-mid': '' },
};

/** Most rows the table lists. The table is drawn on the calling thread, so Ctrl-C waits for it: 1 920 rows (E192,
 * 1 Ω..10 GΩ) took 0.5–0.8 s of CPU; 1 200 (E192 over 6 decades is 1 152) keep it near 0.3 s. The JSON list, a
 * plain array, has no such cost; the range itself is bounded by the notation (1 µΩ..1 TΩ). */
const MAX_TABLE_ROWS = 1200;

function run(series: SeriesName, options: ValuesOptions): void {
  const { from, to } = options;
  if (from > to) {
    throw new InputError('--from/--to', `range is inverted: --from ${formatEngineering(from, 'Ω')} is above --to ${formatEngineering(to, 'Ω')}`, '--from ≤ --to');
  }
  const values = seriesValuesBetween(series, from, to);
  if (values.length === 0) {
    throw new InputError('--from/--to', `no ${series} value lies between ${formatEngineering(from, 'Ω')} and ${formatEngineering(to, 'Ω')}`, 'a range that holds at least one value (widen it)');
  }
  if (options.json) {
    process.stdout.write(`${JSON.stringify(values)}\n`);
    return;
  }
  if (values.length > MAX_TABLE_ROWS) {
    throw new InputError('--from/--to', `the range holds ${values.length} ${series} values, more than the ${MAX_TABLE_ROWS} a table lists`, `a narrower range (E192: at most 6 decades), or --json for the plain list`);
  }
  const data = loadSeries(series);
  const table = new Table({
    head: ['#', 'value', 'RKM', 'step'],
    colAligns: ['right', 'right', 'left', 'right'],
    ...COMPACT_TABLE,
  });
  values.forEach((value, i) => {
    const previous = i > 0 ? (values[i - 1] as number) : undefined;
    const step = previous === undefined ? '' : formatSignedPercent(value / previous - 1, 1);
    table.push([String(i + 1), formatEngineering(value, 'Ω'), formatRkmDigits(value, seriesDigits(series)), step]);
  });
  process.stdout.write(
    `${series}: ${values.length} values from ${formatEngineering(from, 'Ω')} to ${formatEngineering(to, 'Ω')}\n` +
      `${table.toString()}\n` +
      `source: ${shortSource(data.source)}. Commonly sold in ${data.commonTolerances.join(', ')} (common practice).\n` +
      'step: rise over the previous value.\n',
  );
}

export function valuesCommand(): Command {
  return new Command('values')
    .description('list the values of an IEC 60063 E-series within a range, across decades')
    .addArgument(new Argument('<series>', `the series: ${SERIES_NAMES.join(', ')}`).argParser(seriesOption('series')))
    .addOption(new Option('--from <resistance>', 'lowest value, inclusive').argParser(resistanceOption('--from')).default(1e3, '1k'))
    .addOption(new Option('--to <resistance>', 'highest value, inclusive').argParser(resistanceOption('--to')).default(10e3, '10k'))
    .option('--json', 'print a JSON array of the values in ohms')
    .addHelpText(
      'after',
      `
Values are written in engineering notation or the IEC 60062 letter-and-digit code (4K7, R047, 1M0).

Examples:
  $ trimfree values E24                      one decade, 1 kΩ to 10 kΩ
  $ trimfree values E96 --from 10k --to 20k
  $ trimfree values E12 --from 1R0 --to 1M0 --json`,
    )
    .action((series: SeriesName, options: ValuesOptions) => run(series, options));
}
