// `trimfree divider`: feedback-divider resistors for a target output (fixed), or fixed resistors around a pot so
// every unit covers an output range (adjustable). A thin command: parse, call pickDivider, print.
import { Command, Option } from 'commander';
import Table from 'cli-table3';
import { InputError } from '../errors.js';
import { DIVIDER_DEFAULTS, pickDivider, type AdjustableDividerResult, type DividerCandidate, type FixedDividerResult } from '../pick/divider.js';
import { parseSeriesName, type SeriesName } from '../series/load.js';
import { readStockFile } from '../series/stock.js';
import {
  describeCurrentBand,
  formatEngineering,
  formatPercent,
  formatRkmDigits,
  formatSignedPercent,
  parseResistance,
  parseVoltage,
  parseCurrent,
  type CurrentBand,
  type Range,
} from '../units/index.js';
import {
  currentBandOption,
  integerOption,
  kelvinOption,
  percentOption,
  ppmPerKOption,
  toleranceOption,
  rangeOption,
  resistanceOption,
  voltageOption,
} from './option-parsers.js';
import { COMPACT_TABLE } from './values.js';

interface DividerOptions {
  vref: number;
  vout: Range;
  ifb: CurrentBand;
  series: SeriesName[];
  stock?: string;
  parts: number;
  bottom: Range;
  current?: Range;
  max: number;
  biasRatio: number;
  tolerance?: number;
  ratioTol?: number;
  tcr?: number;
  tracking?: number;
  deltaT?: number;
  vrefTol: number;
  maxError?: number;
  top: number;
  pot?: number;
  potTol: number;
  potLeg: 'top' | 'bottom';
  json?: boolean;
}

const ohms = (r: number): string => formatEngineering(r, 'Ω');
const volts = (v: number): string => formatEngineering(v, 'V', 4);

function seriesListOption(text: string): SeriesName[] {
  const names = text.split(',').map((part) => part.trim());
  if (names.some((name) => name === '')) throw new InputError('--series', `empty name in '${text}'`, 'a comma-separated list such as E24,E96');
  return names.map((name) => parseSeriesName(name, '--series'));
}

/** IEC 60062 code with three significant digits for E48 and finer (28K0), two otherwise (3K3). */
function rkm(part: { ohms: number; series: string }): string {
  return formatRkmDigits(part.ohms, /^E(48|96|192)$/.test(part.series) ? 3 : 2);
}

function legText(c: DividerCandidate, leg: 'top' | 'bottom'): string {
  const parts = c.parts.filter((p) => p.leg === leg);
  const kind = leg === 'top' ? c.topKind : c.bottomKind;
  if (parts.length === 1) return `${ohms(parts[0]!.ohms)} ${rkm(parts[0]!)}`;
  const joint = kind === 'series' ? ' + ' : ' ∥ ';
  return `${parts.map((p) => ohms(p.ohms)).join(joint)}\n= ${formatEngineering(leg === 'top' ? c.top : c.bottom, 'Ω', 5)} (${parts.map(rkm).join(joint.trim())})`;
}

function powerText(watts: number): string {
  return watts >= 1e-3 ? formatEngineering(watts, 'W', 2) : formatEngineering(watts, 'W', 1);
}

