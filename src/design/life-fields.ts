// Design-file fields for drift allowances, production distributions and the analysis condition (issue 11, sections
// 3 and 4). schema.ts places them; src/design/life-condition.ts and production-spread.ts read them.
import { z } from 'zod';
import { LIFE_CONDITIONS } from '../tolerance/life-allowances.js';
import { percent } from './fields.js';

/** Adds what a field means in front of what it accepts (as schema.ts's describe). */
function describe<T extends z.ZodType>(schema: T, meaning: string): T {
  const accepted = z.globalRegistry.get(schema)?.description;
  return schema.meta({ description: accepted ? `${meaning}; ${accepted}` : meaning }) as T;
}

/** Spreads a quantity known as a ± bound (an offset, a bias current, a drift allowance) may take. */
export const BOUND_DISTRIBUTIONS = ['uniform', 'normal', 'truncated-normal', 'normal-unbounded', 'triangular'] as const;
export type BoundDistributionName = (typeof BOUND_DISTRIBUTIONS)[number];

const BOUND_TEXT = 'uniform (default), normal (bound = 3σ, cut off at the bound), truncated-normal (the same), normal-unbounded (not cut off), triangular (peak at the nominal)';

/** A distribution for a ± bound quantity. */
export function boundDistribution(meaning: string) {
  return z.enum(BOUND_DISTRIBUTIONS).meta({ description: `${meaning}: ${BOUND_TEXT}` });
}

/** The tighter grade sorted out of a binned part's batch, as a tolerance ("1%" for a 2 % part). */
export const sortedOut = describe(
  percent({ min: Number.MIN_VALUE, max: 0.5, text: 'above 0 % up to 50 %, below the part\'s own tolerance' }),
  'with distribution "binned": the tolerance of the tighter grade sorted out of the same production (e.g. 1% for a 2% part: what is left has no parts within ±1 %; common practice)',
);

/** Named drift allowances of one part: ± bands (fractions) and the distribution the drift takes inside them. */
export const driftAllowances = z
  .strictObject({
    loadLife: describe(percent({ max: 0.5, text: '0 % to 50 %' }), 'load-life drift allowance, ± (after long operation at rated power)').optional(),
    dampHeat: describe(percent({ max: 0.5, text: '0 % to 50 %' }), 'damp-heat drift allowance, ± (after exposure to humidity)').optional(),
    soldering: describe(percent({ max: 0.5, text: '0 % to 50 %' }), 'soldering-heat drift allowance, ± (from the heat of assembly)').optional(),
    distribution: boundDistribution('how the drift spreads inside each allowance').optional(),
  })
  .meta({
    description:
      'drift allowances, used when the design is analysed at end of life: { loadLife, dampHeat, soldering } as ± percentages (each its own contributor), optional distribution; a resistor without them takes its grade\'s defaults (common practice: replace with your datasheet)',
  });
export type DriftAllowancesInput = z.output<typeof driftAllowances>;

/** The analysis condition (analysis.condition; the command line's --condition overrides it). */
export const lifeCondition = z
  .enum(LIFE_CONDITIONS)
  .meta({ description: 'what `spread`, `grades` and `design` analyse: as-built (default: tolerances only, no drift) or end-of-life (tolerances plus every drift allowance: resistors.drift, per-part drift, the grade defaults, reference.drift)' });

/** Lot structure: parts of one reel share a lot offset (the reel-lot model). */
export const lots = z
  .strictObject({
    count: z.number().int().min(2).max(1000).meta({ description: 'lots K to simulate, 2 to 1000 (each its own reel of every part)' }),
    share: describe(
      percent({ max: 0.95, text: '0 % to 95 %' }),
      'share of each part\'s tolerance band taken by the lot offset (default 50 %: common practice); units of a lot spread over the rest of the band about the lot\'s centre',
    ).optional(),
    trialsPerLot: z.number().int().min(1000).max(1e7).meta({ description: 'units simulated per lot, 1000 to 1e7 (default 20000)' }).optional(),
  })
  .meta({
    description:
      'reel-lot model: every resistor value and grade is one reel per lot, whose parts share a lot offset drawn uniformly within ±share of the band; units draw their own value within the rest; `spread` then reports the worst lot\'s yield among K lots beside the overall yield (defaults: common practice)',
  });
export type LotsInput = z.output<typeof lots>;
