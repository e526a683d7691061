// Sensitivity coefficients c_i = ∂y/∂x_i by central differences, (f(x + h·e_i) − f(x − h·e_i))/(2h), at a given
// point (JCGM 100:2008, 5.1.3 allows them to be found numerically). h_i is a thousandth of the part's band
// half-width: small enough that the O(h²) error of the central difference is negligible for the smooth circuit
// transfers here, large enough that rounding in f stays far below the difference.
import { partVaries } from '../tolerance/part.js';
import { evaluateOutputs, type Model } from './model.js';

/** Relative step: h_i = STEP_FRACTION × band half-width. */
export const STEP_FRACTION = 1e-3;

/** Sensitivities of every output to every part at `point` (one value per part): result[output][part]. */
export function sensitivities(model: Model, point: ArrayLike<number>): number[][] {
  const parts = model.parts;
  const m = parts.length;
  // Column 2i is x + h_i·e_i, column 2i + 1 is x − h_i·e_i: every output evaluated once over 2m points.
  const columns = 2 * m;
  const p = parts.map((_, i) => new Float64Array(columns).fill(point[i]!));
  const steps = parts.map((part) => (STEP_FRACTION * (part.minus + part.plus)) / 2);
  for (let i = 0; i < m; i++) {
    p[i]![2 * i] = point[i]! + steps[i]!;
    p[i]![2 * i + 1] = point[i]! - steps[i]!;
  }
  const outs = model.outputs.map(() => new Float64Array(columns));
  evaluateOutputs(model, p, outs, columns);
  return outs.map((out) => {
    return parts.map((part, i) => (partVaries(part) && steps[i]! > 0 ? (out[2 * i]! - out[2 * i + 1]!) / (2 * steps[i]!) : 0));
  });
}
