// Paired trials (common random numbers) for the grade search and the variance indices: one drawn sample of units,
// mapped to each grade's bands. Checked against outside references: an independent Monte Carlo of the same
// assignment (its own seed) within the binomial standard error, the engine's own per-assignment count (same seed:
// bit for bit), a closed-form yield, exact per-unit monotonicity where the band maps u closer to the nominal,
// brute force over every assignment, and models built in full.
import fc from 'fast-check';
import { errorFunction } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { gradableResistors } from '../src/analysis/graded-spec.js';
import type { Model } from '../src/analysis/model.js';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { PairedSample } from '../src/analysis/paired-trials.js';
import { jointYield } from '../src/analysis/trial-values.js';
import { varianceIndices, varianceSample } from '../src/analysis/variance-indices.js';
import { allowedFailures, runGrades } from '../src/design/grade-study.js';
import { gradedModels, specWithGrades } from '../src/design/graded-models.js';
import { GRADES, gradeCosts, type Grade } from '../src/design/grades.js';
import type { ResolvedDesign } from '../src/design/resolve.js';
import { bestSingleUpgrade, cheapestGradeMix, type GradeOption } from '../src/pick/grade-mix.js';
import { partFromTolerance } from '../src/tolerance/part.js';
import { directSenseSupply } from './direct-supply-fixture.js';

function resolvedOf(spec: SupplySpec): ResolvedDesign {
  return { spec, bom: [], notes: [], cautions: [], nominal: {}, costs: gradeCosts(), analysis: {}, cautionLimits: { application: undefined, voutWindow: null } };
}

const grade = (name: string): Grade => GRADES.find((g) => g.name === name)!;

/** Invented supply: direct sense, windows tight enough that 1 % and 0.5 % parts lose units (test data). */
const SPEC: SupplySpec = directSenseSupply(30e3, 10e3, { vout: [4.95, 5.05], ilimit: [0.96, 1.04] });
const RESISTORS = gradableResistors(SPEC);

