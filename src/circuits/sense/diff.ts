// Current limit, `diff` topology: a four-resistor difference amplifier across the shunt, low-side or high-side,
// whose output is compared with a threshold.
//
//   R1: shunt's load-side node (Vn = Vcm) → inverting input;  R2: inverting input → output
//   R3: shunt's supply-side node (Vp = Vcm + I·Rs) → non-inverting input;  R4: non-inverting input → ground
//
// Exact transfer of the ideal op amp with these four resistors (superposition; any analog-electronics text):
//   Vo = Vp·(R4/(R3+R4))·(1 + R2/R1) − Vn·(R2/R1)
// plus the amplifier's input offset Vos (at the non-inverting input) and equal bias currents Ib into both inputs:
//   + (1 + R2/R1)·(Vos − Ib·(R3∥R4)) + Ib·R2
// With R2/R1 = R4/R3 = G the common-mode term vanishes and Vo = G·I·Rs; any mismatch turns Vcm into error,
// which for high-side sensing (Vcm = the supply rail) is often the largest term.

export interface DiffSense {
  shunt: number;
  r1: number;
  r2: number;
  r3: number;
  r4: number;
  /** Voltage of the shunt's load-side node: 0 for low-side sensing, the rail for high-side, V. */
  commonMode: number;
  threshold: number;
  amplifierOffset: number;
  /** Bias current into each amplifier input, A. */
  biasCurrent: number;
  compareOffset: number;
}

/** Differential gain with matched ratios, R2/R1. */
export function diffNominalGain(r1: number, r2: number): number {
  return r2 / r1;
}

/** Gain from the shunt's supply-side node to the output: (R4/(R3+R4))·(1 + R2/R1). */
function plusGain(p: DiffSense): number {
  return (p.r4 / (p.r3 + p.r4)) * (1 + p.r2 / p.r1);
}

/** Output contribution of offset and bias currents, independent of the load current. */
function offsetTerm(p: DiffSense): number {
  const sourceAtPlus = (p.r3 * p.r4) / (p.r3 + p.r4);
  return (1 + p.r2 / p.r1) * (p.amplifierOffset - p.biasCurrent * sourceAtPlus) + p.biasCurrent * p.r2;
}

/** Amplifier output for a load current (exact four-resistor transfer). */
export function diffOutput(p: DiffSense, current: number): number {
  const vp = p.commonMode + current * p.shunt;
  return plusGain(p) * vp - (p.r2 / p.r1) * p.commonMode + offsetTerm(p);
}

/** Load current at which the loop trips: solves diffOutput(I) + Vos_cmp = Vth for I. */
export function diffLimit(p: DiffSense): number {
  const a = plusGain(p);
  const commonModeOut = (a - p.r2 / p.r1) * p.commonMode;
  return (p.threshold - p.compareOffset - commonModeOut - offsetTerm(p)) / (a * p.shunt);
}

/** Common-mode gain Vo/Vcm with no differential signal: (R4/(R3+R4))·(1 + R2/R1) − R2/R1. */
export function diffCommonModeGain(p: Pick<DiffSense, 'r1' | 'r2' | 'r3' | 'r4'>): number {
  return (p.r4 / (p.r3 + p.r4)) * (1 + p.r2 / p.r1) - p.r2 / p.r1;
}
