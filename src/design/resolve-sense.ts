// The current-sense path of a design: given values, or the sense picker's best candidate when the shunt, the gain
// resistors or the threshold divider is "auto"; then the engine's SenseSpec and the picker's figures.
import type { AmplifierSpec, ResistorSpec, SenseSpec, ShuntSpec, ThresholdSpec } from '../analysis/models/supply.js';
import { DEFAULT_SHUNT_DERATING, shuntLossLimit } from '../circuits/shunt-power.js';
import { thresholdFromReference } from '../circuits/sense/threshold-divider.js';
import { ImpossibleError, InputError } from '../errors.js';
import { pickSense, type SenseCandidate, type SenseRequest } from '../pick/sense.js';
import { exceedsLossLimit } from '../pick/sense/feasibility.js';
import { loadShunts, type SeriesName } from '../series/load.js';
import { gradeForTolerance } from './grades.js';
import { seriesValuesBetween } from '../series/enumerate.js';
import { currentBandHalfWidth, formatEngineering, formatPercent, formatRkm, parseResistance } from '../units/index.js';
import { mapPickerError } from './picker-errors.js';
import { distributionSpec, partGrade, type PartGrade } from './part-grade.js';
import { resistorSpec } from './resolve-divider.js';
import { shuntParasiticNote, shuntParasiticSpec } from './shunt-parasitic.js';
import { DESIGNATORS, type CurrentDesign, type CurrentSection } from './schema.js';

/** Gain and threshold-divider resistor window when the file gives none (the `sense` command's default too). */
export const DEFAULT_GAIN_RANGE: [number, number] = [1e3, 1e6];
/** Amplifier output headroom below the rail when the file gives none (common practice for rail-to-rail parts). */
export const DEFAULT_HEADROOM = 0.2;

export interface ResolvedSense {
  sense: SenseSpec;
  /** Resistances by designator (RS, RF, RG, R1–R4, RT1, RT2), ohms. */
  parts: Record<string, number>;
  grades: Record<string, PartGrade>;
  /** The picker's best candidate, when the picker ran. */
  picked?: SenseCandidate;
  derating: number;
  notes: string[];
}

function needsPicker(c: CurrentSection): boolean {
  return c.shunt.value === 'auto' || c.gain === 'auto' || c.threshold.top === 'auto';
}

/**
 * The reference a threshold divider is fed from: its own (threshold.reference a voltage, with threshold.tolerance and
 * tempco) or the regulator's (reference "regulator": the design's reference section, one part for both loops).
 */
export function thresholdReference(design: CurrentDesign): { volts: number; tolerance: number; tempcoPerK: number; shared: boolean } | null {
  const t = design.current.threshold;
  if (t.reference === undefined) return null;
  if (t.reference === 'regulator') {
    const r = design.reference!; // the schema requires it with reference "regulator"
    return { volts: r.voltage, tolerance: r.tolerance, tempcoPerK: r.tempco ?? 0, shared: true };
  }
  return { volts: t.reference, tolerance: t.tolerance!, tempcoPerK: t.tempco ?? 0, shared: false };
}

/** The threshold voltage the design aims at (fixed, or the divider's output or target). */
function thresholdVolts(design: CurrentDesign): number | undefined {
  const t = design.current.threshold;
  const ref = thresholdReference(design);
  if (ref && typeof t.top === 'number' && typeof t.bottom === 'number') {
    return thresholdFromReference(ref.volts, t.top, t.bottom);
  }
  return t.voltage;
}

function shuntCandidates(c: CurrentSection): number[] {
  if (c.shunt.value !== 'auto') return [c.shunt.value];
  if (!c.shunt.candidates) return loadShunts().values;
  return c.shunt.candidates.map((v, i) => parseResistance(String(v), `current.shunt.candidates[${i}]`));
}

