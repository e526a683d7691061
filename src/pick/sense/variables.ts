// Building the uncertain quantities of a sense candidate: a part with a relative tolerance, an offset of either sign.
import type { UncertainVariable } from './types.js';

/** A part at nominal ± tolerance (a fraction). */
export function toleranceVariable(name: string, nominal: number, tolerance: number): UncertainVariable {
  return { name, nominal, lo: nominal * (1 - tolerance), hi: nominal * (1 + tolerance), offset: false };
}

/** An offset or bias current between −max and +max, nominal 0 (its sign is not known in production). */
export function offsetVariable(name: string, max: number): UncertainVariable {
  const size = Math.abs(max);
  return { name, nominal: 0, lo: -size, hi: size, offset: true };
}

/** A bias current within its band [lo, hi] about its nominal (a typical value has lo = hi = nominal). */
export function bandVariable(name: string, band: { nominal: number; lo: number; hi: number }): UncertainVariable {
  return { name, nominal: band.nominal, lo: band.lo, hi: band.hi, offset: true };
}

/** Index of a named variable; the names are fixed by each topology, so a miss is a programming error. */
export function indexOfVariable(variables: readonly UncertainVariable[], name: string): number {
  const index = variables.findIndex((v) => v.name === name);
  if (index < 0) throw new Error(`sense model has no variable '${name}'`);
  return index;
}
