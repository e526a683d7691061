// One leg of a divider: a single resistor, or two in series or in parallel (indices into the allowed values).
import { parallelResistance, seriesResistance } from '../../circuits/combine.js';

export type LegKind = 'single' | 'series' | 'parallel';

export interface Leg {
  kind: LegKind;
  /** Physical resistors in ohms (one or two). */
  parts: number[];
  /** Equivalent resistance of the leg, ohms. */
  ohms: number;
}

export function legOhms(kind: LegKind, a: number, b: number): number {
  if (kind === 'series') return seriesResistance(a, b);
  if (kind === 'parallel') return parallelResistance(a, b);
  return b;
}

export function makeLeg(kind: LegKind, a: number, b: number): Leg {
  return { kind, parts: kind === 'single' ? [b] : [a, b], ohms: legOhms(kind, a, b) };
}

/** Leg values equal to one part per billion are the same leg for ranking and de-duplication. */
export function sameOhms(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-9 * Math.max(a, b);
}
