// Heat in a current-sense shunt and the current its power rating allows.
//   Loss: P = I²·R (Joule's law).
//   Largest current for a rating P_rated used at a fraction d of it: I_max = √(d·P_rated / R).
//   Example (common practice, the trade's quick check): 0.1 Ω rated 2 W carries at most √(2/0.1) = √20 ≈ 4.47 A.
// Derating: using at most ~50–60 % of the rating at the hottest ambient is common practice; the part's datasheet
// derating curve governs. Units: amperes, ohms, watts.

/** Common practice: use at most half of a shunt's rated power at the hottest ambient. */
export const DEFAULT_SHUNT_DERATING = 0.5;

/** Power dissipated in a shunt carrying `current`, W. */
export function shuntLoss(current: number, shunt: number): number {
  return current * current * shunt;
}

/** Largest steady current a shunt may carry when used at `derating` (a fraction, 1 = full rating) of its rating, A. */
export function shuntMaxCurrent(shunt: number, ratingW: number, derating = 1): number {
  return Math.sqrt((derating * ratingW) / shunt);
}

/** Largest shunt resistance whose loss at `current` stays within `budgetW`, Ω. */
export function largestShuntForLoss(current: number, budgetW: number): number {
  return budgetW / (current * current);
}

/**
 * The largest loss a design lets its shunt take at the limit, W: `derating` × the rating, or the loss budget when
 * that is lower. One rule for the picker (which candidates it flags), the design (which it may pick) and the
 * Monte Carlo window of the shunt loss.
 */
export function shuntLossLimit(ratingW: number, derating: number, maxLossW?: number): { watts: number; from: 'derated rating' | 'loss budget' } {
  const derated = derating * ratingW;
  return maxLossW !== undefined && maxLossW < derated ? { watts: maxLossW, from: 'loss budget' } : { watts: derated, from: 'derated rating' };
}
