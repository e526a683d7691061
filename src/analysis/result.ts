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
  /** Tolerance half-widths combined in quadrature, sqrt(Σ (c_i·half-width_i)²): common practice. */
  halfWidth: number;
  /** Output at the parts' means (the linearisation point's estimate). */
  center: number;
}

export interface Contribution {
  part: string;
  /** Sensitivity coefficient ∂y/∂x_i (central difference), output unit per part unit. */
  sensitivity: number;
  /** The part's standard uncertainty u(x_i) (σ of its distribution as Monte Carlo draws it). */
  standardUncertainty: number;
  /** (c_i·u_i)² / u(y)²; shares add to 1; ranked largest first. */
  varianceShare: number;
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
  /** Shortest coverage intervals (JCGM 101:2008, 7.7.2). */
  shortest95: Interval;
  shortest9973: Interval;
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
  nominal: number;
  worstCase: WorstCaseResult;
  rss: RssResult;
  contributions: Contribution[];
}

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
