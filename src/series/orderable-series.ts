// The series to order a resistor from: the smallest IEC 60063 series whose decade holds the value and that is
// commonly sold at the part's tolerance or tighter (the series files' commonTolerances: common practice).
// A 1.00 kΩ 1 % part is ordered as E24, not E3 (E3 parts are not sold at 1 %); a 10.7 kΩ 0.1 % part as E192.
import { loadSeries, SERIES_NAMES, type SeriesName } from './load.js';

function holds(name: SeriesName, significand: number): boolean {
  return loadSeries(name).values.some((v) => Math.abs(v - significand) <= 1e-9 * v);
}

/** Tightest tolerance a series is commonly sold in, as a fraction ("0.1 %" → 0.001; ">20 %" → 0.2). */
function tightestCommonTolerance(name: SeriesName): number {
  const fractions = loadSeries(name).commonTolerances.map((text) => Number(text.replace(/[^0-9.]/g, '')) / 100);
  return Math.min(...fractions);
}

/**
 * Smallest series that holds `ohms` and is commonly sold at `tolerance` (a fraction) or tighter, else the finest
 * series that holds it;
 * undefined when no series holds the value (a non-standard value).
 */
export function orderableSeries(ohms: number, tolerance: number): SeriesName | undefined {
  if (!(ohms > 0) || !Number.isFinite(ohms)) return undefined;
  const exponent = Math.floor(Math.log10(ohms) + 1e-12);
  const significand = ohms / 10 ** exponent;
  const holding = SERIES_NAMES.filter((name) => holds(name, significand));
  return holding.find((name) => tightestCommonTolerance(name) <= tolerance * (1 + 1e-9)) ?? holding[holding.length - 1];
}

/** Every IEC 60063 series whose decade holds `ohms`, coarsest first; empty for a value no series holds. */
export function seriesHolding(ohms: number): SeriesName[] {
  if (!(ohms > 0) || !Number.isFinite(ohms)) return [];
  const exponent = Math.floor(Math.log10(ohms) + 1e-12);
  const significand = ohms / 10 ** exponent;
  return SERIES_NAMES.filter((name) => holds(name, significand));
}