function printFixed(result: FixedDividerResult, ifb: CurrentBand): void {
  const s = result.settings;
  const table = new Table({
    head: ['#', 'top', 'bottom', 'series', 'Vout', 'error', 'Ifb part', 'I divider', 'power each', 'worst case'],
    colAligns: ['right', 'left', 'left', 'left', 'right', 'right', 'right', 'right', 'left', 'left'],
    ...COMPACT_TABLE,
  });
  result.candidates.forEach((c, i) => {
    table.push([
      String(i + 1),
      legText(c, 'top'),
      legText(c, 'bottom'),
      c.series,
      formatEngineering(c.vout, 'V', 5),
      formatSignedPercent(c.errorPct / 100, 3),
      formatSignedPercent(c.ifbShiftPct / 100, 3),
      formatEngineering(c.dividerCurrent, 'A'),
      c.parts.map((p) => powerText(p.powerW)).join(' / '),
      `${volts(c.worstCase.min)} … ${volts(c.worstCase.max)}`,
    ]);
  });
  process.stdout.write(
    `${settingsLine(result, ifb)}\n${table.toString()}\n` +
      `error: Vout vs ${volts(s.vout.lo)} with Ifb included; Ifb part: Ifb·Rtop as a share of the target; ` +
      (s.temperature ? `worst case at 25 °C ± ${s.temperature.deltaT} K with the resistors' TCR ±${Number((s.temperature.tcrPerK * 1e6).toPrecision(4))} ppm/K${s.ratioTolerance !== undefined ? `, tracking ${Number(((s.temperature.trackingPerK ?? 2 * s.temperature.tcrPerK) * 1e6).toPrecision(4))} ppm/K` : ''} (Vref's tempco not counted).\n` : '') +
      (s.ratioTolerance === undefined
        ? `worst case: every corner of ±${formatPercent(s.tolerance, 2)} resistors and ±${formatPercent(s.vrefTolerance, 2)} Vref (${s.temperature ? 'TCR as above' : 'no TCR'}; Ifb at its nominal, no Ifb spread).\n`
        : `worst case: the resistors as one network, ±${formatPercent(s.tolerance, 2)} absolute and ±${formatPercent(s.ratioTolerance, 3)} ratio between any two: every corner of its shared term × each part's own term, and ±${formatPercent(s.vrefTolerance, 2)} Vref (${s.temperature ? 'TCR as above' : 'no TCR'}; Ifb at its nominal, no Ifb spread).\n`) +
      NOTES,
  );
}

function printAdjustable(result: AdjustableDividerResult, ifb: CurrentBand): void {
  const s = result.settings;
  const table = new Table({
    head: ['#', 'fixed top', 'fixed bottom', 'series', 'nominal range', 'every unit covers', 'travel used', 'I divider', 'pot power'],
    colAligns: ['right', 'left', 'left', 'left', 'left', 'left', 'right', 'left', 'right'],
    ...COMPACT_TABLE,
  });
  result.candidates.forEach((c, i) => {
    table.push([
      String(i + 1),
      c.top > 0 ? `${ohms(c.top)} ${rkm(c.parts.find((p) => p.leg === 'top')!)}` : 'none',
      `${ohms(c.bottom)} ${rkm(c.parts.find((p) => p.leg === 'bottom')!)}`,
      c.series,
      `${volts(c.nominal.low)} … ${volts(c.nominal.high)}`,
      `${volts(c.guaranteed.low)} … ${volts(c.guaranteed.high)}`,
      `${c.travelUsedPct.toFixed(1)} %`,
      c.dividerCurrent.min === c.dividerCurrent.max
        ? formatEngineering(c.dividerCurrent.min, 'A')
        : `${formatEngineering(c.dividerCurrent.min, 'A')} … ${formatEngineering(c.dividerCurrent.max, 'A')}`,
      powerText(c.pot.powerW),
    ]);
  });
  process.stdout.write(
    `${settingsLine(result, ifb)}\n` +
      `pot ${ohms(s.pot.ohms)} ±${formatPercent(s.pot.tolerance, 0)} in the ${s.pot.leg} leg, as a rheostat (wiper tied to one track end)\n` +
      `${table.toString()}\n` +
      `every unit covers: the range reachable at every corner of resistor, pot and Vref tolerance; ` +
      `travel used: target span / nominal span (higher is finer adjustment).\n` +
      (s.pot.leg === 'bottom'
        ? 'A pot in the bottom leg that opens drives the output to the regulator\'s maximum: consider the top leg.\n'
        : '') +
      NOTES,
  );
}

function settingsLine(result: FixedDividerResult | AdjustableDividerResult, ifb: CurrentBand): string {
  const s = result.settings;
  const target = s.vout.lo === s.vout.hi ? volts(s.vout.lo) : `${volts(s.vout.lo)} … ${volts(s.vout.hi)}`;
  return (
    `Vref ${volts(s.vref)} ±${formatPercent(s.vrefTolerance, 2)}, Ifb ${describeCurrentBand(ifb)}${ifb.form === 'typical' ? '' : ' (aimed at its nominal)'}, target ${target}; ` +
    `values from ${s.sources.join(', ')}, resistors ±${formatPercent(s.tolerance, 2)} (${s.toleranceSource}); ` +
    `bottom ${ohms(s.window.lo)} … ${ohms(s.window.hi)}`
  );
}

