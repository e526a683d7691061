// The usual cautions a design's output carries, by application and by what the numbers show. They point the
// designer to the datasheets, local codes and licensed practice; trimfree computes spreads, it certifies nothing.
import { DEFAULT_SHUNT_DERATING } from '../circuits/shunt-power.js';
import { formatEngineering, formatPercent } from '../units/index.js';
import type { Application } from './schema.js';

export interface CautionFacts {
  application: Application | undefined;
  /** Highest nominal output, V (null for a current-only design: the output voltage is the load's, not set here). */
  voutMax: number | null;
  /** Shunt loss at the nominal limit, W; its rating and derating, and θ if given. */
  shuntLossW?: number;
  /** Highest shunt loss of the worst-case analysis (every band end, both ends of the temperature range), W. */
  shuntLossWorstW?: number;
  shuntRatingW?: number;
  /** Largest fraction of the shunt rating to use (with a shunt). */
  derating?: number;
  thermalResistanceKPerW?: number;
  temperatureMaxC: number;
}

export const GENERAL_CAUTION =
  'trimfree is a design aid: check every part against its datasheet, and follow local codes and licensed practice for anything connected to mains, batteries or people.';

/** Common practice: 60 V DC is the usual limit of extra-low voltage that is safe to touch in dry conditions (from memory; check the standard that applies to your product). */
const TOUCH_SAFE_DC_V = 60;

export function cautionsFor(facts: CautionFacts): string[] {
  const out: string[] = [];
  if (facts.application === 'charger') {
    out.push(
      "Lithium cells: the charge voltage window is the cell maker's, not trimfree's. Check the worst-case maximum output against the cell datasheet's maximum charge voltage per cell (commonly 4.20 V for lithium-ion, some chemistries differ), and keep an independent protection circuit (overvoltage, overcurrent, temperature) in the pack. Overcharging a lithium cell can cause fire.",
    );
  }
  if (facts.application === 'led') {
    out.push("LEDs: keep the worst-case maximum current below the LED datasheet's maximum forward current at the hottest ambient, after its thermal derating.");
  }
  if (facts.voutMax !== null && facts.voutMax > TOUCH_SAFE_DC_V) {
    out.push(`The output reaches ${formatEngineering(facts.voutMax, 'V')}, above about ${TOUCH_SAFE_DC_V} V DC: treat it as hazardous to touch (guarding, insulation, creepage) per the safety standard that applies.`);
  }
  if (facts.shuntLossW !== undefined) {
    // The heat is judged at the worst case: a unit at the top of the limit's spread dissipates that much.
    const loss = facts.shuntLossWorstW ?? facts.shuntLossW;
    let line =
      facts.shuntLossWorstW === undefined
        ? `Shunt: ${formatEngineering(loss, 'W')} at the nominal current limit`
        : `Shunt: up to ${formatEngineering(loss, 'W')} at the current limit (worst case over tolerances and temperature; ${formatEngineering(facts.shuntLossW, 'W')} nominal)`;
    if (facts.shuntRatingW !== undefined) {
      const share = loss / facts.shuntRatingW;
      line += ` is ${formatPercent(share, 0)} of its ${formatEngineering(facts.shuntRatingW, 'W')} rating (common practice: at most ${formatPercent(facts.derating ?? DEFAULT_SHUNT_DERATING, 0)} at the hottest ambient)`;
    } else {
      line += ' (no rating given: check the datasheet)';
    }
    if (facts.thermalResistanceKPerW !== undefined && facts.thermalResistanceKPerW > 0) {
      const rise = facts.thermalResistanceKPerW * loss;
      line += `; self-heating θ·P = ${rise.toFixed(1)} K above ambient, about ${(facts.temperatureMaxC + rise).toFixed(0)} °C at the hottest ambient`;
    }
    out.push(`${line}. A hot shunt drifts and heats its neighbours: follow the datasheet's derating curve and copper-area guidance.`);
  }
  out.push(GENERAL_CAUTION);
  return out;
}
