// Resistor tolerance grades: the tolerance, the TCR a part of that grade usually comes with, the E-series it is
// usually sold in, and an illustrative relative cost.
//
// Tolerances are the IEC 60062:2016 letter-code grades resistors use (table of tolerance codes, from memory):
// L 0.01 %, P 0.02 %, W 0.05 %, B 0.1 %, C 0.25 %, D 0.5 %, F 1 %, G 2 %, J 5 %, K 10 %.
// The TCR and the series that go with each grade are common practice (from memory), not a standard: carbon and
// thick film at 10 %, 5 % (E12, E24), thick film at 2 %, 1 % (E48, E96), thin film from 0.5 % to 0.05 % (E192),
// thin film and metal foil at 0.02 %, 0.01 % (E192). A given part's datasheet rules.
// The relative costs are ILLUSTRATIVE only (a 5 % part costs 1); put your own supplier's prices in the design
// file's `costs` field.
import { InputError } from '../errors.js';
import { SERIES_NAMES, type SeriesName } from '../series/load.js';
import { seriesHolding } from '../series/orderable-series.js';
import { printableText } from '../user-text.js';

export interface Grade {
  /** Name as written in design files and reports: "5%", "1%", "0.5%", "0.1%". */
  name: GradeName;
  /** Relative tolerance as a fraction (0.01 for 1 %). */
  tolerance: number;
  /** Temperature coefficient usually sold with the grade, 1/K (common practice). */
  tcrPerK: number;
  /** E-series the grade is usually stocked in (common practice): the grade is sold in this series or a coarser one. */
  series: SeriesName;
  /** Relative cost per part (illustrative; 5 % = 1). */
  relativeCost: number;
  /** IEC 60062:2016 tolerance letter. */
  letter: string;
}

/** Every grade, widest first. */
export const GRADE_NAMES = ['10%', '5%', '2%', '1%', '0.5%', '0.25%', '0.1%', '0.05%', '0.02%', '0.01%'] as const;
export type GradeName = (typeof GRADE_NAMES)[number];

/** The grades compared when neither --grades nor the design file's resistors.grades says. */
export const DEFAULT_GRADE_NAMES: readonly GradeName[] = ['5%', '1%', '0.5%', '0.1%'];

/** Widest first. TCR and series: common practice (from memory); relative costs: illustrative. */
export const GRADES: readonly Grade[] = [
  { name: '10%', tolerance: 0.1, tcrPerK: 200e-6, series: 'E12', relativeCost: 1, letter: 'K' },
  { name: '5%', tolerance: 0.05, tcrPerK: 200e-6, series: 'E24', relativeCost: 1, letter: 'J' },
  { name: '2%', tolerance: 0.02, tcrPerK: 100e-6, series: 'E48', relativeCost: 1.1, letter: 'G' },
  { name: '1%', tolerance: 0.01, tcrPerK: 100e-6, series: 'E96', relativeCost: 1.2, letter: 'F' },
  { name: '0.5%', tolerance: 0.005, tcrPerK: 50e-6, series: 'E192', relativeCost: 3, letter: 'D' },
  { name: '0.25%', tolerance: 0.0025, tcrPerK: 25e-6, series: 'E192', relativeCost: 5, letter: 'C' },
  { name: '0.1%', tolerance: 0.001, tcrPerK: 25e-6, series: 'E192', relativeCost: 8, letter: 'B' },
  { name: '0.05%', tolerance: 0.0005, tcrPerK: 10e-6, series: 'E192', relativeCost: 15, letter: 'W' },
  { name: '0.02%', tolerance: 0.0002, tcrPerK: 5e-6, series: 'E192', relativeCost: 30, letter: 'P' },
  { name: '0.01%', tolerance: 0.0001, tcrPerK: 2e-6, series: 'E192', relativeCost: 60, letter: 'L' },
];

export const GRADES_SOURCE =
  'tolerances: IEC 60062:2016 letter codes J, F, D, B; TCR and series per grade: common practice; relative costs: illustrative';

/** The same note for any set of grades: names their letters. Equals GRADES_SOURCE for the default four. */
export function gradesSource(grades: readonly Grade[]): string {
  return `tolerances: IEC 60062:2016 letter codes ${grades.map((g) => g.letter).join(', ')}; TCR and series per grade: common practice; relative costs: illustrative`;
}

/**
 * Whether a grade is commonly sold at this value: the value is in the grade's series or a coarser one (a 5 % part
 * must be an E24, E12, E6 or E3 value; common practice). A value no IEC 60063 series holds (a shunt from the
 * shunt list, a custom value) is not restricted: the caller says so.
 */
export function gradeSoldAt(grade: Grade, ohms: number): boolean | 'non-standard' {
  const holding = seriesHolding(ohms);
  if (holding.length === 0) return 'non-standard';
  const limit = SERIES_NAMES.indexOf(grade.series);
  return holding.some((name) => SERIES_NAMES.indexOf(name) <= limit);
}

/**
 * A list of grades as typed on the command line ("5%,1%,0.1%"; spaces and IEC 60062 letters accepted), widest
 * first, without repeats. `where` names the option.
 */
export function parseGradeList(text: string, where: string): GradeName[] {
  const accepted = `a comma-separated list of ${GRADE_NAMES.join(', ')} (or their IEC 60062 letters ${GRADES.map((g) => g.letter).join(', ')})`;
  const items = text.split(',').map((item) => item.replace(/\s+/g, ''));
  const chosen = new Set<GradeName>();
  for (const item of items) {
    const grade = GRADES.find((g) => g.name === item || g.letter === item.toUpperCase());
    if (!grade) throw new InputError(where, item === '' ? `empty grade in ${JSON.stringify(printableText(text))}` : `no grade ${JSON.stringify(printableText(item))}`, accepted);
    chosen.add(grade.name);
  }
  return GRADES.filter((g) => chosen.has(g.name)).map((g) => g.name);
}

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