export function resolveSense(design: CurrentDesign): ResolvedSense {
  const c = design.current;
  const notes: string[] = [];
  const names = [DESIGNATORS.shunt, ...gainDesignators(c.topology), ...(c.threshold.reference !== undefined ? [DESIGNATORS.thresholdTop, DESIGNATORS.thresholdBottom] : [])];
  const grades: Record<string, PartGrade> = {};
  for (const name of names) grades[name] = partGrade(design, name, name === DESIGNATORS.shunt ? { tolerance: c.shunt.tolerance, tcr: c.shunt.tcr } : {});
  const derating = c.shunt.derating ?? DEFAULT_SHUNT_DERATING;
  const lossLimit = c.shunt.rating !== undefined ? shuntLossLimit(c.shunt.rating, derating, c.shunt.maxLoss) : undefined;

  let parts: Record<string, number> = {};
  let picked: SenseCandidate | undefined;
  if (needsPicker(c)) {
    if (c.shunt.rating === undefined) {
      throw new InputError('current.shunt.rating', 'missing required field: the shunt rating is needed to pick the current-sense parts', 'a power rating such as "1 W"');
    }
    const firstGain = gainDesignators(c.topology)[0] ?? DESIGNATORS.thresholdTop;
    const network = gainNetwork(design);
    const gainGrade = network ? networkGrade(network) : (grades[firstGain] ?? grades[DESIGNATORS.shunt]!);
    const range = c.gainRange ?? DEFAULT_GAIN_RANGE;
    const series = c.gainSeries ?? gainGrade.series;
    const volts = thresholdVolts(design);
    const t = c.threshold;
    const ref = thresholdReference(design);
    const threshold: SenseRequest['threshold'] =
      ref && t.top === 'auto'
        ? { kind: 'divider', reference: ref.volts, tolerance: ref.tolerance, ...(volts !== undefined ? { volts } : {}) }
        : { kind: 'fixed', volts: volts!, tolerance: ref ? ref.tolerance : t.tolerance! };
    const amp = c.amplifier;
    const request: SenseRequest = {
      limit: c.target,
      topology: c.topology,
      threshold,
      shunts: shuntCandidates(c),
      shuntTolerance: grades[DESIGNATORS.shunt]!.tolerance,
      shuntRatingW: c.shunt.rating,
      derating,
      resistorValues: seriesValuesBetween(series, range[0], range[1]),
      resistorTolerance: gainGrade.tolerance,
      // The direct topology has no amplifier: its rail is not used by the picker's checks.
      rail: amp?.rail ?? Math.max(10, 10 * (volts ?? 1)),
      headroom: amp ? (amp.headroom ?? DEFAULT_HEADROOM) : 0,
      amplifierOffset: amp?.vos ?? 0,
      compareOffset: c.compareOffset ?? 0,
      biasCurrent: amp?.biasCurrent ?? { nominal: 0, lo: 0, hi: 0, form: 'typical' },
      // A common mode that spreads: the picker's quick worst case takes the end farthest from 0 V (its error grows with it).
      commonMode: pickerCommonMode(c),
    };
    if (c.shunt.maxLoss !== undefined) request.maxLossW = c.shunt.maxLoss;
    if (network) request.gainNetwork = { name: network.name, tolerance: network.tolerance, ratio: network.ratio };
    const pick = mapPickerError(() => pickSense(request), SENSE_OPTION_FIELDS);
    // Never a candidate `sense` flags with "!" (exceedsLossLimit: one rule for both); the best of the others.
    const allowed = pick.candidates.filter((candidate) => !exceedsLossLimit(candidate));
    if (allowed.length === 0) throw everyCandidateFlagged(pick.candidates, lossLimit!, c.shunt.rating);
    picked = allowed[0]!;
    const skipped = pick.candidates.indexOf(picked);
    parts = { ...picked.parts };
    if (t.reference !== undefined && t.top !== 'auto') {
      parts[DESIGNATORS.thresholdTop] = t.top!;
      parts[DESIGNATORS.thresholdBottom] = t.bottom as number;
    }
    const listed = Object.entries(parts).map(([k, r]) => `${k} ${formatRkm(r)}`).join(', ');
    notes.push(
      `Current sense picked (${series} ${formatEngineering(range[0], 'Ω')}..${formatEngineering(range[1], 'Ω')}, ${pick.candidates.length} candidates; ranked by quick worst-case spread, then shunt loss): ${listed}; quick worst case ${formatEngineering(picked.worstCase.min, 'A', 4)}..${formatEngineering(picked.worstCase.max, 'A', 4)}. \`trimfree sense\` shows the others and the Pareto front.` +
        (skipped > 0 ? ` The ${skipped} better-ranked candidate${skipped === 1 ? '' : 's'} ${skipped === 1 ? 'was' : 'were'} passed over: at ${skipped === 1 ? 'its' : 'their'} quick worst-case highest limit the shunt loss exceeds the ${formatEngineering(lossLimit!.watts, 'W')} loss limit (${lossLimitText(lossLimit!, c.shunt.rating)}), shown as "!" by \`trimfree sense\`.` : ''),
    );
  } else {
    parts[DESIGNATORS.shunt] = c.shunt.value as number;
    const g = c.gain;
    if (g !== undefined && g !== 'auto') {
      if (c.topology === 'noninv') Object.assign(parts, { [DESIGNATORS.feedback]: g.feedback!, [DESIGNATORS.ground]: g.ground! });
      if (c.topology === 'diff') Object.assign(parts, { R1: g.r1!, R2: g.r2!, R3: g.r3!, R4: g.r4! });
    }
    if (c.threshold.reference !== undefined) {
      parts[DESIGNATORS.thresholdTop] = c.threshold.top as number;
      parts[DESIGNATORS.thresholdBottom] = c.threshold.bottom as number;
    }
  }
  const sense = senseSpec(design, parts, grades, lossLimit);
  if (sense.topology === 'diff' && sense.commonModeBand) {
    const [lo, hi] = c.commonMode!;
    notes.push(`Common-mode voltage (current.commonMode) spreads over ${formatEngineering(lo, 'V', 4)}..${formatEngineering(hi, 'V', 4)} from unit to unit: drawn once per unit as the part Vcm (${c.commonModeDistribution ?? 'uniform'}), both ends in the worst case; the BOM's powers${picked ? ' and the picker\'s ranking' : ''} take ${formatEngineering(pickerCommonMode(c), 'V', 4)}.`);
  }
  if (sense.shunt.parasitic) {
    const note = shuntParasiticNote(sense.shunt.nominal, sense.shunt.parasitic);
    // The picker ranks shunts by their own value: it does not know the parasitic, so say where that leaves the limit.
    notes.push(picked ? `${note} The current-sense picker chose ${DESIGNATORS.shunt} without it: give the shunt value, or move the threshold, to re-centre the limit.` : note);
  }
  return { sense, parts, grades, ...(picked ? { picked } : {}), derating, notes };
}

