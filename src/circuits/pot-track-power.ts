// Power in a potentiometer wired as a rheostat (src/circuits/adjustable-divider.ts) when only part of its track
// carries the current. A pot's power rating is for the whole track; with a fraction w of the track in circuit the
// heat is concentrated there, so the usual rule is to derate the rating by the same fraction: allowed = rating·w
// (common practice; pot makers' application notes state it, check your part's datasheet). The dissipation at w is
// I(w)²·w·Rpot, so the load against the derated rating is I(w)²·Rpot/rating: the track may carry at most the current
// the whole track is rated for, √(rating/Rpot), at every setting.
// Units: volts, ohms, amperes, watts.
import type { PotLeg } from './adjustable-divider.js';

/** The rating allowed with a fraction `wiper` of the track in circuit: rating·w (common practice). */
export function deratedPotRating(ratingW: number, wiper: number): number {
  return ratingW * wiper;
}

/** The current the whole track is rated for: √(rating/Rpot). */
export function potRatedCurrent(ratingW: number, rpot: number): number {
  return Math.sqrt(ratingW / rpot);
}

/**
 * The largest current the track carries over the travel (any setting with track in circuit). Pot in the top leg:
 * the top leg carries Vref/Rbottom + Ifb whatever the setting. Pot in the bottom leg: Vref/(Rbottom + w·Rpot),
 * largest as w → 0, Vref/Rbottom.
 */
export function potTrackPeakCurrent(vref: number, rbottomFixed: number, leg: PotLeg, ifb: number): number {
  return leg === 'top' ? vref / rbottomFixed + ifb : vref / rbottomFixed;
}

/** The highest dissipation over the derated rating, over the travel: I_max²·Rpot/rating (1 = at the limit). */
export function potTrackLoadRatio(peakCurrent: number, rpot: number, ratingW: number): number {
  return (peakCurrent * peakCurrent * rpot) / ratingW;
}
