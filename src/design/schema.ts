// The design file (JSON) as a zod 4 schema. Every object is strict: an unknown field is an error (load.ts suggests
// the closest valid name). Values take the notation of src/units or plain numbers and come out in SI units
// (ohms, volts, amperes, watts, fractions, 1/K, K/W, °C). See examples/ for complete files.
import { z } from 'zod';
import { SERIES_NAMES } from '../series/load.js';
import {
  autoOr,
  celsius,
  current,
  currentBand,
  fieldIssue,
  percent,
  power,
  ppmPerK,
  rangeField,
  resistance,
  thermalResistance,
  voltage,
  voltagePerK,
  windowBounds,
  windowField,
  PARSERS,
  type WindowInput,
} from './fields.js';
import { GRADE_NAMES } from './grades.js';
import { dividerLeg } from './divider-leg.js';
import { networkIssues, networksField } from './network-field.js';
import { decibels } from './decibel-field.js';
import { commonModeField } from './common-mode-field.js';
import { printableText } from '../user-text.js';
import { MAX_SHUNT_CANDIDATES } from '../pick/sense.js';
import { boundDistribution, driftAllowances, lifeCondition, lots, sortedOut } from './life-fields.js';

/** Adds what a field means in front of what it accepts (the value field's own description). */
function describe<T extends z.ZodType>(schema: T, meaning: string): T {
  const accepted = z.globalRegistry.get(schema)?.description;
  return schema.meta({ description: accepted ? `${meaning}; ${accepted}` : meaning }) as T;
}

export const TOPOLOGIES = ['direct', 'noninv', 'diff'] as const;
export type Topology = (typeof TOPOLOGIES)[number];
export const DISTRIBUTIONS = ['uniform', 'normal', 'truncated-normal', 'normal-unbounded', 'triangular', 'binned'] as const;
const BINNED_TEXT = 'binned: what is left of a normal production (band = 3σ) after the tighter grade named by sortedOut was sorted out of it (common practice)';
export type DistributionName = (typeof DISTRIBUTIONS)[number];
export const APPLICATIONS = ['charger', 'bench', 'led', 'other'] as const;
export type Application = (typeof APPLICATIONS)[number];
export const POT_LEGS = ['top', 'bottom'] as const;

/** Designators of the resistors trimfree places, by role. */
export const DESIGNATORS = {
  dividerTop: 'RTOP',
  dividerBottom: 'RBOT',
  pot: 'RV',
  shunt: 'RS',
  feedback: 'RF',
  ground: 'RG',
  diff: ['R1', 'R2', 'R3', 'R4'],
  thresholdTop: 'RT1',
  thresholdBottom: 'RT2',
} as const;

/** The two resistors of a two-part divider leg: RTOP_A and RTOP_B (a before b, as written or as picked). */
export function legPartDesignators(leg: string): [string, string] {
  return [`${leg}_A`, `${leg}_B`];
}

/** The designators of the resistors a design places (the pot RV takes its tolerance from voltage.pot). A two-part
 * divider leg places its leg's _A and _B parts; its leg designator (RTOP) stays valid for overrides of both.
 * A single-loop design places only its loop's parts: no divider without `voltage` (topology null), no sense parts
 * without `current` (`hasDivider` false). */
export function placedDesignators(topology: Topology | null, thresholdDivider: boolean, twoPartLegs: string[] = [], hasDivider = true): string[] {
  const names: string[] = [];
  if (hasDivider) names.push(DESIGNATORS.dividerTop, DESIGNATORS.dividerBottom);
  if (topology !== null) names.push(DESIGNATORS.shunt);
  for (const leg of twoPartLegs) names.push(...legPartDesignators(leg));
  if (topology === 'noninv') names.push(DESIGNATORS.feedback, DESIGNATORS.ground);
  if (topology === 'diff') names.push(...DESIGNATORS.diff);
  if (thresholdDivider) names.push(DESIGNATORS.thresholdTop, DESIGNATORS.thresholdBottom);
  return names;
}

const seriesName = z
  .string()
  .transform((text, ctx) => {
    const found = SERIES_NAMES.find((name) => name === text.trim().toUpperCase());
    if (!found) {
      fieldIssue(ctx, text, `unknown series '${text}'`, SERIES_NAMES.join(', '));
      return z.NEVER;
    }
    return found;
  })
  .meta({ description: `an IEC 60063 series: ${SERIES_NAMES.join(', ')}` });

