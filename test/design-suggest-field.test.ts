// Edit distance and the "did you mean" hint for unknown design-file fields.
// Expected distances: the textbook examples (Levenshtein: kitten → sitting = 3, a standard example of the metric;
// optimal string alignment: "ca" → "abc" = 3, the classic case where OSA differs from unrestricted
// Damerau–Levenshtein, which gives 2), and a brute-force reference: the recursive definition of OSA, evaluated
// with memoisation, on random short strings.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { editDistance, suggestField } from '../src/design/suggest-field.js';

/** The OSA distance straight from its recursive definition (reference). */
function osaReference(a: string, b: string): number {
  const memo = new Map<string, number>();
  const d = (i: number, j: number): number => {
    const key = `${i},${j}`;
    const hit = memo.get(key);
    if (hit !== undefined) return hit;
    let best: number;
    if (i === 0) best = j;
    else if (j === 0) best = i;
    else {
      best = Math.min(d(i - 1, j) + 1, d(i, j - 1) + 1, d(i - 1, j - 1) + (a[i - 1] === b[j - 1] ? 0 : 1));
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) best = Math.min(best, d(i - 2, j - 2) + 1);
    }
    memo.set(key, best);
    return best;
  };
  return d(a.length, b.length);
}

describe('editDistance', () => {
  it('gives the textbook values', () => {
    expect(editDistance('kitten', 'sitting')).toBe(3);
    expect(editDistance('ca', 'abc')).toBe(3);
    expect(editDistance('', 'abc')).toBe(3);
    expect(editDistance('abc', '')).toBe(3);
    expect(editDistance('tolerance', 'tolerance')).toBe(0);
    expect(editDistance('topolgy', 'topology')).toBe(1); // one transposition
  });

  it('agrees with the recursive definition on random short strings', () => {
    fc.assert(
      fc.property(fc.string({ unit: fc.constantFrom('a', 'b', 'c', 'd'), maxLength: 7 }), fc.string({ unit: fc.constantFrom('a', 'b', 'c', 'd'), maxLength: 7 }), (a, b) => {
        expect(editDistance(a, b)).toBe(osaReference(a, b));
      }),
      { numRuns: 500 },
    );
  });

  it('is symmetric', () => {
    fc.assert(fc.property(fc.string({ maxLength: 8 }), fc.string({ maxLength: 8 }), (a, b) => editDistance(a, b) === editDistance(b, a)));
  });
});

describe('suggestField', () => {
  const fields = ['target', 'window', 'topology', 'shunt', 'amplifier', 'compareOffset', 'threshold', 'gain'];
  it('suggests the closest name for typical typos', () => {
    expect(suggestField('topolgy', fields)).toBe('topology');
    expect(suggestField('treshold', fields)).toBe('threshold');
    expect(suggestField('Target', fields)).toBe('target');
    expect(suggestField('amplfier', fields)).toBe('amplifier');
  });
  it('suggests nothing for a name that is not a plausible typo', () => {
    expect(suggestField('colour', fields)).toBeUndefined();
    expect(suggestField('x', ['tolerance'])).toBeUndefined();
  });
});
