// The ambient temperatures at which each Monte Carlo unit is checked against its windows (a unit passes an output
// only if it is inside the window at every one of them). A unit's parts, TCRs and drifts are fixed; only the ambient
// moves. Resistor ratios with their TCRs are monotonic in temperature, but the product with the reference's tempco,
// the difference amplifier's common-mode term and the shunt's self-heating need not be, so the check is not left to
// the two ends alone: the range is sampled at evenly spaced points, ends included. Between two neighbouring points an
// output can bulge by at most f''·h²/8 (h the spacing), and f'' is second order in the coefficients (TCR × tempco,
// TCR², ~1e-8 per K²); test/unit-yield.test.ts measures the largest miss against a 129-point grid on every example.

/** Points over a range when nothing else is said: the ends and three between (spacing a quarter of the range). */
export const DEFAULT_AMBIENT_POINTS = 5;

/** The reference temperature of datasheet values, °C; added to the grid when inside the range (reports show it). */
const ROOM_C = 25;

/**
 * `points` evenly spaced temperatures from minC to maxC, plus 25 °C when the range holds it and it is not already
 * a point (ascending; one temperature when the range is a single one).
 */
export function ambientGrid(minC: number, maxC: number, points = DEFAULT_AMBIENT_POINTS): number[] {
  if (!(maxC > minC)) return [minC];
  const count = Math.max(2, Math.floor(points));
  const grid: number[] = [];
  for (let g = 0; g < count; g++) grid.push(g === count - 1 ? maxC : minC + ((maxC - minC) * g) / (count - 1));
  if (ROOM_C > minC && ROOM_C < maxC && !grid.includes(ROOM_C)) grid.push(ROOM_C);
  return grid.sort((a, b) => a - b);
}