const gradeName = z.enum(GRADE_NAMES).meta({ description: `a tolerance grade: ${GRADE_NAMES.join(', ')}` });

const notes = z
  .union([z.string(), z.array(z.string())])
  .transform((v) => (Array.isArray(v) ? v : [v]))
  .meta({ description: 'free text for people: what the file is, where the numbers came from' });

// ---- reference ----------------------------------------------------------------------------------------------------
const reference = z
  .strictObject({
    voltage: describe(voltage({ min: Number.MIN_VALUE, text: 'greater than 0 V' }), 'the regulator feedback reference Vref'),
    tolerance: describe(percent({ max: 0.5, text: '0 % to 50 %' }), 'initial tolerance of Vref (datasheet, over temperature if given so)'),
    drift: describe(percent({ max: 0.5, text: '0 % to 50 %' }), 'long-term drift allowance of Vref, counted when the design is analysed at end of life (analysis.condition, --condition)').optional(),
    tempco: describe(ppmPerK(), 'temperature coefficient bound of Vref, if the tolerance does not already cover temperature').optional(),
    distribution: z.enum(DISTRIBUTIONS).meta({ description: `how Vref spreads inside its tolerance: ${DISTRIBUTIONS.join(', ')} (default uniform; normal: tolerance = 3σ, cut off at the band; ${BINNED_TEXT})` }).optional(),
    sortedOut: sortedOut.optional(),
    notes: notes.optional(),
  })
  .meta({ description: 'the reference the regulator holds its feedback pin at (required with a voltage section; a current-only design leaves it out)' });

// ---- output voltage -----------------------------------------------------------------------------------------------
const dividerValues = z.strictObject({
  top: dividerLeg('top leg RTOP (output to feedback pin); two resistors become RTOP_A and RTOP_B'),
  bottom: dividerLeg('bottom leg RBOT (feedback pin to ground); two resistors become RBOT_A and RBOT_B'),
});

const dividerSearch = z
  .strictObject({
    series: seriesName.optional(),
    bottom: rangeField(PARSERS.resistance, 'bottom resistor range, e.g. 1k..100k').optional(),
    current: rangeField(PARSERS.current, 'divider current window Vref/RBOT, e.g. 50uA..1mA').optional(),
    max: describe(resistance(), 'largest resistor allowed').optional(),
    parts: z
      .union([z.literal(2), z.literal(3)])
      .meta({ description: 'resistors in the whole divider for "auto": 2 (default, one per leg) or 3 (one leg may be two resistors in series or parallel, as `trimfree divider --parts 3`)' })
      .optional(),
  })
  .meta({ description: 'constraints for "auto" divider values' });

const pot = z
  .strictObject({
    value: describe(resistance(), 'potentiometer end-to-end resistance'),
    tolerance: describe(percent({ max: 0.5, text: '0 % to 50 %' }), 'pot tolerance (default 20 %)').optional(),
    leg: z.enum(POT_LEGS).meta({ description: 'leg the pot is in: top (default) or bottom' }).optional(),
    drift: driftAllowances.optional(),
    tcr: describe(ppmPerK(), 'track temperature coefficient (default 0; cermet trimmers are often ±100 ppm/K, carbon ones several hundred: check the datasheet)').optional(),
    rating: describe(power({ min: Number.MIN_VALUE, text: 'above 0 W' }), 'power rating of the whole track; with only part of the track in circuit it is derated by that fraction (common practice), so the track current must stay below √(rating/value) at every setting').optional(),
  })
  .meta({ description: 'a potentiometer for an adjustable output (target is then a range LO..HI)' });