const NOTES =
  'Vref, its tolerance and the feedback-pin bias current Ifb come from the regulator\'s datasheet.\n' +
  'Where the output charges a battery, check the worst-case maximum against the cell maker\'s charge-voltage limit.\n';

/** --tcr, --tracking, --delta-t: the resistors' TCR in the worst case; both --tcr and --delta-t, or neither. */
function dividerTemperature(options: DividerOptions): { tcrPerK: number; trackingPerK?: number; deltaT: number } | undefined {
  const { tcr, tracking, deltaT } = options;
  if (tcr === undefined && tracking === undefined && deltaT === undefined) return undefined;
  if (tcr === undefined || deltaT === undefined) {
    throw new InputError(tcr === undefined ? (tracking !== undefined ? '--tracking' : '--delta-t') : '--tcr', 'the resistors\' TCR needs both --tcr and --delta-t', '--tcr 25ppm --delta-t 45 (the ambient\'s largest distance from 25 °C, K)');
  }
  return tracking === undefined ? { tcrPerK: tcr, deltaT } : { tcrPerK: tcr, trackingPerK: tracking, deltaT };
}

async function run(options: DividerOptions): Promise<void> {
  if (options.parts !== 2 && options.parts !== 3) {
    throw new InputError('--parts', `${options.parts} parts is not offered`, '2 (one resistor a leg) or 3 (one leg may be two resistors)');
  }
  const stock = options.stock !== undefined ? await readStockFile(options.stock, '--stock') : undefined;
  const result = pickDivider({
    vref: options.vref,
    vout: options.vout,
    ifb: options.ifb.nominal,
    series: options.series,
    stock,
    maxParts: options.parts,
    bottom: options.bottom,
    current: options.current,
    minOhms: DIVIDER_DEFAULTS.minOhms,
    maxOhms: options.max,
    biasRatio: options.biasRatio,
    tolerance: options.tolerance,
    ratioTolerance: options.ratioTol,
    temperature: dividerTemperature(options),
    vrefTolerance: options.vrefTol,
    maxError: options.maxError,
    count: options.top,
    pot: options.pot !== undefined ? { ohms: options.pot, tolerance: options.potTol, leg: options.potLeg } : undefined,
  });
  if (options.json) {
    process.stdout.write(`${JSON.stringify({ ...result, settings: { ...result.settings, ifbBand: options.ifb } }, null, 2)}\n`);
    return;
  }
  if (result.mode === 'fixed') printFixed(result, options.ifb);
  else printAdjustable(result, options.ifb);
}

