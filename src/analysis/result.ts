// What an analysis returns: plain JSON, everything a report needs (a report never recomputes a statistic).

export interface Interval {
  low: number;
  high: number;
}

export interface WorstCaseResult {
  min: number;
  max: number;
  /** The vertex that gave `min`: part name → 'low' | 'high' band end (parts without spread are left out). */
  minVertex: Record<string, 'low' | 'high'>;
  maxVertex: Record<string, 'low' | 'high'>;
  /** 'enumeration' (every vertex, exact for outputs monotonic in each part) or 'sensitivity-signs' (then checked). */
  method: 'enumeration' | 'sensitivity-signs';
  /** Vertices evaluated. */
  evaluations: number;
}

export interface RssResult {
  /** Combined standard uncertainty u(y) by the law of propagation (JCGM 100:2008, 5.1.2), first order. */
  sigma: number;
  /**
   * Expanded uncertainty U = k·u(y) (JCGM 100:2008, 6.2.1), k = coverageFactor. With k = 2 the interval y ± U
   * covers about 95 % when y is close to normal (JCGM 100:2008, 6.3.3); it is not a tolerance band.
   */
  expandedUncertainty: number;
  /** The coverage factor k of expandedUncertainty (2, JCGM 100:2008 6.3.3). */
  coverageFactor: number;
  /** Output at the parts' means (the linearisation point's estimate). */
  center: number;
}

/** One part's first-order figures from the law of propagation at the parts' means (rss.ts). */
export interface RssContribution {
  part: string;
  /** Sensitivity coefficient ∂y/∂x_i (central difference), output unit per part unit. */
  sensitivity: number;
  /** The part's standard uncertainty u(x_i) (σ of its distribution as Monte Carlo draws it). */
  standardUncertainty: number;
  /** First-order (RSS) share: (c_i·u_i)² / u(y)², linearised at the parts' means; shares add to 1. */
  varianceShare: number;
}

/** One part's share of an output's variance: the RSS figures plus the variance-based indices (variance-indices.ts). */
export interface Contribution extends RssContribution {
  /** Total-effect share S_Ti (Jansen 1999 estimator): the part alone and through every interaction it takes part in. */
  totalEffectShare: number;
  /** Standard error of totalEffectShare (the estimator's own, from its N rows). */
  totalEffectStandardError: number;
  /** First-order share S_i (Saltelli et al. 2010 estimator): the part alone, averaged over the other parts. */
  firstOrderShare: number;
  firstOrderStandardError: number;
}

/** How the variance-based shares were estimated (one sample for every output of a run). */
export interface VarianceIndicesMethod {
  estimator: string;
  /** N: rows of each of the sample matrices A and B. */
  baseSamples: number;
  /** Model evaluations spent: N·(k + 2), k the parts that vary in Monte Carlo. */
  evaluations: number;
  /** The seed name of the sample's own stream (its chunk 0 holds A, then B). */
  seed: string;
  /** Wall time of the indices, s: set by the caller that timed them (the design layer; src/analysis reads no clock). */
  seconds?: number;
}

/**
 * Whether the first-order RSS σ tells the Monte Carlo σ within RSS_AGREEMENT (variance-budget.ts), and if not, why:
 * 'interaction' when the first-order shares leave a tenth or more of the variance to interactions, else 'nonlinearity'.
 */
export type RssAgreement = 'agrees' | 'interaction' | 'nonlinearity';

/** An output's variance budget: the method and the sums that say how far interactions reach. */
export interface VarianceBudget {
  method: VarianceIndicesMethod;
  /** Σ total-effect shares: past 1 by what interactions add (each counted once per part it involves). */
  totalEffectSum: number;
  /** Σ first-order shares: 1 − this is the share of the variance in interactions. */
  firstOrderSum: number;
  /** RSS σ / Monte Carlo σ; null when the Monte Carlo σ is 0. */
  rssToMonteCarloSigma: number | null;
  rssAgreement: RssAgreement;
}

export interface YieldResult {
  /** Percentage of units inside the window (what counts as inside is said where the yield is given). */
  pct: number;
  /** 95 % Wilson score interval for the yield, in %. */
  low: number;
  high: number;
}

export interface Histogram {
  /** Bin edges, length counts.length + 1, ascending (the first and last bins reach the observed min and max). */
  edges: number[];
  counts: number[];
  /** With a window: how many of the counted values lie below its low end and above its high end (exact counts). */
  belowSpec?: number;
  aboveSpec?: number;
}

export interface Percentile {
  /** Percent, e.g. 2.5. */
  pct: number;
  value: number;
}

