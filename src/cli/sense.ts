// `trimfree sense`: pick the shunt, gain resistors and threshold for a target current limit, rank the candidates by
// quick worst case, and show the Pareto front of shunt loss against limit spread. Thin: parses options into a
// SenseRequest (src/pick/sense.ts does the work) and prints tables or JSON.
import { Command, Option } from 'commander';
import Table from 'cli-table3';
import { DEFAULT_SHUNT_DERATING } from '../circuits/shunt-power.js';
import { InputError } from '../errors.js';
import { MAX_SHUNT_CANDIDATES, pickSense, type SenseCandidate, type SensePick, type SenseRequest } from '../pick/sense.js';
import { exceedsLossLimit } from '../pick/sense/feasibility.js';
import { SENSE_TOPOLOGIES, type SenseTopologyName, type ThresholdSource } from '../pick/sense/types.js';
import { seriesValuesBetween } from '../series/enumerate.js';
import { loadShunts, SERIES_NAMES, type SeriesName } from '../series/load.js';
import { describeCurrentBand, formatEngineering, formatPercent, formatSignedPercent, parseResistance, type CurrentBand, type Range } from '../units/index.js';
import {
  currentBandOption,
  currentOption,
  integerOption,
  boundedPercentOption,
  toleranceOption,
  powerOption,
  kelvinOption,
  ppmPerKOption,
  rangeOption,
  seriesOption,
  voltageOption,
} from './option-parsers.js';
import { COMPACT_TABLE } from './values.js';
import { printableText } from '../user-text.js';

interface SenseOptions {
  limit: number;
  topology: SenseTopologyName;
  threshold?: number;
  thresholdTol: number;
  thresholdFrom?: number;
  shunts?: number[];
  shuntTol: number;
  shuntRating: number;
  derate: number;
  maxLoss?: number;
  series: SeriesName;
  window: Range;
  tolerance: number;
  ratioTol?: number;
  tcr?: number;
  tracking?: number;
  deltaT?: number;
  rail: number;
  headroom: number;
  vos: number;
  vosCmp: number;
  ib: CurrentBand;
  commonMode: number;
  top: number;
  json?: boolean;
}

export const SHUNT_CAUTION =
  'Caution: a shunt at the current limit runs hot. Check its temperature rise and the power derating curve in its\n' +
  'datasheet at your hottest ambient (using about 50–60 % of the rating is common practice); keep it clear of\n' +
  'heat-sensitive parts.';

/** "10m,20m,R05" → ohms; each entry in any resistance notation. */
function parseShuntList(text: string): number[] {
  const entries = text.split(',').map((entry) => entry.trim());
  if (entries.some((entry) => entry === '')) {
    throw new InputError('--shunts', `empty entry in '${printableText(text)}'`, 'a comma-separated list of resistances such as 10m,20m,R05');
  }
  if (entries.length > MAX_SHUNT_CANDIDATES) {
    throw new InputError('--shunts', `${entries.length} values are more than the ${MAX_SHUNT_CANDIDATES} the search takes`, `a comma-separated list of at most ${MAX_SHUNT_CANDIDATES} resistances`);
  }
  return entries.map((entry) => parseResistance(entry, '--shunts'));
}

function thresholdSource(options: SenseOptions): ThresholdSource {
  const { threshold, thresholdFrom, thresholdTol } = options;
  if (threshold !== undefined && !(threshold > 0)) {
    throw new InputError('--threshold', `must be above 0 V, got ${formatEngineering(threshold, 'V')}`, 'a positive voltage, e.g. 1V or 800mV');
  }
  if (thresholdFrom !== undefined) {
    if (!(thresholdFrom > 0)) {
      throw new InputError('--threshold-from', `the reference must be above 0 V, got ${formatEngineering(thresholdFrom, 'V')}`, 'a positive voltage, e.g. 1.25V');
    }
    return threshold === undefined
      ? { kind: 'divider', reference: thresholdFrom, tolerance: thresholdTol }
      : { kind: 'divider', reference: thresholdFrom, tolerance: thresholdTol, volts: threshold };
  }
  if (threshold === undefined) {
    throw new InputError('--threshold', 'no threshold given', 'a voltage, e.g. --threshold 1V, or --threshold-from 1.25V to derive it from a reference');
  }
  return { kind: 'fixed', volts: threshold, tolerance: thresholdTol };
}

