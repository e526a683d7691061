// "Did you mean …?" for unknown names in a design file: the valid name nearest by edit distance.
//
// Distance: optimal string alignment (Levenshtein's insert / delete / substitute, plus the transposition of two
// adjacent characters, each costing 1), compared case-insensitively. Levenshtein, V. I., "Binary codes capable of
// correcting deletions, insertions and reversals", Soviet Physics Doklady 10 (1966); the transposition step as in
// Damerau, F. J., Comm. ACM 7(3) (1964). Typing errors are mostly one of these four operations.

/** Optimal-string-alignment edit distance between a and b (case-sensitive; callers fold case if they wish). */
export function editDistance(a: string, b: string): number {
  const n = a.length;
  const m = b.length;
  if (n === 0) return m;
  if (m === 0) return n;
  // Three rows: the one before last (for transpositions), the last, and the current.
  let before = new Array<number>(m + 1).fill(0);
  let last = Array.from({ length: m + 1 }, (_, j) => j);
  let current = new Array<number>(m + 1).fill(0);
  for (let i = 1; i <= n; i++) {
    current[0] = i;
    for (let j = 1; j <= m; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let best = Math.min(last[j] + 1, current[j - 1] + 1, last[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) best = Math.min(best, before[j - 2] + 1);
      current[j] = best;
    }
    [before, last, current] = [last, current, before];
  }
  return last[m];
}

/**
 * The valid name closest to `given`, or undefined when none is close enough to be a plausible typo:
 * at most a third of the longer name's letters changed, and at least 2 edits allowed (common practice for
 * "did you mean" hints). Ties go to the name listed first.
 */
export function suggestField(given: string, valid: readonly string[]): string | undefined {
  // A name more than half again as long as the longest valid one is never within a third of its letters: no
  // suggestion, and no quadratic distance over a hostile 10 MB key.
  const longest = valid.reduce((most, name) => Math.max(most, name.length), 0);
  if (given.length > 2 * longest + 2) return undefined;
  const folded = given.toLowerCase();
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const name of valid) {
    const distance = editDistance(folded, name.toLowerCase());
    const allowed = Math.max(2, Math.floor(Math.max(given.length, name.length) / 3));
    if (distance <= allowed && distance < bestDistance) {
      best = name;
      bestDistance = distance;
    }
  }
  return best;
}
