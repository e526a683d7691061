// A validated design → everything the engine and the report need: "auto" values filled by the pickers, grades and
// per-designator overrides applied, the engine's SupplySpec, the BOM with the power each part handles, and notes
// and cautions for the designer.
import { nominalOutputs } from '../analysis/model.js';
import { buildSupplyModel, type SupplySpec } from '../analysis/models/supply.js';
import { worstCase } from '../analysis/worst-case.js';
import { OVERLOAD_FACTOR } from '../pick/sense/evaluate.js';
import { ImpossibleError } from '../errors.js';
import { describeCurrentBand, formatEngineering, formatPercent } from '../units/index.js';
import { bomLine, diffBranchCurrents, noninvGainCurrent, resistorPower, type BomLine, type BomPart } from './bom.js';
import { cautionsFor } from './cautions.js';
import type { OutputCautionLimits } from './output-cautions.js';
import { windowBounds } from './fields.js';
import { GRADE_NAMES, gradeCosts, type GradeName } from './grades.js';
import { feedbackBias, resolveDivider } from './resolve-divider.js';
import { pickerCommonMode, resolveSense, thresholdReference } from './resolve-sense.js';
import { resolveNetworks } from './resolve-networks.js';
import { DESIGNATORS, hasCurrentLoop, hasVoltageLoop, type CurrentDesign, type Design, type VoltageDesign } from './schema.js';
import { lifePlanOf, type LifePlan } from './life-condition.js';
import { withProductionSpread } from './production-spread.js';

export interface ResolvedDesign {
  /** The engine's input, as built (no drift allowances: resolvedForCondition adds them): at the top of the range for an adjustable output. */
  spec: SupplySpec;
  /** Adjustable output only: the same supply with the pot at the bottom of its travel (vout window [0, LO]). */
  lowEnd?: SupplySpec;
  bom: BomLine[];
  /** How values were picked, assumptions made. */
  notes: string[];
  /** Safety cautions for this kind of supply. */
  cautions: string[];
  /** Nominal outputs of the resolved design (all parts nominal). */
  nominal: Record<string, number>;
  /** Relative cost of each grade (the file's, else the illustrative defaults). */
  costs: Record<GradeName, number>;
  /** The grades the design file allows (resistors.grades), widest first; absent: the default four. */
  allowedGrades?: GradeName[];
  analysis: { trials?: number | 'auto'; seed?: number; workers?: number };
  /** What the file says about drift (life-condition.ts): the analysis condition picks the spec from it (absent: nothing). */
  life?: LifePlan;
  /** The file's lot structure (lots), for the lot study. */
  lots?: NonNullable<Design['lots']>;
  /** Limits no part choice can fix (e.g. a window narrower than the reference alone allows), stated in the output. */
  limits?: string[];
  /** What the analysed figures are checked against in the caution box (output-cautions.ts). */
  cautionLimits: OutputCautionLimits;
}

/** Monte Carlo seed when neither the file nor the command line gives one. */
export const DEFAULT_SEED = 1;

