// Exact search for the fixed dividers nearest a target output.
//
// For each allowed bottom leg the output is Vref + Rtop·g with g = Vref/Rbottom + Ifb > 0, so the error is a
// V-shaped function of Rtop with its zero at the ideal top (dividerRtopFor). Every family of top legs is a sorted
// stream: the single values; for a fixed first part a, a + b and a ∥ b over b ≥ a (both increase with b). In each
// stream the ideal's position is found and a two-pointer walk visits values in order of increasing |error|,
// stopping as soon as the error exceeds that of the worst candidate kept. No allowed pair is skipped unless it is
// provably worse than every kept candidate: the result equals a brute-force enumeration
// (test/pick-divider-search.test.ts proves it on random targets, series and stock lists).
//
// Positions move monotonically, so they are found by sliding from the previous one instead of a fresh binary
// search: as a grows, the b that makes a + b (or a ∥ b) equal a fixed ideal shrinks; as a bottom leg grows, its
// ideal top grows. Each sweep is then linear in the number of values, not n·log n.
//
// Legs: parts = 2 allows one resistor per leg; parts = 3 lets either leg (not both) be two resistors.
import { dividerVout } from '../../circuits/divider.js';
import type { AllowedValues } from './allowed-values.js';
import type { BottomWindow } from './bottom-window.js';
import { makeLeg, sameOhms, type Leg, type LegKind } from './legs.js';
import { bestList, quantize, type BestList, type Ranked } from './ranking.js';

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

const SINGLE = 0;
const SERIES = 1;
const PARALLEL = 2;
const KIND_NAMES: LegKind[] = ['single', 'series', 'parallel'];

/** Equivalent of a leg; the same arithmetic as circuits/combine.ts (a + b, a·b/(a + b)) so values agree to the bit. */
function combine(kind: number, a: number, b: number): number {
  return kind === SINGLE ? b : kind === SERIES ? a + b : (a * b) / (a + b);
}

/** The bottom leg being matched: kind and parts (for a single resistor, b is the resistor and a is unused). */
interface BottomState {
  kind: number;
  a: number;
  b: number;
  ohms: number;
  parts: number;
  rank: number;
}

interface Search {
  vref: number;
  target: number;
  ifb: number;
  ohms: Float64Array;
  rank: Uint8Array;
  best: BestList<FixedPair>;
  middle: number;
}

/** First j in [from, n) with combine(kind, a, ohms[j]) ≥ ideal, sliding from `hint` (any index in [from, n]). */
function slide(ohms: Float64Array, kind: number, a: number, from: number, ideal: number, hint: number): number {
  const n = ohms.length;
  let j = Math.min(Math.max(hint, from), n);
  while (j > from && combine(kind, a, ohms[j - 1]!) >= ideal) j--;
  while (j < n && combine(kind, a, ohms[j]!) < ideal) j++;
  return j;
}

/** |Vout error| relative to the target for a top leg over a bottom leg. */
function relError(s: Search, rtop: number, rb: number): number {
  return Math.abs(dividerVout(s.vref, rtop, rb, s.ifb) - s.target) / s.target;
}

/**
 * Could the stream beat the kept candidates? Its best value is one of the two around the ideal's position `at`:
 * a cheap test that lets the search skip most streams without building anything.
 */
function promising(s: Search, rb: number, kind: number, a: number, from: number, at: number): boolean {
  const limit = s.best.scoreLimit();
  if (limit === Infinity) return true;
  const ohms = s.ohms;
  const errLeft = at - 1 >= from ? relError(s, combine(kind, a, ohms[at - 1]!), rb) : Infinity;
  const errRight = at < ohms.length ? relError(s, combine(kind, a, ohms[at]!), rb) : Infinity;
  return quantize(Math.min(errLeft, errRight)) <= limit;
}

/**
 * Walks one stream of top legs outward from position `at` in order of increasing |error|, offering each to the
 * best list until the error exceeds the list's limit. Stream: combine(kind, a, ohms[j]) for j ∈ [from, n).
 */
