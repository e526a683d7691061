// The threshold of a sense candidate: a fixed voltage with its tolerance, or a reference through a picked divider
// RT1/RT2 (src/circuits/sense/threshold-divider.ts). Either way it becomes uncertain variables plus a function that
// reads the threshold back from a vector of their values.
import { thresholdDividerRatio, thresholdFromReference } from '../../circuits/sense/threshold-divider.js';
import { nearestRatioPairs } from './ratio-pairs.js';
import type { ThresholdSource, UncertainVariable } from './types.js';
import { indexOfVariable, toleranceVariable } from './variables.js';

export interface ThresholdPlan {
  /** Nominal threshold, V. */
  volts: number;
  /** RT1 and RT2 when a divider was picked. */
  parts: Record<string, number>;
  variables: UncertainVariable[];
  /** The threshold for values `x`, the plan's variables found at their names in `all`. */
  bind(all: readonly UncertainVariable[]): (x: Float64Array) => number;
}

/** Geometric centre of the resistor window: among equal-ratio pairs, the one nearest it is kept. */
export function windowCentre(values: readonly number[]): number {
  return Math.sqrt(values[0]! * values[values.length - 1]!);
}

/** Log-distance of a pair's geometric mean from the window centre (smaller is more central). */
export function offCentre(a: number, b: number, centre: number): number {
  return Math.abs(Math.log(Math.sqrt(a * b) / centre));
}

/**
 * The threshold plan for a wanted threshold `volts`; undefined when a divider cannot make it from the reference
 * with the given resistor values (threshold at or above the reference, or a ratio outside the window).
 */
export function planThreshold(
  source: ThresholdSource,
  volts: number,
  resistorValues: readonly number[],
  resistorTolerance: number,
): ThresholdPlan | undefined {
  if (source.kind === 'fixed') {
    return {
      volts: source.volts,
      parts: {},
      variables: [toleranceVariable('Vth', source.volts, source.tolerance)],
      bind(all) {
        const i = indexOfVariable(all, 'Vth');
        return (x) => x[i]!;
      },
    };
  }
  if (!(volts > 0) || volts >= source.reference || resistorValues.length === 0) return undefined;
  const ratio = thresholdDividerRatio(source.reference, volts);
  const lowest = resistorValues[0]!;
  const highest = resistorValues[resistorValues.length - 1]!;
  if (ratio < lowest / highest || ratio > highest / lowest) return undefined;
  const pairs = nearestRatioPairs(resistorValues, ratio, (rt1, rt2) =>
    Math.abs(thresholdFromReference(source.reference, rt1, rt2) / volts - 1),
  );
  const centre = windowCentre(resistorValues);
  const best = pairs.reduce((a, b) => (offCentre(b.numerator, b.denominator, centre) < offCentre(a.numerator, a.denominator, centre) ? b : a));
  const rt1 = best.numerator;
  const rt2 = best.denominator;
  return {
    volts: thresholdFromReference(source.reference, rt1, rt2),
    parts: { RT1: rt1, RT2: rt2 },
    variables: [
      toleranceVariable('Vref', source.reference, source.tolerance),
      toleranceVariable('RT1', rt1, resistorTolerance),
      toleranceVariable('RT2', rt2, resistorTolerance),
    ],
    bind(all) {
      const iv = indexOfVariable(all, 'Vref');
      const i1 = indexOfVariable(all, 'RT1');
      const i2 = indexOfVariable(all, 'RT2');
      return (x) => thresholdFromReference(x[iv]!, x[i1]!, x[i2]!);
    },
  };
}
