// The physical resistor values a divider may use: standard series (IEC 60063:2015 decades, via series/) or a stock
// list, limited to [minOhms, maxOhms], as one ascending typed array. Each value remembers its source: the most
// common requested series that offers it (E24 before E96), so a candidate can be labelled with the rarest part it needs.
import { ImpossibleError } from '../../errors.js';
import { SERIES_NAMES, type SeriesName } from '../../series/load.js';
import { seriesValuesBetween } from '../../series/enumerate.js';

export interface AllowedValues {
  /** Resistances in ohms, ascending and distinct. */
  ohms: Float64Array;
  /** Per value: index into `sources`; a lower index is the more common source. */
  sourceRank: Uint8Array;
  /** Source labels, most common first, e.g. ['E24', 'E96'] or ['stock']. */
  sources: string[];
}

/** Coarser series are the more common ones: E3 < E6 < … < E192 (fewer values, stocked more widely: common practice). */
export function byCommonness(names: readonly SeriesName[]): SeriesName[] {
  const unique = [...new Set(names)];
  return unique.sort((a, b) => SERIES_NAMES.indexOf(a) - SERIES_NAMES.indexOf(b));
}

export function allowedFromSeries(names: readonly SeriesName[], minOhms: number, maxOhms: number): AllowedValues {
  const sources = byCommonness(names);
  const rankOf = new Map<number, number>();
  sources.forEach((name, rank) => {
    for (const value of seriesValuesBetween(name, minOhms, maxOhms)) {
      if (!rankOf.has(value)) rankOf.set(value, rank);
    }
  });
  return pack(rankOf, sources, `series ${sources.join(', ')}`, minOhms, maxOhms);
}

export function allowedFromStock(values: readonly number[], minOhms: number, maxOhms: number): AllowedValues {
  const rankOf = new Map<number, number>();
  for (const value of values) if (value >= minOhms && value <= maxOhms) rankOf.set(value, 0);
  return pack(rankOf, ['stock'], 'the stock list', minOhms, maxOhms);
}

function pack(rankOf: Map<number, number>, sources: string[], what: string, minOhms: number, maxOhms: number): AllowedValues {
  if (rankOf.size === 0) {
    throw new ImpossibleError('--max', `${what} has no value between ${minOhms} Ω and ${maxOhms} Ω`, 'raise --max or add values to the list');
  }
  const ohms = Float64Array.from(rankOf.keys()).sort();
  const sourceRank = new Uint8Array(ohms.length);
  for (let i = 0; i < ohms.length; i++) sourceRank[i] = rankOf.get(ohms[i]!)!;
  return { ohms, sourceRank, sources };
}