function buildRequest(options: SenseOptions): SenseRequest {
  if (!(options.window.lo > 0)) {
    throw new InputError('--window', 'the window must start above 0 Ω', 'LO..HI with 0 < LO ≤ HI, e.g. 1k..1M');
  }
  const request: SenseRequest = {
    limit: options.limit,
    topology: options.topology,
    threshold: thresholdSource(options),
    shunts: options.shunts ?? loadShunts().values,
    shuntTolerance: options.shuntTol,
    shuntRatingW: options.shuntRating,
    derating: options.derate,
    resistorValues: seriesValuesBetween(options.series, options.window.lo, options.window.hi),
    resistorTolerance: options.tolerance,
    rail: options.rail,
    headroom: options.headroom,
    amplifierOffset: Math.abs(options.vos),
    compareOffset: Math.abs(options.vosCmp),
    biasCurrent: options.ib,
    commonMode: options.commonMode,
  };
  if (options.maxLoss !== undefined) request.maxLossW = options.maxLoss;
  if (options.ratioTol !== undefined) {
    if (options.topology !== 'diff') {
      throw new InputError('--ratio-tol', `a gain network is offered for the diff topology's R1–R4, not ${options.topology}`, '--topology diff with --ratio-tol, or no --ratio-tol');
    }
    if (!(options.ratioTol <= options.tolerance)) {
      throw new InputError('--ratio-tol', `${formatPercent(options.ratioTol)} is wider than the ${formatPercent(options.tolerance)} absolute --tolerance`, `a ratio tolerance at most --tolerance (${formatPercent(options.tolerance)})`);
    }
    request.gainNetwork = { name: 'RN1', tolerance: options.tolerance, ratio: options.ratioTol };
  }
  gainTemperature(options, request);
  return request;
}

/** --tcr, --tracking, --delta-t: the gain resistors' TCR in the quick worst case (diff only). */
function gainTemperature(options: SenseOptions, request: SenseRequest): void {
  const { tcr, tracking, deltaT } = options;
  if (tcr === undefined && tracking === undefined && deltaT === undefined) return;
  const first = tcr !== undefined ? '--tcr' : tracking !== undefined ? '--tracking' : '--delta-t';
  if (options.topology !== 'diff') throw new InputError(first, `the gain resistors' TCR is counted for the diff topology's R1–R4, not ${options.topology}`, '--topology diff');
  if (deltaT === undefined || tcr === undefined) {
    throw new InputError(deltaT === undefined ? first : '--delta-t', 'the gain resistors\' TCR needs both --tcr and --delta-t', '--tcr 25ppm --delta-t 45 (the ambient\'s largest distance from 25 °C, K)');
  }
  if (tracking !== undefined) {
    if (!request.gainNetwork) throw new InputError('--tracking', 'TCR tracking is a network figure', '--ratio-tol with --tracking, or no --tracking');
    if (tracking > 2 * tcr * (1 + 1e-12)) throw new InputError('--tracking', `${formatPpm(tracking)} is more than twice the ${formatPpm(tcr)} --tcr`, 'a tracking figure at most twice --tcr (two members inside ±tcr differ by at most 2·tcr)');
    request.gainNetwork!.trackingPerK = tracking;
  }
  request.gainTcr = { tcrPerK: tcr, deltaT };
}

const formatPpm = (perK: number): string => `${Number((perK * 1e6).toPrecision(4))} ppm/K`;

const ohms = (r: number): string => formatEngineering(r, 'Ω');

/** The gain-resistor cell: "RF 11.3 kΩ / RG 2.00 kΩ", "R1=R3 15.0 kΩ / R2=R4 100 kΩ". */
function gainCell(c: SenseCandidate): string {
  const p = c.parts;
  if (c.topology === 'noninv') return `${ohms(p['RF']!)} / ${ohms(p['RG']!)}`;
  if (c.topology === 'diff') return `${ohms(p['R1']!)} / ${ohms(p['R2']!)}`;
  return '';
}