describe('paired sample: the same units as the engine, counted by the same test', () => {
  it('same seed and trials: the paired count equals the engine-order joint yield bit for bit, for every grade mix tried', () => {
    const trials = 70_000; // two chunks of the engine (65536 + 4464), so chunk boundaries are crossed
    const models = gradedModels(SPEC, RESISTORS, [grade('5%'), grade('1%'), grade('0.5%'), grade('0.1%')]);
    const sample = new PairedSample(models.modelFor(RESISTORS.map(() => grade('1%'))).parts.length, { seed: '17', trials });
    for (const names of [['1%', '1%', '1%'], ['0.5%', '5%', '0.1%'], ['0.1%', '0.1%', '1%'], ['5%', '5%', '5%']]) {
      const chosen = names.map(grade);
      const model = buildSupplyModel(specWithGrades(SPEC, RESISTORS, chosen));
      const reference = jointYield(model, { seed: '17', runTrials: trials }, trials);
      const counted = sample.count(models.modelFor(chosen));
      expect(counted.complete).toBe(true);
      expect(counted.inSpec, names.join(' ')).toBe(reference.inSpec);
      // Evaluations: every unit at every ambient of the grid (unit-check.ts).
      expect(counted.evaluations).toBe(trials * model.ambient!.gridC.length);
    }
  });

  it('against an independent Monte Carlo of the same assignment (another seed): within 4 binomial standard errors', () => {
    const trials = 40_000;
    const chosen = [grade('0.5%'), grade('1%'), grade('1%')];
    const model = buildSupplyModel(specWithGrades(SPEC, RESISTORS, chosen));
    const paired = new PairedSample(model.parts.length, { seed: 'paired', trials }).count(model);
    const independent = jointYield(model, { seed: 'independent', runTrials: trials }, trials);
    const p1 = paired.inSpec / trials;
    const p2 = independent.inSpec / trials;
    // The difference of two independent binomial proportions: SE = √(p(1 − p)·(1/n + 1/n)), p pooled.
    const p = (p1 + p2) / 2;
    expect(p).toBeGreaterThan(0.05);
    expect(p).toBeLessThan(0.995); // a case where the yield is neither 0 nor 1
    expect(Math.abs(p1 - p2)).toBeLessThanOrEqual(4 * Math.sqrt((p * (1 - p) * 2) / trials));
  });

  it('a uniform band about the nominal: yield w/t in closed form, and a tighter band never loses a unit (exact per unit)', () => {
    // One resistor, output = its value, window nominal ± w: with a uniform band ±t·R, P(|x − R| ≤ w·R) = w/t for w < t
    // (closed form). With common random numbers x − R = t·R·(2u − 1), so |x − R| scales with t for every unit.
    const w = 0.004;
    const modelOf = (tolerance: number): Model => ({
      parts: [partFromTolerance({ name: 'R', kind: 'resistor', nominal: 1000, tolerance })],
      outputs: [{ name: 'r', unit: 'Ω', spec: [1000 * (1 - w), 1000 * (1 + w)], evaluate: (p, out, n) => out.set(p[0]!.subarray(0, n)) }],
    });
    const trials = 50_000;
    const sample = new PairedSample(1, { seed: 'closed form', trials });
    let previous = -1;
    for (const g of GRADES) {
      const counted = sample.count(modelOf(g.tolerance));
      const exact = Math.min(1, w / g.tolerance);
      const se = Math.sqrt((exact * (1 - exact)) / trials);
      expect(Math.abs(counted.inSpec / trials - exact), g.name).toBeLessThanOrEqual(4 * se + 1e-12);
      // GRADES runs widest first: each tighter grade keeps every unit the looser one passed.
      expect(counted.inSpec).toBeGreaterThanOrEqual(previous);
      previous = counted.inSpec;
    }
  });

  it('monotone on the real model: tightening any one part never lowers the paired yield by more than noise', () => {
    const trials = 20_000;
    const candidates = [grade('5%'), grade('1%'), grade('0.5%'), grade('0.1%')];
    const models = gradedModels(SPEC, RESISTORS, candidates);
    const base = [grade('1%'), grade('1%'), grade('1%')];
    const sample = new PairedSample(models.modelFor(base).parts.length, { seed: 'monotone', trials });
    const yieldOf = (chosen: Grade[]): number => sample.count(models.modelFor(chosen)).inSpec / trials;
    for (let part = 0; part < RESISTORS.length; part++) {
      let previous = -Infinity;
      for (const g of candidates) {
        const chosen = base.slice();
        chosen[part] = g;
        const y = yieldOf(chosen);
        // Paired noise: a unit can only change verdict if its value moves, and each tighter band moves it toward
        // the nominal; allow 3 binomial standard errors of the yield for the units near a window's edge.
        const noise = 3 * Math.sqrt((Math.max(y, 1e-3) * (1 - Math.min(y, 0.999))) / trials);
        expect(y, `${RESISTORS[part]!.name} at ${g.name}`).toBeGreaterThanOrEqual(previous - noise);
        previous = y;
      }
    }
  });

  it('a stop at too many failures never changes the verdict, and counts fewer units', () => {
    const trials = 20_000;
    const models = gradedModels(SPEC, RESISTORS, [grade('5%'), grade('1%'), grade('0.1%')]);
    const sample = new PairedSample(models.modelFor(RESISTORS.map(() => grade('1%'))).parts.length, { seed: 'stop', trials });
    for (const target of [0.5, 0.9, 0.99, 0.999]) {
      const maxFailures = allowedFailures(trials, target);
      for (const names of [['5%', '5%', '5%'], ['1%', '1%', '1%'], ['0.1%', '0.1%', '0.1%'], ['0.1%', '5%', '1%']]) {
        const model = models.modelFor(names.map(grade));
        const full = sample.count(model);
        const stopped = sample.count(model, { maxFailures });
        const passes = (100 * full.inSpec) / trials / 100 >= target;
        expect(stopped.complete, `${names.join(' ')} at ${target}`).toBe(passes);
        if (passes) expect(stopped.inSpec).toBe(full.inSpec);
        else expect(stopped.failures).toBeGreaterThan(maxFailures);
        expect(stopped.evaluations).toBeLessThanOrEqual(full.evaluations + 1024 * model.ambient!.gridC.length);
      }
    }
  });
});

