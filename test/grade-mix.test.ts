import fc from 'fast-check';
import { errorFunction } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { bestSingleUpgrade, cheapestGradeMix, type GradeOption } from '../src/pick/grade-mix.js';

// Grades as the grades command sees them: tolerance and an illustrative relative cost (test data, invented).
const GRADES: Array<GradeOption & { tolerance: number }> = [
  { name: '5 %', tolerance: 0.05, cost: 1, tightness: 0 },
  { name: '1 %', tolerance: 0.01, cost: 1.2, tightness: 1 },
  { name: '0.5 %', tolerance: 0.005, cost: 3, tightness: 2 },
  { name: '0.1 %', tolerance: 0.001, cost: 10, tightness: 3 },
];

/**
 * Closed-form yield of a linear output y = Σ s_p·x_p, x_p normal with tolerance = 3σ, window ±w about the nominal:
 * P(|y| ≤ w) = erf(w / (σ·√2)) (normal distribution; erf from simple-statistics, an outside library).
 */
function linearYield(sensitivities: number[], window: number) {
  return (assignment: readonly number[]): number => {
    let variance = 0;
    assignment.forEach((g, p) => {
      variance += (sensitivities[p] * GRADES[g].tolerance / 3) ** 2;
    });
    return errorFunction(window / Math.sqrt(variance) / Math.SQRT2);
  };
}

/** Brute force: every assignment, the cheapest that passes (the reference the search must agree with). */
function exhaustive(options: GradeOption[][], target: number, evaluate: (a: number[]) => number) {
  let best: { cost: number; assignment: number[] } | null = null;
  const walk = (prefix: number[]): void => {
    if (prefix.length === options.length) {
      if (evaluate(prefix) < target) return;
      const cost = prefix.reduce((sum, g, p) => sum + options[p][g].cost, 0);
      if (!best || cost < best.cost - 1e-12) best = { cost, assignment: prefix.slice() };
      return;
    }
    for (let g = 0; g < options[prefix.length].length; g += 1) walk([...prefix, g]);
  };
  walk([]);
  return best as { cost: number; assignment: number[] } | null;
}

function costOf(options: GradeOption[][], assignment: number[]): number {
  return assignment.reduce((sum, g, p) => sum + options[p][g].cost, 0);
}

