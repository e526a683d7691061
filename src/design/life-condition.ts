// The analysis condition applied to a resolved supply: "as built" leaves every drift out (tolerances, TCRs and
// tempcos only); "end of life" adds each part's named drift allowances (load life, damp heat, soldering) and the
// reference's drift. Where a resistor's allowances come from, most specific first:
//   resistors.overrides[designator].drift, its leg's override (RTOP for RTOP_A), the part's own section
//   (current.shunt.drift, voltage.pot.drift), resistors.drift, then its grade's defaults
//   (src/tolerance/life-allowances.ts: common practice, replace with your datasheet).
// A drift block given replaces the defaults as a whole: an allowance it leaves out is 0.
import type { ResistorSpec, SupplySpec } from '../analysis/models/supply.js';
import { DEFAULT_ALLOWANCES_SOURCE, defaultAllowances, type AllowanceSpec, type LifeCondition } from '../tolerance/life-allowances.js';
import { formatPercent } from '../units/index.js';
import type { DriftAllowancesInput } from './life-fields.js';
import { boundDistributionSpec } from './production-spread.js';
import { DESIGNATORS, type Design } from './schema.js';
import { legOf, specResistors } from '../analysis/spec-resistors.js';

/** What the design file says about drift, gathered once at resolve time (plain JSON). */
export interface LifePlan {
  /** analysis.condition, if the file gives one. */
  condition?: LifeCondition;
  /** Allowances given in the file, by designator (a leg's override is listed under each of its parts). */
  resistors: Record<string, AllowanceSpec[]>;
  /** resistors.drift: every fixed resistor without its own. */
  allResistors?: AllowanceSpec[];
  /** The fixed threshold's (current.threshold.drift). */
  threshold?: AllowanceSpec[];
  /** reference.drift: the regulator reference's drift allowance, a fraction. */
  referenceDrift?: number;
}

/** A design file's drift block as the engine's allowances (zero bands left out). */
export function allowancesOf(block: DriftAllowancesInput): AllowanceSpec[] {
  const distribution = boundDistributionSpec(block.distribution);
  const out: AllowanceSpec[] = [];
  const add = (name: AllowanceSpec['name'], band: number | undefined): void => {
    if (band === undefined || band === 0) return;
    out.push(distribution ? { name, band, distribution } : { name, band });
  };
  add('load life', block.loadLife);
  add('damp heat', block.dampHeat);
  add('soldering', block.soldering);
  return out;
}

/** Gathers the design file's drift fields for the resolved spec's parts. */
export function lifePlanOf(design: Design, spec: SupplySpec): LifePlan {
  const plan: LifePlan = { resistors: {} };
  if (design.analysis?.condition !== undefined) plan.condition = design.analysis.condition;
  if (design.reference?.drift) plan.referenceDrift = design.reference.drift;
  const overrides = design.resistors.overrides ?? {};
  if (design.resistors.drift) plan.allResistors = allowancesOf(design.resistors.drift);
  if (design.current?.threshold.drift) plan.threshold = allowancesOf(design.current.threshold.drift);
  for (const { r, kind } of specResistors(spec)) {
    const leg = legOf(r.name);
    const block =
      overrides[r.name]?.drift ??
      (leg !== undefined ? overrides[leg]?.drift : undefined) ??
      (kind === 'shunt' ? design.current?.shunt.drift : kind === 'potentiometer' ? design.voltage?.pot?.drift : undefined);
    if (block) plan.resistors[r.name] = allowancesOf(block);
  }
  return plan;
}

export interface ConditionedSpec {
  spec: SupplySpec;
  /** What the condition left out or added, and where defaults were taken, for the notes. */
  notes: string[];
}

/** A copy of `spec` for the condition. `plan` says what the file gave; grade defaults fill the rest at end of life. */
export function specForCondition(spec: SupplySpec, plan: LifePlan, condition: LifeCondition): ConditionedSpec {
  const out = structuredClone(spec);
  const notes: string[] = [];
  const references = [...(out.reference ? [out.reference] : []), ...(out.sense?.threshold.kind === 'divided' && out.sense.threshold.source !== 'regulator-reference' ? [out.sense.threshold.source] : [])];
  const resistors = specResistors(out);
  if (condition === 'as-built') {
    const dropped: string[] = [];
    for (const ref of references) {
      if (ref.drift) dropped.push(`${ref.name ?? 'Vref'} drift ±${formatPercent(ref.drift)}`);
      delete ref.drift;
    }
    for (const { r } of resistors) {
      if (r.drift) dropped.push(`${r.name} drift`);
      delete r.drift;
      delete r.allowances;
      delete r.allowancesFromGrade;
    }
    if (out.sense?.threshold.kind === 'fixed') delete out.sense.threshold.allowances;
    if (plan.referenceDrift) dropped.unshift(`reference.drift ±${formatPercent(plan.referenceDrift)}`);
    const given = dropped.length > 0 || Object.keys(plan.resistors).length > 0 || plan.allResistors !== undefined || plan.threshold !== undefined;
    notes.push(`Analysed as built: tolerances, TCRs and tempcos only, no drift allowances${given ? ` (those given${dropped.length > 0 ? `, e.g. ${dropped.join(', ')},` : ''} count at end of life)` : ''}; --condition end-of-life adds them.`);
    return { spec: out, notes };
  }

  if (plan.referenceDrift && out.reference) out.reference.drift = plan.referenceDrift;
  const fromGrade: string[] = [];
  const none: string[] = [];
  for (const { r, kind } of resistors) {
    const own = plan.resistors[r.name] ?? (kind === 'potentiometer' ? undefined : plan.allResistors);
    if (own) {
      setAllowances(r, own, false);
      continue;
    }
    const defaults = kind === 'potentiometer' ? null : defaultAllowances(r.tolerance);
    if (defaults) {
      setAllowances(r, defaults, true);
      fromGrade.push(r.name);
    } else none.push(r.name);
  }
  if (out.sense?.threshold.kind === 'fixed' && plan.threshold && plan.threshold.length > 0) out.sense.threshold.allowances = plan.threshold;
  notes.push('Analysed at end of life: each part\'s tolerance plus its drift allowances (load life, damp heat, soldering; each its own contributor) and the reference\'s drift.');
  if (fromGrade.length > 0) notes.push(`Drift allowances of ${fromGrade.join(', ')}: their grade's defaults (${DEFAULT_ALLOWANCES_SOURCE}).`);
  if (none.length > 0) {
    const pot = none.includes(DESIGNATORS.pot) ? ' (a pot usually drifts more than a fixed resistor: voltage.pot.drift)' : '';
    notes.push(`No drift allowance for ${none.join(', ')}: no grade default matches its tolerance and the file gives none${pot}.`);
  }
  if (out.sense?.threshold.kind === 'fixed' && !plan.threshold) notes.push('The fixed threshold has no drift allowance (current.threshold.drift); its tolerance alone is used.');
  return { spec: out, notes };
}

function setAllowances(r: ResistorSpec, allowances: AllowanceSpec[], fromGrade: boolean): void {
  if (allowances.length === 0) {
    delete r.allowances;
    delete r.allowancesFromGrade;
    return;
  }
  r.allowances = allowances.map((a) => ({ ...a }));
  if (fromGrade) r.allowancesFromGrade = true;
  else delete r.allowancesFromGrade;
}
