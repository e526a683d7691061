// The yield a build is expected to give, from the model's trials moved to the measured mean and widened to the
// measured spread where that is larger: y' = target + (y − ȳ)·scale, counted inside the spec window (lo ≤ y' ≤ hi,
// the engine's yield test). The shape of the predicted distribution is kept; only its centre and width follow the
// measurements.

export function projectedYieldPct(trials: Float64Array, targetMean: number, scale: number, window: [number, number]): number {
  const n = trials.length;
  let sum = 0;
  for (let j = 0; j < n; j++) sum += trials[j]!;
  const mean = sum / n;
  let inside = 0;
  for (let j = 0; j < n; j++) {
    const y = targetMean + (trials[j]! - mean) * scale;
    if (y >= window[0] && y <= window[1]) inside++;
  }
  return (100 * inside) / n;
}
