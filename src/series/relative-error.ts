// Relative error of a chosen value against its target, in percent: (chosen / target − 1) × 100.
// Positive means the chosen value is above the target.

export function relativeErrorPct(chosen: number, target: number): number {
  return (chosen / target - 1) * 100;
}
