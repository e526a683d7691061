// The feedback-divider picker: standard-value (or stocked) resistors for a regulator's output divider.
// Fixed output: the pairs nearest the target (exact search, fixed-search.ts). Adjustable output: fixed resistors
// around a pot so every unit covers the range (adjustable-search.ts). Inputs and outputs in SI units.
import { ImpossibleError, InputError } from '../errors.js';
import { adjustablePeakPowers, type PotLeg } from '../circuits/adjustable-divider.js';
import { dividerCurrent } from '../circuits/divider.js';
import { loadSeries, type SeriesName } from '../series/load.js';
import { formatEngineering, formatPercent } from '../units/index.js';
import { allowedFromSeries, allowedFromStock, byCommonness, type AllowedValues } from './divider/allowed-values.js';
import { searchAdjustableDividers } from './divider/adjustable-search.js';
import { bottomWindow, type BottomWindow, type Interval } from './divider/bottom-window.js';
import { describeFixed, type DividerCandidate, type DividerPart } from './divider/describe-fixed.js';
import { searchFixedDividers } from './divider/fixed-search.js';
import type { GuaranteedRange } from './divider/guaranteed-range.js';

export type { DividerCandidate, DividerPart } from './divider/describe-fixed.js';

export interface PotRequest {
  ohms: number;
  /** Relative tolerance of the track resistance. */
  tolerance: number;
  leg: PotLeg;
}

export interface DividerRequest {
  vref: number;
  /** Target output: lo = hi for a fixed output, a range with a pot for an adjustable one. */
  vout: Interval;
  /** Feedback-pin bias current, amperes, positive into the pin. */
  ifb: number;
  series: SeriesName[];
  /** Stocked values (ohms); when given, replaces the series. */
  stock?: number[] | undefined;
  maxParts: 2 | 3;
  bottom: Interval;
  current?: Interval | undefined;
  /** Smallest and largest physical resistor, ohms. */
  minOhms: number;
  maxOhms: number;
  /** Divider current ≥ biasRatio × |Ifb| (common practice: 100); 0 turns the rule off. */
  biasRatio: number;
  /** True where the request has no --bias-ratio to change (a design file): remedies do not offer it. */
  biasRatioFixed?: boolean | undefined;
  /** Relative tolerance of each resistor; undefined: the series' commonly sold tolerance. */
  tolerance?: number | undefined;
  /** Every resistor of a fixed divider in one network with this ratio tolerance (a fraction ≤ tolerance). */
  ratioTolerance?: number | undefined;
  /** A fixed divider's resistor TCR counted in its worst case at 25 °C ± deltaT (tracking: with ratioTolerance). */
  temperature?: { tcrPerK: number; trackingPerK?: number | undefined; deltaT: number } | undefined;
  vrefTolerance: number;
  /** Largest acceptable |error| of a fixed output, as a fraction; undefined: the resistor tolerance. */
  maxError?: number | undefined;
  count: number;
  pot?: PotRequest | undefined;
}

/** Defaults the CLI shows in its help. Each is common practice, not a standard. */
export const DIVIDER_DEFAULTS = {
  series: ['E96'] as SeriesName[],
  bottom: { lo: 1e3, hi: 100e3 },
  minOhms: 1,
  maxOhms: 1e6,
  biasRatio: 100,
  /** A typical regulator reference accuracy over temperature (from memory): use the datasheet's figure. */
  vrefTolerance: 0.01,
  /** Carbon and cermet trimmers are commonly sold at ±20 % (common practice). */
  potTolerance: 0.2,
  count: 10,
  /** Used for a stock list, whose series (and so its usual tolerance) is unknown. */
  stockTolerance: 0.01,
};