function gainHead(topology: SenseTopologyName): string {
  return topology === 'noninv' ? 'RF / RG' : topology === 'diff' ? 'R1=R3 / R2=R4' : '';
}

function candidateTable(candidates: SenseCandidate[], topology: SenseTopologyName, divider: boolean): string {
  const head = ['#', 'RS'];
  if (topology !== 'direct') head.push(gainHead(topology), 'gain');
  if (divider) head.push('RT1 / RT2', 'Vth');
  head.push('limit', 'error', 'V shunt', 'loss', 'I max', topology === 'direct' ? '' : 'amp out', 'offsets', 'worst case', 'spread');
  if (topology === 'direct') head.splice(head.indexOf(''), 1);
  const table = new Table({ head, ...COMPACT_TABLE, colAligns: head.map((h) => (h === '#' || h.startsWith('R') ? 'left' : 'right')) });
  candidates.forEach((c, i) => {
    const row = [String(i + 1), ohms(c.parts['RS']!)];
    if (topology !== 'direct') row.push(gainCell(c), c.gain.toFixed(3));
    if (divider) row.push(`${ohms(c.parts['RT1']!)} / ${ohms(c.parts['RT2']!)}`, formatEngineering(c.threshold, 'V', 4));
    row.push(
      formatEngineering(c.limit, 'A', 4),
      formatSignedPercent(c.errorPct / 100),
      formatEngineering(c.shuntVoltage, 'V'),
      formatEngineering(c.shuntLossW, 'W'),
      `${formatEngineering(c.shuntMaxCurrent, 'A')}${exceedsLossLimit(c) ? ' !' : ''}`,
    );
    if (topology !== 'direct') row.push(formatEngineering(c.outputAtLimit, 'V'));
    row.push(
      `±${formatPercent(c.offsetErrorPct / 100)}`,
      `${formatEngineering(c.worstCase.min, 'A', 4)} … ${formatEngineering(c.worstCase.max, 'A', 4)}`,
      `±${formatPercent(c.worstCaseSpreadPct / 100)}`,
    );
    table.push(row);
  });
  return table.toString();
}

function paretoTable(pick: SensePick): string {
  const table = new Table({ head: ['RS', 'parts', 'loss', 'spread'], ...COMPACT_TABLE, colAligns: ['left', 'left', 'right', 'right'] });
  for (const c of pick.pareto) {
    const others = Object.entries(c.parts)
      .filter(([name]) => name !== 'RS' && name !== 'R3' && name !== 'R4')
      .map(([name, r]) => `${name} ${ohms(r)}`)
      .join(', ');
    table.push([ohms(c.parts['RS']!), others, formatEngineering(c.shuntLossW, 'W'), `±${formatPercent(c.worstCaseSpreadPct / 100)}`]);
  }
  return table.toString();
}

function describeRequest(request: SenseRequest, options: SenseOptions): string {
  const t = request.threshold;
  const threshold =
    t.kind === 'fixed'
      ? `threshold ${formatEngineering(t.volts, 'V')} ±${formatPercent(t.tolerance)}`
      : `threshold from a ${formatEngineering(t.reference, 'V')} ±${formatPercent(t.tolerance)} reference through RT1/RT2` +
        (t.volts === undefined ? '' : ` (aiming at ${formatEngineering(t.volts, 'V')})`);
  const side = request.commonMode !== 0 ? `high side at ${formatEngineering(request.commonMode, 'V')}` : 'low side';
  const amp =
    request.topology === 'direct'
      ? `comparing offset ±${formatEngineering(request.compareOffset, 'V')}`
      : `amplifier on a ${formatEngineering(request.rail, 'V')} rail (${formatEngineering(request.headroom, 'V')} headroom), Vos ±${formatEngineering(request.amplifierOffset, 'V')}, Ib ${describeCurrentBand(request.biasCurrent)}, comparing offset ±${formatEngineering(request.compareOffset, 'V')}`;
  return [
    `current limit ${formatEngineering(request.limit, 'A')}, ${request.topology} topology, ${side}, ${threshold}`,
    `resistors ${options.series} ${ohms(options.window.lo)}–${ohms(options.window.hi)} ±${formatPercent(request.resistorTolerance)}; ` +
      (request.gainNetwork ? `R1–R4 one network RN1, ±${formatPercent(request.gainNetwork.ratio, 3)} ratio between any two; ` : '') +
      (request.gainTcr
        ? `R1–R4 TCR ±${formatPpm(request.gainTcr.tcrPerK)}${request.gainNetwork ? `, tracking ${formatPpm(request.gainNetwork.trackingPerK ?? 2 * request.gainTcr.tcrPerK)}` : ''} at 25 °C ± ${request.gainTcr.deltaT} K; `
        : '') +
      `shunts ±${formatPercent(request.shuntTolerance)} rated ${formatEngineering(request.shuntRatingW, 'W')} used to ${formatPercent(request.derating, 0)}` +
      (request.maxLossW === undefined ? '' : `, loss budget ${formatEngineering(request.maxLossW, 'W')}`),
    amp,
  ].join('\n');
}