function walk(s: Search, bottom: BottomState, kind: number, a: number, aIndex: number, from: number, at: number): void {
  const { ohms, rank, best } = s;
  const n = ohms.length;
  const rb = bottom.ohms;
  let bottomLeg: Leg | undefined;
  let left = at - 1;
  let right = at;
  while (left >= from || right < n) {
    const errLeft = left >= from ? relError(s, combine(kind, a, ohms[left]!), rb) : Infinity;
    const errRight = right < n ? relError(s, combine(kind, a, ohms[right]!), rb) : Infinity;
    const takeLeft = errLeft <= errRight;
    const j = takeLeft ? left : right;
    const score = quantize(takeLeft ? errLeft : errRight);
    if (score > best.scoreLimit()) return;
    if (takeLeft) left--;
    else right++;
    const top = makeLeg(KIND_NAMES[kind]!, a, ohms[j]!);
    bottomLeg ??= makeLeg(KIND_NAMES[bottom.kind]!, bottom.a, bottom.b);
    best.offer(
      {
        score,
        parts: bottom.parts + (kind === SINGLE ? 1 : 2),
        sourceRank: Math.max(bottom.rank, rank[j]!, kind === SINGLE ? 0 : rank[aIndex]!),
        centre: quantize(Math.abs(Math.log(rb / s.middle))),
      },
      { top, bottom: bottomLeg, vout: dividerVout(s.vref, top.ohms, rb, s.ifb) },
    );
  }
}

export function searchFixedDividers(request: FixedSearchRequest): Ranked<FixedPair>[] {
  const { vref, vout: target, ifb, allowed, window, maxParts, count } = request;
  const ohms = allowed.ohms;
  const rank = allowed.sourceRank;
  const n = ohms.length;
  const best = bestList<FixedPair>(count, (p, q) => sameOhms(p.top.ohms, q.top.ohms) && sameOhms(p.bottom.ohms, q.bottom.ohms));
  const s: Search = { vref, target, ifb, ohms, rank, best, middle: window.middle };
  const idealTop = (rb: number): number => (target - vref) / (vref / rb + ifb); // g > 0 within the window

  // Bottom legs of one resistor: ascending, so the ideal top ascends and the single-top position slides up.
  let singleHint = 0;
  for (let i = 0; i < n; i++) {
    const rb = ohms[i]!;
    if (rb < window.lo || rb > window.hi) continue;
    const bottom: BottomState = { kind: SINGLE, a: rb, b: rb, ohms: rb, parts: 1, rank: rank[i]! };
    const ideal = idealTop(rb);
    singleHint = slide(ohms, SINGLE, 0, 0, ideal, singleHint);
    walk(s, bottom, SINGLE, 0, 0, 0, singleHint);
    if (maxParts >= 3) {
      // Two-resistor tops: for each first part a = ohms[k], the stream over b = ohms[j], j ≥ k.
      // Series (a + b ≥ 2a): every a up to ideal/2 may hold the best b; past it the stream's least value 2a rises
      // with a, so the first unpromising stream ends the loop. The ideal b's position falls as a rises: one hint slides.
      let hint = n;
      for (let k = 0; k < n; k++) {
        const a = ohms[k]!;
        hint = slide(ohms, SERIES, a, k, ideal, hint);
        if (promising(s, rb, SERIES, a, k, hint)) walk(s, bottom, SERIES, a, k, k, hint);
        else if (2 * a > ideal) break;
      }
      // Parallel (a/2 ≤ a ∥ b < a): for a above the ideal, streams hold values around it until a/2 passes it;
      // for a at or below the ideal every value is below it, the nearest being a ∥ (largest b), which falls with a:
      // walk a downward from the ideal and stop at the first unpromising stream either way.
      const above = slide(ohms, SINGLE, 0, 0, ideal, 0);
      hint = n;
      for (let k = above; k < n; k++) {
        const a = ohms[k]!;
        hint = slide(ohms, PARALLEL, a, k, ideal, hint);
        if (promising(s, rb, PARALLEL, a, k, hint)) walk(s, bottom, PARALLEL, a, k, k, hint);
        else if (a > 2 * ideal) break;
      }
      for (let k = above - 1; k >= 0; k--) {
        if (!promising(s, rb, PARALLEL, ohms[k]!, k, n)) break;
        walk(s, bottom, PARALLEL, ohms[k]!, k, k, n);
      }
    }
  }
  // Bottom legs of two resistors, each with a single top resistor. For fixed k the bottom (and its ideal top)
  // rises with j, so the top position slides up.
  if (maxParts >= 3) {
    for (let k = 0; k < n; k++) {
      const a = ohms[k]!;
      for (let kind = SERIES; kind <= PARALLEL; kind++) {
        let hint = 0;
        for (let j = k; j < n; j++) {
          const rb = combine(kind, a, ohms[j]!);
          if (rb < window.lo) continue;
          if (rb > window.hi) break;
          hint = slide(ohms, SINGLE, 0, 0, idealTop(rb), hint);
          if (!promising(s, rb, SINGLE, 0, 0, hint)) continue;
          walk(s, { kind, a, b: ohms[j]!, ohms: rb, parts: 2, rank: Math.max(rank[k]!, rank[j]!) }, SINGLE, 0, 0, 0, hint);
        }
      }
    }
  }
  return best.entries;
}
