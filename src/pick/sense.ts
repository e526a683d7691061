// The current-limit picker: for a target limit, each usable shunt gets the gain resistors (and threshold divider)
// from the series that bring the limit closest to the target; each design is then judged by its quick worst case.
// Candidates are ranked by worst-case spread, then shunt loss; the Pareto front of loss against spread shows the
// trade between a cool shunt and a tight limit. Pure: SI numbers in, candidates out; impossible requests throw
// ImpossibleError with the constraint and its remedy.
import { ImpossibleError, InputError } from '../errors.js';
import { formatEngineering } from '../units/index.js';
import { paretoFront } from './pareto.js';
import { evaluateDesign, type EvaluatedDesign } from './sense/evaluate.js';
import { checkThreshold, usableShunts, wantedThreshold } from './sense/feasibility.js';
import { offCentre, planThreshold, windowCentre } from './sense/threshold.js';
import { SENSE_TOPOLOGY_MODULES } from './sense/topologies.js';
import type { SenseCandidate, SensePick, SenseRequest } from './sense/types.js';

export type { SenseCandidate, SensePick, SenseRequest } from './sense/types.js';

const REASON_DIVIDER = 'threshold divider out of reach';
const REASON_GAIN = 'gain out of reach of the resistor values';
const REASON_OUTPUT = 'amplifier output above rail − headroom at 120 % of the limit';
const REASON_INPUT = 'amplifier inputs above the rail (common mode)';
const REASON_OFFSET = 'offsets can cancel the threshold';

function checkRequest(request: SenseRequest): void {
  const positive: Array<[string, number]> = [
    ['--limit', request.limit],
    ['--shunt-rating', request.shuntRatingW],
    ['--derate', request.derating],
    ['--rail', request.rail],
  ];
  for (const [where, value] of positive) {
    if (!(value > 0) || !Number.isFinite(value)) throw new InputError(where, `must be a positive finite number, got ${value}`, 'a value above zero');
  }
  if (request.derating > 1) throw new InputError('--derate', 'cannot use more than 100 % of the rating', 'a percentage up to 100 %, commonly 50–60 %');
  if (request.shunts.length === 0 || request.shunts.some((rs) => !(rs > 0) || !Number.isFinite(rs))) {
    throw new InputError('--shunts', 'needs at least one positive shunt value', 'a comma-separated list such as 10m,20m,R05');
  }
  if (!(request.headroom >= 0) || request.headroom >= request.rail) {
    throw new InputError('--headroom', `must be at least 0 and below the ${formatEngineering(request.rail, 'V')} rail`, 'a voltage such as 0.2V');
  }
  if (request.commonMode !== 0 && request.topology !== 'diff') {
    throw new InputError('--common-mode', `the ${request.topology} topology senses on the low side only`, 'use --topology diff for high-side sensing, or leave --common-mode at 0');
  }
  const threshold = request.threshold;
  if (threshold.kind === 'divider' && threshold.volts === undefined && request.topology !== 'direct') {
    throw new InputError('--threshold', `the ${request.topology} topology needs a threshold voltage to aim the divider at`, 'a voltage, e.g. --threshold 0.5V');
  }
  const needsResistors = request.topology !== 'direct' || threshold.kind === 'divider';
  if (needsResistors && request.resistorValues.length === 0) {
    throw new InputError('--window', 'no resistor value of the series lies in the window', 'a window that spans at least one series value, e.g. 1k..1M');
  }
}

/** Best of the equal-ratio designs for one shunt: tightest worst case, then the pair nearest the window centre. */
function bestOf(designs: EvaluatedDesign[], centre: number): EvaluatedDesign {
  const centrality = (d: EvaluatedDesign): number => {
    const values = Object.entries(d.candidate.parts).filter(([k]) => k !== 'RS').map(([, r]) => r);
    return values.length === 0 ? 0 : offCentre(Math.min(...values), Math.max(...values), centre);
  };
  return designs.reduce((best, d) => {
    const delta = d.candidate.worstCaseSpreadPct - best.candidate.worstCaseSpreadPct;
    if (delta < -1e-9 || (Math.abs(delta) <= 1e-9 && centrality(d) < centrality(best))) return d;
    return best;
  });
}

function allFinite(c: SenseCandidate): boolean {
  const numbers = [c.gain, c.threshold, c.limit, c.errorPct, c.shuntVoltage, c.shuntLossW, c.shuntMaxCurrent, c.worstCaseLossW, c.outputAtLimit, c.offsetErrorPct, c.worstCase.min, c.worstCase.max, c.worstCaseSpreadPct, ...Object.values(c.parts)];
  return numbers.every(Number.isFinite);
}

/** Most shunt values the picker takes. Each usable shunt costs about 0.1 ms of synchronous search (measured on the
 * charger example: 1 000 candidates ~0.1–0.3 s, 10 000 ~1 s, 100 000 took 26.8 s and could not be interrupted);
 * the default list has 35. */
export const MAX_SHUNT_CANDIDATES = 1000;