function highSideNote(commonMode: number, network: SenseRequest['gainNetwork']): string {
  if (network) {
    return (
      `high side: resistor mismatch turns the ${formatEngineering(commonMode, 'V')} common mode into limit error. R1–R4 as one network: its shared\n` +
      `term cancels in every ratio and each member keeps its own ±ρ/(2 + ρ) (ρ the ratio tolerance), so the worst-case CMRR\n` +
      `is about (1 + G)/(4·ρ/(2 + ρ)) ≈ (1 + G)/(2ρ) (first order).\n`
    );
  }
  return (
    `high side: resistor mismatch turns the ${formatEngineering(commonMode, 'V')} common mode into limit error (worst-case CMRR of four\n` +
    `resistors of tolerance t is about (1 + G)/(4t), from memory); a tighter --tolerance or a matched network (--ratio-tol) narrows it.\n`
  );
}

function jsonOf(pick: SensePick, shown: SenseCandidate[], network: SenseRequest['gainNetwork']): unknown {
  return {
    target: pick.target,
    candidates: shown.map((c) => ({
      parts: c.parts,
      gain: c.gain,
      threshold: c.threshold,
      limit: c.limit,
      errorPct: c.errorPct,
      shuntVoltage: c.shuntVoltage,
      shuntLossW: c.shuntLossW,
      shuntMaxCurrent: c.shuntMaxCurrent,
      worstCaseLossW: c.worstCaseLossW,
      outputAtLimit: c.outputAtLimit,
      offsetErrorPct: c.offsetErrorPct,
      worstCase: c.worstCase,
      worstCaseSpreadPct: c.worstCaseSpreadPct,
    })),
    pareto: pick.pareto.map((c) => ({ parts: c.parts, shuntLossW: c.shuntLossW, worstCaseSpreadPct: c.worstCaseSpreadPct })),
    ...(network ? { gainNetwork: network } : {}),
    considered: pick.considered,
    rejected: pick.rejected,
    cautions: [SHUNT_CAUTION.replace(/\n/g, ' ')],
  };
}

