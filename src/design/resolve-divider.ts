// The output divider of a design: the given values, or the divider picker's best candidate for "auto"; then the
// engine's leg specs, the BOM parts and notes. Fixed outputs and adjustable ones (a pot in one leg) alike.
import { adjustablePeakPowers, wiperForHighest, wiperForLowest, type PotLeg } from '../circuits/adjustable-divider.js';
import { potRatedCurrent, potTrackLoadRatio, potTrackPeakCurrent } from '../circuits/pot-track-power.js';
import { ImpossibleError } from '../errors.js';
import type { LegSpec, ResistorSpec } from '../analysis/models/supply.js';
import { DIVIDER_DEFAULTS, pickDivider, type AdjustableCandidate, type DividerCandidate, type DividerRequest } from '../pick/divider.js';
import { currentBandHalfWidth, formatEngineering, formatPercent, formatRkm } from '../units/index.js';
import { dividerCurrents, resistorPower, type BomPart } from './bom.js';
import { mapPickerError } from './picker-errors.js';
import { distributionSpec, partGrade, type PartGrade } from './part-grade.js';
import { DESIGNATORS, legPartDesignators, type VoltageDesign } from './schema.js';
import { legNotation, type DividerLegValue } from './divider-leg.js';

/** Default pot tolerance: 20 % is the usual track tolerance of trimmer pots (common practice). */
export const DEFAULT_POT_TOLERANCE = DIVIDER_DEFAULTS.potTolerance;

/** A jumper's resistance, standing in for an absent fixed resistor beside a pot (1 µΩ: negligible). */
const JUMPER_OHMS = 1e-6;

export interface ResolvedDivider {
  top: number;
  bottom: number;
  /** The top and bottom legs for the engine; with a pot, `wiper` is set for the top of the range. */
  legs: { top: LegSpec; bottom: LegSpec };
  /** With a pot: the legs at the bottom of the range. */
  lowLegs?: { top: LegSpec; bottom: LegSpec };
  pot?: { ohms: number; tolerance: number; leg: PotLeg; tcrPerK: number };
  bomParts: BomPart[];
  notes: string[];
  /** The grade of every fixed divider resistor (for the notes of assumed TCRs). */
  grades: PartGrade[];
}

export function resistorSpec(name: string, nominal: number, grade: PartGrade): ResistorSpec {
  const spec: ResistorSpec = { name, nominal, tolerance: grade.tolerance, distribution: distributionSpec(grade.distribution) };
  if (grade.tcrPerK > 0) spec.tcrPerK = grade.tcrPerK;
  return spec;
}

/** The feedback-pin bias current the picker aims at (its nominal) and the engine's band (src/units/current-band.ts). */
export function feedbackBias(design: VoltageDesign): { nominal: number; plusMinus: number } {
  const band = design.voltage.feedbackBias;
  return band ? { nominal: band.nominal, plusMinus: currentBandHalfWidth(band) } : { nominal: 0, plusMinus: 0 };
}

