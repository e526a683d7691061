// Current limit, `direct` topology: the shunt voltage is compared straight with a threshold (no amplifier).
// The loop trips when I·Rs + Vos_cmp = Vth, so I_limit = (Vth − Vos_cmp)/Rs.
// Units: ohms, volts, amperes. Offsets are positive when they add to the sensed signal.

export interface DirectSense {
  /** Shunt resistance at its operating temperature, Ω. */
  shunt: number;
  /** Threshold the shunt voltage is compared with, V. */
  threshold: number;
  /** Offset of the comparing stage, referred to its input, V. */
  compareOffset: number;
}

/** Load current at which the loop trips. */
export function directLimit(p: DirectSense): number {
  return (p.threshold - p.compareOffset) / p.shunt;
}

/** Signal at the comparing stage's input for a load current (the shunt voltage). */
export function directSignal(p: DirectSense, current: number): number {
  return current * p.shunt;
}