describe('allowedFailures: the most failures that still reach the target, by the search\'s own comparison', () => {
  it('agrees with trying every failure count (brute force)', () => {
    for (const trials of [1, 7, 1000, 20_000, 65_537]) {
      for (const target of [0.5, 0.9, 0.97, 0.99, 0.999, 0.9999, 0.99999]) {
        let brute = -1;
        for (let f = 0; f <= trials; f++) if ((100 * (trials - f)) / trials / 100 >= target) brute = f;
        expect(allowedFailures(trials, target), `${trials} at ${target}`).toBe(brute);
      }
    }
  });
});

describe('graded models put together from parts', () => {
  it('equal the models built in full from a graded spec, part for part, and count the same units', () => {
    const candidates = [grade('10%'), grade('2%'), grade('0.25%'), grade('0.02%')];
    const models = gradedModels(SPEC, RESISTORS, candidates);
    const sample = new PairedSample(buildSupplyModel(specWithGrades(SPEC, RESISTORS, RESISTORS.map(() => candidates[0]!))).parts.length, { seed: 'compose', trials: 4000 });
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: candidates.length - 1 }), { minLength: RESISTORS.length, maxLength: RESISTORS.length }), (picks) => {
        const chosen = picks.map((i) => candidates[i]!);
        const built = buildSupplyModel(specWithGrades(SPEC, RESISTORS, chosen));
        const composed = models.modelFor(chosen);
        expect(composed.parts).toEqual(built.parts);
        expect(sample.count(composed).inSpec).toBe(jointYield(built, { seed: 'compose', runTrials: 4000 }, 4000).inSpec);
      }),
      { numRuns: 24, seed: 14 },
    );
  });
});

describe('the search on paired trials against brute force', { timeout: 120_000 }, () => {
  it('3 parts × 3 grades on the real supply model: the cheapest passing mix of all 27, found with fewer full evaluations', async () => {
    const allowed = ['1%', '0.5%', '0.1%'] as const;
    const searchTrials = 8000;
    const passingCounts: number[] = [];
    for (const targetPct of [90, 97, 99]) {
      const run = await runGrades(resolvedOf(SPEC), { trials: 2000, seed: 5, workers: 1, progress: false }, { targetYieldPct: targetPct, searchTrials, grades: [...allowed] });
      // Brute force: every assignment counted by the engine-order joint yield (no paired code), the cheapest passing.
      const costs = gradeCosts();
      let best: { cost: number; names: string } | null = null;
      let passing = 0;
      for (const a of allowed) for (const b of allowed) for (const c of allowed) {
        const chosen = [a, b, c].map(grade);
        const y = jointYield(buildSupplyModel(specWithGrades(SPEC, RESISTORS, chosen)), { seed: '5', runTrials: searchTrials }, searchTrials).pct / 100;
        if (y < targetPct / 100) continue;
        passing++;
        const cost = chosen.reduce((s, g) => s + costs[g.name], 0);
        if (best === null || cost < best.cost - 1e-12) best = { cost, names: [a, b, c].join(' ') };
      }
      expect(passing, `target ${targetPct} %`).toBeGreaterThan(0);
      passingCounts.push(passing);
      expect(run.mix.found).toBe(true);
      expect(run.mix.cost!).toBeCloseTo(best!.cost, 12);
      expect(run.mix.searchYieldPct! / 100).toBeGreaterThanOrEqual(targetPct / 100);
      expect(run.mix.evaluations).toBeLessThan(27);
      // The JSON's figures: model evaluations counted, wall time measured.
      expect(run.method.evaluations).toBeGreaterThan(0);
      expect(run.method.seconds).toBeGreaterThanOrEqual(0);
      expect(run.method.steps.search.evaluations + run.method.steps.verify.evaluations + run.method.steps.upgrade.evaluations).toBe(run.method.evaluations);
    }
    // Not a trivial case: at some target some assignments fail and some pass.
    expect(passingCounts.some((n) => n > 0 && n < 27)).toBe(true);
  });

  it('property: branch and bound with a screen that may say nothing gives the exhaustive answer (monotone yields)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.double({ min: 0.01, max: 2, noNaN: true }), { minLength: 1, maxLength: 4 }),
        fc.double({ min: 0.002, max: 0.05, noNaN: true }),
        fc.constantFrom(0.9, 0.99, 0.999),
        fc.array(fc.boolean(), { minLength: 64, maxLength: 64 }),
        async (sensitivities, window, target, silent) => {
          // Linear output, normal parts with tolerance = 3σ: yield = erf(w/(σ√2)) (closed form, monotone; erf from
          // simple-statistics, an outside library).
          const tolerances = [0.05, 0.01, 0.005, 0.001];
          const options: GradeOption[][] = sensitivities.map(() => [
            { name: 'a', cost: 1, tightness: 0 },
            { name: 'b', cost: 1.2, tightness: 1 },
            { name: 'c', cost: 3, tightness: 2 },
            { name: 'd', cost: 10, tightness: 3 },
          ]);
          const evaluate = (a: readonly number[]): number => {
            let variance = 0;
            a.forEach((g, p) => (variance += (sensitivities[p]! * tolerances[g]! / 3) ** 2));
            return errorFunction(window / Math.sqrt(variance) / Math.SQRT2);
          };
          let calls = 0;
          // The screen rejects only true failures, and stays silent on some of them (an inconclusive screen).
          const screen = (a: readonly number[]): boolean => evaluate(a) < target && !silent[calls++ % silent.length];
          let reference: number | null = null;
          const walk = (prefix: number[]): void => {
            if (prefix.length === options.length) {
              if (evaluate(prefix) < target) return;
              const cost = prefix.reduce((s, g, p) => s + options[p]![g]!.cost, 0);
              if (reference === null || cost < reference) reference = cost;
              return;
            }
            for (let g = 0; g < 4; g++) walk([...prefix, g]);
          };
          walk([]);
          const found = await cheapestGradeMix({ options, target, evaluate, screen });
          expect(found.found).toBe(reference !== null);
          if (reference !== null) expect(found.cost).toBeCloseTo(reference, 12);
        },
      ),
      { numRuns: 200, seed: 21 },
    );
  });
});

