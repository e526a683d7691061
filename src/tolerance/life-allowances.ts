// Drift allowances: how far a part may move from its as-built value over its life, as named ± bands, each its own
// uncertain quantity (so worst case, RSS and the contributions name it). Three are named, after the endurance and
// environmental tests resistor datasheets quote their stability for:
//   load life    ΔR/R after long operation at rated power (datasheets quote e.g. 1000 h at 70 °C)
//   damp heat    ΔR/R after steady-state damp heat (humidity, no load)
//   soldering    ΔR/R from the heat of soldering (reflow or wave)
// A design analysed "as built" leaves every allowance out; "end of life" adds them. The allowances multiply the
// part's value: R·(1 + d_load life)·(1 + d_damp heat)·(1 + d_soldering).
//
// DEFAULTS BY GRADE: common practice (from memory), NOT a standard and not any maker's figures. They are of the order
// thick-film chips (10 %…1 %), thin film (0.5 %…0.05 %) and metal foil (0.02 %, 0.01 %) datasheets quote. Replace
// them with your datasheet's figures (resistors.drift, or per part in resistors.overrides).
import type { DistributionSpec } from './part.js';

export const ALLOWANCE_NAMES = ['load life', 'damp heat', 'soldering'] as const;
export type AllowanceName = (typeof ALLOWANCE_NAMES)[number];

/** One named drift allowance: a relative ± band (fraction) with the distribution the drift spreads with inside it. */
export interface AllowanceSpec {
  name: AllowanceName;
  /** Half-width of the band, a fraction (0.001 for ±0.1 %). */
  band: number;
  /** Default uniform (nothing is known of where inside the band a unit ends up: common practice). */
  distribution?: DistributionSpec;
}

/** The analysis condition: as built (no drift allowances) or at the end of the parts' life (with them). */
export const LIFE_CONDITIONS = ['as-built', 'end-of-life'] as const;
export type LifeCondition = (typeof LIFE_CONDITIONS)[number];

/** The condition when neither the command line nor the design file says: as built. */
export const DEFAULT_LIFE_CONDITION: LifeCondition = 'as-built';

/** The condition of a choice that may name none. */
export function lifeConditionOr(condition: LifeCondition | undefined): LifeCondition {
  return condition ?? DEFAULT_LIFE_CONDITION;
}

/** The condition in a heading: "as built", "end of life". */
export const LIFE_CONDITION_SHORT: Record<LifeCondition, string> = { 'as-built': 'as built', 'end-of-life': 'end of life' };

/** What a report calls each condition. */
export const LIFE_CONDITION_LABEL: Record<LifeCondition, string> = {
  'as-built': 'as built (no drift allowances)',
  'end-of-life': 'end of life (tolerance plus drift allowances)',
};

/** Default allowances for a resistor of the grade with this tolerance (fraction): load life, damp heat, soldering. */
interface GradeAllowances {
  tolerance: number;
  loadLife: number;
  dampHeat: number;
  soldering: number;
}

/** Common practice (from memory): replace with your datasheet. Keyed by the grade's tolerance. */
export const DEFAULT_ALLOWANCES_BY_TOLERANCE: readonly GradeAllowances[] = [
  { tolerance: 0.1, loadLife: 0.02, dampHeat: 0.02, soldering: 0.01 },
  { tolerance: 0.05, loadLife: 0.01, dampHeat: 0.01, soldering: 0.005 },
  { tolerance: 0.02, loadLife: 0.01, dampHeat: 0.01, soldering: 0.005 },
  { tolerance: 0.01, loadLife: 0.01, dampHeat: 0.005, soldering: 0.0025 },
  { tolerance: 0.005, loadLife: 0.0025, dampHeat: 0.0025, soldering: 0.001 },
  { tolerance: 0.0025, loadLife: 0.001, dampHeat: 0.001, soldering: 0.0005 },
  { tolerance: 0.001, loadLife: 0.0005, dampHeat: 0.0005, soldering: 0.0002 },
  { tolerance: 0.0005, loadLife: 0.00025, dampHeat: 0.00025, soldering: 0.0001 },
  { tolerance: 0.0002, loadLife: 0.0001, dampHeat: 0.0001, soldering: 0.00005 },
  { tolerance: 0.0001, loadLife: 0.00005, dampHeat: 0.00005, soldering: 0.00002 },
];

export const DEFAULT_ALLOWANCES_SOURCE =
  'drift allowances per grade: common practice (from memory, of the order thick-film, thin-film and foil datasheets quote); replace with your datasheet';

/**
 * The default allowances of the grade whose tolerance equals `tolerance` (fraction), or null when no grade has it
 * (a custom tolerance, a potentiometer): the caller then says that no default applies.
 */
export function defaultAllowances(tolerance: number): AllowanceSpec[] | null {
  const row = DEFAULT_ALLOWANCES_BY_TOLERANCE.find((r) => Math.abs(r.tolerance - tolerance) <= 1e-12 + 1e-9 * r.tolerance);
  if (!row) return null;
  return [
    { name: 'load life', band: row.loadLife },
    { name: 'damp heat', band: row.dampHeat },
    { name: 'soldering', band: row.soldering },
  ];
}

/** The largest relative change the allowances allow: Π(1 + band) − 1 (every allowance at its upper end). */
export function allowancesUpper(allowances: readonly AllowanceSpec[]): number {
  let f = 1;
  for (const a of allowances) f *= 1 + a.band;
  return f - 1;
}