describe('cheapest grade mix (best-first over the grade lattice) against exhaustive search', () => {
  it('four parts × four grades, linear output: same cost as enumerating all 256 assignments, fewer evaluations', async () => {
    const sensitivities = [1, 0.8, 0.3, 0.05]; // one dominant part, one negligible
    const options = sensitivities.map(() => GRADES);
    const evaluate = linearYield(sensitivities, 0.012);
    for (const target of [0.9, 0.99, 0.999, 0.9999]) {
      const reference = exhaustive(options, target, evaluate);
      const found = await cheapestGradeMix({ options, target, evaluate });
      expect(reference).not.toBeNull();
      expect(found.found).toBe(true);
      expect(found.cost).toBeCloseTo(reference!.cost, 12);
      expect(evaluate(found.assignment!)).toBeGreaterThanOrEqual(target);
      expect(found.evaluations).toBeLessThan(256);
    }
  });

  it('two dominant parts out of five: the bounds step leaves few assignments (1024 in the lattice)', async () => {
    const sensitivities = [1, 1, 0.01, 0.01, 0.01];
    const options = sensitivities.map(() => GRADES);
    const evaluate = linearYield(sensitivities, 0.004);
    const reference = exhaustive(options, 0.999, evaluate);
    const found = await cheapestGradeMix({ options, target: 0.999, evaluate });
    expect(found.cost).toBeCloseTo(reference!.cost, 12);
    // 1 tightest run + at most 5 × 3 bound probes + a handful of best-first steps.
    expect(found.evaluations).toBeLessThanOrEqual(25);
  });

  it('the negligible part stays at the cheapest grade, the dominant part is tightened first', async () => {
    const sensitivities = [1, 0.05];
    const options = sensitivities.map(() => GRADES);
    const found = await cheapestGradeMix({ options, target: 0.99, evaluate: linearYield(sensitivities, 0.012) });
    // [1 %, 5 %]: σ = √((0.01/3)² + (0.05·0.05/3)²) = 3.44e-3, w/σ = 3.49, yield 99.95 % at cost 2.2; every
    // assignment with part 0 at 5 % has σ ≥ 0.0167 (yield < 53 %), so nothing cheaper passes (hand arithmetic).
    expect(found.assignment).toEqual([1, 0]);
  });

  it('an unreachable target says so after one evaluation of the tightest assignment', async () => {
    const options = [GRADES, GRADES];
    const found = await cheapestGradeMix({ options, target: 0.999, evaluate: linearYield([1, 1], 0.0001) });
    expect(found).toMatchObject({ found: false, reason: 'target-unreachable', evaluations: 1 });
  });

  it('the evaluation limit stops the search and says so', async () => {
    const options = [GRADES, GRADES, GRADES];
    const found = await cheapestGradeMix({ options, target: 0.9999, evaluate: linearYield([1, 1, 1], 0.004), maxEvaluations: 3 });
    expect(found).toMatchObject({ found: false, reason: 'evaluation-limit' });
  });

  it('property: with pruning off, any yield table (monotone or not) and any costs give the exhaustive answer', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 1, max: 4 }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 81, maxLength: 81 }),
        fc.array(fc.integer({ min: 1, max: 9 }), { minLength: 12, maxLength: 12 }),
        fc.double({ min: 0.1, max: 0.95, noNaN: true }),
        async (parts, table, costs, target) => {
          const options: GradeOption[][] = Array.from({ length: parts }, (_, p) =>
            [0, 1, 2].map((g) => ({ name: `g${g}`, cost: costs[p * 3 + g], tightness: g })),
          );
          const evaluate = (a: readonly number[]): number => table[a.reduce((key, g) => key * 3 + g, 0)];
          const reference = exhaustive(options, target, evaluate);
          const found = await cheapestGradeMix({ options, target, evaluate, prune: false });
          if (reference === null) {
            expect(found.found).toBe(false);
          } else {
            expect(found.found).toBe(true);
            expect(costOf(options, found.assignment!)).toBe(reference.cost);
            expect(evaluate(found.assignment!)).toBeGreaterThanOrEqual(target);
          }
        },
      ),
      { numRuns: 300, seed: 6 },
    );
  });

  it('property: with pruning on and a monotone yield (linear model, random sensitivities), the exhaustive answer', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.double({ min: 0.01, max: 2, noNaN: true }), { minLength: 1, maxLength: 4 }),
        fc.double({ min: 0.002, max: 0.05, noNaN: true }),
        fc.constantFrom(0.9, 0.99, 0.999),
        async (sensitivities, window, target) => {
          const options = sensitivities.map(() => GRADES);
          const evaluate = linearYield(sensitivities, window);
          const reference = exhaustive(options, target, evaluate);
          const found = await cheapestGradeMix({ options, target, evaluate });
          expect(found.found).toBe(reference !== null);
          if (reference) expect(found.cost).toBeCloseTo(reference.cost, 12);
        },
      ),
      { numRuns: 200, seed: 7 },
    );
  });
});

describe('single upgrade with the most yield per unit cost', () => {
  it('picks the dominant part, and the cheap 1 % step over the expensive 0.1 % step (checked by hand)', async () => {
    // base all 5 %: σ² = (0.05/3)²(1 + 0.01); 1 % on part 0 cuts σ almost to the part-1 term alone.
    const sensitivities = [1, 0.1];
    const evaluate = linearYield(sensitivities, 0.02);
    const result = await bestSingleUpgrade({ options: [GRADES, GRADES], base: [0, 0], evaluate });
    expect(result.best).toMatchObject({ part: 0, option: 1 });
    expect(result.tried).toHaveLength(6);
    // Recompute the ratio of every candidate by brute force and check the chosen one is the largest.
    const ratios = result.tried.map((t) => (t.yield - result.baseYield) / t.extraCost);
    expect(result.best!.yieldPerCost).toBeCloseTo(Math.max(...ratios), 12);
  });

  it('no upgrade when the yield is already 100 %', async () => {
    const result = await bestSingleUpgrade({ options: [GRADES], base: [0], evaluate: () => 1 });
    expect(result.best).toBeNull();
  });
});
