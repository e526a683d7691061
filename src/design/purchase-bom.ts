// The BOM a buyer imports (`design --bom FILE.csv`, and `bom` in `design --json`): each line of the design's BOM
// (src/design/bom.ts) with its tolerance letter, the power at the operating point and at worst case, the voltage
// across the part at worst case, and the smallest chip size from the table (src/design/chip-sizes.ts) that covers
// both.
//
// Worst case per part (an upper bound, not a vertex search of its own): the current through the part scales with
// the model output that drives it, so the part's operating-point current I is scaled by that output's worst-case
// maximum over its nominal value (the analysis's worst case over every tolerance end and temperature corner), and the
// part is taken at the top of its tolerance band:
//   I_wc = I · max(1, driver_wc_max / driver_nominal),  R_wc = R · (1 + tolerance),
//   V_wc = I_wc · R_wc,  P_wc = I_wc · V_wc = I_wc² · R_wc   (Ohm's and Joule's laws)
// The drivers: the feedback divider and the pot carry the divider current (dividerCurrent); the shunt and the
// difference amplifier's resistors the load current at the limit (ilimit); noninv's gain pair the amplifier output
// (ampOutput); the threshold divider its reference, which the model holds constant (no scaling). The current's
// and the resistance's maxima cannot both happen in one unit, so the bound is conservative. TCR is left out.
//
// A resistor network (design file `networks`) keeps one line per member, each naming its network and its ratio in
// the role; such a line gets no chip size (the network's per-element rating applies). `members` stays empty until a
// line stands for a whole package; a BOM line that gains `members` passes them through here unchanged.
import type { AnalysisResult } from '../analysis/result.js';
import { toleranceLetter } from '../units/index.js';
import type { BomLine } from './bom.js';
import { smallestChip, type ChipSizeTable } from './chip-sizes.js';
import { DESIGNATORS, legPartDesignators } from './schema.js';

export interface PurchaseBomLine {
  designator: string;
  /** The designators inside a network's package; empty for a single resistor. */
  members: string[];
  role: string;
  ohms: number;
  /** IEC 60062:2016 letter-and-digit code, e.g. "4K7". */
  code: string;
  series: string;
  tolerance: number;
  /** IEC 60062:2016 tolerance letter (F for ±1 %), or null when the tolerance has none. */
  toleranceLetter: string | null;
  tcrPerK: number;
  /** Power at the operating point (see powerAt), W. */
  powerW: number;
  powerAt: string;
  /** Upper bound of the power at worst case, W. */
  powerWorstCaseW: number;
  /** Upper bound of the voltage across the part at worst case, V. */
  voltageWorstCaseV: number;
  /** What the worst case was scaled by, in words. */
  worstCaseBasis: string;
  /** Power rating the design gives for the part, W, or null. */
  ratingW: number | null;
  /** Smallest chip size covering the worst-case power (derated) and voltage, or null (see chipSizeNote). */
  chipSize: string | null;
  /** Why there is no chip size: none in the table covers the part, or the part is not a chip resistor. */
  chipSizeNote: string | null;
}

/** Which model output drives each placed part's current. */
function driverOf(designator: string): string | undefined {
  if (designator === DESIGNATORS.pot || [DESIGNATORS.dividerTop, DESIGNATORS.dividerBottom].some((leg) => designator === leg || legPartDesignators(leg).includes(designator))) return 'dividerCurrent';
  if (designator === DESIGNATORS.shunt || (DESIGNATORS.diff as readonly string[]).includes(designator)) return 'ilimit';
  if (designator === DESIGNATORS.feedback || designator === DESIGNATORS.ground) return 'ampOutput';
  return undefined;
}

/** The scale from the operating point to the worst case, and the basis in words. */
function worstCaseScale(designator: string, result: AnalysisResult): { scale: number; basis: string } {
  const driver = driverOf(designator);
  const output = driver !== undefined ? result.outputs[driver] : undefined;
  if (!output || !(output.nominal > 0) || !Number.isFinite(output.worstCase.max)) {
    return { scale: 1, basis: 'current at the operating point (its source is held constant), part at the top of its tolerance' };
  }
  const scale = Math.max(1, output.worstCase.max / output.nominal);
  return { scale, basis: `current scaled by ${driver} worst-case maximum / nominal (×${scale.toPrecision(4)}), part at the top of its tolerance` };
}

export function purchaseBom(bom: BomLine[], result: AnalysisResult, chips: ChipSizeTable): PurchaseBomLine[] {
  return bom.map((line) => {
    const { scale, basis } = worstCaseScale(line.designator, result);
    const current = line.ohms > 0 ? Math.sqrt(line.powerW / line.ohms) * scale : 0;
    const ohmsHigh = line.ohms * (1 + line.tolerance);
    const voltage = current * ohmsHigh;
    const power = current * voltage;
    // The pot is a trimmer or panel part, not a chip resistor: the table does not apply to it.
    const isPot = line.designator === DESIGNATORS.pot;
    // A network member sits in the network's own package: its per-element rating applies, not a chip size.
    const chip = isPot || line.network !== undefined ? undefined : smallestChip(chips, power, voltage);
    const chipSizeNote = chip
      ? null
      : isPot
        ? "a potentiometer, not a chip resistor: choose one by its own rating"
        : line.network !== undefined
          ? `a member of the network ${line.network}: check the network's per-element power and voltage rating against these figures`
          : 'none in the table covers it';
    return {
      designator: line.designator,
      members: [...(line.members ?? [])],
      role: line.role,
      ohms: line.ohms,
      code: line.code,
      series: line.series,
      tolerance: line.tolerance,
      toleranceLetter: toleranceLetter(line.tolerance) ?? null,
      tcrPerK: line.tcrPerK,
      powerW: line.powerW,
      powerAt: line.powerAt,
      powerWorstCaseW: power,
      voltageWorstCaseV: voltage,
      worstCaseBasis: basis,
      ratingW: line.ratingW ?? null,
      chipSize: chip ? chip.size : null,
      chipSizeNote,
    };
  });
}