export function pickSense(request: SenseRequest): SensePick {
  checkRequest(request);
  const topology = SENSE_TOPOLOGY_MODULES[request.topology];
  checkThreshold(request, topology);
  const { shunts, rejected } = usableShunts(request, topology);
  const count = (reason: string): void => {
    rejected[reason] = (rejected[reason] ?? 0) + 1;
  };
  const centre = request.resistorValues.length > 0 ? windowCentre(request.resistorValues) : 1;
  const reach = request.rail - request.headroom;
  const candidates: SenseCandidate[] = [];
  let considered = 0;
  for (const shunt of shunts) {
    const thresholdTarget = wantedThreshold(request) ?? shunt * request.limit;
    const plan = planThreshold(request.threshold, thresholdTarget, request.resistorValues, request.resistorTolerance);
    if (!plan) {
      count(REASON_DIVIDER);
      continue;
    }
    const designs = topology.designs(shunt, plan, request);
    if (designs.length === 0) {
      count(REASON_GAIN);
      continue;
    }
    const fitting: EvaluatedDesign[] = [];
    const reasons = new Set<string>();
    for (const design of designs) {
      considered++;
      const evaluated = evaluateDesign(design, request.topology, request);
      if (topology.usesAmplifier && evaluated.outputAtOverload > reach) reasons.add(REASON_OUTPUT);
      else if (evaluated.inputAtOverload !== undefined && evaluated.inputAtOverload > request.rail) reasons.add(REASON_INPUT);
      else if (!(evaluated.candidate.worstCase.min > 0) || !allFinite(evaluated.candidate)) reasons.add(REASON_OFFSET);
      else fitting.push(evaluated);
    }
    if (fitting.length === 0) {
      for (const reason of reasons) count(reason);
      continue;
    }
    candidates.push(bestOf(fitting, centre).candidate);
  }
  if (candidates.length === 0) throw nothingFits(request, shunts, rejected);
  // Spreads equal to 1e-9 % (rounding) count as equal, so loss decides between them.
  candidates.sort((x, y) => {
    const spread = x.worstCaseSpreadPct - y.worstCaseSpreadPct;
    return Math.abs(spread) > 1e-9 ? spread : x.shuntLossW - y.shuntLossW;
  });
  const pareto = paretoFront(candidates, (c) => c.shuntLossW, (c) => c.worstCaseSpreadPct);
  for (const key of Object.keys(rejected)) if (rejected[key] === 0) delete rejected[key];
  return { target: request.limit, candidates, pareto, considered, rejected };
}

/** The one-line reason when every usable shunt failed a per-design check. */
function nothingFits(request: SenseRequest, shunts: readonly number[], rejected: Record<string, number>): ImpossibleError {
  const v = (x: number): string => formatEngineering(x, 'V');
  const n = shunts.length;
  const threshold = wantedThreshold(request);
  if ((rejected[REASON_INPUT] ?? 0) > 0) {
    return new ImpossibleError(
      '--common-mode',
      `at ${v(request.commonMode)} common mode the amplifier's inputs would sit above its ${v(request.rail)} rail for every usable shunt`,
      `power the amplifier from a rail above the common mode (--rail), or use a current-sense amplifier rated for ${v(request.commonMode)}`,
    );
  }
  if ((rejected[REASON_GAIN] ?? 0) === n && threshold !== undefined) {
    const topology = SENSE_TOPOLOGY_MODULES[request.topology];
    const { lo, hi } = topology.gainRange(request.resistorValues);
    const gains = shunts.map((rs) => threshold / (rs * request.limit));
    const low = Math.min(...gains);
    const high = Math.max(...gains);
    return new ImpossibleError(
      '--threshold',
      `the usable shunts need gains of ${low.toPrecision(3)}–${high.toPrecision(3)}, outside the ${lo.toPrecision(4)}–${hi.toPrecision(4)} the ${request.topology} resistors in the window can make`,
      high < lo
        ? `raise --threshold, use smaller shunts (--shunts), or use --topology diff, which can attenuate`
        : `lower --threshold, widen --window, or allow larger shunts (--max-loss, --shunt-rating, --shunts)`,
    );
  }
  if ((rejected[REASON_DIVIDER] ?? 0) === n) {
    return new ImpossibleError(
      '--threshold-from',
      `no divider from the reference makes the threshold every usable shunt needs (a threshold must be below the reference, with a ratio the window allows)`,
      `use a higher reference, widen --window, or give a fixed --threshold`,
    );
  }
  if ((rejected[REASON_OUTPUT] ?? 0) > 0) {
    return new ImpossibleError(
      '--rail',
      `every design's amplifier output at 120 % of the limit is above ${v(request.rail - request.headroom)} (rail − headroom)`,
      `lower --threshold, raise --rail, or reduce --headroom with a rail-to-rail output amplifier`,
    );
  }
  return new ImpossibleError(
    '--vos',
    `offsets and bias currents can cancel the threshold for every usable shunt, so the limit is not assured`,
    `use a lower-offset amplifier (--vos, --ib, --vos-cmp) or a larger shunt voltage (--shunts, --max-loss)`,
  );
}