export function resolveDivider(design: VoltageDesign): ResolvedDivider {
  const v = design.voltage;
  const vref = design.reference.voltage;
  const [lo, hi] = v.target;
  const gradeTop = partGrade(design, DESIGNATORS.dividerTop);
  const gradeBottom = partGrade(design, DESIGNATORS.dividerBottom);
  const ifb = feedbackBias(design).nominal;
  const notes: string[] = [];
  const pot = v.pot ? { ohms: v.pot.value, tolerance: v.pot.tolerance ?? DEFAULT_POT_TOLERANCE, leg: v.pot.leg ?? 'top', tcrPerK: v.pot.tcr ?? 0 } : undefined;

  let topLeg: DividerLegValue;
  let bottomLeg: DividerLegValue;
  if (v.divider === 'auto') {
    const request: DividerRequest = {
      vref,
      vout: { lo, hi },
      ifb,
      series: [v.search?.series ?? gradeBottom.series],
      maxParts: v.search?.parts ?? 2,
      bottom: v.search?.bottom ? { lo: v.search.bottom[0], hi: v.search.bottom[1] } : DIVIDER_DEFAULTS.bottom,
      current: v.search?.current ? { lo: v.search.current[0], hi: v.search.current[1] } : undefined,
      minOhms: DIVIDER_DEFAULTS.minOhms,
      maxOhms: v.search?.max ?? DIVIDER_DEFAULTS.maxOhms,
      biasRatio: DIVIDER_DEFAULTS.biasRatio,
      biasRatioFixed: true,
      tolerance: Math.max(gradeTop.tolerance, gradeBottom.tolerance),
      vrefTolerance: design.reference.tolerance,
      count: 5,
      pot,
    };
    const result = mapPickerError(() => pickDivider(request), DIVIDER_OPTION_FIELDS);
    const best = result.candidates[0]!; // the picker throws rather than return none
    topLeg = pickedLeg(best, 'top');
    bottomLeg = pickedLeg(best, 'bottom');
    const how = `${request.series.join(', ')}, bottom ${formatEngineering(request.bottom.lo, 'Ω')}..${formatEngineering(request.bottom.hi, 'Ω')}${request.maxParts === 3 ? ', up to 3 parts' : ''}`;
    notes.push(`Divider picked (${how}): ${DESIGNATORS.dividerTop} ${topLeg.ohms > 0 ? legNotation(topLeg, formatRkm) : 'none'}, ${DESIGNATORS.dividerBottom} ${legNotation(bottomLeg, formatRkm)}; best of ${result.candidates.length} shown by \`trimfree divider\`.`);
  } else {
    topLeg = v.divider.top;
    bottomLeg = v.divider.bottom;
  }
  const top = topLeg.ohms;
  const bottom = bottomLeg.ohms;

  const bias = ifb;
  const topSpec = (): ResistorSpec => (top > 0 ? resistorSpec(DESIGNATORS.dividerTop, top, gradeTop) : { name: 'jumper', nominal: JUMPER_OHMS, tolerance: 0 });
  const leg = (which: 'top' | 'bottom', wiper: number): LegSpec => {
    const spec: LegSpec = { resistors: [which === 'top' ? topSpec() : resistorSpec(DESIGNATORS.dividerBottom, bottom, gradeBottom)] };
    if (pot && pot.leg === which) {
      spec.potentiometer = { name: DESIGNATORS.pot, nominal: pot.ohms, tolerance: pot.tolerance, wiper, distribution: { kind: 'uniform' }, ...(pot.tcrPerK > 0 ? { tcrPerK: pot.tcrPerK } : {}) };
    }
    return spec;
  };

  const bomParts: BomPart[] = [];
  if (pot) {
    const highWiper = wiperForHighest(pot.leg);
    const lowWiper = wiperForLowest(pot.leg);
    const powers = adjustablePeakPowers(vref, top, bottom, pot.ohms, pot.leg, bias);
    const at = 'highest over the pot travel';
    if (top > 0) bomParts.push({ designator: DESIGNATORS.dividerTop, role: 'feedback divider, top', ohms: top, tolerance: gradeTop.tolerance, tcrPerK: gradeTop.tcrPerK, powerW: powers.top, powerAt: at });
    else notes.push(`No fixed top resistor: the pot ${DESIGNATORS.pot} alone forms the top leg.`);
    bomParts.push({ designator: DESIGNATORS.dividerBottom, role: 'feedback divider, bottom', ohms: bottom, tolerance: gradeBottom.tolerance, tcrPerK: gradeBottom.tcrPerK, powerW: powers.bottom, powerAt: at });
    bomParts.push({ designator: DESIGNATORS.pot, role: `adjustment pot, ${pot.leg} leg (rheostat)`, ohms: pot.ohms, tolerance: pot.tolerance, tcrPerK: pot.tcrPerK, powerW: powers.pot, powerAt: at, ...(v.pot!.rating !== undefined ? { ratingW: v.pot!.rating } : {}) });
    if (v.pot!.rating !== undefined) notes.push(checkPotTrack(vref, bottom, pot.ohms, pot.leg, bias, v.pot!.rating));
    return {
      top,
      bottom,
      legs: { top: leg('top', highWiper), bottom: leg('bottom', highWiper) },
      lowLegs: { top: leg('top', lowWiper), bottom: leg('bottom', lowWiper) },
      pot,
      bomParts,
      notes,
      grades: [gradeTop, gradeBottom],
    };
  }
  const currents = dividerCurrents(vref, bottom, bias);
  const at = 'at the nominal output';
  const grades: PartGrade[] = [];
  const fixedLeg = (value: DividerLegValue, designator: string, where: string, current: number): LegSpec => {
    const legVolts = current * value.ohms;
    if (value.parts.length === 1) {
      const grade = designator === DESIGNATORS.dividerTop ? gradeTop : gradeBottom;
      grades.push(grade);
      bomParts.push({ designator, role: `feedback divider, ${where}`, ohms: value.ohms, tolerance: grade.tolerance, tcrPerK: grade.tcrPerK, powerW: resistorPower(current, value.ohms), powerAt: at });
      return { resistors: [resistorSpec(designator, value.ohms, grade)] };
    }
    const arrangement = value.arrangement!;
    const names = legPartDesignators(designator);
    const specs = value.parts.map((ohms, i) => {
      const grade = partGrade(design, names[i]!, {}, designator);
      grades.push(grade);
      // Series: the leg current flows through each part; parallel: each part takes the leg voltage (Ohm's law).
      const partCurrent = arrangement === 'series' ? current : legVolts / ohms;
      bomParts.push({ designator: names[i]!, role: `feedback divider, ${where} (${arrangement} with ${names[1 - i]})`, ohms, tolerance: grade.tolerance, tcrPerK: grade.tcrPerK, powerW: resistorPower(partCurrent, ohms), powerAt: at });
      return resistorSpec(names[i]!, ohms, grade);
    }) as [ResistorSpec, ResistorSpec];
    return { resistors: specs, arrangement };
  };
  const legs = {
    top: fixedLeg(topLeg, DESIGNATORS.dividerTop, 'top', currents.top),
    bottom: fixedLeg(bottomLeg, DESIGNATORS.dividerBottom, 'bottom', currents.bottom),
  };
  return { top, bottom, legs, bomParts, notes, grades };
}

