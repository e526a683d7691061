// Everything a designer reads about one fixed divider: nominal output and error, the share of the bias current,
// the divider current, each resistor's dissipation and a quick worst-case output range.
import { cornerExtremes } from '../../analysis/corners.js';
import { dividerBiasShift, dividerCurrent, dividerVout } from '../../circuits/divider.js';
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
}

export function describeFixed(top: Leg, bottom: Leg, context: DescribeContext): DividerCandidate {
  const { vref, target, ifb, tolerance, vrefTolerance } = context;
  const vout = dividerVout(vref, top.ohms, bottom.ohms, ifb);
  const topCurrent = (vout - vref) / top.ohms;
  const bottomCurrent = vref / bottom.ohms;
  const parts: DividerPart[] = [
    ...legParts('top', top, topCurrent, vout - vref),
    ...legParts('bottom', bottom, bottomCurrent, vref),
  ].map((p) => ({ ...p, series: context.seriesOf(p.ohms) }));
  const rarest = parts.reduce((a, b) => (context.seriesRankOf(b.ohms) > context.seriesRankOf(a.ohms) ? b : a));

  // Worst case: x = [Vref, top parts…, bottom parts…], each at ±its tolerance.
  const nominal = [vref, ...top.parts, ...bottom.parts];
  const relative = [vrefTolerance, ...top.parts.map(() => tolerance), ...bottom.parts.map(() => tolerance)];
  const lo = nominal.map((x, i) => x * (1 - relative[i]!));
  const hi = nominal.map((x, i) => x * (1 + relative[i]!));
  const nt = top.parts.length;
  const legValue = (leg: Leg, x: Float64Array, at: number): number =>
    leg.parts.length === 1 ? x[at]! : legOhms(leg.kind, x[at]!, x[at + 1]!);
  const extremes = cornerExtremes((x) => dividerVout(x[0]!, legValue(top, x, 1), legValue(bottom, x, 1 + nt), ifb), lo, hi);

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
