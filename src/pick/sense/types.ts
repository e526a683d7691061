// The request and the answer of the current-limit picker (SI numbers throughout: A, V, Ω, W; fractions, not %).
import type { CurrentBand } from '../../units/index.js';

export const SENSE_TOPOLOGIES = ['noninv', 'diff', 'direct'] as const;
export type SenseTopologyName = (typeof SENSE_TOPOLOGIES)[number];

/** Where the threshold comes from. */
export type ThresholdSource =
  | { kind: 'fixed'; volts: number; tolerance: number }
  /**
   * From a reference through a picked two-resistor divider RT1/RT2. `volts` is the wanted threshold; without it
   * (direct topology only) each shunt gets the divider that makes its own voltage at the limit the threshold.
   */
  | { kind: 'divider'; reference: number; tolerance: number; volts?: number };

export interface SenseRequest {
  /** Target current limit, A. */
  limit: number;
  topology: SenseTopologyName;
  threshold: ThresholdSource;
  /** Shunt values to consider, Ω. */
  shunts: readonly number[];
  /** Shunt tolerance, a fraction (0.01 = 1 %). */
  shuntTolerance: number;
  /** Shunt power rating, W. */
  shuntRatingW: number;
  /** Fraction of the rating the shunt may use at the hottest ambient (common practice: 0.5). */
  derating: number;
  /** Largest shunt loss allowed at the limit, W (no budget when absent). */
  maxLossW?: number;
  /** Candidate values for gain and threshold-divider resistors, Ω, ascending (a series within a window). */
  resistorValues: readonly number[];
  /** Tolerance of the gain and threshold-divider resistors, a fraction. */
  resistorTolerance: number;
  /**
   * The gain resistors (diff R1–R4, noninv RF/RG) as one network: absolute tolerance and ratio tolerance, fractions
   * (src/tolerance/network-bands.ts). Absent: each at ±resistorTolerance on its own.
   */
  gainNetwork?: { name: string; tolerance: number; ratio: number; trackingPerK?: number };
  /**
   * The gain resistors' TCR counted in the quick worst case (diff): every resistor within ±tcrPerK (a network: its
   * shared TCR and each member's own, from gainNetwork.trackingPerK, default 2·tcrPerK), at ambients 25 °C ± deltaT.
   * Absent: the quick worst case is at 25 °C.
   */
  gainTcr?: { tcrPerK: number; deltaT: number };
  /** Amplifier supply rail, V, and how close to it the output can swing, V. */
  rail: number;
  headroom: number;
  /** Largest amplifier input offset, V (either sign). */
  amplifierOffset: number;
  /** Largest offset of the stage that compares with the threshold, V (either sign). */
  compareOffset: number;
  /** Amplifier input bias current, A: its nominal and band (src/units/current-band.ts; lo = hi for a typical value). */
  biasCurrent: CurrentBand;
  /** Voltage of the shunt's load-side node: 0 for low-side sensing, the rail for high-side (diff only), V. */
  commonMode: number;
}

/** One uncertain quantity of a candidate: its nominal and the bounds the quick worst case spans. */
export interface UncertainVariable {
  name: string;
  nominal: number;
  lo: number;
  hi: number;
  /** An offset-like quantity (Vos, bias current): nominal 0, counted in the offset error. */
  offset: boolean;
}

export interface SenseCandidate {
  topology: SenseTopologyName;
  /** Parts by designator (RS, RF, RG, R1–R4, RT1, RT2), Ω. */
  parts: Record<string, number>;
  /** Nominal amplifier gain (1 for direct). */
  gain: number;
  /** Nominal threshold, V. */
  threshold: number;
  /** Nominal limit (all parts nominal, offsets zero), A. */
  limit: number;
  /** (limit − target)/target × 100. */
  errorPct: number;
  /** Shunt voltage and loss at the nominal limit. */
  shuntVoltage: number;
  shuntLossW: number;
  /** Largest current the shunt may carry at its loss limit (the derated rating, or the loss budget when lower), A. */
  shuntMaxCurrent: number;
  /** Shunt loss at the worst-case highest limit, W (above the loss limit when the spread eats the margin). */
  worstCaseLossW: number;
  /** Amplifier output at the nominal limit (direct: the shunt voltage), V. */
  outputAtLimit: number;
  /** Largest change of the limit from offsets and bias currents alone, % of the target. */
  offsetErrorPct: number;
  /** Quick worst case of the limit over every tolerance and offset (vertex enumeration), A. */
  worstCase: { min: number; max: number };
  /** Larger distance from the target to the worst-case min or max, % of the target. */
  worstCaseSpreadPct: number;
}

export interface SensePick {
  target: number;
  candidates: SenseCandidate[];
  /** Candidates no other is both cooler (less shunt loss) and tighter (smaller worst-case spread) than. */
  pareto: SenseCandidate[];
  /** How many designs were evaluated, and how many shunts each filter removed. */
  considered: number;
  rejected: Record<string, number>;
}
