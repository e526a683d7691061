// Feedback divider of a regulator that holds its feedback pin at Vref.
// Vout = Vref·(1 + Rtop/Rbottom) + Ifb·Rtop, Ifb the feedback-pin bias current, positive into the pin.
// Derivation (Kirchhoff's current law at the feedback node): the current in Rtop is Vref/Rbottom + Ifb,
// so Vout = Vref + Rtop·(Vref/Rbottom + Ifb). Units: volts, ohms, amperes.

/** Output voltage set by the divider. */
export function dividerVout(vref: number, rtop: number, rbottom: number, ifb: number): number {
  return vref + rtop * (vref / rbottom + ifb);
}

/** Top resistor that gives exactly `vout` with a given bottom resistor (inverse of dividerVout). */
export function dividerRtopFor(vref: number, vout: number, rbottom: number, ifb: number): number {
  return (vout - vref) / (vref / rbottom + ifb);
}

/** Current in the bottom resistor, Vref/Rbottom: the divider current the feedback-pin rule is judged on. */
export function dividerCurrent(vref: number, rbottom: number): number {
  return vref / rbottom;
}

/** Part of the output voltage due to the feedback-pin bias current: Ifb·Rtop. */
export function dividerBiasShift(rtop: number, ifb: number): number {
  return ifb * rtop;
}
