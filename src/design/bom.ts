// The bill of materials of a resolved design: every placed resistor with its value, IEC 60062 code, series,
// tolerance, TCR, and the power it must handle at the operating point (and its rating where the design gives one).
// Operating points (Joule's law P = I²R throughout):
//   feedback divider  at the nominal output: I_bottom = Vref/RBOT, I_top = I_bottom + Ifb (Kirchhoff's current law)
//   shunt             at the nominal current limit: P = I_limit²·RS
//   noninv RF, RG     in series from the amplifier output Vo (at the limit) to ground: I = Vo/(RF + RG)
//   diff R1, R2       I = (Vcm − V₋)/R1 with V₋ = V₊ = Vp·R4/(R3 + R4), Vp = Vcm + I_limit·RS (ideal op amp)
//   diff R3, R4       I = Vp/(R3 + R4)
//   threshold RT1/RT2 I = Vsource/(RT1 + RT2)
// Bias currents and offsets change these by far less than a part's rating margin and are left out.
import { orderableSeries } from '../series/orderable-series.js';
import { formatRkm } from '../units/index.js';

export interface BomLine {
  designator: string;
  /** What the part does, e.g. "feedback divider, top". */
  role: string;
  ohms: number;
  /** IEC 60062:2016 letter-and-digit code, e.g. "4K7". */
  code: string;
  /** Series to order from (smallest that holds the value and is sold at its tolerance), 'shunt', or 'non-standard'. */
  series: string;
  tolerance: number;
  tcrPerK: number;
  /** Power the part dissipates at the operating point, W. */
  powerW: number;
  /** Power rating the design gives for the part, W (undefined: not given; check the part's datasheet). */
  ratingW?: number;
  /** The operating point the power is taken at. */
  powerAt: string;
  /** A resistor network's designators, for a line standing for the whole package. Not filled yet: a network's
   * members keep a line each (their values and powers differ), each naming its network in `network`. */
  members?: string[];
  /** The network (design file `networks`) this resistor is a member of: bought as part of that package. */
  network?: string;
}

export interface BomPart {
  designator: string;
  role: string;
  ohms: number;
  tolerance: number;
  tcrPerK: number;
  powerW: number;
  powerAt: string;
  ratingW?: number | undefined;
  shunt?: boolean;
  network?: string;
}

export function bomLine(part: BomPart): BomLine {
  const line: BomLine = {
    designator: part.designator,
    role: part.role,
    ohms: part.ohms,
    code: formatRkm(part.ohms),
    series: part.shunt ? 'shunt' : (orderableSeries(part.ohms, part.tolerance) ?? 'non-standard'),
    tolerance: part.tolerance,
    tcrPerK: part.tcrPerK,
    powerW: part.powerW,
    powerAt: part.powerAt,
  };
  if (part.ratingW !== undefined) line.ratingW = part.ratingW;
  if (part.network !== undefined) line.network = part.network;
  return line;
}

// ---- operating-point currents (amperes) ----------------------------------------------------------------------

/** Feedback divider at the output it sets: currents in the bottom and top legs. */
export function dividerCurrents(vref: number, bottomOhms: number, ifb: number): { bottom: number; top: number } {
  const bottom = vref / bottomOhms;
  return { bottom, top: bottom + ifb };
}

/** noninv: current in RF and RG (in series from the amplifier output to ground). */
export function noninvGainCurrent(ampOutput: number, rf: number, rg: number): number {
  return ampOutput / (rf + rg);
}

/** diff: currents in the R1–R2 branch and the R3–R4 branch at load current `current`. */
export function diffBranchCurrents(
  r: { r1: number; r3: number; r4: number },
  shunt: number,
  commonMode: number,
  current: number,
): { r1r2: number; r3r4: number } {
  const vp = commonMode + current * shunt;
  const r3r4 = vp / (r.r3 + r.r4);
  const vMinus = r3r4 * r.r4;
  return { r1r2: (commonMode - vMinus) / r.r1, r3r4 };
}

/** Power in a resistor carrying `current`, P = I²R. */
export function resistorPower(current: number, ohms: number): number {
  return current * current * ohms;
}
