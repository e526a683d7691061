// Drawing a part's values and its moments, dispatched on the part's distribution. Every distribution lives on the
// part's band [lo, hi] = [nominal − minus, nominal + plus]; the normal kinds centre on the band's middle with
// half-width = k·σ (k = 3 by default: common practice), the triangular peaks at the nominal value.
import { binnedFromUnit, binnedSigma } from './distributions/binned.js';
import { DEFAULT_K, normalFromUnit } from './distributions/normal.js';
import { triangularFromUnit, triangularMean, triangularSigma } from './distributions/triangular.js';
import { truncatedNormalFromUnit, truncatedNormalMean, truncatedNormalSigma } from './distributions/truncated-normal.js';
import { uniformFromUnit, uniformMean, uniformSigma } from './distributions/uniform.js';
import { partHigh, partLow, type Part } from './part.js';
import type { UniformSource } from './uniform-source.js';

function kOf(spec: { k?: number }): number {
  return spec.k ?? DEFAULT_K;
}

/**
 * In place: turns n uniforms in [0, 1) into the part's Monte Carlo values (one uniform per value, for every
 * distribution, so each part always consumes exactly n draws of its chunk's stream). A part without spread, or
 * held fixed in Monte Carlo, gets its value regardless of the uniforms.
 */
export function partFromUnit(part: Part, buf: Float64Array, n: number): void {
  const lo = partLow(part);
  const hi = partHigh(part);
  const d = part.distribution;
  if (d.kind === 'fixed') {
    buf.fill(d.value, 0, n);
    return;
  }
  if (hi <= lo) {
    buf.fill(part.nominal, 0, n);
    return;
  }
  const center = (lo + hi) / 2;
  const half = (hi - lo) / 2;
  switch (d.kind) {
    case 'uniform':
      uniformFromUnit(buf, n, lo, hi);
      return;
    case 'normal':
      normalFromUnit(buf, n, center, half / kOf(d));
      return;
    case 'truncated-normal':
      truncatedNormalFromUnit(buf, n, center, half / kOf(d), lo, hi);
      return;
    case 'triangular':
      triangularFromUnit(buf, n, lo, part.nominal, hi);
      return;
    case 'binned':
      binnedFromUnit(buf, n, center, half / kOf(d), d.innerFraction * half, half);
      return;
  }
}

/**
 * How partFromUnit turns a uniform into the part's value, for callers that fuse drawing and transforming:
 * `affine` when the value is lo + width·u (a uniform part with spread), `constant` when it ignores u (held fixed,
 * or no spread), otherwise `transform` (call partFromUnit).
 */
export type UnitMap = { kind: 'affine'; lo: number; width: number } | { kind: 'constant'; value: number } | { kind: 'transform' };

export function partUnitMap(part: Part): UnitMap {
  const lo = partLow(part);
  const hi = partHigh(part);
  const d = part.distribution;
  if (d.kind === 'fixed') return { kind: 'constant', value: d.value };
  if (hi <= lo) return { kind: 'constant', value: part.nominal };
  if (d.kind === 'uniform') return { kind: 'affine', lo, width: hi - lo };
  return { kind: 'transform' };
}

/** Fills out[0..n) with the part's Monte Carlo values drawn from `random` (n draws). */
export function fillPart(part: Part, out: Float64Array, n: number, random: UniformSource): void {
  for (let j = 0; j < n; j++) out[j] = random();
  partFromUnit(part, out, n);
}

/** Mean of the part's Monte Carlo distribution. */
export function partMean(part: Part): number {
  const lo = partLow(part);
  const hi = partHigh(part);
  const d = part.distribution;
  if (d.kind === 'fixed') return d.value;
  if (hi <= lo) return part.nominal;
  const center = (lo + hi) / 2;
  switch (d.kind) {
    case 'uniform':
      return uniformMean(lo, hi);
    case 'normal':
    case 'binned':
      return center;
    case 'truncated-normal':
      return truncatedNormalMean(center, (hi - lo) / 2 / kOf(d), lo, hi);
    case 'triangular':
      return triangularMean(lo, part.nominal, hi);
  }
}

/** Standard deviation of the part's Monte Carlo distribution: its standard uncertainty u(x) for RSS. */
export function partSigma(part: Part): number {
  const lo = partLow(part);
  const hi = partHigh(part);
  const d = part.distribution;
  if (d.kind === 'fixed' || hi <= lo) return 0;
  const center = (lo + hi) / 2;
  const half = (hi - lo) / 2;
  switch (d.kind) {
    case 'uniform':
      return uniformSigma(lo, hi);
    case 'normal':
      return half / kOf(d);
    case 'truncated-normal':
      return truncatedNormalSigma(center, half / kOf(d), lo, hi);
    case 'triangular':
      return triangularSigma(lo, part.nominal, hi);
    case 'binned':
      return binnedSigma(half / kOf(d), d.innerFraction * half, half);
  }
}

/** One line naming the distribution, for reports' method notes. */
export function describeDistribution(part: Part): string {
  const d = part.distribution;
  switch (d.kind) {
    case 'uniform':
      return 'uniform over the band';
    case 'normal':
      return `normal, band = ±${kOf(d)}σ`;
    case 'truncated-normal':
      return `normal cut off at the band, band = ±${kOf(d)}σ`;
    case 'triangular':
      return 'triangular, peak at nominal';
    case 'binned':
      return `binned: normal (band = ±${kOf(d)}σ) with the inner ±${d.innerFraction * 100} % of the band sorted out (common practice)`;
    case 'fixed':
      return `held at ${d.value} in Monte Carlo`;
  }
}
