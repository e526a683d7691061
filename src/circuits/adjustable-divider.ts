// Adjustable feedback divider: a potentiometer in series with the fixed resistor of one leg.
//
// Connection: the pot is wired as a rheostat, its wiper tied to one end of its track, so the leg is
// Rfixed + w·Rpot with w ∈ [0, 1] the wiper position (fraction of the track in circuit). Tying the wiper to a track
// end means a wiper that lifts off the track leaves the whole track in the leg (w = 1) instead of opening the leg.
// Pot in the top leg: w = 0 gives the lowest output, w = 1 the highest. Pot in the bottom leg: the reverse.
// The track's end resistance (a few ohms at w = 0 on real pots) is not modelled.
// Output: dividerVout with the adjusted leg (Kirchhoff's current law at the feedback node, see divider.ts).
import { dividerVout } from './divider.js';

export type PotLeg = 'top' | 'bottom';

/** Output voltage at wiper position `wiper` (0…1). */
export function adjustableVout(
  vref: number,
  rtopFixed: number,
  rbottomFixed: number,
  rpot: number,
  leg: PotLeg,
  wiper: number,
  ifb: number,
): number {
  const rtop = leg === 'top' ? rtopFixed + wiper * rpot : rtopFixed;
  const rbottom = leg === 'bottom' ? rbottomFixed + wiper * rpot : rbottomFixed;
  return dividerVout(vref, rtop, rbottom, ifb);
}

/** Wiper position that gives the lowest output (0 for a top-leg pot, 1 for a bottom-leg pot) and the highest. */
export function wiperForLowest(leg: PotLeg): number {
  return leg === 'top' ? 0 : 1;
}

export function wiperForHighest(leg: PotLeg): number {
  return leg === 'top' ? 1 : 0;
}

/** Lowest and highest output over the pot's travel. */
export function adjustableEnds(
  vref: number,
  rtopFixed: number,
  rbottomFixed: number,
  rpot: number,
  leg: PotLeg,
  ifb: number,
): { low: number; high: number } {
  return {
    low: adjustableVout(vref, rtopFixed, rbottomFixed, rpot, leg, wiperForLowest(leg), ifb),
    high: adjustableVout(vref, rtopFixed, rbottomFixed, rpot, leg, wiperForHighest(leg), ifb),
  };
}

/**
 * Highest dissipation of each part over the pot's travel, watts (Joule heating I²R).
 * Top-leg pot: the top-leg current is Vref/Rbottom + Ifb whatever the wiper, so the fixed top resistor's power is
 * constant and the pot's is highest at w = 1. Bottom-leg pot: the bottom current Vref/(Rbottom + x), x = w·Rpot, is
 * highest at x = 0 (for the fixed parts); the pot's power Vref²·x/(Rbottom + x)² peaks at x = Rbottom (or at the
 * track's end if the track is shorter). A rheostat carries its rated power only over the whole track: compare this
 * figure with the pot datasheet's rating for the part of the track in use.
 */
export function adjustablePeakPowers(
  vref: number,
  rtopFixed: number,
  rbottomFixed: number,
  rpot: number,
  leg: PotLeg,
  ifb: number,
): { top: number; bottom: number; pot: number } {
  if (leg === 'top') {
    const current = vref / rbottomFixed + ifb;
    return { top: current * current * rtopFixed, bottom: (vref * vref) / rbottomFixed, pot: current * current * rpot };
  }
  const topCurrent = vref / rbottomFixed + ifb;
  const x = Math.min(rpot, rbottomFixed);
  return {
    top: topCurrent * topCurrent * rtopFixed,
    bottom: (vref * vref) / rbottomFixed,
    pot: (vref * vref * x) / ((rbottomFixed + x) * (rbottomFixed + x)),
  };
}