/** The network holding every gain resistor of the topology (diff R1–R4), if the file declares one. */
function gainNetwork(design: CurrentDesign): { name: string; tolerance: number; ratio: number } | undefined {
  const gain = gainDesignators(design.current.topology);
  if (gain.length === 0) return undefined;
  for (const [name, n] of Object.entries(design.networks ?? {})) {
    if (gain.every((g) => n.members.includes(g))) return { name, tolerance: n.tolerance, ratio: n.ratio };
  }
  return undefined;
}

/** The picker's tolerance and series for a network's members: its absolute tolerance, the series that tolerance is usually sold in (common practice, grades.ts). */
function networkGrade(network: { tolerance: number }): { tolerance: number; series: SeriesName } {
  return { tolerance: network.tolerance, series: gradeForTolerance(network.tolerance)?.series ?? 'E192' };
}

export function gainDesignators(topology: CurrentSection['topology']): string[] {
  if (topology === 'noninv') return [DESIGNATORS.feedback, DESIGNATORS.ground];
  if (topology === 'diff') return [...DESIGNATORS.diff];
  return [];
}

/** Where the loss limit came from, in words: "50 % of the 500 mW rating" or "the loss budget current.shunt.maxLoss". */
function lossLimitText(limit: ReturnType<typeof shuntLossLimit>, ratingW: number | undefined): string {
  if (limit.from === 'loss budget') return 'the loss budget current.shunt.maxLoss, below the derated rating';
  return `${formatPercent(limit.watts / ratingW!, 0)} of the ${formatEngineering(ratingW!, 'W')} rating, current.shunt.derating`;
}

/** Every candidate the picker found would load its shunt past the loss limit at its worst-case highest limit. */
function everyCandidateFlagged(candidates: readonly SenseCandidate[], limit: ReturnType<typeof shuntLossLimit>, ratingW: number): ImpossibleError {
  const coolest = candidates.reduce((best, c) => (c.worstCaseLossW < best.worstCaseLossW ? c : best));
  const need = formatEngineering(coolest.worstCaseLossW, 'W');
  const raise =
    limit.from === 'loss budget'
      ? `raise current.shunt.maxLoss to at least ${need}`
      : `raise current.shunt.rating to at least ${formatEngineering((coolest.worstCaseLossW * ratingW) / limit.watts, 'W')}`;
  return new ImpossibleError(
    limit.from === 'loss budget' ? 'current.shunt.maxLoss' : 'current.shunt.rating',
    `every one of the ${candidates.length} current-sense candidates loads its shunt past the ${formatEngineering(limit.watts, 'W')} loss limit (${lossLimitText(limit, ratingW)}) at its quick worst-case highest limit; the least, RS ${formatRkm(coolest.parts['RS']!)}, reaches ${need}`,
    `${raise}, allow smaller shunts (current.shunt.candidates), or tighten the parts that widen the worst case (resistors, current.shunt.tolerance)`,
  );
}