const voltageSection = z
  .strictObject({
    target: rangeField(PARSERS.voltage, 'output voltage target: 8.4 V, or 1.25..20 V for an adjustable output with a pot'),
    window: windowField(PARSERS.voltage, 'V').optional(),
    absoluteMax: describe(voltage({ min: Number.MIN_VALUE, text: 'greater than 0 V' }), 'an output voltage the supply must never exceed (e.g. what the load survives); the caution box reports a worst case above it').optional(),
    divider: z
      .union([z.literal('auto'), dividerValues])
      .meta({ description: '"auto" (picked from the series; search.parts 3 allows a two-resistor leg) or { top, bottom }, each leg one resistance or two in series ("6R8 + 2K2") or parallel ("10k ∥ 47k")' }),
    search: dividerSearch.optional(),
    pot: pot.optional(),
    feedbackBias: describe(currentBand(), 'feedback-pin bias current, positive into the pin (default 0); the divider picker aims at its nominal').optional(),
    feedbackBiasDistribution: boundDistribution('how the feedback-pin bias current spreads over its band').optional(),
    notes: notes.optional(),
  })
  .superRefine((v, ctx) => {
    const adjustable = v.target[0] !== v.target[1];
    if (adjustable && !v.pot) {
      ctx.issues.push({ code: 'custom', path: ['pot'], input: undefined, message: 'an adjustable target (LO..HI) needs a pot', params: { accepted: 'pot: { value: "10k", tolerance: "20%", leg: "top" }, or a single target value' } });
    }
    if (!adjustable && v.pot) {
      ctx.issues.push({ code: 'custom', path: ['target'], input: v.target[0], message: 'a pot is given but the target is a single value', params: { accepted: 'a range LO..HI such as "1.25..20 V" with a pot, or no pot' } });
    }
    if (!adjustable && !v.window) {
      ctx.issues.push({ code: 'custom', path: ['window'], input: undefined, message: 'missing required field', params: { accepted: 'a spec window: "±0.5%", "8.36..8.44 V" or [LO, HI]' } });
    }
    if (v.window && !adjustable) checkTargetInside(v.window, v.target[0], ctx, 'V');
    if (v.pot && v.divider !== 'auto') {
      for (const leg of ['top', 'bottom'] as const) {
        if (v.divider[leg].parts.length === 2) {
          ctx.issues.push({ code: 'custom', path: ['divider', leg], input: undefined, message: 'two-resistor legs are not offered with a pot', params: { accepted: 'one resistance per leg with a pot' } });
        }
      }
    }
    if (v.pot && v.search?.parts === 3) {
      ctx.issues.push({ code: 'custom', path: ['search', 'parts'], input: 3, message: 'two-resistor legs are not offered with a pot', params: { accepted: '2 (the default) with a pot' } });
    }
  })
  .meta({ description: 'the constant-voltage set-point: feedback divider from the output to the feedback pin (leave it out for a current-only design, e.g. an LED driver)' });

function checkTargetInside(window: WindowInput, target: number, ctx: z.core.$RefinementCtx<unknown>, unit: string): void {
  const [lo, hi] = windowBounds(window, target);
  if (target < lo || target > hi) {
    ctx.issues.push({
      code: 'custom',
      path: ['window'],
      input: window.kind === 'absolute' ? [window.lo, window.hi] : undefined,
      message: `the target ${target} ${unit} lies outside the window ${lo}..${hi} ${unit}`,
      params: { accepted: 'a window that contains the target' },
    });
  }
}

// ---- current limit ------------------------------------------------------------------------------------------------
const shuntParasitic = z
  .strictObject({
    value: describe(resistance(), 'series resistance of the pads and traces the sense connections see, e.g. 2m'),
    tolerance: describe(percent({ max: 1, text: '0 % to 100 %' }), 'its tolerance (copper geometry and solder vary widely: 30 % or more is common practice)'),
    tcr: describe(ppmPerK(), 'its temperature coefficient (default 3930 ppm/K, annealed copper at 20 °C: IEC 60028, from memory)').optional(),
  })
  .meta({ description: 'parasitic series resistance of pads and traces in the sensed path (a common-practice concern: a few mΩ matter beside a 10 mΩ shunt); Kelvin (four-terminal) sensing removes most of it, so leave it out then' });

