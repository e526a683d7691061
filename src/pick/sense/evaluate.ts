// Figures of one sense design: nominal limit and error, shunt voltage and loss, amplifier output, the offset error
// and the quick worst case. The worst case enumerates every vertex of the tolerance box (src/analysis/corners.ts),
// exact here because each limit transfer is monotonic in every part and offset over a tolerance-sized box.
import { cornerExtremes } from '../../analysis/corners.js';
import { shuntLoss, shuntLossLimit, shuntMaxCurrent } from '../../circuits/shunt-power.js';
import type { SenseDesign } from './topology.js';
import type { SenseCandidate, SenseRequest, SenseTopologyName, UncertainVariable } from './types.js';

/** Extremes of `limit` over the variables selected by `free`, the others held at nominal. */
function extremesOver(
  variables: readonly UncertainVariable[],
  limit: (x: Float64Array) => number,
  free: (v: UncertainVariable) => boolean,
): { min: number; max: number } {
  const x = Float64Array.from(variables, (v) => v.nominal);
  const moving = variables.map((v, i) => (free(v) && v.hi > v.lo ? i : -1)).filter((i) => i >= 0);
  if (moving.length === 0) {
    const y = limit(x);
    return { min: y, max: y };
  }
  const lo = moving.map((i) => variables[i]!.lo);
  const hi = moving.map((i) => variables[i]!.hi);
  const { min, max } = cornerExtremes(
    (sub) => {
      for (let k = 0; k < moving.length; k++) x[moving[k]!] = sub[k]!;
      return limit(x);
    },
    lo,
    hi,
  );
  return { min, max };
}

export interface EvaluatedDesign {
  candidate: SenseCandidate;
  /** Amplifier output at 120 % of the target (the headroom check), V. */
  outputAtOverload: number;
  /** Highest amplifier input voltage at 120 % of the target, V (undefined when it stays near ground). */
  inputAtOverload: number | undefined;
}

/** Overload point for the rail checks: the output must stay in range up to 120 % of the limit (common practice). */
export const OVERLOAD_FACTOR = 1.2;

export function evaluateDesign(design: SenseDesign, topology: SenseTopologyName, request: SenseRequest): EvaluatedDesign {
  const { variables, limit, output, amplifierInput } = design.model;
  const target = request.limit;
  const nominal = Float64Array.from(variables, (v) => v.nominal);
  const limitNominal = limit(nominal);
  const shunt = design.parts['RS']!;
  const offsets = extremesOver(variables, limit, (v) => v.offset);
  const worstCase = extremesOver(variables, limit, () => true);
  const offsetError = Math.max(Math.abs(offsets.max - limitNominal), Math.abs(limitNominal - offsets.min));
  const candidate: SenseCandidate = {
    topology,
    parts: design.parts,
    gain: design.gain,
    threshold: design.threshold,
    limit: limitNominal,
    errorPct: ((limitNominal - target) / target) * 100,
    shuntVoltage: limitNominal * shunt,
    shuntLossW: shuntLoss(limitNominal, shunt),
    shuntMaxCurrent: shuntMaxCurrent(shunt, shuntLossLimit(request.shuntRatingW, request.derating, request.maxLossW).watts),
    worstCaseLossW: shuntLoss(worstCase.max, shunt),
    outputAtLimit: output(nominal, limitNominal),
    offsetErrorPct: (offsetError / target) * 100,
    worstCase,
    worstCaseSpreadPct: (Math.max(worstCase.max - target, target - worstCase.min) / target) * 100,
  };
  const overload = OVERLOAD_FACTOR * target;
  return {
    candidate,
    outputAtOverload: output(nominal, overload),
    inputAtOverload: amplifierInput ? amplifierInput(nominal, overload) : undefined,
  };
}