function run(options: SenseOptions): void {
  if (options.rail > 0 && options.headroom >= options.rail) {
    // Checked here too so the line names both options (the picker knows no option names but its own).
    throw new InputError(
      '--rail/--headroom',
      `the ${formatEngineering(options.headroom, 'V')} headroom leaves nothing of the ${formatEngineering(options.rail, 'V')} rail for the amplifier output`,
      'a --rail above --headroom (default 0.2 V), e.g. --rail 5V',
    );
  }
  const request = buildRequest(options);
  const pick = pickSense(request);
  const shown = pick.candidates.slice(0, options.top);
  if (options.json) {
    process.stdout.write(`${JSON.stringify(jsonOf(pick, shown, request.gainNetwork), null, 2)}\n`);
    return;
  }
  const divider = request.threshold.kind === 'divider';
  const removed = Object.entries(pick.rejected).map(([reason, n]) => `${reason} ${n}`);
  process.stdout.write(
    `${describeRequest(request, options)}\n\n` +
      `candidates (best ${shown.length} of ${pick.candidates.length}, ranked by worst-case spread, then loss)\n` +
      `${candidateTable(shown, request.topology, divider)}\n` +
      `error: nominal limit against the target; V shunt, loss, amp out: at the nominal limit; I max: the current at the shunt's\n` +
      `loss limit (its derated rating, or --max-loss when lower);\n` +
      `offsets: largest limit change from Vos, Ib and the comparing offset; worst case: every tolerance and offset at its\n` +
      `extremes (vertex enumeration, exact for these monotonic transfers${request.gainNetwork ? '; R1–R4 by the corners of the network\'s shared term ×\neach member\'s own term, so every unit holds both bands' : ''}); spread: larger distance from the target to\n` +
      (request.gainTcr
        ? `either end, in % of the target. TCR: only R1–R4's, at 25 °C ± ${request.gainTcr.deltaT} K; the shunt's, the threshold's, offset drift and\nself-heating are not included: run 'trimfree spread' on a design file.\n`
        : `either end, in % of the target. TCR and self-heating are not included: run 'trimfree spread' on a design file.\n`) +
      (shown.some(exceedsLossLimit) ? `!: the worst-case highest limit exceeds I max (the loss there is listed in --json as worstCaseLossW); 'trimfree design' never picks such a candidate.\n` : '') +
      (removed.length > 0 ? `removed before ranking: ${removed.join(', ')}\n` : '') +
      (request.commonMode !== 0 ? highSideNote(request.commonMode, request.gainNetwork) : '') +
      `\nPareto front: no other candidate is both cooler and tighter\n${paretoTable(pick)}\n\n${SHUNT_CAUTION}\n`,
  );
}