const shunt = z
  .strictObject({
    value: autoOr(PARSERS.resistance, 'a shunt resistance: 50m, R050, 0.05'),
    rating: describe(power(), 'shunt power rating at 70 °C or as the datasheet states').optional(),
    derating: describe(percent({ min: Number.MIN_VALUE, max: 1, text: 'above 0 % up to 100 %' }), 'largest fraction of the rating to use (default 50 %: common practice)').optional(),
    maxLoss: describe(power(), 'largest shunt loss allowed at the current limit, for "auto"').optional(),
    tolerance: describe(percent({ max: 0.5, text: '0 % to 50 %' }), 'shunt tolerance (default: the resistor grade)').optional(),
    tcr: describe(ppmPerK(), 'shunt TCR (default: the resistor grade\'s)').optional(),
    thermalResistance: describe(thermalResistance(), 'θ shunt to ambient, for self-heating θ·I²R (default 0)').optional(),
    drift: driftAllowances.optional(),
    parasitic: shuntParasitic.optional(),
    candidates: z
      .array(z.union([z.string(), z.number()]))
      .max(MAX_SHUNT_CANDIDATES)
      .meta({ description: `shunt values to choose from for "auto", at most ${MAX_SHUNT_CANDIDATES} (default: the stocked milliohm list)` })
      .optional(),
  })
  .meta({ description: 'the current-sense shunt RS' });

const amplifier = z
  .strictObject({
    vos: describe(voltage({ min: 0, text: '0 V or more' }), 'input offset voltage, maximum magnitude'),
    vosDrift: describe(voltagePerK(), 'offset drift, maximum magnitude (default 0)').optional(),
    biasCurrent: describe(currentBand(), 'input bias current, positive into the inputs (default 0): the mean of the two inputs\' currents when offsetCurrent is given').optional(),
    vosDistribution: boundDistribution('how the offset spreads over ±vos').optional(),
    biasDistribution: boundDistribution('how the bias current spreads over its band').optional(),
    offsetCurrent: describe(current({ min: 0, text: '0 A or more' }), 'input offset current Ios, the difference of the two inputs\' currents, maximum magnitude (default 0)').optional(),
    cmrr: describe(decibels(), 'the amplifier\'s own common-mode rejection, datasheet minimum in dB (diff only: its inputs sit at the common-mode voltage, and its offset moves by ±V+/CMRR; default: not modelled)').optional(),
    rail: describe(voltage({ min: Number.MIN_VALUE, text: 'greater than 0 V' }), 'amplifier supply rail (highest output swing before headroom)'),
    headroom: describe(voltage({ min: 0, text: '0 V or more' }), 'output headroom below the rail (default 0.2 V)').optional(),
  })
  .meta({ description: 'the current-sense amplifier (noninv, diff)' });

const threshold = z
  .strictObject({
    voltage: describe(voltage({ min: Number.MIN_VALUE, text: 'greater than 0 V' }), 'threshold voltage (fixed), or the target for an "auto" threshold divider').optional(),
    tolerance: describe(percent({ max: 0.5, text: '0 % to 50 %' }), 'tolerance of the fixed threshold, or of the reference it is derived from (not with reference "regulator": the regulator reference\'s own applies)').optional(),
    tempco: describe(ppmPerK(), 'temperature coefficient bound of the fixed threshold, or of the reference it is derived from (default 0; not with reference "regulator")').optional(),
    reference: z
      .union([z.literal('regulator'), voltage({ min: Number.MIN_VALUE, text: 'greater than 0 V' })])
      .meta({ description: 'reference the threshold divider RT1/RT2 is fed from: its own, a voltage such as "2.5 V" (its own part, Vref threshold, with tolerance and tempco), or "regulator" (the design\'s reference section: one Vref shared by both loops)' })
      .optional(),
    top: autoOr(PARSERS.resistance, 'RT1, reference to threshold node').optional(),
    bottom: autoOr(PARSERS.resistance, 'RT2, threshold node to ground').optional(),
    distribution: boundDistribution('how the fixed threshold spreads inside its tolerance').optional(),
    drift: driftAllowances.optional(),
  })
  .superRefine((t, ctx) => {
    const issue = (path: string, message: string, accepted: string) =>
      ctx.issues.push({ code: 'custom', path: [path], input: undefined, message, params: { accepted } });
    if (t.reference === 'regulator') {
      if (t.tolerance !== undefined) issue('tolerance', 'a threshold fed from the regulator reference takes that reference\'s tolerance', 'no threshold.tolerance with reference "regulator" (reference.tolerance applies)');
      if (t.tempco !== undefined) issue('tempco', 'a threshold fed from the regulator reference takes that reference\'s tempco', 'no threshold.tempco with reference "regulator" (reference.tempco applies)');
    } else if (t.tolerance === undefined) {
      issue('tolerance', 'missing required field', 'a percentage: 1%, 0.5 %, or a number of percent');
    }
    if (t.reference === undefined) {
      if (t.voltage === undefined) issue('voltage', 'missing required field', 'a threshold voltage such as "0.8 V", or reference with top and bottom');
      if (t.top !== undefined || t.bottom !== undefined) issue(t.top !== undefined ? 'top' : 'bottom', 'a threshold divider needs the reference it is fed from', 'reference: "2.5 V" with top and bottom');
      return;
    }
    if (t.top === undefined) issue('top', 'missing required field', '"auto" or a resistance for RT1');
    if (t.bottom === undefined) issue('bottom', 'missing required field', '"auto" or a resistance for RT2');
    if (t.top !== undefined && t.bottom !== undefined && (t.top === 'auto') !== (t.bottom === 'auto')) {
      issue(t.top === 'auto' ? 'top' : 'bottom', 'the threshold divider is picked as a pair', 'both top and bottom "auto", or both resistances');
    }
    if ((t.top === 'auto' || t.bottom === 'auto') && t.voltage === undefined) {
      issue('voltage', 'an "auto" threshold divider needs a target threshold voltage', 'voltage: "0.8 V" below the reference');
    }
    if (t.reference !== 'regulator' && t.voltage !== undefined && t.voltage >= t.reference) {
      issue('voltage', `the threshold ${t.voltage} V is not below the reference ${t.reference} V it is divided from`, 'a threshold below the reference');
    }
  })
  .meta({ description: 'threshold the amplified shunt signal is compared with: fixed { voltage, tolerance, tempco } or from a reference { reference, tolerance, tempco, top, bottom }, the reference its own or the regulator\'s ("regulator")' });

