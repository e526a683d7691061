// The standard values that bracket a target: the largest at or below it, the smallest at or above it, and the
// nearer of the two. "Nearer" is the smaller |chosen − target|, which is also the smaller relative error against
// the target (same denominator); a tie goes to the lower value.
// Works on an IEC 60063 series (every decade) or on an ascending list such as a stock file.
import { InputError } from '../errors.js';
import { seriesValuesBetween } from './enumerate.js';
import type { SeriesName } from './load.js';
import { relativeErrorPct } from './relative-error.js';

export interface Bracket {
  below: number;
  above: number;
  nearest: number;
  belowErrorPct: number;
  aboveErrorPct: number;
  nearestErrorPct: number;
}

/** Like Bracket, but a finite list may have nothing below or above the target. */
export interface ListBracket {
  below: number | null;
  above: number | null;
  nearest: number;
  belowErrorPct: number | null;
  aboveErrorPct: number | null;
  nearestErrorPct: number;
}

/** Index of the first element ≥ target in ascending `values` (values.length when none). */
export function lowerBound(values: ArrayLike<number>, target: number): number {
  let lo = 0;
  let hi = values.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((values[mid] as number) < target) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

function checkTarget(value: number, where: string): void {
  if (!Number.isFinite(value) || !(value > 0)) {
    throw new InputError(where, `target resistance must be a positive finite number, got ${value}`, 'a resistance > 0');
  }
}

function bracketInList(value: number, values: readonly number[]): ListBracket {
  if (values.length === 0) throw new InputError('values', 'the list of standard values is empty', 'at least one value');
  const i = lowerBound(values, value);
  const above = i < values.length ? (values[i] as number) : null;
  const below = above === value ? value : i > 0 ? (values[i - 1] as number) : null;
  let nearest: number;
  if (below === null) nearest = above as number;
  else if (above === null) nearest = below;
  else nearest = above - value < value - below ? above : below;
  return {
    below,
    above,
    nearest,
    belowErrorPct: below === null ? null : relativeErrorPct(below, value),
    aboveErrorPct: above === null ? null : relativeErrorPct(above, value),
    nearestErrorPct: relativeErrorPct(nearest, value),
  };
}

export function nearestStandard(value: number, series: SeriesName, where?: string): Bracket;
export function nearestStandard(value: number, series: readonly number[], where?: string): ListBracket;
export function nearestStandard(value: number, series: SeriesName | readonly number[], where = 'value'): Bracket | ListBracket {
  checkTarget(value, where);
  if (typeof series !== 'string') return bracketInList(value, series);
  // One decade either side always holds a value below and one above (every series starts each decade at 1.0).
  return bracketInList(value, seriesValuesBetween(series, value / 10, value * 10)) as Bracket;
}
