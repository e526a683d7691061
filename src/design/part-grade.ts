// The grade of one placed resistor: tolerance, TCR, series and distribution, from the design file's layers.
// Precedence, most specific first: resistors.overrides[designator] (its own fields, then its grade), the part's own
// section (the shunt's tolerance and tcr), the default resistor fields, then the default grade from the table.
import type { DistributionSpec } from '../tolerance/part.js';
import type { SeriesName } from '../series/load.js';
import { gradeByName, gradeForTolerance, type GradeName } from './grades.js';
import type { Design, DistributionName } from './schema.js';

export interface PartGrade {
  tolerance: number;
  tcrPerK: number;
  series: SeriesName;
  distribution: DistributionName;
  /** The table grade the tolerance corresponds to, if any (for costs). */
  grade?: GradeName;
  /** Where the TCR came from, when it was not given: for the notes. */
  tcrAssumed?: string;
}

/** Per-part fields a section may set for its own part (the shunt's tolerance and TCR). */
export interface SectionGrade {
  tolerance?: number | undefined;
  tcr?: number | undefined;
}

/** Default production spread inside the tolerance band: uniform (the conservative choice for yield; common practice). */
export const DEFAULT_DISTRIBUTION: DistributionName = 'uniform';

/** `leg`: for a resistor of a two-part divider leg (RTOP_A), its leg's designator (RTOP), whose override applies
 * when the part has none of its own. */
export function partGrade(design: Design, designator: string, section: SectionGrade = {}, leg?: string): PartGrade {
  const defaults = design.resistors;
  const override = defaults.overrides?.[designator] ?? (leg === undefined ? undefined : defaults.overrides?.[leg]);
  const overrideGrade = override?.grade ? gradeByName(override.grade) : undefined;
  const defaultGrade = defaults.grade ? gradeByName(defaults.grade) : undefined;

  const tolerance =
    override?.tolerance ?? overrideGrade?.tolerance ?? section.tolerance ?? defaults.tolerance ?? defaultGrade?.tolerance;
  if (tolerance === undefined) throw new Error('resistors: the schema requires a grade or a tolerance'); // schema-checked
  const matching = gradeForTolerance(tolerance);

  let tcrAssumed: string | undefined;
  let tcrPerK = override?.tcr ?? overrideGrade?.tcrPerK ?? section.tcr ?? defaults.tcr ?? defaultGrade?.tcrPerK;
  if (tcrPerK === undefined) {
    tcrPerK = matching?.tcrPerK ?? 0;
    tcrAssumed = matching
      ? `${designator}: no TCR given, ${tcrPerK * 1e6} ppm/K assumed (usual for the ${matching.name} grade: common practice)`
      : `${designator}: no TCR given and the tolerance matches no table grade: TCR taken as 0`;
  }
  const series = override?.series ?? overrideGrade?.series ?? defaults.series ?? defaultGrade?.series ?? matching?.series ?? 'E96';
  const distribution = override?.distribution ?? defaults.distribution ?? DEFAULT_DISTRIBUTION;
  const out: PartGrade = { tolerance, tcrPerK, series, distribution };
  if (matching) out.grade = matching.name;
  if (tcrAssumed) out.tcrAssumed = tcrAssumed;
  return out;
}

/**
 * The engine's distribution for a design-file name (the normals: tolerance = 3σ, common practice). "normal" is cut
 * off at the band: makers test parts to their band and sort out the rest (common practice), so no part leaves it;
 * "normal-unbounded" keeps the tails (Monte Carlo can then pass the worst case, and the analysis notes say so).
 */
export function distributionSpec(name: DistributionName): DistributionSpec {
  switch (name) {
    case 'normal':
    case 'truncated-normal':
      return { kind: 'truncated-normal', k: 3 };
    case 'normal-unbounded':
      return { kind: 'normal', k: 3 };
    case 'triangular':
      return { kind: 'triangular' };
    default:
      return { kind: 'uniform' };
  }
}
