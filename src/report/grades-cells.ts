// Cells every grade report shares (terminal text, JSON, HTML tables): which outputs the grades are compared on,
// a grade's label and a relative cost as text.
import type { GradesRun } from '../design/grade-study.js';
import type { Grade } from '../design/grades.js';

/** The outputs with a spec window (the ones a unit must meet), in the analysis's order. */
export function specOutputs(run: GradesRun): string[] {
  const first = run.rows[0]!.result;
  return Object.values(first.outputs).filter((o) => o.spec !== undefined).map((o) => o.name);
}

/** "1% (50 ppm/K)": the grade and the TCR it comes with. */
export function gradeLabel(grade: Grade): string {
  return `${grade.name} (${Math.round(grade.tcrPerK * 1e6)} ppm/K)`;
}

/** A relative cost: whole numbers as they are, others to two decimals. */
export function costText(cost: number): string {
  return Number.isInteger(cost) ? String(cost) : cost.toFixed(2);
}
