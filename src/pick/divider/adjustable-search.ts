// Search for the fixed resistors around a pot so that every unit covers a target output range.
//
// Vout rises with Vref and with the top leg and falls with the bottom leg (g = Vref/Rbottom + Ifb > 0), so the
// guarantees are closed-form bounds on the fixed top resistor Rt for each fixed bottom resistor Rb
// (t, p, v the resistor, pot and Vref tolerances; dividerRtopFor written R(V, Vout, Rb)):
//   pot in the top leg:    Rt(1−t) + P(1−p) ≥ R(Vref(1−v), hi, Rb(1+t))   and   Rt(1+t) ≤ R(Vref(1+v), lo, Rb(1−t))
//   pot in the bottom leg: Rt(1−t) ≥ R(Vref(1−v), hi, Rb(1+t))          and   Rt(1+t) ≤ R(Vref(1+v), lo, Rb(1−t) + P(1−p))
// Each chosen pair is then checked by enumerating the tolerance corners (guaranteed-range.ts).
// Waste: the nominal span over the target span, minus one; less waste is finer adjustment per turn.
// Top-leg pot: the span is P·(Vref/Rb + Ifb) whatever Rt, so for each Rb the Rt that centres the guaranteed range
// on the target is taken (the larger of its two margins' minimum; and Rt = 0, no fixed top resistor, when it fits). Bottom-leg pot: the span grows with
// Rt, so for each Rb the smallest Rt that fits is taken. One candidate per (Rb, Rt) so chosen.
import { dividerRtopFor } from '../../circuits/divider.js';
import type { PotLeg } from '../../circuits/adjustable-divider.js';
import { adjustableEnds } from '../../circuits/adjustable-divider.js';
import type { AllowedValues } from './allowed-values.js';
import type { BottomWindow, Interval } from './bottom-window.js';
import { guaranteedRange, type GuaranteedRange, type Tolerances } from './guaranteed-range.js';
import { bestList, quantize, type Ranked } from './ranking.js';

export interface AdjustableSearchRequest {
  vref: number;
  vout: Interval;
  ifb: number;
  allowed: AllowedValues;
  window: BottomWindow;
  pot: { ohms: number; leg: PotLeg };
  tolerances: Tolerances;
  count: number;
}

export interface AdjustablePair {
  /** Fixed top resistor, ohms (0: none, the pot alone forms the top leg). */
  rtop: number;
  rbottom: number;
  nominal: { low: number; high: number };
  guaranteed: GuaranteedRange;
  /** Nominal span / target span − 1. */
  waste: number;
}

export function searchAdjustableDividers(request: AdjustableSearchRequest): Ranked<AdjustablePair>[] {
  const { vref, vout, ifb, allowed, window, pot, tolerances, count } = request;
  const { resistor: t, pot: p, vref: v } = tolerances;
  const P = pot.ohms;
  const ohms = allowed.ohms;
  const n = ohms.length;
  const best = bestList<AdjustablePair>(count, (a, b) => a.rtop === b.rtop && a.rbottom === b.rbottom);
  const targetSpan = vout.hi - vout.lo;

  const offer = (rtop: number, topIndex: number, bottomIndex: number): void => {
    const rbottom = ohms[bottomIndex]!;
    const guaranteed = guaranteedRange({ vref, rtop, rbottom, rpot: P, leg: pot.leg, ifb }, tolerances);
    // Floating-point slack of one part in 10^12 on the closed-form bounds.
    if (guaranteed.low > vout.lo * (1 + 1e-12) || guaranteed.high < vout.hi * (1 - 1e-12)) return;
    const nominal = adjustableEnds(vref, rtop, rbottom, P, pot.leg, ifb);
    const waste = (nominal.high - nominal.low) / targetSpan - 1;
    const topRank = topIndex >= 0 ? allowed.sourceRank[topIndex]! : 0;
    best.offer(
      {
        score: quantize(waste),
        parts: topIndex >= 0 ? 3 : 2,
        sourceRank: Math.max(topRank, allowed.sourceRank[bottomIndex]!),
        centre: quantize(Math.abs(Math.log(rbottom / window.middle))),
      },
      { rtop, rbottom, nominal, guaranteed, waste },
    );
  };

  for (let i = 0; i < n; i++) {
    const rb = ohms[i]!;
    // The window applies to the fixed bottom resistor; with a bottom-leg pot the feedback-pin rule also to the whole leg.
    if (rb < window.lo || rb > window.hi) continue;
    if (pot.leg === 'bottom' && rb + P * (1 + p) > window.biasLimit) continue;
    const gHigh = vref * (1 - v) / (rb * (1 + t)) + ifb;
    const gLow = vref * (1 + v) / (rb * (1 - t)) + ifb;
    if (!(gHigh > 0) || !(gLow > 0)) continue;
    if (pot.leg === 'top') {
      const rtMin = (dividerRtopFor(vref * (1 - v), vout.hi, rb * (1 + t), ifb) - P * (1 - p)) / (1 - t);
      const rtMax = dividerRtopFor(vref * (1 + v), vout.lo, rb * (1 - t), ifb) / (1 + t);
      if (rtMax < Math.max(rtMin, 0)) continue;
      if (rtMin <= 0) offer(0, -1, i);
      // Centre: lowest-corner low end + highest-corner high end = lo + hi (both linear in Rt).
      const centred =
        (vout.lo + vout.hi - vref * (1 + v) - vref * (1 - v) - P * (1 - p) * gHigh) / ((1 + t) * gLow + (1 - t) * gHigh);
      // The smaller margin is concave in Rt, peaking at `centred`: the best allowed value is one of its neighbours.
      const at = lowerBound(ohms, Math.min(Math.max(centred, rtMin), rtMax));
      let chosen = -1;
      let chosenMargin = -Infinity;
      for (const j of [at - 1, at]) {
        if (j < 0 || j >= n || ohms[j]! < rtMin || ohms[j]! > rtMax) continue;
        const g = guaranteedRange({ vref, rtop: ohms[j]!, rbottom: rb, rpot: P, leg: 'top', ifb }, tolerances);
        const margin = Math.min(vout.lo - g.low, g.high - vout.hi);
        if (margin > chosenMargin) {
          chosen = j;
          chosenMargin = margin;
        }
      }
      if (chosen >= 0) offer(ohms[chosen]!, chosen, i);
    } else {
      const rtMin = dividerRtopFor(vref * (1 - v), vout.hi, rb * (1 + t), ifb) / (1 - t);
      const rtMax = dividerRtopFor(vref * (1 + v), vout.lo, rb * (1 - t) + P * (1 - p), ifb) / (1 + t);
      const j = lowerBound(ohms, rtMin);
      if (j < n && ohms[j]! <= rtMax && ohms[j]! > 0) offer(ohms[j]!, j, i);
    }
  }
  return best.entries;
}

/** First index whose value is ≥ x (binary search over an ascending array). */
function lowerBound(values: Float64Array, x: number): number {
  let lo = 0;
  let hi = values.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (values[mid]! < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
