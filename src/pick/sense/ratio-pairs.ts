// The resistor pairs (numerator, denominator) from a list of standard values whose ratio comes closest to a target:
// the gain pair of an amplifier (RF/RG, R2/R1) or the legs of a threshold divider (RT1/RT2).
//
// Exact search by ratio ordering: for each denominator d, the numerators nearest target·d are the two values that
// bracket it (binary search in the ascending list). `errorOf` scores a pair; it must grow as the numerator moves
// away from target·d on either side (true of every gain and divider error), so the best pair for each d is one of
// the two bracketing values, and the best over all d is the global best. A brute force over all pairs agrees (test).

export interface RatioPair {
  numerator: number;
  denominator: number;
  /** Score from errorOf (0 = exact). */
  error: number;
}

/** Index of the first value ≥ x in an ascending list (values.length when none). */
function lowerBound(values: readonly number[], x: number): number {
  let lo = 0;
  let hi = values.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (values[mid]! < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * All pairs whose error is within `tieTolerance` of the best one, best first (errorOf returns a dimensionless
 * relative error, so 1e-9 separates true ties from rounding); equal ratios repeat in every
 * decade (1 k/2 k, 10 k/20 k), so ties are common and the caller chooses among them on other grounds.
 */
export function nearestRatioPairs(
  values: readonly number[],
  target: number,
  errorOf: (numerator: number, denominator: number) => number,
  tieTolerance = 1e-9,
): RatioPair[] {
  const bestPerDenominator: RatioPair[] = [];
  for (const denominator of values) {
    const i = lowerBound(values, target * denominator);
    let best: RatioPair | undefined;
    for (const j of [i - 1, i]) {
      if (j < 0 || j >= values.length) continue;
      const numerator = values[j]!;
      const error = errorOf(numerator, denominator);
      if (!best || error < best.error) best = { numerator, denominator, error };
    }
    if (best) bestPerDenominator.push(best);
  }
  if (bestPerDenominator.length === 0) return [];
  const least = Math.min(...bestPerDenominator.map((p) => p.error));
  const limit = least + tieTolerance;
  return bestPerDenominator.filter((p) => p.error <= limit).sort((a, b) => a.error - b.error);
}
