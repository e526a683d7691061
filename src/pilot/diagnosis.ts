// Which parts could explain a measured mean shift Δ, by the model's sensitivities c_i = ∂y/∂x_i (first order,
// JCGM 100:2008 5.1.3, as the engine's RSS computes them):
//   one part alone: the deviation d_i = Δ/c_i, in units of its tolerance band's half-width h_i. |d_i/h_i| ≤ 1 means
//   the part alone could explain the shift while staying inside its band (plausible).
//   least squares: the smallest combination weighted by each part's standard uncertainty u_i,
//   x_i = Δ·c_i·u_i²/Σ_j c_j²·u_j² (the minimum-norm solution of Σ c_i·x_i = Δ in units of u_i: the most likely
//   combination if the parts were independent normal deviations). One explanation among many.
import type { Contribution } from '../analysis/result.js';
import type { Part } from '../tolerance/part.js';

export interface SinglePartExplanation {
  part: string;
  sensitivity: number;
  /** Half-width of the part's tolerance band, part unit. */
  bandHalfWidth: number;
  /** Deviation from nominal that alone gives the shift, part unit. */
  deviation: number;
  /** deviation / bandHalfWidth: ±1 is the band's edge. */
  bands: number;
  plausible: boolean;
}

export interface ShiftDiagnosis {
  shift: number;
  /** Parts ranked by |bands|, smallest (most plausible) first. */
  singleParts: SinglePartExplanation[];
  /** The least-squares combination: part → deviation in band units. */
  leastSquares: Array<{ part: string; deviation: number; bands: number }>;
}

export function diagnoseShift(shift: number, contributions: readonly Contribution[], parts: readonly Part[]): ShiftDiagnosis {
  const byName = new Map(parts.map((p) => [p.name, p]));
  const active = contributions
    .map((c) => ({ c, part: byName.get(c.part) }))
    .filter((x): x is { c: Contribution; part: Part } => x.part !== undefined && x.c.sensitivity !== 0 && x.c.standardUncertainty > 0 && x.part.minus + x.part.plus > 0);
  const singleParts = active
    .map(({ c, part }) => {
      const half = (part.minus + part.plus) / 2;
      const deviation = shift / c.sensitivity;
      const bands = deviation / half;
      return { part: c.part, sensitivity: c.sensitivity, bandHalfWidth: half, deviation, bands, plausible: Math.abs(bands) <= 1 };
    })
    .sort((a, b) => Math.abs(a.bands) - Math.abs(b.bands));
  let denominator = 0;
  for (const { c } of active) denominator += (c.sensitivity * c.standardUncertainty) ** 2;
  const leastSquares = denominator > 0
    ? active
        .map(({ c, part }) => {
          const deviation = (shift * c.sensitivity * c.standardUncertainty ** 2) / denominator;
          return { part: c.part, deviation, bands: deviation / ((part.minus + part.plus) / 2) };
        })
        .sort((a, b) => Math.abs(b.bands) - Math.abs(a.bands))
    : [];
  return { shift, singleParts, leastSquares };
}
