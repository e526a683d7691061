// When the worst case does not bound Monte Carlo, the result says so and why. The worst case takes every part at
// the ends of its band; Monte Carlo stays inside it unless (a) a part is drawn from a distribution that leaves its
// band (an unbounded normal), (b) the worst case was found from sensitivity signs rather than every vertex, or (c) an
// output is not monotonic in a part over its band, so the band's ends do not hold its extremes. (a) is known before
// the run and named up front; after the run every output whose Monte Carlo range passes its worst case gets a note
// naming the output, how far, and which of (a)–(c) applies, so no result shows Monte Carlo beyond the worst case
// without a note.
import { DEFAULT_K, normalCdf } from '../tolerance/distributions/normal.js';
import { partVaries, type Part } from '../tolerance/part.js';

/** Varying parts Monte Carlo draws from an unbounded normal: they can fall outside the band the worst case takes. */
export function partsBeyondTheirBand(parts: readonly Part[]): Part[] {
  return parts.filter((p) => partVaries(p) && p.distribution.kind === 'normal');
}

/** The up-front note for parts that can leave their band, or none. */
export function unboundedPartsNote(parts: readonly Part[]): string[] {
  const beyond = partsBeyondTheirBand(parts);
  if (beyond.length === 0) return [];
  const ks = [...new Set(beyond.map((p) => (p.distribution.kind === 'normal' ? (p.distribution.k ?? DEFAULT_K) : DEFAULT_K)))];
  // Share of a normal outside ±kσ: 2·(1 − Φ(k)) (0.27 % for k = 3).
  const shares = ks.map((k) => `${(200 * (1 - normalCdf(k))).toPrecision(2)} % outside ±${k}σ`).join(', ');
  return [
    `Worst case does not bound Monte Carlo: ${beyond.map((p) => p.name).join(', ')} ${beyond.length === 1 ? 'is' : 'are'} drawn from an unbounded normal (band = ±kσ; ${shares}), so Monte Carlo draws values outside the band the worst case takes. A design file's "normal" is cut off at the band (makers test parts to their band); "normal-unbounded" is not.`,
  ];
}

interface Observed {
  name: string;
  unit: string;
  /** Monte Carlo extremes. */
  min: number;
  max: number;
  worstCase: { min: number; max: number; method: string };
}

/** Relative slack for rounding: a worst-case vertex and a Monte Carlo trial at the same point agree to a few ulps. */
const ROUNDING = 1e-12;

function plain(value: number, unit: string): string {
  return `${Number(value.toPrecision(6))} ${unit}`.trimEnd();
}

/** One note per output whose Monte Carlo range passes its worst case, naming why. */
export function beyondWorstCaseNotes(parts: readonly Part[], outputs: readonly Observed[]): string[] {
  const beyond = partsBeyondTheirBand(parts);
  const notes: string[] = [];
  for (const o of outputs) {
    const slack = ROUNDING * Math.max(Math.abs(o.worstCase.min), Math.abs(o.worstCase.max));
    const below = o.min < o.worstCase.min - slack;
    const above = o.max > o.worstCase.max + slack;
    if (!below && !above) continue;
    const reached = [below ? `down to ${plain(o.min, o.unit)}` : '', above ? `up to ${plain(o.max, o.unit)}` : ''].filter(Boolean).join(' and ');
    const why =
      beyond.length > 0
        ? `${beyond.map((p) => p.name).join(', ')} ${beyond.length === 1 ? 'is' : 'are'} drawn from an unbounded normal that leaves its band`
        : o.worstCase.method === 'sensitivity-signs'
          ? 'the worst case came from sensitivity signs (too many parts to enumerate every vertex) and missed this corner'
          : 'the output is not monotonic in every part over its band, so the band ends do not hold its extremes';
    notes.push(`${o.name}: Monte Carlo reached ${reached}, beyond the worst case ${plain(o.worstCase.min, o.unit)} … ${plain(o.worstCase.max, o.unit)}: ${why}.`);
  }
  return notes;
}
