// Re-centring a pilot build with one resistor swap: which single divider or gain resistor, changed to another
// standard value of its own series, moves the measured mean nearest the middle of the spec window.
//
// With the swap, the model's output moves by f(R') − f(R) (f: the nominal output as a function of that resistor), so
// the build's mean is expected at x̄ + f(R') − f(R). The ideal R* solves f(R*) = f(R) + (centre − x̄); f is monotonic
// in each resistor (a divider leg, a gain resistor), so R* is found by bisection on log R over R/10 … 10·R, and the
// best standard value other than the present one is one of the two that bracket R* in the series, or, when one of
// those is the present value, its neighbour beyond: the series' own `nearestStandard` (src/series/nearest.ts) gives
// them, the same lookup `trimfree nearest` uses. Every swappable resistor is tried and
// the one whose expected mean lands nearest the centre wins (ties: the first in the design's order).
import { nominalOutputs } from '../analysis/model.js';
import { buildSupplyModel, type ResistorSpec, type SupplySpec } from '../analysis/models/supply.js';
import type { SeriesName } from '../series/load.js';
import { nearestStandard } from '../series/nearest.js';

/** How far either side of the present value the ideal value is sought (a decade: a swap, not a redesign). */
export const SWAP_REACH = 10;

export interface SwappableResistor {
  designator: string;
  /** Present value, Ω. */
  ohms: number;
  series: SeriesName;
  /** The supply with this resistor at `ohms`. */
  withValue(ohms: number): SupplySpec;
}

export interface ResistorSwap {
  designator: string;
  from: number;
  to: number;
  series: SeriesName;
  /** The build's mean expected after the swap: x̄ + f(to) − f(from). */
  expectedMean: number;
  /** expectedMean − centre. */
  error: number;
  /** The swapped supply. */
  spec: SupplySpec;
}

/** The divider and gain resistors of a supply (not the shunt, not a pot, not a jumper), with the series of each. */
export function swappableResistors(spec: SupplySpec, seriesOf: (designator: string) => SeriesName): SwappableResistor[] {
  const out: SwappableResistor[] = [];
  const add = (r: ResistorSpec | undefined, path: (s: SupplySpec) => ResistorSpec): void => {
    if (!r || r.name === 'jumper' || !(r.nominal > 0)) return;
    out.push({
      designator: r.name,
      ohms: r.nominal,
      series: seriesOf(r.name),
      withValue: (ohms) => {
        const copy = structuredClone(spec);
        path(copy).nominal = ohms;
        return copy;
      },
    });
  };
  spec.divider?.top.resistors.forEach((r, i) => add(r, (s) => s.divider!.top.resistors[i]!));
  spec.divider?.bottom.resistors.forEach((r, i) => add(r, (s) => s.divider!.bottom.resistors[i]!));
  const sense = spec.sense;
  if (sense?.topology === 'noninv') {
    add(sense.rf, (s) => (s.sense as typeof sense).rf);
    add(sense.rg, (s) => (s.sense as typeof sense).rg);
  }
  if (sense?.topology === 'diff') {
    for (const key of ['r1', 'r2', 'r3', 'r4'] as const) add(sense[key], (s) => (s.sense as typeof sense)[key]);
  }
  if (sense && sense.threshold.kind === 'divided') {
    const t = sense.threshold;
    add(t.top, (s) => (s.sense!.threshold as typeof t).top);
    add(t.bottom, (s) => (s.sense!.threshold as typeof t).bottom);
  }
  return out;
}

function nominalOf(spec: SupplySpec, output: string): number {
  return nominalOutputs(buildSupplyModel(spec))[output]!;
}

/** R with f(R) = goal by bisection on log R over [R/10, 10·R] (the nearer end when the goal lies beyond). */
function idealValue(f: (ohms: number) => number, ohms: number, goal: number): number {
  let lo = Math.log(ohms / SWAP_REACH);
  let hi = Math.log(ohms * SWAP_REACH);
  const rising = f(Math.exp(hi)) > f(Math.exp(lo));
  for (let i = 0; i < 60; i++) {
    const mid = (lo + hi) / 2;
    if (f(Math.exp(mid)) < goal === rising) lo = mid;
    else hi = mid;
  }
  return Math.exp((lo + hi) / 2);
}

/** The best single swap for one output, or null when no resistor moves it. */
export function bestSwap(spec: SupplySpec, output: string, measuredMean: number, centre: number, resistors: readonly SwappableResistor[]): ResistorSwap | null {
  const base = nominalOf(spec, output);
  const goal = base + (centre - measuredMean);
  let best: ResistorSwap | null = null;
  for (const r of resistors) {
    const f = (ohms: number): number => nominalOf(r.withValue(ohms), output);
    const lo = f(r.ohms / SWAP_REACH);
    const hi = f(r.ohms * SWAP_REACH);
    if (!(Math.abs(hi - lo) > 1e-12 * Math.max(Math.abs(base), 1e-300))) continue; // this resistor does not move the output
    const bracket = nearestStandard(idealValue(f, r.ohms, goal), r.series, r.designator);
    // When the ideal's bracket holds the present value itself, the best other value is its neighbour beyond it.
    const neighbours = [nearestStandard(r.ohms * (1 - 1e-9), r.series, r.designator).below, nearestStandard(r.ohms * (1 + 1e-9), r.series, r.designator).above];
    for (const to of new Set([bracket.below, bracket.above, ...neighbours])) {
      if (to === r.ohms) continue;
      const swapped = r.withValue(to);
      const expectedMean = measuredMean + nominalOf(swapped, output) - base;
      const error = expectedMean - centre;
      if (best === null || Math.abs(error) < Math.abs(best.error)) best = { designator: r.designator, from: r.ohms, to, series: r.series, expectedMean, error, spec: swapped };
    }
  }
  return best;
}
