// Exact search for the fixed dividers nearest a target output.
//
// For each allowed bottom leg the output is Vref + Rtop·g with g = Vref/Rbottom + Ifb > 0, so the error is a
// V-shaped function of Rtop with its zero at the ideal top (dividerRtopFor). Every family of top legs is a sorted
// stream: the single values; for a fixed first part a, a + b and a ∥ b over b ≥ a (both increase with b). In each
// stream a binary search finds the ideal's position and a two-pointer walk visits values in order of increasing
// |error|, stopping as soon as the error exceeds that of the worst candidate kept. No allowed pair is skipped
// unexamined unless it is provably worse than every kept candidate: the result equals a brute-force enumeration
// (test/pick-divider-search.test.ts proves it on random targets).
//
// Legs: parts = 2 allows one resistor per leg; parts = 3 lets either leg (not both) be two resistors.
import { dividerVout } from '../../circuits/divider.js';
import type { AllowedValues } from './allowed-values.js';
import type { BottomWindow } from './bottom-window.js';
import { makeLeg, sameOhms, type Leg, type LegKind } from './legs.js';
import { bestList, quantize, type Ranked } from './ranking.js';

export interface FixedSearchRequest {
  vref: number;
  /** Target output, volts. */
  vout: number;
  ifb: number;
  allowed: AllowedValues;
  window: BottomWindow;
  maxParts: 2 | 3;
  count: number;
}

export interface FixedPair {
  top: Leg;
  bottom: Leg;
  /** Nominal output with this pair (Ifb included), volts. */
  vout: number;
}

const STREAM_KINDS: LegKind[] = ['series', 'parallel'];

export function searchFixedDividers(request: FixedSearchRequest): Ranked<FixedPair>[] {
  const { vref, vout: target, ifb, allowed, window, maxParts, count } = request;
  const ohms = allowed.ohms;
  const rank = allowed.sourceRank;
  const n = ohms.length;
  const best = bestList<FixedPair>(count, (p, q) => sameOhms(p.top.ohms, q.top.ohms) && sameOhms(p.bottom.ohms, q.bottom.ohms));

  // Walks one stream of top legs for one bottom leg. kind 'single': value(j) = ohms[j], j ∈ [0, n);
  // otherwise value(j) = combine(a, ohms[j]) for j ∈ [first, n), a = ohms[first].
  const walk = (bottom: Leg, bottomParts: number, bottomRank: number, kind: LegKind, first: number): void => {
    const rb = bottom.ohms;
    const a = ohms[first]!;
    const value = (j: number): number => {
      const b = ohms[j]!;
      return kind === 'single' ? b : kind === 'series' ? a + b : (a * b) / (a + b);
    };
    const relError = (rt: number): number => Math.abs(dividerVout(vref, rt, rb, ifb) - target) / target;
    const start = kind === 'single' ? 0 : first;
    // Ideal top for this bottom (g > 0 is guaranteed by the window).
    const ideal = (target - vref) / (vref / rb + ifb);
    let lo = start;
    let hi = n;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (value(mid) < ideal) lo = mid + 1;
      else hi = mid;
    }
    let left = lo - 1;
    let right = lo;
    const centre = quantize(Math.abs(Math.log(rb / window.middle)));
    const topParts = kind === 'single' ? 1 : 2;
    while (left >= start || right < n) {
      const errLeft = left >= start ? relError(value(left)) : Infinity;
      const errRight = right < n ? relError(value(right)) : Infinity;
      const takeLeft = errLeft <= errRight;
      const j = takeLeft ? left : right;
      const score = quantize(takeLeft ? errLeft : errRight);
      if (score > best.scoreLimit()) return;
      if (takeLeft) left--;
      else right++;
      const sourceRank = Math.max(bottomRank, rank[j]!, kind === 'single' ? 0 : rank[first]!);
      const top = makeLeg(kind, a, ohms[j]!);
      best.offer(
        { score, parts: bottomParts + topParts, sourceRank, centre },
        { top, bottom, vout: dividerVout(vref, top.ohms, rb, ifb) },
      );
    }
  };

  // Bottom legs of one resistor.
  for (let i = 0; i < n; i++) {
    const rb = ohms[i]!;
    if (rb < window.lo || rb > window.hi) continue;
    const bottom = makeLeg('single', rb, rb);
    walk(bottom, 1, rank[i]!, 'single', 0);
    if (maxParts >= 3) {
      for (let k = 0; k < n; k++) {
        for (const kind of STREAM_KINDS) walk(bottom, 1, rank[i]!, kind, k);
      }
    }
  }
  // Bottom legs of two resistors, each with a single top resistor.
  if (maxParts >= 3) {
    for (let k = 0; k < n; k++) {
      const a = ohms[k]!;
      for (let j = k; j < n; j++) {
        const b = ohms[j]!;
        for (const kind of STREAM_KINDS) {
          const rb = kind === 'series' ? a + b : (a * b) / (a + b);
          if (rb < window.lo || rb > window.hi) continue;
          walk(makeLeg(kind, a, b), 2, Math.max(rank[k]!, rank[j]!), 'single', 0);
        }
      }
    }
  }
  return best.entries;
}
