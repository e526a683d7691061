// A resistor network (several resistors on one substrate, bought as one part) as a shared draw plus one draw per
// member. Its datasheet gives four figures; this file turns them into the half-widths of the independent draws so
// that every drawn unit holds every stated band, and says exactly what each figure is taken to mean.
//
// What the figures mean here (our definitions; a datasheet that defines them otherwise needs its own numbers):
//   absolute tolerance A   every member:      |R_i/R_i,nom − 1| ≤ A
//   ratio tolerance ρ      every two members: |(R_i/R_j)/(R_i,nom/R_j,nom) − 1| ≤ ρ
//   absolute TCR T         every member's temperature coefficient: |α_i| ≤ T
//   TCR tracking τ         every two members: |α_i − α_j| ≤ τ
//
// The draw: R_i = R_i,nom·(1 + s)·(1 + m_i), α_i = a + t_i, with s, a shared by the members and m_i, t_i each member's
// own, all independent, each inside its half-width:
//   |m_i| ≤ μ = ρ/(2 + ρ)          the worst ratio is (1 + μ)/(1 − μ) = 1 + 2μ/(1 − μ) = 1 + ρ exactly (and the lowest,
//                                  (1 − μ)/(1 + μ) = 1 − 2μ/(1 + μ), lies inside 1 − ρ)
//   |s|   ≤ σ = (A − μ)/(1 + μ)    the highest member is (1 + σ)(1 + μ) = 1 + A exactly; the lowest,
//                                  (1 − σ)(1 − μ) = 1 − A + 2μ(A − μ)/(1 + μ), lies inside 1 − A
//   |t_i| ≤ τ/2,  |a| ≤ T − τ/2    so |α_i| ≤ T and |α_i − α_j| ≤ τ, both reached at a corner
// The split is exact at the corners (worst case reaches each stated band) and never leaves a band (Monte Carlo
// draws only units a maker could ship). It needs ρ ≤ A (a ratio band wider than the absolute one is refused: two
// members each inside ±A can differ by nearly 2A, but networks are sold with ρ ≤ A) and τ ≤ 2T (two members inside
// ±T differ by at most 2T; τ = 2T is the same as independent TCRs, the conservative default when no tracking figure
// is given). test/network-bands.test.ts checks both bands over every corner and a grid inside.

export interface NetworkFigures {
  /** Absolute tolerance A, a fraction (0.001 for 0.1 %). */
  tolerance: number;
  /** Ratio (matching) tolerance ρ between any two members, a fraction; ρ ≤ A. */
  ratio: number;
  /** Absolute TCR bound T, 1/K (0 when the network gives none). */
  tcrPerK: number;
  /** TCR tracking τ between any two members, 1/K; τ ≤ 2T. */
  trackingPerK: number;
}

export interface NetworkBands {
  /** Half-width σ of the shared relative deviation s. */
  shared: number;
  /** Half-width μ of each member's own relative deviation m_i. */
  mismatch: number;
  /** Half-width of the shared temperature coefficient a, 1/K. */
  sharedTcrPerK: number;
  /** Half-width of each member's own temperature coefficient t_i, 1/K. */
  memberTcrPerK: number;
}

/** Half-widths of the shared and per-member draws (see the header). Throws RangeError for figures it cannot split. */
export function networkBands(f: NetworkFigures): NetworkBands {
  const finite = [f.tolerance, f.ratio, f.tcrPerK, f.trackingPerK].every((x) => Number.isFinite(x) && x >= 0);
  if (!finite) throw new RangeError('network figures must be finite and ≥ 0');
  if (f.tolerance >= 1) throw new RangeError('absolute tolerance must be below 1');
  if (f.ratio > f.tolerance) throw new RangeError('ratio tolerance must not exceed the absolute tolerance');
  if (f.trackingPerK > 2 * f.tcrPerK) throw new RangeError('TCR tracking must not exceed twice the absolute TCR');
  const mismatch = f.ratio / (2 + f.ratio);
  const shared = Math.max(0, (f.tolerance - mismatch) / (1 + mismatch));
  return { shared, mismatch, sharedTcrPerK: f.tcrPerK - f.trackingPerK / 2, memberTcrPerK: f.trackingPerK / 2 };
}