export function resolveDesign(design: Design): ResolvedDesign {
  const notes: string[] = [];
  // A single-loop design has one of the two sections (schema.ts requires at least one): no dummy section is made up.
  const vDesign = hasVoltageLoop(design) ? design : null;
  const cDesign = hasCurrentLoop(design) ? design : null;
  const [lo, hi] = vDesign ? vDesign.voltage.target : [0, 0];
  const adjustable = lo !== hi;
  if (vDesign && !(lo > vDesign.reference.voltage)) {
    const vref = vDesign.reference.voltage;
    throw new ImpossibleError(
      'voltage.target',
      `${formatEngineering(lo, 'V', 4)} is at or below the reference ${formatEngineering(vref, 'V', 4)}: a feedback divider cannot set an output below Vref`,
      'ask for an output above Vref, or use a regulator with a lower reference',
    );
  }
  if (!vDesign) notes.push('Current-only design (no voltage section): no output divider, so vout and dividerCurrent are not analysed.');
  if (!cDesign) notes.push('Voltage-only design (no current section): no current limit, so ilimit, shuntLoss and ampOutput are not analysed.');

  const divider = vDesign ? resolveDivider(vDesign) : null;
  if (divider) notes.push(...divider.notes);
  const sense = cDesign ? resolveSense(cDesign) : null;
  if (sense) notes.push(...sense.notes);

  const temperature = operatingRange(design.temperature);
  if (!design.temperature) notes.push('No temperature range given: analysed at 25 °C only, so TCRs and drifts with temperature play no part.');
  else if (design.temperature.fixed !== undefined) notes.push(`One ambient given: every figure is at ${design.temperature.fixed} °C, where TCRs and tempcos act through the ${design.temperature.fixed - 25} K from 25 °C (give min and max to check units over a range).`);
  const bias = vDesign ? feedbackBias(vDesign) : { nominal: 0, plusMinus: 0 };
  // What the bias-current notation was taken to mean (src/units/current-band.ts), said back to the designer.
  if (vDesign?.voltage.feedbackBias) notes.push(`Feedback-pin bias current Ifb (voltage.feedbackBias): ${describeCurrentBand(vDesign.voltage.feedbackBias)}.`);
  const ib = cDesign?.current.amplifier?.biasCurrent;
  if (ib && cDesign!.current.topology !== 'direct') notes.push(`Amplifier bias current Ib (current.amplifier.biasCurrent): ${describeCurrentBand(ib)}.`);

  let reference: SupplySpec['reference'] | undefined;
  // The regulator's reference: the divider's, and the threshold divider's too when it is fed from it ("regulator").
  if (design.reference && (vDesign || cDesign?.current.threshold.reference === 'regulator')) {
    const r = design.reference;
    reference = { name: 'Vref', nominal: r.voltage, tolerance: r.tolerance };
    // reference.drift is a drift allowance: the spec is as built, and life-condition.ts adds it at end of life.
    if (r.tempco) reference.tempcoPerK = r.tempco;
  }

  const ilimitWindow = cDesign ? windowBounds(cDesign.current.window, cDesign.current.target) : undefined;
  // An adjustable output is judged at both ends of the pot's travel: every unit must reach HI at the top and LO at
  // the bottom. Without a window from the file, each end's window runs out to that end's worst case, so the yield
  // counts exactly the units that fail to cover the range (Cp and Cpk then mean little: the notes say so).
  let voutWindow: [number, number] | undefined = vDesign ? (adjustable ? [hi, hi] : windowBounds(vDesign.voltage.window!, lo)) : undefined;
  let lowWindow: [number, number] = [lo, lo];
  if (vDesign && divider && adjustable) {
    const reach = (legs: Pick<NonNullable<SupplySpec['divider']>, 'top' | 'bottom'>): { min: number; max: number } => {
      const result = worstCase(buildSupplyModel(base(legs, [0, 1]))).find((w) => w.name === 'vout')!;
      return { min: result.min, max: result.max };
    };
    const top = reach(divider.legs);
    const bottom = reach(divider.lowLegs!);
    voutWindow = vDesign.voltage.window ? windowBounds(vDesign.voltage.window, hi) : [hi, Math.max(top.max, hi) * (1 + 1e-9)];
    lowWindow = [Math.min(bottom.min, lo) * (1 - 1e-9), lo];
    notes.push(
      `Adjustable output: vout is analysed at the top of the pot's travel against ${formatEngineering(voutWindow[0], 'V', 4)}..${formatEngineering(voutWindow[1], 'V', 4)}${vDesign.voltage.window ? '' : ' (up to its worst case: the file gives no upper limit)'} and at the bottom against ${formatEngineering(lowWindow[0], 'V', 4)}..${formatEngineering(lowWindow[1], 'V', 4)}; the yield is the share of units covering ${formatEngineering(lo, 'V', 4)}..${formatEngineering(hi, 'V', 4)}; where only one limit is the design's, Cpk is the one-sided Cpl or Cpu and no Cp is given.`,
    );
  }

  function base(legs: Pick<NonNullable<SupplySpec['divider']>, 'top' | 'bottom'> | null, window: [number, number] | undefined, voutSides: 'both' | 'low' | 'high' = 'both'): SupplySpec {
    const windows: NonNullable<SupplySpec['windows']> = {};
    if (window) windows.vout = window;
    if (ilimitWindow) windows.ilimit = ilimitWindow;
    if (voutSides !== 'both') windows.voutSides = voutSides;
    const spec: SupplySpec = {
      temperature: { minC: temperature.min, maxC: temperature.max, monteCarlo: 'uniform' },
      windows,
    };
    if (reference) spec.reference = reference;
    if (legs) spec.divider = { ...legs, ...(bias.nominal !== 0 || bias.plusMinus > 0 ? { feedbackBias: bias } : {}) };
    if (sense) spec.sense = sense.sense;
    if (vDesign) spec.voutTarget = adjustable ? hi : lo;
    return spec;
  }
  // Without a window from the file only the limit each end must reach is the design's: HI at the top, LO at the bottom.
  // The file's production distributions (binned resistors, the reference's, offsets' and bias currents') on both ends.
  const spec = withProductionSpread(base(divider ? divider.legs : null, voutWindow, adjustable && !vDesign?.voltage.window ? 'low' : 'both'), design);
  const lowEnd = divider?.lowLegs ? withProductionSpread({ ...base(divider.lowLegs, lowWindow, 'high'), voutTarget: lo }, design) : undefined;
  // Resistor networks: members take the network's figures (resolve-networks.ts), in both ends of an adjustable output.
  const networks = resolveNetworks(design, spec);
  if (networks.networks.length > 0) {
    spec.networks = networks.networks;
    if (lowEnd) lowEnd.networks = resolveNetworks(design, lowEnd).networks;
    notes.push(...networks.notes);
  }

  const nominal = nominalOutputs(buildSupplyModel(spec));
  const limits: string[] = [];
  if (cDesign && sense) {
    checkOperatingPoint(cDesign, nominal, sense.derating);
    checkShuntSignal(cDesign, nominal, sense.parts[DESIGNATORS.shunt]!);
    checkSelfHeating(cDesign, nominal, sense.grades[DESIGNATORS.shunt]!.tcrPerK);
  }
  if (vDesign) checkWindowAgainstReference(vDesign, voutWindow!, adjustable ? hi : lo, limits);

  const bomParts: BomPart[] = [...(divider?.bomParts ?? []), ...(cDesign && sense ? senseBomParts(cDesign, sense.parts, sense.grades, nominal) : [])];
  for (const part of bomParts) {
    const network = spec.networks?.find((n) => n.name === networks.memberOf[part.designator]);
    if (!network) continue;
    part.tolerance = network.tolerance;
    part.tcrPerK = network.tcrPerK ?? part.tcrPerK;
    part.network = network.name;
    part.role = `${part.role}; in network ${network.name} (${network.members.join(', ')}), ratio ±${formatPercent(network.ratio)}`;
  }
  const bom = bomParts.map(bomLine);
  const notFinite = [...Object.entries(nominal), ...bom.map((l) => [`${l.designator} power`, l.powerW] as const)].find(([, v]) => !Number.isFinite(v));
  if (notFinite) {
    throw new ImpossibleError('design', `the ${notFinite[0]} of this design is not a finite number`, 'check the values for extremes (a resistance near zero, a threshold at an offset)');
  }
  for (const grade of [...(divider?.grades ?? []), ...Object.values(sense?.grades ?? {})]) {
    if (grade.tcrAssumed && !notes.includes(grade.tcrAssumed)) notes.push(grade.tcrAssumed);
  }

  // The shunt-heat caution takes the worst-case loss (every band end, both ends of the temperature range).
  const shuntFacts = cDesign && sense
    ? {
        shuntLossW: nominal['shuntLoss']!,
        shuntLossWorstW: worstShuntLoss(spec),
        derating: sense.derating,
        ...(cDesign.current.shunt.rating !== undefined ? { shuntRatingW: cDesign.current.shunt.rating } : {}),
        ...(cDesign.current.shunt.thermalResistance !== undefined ? { thermalResistanceKPerW: cDesign.current.shunt.thermalResistance } : {}),
      }
    : {};
  const voutMax = vDesign ? Math.max(hi, nominal['vout']!) : null;
  const cautions = cautionsFor({ application: design.application, voutMax, temperatureMaxC: temperature.max, ...shuntFacts });

  const analysis: ResolvedDesign['analysis'] = {};
  if (design.analysis?.trials !== undefined) analysis.trials = design.analysis.trials;
  if (design.analysis?.seed !== undefined) analysis.seed = design.analysis.seed;
  if (design.analysis?.workers !== undefined) analysis.workers = design.analysis.workers;

  const cautionLimits: OutputCautionLimits = { application: design.application, voutWindow: vDesign?.voltage.window ? voutWindow! : null };
  if (vDesign?.voltage.absoluteMax !== undefined) cautionLimits.voutAbsoluteMax = vDesign.voltage.absoluteMax;
  const resolved: ResolvedDesign = { spec, bom, notes, cautions, nominal, costs: gradeCosts(design.costs ?? {}), analysis, cautionLimits, life: lifePlanOf(design, spec) };
  if (design.lots) resolved.lots = design.lots;
  if (design.resistors.grades) resolved.allowedGrades = GRADE_NAMES.filter((g) => design.resistors.grades!.includes(g));
  if (lowEnd) resolved.lowEnd = lowEnd;
  if (limits.length > 0) {
    resolved.limits = limits;
    notes.push(...limits);
  }
  return resolved;
}