function senseSpec(design: CurrentDesign, parts: Record<string, number>, grades: Record<string, PartGrade>, lossLimit: ReturnType<typeof shuntLossLimit> | undefined): SenseSpec {
  const c = design.current;
  const r = (name: string): ResistorSpec => resistorSpec(name, parts[name]!, grades[name]!);
  const shuntGrade = grades[DESIGNATORS.shunt]!;
  const shunt: ShuntSpec = { ...r(DESIGNATORS.shunt) };
  if (c.shunt.rating !== undefined) shunt.powerRatingW = c.shunt.rating;
  // The design's own loss limit is the window of the shunt loss: the derated rating, or the loss budget when lower.
  if (lossLimit) {
    shunt.lossLimitW = lossLimit.watts;
    shunt.lossLimitFrom = lossLimit.from === 'loss budget' ? 'current.shunt.maxLoss, below the derated rating' : `${formatPercent(lossLimit.watts / c.shunt.rating!, 0)} of the ${formatEngineering(c.shunt.rating!, 'W')} rating`;
  } else if (c.shunt.maxLoss !== undefined) {
    shunt.lossLimitW = c.shunt.maxLoss;
    shunt.lossLimitFrom = 'current.shunt.maxLoss; no rating given';
  }
  if (c.shunt.thermalResistance !== undefined && c.shunt.thermalResistance > 0) shunt.thermalResistanceKPerW = c.shunt.thermalResistance;
  if (c.shunt.parasitic) shunt.parasitic = shuntParasiticSpec(c.shunt.parasitic);
  shunt.distribution = distributionSpec(shuntGrade.distribution);

  const t = c.threshold;
  const ref = thresholdReference(design);
  let threshold: ThresholdSpec;
  if (ref) {
    const source: ThresholdSpec & { kind: 'divided' } extends { source: infer S } ? S : never = ref.shared ? 'regulator-reference' : { name: 'Vref threshold', nominal: ref.volts, tolerance: ref.tolerance, ...(ref.tempcoPerK > 0 ? { tempcoPerK: ref.tempcoPerK } : {}) };
    threshold = { kind: 'divided', source, top: r(DESIGNATORS.thresholdTop), bottom: r(DESIGNATORS.thresholdBottom) };
  } else {
    threshold = { kind: 'fixed', nominal: t.voltage!, tolerance: t.tolerance!, ...(t.tempco ? { tempcoPerK: t.tempco } : {}) };
  }

  const common = { shunt, threshold, limitTarget: c.target, ...(c.compareOffset ? { compareOffset: { nominal: 0, plusMinus: c.compareOffset } } : {}) };
  if (c.topology === 'direct') return { ...common, topology: 'direct' };
  const a = c.amplifier!;
  const amplifier: AmplifierSpec = { offsetMax: a.vos, railV: a.rail, headroomV: a.headroom ?? DEFAULT_HEADROOM };
  if (a.vosDrift) amplifier.offsetDriftPerK = Math.abs(a.vosDrift);
  const ib = a.biasCurrent;
  if (ib && (ib.nominal !== 0 || ib.hi > ib.lo)) amplifier.biasCurrent = { nominal: ib.nominal, plusMinus: currentBandHalfWidth(ib) };
  if (a.offsetCurrent) amplifier.offsetCurrentMax = a.offsetCurrent;
  if (a.cmrr !== undefined && c.topology === 'diff') amplifier.cmrrDb = a.cmrr;
  if (c.topology === 'noninv') return { ...common, topology: 'noninv', rf: r(DESIGNATORS.feedback), rg: r(DESIGNATORS.ground), amplifier };
  const [cmLo, cmHi] = c.commonMode ?? [0, 0];
  const diff: SenseSpec = { ...common, topology: 'diff', r1: r('R1'), r2: r('R2'), r3: r('R3'), r4: r('R4'), commonModeV: (cmLo + cmHi) / 2, amplifier };
  if (cmHi > cmLo) diff.commonModeBand = { plusMinus: (cmHi - cmLo) / 2, distribution: distributionSpec(c.commonModeDistribution ?? 'uniform') };
  return diff;
}

/** The common mode the sense picker ranks at: the one voltage, or the end of its range farthest from 0 V. */
export function pickerCommonMode(c: CurrentSection): number {
  const [lo, hi] = c.commonMode ?? [0, 0];
  return Math.abs(hi) >= Math.abs(lo) ? hi : lo;
}

/** The sense picker's option names and the design-file fields they come from. */
const SENSE_OPTION_FIELDS: Record<string, string> = {
  '--limit': 'current.target',
  '--topology': 'current.topology',
  '--threshold': 'current.threshold.voltage',
  '--threshold-tol': 'current.threshold.tolerance',
  '--threshold-from': 'current.threshold.reference',
  '--shunts': 'current.shunt.candidates',
  '--shunt-tol': 'current.shunt.tolerance',
  '--shunt-rating': 'current.shunt.rating',
  '--derate': 'current.shunt.derating',
  '--max-loss': 'current.shunt.maxLoss',
  '--series': 'current.gainSeries',
  '--window': 'current.gainRange',
  '--tolerance': 'resistors.tolerance',
  '--rail': 'current.amplifier.rail',
  '--headroom': 'current.amplifier.headroom',
  '--vos': 'current.amplifier.vos',
  '--vos-cmp': 'current.compareOffset',
  '--ib': 'current.amplifier.biasCurrent',
  '--common-mode': 'current.commonMode',
};