export interface DividerSettings {
  vref: number;
  vout: Interval;
  ifb: number;
  tolerance: number;
  toleranceSource: string;
  /** The resistors' ratio tolerance when they are one network (worst case: shared × own corners). */
  ratioTolerance?: number;
  /** The resistors' TCR counted in the worst case, at 25 °C ± deltaT. */
  temperature?: { tcrPerK: number; trackingPerK?: number | undefined; deltaT: number };
  vrefTolerance: number;
  maxError: number;
  sources: string[];
  /** The bottom-leg window actually searched, ohms (middle: its geometric middle). */
  window: { lo: number; hi: number; middle: number };
}

export interface FixedDividerResult {
  mode: 'fixed';
  settings: DividerSettings;
  candidates: DividerCandidate[];
}

export interface AdjustableCandidate {
  /** Fixed top resistor, ohms (0: none). */
  top: number;
  bottom: number;
  pot: { ohms: number; leg: PotLeg; powerW: number };
  parts: DividerPart[];
  series: string;
  nominal: { low: number; high: number };
  guaranteed: GuaranteedRange;
  /** Share of the pot's travel the target range uses, percent (higher: finer adjustment). */
  travelUsedPct: number;
  /** Divider current at the two ends of travel, amperes. */
  dividerCurrent: { min: number; max: number };
}

export interface AdjustableDividerResult {
  mode: 'adjustable';
  settings: DividerSettings & { pot: PotRequest };
  candidates: AdjustableCandidate[];
}

export type DividerResult = FixedDividerResult | AdjustableDividerResult;

/** The tolerance a series is most commonly sold in (the first listed in series/*.json: common practice). */
export function commonTolerance(name: SeriesName): number {
  const first = loadSeries(name).commonTolerances[0] ?? '';
  const match = /(\d+(?:\.\d+)?)/.exec(first);
  return match ? Number(match[1]) / 100 : 0.2;
}

/** Most distinct values in range a three-part (--parts 3) search takes. Its time grows with the square of the list:
 * measured on one core of the project's two-core machine, 1 000 values ~0.1 s, 2 000 ~0.3 s, 3 000 ~0.4 s, 5 000
 * ~1.1 s, 10 000 ~4.6 s (a 100 000-line list ran for more than 5 minutes and could not be interrupted, since the
 * search is synchronous). E192 from 1 Ω to 1 MΩ has 1 153. */
export const MAX_THREE_PART_VALUES = 2000;