/**
 * The highest shunt loss of the worst-case analysis. The divider's resistors and Ifb never enter the sense path, so
 * they are held exact here: the same extreme, from far fewer vertices (2^14 rather than 2^19 for the charger example).
 */
function worstShuntLoss(spec: SupplySpec): number {
  const { divider, ...senseOnly }: SupplySpec = spec;
  // A network keeps its sense-path members; one left alone is its own band (its ResistorSpec carries the network's
  // tolerance and TCR, resolve-networks.ts), which is exactly the set of values a single member can take.
  const dividerNames = new Set(divider ? [...divider.top.resistors, ...divider.bottom.resistors].map((r) => r.name) : []);
  const networks = (spec.networks ?? []).map((n) => ({ ...n, members: n.members.filter((m) => !dividerNames.has(m)) })).filter((n) => n.members.length >= 2);
  if (networks.length > 0) senseOnly.networks = networks;
  else delete senseOnly.networks;
  return worstCase(buildSupplyModel(senseOnly)).find((w) => w.name === 'shuntLoss')!.max;
}

/** Largest α·θ·P (the shunt's relative change from its own heat at the limit) the first-order self-heating model is
 * used for: it assumes α·θ·P ≪ 1 (src/analysis/models/supply.ts hotShunt), and past 1/4 at any trial it has no
 * steady state at all (thermal runaway: the Monte Carlo trials there give no value). 0.1 leaves room for the spread
 * of P across units (common practice: a 10 % shift from self-heating alone is already a design to rework). */
