// Resistor tolerance grades: the tolerance, the TCR a part of that grade usually comes with, the E-series it is
// usually sold in, and an illustrative relative cost.
//
// Tolerances are the IEC 60062:2016 letter-code grades J (5 %), F (1 %), D (0.5 %), B (0.1 %).
// The TCR and the series that go with each grade are common practice for thick-film (5 %, 1 %) and thin-film
// (0.5 %, 0.1 %) chip resistors, not a standard: a given part's datasheet rules.
// The relative costs are ILLUSTRATIVE only (a 5 % part costs 1); put your own supplier's prices in the design
// file's `costs` field.
import type { SeriesName } from '../series/load.js';

export interface Grade {
  /** Name as written in design files and reports: "5%", "1%", "0.5%", "0.1%". */
  name: GradeName;
  /** Relative tolerance as a fraction (0.01 for 1 %). */
  tolerance: number;
  /** Temperature coefficient usually sold with the grade, 1/K (common practice). */
  tcrPerK: number;
  /** E-series the grade is usually stocked in (common practice). */
  series: SeriesName;
  /** Relative cost per part (illustrative; 5 % = 1). */
  relativeCost: number;
  /** IEC 60062:2016 tolerance letter. */
  letter: string;
}

export const GRADE_NAMES = ['5%', '1%', '0.5%', '0.1%'] as const;
export type GradeName = (typeof GRADE_NAMES)[number];

/** Widest first. */
export const GRADES: readonly Grade[] = [
  { name: '5%', tolerance: 0.05, tcrPerK: 200e-6, series: 'E24', relativeCost: 1, letter: 'J' },
  { name: '1%', tolerance: 0.01, tcrPerK: 100e-6, series: 'E96', relativeCost: 1.2, letter: 'F' },
  { name: '0.5%', tolerance: 0.005, tcrPerK: 50e-6, series: 'E192', relativeCost: 3, letter: 'D' },
  { name: '0.1%', tolerance: 0.001, tcrPerK: 25e-6, series: 'E192', relativeCost: 8, letter: 'B' },
];

export const GRADES_SOURCE =
  'tolerances: IEC 60062:2016 letter codes J, F, D, B; TCR and series per grade: common practice; relative costs: illustrative';

export function gradeByName(name: GradeName): Grade {
  const grade = GRADES.find((g) => g.name === name);
  if (!grade) throw new Error(`no grade ${name}`); // unreachable for a GradeName
  return grade;
}

/** The grade whose tolerance equals `tolerance` (fraction), if it is one of the table's. */
export function gradeForTolerance(tolerance: number): Grade | undefined {
  return GRADES.find((g) => Math.abs(g.tolerance - tolerance) <= 1e-9);
}

/** Relative cost of each grade: the table's illustrative figures, overridden by a design file's `costs`. */
export function gradeCosts(overrides: { [K in GradeName]?: number | undefined } = {}): Record<GradeName, number> {
  const out = {} as Record<GradeName, number>;
  for (const g of GRADES) out[g.name] = overrides[g.name] ?? g.relativeCost;
  return out;
}