/**
 * The pot's track current against its rating derated by the share of track in circuit (common practice,
 * src/circuits/pot-track-power.ts): a note when it holds at every setting, an ImpossibleError when it does not.
 */
function checkPotTrack(vref: number, bottom: number, rpot: number, leg: PotLeg, ifb: number, ratingW: number): string {
  const peak = potTrackPeakCurrent(vref, bottom, leg, ifb);
  const allowed = potRatedCurrent(ratingW, rpot);
  const ratio = potTrackLoadRatio(peak, rpot, ratingW);
  const text = `the pot ${DESIGNATORS.pot}'s track carries up to ${formatEngineering(peak, 'A')} over its travel; with only part of its track in circuit its ${formatEngineering(ratingW, 'W')} rating is derated by that share (common practice), which allows ${formatEngineering(allowed, 'A')} at any setting`;
  if (ratio > 1) {
    throw new ImpossibleError('voltage.pot.rating', `${text}: ${formatPercent(ratio, 0)} of the derated rating`, 'a pot with a higher rating or a higher value, or a larger divider (voltage.search.bottom) for less current');
  }
  return `Pot track: ${text} (${formatPercent(ratio, 0)} of the derated rating at worst). Check the datasheet's own rule for partial-track use.`;
}

/** The picked candidate's leg as the design file would write it. */
function pickedLeg(candidate: DividerCandidate | AdjustableCandidate, which: 'top' | 'bottom'): DividerLegValue {
  const ohms = which === 'top' ? candidate.top : candidate.bottom;
  const parts = candidate.parts.filter((p) => p.leg === which).map((p) => p.ohms);
  const kind = 'topKind' in candidate ? (which === 'top' ? candidate.topKind : candidate.bottomKind) : 'single';
  if (parts.length === 2 && kind !== 'single') return { parts: [parts[0]!, parts[1]!], arrangement: kind, ohms };
  return { parts: [ohms], ohms };
}

/** The divider picker's option names and the design-file fields they come from. */
const DIVIDER_OPTION_FIELDS: Record<string, string> = {
  '--vref': 'reference.voltage',
  '--vout': 'voltage.target',
  '--ifb': 'voltage.feedbackBias',
  '--pot': 'voltage.pot',
  '--pot-tol': 'voltage.pot.tolerance',
  '--parts': 'voltage.search.parts',
  '--bottom': 'voltage.search.bottom',
  '--current': 'voltage.search.current',
  '--max': 'voltage.search.max',
  '--series': 'voltage.search.series',
  '--tolerance': 'resistors.tolerance',
  '--max-error': 'voltage.window',
};