export function dividerCommand(): Command {
  const d = DIVIDER_DEFAULTS;
  return new Command('divider')
    .description('feedback-divider resistors for a target output voltage, or fixed resistors around a pot for an adjustable output')
    .addOption(new Option('--vref <volts>', "the regulator's reference (feedback-pin) voltage, from its datasheet").argParser(voltageOption('--vref')).makeOptionMandatory())
    .addOption(new Option('--vout <volts>', 'target output, or LO..HI with --pot').argParser(rangeOption(parseVoltage, '--vout')).makeOptionMandatory())
    .addOption(new Option('--ifb <amps>', 'feedback-pin bias current, positive into the pin: 20n (typical, exactly that), ±20n or 10n±10n (a band), 0..20n (a range), max 20n (anywhere in 0..20 nA); the picker aims at its nominal').argParser(currentBandOption('--ifb')).default({ nominal: 0, lo: 0, hi: 0, form: 'typical' }, '0'))
    .addOption(new Option('--series <list>', 'E-series to draw from, e.g. E24,E96').argParser(seriesListOption).default(d.series, d.series.join(',')))
    .addOption(new Option('--stock <file>', 'use only the values in this list (one a line, or a CSV with a value column)'))
    .addOption(new Option('--parts <n>', '2: one resistor a leg; 3: one leg may be two in series or parallel').argParser(integerOption('--parts', 2, 3)).default(2))
    .addOption(new Option('--bottom <range>', 'bottom resistor range, LO..HI').argParser(rangeOption(parseResistance, '--bottom')).default(d.bottom, '1k..100k'))
    .addOption(new Option('--current <range>', 'divider current window Vref/Rbottom, LO..HI').argParser(rangeOption(parseCurrent, '--current')))
    .addOption(new Option('--max <ohms>', 'largest resistor').argParser(resistanceOption('--max')).default(d.maxOhms, '1M'))
    .addOption(new Option('--bias-ratio <n>', 'divider current at least n × |Ifb| (0: off)').argParser(integerOption('--bias-ratio', 0, 1e6)).default(d.biasRatio))
    .addOption(new Option('--tolerance <pct>', 'resistor tolerance (default: the series\' usual, E96 1 %)').argParser(toleranceOption('--tolerance')))
    .addOption(new Option('--ratio-tol <pct>', 'the divider\'s resistors as one network with this ratio (matching) tolerance, --tolerance its absolute one; worst case then takes the network\'s shared × own corners (default: separate resistors)').argParser(toleranceOption('--ratio-tol')))
    .addOption(new Option('--tcr <ppm>', 'resistor TCR (with --ratio-tol the network\'s absolute TCR), counted in the worst case at 25 °C ± --delta-t (default: not counted)').argParser(ppmPerKOption('--tcr')))
    .addOption(new Option('--tracking <ppm>', 'with --ratio-tol: TCR tracking between the resistors, at most 2 × --tcr (default 2 × --tcr: independent TCRs)').argParser(ppmPerKOption('--tracking')))
    .addOption(new Option('--delta-t <K>', 'with --tcr: the ambient\'s largest distance from 25 °C, in kelvin (e.g. 45 for -20..60 °C)').argParser(kelvinOption('--delta-t')))
    .addOption(new Option('--vref-tol <pct>', 'reference tolerance').argParser(toleranceOption('--vref-tol')).default(d.vrefTolerance, '1%'))
    .addOption(new Option('--max-error <pct>', 'largest output error accepted (default: the resistor tolerance)').argParser(percentOption('--max-error')))
    .addOption(new Option('--top <n>', 'candidates shown').argParser(integerOption('--top', 1, 200)).default(d.count))
    .addOption(new Option('--pot <ohms>', 'potentiometer for an adjustable output (needs --vout LO..HI)').argParser(resistanceOption('--pot')))
    .addOption(new Option('--pot-tol <pct>', 'pot track tolerance').argParser(toleranceOption('--pot-tol')).default(d.potTolerance, '20%'))
    .addOption(new Option('--pot-leg <leg>', 'leg holding the pot').choices(['top', 'bottom']).default('top'))
    .option('--json', 'print JSON: { settings, candidates: [{ top, bottom, vout, errorPct, parts, ... }] } in ohms, volts, amperes, watts')
    .addHelpText(
      'after',
      `
Vout = Vref·(1 + Rtop/Rbottom) + Ifb·Rtop. Take Vref, its tolerance and the feedback-pin bias current
from the regulator's datasheet. Candidates are ranked by |error|, then fewer parts, then the more common
series, then divider current nearest the middle of the window; the search is exhaustive.
The bias-ratio rule (divider current ≥ 100 × |Ifb|) is common practice.
With --pot the pot is a rheostat (wiper tied to one track end) in series with the leg's fixed resistor.

Examples:
  $ trimfree divider --vref 1.25 --vout 12
  $ trimfree divider --vref 0.8 --vout 5 --ifb 50n --series E24,E96 --parts 3
  $ trimfree divider --vref 1.25 --vout 12 --bottom 3k3..3k3 --series E24,E96 --max-error 2%
  $ trimfree divider --vref 1.25 --vout 14.4 --stock my-resistors.txt --json
  $ trimfree divider --vref 1.25 --vout 8.4 --tolerance 0.1% --ratio-tol 0.05%
  $ trimfree divider --vref 1.25 --vout 8.4 --tolerance 0.1% --ratio-tol 0.05% --tcr 25ppm --tracking 5ppm --delta-t 45
  $ trimfree divider --vref 1.25 --vout 3.3..24 --pot 100k --pot-leg top`,
    )
    .configureOutput({ outputError: () => undefined }) // src/cli/main.ts prints the one-line error
    .action((options: DividerOptions) => run(options));
}