export function pickDivider(request: DividerRequest): DividerResult {
  const { vref, vout, ifb } = request;
  if (!(vref > 0)) throw new InputError('--vref', `reference must be positive, got ${vref} V`, 'a positive voltage such as 0.8, 1.25V');
  if (!(vout.lo > vref)) {
    throw new ImpossibleError(
      '--vout',
      `${fmtV(vout.lo)} is at or below the reference ${fmtV(vref)}: a feedback divider cannot set an output below Vref`,
      'ask for an output above Vref, or use a regulator with a lower reference',
    );
  }
  if (request.pot && !(vout.hi > vout.lo)) {
    throw new InputError('--vout', 'a pot needs an output range', 'LO..HI with LO < HI, e.g. 3.3..24');
  }
  if (!request.pot && vout.hi !== vout.lo) {
    throw new InputError('--vout', `a range (${fmtV(vout.lo)}..${fmtV(vout.hi)}) needs a pot`, 'a single voltage, or a range with --pot');
  }
  if (request.pot && request.maxParts !== 2) {
    throw new InputError('--parts', 'two-resistor legs are not offered with a pot', '--parts 2 (the default) with --pot');
  }
  const window = bottomWindow({ vref, ifb, bottom: request.bottom, current: request.current, biasRatio: request.biasRatio, biasRatioFixed: request.biasRatioFixed });
  const allowed = request.stock
    ? allowedFromStock(request.stock, request.minOhms, request.maxOhms)
    : allowedFromSeries(request.series, request.minOhms, request.maxOhms);
  if (request.maxParts === 3 && !request.pot && allowed.ohms.length > MAX_THREE_PART_VALUES) {
    throw new InputError(
      request.stock ? '--stock' : '--series',
      `${allowed.ohms.length} distinct values between ${formatEngineering(request.minOhms, 'Ω')} and ${formatEngineering(request.maxOhms, 'Ω')} are more than the ${MAX_THREE_PART_VALUES} a three-part search takes (its time grows with the square of the list)`,
      `at most ${MAX_THREE_PART_VALUES} values in range with --parts 3: a shorter list, a lower --max, or --parts 2`,
    );
  }
  const finest = byCommonness(request.series).at(-1)!;
  const tolerance = request.tolerance ?? (request.stock ? DIVIDER_DEFAULTS.stockTolerance : commonTolerance(finest));
  const toleranceSource =
    request.tolerance !== undefined ? 'given' : request.stock ? 'assumed for stock' : `commonly sold for ${finest}`;
  const settings: DividerSettings = {
    vref,
    vout,
    ifb,
    tolerance,
    toleranceSource,
    vrefTolerance: request.vrefTolerance,
    maxError: request.maxError ?? tolerance,
    sources: allowed.sources,
    window: { lo: window.lo, hi: window.hi, middle: window.middle },
  };
  if (request.ratioTolerance !== undefined) {
    if (request.pot) throw new InputError('--ratio-tol', 'a network is offered for a fixed divider only', 'no --ratio-tol with --pot');
    if (!(request.ratioTolerance <= tolerance)) {
      throw new InputError('--ratio-tol', `${formatPercent(request.ratioTolerance)} is wider than the resistors' ${formatPercent(tolerance)} absolute tolerance`, `a ratio tolerance at most --tolerance (${formatPercent(tolerance)})`);
    }
    settings.ratioTolerance = request.ratioTolerance;
  }
  if (request.temperature) {
    if (request.pot) throw new InputError('--tcr', 'the resistors\' TCR is counted for a fixed divider only', 'no --tcr with --pot');
    const t = request.temperature;
    if (t.trackingPerK !== undefined && request.ratioTolerance === undefined) throw new InputError('--tracking', 'TCR tracking is a network figure', '--ratio-tol with --tracking, or no --tracking');
    if (t.trackingPerK !== undefined && t.trackingPerK > 2 * t.tcrPerK * (1 + 1e-12)) {
      throw new InputError('--tracking', `${Number((t.trackingPerK * 1e6).toPrecision(4))} ppm/K is more than twice the ${Number((t.tcrPerK * 1e6).toPrecision(4))} ppm/K --tcr`, 'a tracking figure at most twice --tcr (two members inside ±tcr differ by at most 2·tcr)');
    }
    settings.temperature = t;
  }
  return request.pot
    ? pickAdjustable(request, request.pot, settings, allowed, window)
    : pickFixed(request, settings, allowed, window);
}

function pickFixed(request: DividerRequest, settings: DividerSettings, allowed: AllowedValues, window: BottomWindow): FixedDividerResult {
  const { vref, ifb } = request;
  const target = request.vout.lo;
  const ranked = searchFixedDividers({ vref, vout: target, ifb, allowed, window, maxParts: request.maxParts, count: request.count });
  if (ranked.length === 0) {
    throw new ImpossibleError(
      '--bottom',
      `no allowed ${request.maxParts === 2 ? 'value' : 'value or pair'} lies in the bottom window ${formatEngineering(window.lo, 'Ω')}..${formatEngineering(window.hi, 'Ω')}`,
      'widen --bottom or --current, raise --max, or add values to the stock list',
    );
  }
  const context = {
    vref,
    target,
    ifb,
    tolerance: settings.tolerance,
    vrefTolerance: settings.vrefTolerance,
    ratioTolerance: settings.ratioTolerance,
    temperature: settings.temperature,
    ...sourceLookup(allowed),
  };
  const all = ranked.map((r) => describeFixed(r.item.top, r.item.bottom, context));
  const candidates = all.filter((c) => Math.abs(c.errorPct) / 100 <= settings.maxError);
  if (candidates.length === 0) {
    const bestError = all[0] ? Math.abs(all[0].errorPct) / 100 : Infinity;
    const biasShare = all[0] ? Math.abs(all[0].ifbShiftPct) / 100 : 0;
    const biasNote =
      biasShare > settings.maxError
        ? `; the feedback-pin bias current alone moves that output by ${formatPercent(biasShare)}`
        : '';
    throw new ImpossibleError(
      '--vout',
      `no divider within ±${formatPercent(settings.maxError)} of ${fmtV(target)} (best ${Number.isFinite(bestError) ? formatPercent(bestError) : 'none'})${biasNote}`,
      `allow two-resistor legs (--parts 3), add a finer series (--series), widen --bottom/--current, raise --max-error${biasNote ? ', or use smaller resistors or a regulator with less bias current' : ''}`,
    );
  }
  return { mode: 'fixed', settings, candidates };
}

