// Current limit, `noninv` topology: a low-side shunt into a non-inverting amplifier of gain G = 1 + RF/RG,
// whose output is compared with a threshold.
//
// Amplifier output (ideal op amp plus input offset and bias current; textbook non-inverting stage):
//   Vo = G·(I·Rs + Vos) + Ib·RF
// Vos is the amplifier's input offset (in series with the non-inverting input); Ib is the bias current flowing
// into the inverting input, which must come through RF from the output. The bias current of the non-inverting
// input flows through the shunt (milliohms) and is neglected.
// Trip: Vo + Vos_cmp = Vth, so I_limit = ((Vth − Vos_cmp − Ib·RF)/G − Vos)/Rs.
// With unequal input currents, Ib is their mean and Ios = Ib+ − Ib− their difference (the datasheet's offset
// current): the inverting input draws Ib− = Ib − Ios/2, which takes the place of Ib above.

export interface NoninvSense {
  shunt: number;
  /** Feedback resistor RF (output to inverting input), Ω. */
  feedback: number;
  /** Gain resistor RG (inverting input to ground), Ω. */
  ground: number;
  threshold: number;
  /** Amplifier input offset voltage, V. */
  amplifierOffset: number;
  /** Amplifier input bias current, the mean of the two inputs', A. */
  biasCurrent: number;
  /** Offset current Ios = Ib+ − Ib−, A (default 0): the inverting input draws Ib − Ios/2. */
  offsetCurrent?: number;
  compareOffset: number;
}

/** The current the inverting input draws through RF: Ib − Ios/2. */
function invertingCurrent(p: NoninvSense): number {
  return p.biasCurrent - (p.offsetCurrent ?? 0) / 2;
}

export function noninvGain(feedback: number, ground: number): number {
  return 1 + feedback / ground;
}

/** Amplifier output for a load current. */
export function noninvOutput(p: NoninvSense, current: number): number {
  return noninvGain(p.feedback, p.ground) * (current * p.shunt + p.amplifierOffset) + invertingCurrent(p) * p.feedback;
}

/** Load current at which the loop trips. */
export function noninvLimit(p: NoninvSense): number {
  const gain = noninvGain(p.feedback, p.ground);
  return ((p.threshold - p.compareOffset - invertingCurrent(p) * p.feedback) / gain - p.amplifierOffset) / p.shunt;
}