describe('best single upgrade with counts that stop below a floor', () => {
  it('property: the same best change as with every yield exact (the floors never prune the winner)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.integer({ min: 0, max: 20_000 }), { minLength: 64, maxLength: 64 }),
        fc.array(fc.integer({ min: 1, max: 9 }), { minLength: 9, maxLength: 9 }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 64, maxLength: 64 }),
        async (table, costs, cut) => {
          // Three parts × three grades; yields are counts out of 20 000 units (as the search's are).
          const options: GradeOption[][] = [0, 1, 2].map((p) => [0, 1, 2].map((g) => ({ name: `g${g}`, cost: costs[p * 3 + g]!, tightness: g })));
          const evaluate = (a: readonly number[]): number => table[a[0]! * 9 + a[1]! * 3 + a[2]!]! / 20_000;
          let calls = 0;
          // Below the floor: some value under it (what a count stopped early gives), else the exact yield.
          const evaluateAbove = (a: readonly number[], floor: number): number => {
            const y = evaluate(a);
            return y < floor ? y + (floor - y) * cut[calls++ % cut.length]! * 0.999 : y;
          };
          const exact = await bestSingleUpgrade({ options, base: [0, 0, 0], evaluate });
          const bounded = await bestSingleUpgrade({ options, base: [0, 0, 0], evaluate, evaluateAbove });
          expect(bounded.best).toEqual(exact.best);
          expect(bounded.baseYield).toBe(exact.baseYield);
        },
      ),
      { numRuns: 300, seed: 23 },
    );
  });
});

describe('variance indices on a shared sample', () => {
  it('give exactly the indices of their own draw, for each grade, from one sample', () => {
    const seed = '9';
    const candidates = [grade('5%'), grade('0.1%')];
    let sample: PairedSample | null = null;
    for (const g of candidates) {
      const model = buildSupplyModel(specWithGrades(SPEC, RESISTORS, RESISTORS.map(() => g)));
      sample ??= varianceSample(seed, model.parts.length, 1024);
      const own = varianceIndices(model, { seed, baseSamples: 1024 });
      const shared = varianceIndices(model, { seed, baseSamples: 1024, sample });
      expect(shared).toEqual(own);
    }
  });
});

