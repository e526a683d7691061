// The checks that make a sense request impossible, each failing with one line that names the constraint and what
// would relax it (ImpossibleError), and the shunt filters: derated power rating, loss budget, signal against offset.
import { largestShuntForLoss, shuntLoss, shuntMaxCurrent } from '../../circuits/shunt-power.js';
import { ImpossibleError } from '../../errors.js';
import { formatEngineering, formatPercent } from '../../units/index.js';
import { OVERLOAD_FACTOR } from './evaluate.js';
import type { SenseTopology } from './topology.js';
import type { SenseCandidate, SenseRequest } from './types.js';

/** Common practice: the shunt voltage at the limit should be at least ten times the offset that competes with it. */
export const MIN_SIGNAL_TO_OFFSET = 10;

const v = (x: number): string => formatEngineering(x, 'V');
const a = (x: number): string => formatEngineering(x, 'A');
const w = (x: number): string => formatEngineering(x, 'W');
const ohm = (x: number): string => formatEngineering(x, 'Ω');

/** The wanted threshold, when the request fixes one (a direct divider without --threshold picks it per shunt). */
export function wantedThreshold(request: SenseRequest): number | undefined {
  return request.threshold.volts;
}

/** Threshold-level checks that hold for every shunt: reach of the amplifier output, divider below its reference. */
export function checkThreshold(request: SenseRequest, topology: SenseTopology): void {
  const threshold = wantedThreshold(request);
  const source = request.threshold;
  if (source.kind === 'divider' && threshold !== undefined && threshold >= source.reference) {
    throw new ImpossibleError(
      '--threshold',
      `a ${v(threshold)} threshold cannot come from a ${v(source.reference)} reference through a divider`,
      `ask for a threshold below ${v(source.reference)}, or drop --threshold-from and give a fixed --threshold`,
    );
  }
  if (!topology.usesAmplifier || threshold === undefined) return;
  const reach = request.rail - request.headroom;
  const needed = OVERLOAD_FACTOR * threshold;
  if (needed > reach) {
    throw new ImpossibleError(
      '--threshold',
      `a ${v(threshold)} threshold needs the amplifier output to reach ${v(needed)} at ${formatPercent(OVERLOAD_FACTOR, 0)} of the limit, above the ${v(reach)} it can reach (${v(request.rail)} rail − ${v(request.headroom)} headroom)`,
      `lower --threshold to at most ${v(reach / OVERLOAD_FACTOR)}, or raise --rail, or use an amplifier that swings closer to its rail (--headroom)`,
    );
  }
}

export interface ShuntFilterResult {
  shunts: number[];
  rejected: Record<string, number>;
}

/** Shunts that survive the derated rating, the loss budget and the signal-to-offset rule, in that order. */
export function usableShunts(request: SenseRequest, topology: SenseTopology): ShuntFilterResult {
  const current = request.limit;
  const rejected: Record<string, number> = {};
  let shunts = [...request.shunts].sort((x, y) => x - y);

  const rated = shunts.filter((rs) => current <= shuntMaxCurrent(rs, request.shuntRatingW, request.derating) * (1 + 1e-12));
  rejected['derated power rating'] = shunts.length - rated.length;
  if (rated.length === 0) {
    const largestAllowed = (request.derating * request.shuntRatingW) / (current * current);
    throw new ImpossibleError(
      '--shunt-rating',
      `no listed shunt carries ${a(current)} within ${formatPercent(request.derating, 0)} of a ${w(request.shuntRatingW)} rating (that needs ${ohm(largestAllowed)} or less; the smallest listed is ${ohm(shunts[0]!)})`,
      `raise --shunt-rating, add smaller shunts with --shunts, or raise --derate only as far as the shunt's datasheet allows`,
    );
  }
  shunts = rated;

  if (request.maxLossW !== undefined) {
    const budget = request.maxLossW;
    const cool = shunts.filter((rs) => shuntLoss(current, rs) <= budget * (1 + 1e-12));
    rejected['loss budget'] = shunts.length - cool.length;
    if (cool.length === 0) {
      throw new ImpossibleError(
        '--max-loss',
        `every usable shunt dissipates more than ${w(budget)} at ${a(current)} (the smallest, ${ohm(shunts[0]!)}, dissipates ${w(shuntLoss(current, shunts[0]!))}; the budget needs ${ohm(largestShuntForLoss(current, budget))} or less)`,
        `raise --max-loss to at least ${w(shuntLoss(current, shunts[0]!))}, or add shunts of ${ohm(largestShuntForLoss(current, budget))} or less with --shunts`,
      );
    }
    shunts = cool;
  }

  const offset = Math.abs(topology.usesAmplifier ? request.amplifierOffset : request.compareOffset);
  if (offset > 0) {
    const loud = shunts.filter((rs) => rs * current >= MIN_SIGNAL_TO_OFFSET * offset);
    rejected['shunt voltage under 10× offset'] = shunts.length - loud.length;
    if (loud.length === 0) {
      const largest = shunts[shunts.length - 1]!;
      const which = topology.usesAmplifier ? 'amplifier offset (--vos)' : 'comparing stage offset (--vos-cmp)';
      throw new ImpossibleError(
        '--limit',
        `at ${a(current)} the largest usable shunt (${ohm(largest)}) gives ${v(largest * current)}, less than ${MIN_SIGNAL_TO_OFFSET}× the ${v(offset)} ${which}, so offset would swamp the limit`,
        `use a lower-offset part (a zero-drift amplifier), allow a larger shunt (--max-loss, --shunt-rating, --shunts), or sense a higher current`,
      );
    }
    shunts = loud;
  }
  return { shunts, rejected };
}

/**
 * The rule behind `sense`'s "!" and `design`'s choice: the candidate's quick worst-case highest limit loads the shunt
 * past its loss limit (the derated rating, or the loss budget when lower; shuntLossLimit). `sense` lists such a
 * candidate with "!"; `design` never picks one.
 */
export function exceedsLossLimit(candidate: SenseCandidate): boolean {
  return candidate.worstCase.max > candidate.shuntMaxCurrent * (1 + 1e-12);
}
