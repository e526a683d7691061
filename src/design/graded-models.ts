// The supply's Model for any grade assignment of its gradable resistors, put together from parts rather than built
// from a graded copy of the spec each time (a build clones the spec and costs about a millisecond; the grade search
// asks for thousands of assignments). A grade changes only the bands of its resistor's own parts (the value's
// tolerance and, for a resistor, the TCR bound: graded-spec.ts), so the model of an assignment is the model with
// every resistor in the first candidate grade, with each resistor's own parts swapped for those of a model built
// with that resistor alone in its grade. Built once: one model per resistor and grade. Where a graded model's parts
// do not line up with the base model's (another part list), every assignment is built in full instead.
// test/paired-grades.test.ts checks the put-together models against full builds, part for part.
import { gradedSpec, type GradableResistor, type ResistorGrade } from '../analysis/graded-spec.js';
import type { Model } from '../analysis/model.js';
import { buildSupplyModel, type SupplySpec } from '../analysis/models/supply.js';
import type { Part } from '../tolerance/part.js';
import type { Grade } from './grades.js';

export interface GradedModels {
  /** The model with resistor i in grades[i] (a Grade from the candidates given at construction). */
  modelFor(grades: readonly Grade[]): Model;
  /** Model builds made so far (base and per-grade models included). */
  builds(): number;
}

function gradeOf(grade: Grade): ResistorGrade {
  return { tolerance: grade.tolerance, tcrPerK: grade.tcrPerK };
}

/** The spec with resistor i in grades[i]. */
export function specWithGrades(spec: SupplySpec, resistors: readonly GradableResistor[], grades: readonly Grade[]): SupplySpec {
  const map: Record<string, ResistorGrade> = {};
  resistors.forEach((r, i) => {
    map[r.name] = gradeOf(grades[i]!);
  });
  return gradedSpec(spec, map);
}

export function gradedModels(spec: SupplySpec, resistors: readonly GradableResistor[], candidates: readonly Grade[]): GradedModels {
  let builds = 0;
  const build = (grades: readonly Grade[]): Model => {
    builds += 1;
    return buildSupplyModel(specWithGrades(spec, resistors, grades));
  };
  const baseGrade = candidates[0];
  if (baseGrade === undefined || resistors.length === 0) return { modelFor: build, builds: () => builds };
  const baseGrades = resistors.map(() => baseGrade);
  const base = build(baseGrades);
  const same = (a: Part, b: Part): boolean => JSON.stringify(a) === JSON.stringify(b);
  // swaps[i].get(grade name): the parts (index, part) in which resistor i in that grade differs from the base model.
  const swaps: Array<Map<string, Array<[number, Part]>>> = [];
  let composable = true;
  for (let i = 0; i < resistors.length && composable; i++) {
    const byGrade = new Map<string, Array<[number, Part]>>();
    for (const grade of candidates) {
      if (grade === baseGrade) {
        byGrade.set(grade.name, []);
        continue;
      }
      const grades = baseGrades.slice();
      grades[i] = grade;
      const model = build(grades);
      if (model.parts.length !== base.parts.length || model.parts.some((p, j) => p.name !== base.parts[j]!.name)) {
        composable = false;
        break;
      }
      byGrade.set(
        grade.name,
        model.parts.flatMap((p, j): Array<[number, Part]> => (same(p, base.parts[j]!) ? [] : [[j, p]])),
      );
    }
    swaps.push(byGrade);
  }
  if (!composable) return { modelFor: build, builds: () => builds };
  return {
    modelFor(grades) {
      const parts = base.parts.slice();
      grades.forEach((grade, i) => {
        const swap = swaps[i]!.get(grade.name);
        if (swap === undefined) throw new Error(`graded models: grade ${grade.name} was not among the candidates`);
        for (const [j, part] of swap) parts[j] = part;
      });
      return { ...base, parts };
    },
    builds: () => builds,
  };
}
