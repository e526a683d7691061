// How divider candidates are ordered, and a bounded list that keeps the best few while a search runs.
// Order: score (|Vout error| for a fixed output; wasted range for an adjustable one), then fewer physical parts,
// then the more common source (E24 before E96), then a divider current nearer the middle of its window.
// Scores are compared at 1e-9 resolution (SCORE_STEP): two candidates closer than one part per billion are a tie,
// so a float rounding difference never outranks a real difference in parts count or series.

export const SCORE_STEP = 1e-9;

export interface RankKey {
  /** Quantized score: round(score / SCORE_STEP). Lower is better. */
  score: number;
  parts: number;
  /** Index of the rarest source used (0 = most common). */
  sourceRank: number;
  /** Quantized |ln(Rbottom / window middle)|: distance of the divider current from the middle of its window. */
  centre: number;
}

export function quantize(score: number): number {
  return Math.round(score / SCORE_STEP);
}

export function compareKeys(a: RankKey, b: RankKey): number {
  return a.score - b.score || a.parts - b.parts || a.sourceRank - b.sourceRank || a.centre - b.centre;
}

export interface Ranked<T> {
  key: RankKey;
  item: T;
}

export interface BestList<T> {
  readonly entries: Ranked<T>[];
  /** Score a new entry must not exceed to have a chance; Infinity until the list is full. */
  scoreLimit(): number;
  offer(key: RankKey, item: T): void;
}

/**
 * Keeps the `capacity` best entries in order. Entries that `same` calls equal (the same leg values realised with
 * different parts) are kept once, as the best-ranked realisation.
 */
export function bestList<T>(capacity: number, same: (a: T, b: T) => boolean): BestList<T> {
  const entries: Ranked<T>[] = [];
  const full = (): boolean => entries.length >= capacity;
  return {
    entries,
    scoreLimit: () => (full() ? entries[entries.length - 1]!.key.score : Infinity),
    offer(key, item) {
      if (full() && compareKeys(key, entries[entries.length - 1]!.key) >= 0) return;
      const twin = entries.findIndex((e) => same(e.item, item));
      if (twin >= 0) {
        if (compareKeys(key, entries[twin]!.key) >= 0) return;
        entries.splice(twin, 1);
      }
      let at = entries.length;
      while (at > 0 && compareKeys(key, entries[at - 1]!.key) < 0) at--;
      entries.splice(at, 0, { key, item });
      if (entries.length > capacity) entries.pop();
    },
  };
}
