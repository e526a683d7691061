// Everything a designer reads about one fixed divider: nominal output and error, the share of the bias current,
// the divider current, each resistor's dissipation and a quick worst-case output range.
import { cornerExtremes } from '../../analysis/corners.js';
import { dividerBiasShift, dividerCurrent, dividerVout } from '../../circuits/divider.js';
import { networkBands } from '../../tolerance/network-bands.js';
import { legOhms, type Leg, type LegKind } from './legs.js';

export interface DividerPart {
  leg: 'top' | 'bottom';
  ohms: number;
  /** Source of the value: the most common requested series offering it, or 'stock'. */
  series: string;
  /** Dissipation at the nominal output, watts (I²R). */
  powerW: number;
}

export interface DividerCandidate {
  /** Equivalent resistance of the top leg, ohms. */
  top: number;
  bottom: number;
  topKind: LegKind;
  bottomKind: LegKind;
  parts: DividerPart[];
  /** The rarest source among the parts. */
  series: string;
  vout: number;
  /** (vout − target)/target × 100. */
  errorPct: number;
  /** Output shift due to the feedback-pin bias current, Ifb·Rtop, as a percentage of the target. */
  ifbShiftPct: number;
  /** Vref/Rbottom, amperes. */
  dividerCurrent: number;
  /** Extremes of Vout over resistor and Vref tolerance (every vertex of the tolerance box). */
  worstCase: { min: number; max: number };
}

export interface DescribeContext {
  vref: number;
  target: number;
  ifb: number;
  /** Relative tolerance of each resistor and of Vref. */
  tolerance: number;
  vrefTolerance: number;
  seriesOf: (ohms: number) => string;
  seriesRankOf: (ohms: number) => number;
  /**
   * Every divider resistor in one network with this ratio (matching) tolerance, a fraction, and `tolerance` as its
   * absolute tolerance: the worst case takes the corners of the network's shared term × each part's own term
   * (src/tolerance/network-bands.ts). Absent: each resistor on its own at ±tolerance.
   */
  ratioTolerance?: number | undefined;
  /**
   * The resistors' TCR counted in the worst case at ambients 25 °C ± deltaT: each within ±tcrPerK, or, in a network,
   * its shared TCR plus each part's own (trackingPerK, default 2·tcrPerK: independent). Absent: at 25 °C.
   */
  temperature?: { tcrPerK: number; trackingPerK?: number | undefined; deltaT: number } | undefined;
}

export function describeFixed(top: Leg, bottom: Leg, context: DescribeContext): DividerCandidate {
  const { vref, target, ifb } = context;
  const vout = dividerVout(vref, top.ohms, bottom.ohms, ifb);
  const topCurrent = (vout - vref) / top.ohms;
  const bottomCurrent = vref / bottom.ohms;
  const parts: DividerPart[] = [
    ...legParts('top', top, topCurrent, vout - vref),
    ...legParts('bottom', bottom, bottomCurrent, vref),
  ].map((p) => ({ ...p, series: context.seriesOf(p.ohms) }));
  const rarest = parts.reduce((a, b) => (context.seriesRankOf(b.ohms) > context.seriesRankOf(a.ohms) ? b : a));

  const extremes = context.ratioTolerance === undefined ? looseExtremes(top, bottom, context) : networkExtremes(top, bottom, context, context.ratioTolerance);

  return {
    top: top.ohms,
    bottom: bottom.ohms,
    topKind: top.kind,
    bottomKind: bottom.kind,
    parts,
    series: rarest.series,
    vout,
    errorPct: ((vout - target) / target) * 100,
    ifbShiftPct: (dividerBiasShift(top.ohms, ifb) / target) * 100,
    dividerCurrent: dividerCurrent(vref, bottom.ohms),
    worstCase: { min: extremes.min, max: extremes.max },
  };
}

/** Each physical resistor of a leg with its dissipation: series parts share the current, parallel parts the voltage. */
function legParts(leg: 'top' | 'bottom', l: Leg, current: number, voltage: number): Array<Omit<DividerPart, 'series'>> {
  return l.parts.map((ohms) => ({
    leg,
    ohms,
    powerW: l.kind === 'parallel' ? (voltage * voltage) / ohms : current * current * ohms,
  }));
}

const legValue = (leg: Leg, r: (k: number) => number, at: number): number => (leg.parts.length === 1 ? r(at) : legOhms(leg.kind, r(at), r(at + 1)));

/**
 * Worst case: x = [Vref, top parts…, bottom parts…, then with a temperature: ΔT, each part's α…], each part at ±its
 * tolerance, R_k·(1 + α_k·ΔT) at temperature.
 */
function looseExtremes(top: Leg, bottom: Leg, context: DescribeContext): { min: number; max: number } {
  const { vref, ifb, tolerance, vrefTolerance, temperature } = context;
  const parts = [...top.parts, ...bottom.parts];
  const n = parts.length;
  const lo = [vref * (1 - vrefTolerance), ...parts.map((r) => r * (1 - tolerance))];
  const hi = [vref * (1 + vrefTolerance), ...parts.map((r) => r * (1 + tolerance))];
  if (temperature) {
    lo.push(-temperature.deltaT, ...parts.map(() => -temperature.tcrPerK));
    hi.push(temperature.deltaT, ...parts.map(() => temperature.tcrPerK));
  }
  const nt = top.parts.length;
  return cornerExtremes((x) => {
    const r = (k: number): number => (temperature ? x[1 + k]! * (1 + x[2 + n + k]! * x[1 + n]!) : x[1 + k]!);
    return dividerVout(x[0]!, legValue(top, r, 0), legValue(bottom, r, nt), ifb);
  }, lo, hi);
}

/**
 * Worst case with the resistors one network: x = [Vref, s, m for each part…, then with a temperature: ΔT, a, t for
 * each part…], part k = R_k·(1 + s)·(1 + m_k)·(1 + (a + t_k)·ΔT) (src/tolerance/network-bands.ts).
 */
function networkExtremes(top: Leg, bottom: Leg, context: DescribeContext, ratio: number): { min: number; max: number } {
  const { vref, ifb, tolerance, vrefTolerance, temperature } = context;
  const tcrPerK = temperature?.tcrPerK ?? 0;
  const bands = networkBands({ tolerance, ratio, tcrPerK, trackingPerK: temperature?.trackingPerK ?? 2 * tcrPerK });
  const parts = [...top.parts, ...bottom.parts];
  const n = parts.length;
  const lo = [vref * (1 - vrefTolerance), -bands.shared, ...parts.map(() => -bands.mismatch)];
  const hi = [vref * (1 + vrefTolerance), bands.shared, ...parts.map(() => bands.mismatch)];
  if (temperature) {
    lo.push(-temperature.deltaT, -bands.sharedTcrPerK, ...parts.map(() => -bands.memberTcrPerK));
    hi.push(temperature.deltaT, bands.sharedTcrPerK, ...parts.map(() => bands.memberTcrPerK));
  }
  const nt = top.parts.length;
  return cornerExtremes((x) => {
    const r = (k: number): number => {
      const value = parts[k]! * (1 + x[1]!) * (1 + x[2 + k]!);
      return temperature ? value * (1 + (x[3 + n]! + x[4 + n + k]!) * x[2 + n]!) : value;
    };
    return dividerVout(x[0]!, legValue(top, r, 0), legValue(bottom, r, nt), ifb);
  }, lo, hi);
}