const gainValues = z
  .strictObject({
    feedback: describe(resistance(), 'RF, noninv: output to inverting input').optional(),
    ground: describe(resistance(), 'RG, noninv: inverting input to ground').optional(),
    r1: describe(resistance(), 'R1, diff: load-side shunt node to inverting input').optional(),
    r2: describe(resistance(), 'R2, diff: inverting input to output').optional(),
    r3: describe(resistance(), 'R3, diff: supply-side shunt node to non-inverting input').optional(),
    r4: describe(resistance(), 'R4, diff: non-inverting input to ground').optional(),
  })
  .meta({ description: 'gain resistors: { feedback, ground } for noninv, { r1, r2, r3, r4 } for diff' });

const currentSection = z
  .strictObject({
    target: describe(current({ min: Number.MIN_VALUE, text: 'greater than 0 A' }), 'current limit target'),
    window: windowField(PARSERS.current, 'A'),
    topology: z.enum(TOPOLOGIES).meta({ description: 'direct: shunt voltage straight to the threshold; noninv: low-side shunt, gain 1 + RF/RG; diff: four-resistor difference amplifier, low- or high-side' }),
    shunt,
    amplifier: amplifier.optional(),
    compareOffset: describe(voltage({ min: 0, text: '0 V or more' }), 'offset of the stage comparing with the threshold, maximum magnitude (default 0)').optional(),
    compareOffsetDistribution: boundDistribution('how the comparing offset spreads over ±compareOffset').optional(),
    threshold,
    gain: z.union([z.literal('auto'), gainValues]).meta({ description: '"auto" or the gain resistors' }).optional(),
    gainRange: rangeField(PARSERS.resistance, 'gain-resistor range for "auto", e.g. 1k..100k').optional(),
    gainSeries: seriesName.optional(),
    commonMode: describe(commonModeField(), 'diff: voltage of the shunt\'s load-side node (0 low-side, the rail high-side; default 0), one value or the range it spreads over from unit to unit').optional(),
    commonModeDistribution: z
      .enum(DISTRIBUTIONS)
      .meta({ description: `how a commonMode range spreads from unit to unit: ${DISTRIBUTIONS.join(', ')} (default uniform, conservative; normal: the range is ±3σ)` })
      .optional(),
    notes: notes.optional(),
  })
  .superRefine((c, ctx) => {
    const issue = (path: (string | number)[], message: string, accepted: string) =>
      ctx.issues.push({ code: 'custom', path, input: undefined, message, params: { accepted } });
    checkTargetInside(c.window, c.target, ctx, 'A');
    if (c.topology === 'direct') {
      if (c.gain !== undefined) issue(['gain'], 'the direct topology has no gain resistors', 'no gain field with topology "direct"');
      if (c.amplifier !== undefined) issue(['amplifier'], 'the direct topology has no amplifier', 'compareOffset for the comparing stage; or topology noninv or diff');
    } else {
      if (c.amplifier === undefined) issue(['amplifier'], 'missing required field', `the amplifier { vos, rail, ... } of the ${c.topology} stage`);
      if (c.gain === undefined) issue(['gain'], 'missing required field', c.topology === 'noninv' ? '"auto" or { feedback, ground }' : '"auto" or { r1, r2, r3, r4 }');
      if (c.gain !== undefined && c.gain !== 'auto') {
        const need = c.topology === 'noninv' ? (['feedback', 'ground'] as const) : (['r1', 'r2', 'r3', 'r4'] as const);
        const other = c.topology === 'noninv' ? (['r1', 'r2', 'r3', 'r4'] as const) : (['feedback', 'ground'] as const);
        for (const key of need) if (c.gain[key] === undefined) issue(['gain', key], 'missing required field', `a resistance (the ${c.topology} stage needs ${need.join(', ')})`);
        for (const key of other) if (c.gain[key] !== undefined) issue(['gain', key], `${key} does not belong to the ${c.topology} topology`, `only ${need.join(', ')}`);
      }
    }
    const thresholdAuto = c.threshold.top === 'auto';
    if (c.gain !== undefined && c.gain !== 'auto' && (c.shunt.value === 'auto' || thresholdAuto)) {
      issue(['gain'], `gain resistors are picked together with an "auto" ${c.shunt.value === 'auto' ? 'shunt' : 'threshold divider'}`, '"auto", or give the shunt and the threshold too');
    }
    if (c.amplifier?.cmrr !== undefined && c.topology !== 'diff') {
      issue(['amplifier', 'cmrr'], `the amplifier's CMRR applies to the diff topology only (the ${c.topology} stage's inputs sit near ground)`, 'topology "diff", or no amplifier.cmrr');
    }
    if (c.commonModeDistribution !== undefined && (c.commonMode === undefined || c.commonMode[0] === c.commonMode[1])) {
      issue(['commonModeDistribution'], 'a distribution needs a commonMode range to spread over', 'commonMode as a range such as "17..21 V", or no commonModeDistribution');
    }
    if (c.commonMode !== undefined && (c.commonMode[0] !== 0 || c.commonMode[1] !== 0) && c.topology !== 'diff') {
      issue(['commonMode'], `a common-mode voltage applies to the diff topology only (this is ${c.topology}, a low-side shunt)`, 'topology "diff" for high-side sensing, or no commonMode');
    }
  })
  .meta({ description: 'the constant-current set-point: shunt, amplifier, threshold (leave it out for a voltage-only design, e.g. a fixed-voltage regulator)' });