export function senseCommand(): Command {
  return new Command('sense')
    .description('pick shunt, gain resistors and threshold for a current limit; Pareto front of shunt loss against limit spread')
    // main.ts prints commander's errors as one line; a subcommand does not inherit the program's silenced output.
    .configureOutput({ outputError: () => undefined })
    .addOption(new Option('--limit <A>', 'target current limit, e.g. 3A or 750mA').argParser(currentOption('--limit')).makeOptionMandatory())
    .addOption(new Option('--topology <name>', 'sense circuit').choices([...SENSE_TOPOLOGIES]).default('noninv'))
    .addOption(new Option('--threshold <V>', 'threshold the amplified shunt signal meets').argParser(voltageOption('--threshold')))
    .addOption(new Option('--threshold-tol <pct>', 'tolerance of the threshold (or of the reference with --threshold-from)').argParser(toleranceOption('--threshold-tol')).default(0.01, '1 %'))
    .addOption(new Option('--threshold-from <Vref>', 'derive the threshold from this reference through a picked divider RT1/RT2').argParser(voltageOption('--threshold-from')))
    .addOption(new Option('--shunts <list>', 'shunt values, comma-separated, any notation (default: the list in series/shunts-milliohm.json)').argParser(parseShuntList))
    .addOption(new Option('--shunt-tol <pct>', 'shunt tolerance').argParser(toleranceOption('--shunt-tol')).default(0.01, '1 %'))
    .addOption(new Option('--shunt-rating <W>', 'shunt power rating').argParser(powerOption('--shunt-rating')).default(1, '1 W'))
    .addOption(new Option('--derate <pct>', 'share of the rating the shunt may use at the hottest ambient (common practice)').argParser(boundedPercentOption('--derate', 0, 1, 'above 0 % up to 100 % of the rating, e.g. 50%', true)).default(DEFAULT_SHUNT_DERATING, '50 %'))
    .addOption(new Option('--max-loss <W>', 'largest shunt loss at the limit (default: no budget beyond the derated rating)').argParser(powerOption('--max-loss')))
    .addOption(new Option('--series <name>', `E-series of the gain and divider resistors: ${SERIES_NAMES.join(', ')}`).argParser(seriesOption('--series')).default('E96'))
    .addOption(new Option('--window <lo..hi>', 'range of the gain and divider resistors').argParser(rangeOption(parseResistance, '--window')).default({ lo: 1e3, hi: 1e6 }, '1k..1M'))
    .addOption(new Option('--tolerance <pct>', 'tolerance of the gain and divider resistors').argParser(toleranceOption('--tolerance')).default(0.01, '1 %'))
    .addOption(new Option('--ratio-tol <pct>', 'diff: R1–R4 as one network with this ratio (matching) tolerance, --tolerance its absolute one; worst case takes its shared × own corners (default: four separate resistors)').argParser(toleranceOption('--ratio-tol')))
    .addOption(new Option('--tcr <ppm>', 'diff: TCR of R1–R4 (with --ratio-tol the network\'s absolute TCR), counted at 25 °C ± --delta-t (default: not counted)').argParser(ppmPerKOption('--tcr')))
    .addOption(new Option('--tracking <ppm>', 'with --ratio-tol: TCR tracking between R1–R4, at most 2 × --tcr (default 2 × --tcr: independent TCRs)').argParser(ppmPerKOption('--tracking')))
    .addOption(new Option('--delta-t <K>', 'with --tcr: the ambient\'s largest distance from 25 °C, in kelvin (e.g. 45 for -20..60 °C)').argParser(kelvinOption('--delta-t')))
    .addOption(new Option('--rail <V>', 'amplifier supply rail').argParser(voltageOption('--rail')).default(5, '5 V'))
    .addOption(new Option('--headroom <V>', 'how close to the rail the amplifier output swings').argParser(voltageOption('--headroom')).default(0.2, '0.2 V'))
    .addOption(new Option('--vos <V>', 'largest amplifier input offset').argParser(voltageOption('--vos')).default(1e-3, '1 mV'))
    .addOption(new Option('--vos-cmp <V>', 'largest offset of the stage that compares with the threshold').argParser(voltageOption('--vos-cmp')).default(0, '0 V'))
    .addOption(new Option('--ib <A>', 'amplifier input bias current: 20n (typical, exactly that), ±20n or 10n±10n (a band), 0..20n (a range), max 20n (anywhere in 0..20 nA)').argParser(currentBandOption('--ib')).default({ nominal: 0, lo: 0, hi: 0, form: 'typical' }, '0 A'))
    .addOption(new Option('--common-mode <V>', 'load-side shunt voltage for high-side sensing (diff only)').argParser(voltageOption('--common-mode')).default(0, '0 V, low side'))
    .addOption(new Option('--top <n>', 'candidates listed').argParser(integerOption('--top', 1, 1000)).default(10))
    .option('--json', 'print JSON: candidates (parts in ohms, limit, errorPct, shuntLossW, worstCase), pareto, gainNetwork with --ratio-tol')
    .addHelpText(
      'after',
      `
For each shunt the gain resistors (and the threshold divider) come from the series by exact ratio search; each
design's quick worst case enumerates every tolerance and offset extreme. The amplifier output must stay below the
rail minus headroom at 120 % of the limit; the shunt voltage at the limit must be at least 10 × the offset it competes
with (common practice). TCR, self-heating and Monte Carlo spread: 'trimfree spread' on a design file.

Examples:
  $ trimfree sense --limit 3A --threshold 1V
  $ trimfree sense --limit 3A --threshold 1V --max-loss 0.25W --vos 50uV --tolerance 0.1%
  $ trimfree sense --limit 5A --topology diff --threshold 1.2V --common-mode 24V --rail 30V
  $ trimfree sense --limit 5A --topology diff --threshold 1.2V --common-mode 24V --rail 30V --tolerance 0.1% --ratio-tol 0.05%
  $ trimfree sense --limit 5A --topology diff --threshold 1.2V --common-mode 24V --rail 30V --tolerance 0.1% --ratio-tol 0.05% --tcr 25ppm --tracking 5ppm --delta-t 45
  $ trimfree sense --limit 2A --topology direct --threshold-from 1.25V --vos-cmp 1mV
  $ trimfree sense --limit 3A --threshold 1V --shunts 20m,R033,50m --json`,
    )
    .action((options: SenseOptions) => run(options));
}