const MAX_SELF_HEATING_SHIFT = 0.1;

/** A shunt whose own heat shifts its value past the self-heating model's range: refused with the fields to change,
 * rather than left to fail in the Monte Carlo run with a message naming no field. */
function checkSelfHeating(design: CurrentDesign, nominal: Record<string, number>, tcrPerK: number): void {
  const theta = design.current.shunt.thermalResistance ?? 0;
  const loss = nominal['shuntLoss']!;
  const shift = tcrPerK * theta * loss;
  if (theta > 0 && shift > MAX_SELF_HEATING_SHIFT) {
    throw new ImpossibleError(
      'current.shunt.thermalResistance',
      `θ = ${Math.round(theta)} K/W with ${formatEngineering(loss, 'W')} at the limit heats the shunt ${Math.round(theta * loss)} K above ambient, shifting it by ${formatPercent(shift, 0)} through its ±${Math.round(tcrPerK * 1e6)} ppm/K TCR: past the ${formatPercent(MAX_SELF_HEATING_SHIFT, 0)} the self-heating model holds for, towards thermal runaway`,
      'lower current.shunt.thermalResistance (more copper, a larger package), a shunt with a smaller TCR (current.shunt.tcr), or less loss (a smaller shunt with more gain)',
    );
  }
}

/** Loads and heat the nominal design must stay within, whatever picked its values. */
/** The design's ambient as a range (a fixed ambient is a range of one temperature; none given: 25 °C). */
function operatingRange(t: Design['temperature']): { min: number; max: number } {
  if (!t) return { min: 25, max: 25 };
  if (t.fixed !== undefined) return { min: t.fixed, max: t.fixed };
  return { min: t.min!, max: t.max! };
}

function checkOperatingPoint(design: CurrentDesign, nominal: Record<string, number>, derating: number): void {
  const c = design.current;
  const loss = nominal['shuntLoss']!;
  if (c.shunt.rating !== undefined && loss > derating * c.shunt.rating) {
    throw new ImpossibleError(
      'current.shunt',
      `the shunt dissipates ${formatEngineering(loss, 'W')} at the limit, more than ${formatPercent(derating, 0)} of its ${formatEngineering(c.shunt.rating, 'W')} rating`,
      'use a smaller shunt (with more gain), a higher-rated shunt (current.shunt.rating), or a lower current.target',
    );
  }
  if (c.amplifier && c.topology !== 'direct') {
    const reach = c.amplifier.rail - (c.amplifier.headroom ?? 0.2);
    const overload = nominal['ampOutput']! * OVERLOAD_FACTOR;
    if (overload > reach) {
      throw new ImpossibleError(
        'current.amplifier.rail',
        `the amplifier output at ${OVERLOAD_FACTOR * 100} % of the limit, ${formatEngineering(overload, 'V')}, is above the rail minus headroom (${formatEngineering(reach, 'V')})`,
        'lower the threshold or the gain, or raise current.amplifier.rail',
      );
    }
  }
  if (!(nominal['ilimit']! > 0) || !Number.isFinite(nominal['ilimit']!)) {
    throw new ImpossibleError('current', 'the nominal current limit is not a positive current', 'check the threshold, the offsets and the gain resistors');
  }
}

