// The pilot study's statistics against published tables, a reference library's table and hand arithmetic.
import { chiSquaredDistributionTable } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { andersonDarlingLimitCdf, andersonDarlingStatistic } from '../src/analysis/statistics/anderson-darling.js';
import { chiSquareCdf, chiSquareQuantile } from '../src/analysis/statistics/chi-square.js';
import { cpkInterval } from '../src/analysis/statistics/cpk-interval.js';
import { empiricalCdf, kurtosisOf } from '../src/analysis/statistics/empirical-cdf.js';
import { grubbsCritical, grubbsTest } from '../src/analysis/statistics/grubbs.js';
import { meanShiftTest } from '../src/analysis/statistics/mean-shift-test.js';
import { summarizeSample } from '../src/analysis/statistics/sample-intervals.js';
import { studentTCdf, studentTQuantile, studentTTwoSidedP } from '../src/analysis/statistics/student-t.js';
import { supportedCoverage, twoSidedToleranceFactor, unitsNeededForCoverage } from '../src/analysis/statistics/tolerance-factor.js';
import { varianceRatioTest } from '../src/analysis/statistics/variance-ratio-test.js';

describe("Student's t quantiles against NIST/SEMATECH e-Handbook 1.3.6.7.2 (critical values, 3 decimals)", () => {
  // [upper-tail probability, ν, printed t]; printed to 3 decimals, so agreement within 6e-4 (rounding ±5e-4 plus margin).
  const table: Array<[number, number, number]> = [
    [0.025, 1, 12.706],
    [0.025, 10, 2.228],
    [0.05, 5, 2.015],
    [0.005, 20, 2.845],
    [0.025, 30, 2.042],
    [0.1, 24, 1.318],
    [0.01, 15, 2.602],
  ];
  for (const [upper, df, printed] of table) {
    it(`t(${1 - upper}, ${df}) = ${printed}`, () => {
      expect(Math.abs(studentTQuantile(1 - upper, df) - printed)).toBeLessThan(6e-4);
      expect(Math.abs(studentTQuantile(upper, df) + printed)).toBeLessThan(6e-4);
    });
  }
  it('ν → ∞ tends to the normal quantile 1.95996 (closed form)', () => {
    expect(studentTQuantile(0.975, 1e7)).toBeCloseTo(1.959964, 4);
  });
  it('ν = 1 is the Cauchy distribution: F(t) = 1/2 + atan(t)/π (closed form)', () => {
    for (const t of [-3, -0.5, 0, 0.7, 5]) expect(studentTCdf(t, 1)).toBeCloseTo(0.5 + Math.atan(t) / Math.PI, 10);
  });
  it('ν = 2: F(t) = 1/2 + t/(2√(2 + t²)) (closed form), and the two-sided p is 2·(1 − F(|t|))', () => {
    for (const t of [-2, 0.3, 4]) {
      expect(studentTCdf(t, 2)).toBeCloseTo(0.5 + t / (2 * Math.sqrt(2 + t * t)), 10);
      expect(studentTTwoSidedP(t, 2)).toBeCloseTo(2 * (1 - studentTCdf(Math.abs(t), 2)), 10);
    }
  });
});