/** All units held at one ambient of the operating grid. */
export interface AmbientPoint {
  ambientC: number;
  mean: number;
  sigma: number;
  min: number;
  max: number;
  /** The 0.135 % and 99.865 % percentiles (the ±3σ-equivalent 99.73 % band), read from the fine histogram. */
  band9973: Interval;
  /** Largest error of the band ends (one fine histogram bin), output unit. */
  bandBound: number;
  /** Units inside the window at this ambient (with a window). */
  yield?: YieldResult;
  cp?: number;
  cpk?: number;
  /** Every part at its nominal value, at this ambient (added by analyze). */
  nominal?: number;
  /** Worst case with the ambient held here: every other part's band ends enumerated (added by analyze). */
  worstCase?: Interval;
}

export interface AllSpecsYield extends YieldResult {
  /** The outputs whose windows a unit had to meet. */
  outputs: string[];
}

/** What Monte Carlo alone tells of one output (JCGM 101:2008). */
export interface MonteCarloOutput {
  name: string;
  unit: string;
  spec?: [number, number];
  mean: number;
  sigma: number;
  min: number;
  max: number;
  percentiles: Percentile[];
  /** Probabilistically symmetric coverage intervals (JCGM 101:2008, 7.7.1). */
  interval95: Interval;
  interval9973: Interval;
  /** Shortest coverage intervals (JCGM 101:2008, 7.7.2); absent only from a run asked to leave them out
   *  (MonteCarloOptions.shortestIntervals: false). */
  shortest95?: Interval;
  shortest9973?: Interval;
  /** 'exact' (from every sample, sorted) or 'histogram' (± quantileBound, one fine bin). */
  quantileMethod: 'exact' | 'histogram';
  /** Largest possible error of each quantile and interval end (0 when exact), output unit. */
  quantileBound: number;
  /**
   * Per unit: the share of units inside the window at every ambient of the operating grid (present with a window).
   * Without a grid (see MonteCarloResult.ambientGridC), at the ambient drawn with each unit.
   */
  yield?: YieldResult;
  /** The share of trials inside the window at the ambient drawn with each trial (a random unit at a random ambient). */
  yieldAtRandomAmbient?: YieldResult;
  /** Units out of the window somewhere in the range, per million (1e6 − yield·1e4). */
  ppmOut?: number;
  /**
   * Process capability (NIST/SEMATECH e-Handbook 6.1.6); present with a spec window and σ > 0. With an ambient
   * grid, from the units at the grid ambient where Cpk is lowest (capabilityAmbientC); they assume normality.
   */
  cp?: number;
  cpk?: number;
  capabilityAmbientC?: number;
  /** Only this limit of the window is the design's: cpk is then Cpl ('low') or Cpu ('high'), and there is no cp. */
  capabilitySides?: 'low' | 'high';
  /** The units at each ambient of the operating grid (per-unit runs). */
  ambientSweep?: AmbientPoint[];
  /** Adaptive runs: the numerical tolerance δ of u(y) the run was held to (JCGM 101:2008 7.9.2), output unit. */
  numericalTolerance?: number;
  histogram: Histogram;
}

/** One output's full result: Monte Carlo plus the nominal, worst case, RSS and contributions. */
export interface OutputResult extends MonteCarloOutput {
  /** Shortest coverage intervals (JCGM 101:2008, 7.7.2): always in a full analysis. */
  shortest95: Interval;
  shortest9973: Interval;
  nominal: number;
  worstCase: WorstCaseResult;
  rss: RssResult;
  /** Ranked by total-effect share, largest first. */
  contributions: Contribution[];
  varianceBudget: VarianceBudget;
}

/** An output's result in a side-by-side comparison (analyzeSummary; the grade study's rows): OutputResult without
 *  what such a comparison never shows: the variance-based shares (contributions, variance budget), the shortest
 *  coverage intervals and the per-ambient sweep. */
export type OutputSummary = Omit<OutputResult, 'contributions' | 'varianceBudget' | 'shortest95' | 'shortest9973' | 'ambientSweep'>;

/** AnalysisResult with OutputSummary outputs (analyzeSummary). */
export type AnalysisSummary = Omit<AnalysisResult, 'outputs'> & { outputs: Record<string, OutputSummary> };

export interface AnalysisResult {
  seed: string;
  trials: number;
  workers: number;
  /** Trials per chunk; chunk k draws from its own xor128 stream, started from SHA-256 of (seed, k). */
  chunkSize: number;
  /** How the numbers were obtained (distributions, temperature handling, quantile method, adaptive stop). */
  notes: string[];
  outputs: Record<string, OutputResult>;
  /** The ambients every unit was checked at, °C (null: judged at the ambient drawn with it). */
  ambientGridC: number[] | null;
  /** Units that met every window at every ambient (null without windows). */
  allSpecs: AllSpecsYield | null;
}