/**
 * The shunt's signal at the limit against the offsets that compete with it (amplifier Vos, plus the comparing stage's
 * offset referred back through the gain): when the offsets can reach the whole signal, they alone can cancel the
 * limit, whatever the other parts. The pickers refuse below 10× (common practice); a design with its own values is
 * analysed down to 1× and refused below it.
 */
function checkShuntSignal(design: CurrentDesign, nominal: Record<string, number>, shuntOhms: number): void {
  const c = design.current;
  const signal = nominal['ilimit']! * shuntOhms;
  const gain = c.topology === 'direct' ? 1 : nominal['ampOutput']! / signal;
  const offset = (c.amplifier?.vos ?? 0) + (c.compareOffset ?? 0) / gain;
  if (offset > 0 && Number.isFinite(gain) && gain > 0 && signal <= offset) {
    throw new ImpossibleError(
      'current.shunt',
      `the shunt gives ${formatEngineering(signal, 'V')} at the limit, no more than the ${formatEngineering(offset, 'V')} of offset referred to it (amplifier Vos plus the comparing offset divided by the gain): the offsets alone can cancel the current limit`,
      'a larger shunt (current.shunt.value) with less gain, or a lower-offset amplifier (current.amplifier.vos, current.compareOffset); aim for at least 10× the offset (common practice)',
    );
  }
}

/** The spec window against the reference's own tolerance: a window narrower than it cannot hold every unit. */
function checkWindowAgainstReference(design: VoltageDesign, window: [number, number], target: number, limits: string[]): void {
  const half = Math.min(target - window[0], window[1] - target) / target;
  const refBand = design.reference.tolerance + (design.reference.drift ?? 0);
  if (half > 0 && half < refBand) {
    limits.push(
      `No resistor grade can keep every unit inside the output window: it is ±${formatPercent(half)} at its narrower side, narrower than the reference's own ±${formatPercent(refBand)} (tolerance plus drift), so the worst case falls outside it whatever the resistors; the yield rests on how Vref spreads. To change: a tighter reference (reference.tolerance, reference.drift), a wider voltage.window, or a trimming step.`,
    );
  }
}

function senseBomParts(design: CurrentDesign, parts: Record<string, number>, grades: ReturnType<typeof resolveSense>['grades'], nominal: Record<string, number>): BomPart[] {
  const c = design.current;
  const limit = nominal['ilimit']!;
  const ampOutput = nominal['ampOutput']!;
  const at = `at the nominal limit ${formatEngineering(limit, 'A', 4)}`;
  const out: BomPart[] = [];
  const add = (designator: string, role: string, current: number, extra: Partial<BomPart> = {}): void => {
    const ohms = parts[designator]!;
    const grade = grades[designator]!;
    out.push({ designator, role, ohms, tolerance: grade.tolerance, tcrPerK: grade.tcrPerK, powerW: resistorPower(current, ohms), powerAt: at, ...extra });
  };
  add(DESIGNATORS.shunt, 'current-sense shunt', limit, { shunt: true, ratingW: c.shunt.rating });
  if (c.topology === 'noninv') {
    const i = noninvGainCurrent(ampOutput, parts[DESIGNATORS.feedback]!, parts[DESIGNATORS.ground]!);
    add(DESIGNATORS.feedback, 'amplifier feedback (noninv)', i);
    add(DESIGNATORS.ground, 'amplifier gain to ground (noninv)', i);
  }
  if (c.topology === 'diff') {
    // A common mode that spreads: the branch currents at the end farthest from 0 V, the most power.
    const i = diffBranchCurrents({ r1: parts['R1']!, r3: parts['R3']!, r4: parts['R4']! }, parts[DESIGNATORS.shunt]!, pickerCommonMode(c), limit);
    add('R1', 'difference amplifier, load side to − input', i.r1r2);
    add('R2', 'difference amplifier, − input to output', i.r1r2);
    add('R3', 'difference amplifier, supply side to + input', i.r3r4);
    add('R4', 'difference amplifier, + input to ground', i.r3r4);
  }
  const thresholdRef = thresholdReference(design);
  if (thresholdRef) {
    const i = thresholdRef.volts / (parts[DESIGNATORS.thresholdTop]! + parts[DESIGNATORS.thresholdBottom]!);
    add(DESIGNATORS.thresholdTop, 'threshold divider, top', i, { powerAt: 'from the threshold reference' });
    add(DESIGNATORS.thresholdBottom, 'threshold divider, bottom', i, { powerAt: 'from the threshold reference' });
  }
  return out;
}

