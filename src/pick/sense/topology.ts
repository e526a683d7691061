// What each sense topology gives the picker: the gain-resistor designs for one shunt, each as a small model of
// uncertain variables and the exact transfer from src/circuits/sense/. To add a topology: write its circuit file in
// src/circuits/sense/, a module here beside noninv.ts that implements SenseTopology, and one entry in topologies.ts.
import type { ThresholdPlan } from './threshold.js';
import type { SenseRequest, SenseTopologyName, UncertainVariable } from './types.js';

export interface SenseModel {
  variables: UncertainVariable[];
  /** Current at which the loop trips, for values x (one per variable, in order), A. */
  limit(x: Float64Array): number;
  /** Amplifier output (direct: the shunt voltage) at a load current, V. */
  output(x: Float64Array, current: number): number;
  /** Highest voltage at the amplifier's inputs at a load current, V (absent when it cannot leave the low rail). */
  amplifierInput?(x: Float64Array, current: number): number;
}

export interface SenseDesign {
  /** Parts by designator, Ω. */
  parts: Record<string, number>;
  gain: number;
  /** Nominal threshold, V. */
  threshold: number;
  model: SenseModel;
}

export interface SenseTopology {
  name: SenseTopologyName;
  /** Whether an amplifier sits between shunt and threshold (its rail, headroom and offset then apply). */
  usesAmplifier: boolean;
  /** Designators of the gain resistors, in the order the tables show them. */
  gainDesignators: readonly string[];
  /** Lowest and highest gain the resistor values can make. */
  gainRange(resistorValues: readonly number[]): { lo: number; hi: number };
  /**
   * The designs that bring this shunt's limit closest to the target with the threshold plan: the best gain pair and
   * any pair with the same ratio (other decades). Empty when the needed gain is out of reach.
   */
  designs(shunt: number, threshold: ThresholdPlan, request: SenseRequest): SenseDesign[];
}