describe('chi-square quantiles against simple-statistics chiSquaredDistributionTable (a reference library; 2 decimals)', () => {
  it('every printed point, ν = 1…30, 40…100, within the table rounding (±0.005, plus 1e-3 margin)', () => {
    let checked = 0;
    for (const [dfText, row] of Object.entries(chiSquaredDistributionTable)) {
      const df = Number(dfText);
      for (const [upperText, printed] of Object.entries(row as unknown as Record<string, number>)) {
        const upper = Number(upperText);
        // The library prints 6.27 for ν = 15, upper 0.975; NIST/SEMATECH e-Handbook 1.3.6.7.4 gives 6.262 (checked below).
        if (df === 15 && upper === 0.975) continue;
        expect(Math.abs(chiSquareQuantile(1 - upper, df) - printed), `ν = ${df}, upper tail ${upper}`).toBeLessThan(0.006);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(300);
    expect(chiSquareQuantile(0.025, 15)).toBeCloseTo(6.262, 3);
  });
  it('ν = 2 is exponential: F(x) = 1 − e^(−x/2) (closed form)', () => {
    for (const x of [0.1, 1, 5.99146]) expect(chiSquareCdf(x, 2)).toBeCloseTo(1 - Math.exp(-x / 2), 10);
  });
});

describe('mean and σ intervals, t test (NIST/SEMATECH e-Handbook 1.3.5.2, 1.3.5.8, 7.2.2)', () => {
  it('hand arithmetic on 1..5: x̄ = 3, s = √2.5, mean ± t(0.975,4)·s/√5 with t = 2.776 (table)', () => {
    const s = summarizeSample([1, 2, 3, 4, 5]);
    expect(s.mean).toBe(3);
    expect(s.sigma).toBeCloseTo(Math.sqrt(2.5), 12);
    expect(s.meanInterval.high - 3).toBeCloseTo((2.776 * Math.sqrt(2.5)) / Math.sqrt(5), 3);
    // σ interval with χ²(0.975, 4) = 11.143 and χ²(0.025, 4) = 0.4844 (NIST e-Handbook 1.3.6.7.4, 3 decimals).
    expect(s.sigmaInterval.low).toBeCloseTo(Math.sqrt(2.5) * Math.sqrt(4 / 11.143), 3);
    expect(s.sigmaInterval.high).toBeCloseTo(Math.sqrt(2.5) * Math.sqrt(4 / 0.4844), 2);
  });
  it('t test: a shift of exactly t(0.975, 23)·s/√24 gives p = 0.05 (the definition of the critical value)', () => {
    const t = studentTQuantile(0.975, 23);
    const test = meanShiftTest(10 + (t * 0.2) / Math.sqrt(24), 0.2, 24, 10);
    expect(test.p).toBeCloseTo(0.05, 8);
    expect(test.t).toBeCloseTo(t, 10);
  });
});

describe('variance ratio test with the kurtosis allowance (Satterthwaite / Box moment matching)', () => {
  it('κ = 3 gives the plain chi-square test: s²/σ₀² at χ²(0.975, 23)/23 has p = 0.05', () => {
    const ratio = chiSquareQuantile(0.975, 23) / 23;
    const test = varianceRatioTest(Math.sqrt(ratio), 24, 1, 3);
    expect(test.degreesOfFreedom).toBeCloseTo(23, 12);
    expect(test.p).toBeCloseTo(0.05, 8);
  });
  it('a flat distribution (κ = 1.8) gets more degrees of freedom, so the same ratio is less likely', () => {
    const plain = varianceRatioTest(1.5, 24, 1, 3);
    const flat = varianceRatioTest(1.5, 24, 1, 1.8);
    expect(flat.degreesOfFreedom).toBeGreaterThan(23);
    expect(flat.p).toBeLessThan(plain.p);
  });
});

describe('Anderson–Darling, case 0 (Stephens 1974 table 1A, asymptotic points; from memory)', () => {
  // Upper-tail points of the limiting distribution: 25 % 1.248, 10 % 1.933, 5 % 2.492, 1 % 3.878.
  const points: Array<[number, number]> = [[1.248, 0.75], [1.933, 0.9], [2.492, 0.95], [3.878, 0.99]];
  for (const [z, p] of points) {
    it(`P(A² ≤ ${z}) = ${p}`, () => {
      // The points are printed to 3 decimals; dF/dz ≤ 0.3 there, so rounding alone allows 1.5e-4; 3e-4 with margin.
      expect(Math.abs(andersonDarlingLimitCdf(z) - p)).toBeLessThan(3e-4);
    });
  }
  it('A² from its definition on a hand example: u = 0.5 alone gives −1 − 2·ln 0.5 = 0.38629', () => {
    expect(andersonDarlingStatistic([0.5])).toBeCloseTo(-1 - 2 * Math.log(0.5), 12);
  });
});

describe("Grubbs' test (critical values, two-sided α = 0.05: Grubbs 1969 / NIST e-Handbook 1.3.5.17; from memory)", () => {
  const table: Array<[number, number]> = [[3, 1.155], [10, 2.29], [15, 2.549], [20, 2.709], [25, 2.822], [30, 2.908]];
  for (const [n, g] of table) {
    it(`n = ${n}: G = ${g}`, () => expect(Math.abs(grubbsCritical(n, 0.05) - g)).toBeLessThan(2e-3));
  }
  it('flags a planted far value and names it', () => {
    const values = [10, 10.1, 9.9, 10.05, 9.95, 10.02, 9.98, 10.03, 9.97, 13];
    const mean = values.reduce((a, b) => a + b) / values.length;
    const sigma = Math.sqrt(values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1));
    const test = grubbsTest(values, mean, sigma);
    expect(test.index).toBe(9);
    expect(test.outlier).toBe(true);
  });
});

describe('Cpk interval (Bissell 1990, as in NIST/SEMATECH e-Handbook 6.1.6)', () => {
  it('worked by hand: Cpk 1.33, n = 50: ±1.95996·√(1/450 + 1.7689/98) = ±0.27906', () => {
    // 1/450 = 0.0022222, 1.7689/98 = 0.0180500, sum 0.0202722, √ = 0.142380, × 1.959964 = 0.279058.
    const i = cpkInterval(1.33, 50);
    expect(i.low).toBeCloseTo(1.33 - 0.279058, 5);
    expect(i.high).toBeCloseTo(1.33 + 0.279058, 5);
  });
});

describe('two-sided tolerance factor (Howe 1969; NIST/SEMATECH e-Handbook 7.2.6.3) against exact factors (ISO 16269-6:2014 annex tables; from memory)', () => {
  // Exact k2 (n, p, γ): Howe's approximation is within about 1 % of it; allowed 1 %.
  const table: Array<[number, number, number, number]> = [[10, 0.9, 0.95, 2.856], [20, 0.95, 0.95, 2.752], [30, 0.99, 0.95, 3.35], [50, 0.95, 0.99, 2.58]];
  for (const [n, p, g, k] of table) {
    it(`n ${n}, p ${p}, γ ${g}: k ≈ ${k}`, () => expect(Math.abs(twoSidedToleranceFactor(n, p, g) / k - 1)).toBeLessThan(0.01));
  }
  it('large n tends to z_{(1+p)/2}: 1.95996 for p = 0.95 (closed form)', () => {
    expect(twoSidedToleranceFactor(1e6, 0.95, 0.95)).toBeCloseTo(1.96, 2);
  });
  it('the supported coverage puts x̄ ± k·s exactly on the nearer limit, and more units shrink k', () => {
    const p = supportedCoverage(10, 1, 24, [5, 16], 0.95);
    expect(twoSidedToleranceFactor(24, p, 0.95)).toBeCloseTo(5, 6);
    const needed = unitsNeededForCoverage(10, 1, [5, 16], 0.9999, 0.95)!;
    expect(twoSidedToleranceFactor(needed, 0.9999, 0.95)).toBeLessThanOrEqual(5);
    expect(twoSidedToleranceFactor(needed - 1, 0.9999, 0.95)).toBeGreaterThan(5);
    // z_{(1+p)/2} for p = 1 − 1e-7 is 5.33 > 5: no number of units can support it.
    expect(unitsNeededForCoverage(10, 1, [5, 16], 1 - 1e-7, 0.95)).toBeNull();
  });
});

describe('empirical CDF and kurtosis of the Monte Carlo sample', () => {
  it('mid-ranks with ties, clamped to [1/(2N), 1 − 1/(2N)] (hand)', () => {
    const s = Float64Array.of(1, 2, 2, 3);
    expect(empiricalCdf(s, 2)).toBe((1 + 3) / 8);
    expect(empiricalCdf(s, 0)).toBe(1 / 8);
    expect(empiricalCdf(s, 9)).toBe(7 / 8);
  });
  it('kurtosis of an evenly spaced grid tends to the uniform 1.8 (closed form 9/5)', () => {
    const n = 100001;
    expect(kurtosisOf(Float64Array.from({ length: n }, (_, i) => i / (n - 1)))).toBeCloseTo(1.8, 3);
  });
});