function pickAdjustable(
  request: DividerRequest,
  pot: PotRequest,
  settings: DividerSettings,
  allowed: AllowedValues,
  window: BottomWindow,
): AdjustableDividerResult {
  const { vref, ifb, vout } = request;
  const ranked = searchAdjustableDividers({
    vref,
    vout,
    ifb,
    allowed,
    window,
    pot: { ohms: pot.ohms, leg: pot.leg },
    tolerances: { resistor: settings.tolerance, pot: pot.tolerance, vref: settings.vrefTolerance },
    count: request.count,
  });
  if (ranked.length === 0) {
    throw new ImpossibleError(
      '--pot',
      `no fixed resistors let a ${formatEngineering(pot.ohms, 'Ω')} ±${formatPercent(pot.tolerance, 0)} pot in the ${pot.leg} leg cover ${fmtV(vout.lo)}..${fmtV(vout.hi)} on every unit`,
      'use a larger pot (--pot) or a tighter one (--pot-tol), tighter resistors (--tolerance), a narrower --vout range, or a wider --bottom window',
    );
  }
  const { seriesOf, seriesRankOf } = sourceLookup(allowed);
  const candidates = ranked.map(({ item }): AdjustableCandidate => {
    const powers = adjustablePeakPowers(vref, item.rtop, item.rbottom, pot.ohms, pot.leg, ifb);
    const fixed = [
      ...(item.rtop > 0 ? [{ leg: 'top' as const, ohms: item.rtop, series: seriesOf(item.rtop), powerW: powers.top }] : []),
      { leg: 'bottom' as const, ohms: item.rbottom, series: seriesOf(item.rbottom), powerW: powers.bottom },
    ];
    const rarest = fixed.reduce((a, b) => (seriesRankOf(b.ohms) > seriesRankOf(a.ohms) ? b : a));
    const bottomSpan = pot.leg === 'bottom' ? [item.rbottom, item.rbottom + pot.ohms] : [item.rbottom, item.rbottom];
    return {
      top: item.rtop,
      bottom: item.rbottom,
      pot: { ohms: pot.ohms, leg: pot.leg, powerW: powers.pot },
      parts: fixed,
      series: rarest.series,
      nominal: item.nominal,
      guaranteed: item.guaranteed,
      travelUsedPct: ((vout.hi - vout.lo) / (item.nominal.high - item.nominal.low)) * 100,
      dividerCurrent: { min: dividerCurrent(vref, bottomSpan[1]!), max: dividerCurrent(vref, bottomSpan[0]!) },
    };
  });
  return { mode: 'adjustable', settings: { ...settings, pot }, candidates };
}

function sourceLookup(allowed: AllowedValues): { seriesOf: (ohms: number) => string; seriesRankOf: (ohms: number) => number } {
  const rankAt = new Map<number, number>();
  allowed.ohms.forEach((ohms, i) => rankAt.set(ohms, allowed.sourceRank[i]!));
  const seriesRankOf = (ohms: number): number => rankAt.get(ohms) ?? 0;
  return { seriesRankOf, seriesOf: (ohms) => allowed.sources[seriesRankOf(ohms)]! };
}

function fmtV(volts: number): string {
  return formatEngineering(volts, 'V', 4);
}