// ---- resistor grades ----------------------------------------------------------------------------------------------
const gradeFields = {
  grade: gradeName.optional(),
  series: seriesName.optional(),
  tolerance: describe(percent({ max: 0.5, text: '0 % to 50 %' }), 'tolerance (overrides the grade\'s)').optional(),
  tcr: describe(ppmPerK(), 'temperature coefficient (overrides the grade\'s)').optional(),
  distribution: z
    .enum(DISTRIBUTIONS)
    .meta({
      description: `production spread inside the tolerance band: ${DISTRIBUTIONS.join(', ')} (normal: tolerance = 3σ, cut off at the band, since makers test parts to their band; truncated-normal: the same; normal-unbounded: not cut off, so Monte Carlo can pass the worst case, and the notes say so; ${BINNED_TEXT})`,
    })
    .optional(),
  sortedOut: sortedOut.optional(),
  drift: driftAllowances.optional(),
};

const override = z.strictObject(gradeFields).meta({ description: 'grade of one part, by designator' });

const resistors = z
  .strictObject({
    ...gradeFields,
    overrides: z.record(z.string(), override).meta({ description: 'per-designator grade: { "RS": { "tolerance": "0.5%" } }' }).optional(),
    grades: z.array(gradeName).min(1).meta({ description: 'the grades `grades` and `design` compare and may choose from (default: 5%, 1%, 0.5%, 0.1%); a part is offered a grade only where its usual series (common practice) or a coarser one holds the value' }).optional(),
  })
  .superRefine((r, ctx) => {
    if (r.grade === undefined && r.tolerance === undefined) {
      ctx.issues.push({ code: 'custom', path: ['grade'], input: undefined, message: 'missing required field: give a grade or a tolerance', params: { accepted: `grade: ${GRADE_NAMES.join(', ')}; or tolerance (with tcr and series)` } });
    }
  })
  .meta({ description: 'the default resistor grade: a grade name (10%, 5%, 2%, 1%, 0.5%, 0.25%, 0.1%, 0.05%, 0.02%, 0.01%) and/or series, tolerance, TCR, distribution' });

