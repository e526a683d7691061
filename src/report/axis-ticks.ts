// Axis ticks for the report's charts: round values (1, 2 or 5 times a power of ten apart) inside [low, high], the
// usual choice for a readable linear axis (common practice), and the significant digits that tell adjacent ticks
// apart.

export interface AxisTicks {
  /** Distance between ticks. */
  step: number;
  /** Tick values from low to high, each a whole multiple of step. */
  values: number[];
  /** Significant digits that show each tick exactly, in engineering notation. */
  digits: number;
}

/** Ticks with a 1-2-5 step giving about `target` ticks (at least two, at most 2·target + 1) in [low, high]. */
export function axisTicks(low: number, high: number, target = 6): AxisTicks {
  if (!Number.isFinite(low) || !Number.isFinite(high) || !(high > low)) throw new RangeError(`axisTicks: need finite low < high (${low}, ${high})`);
  const raw = (high - low) / Math.max(1, target);
  const decade = 10 ** Math.floor(Math.log10(raw));
  // The 1-2-5 sequence from below raw upwards; the first step at least raw, stepping back down while it leaves
  // fewer than two ticks inside the range (a short range straddling no round value).
  const candidates = [0.1, 0.2, 0.5, 1, 2, 5, 10].map((m) => m * decade);
  let index = candidates.findIndex((c) => c >= raw);
  let values = multiples(low, high, candidates[index]!);
  while (values.length < 2 && index > 0) {
    index -= 1;
    values = multiples(low, high, candidates[index]!);
  }
  const step = candidates[index]!;
  const largest = Math.max(...values.map((v) => Math.abs(v)), step);
  const digits = Math.min(7, Math.max(1, Math.floor(Math.log10(largest)) - Math.floor(Math.log10(step)) + 1));
  return { step, values, digits };
}

/** The whole multiples of step in [low, high], each rounded to the step's own decimals (0.1·3 → 0.3). */
function multiples(low: number, high: number, step: number): number[] {
  const decimals = Math.min(100, Math.max(0, -Math.floor(Math.log10(step))));
  const values: number[] = [];
  for (let k = Math.ceil(low / step); k * step <= high; k += 1) values.push(Number((k * step).toFixed(decimals)));
  return values;
}
