// The output range every unit of an adjustable divider is sure to cover, over all tolerance corners.
// Variables: Vref, fixed top, fixed bottom, pot track, each at the low or high end of its tolerance. The lowest
// output a unit reaches is worst (highest) at some corner; the highest it reaches is worst (lowest) at another.
// cornerExtremes enumerates every vertex; Vout is monotonic in each variable, so the vertices hold the extremes.
import { cornerExtremes } from '../../analysis/corners.js';
import { adjustableVout, wiperForHighest, wiperForLowest, type PotLeg } from '../../circuits/adjustable-divider.js';

export interface AdjustableParts {
  vref: number;
  rtop: number;
  rbottom: number;
  rpot: number;
  leg: PotLeg;
  ifb: number;
}

export interface Tolerances {
  /** Relative tolerance of each fixed resistor. */
  resistor: number;
  pot: number;
  vref: number;
}

export interface GuaranteedRange {
  /** Every unit can be set at least this low (the highest bottom-of-travel output over the corners). */
  low: number;
  /** Every unit can be set at least this high (the lowest top-of-travel output over the corners). */
  high: number;
}

export function guaranteedRange(parts: AdjustableParts, tolerances: Tolerances): GuaranteedRange {
  const { vref, rtop, rbottom, rpot, leg, ifb } = parts;
  const lo = [vref * (1 - tolerances.vref), rtop * (1 - tolerances.resistor), rbottom * (1 - tolerances.resistor), rpot * (1 - tolerances.pot)];
  const hi = [vref * (1 + tolerances.vref), rtop * (1 + tolerances.resistor), rbottom * (1 + tolerances.resistor), rpot * (1 + tolerances.pot)];
  const at = (wiper: number) => (x: Float64Array): number => adjustableVout(x[0]!, x[1]!, x[2]!, x[3]!, leg, wiper, ifb);
  const lowest = cornerExtremes(at(wiperForLowest(leg)), lo, hi);
  const highest = cornerExtremes(at(wiperForHighest(leg)), lo, hi);
  return { low: lowest.max, high: highest.min };
}
