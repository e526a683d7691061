// The same supply with its resistors ordered in other tolerance grades: a copy of the SupplySpec with each named
// resistor's tolerance (and TCR, where the grade brings one) replaced. Nominal values, distributions, the reference,
// offsets and temperature stay as they are, so two graded copies differ only in the resistors' grades.
import { defaultAllowances } from '../tolerance/life-allowances.js';
import type { LegSpec, ResistorSpec, SupplySpec } from './models/supply.js';

export interface GradableResistor {
  /** Designator, as in the model's parts and the BOM. */
  name: string;
  /** Field path in the SupplySpec, for messages. */
  path: string;
  kind: 'resistor' | 'shunt';
  nominal: number;
  tolerance: number;
  tcrPerK?: number;
}

export interface ResistorGrade {
  tolerance: number;
  /** The grade's usual TCR; left out to keep the part's own (the shunt keeps its own: see gradedSpec). */
  tcrPerK?: number;
}

/** Every fixed resistor of the supply, in a stable order: divider legs, shunt, gain resistors, threshold divider. Potentiometers are left out (their track tolerance is not a resistor grade). */
export function supplyResistors(spec: SupplySpec): Array<{ path: string; kind: 'resistor' | 'shunt'; r: ResistorSpec }> {
  const out: Array<{ path: string; kind: 'resistor' | 'shunt'; r: ResistorSpec }> = [];
  const leg = (l: LegSpec, path: string): void => {
    l.resistors.forEach((r, i) => out.push({ path: `${path}.resistors[${i}]`, kind: 'resistor', r }));
  };
  if (spec.divider) {
    leg(spec.divider.top, 'supply.divider.top');
    leg(spec.divider.bottom, 'supply.divider.bottom');
  }
  const sense = spec.sense;
  if (sense) {
    out.push({ path: 'supply.sense.shunt', kind: 'shunt', r: sense.shunt });
    if (sense.topology === 'noninv') {
      out.push({ path: 'supply.sense.rf', kind: 'resistor', r: sense.rf }, { path: 'supply.sense.rg', kind: 'resistor', r: sense.rg });
    } else if (sense.topology === 'diff') {
      for (const key of ['r1', 'r2', 'r3', 'r4'] as const) out.push({ path: `supply.sense.${key}`, kind: 'resistor', r: sense[key] });
    }
    if (sense.threshold.kind === 'divided') {
      out.push({ path: 'supply.sense.threshold.top', kind: 'resistor', r: sense.threshold.top }, { path: 'supply.sense.threshold.bottom', kind: 'resistor', r: sense.threshold.bottom });
    }
  }
  return out;
}

/** The resistors a grade applies to: every fixed resistor but a network's members (a network is bought at its own figures). */
function resistorsOf(spec: SupplySpec): Array<{ path: string; kind: 'resistor' | 'shunt'; r: ResistorSpec }> {
  const members = new Set((spec.networks ?? []).flatMap((n) => n.members));
  return supplyResistors(spec).filter(({ r }) => !members.has(r.name));
}

export function gradableResistors(spec: SupplySpec): GradableResistor[] {
  return resistorsOf(spec).map(({ path, kind, r }) => {
    const g: GradableResistor = { name: r.name, path, kind, nominal: r.nominal, tolerance: r.tolerance };
    if (r.tcrPerK !== undefined) g.tcrPerK = r.tcrPerK;
    return g;
  });
}

/**
 * A copy of `spec` with each resistor named in `grades` given that grade's tolerance and TCR. A shunt takes the
 * grade's tolerance but keeps its own TCR: chip-resistor TCR grades do not describe metal-element shunts.
 * Unknown names are an error (a caller bug, not user input).
 */
export function gradedSpec(spec: SupplySpec, grades: Record<string, ResistorGrade>): SupplySpec {
  const copy = structuredClone(spec);
  const known = new Set<string>();
  for (const { kind, r } of resistorsOf(copy)) {
    known.add(r.name);
    const grade = grades[r.name];
    if (!grade) continue;
    r.tolerance = grade.tolerance;
    if (kind === 'resistor' && grade.tcrPerK !== undefined) r.tcrPerK = grade.tcrPerK;
    // Drift allowances that were the old grade's defaults become the new grade's (life-allowances.ts).
    if (r.allowancesFromGrade) {
      const allowances = defaultAllowances(grade.tolerance);
      if (allowances) r.allowances = allowances;
      else delete r.allowances;
    }
  }
  for (const name of Object.keys(grades)) {
    if (!known.has(name)) throw new Error(`gradedSpec: the supply has no resistor named ${name}`);
  }
  return copy;
}
