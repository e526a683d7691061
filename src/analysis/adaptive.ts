// Adaptive Monte Carlo (JCGM 101:2008, 7.9): runs of M trials (here: one chunk each, M = 65536 ≥ 10^4 and ≥
// 100/(1 − 0.95)) are added until, for the h runs so far, twice the standard deviation of the run means, of the
// run standard deviations and of the run 95 % interval ends is below the numerical tolerance δ of u(y).
// δ (7.9.2, as in JCGM 101:2008 7.9.2 / JCGM 100 rounding): write u(y) = c × 10^l with c an integer of ndig digits;
// then δ = ½ × 10^l.
import type { OutputChunk } from './chunk.js';
import { mergeMoments, momentsSigma, type Moments } from './statistics/moments.js';

export interface AdaptiveState {
  means: number[];
  sigmas: number[];
  lows: number[];
  highs: number[];
  all: Moments;
}

export function adaptiveState(): AdaptiveState {
  return { means: [], sigmas: [], lows: [], highs: [], all: { n: 0, mean: 0, m2: 0 } };
}

export function pushAdaptive(state: AdaptiveState, c: OutputChunk): void {
  state.means.push(c.mean);
  state.sigmas.push(c.n > 1 ? Math.sqrt(c.m2 / (c.n - 1)) : 0);
  state.lows.push(c.low95);
  state.highs.push(c.high95);
  state.all = mergeMoments(state.all, { n: c.n, mean: c.mean, m2: c.m2 });
}

/** Standard deviation of the average of h values: √(Σ(v − v̄)²/(h(h − 1))) (JCGM 101:2008 7.9.4 g). */
function sdOfAverage(values: number[]): number {
  const h = values.length;
  let mean = 0;
  for (const v of values) mean += v;
  mean /= h;
  let ss = 0;
  for (const v of values) ss += (v - mean) * (v - mean);
  return Math.sqrt(ss / (h * (h - 1)));
}

/** Numerical tolerance of u (JCGM 101:2008 7.9.2): u = c × 10^l, c with ndig digits, δ = ½ × 10^l. */
export function numericalTolerance(u: number, digits: number): number {
  if (!(u > 0)) return 0;
  const l = Math.floor(Math.log10(u)) - (digits - 1);
  return 0.5 * 10 ** l;
}

export function adaptiveStable(state: AdaptiveState, digits: number): boolean {
  if (state.means.length < 2) return false;
  const u = momentsSigma(state.all);
  const delta = numericalTolerance(u, digits);
  if (delta === 0) return true; // no spread at all: every run gives the same value
  return (
    2 * sdOfAverage(state.means) < delta &&
    2 * sdOfAverage(state.sigmas) < delta &&
    2 * sdOfAverage(state.lows) < delta &&
    2 * sdOfAverage(state.highs) < delta
  );
}