// ---- temperature, analysis, costs ---------------------------------------------------------------------------------
const temperature = z
  .strictObject({
    min: describe(celsius(), 'lowest ambient, °C').optional(),
    max: describe(celsius(), 'highest ambient, °C').optional(),
    fixed: describe(celsius(), 'the one ambient the supply runs at, °C, any value such as 40 °C, instead of min and max (every figure at that ambient, TCRs and tempcos acting through its distance from 25 °C; pilot predicts there when the CSV has no ambient column)').optional(),
  })
  .superRefine((t, ctx) => {
    const accepted = '{ min, max } for a range, or { fixed } for one ambient';
    if (t.fixed !== undefined && (t.min !== undefined || t.max !== undefined)) {
      ctx.issues.push({ code: 'custom', path: ['fixed'], input: t.fixed, message: 'fixed goes without min and max', params: { accepted } });
    } else if (t.fixed === undefined && (t.min === undefined || t.max === undefined)) {
      ctx.issues.push({ code: 'custom', path: [t.min === undefined ? 'min' : 'max'], input: undefined, message: 'missing required field', params: { accepted } });
    } else if (t.min !== undefined && t.max !== undefined && t.min > t.max) {
      ctx.issues.push({ code: 'custom', path: ['min'], input: t.min, message: `min ${t.min} °C is above max ${t.max} °C`, params: { accepted: 'min ≤ max' } });
    }
  })
  .meta({ description: 'operating ambient: a range { min, max } (every unit checked over it) or one ambient { fixed } (default 25 °C only)' });

const positiveInteger = (what: string) =>
  z.number().int().min(1).meta({ description: what });

const analysis = z
  .strictObject({
    trials: z.union([z.literal('auto'), positiveInteger('number of Monte Carlo trials, at most 1e10 (more could not finish in any sensible time)').max(1e10)]).meta({ description: 'Monte Carlo trials, or "auto" (adaptive, JCGM 101:2008 7.9)' }).optional(),
    seed: z.number().int().min(0).max(2 ** 32 - 1).meta({ description: 'random seed (default 1): the same seed gives the same numbers' }).optional(),
    workers: positiveInteger('worker threads, 1 to 256 (default: one per 1e6 trials, up to the number of cores)').max(256).optional(),
    condition: lifeCondition.optional(),
  })
  .meta({ description: 'Monte Carlo options; command-line options override them' });

const costs = z
  .strictObject(Object.fromEntries(GRADE_NAMES.map((g) => [g, z.number().positive().optional()])) as Record<(typeof GRADE_NAMES)[number], z.ZodOptional<z.ZodNumber>>)
  .meta({ description: 'relative cost per part of each grade (defaults are illustrative: 10% 1, 5% 1, 2% 1.1, 1% 1.2, 0.5% 3, 0.25% 5, 0.1% 8, 0.05% 15, 0.02% 30, 0.01% 60)' });

