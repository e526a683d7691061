// A current-limit threshold taken from a reference through its own two-resistor divider.
//   RT1: reference → threshold node;  RT2: threshold node → ground.
//   Vth = Vref · RT2 / (RT1 + RT2)   (unloaded divider; Ohm's law). The threshold pin's input current is taken
//   as negligible next to the divider current (keep the divider current ≫ the pin's bias current).
// Units: volts, ohms.

/** Threshold voltage produced by the divider. */
export function thresholdFromReference(vref: number, rt1: number, rt2: number): number {
  return (vref * rt2) / (rt1 + rt2);
}

/** The ratio RT1/RT2 that gives exactly `threshold` from `vref` (inverse of thresholdFromReference). */
export function thresholdDividerRatio(vref: number, threshold: number): number {
  return vref / threshold - 1;
}
