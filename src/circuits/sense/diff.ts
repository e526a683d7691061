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
//
// Unequal input currents: Ib is the mean of the two, Ios = Ib+ − Ib− their difference (the datasheet's offset
// current), so Ib+ = Ib + Ios/2 flows out of the + node through R3∥R4 and Ib− = Ib − Ios/2 through R2.
// The amplifier's own CMRR: its input offset moves by V+/CMRR with the common-mode voltage V+ at its inputs (the
// definition of CMRR as differential over common-mode gain, referred to the input; any op-amp text, from memory).
// With e = ±1/CMRR (the sign is unknown for a given unit) and V+ = k·Vp − Ib+·(R3∥R4), k = R4/(R3+R4), the output is
//   Vo = a·(1 + e)·Vp − (R2/R1)·Vn + (1 + R2/R1)·(Vos − (1 + e)·Ib+·(R3∥R4)) + Ib−·R2,   a = k·(1 + R2/R1)
// exactly (still linear in the load current, so the limit is found in closed form). e = Ios = 0 gives the form above.

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
  /** Bias current into each amplifier input (the mean of the two), A. */
  biasCurrent: number;
  /** Offset current Ios = Ib+ − Ib−, A (default 0). */
  offsetCurrent?: number;
  /** The amplifier's common-mode error e: its input offset moves by e·V+ (|e| = 1/CMRR as a ratio; default 0). */
  cmrrError?: number;
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

/** Output contribution of offset and input currents, independent of the load current. */
function offsetTerm(p: DiffSense): number {
  const sourceAtPlus = (p.r3 * p.r4) / (p.r3 + p.r4);
  const half = (p.offsetCurrent ?? 0) / 2;
  const cm = 1 + (p.cmrrError ?? 0);
  return (1 + p.r2 / p.r1) * (p.amplifierOffset - cm * (p.biasCurrent + half) * sourceAtPlus) + (p.biasCurrent - half) * p.r2;
}

/** Amplifier output for a load current (exact four-resistor transfer). */
export function diffOutput(p: DiffSense, current: number): number {
  const vp = p.commonMode + current * p.shunt;
  return plusGain(p) * (1 + (p.cmrrError ?? 0)) * vp - (p.r2 / p.r1) * p.commonMode + offsetTerm(p);
}

/** Load current at which the loop trips: solves diffOutput(I) + Vos_cmp = Vth for I. */
export function diffLimit(p: DiffSense): number {
  const a = plusGain(p) * (1 + (p.cmrrError ?? 0));
  const commonModeOut = (a - p.r2 / p.r1) * p.commonMode;
  return (p.threshold - p.compareOffset - commonModeOut - offsetTerm(p)) / (a * p.shunt);
}

/** Common-mode gain Vo/Vcm with no differential signal: (R4/(R3+R4))·(1 + R2/R1) − R2/R1. */
export function diffCommonModeGain(p: Pick<DiffSense, 'r1' | 'r2' | 'r3' | 'r4'>): number {
  return (p.r4 / (p.r3 + p.r4)) * (1 + p.r2 / p.r1) - p.r2 / p.r1;
}