// ---- the file -----------------------------------------------------------------------------------------------------
export const DesignSchema = z
  .strictObject({
    $schema: z.string().meta({ description: 'path or URL of the JSON Schema (for editors)' }).optional(),
    notes: notes.optional(),
    application: z.enum(APPLICATIONS).meta({ description: 'what the supply is for (selects the cautions shown): charger, bench, led, other' }).optional(),
    reference: reference.optional(),
    voltage: voltageSection.optional(),
    current: currentSection.optional(),
    resistors,
    temperature: temperature.optional(),
    analysis: analysis.optional(),
    costs: costs.optional(),
    networks: networksField(gradeFields.distribution.unwrap()).optional(),
    lots: lots.optional(),
  })
  .superRefine((d, ctx) => {
    // Single-loop designs: a voltage loop alone (a fixed-voltage regulator), a current loop alone (an LED driver), or both.
    if (d.voltage === undefined && d.current === undefined) {
      ctx.issues.push({ code: 'custom', path: ['voltage'], input: undefined, message: 'missing required field: the design has neither a voltage nor a current section', params: { accepted: 'a voltage section (output divider), a current section (current limit), or both' } });
      return;
    }
    if (d.voltage !== undefined && d.reference === undefined) {
      ctx.issues.push({ code: 'custom', path: ['reference'], input: undefined, message: 'missing required field: the voltage section needs the reference the divider sets the output from', params: { accepted: 'reference: { voltage: "1.25 V", tolerance: "1%" }' } });
      return;
    }
    const th = d.current?.threshold;
    if (th?.reference === 'regulator') {
      if (d.reference === undefined) {
        ctx.issues.push({ code: 'custom', path: ['current', 'threshold', 'reference'], input: 'regulator', message: 'the threshold is fed from the regulator reference, but the design has no reference section', params: { accepted: 'a reference voltage of its own such as "2.5 V" with threshold.tolerance, or a reference section' } });
        return;
      }
      if (th.voltage !== undefined && th.voltage >= d.reference.voltage) {
        ctx.issues.push({ code: 'custom', path: ['current', 'threshold', 'voltage'], input: th.voltage, message: `the threshold ${th.voltage} V is not below the regulator reference ${d.reference.voltage} V it is divided from`, params: { accepted: 'a threshold below the reference' } });
        return;
      }
    }
    const divider = d.voltage?.divider;
    const twoPartLegs = divider === undefined ? [] : divider === 'auto' ? (d.voltage!.search?.parts === 3 ? [DESIGNATORS.dividerTop, DESIGNATORS.dividerBottom] : []) : [
      ...(divider.top.parts.length === 2 ? [DESIGNATORS.dividerTop] : []),
      ...(divider.bottom.parts.length === 2 ? [DESIGNATORS.dividerBottom] : []),
    ];
    const placed = placedDesignators(d.current?.topology ?? null, d.current?.threshold.reference !== undefined && d.current !== undefined, twoPartLegs, d.voltage !== undefined);
    for (const name of Object.keys(d.resistors.overrides ?? {})) {
      if (!placed.includes(name)) {
        ctx.issues.push({
          code: 'custom',
          path: ['resistors', 'overrides', name],
          input: name,
          message: `no part '${printableText(name)}' in this design`,
          params: { accepted: `a designator of this design: ${placed.join(', ')}`, unknownKey: name, validKeys: placed },
        });
      }
    }
    if (d.networks) {
      const explicitTwoPart = divider === 'auto' ? [] : twoPartLegs;
      for (const issue of networkIssues(d.networks, placed, explicitTwoPart, Object.keys(d.resistors.overrides ?? {}), DESIGNATORS.shunt)) {
        const params: Record<string, unknown> = { accepted: issue.accepted };
        if (issue.unknownKey !== undefined) {
          params['unknownKey'] = issue.unknownKey;
          params['validKeys'] = issue.validKeys;
        }
        ctx.issues.push({ code: 'custom', path: issue.path, input: undefined, message: issue.message, params });
      }
    }
  })
  .meta({ title: 'trimfree design file', description: 'a CV/CC DC-DC supply: reference, output divider, current sense, resistor grades; a single-loop design gives only voltage (with reference) or only current' });

/** The design file after validation, in SI units. */
export type Design = z.output<typeof DesignSchema>;
/** The design file as written. */
export type DesignInput = z.input<typeof DesignSchema>;
/** A design with a voltage loop (its `voltage` section and the `reference` it needs). */
export type VoltageDesign = Design & { voltage: NonNullable<Design['voltage']>; reference: NonNullable<Design['reference']> };
/** A design with a current loop (its `current` section). */
export type CurrentDesign = Design & { current: NonNullable<Design['current']> };
/** The design's current section, for helpers that read one. */
export type CurrentSection = NonNullable<Design['current']>;

export function hasVoltageLoop(design: Design): design is VoltageDesign {
  return design.voltage !== undefined && design.reference !== undefined;
}
export function hasCurrentLoop(design: Design): design is CurrentDesign {
  return design.current !== undefined;
}
