// How each part spreads in production, from the design file: the resistors' binned distribution (a wider grade's
// normal with the tighter grade sorted out: src/tolerance/distributions/binned.ts, common practice) and the
// distributions the reference, the fixed threshold, the offsets and the bias currents choose (uniform unless said).
// Applied to the resolved SupplySpec; nominal values and bands are left as they are, so worst case does not change.
import type { SupplySpec } from '../analysis/models/supply.js';
import { InputError } from '../errors.js';
import type { DistributionSpec } from '../tolerance/part.js';
import type { BoundDistributionName } from './life-fields.js';
import { distributionSpec } from './part-grade.js';
import type { Design, DistributionName } from './schema.js';
import { legOf, specResistors } from '../analysis/spec-resistors.js';

/** σ of the production normal a binned grade is cut from: band = 3σ (common practice, as the other normals). */
const BINNED_K = 3;

/** A bound quantity's distribution (offsets, bias currents, a fixed threshold): the resistors' names, no binned. */
export function boundDistributionSpec(name: BoundDistributionName | undefined): DistributionSpec | undefined {
  return name === undefined ? undefined : distributionSpec(name);
}

/**
 * A distribution named in the design file for a part with tolerance `tolerance`: binned needs `sortedOut` below the
 * tolerance; `sortedOut` without binned is refused (it would silently mean nothing). `where` is the field path of
 * the distribution's layer, `sortedWhere` that of sortedOut.
 */
export function toleranceDistributionSpec(name: DistributionName, sortedOut: number | undefined, tolerance: number, where: string, sortedWhere: string): DistributionSpec {
  if (name !== 'binned') {
    if (sortedOut !== undefined) throw new InputError(sortedWhere, `sortedOut is given but the distribution is ${name}`, 'sortedOut only with distribution "binned"');
    return distributionSpec(name);
  }
  if (sortedOut === undefined) throw new InputError(where, 'a binned distribution needs the tighter grade sorted out of it', 'sortedOut: the tighter grade\'s tolerance, e.g. "1%" for a 2% part');
  if (!(sortedOut < tolerance)) {
    throw new InputError(sortedWhere, `${sortedOut * 100} % sorted out of a ±${tolerance * 100} % part leaves nothing`, `a tolerance below the part's own ±${tolerance * 100} %`);
  }
  return { kind: 'binned', k: BINNED_K, innerFraction: sortedOut / tolerance };
}

/** A copy of `spec` with the design file's production distributions applied. */
export function withProductionSpread(spec: SupplySpec, design: Design): SupplySpec {
  const out = structuredClone(spec);
  const defaults = design.resistors;
  for (const { r, kind } of specResistors(out)) {
    if (kind === 'potentiometer') continue; // a pot's track is not a sorted grade
    const leg = legOf(r.name);
    const ownKey = defaults.overrides?.[r.name] ? r.name : leg !== undefined && defaults.overrides?.[leg] ? leg : undefined;
    const override = ownKey === undefined ? undefined : defaults.overrides![ownKey];
    const name = override?.distribution ?? defaults.distribution;
    const sorted = override?.sortedOut ?? defaults.sortedOut;
    if (name === undefined && sorted === undefined) continue;
    const layer = override?.distribution !== undefined ? `resistors.overrides.${ownKey}` : 'resistors';
    const sortedLayer = override?.sortedOut !== undefined ? `resistors.overrides.${ownKey}` : 'resistors';
    r.distribution = toleranceDistributionSpec(name ?? 'uniform', sorted, r.tolerance, `${layer}.distribution`, `${sortedLayer}.sortedOut`);
  }

  const ref = design.reference;
  if (ref && out.reference && (ref.distribution !== undefined || ref.sortedOut !== undefined)) {
    out.reference.distribution = toleranceDistributionSpec(ref.distribution ?? 'uniform', ref.sortedOut, ref.tolerance, 'reference.distribution', 'reference.sortedOut');
  }
  const bias = boundDistributionSpec(design.voltage?.feedbackBiasDistribution);
  if (bias && out.divider?.feedbackBias) out.divider.feedbackBias.distribution = bias;

  const sense = out.sense;
  const c = design.current;
  if (sense && c) {
    const threshold = boundDistributionSpec(c.threshold.distribution);
    if (threshold) {
      if (sense.threshold.kind !== 'fixed') throw new InputError('current.threshold.distribution', 'the threshold is divided from a reference', 'no distribution for a divided threshold (its resistors and reference carry their own)');
      sense.threshold.distribution = threshold;
    }
    const compare = boundDistributionSpec(c.compareOffsetDistribution);
    if (compare && sense.compareOffset) sense.compareOffset.distribution = compare;
    if (sense.topology !== 'direct') {
      const vos = boundDistributionSpec(c.amplifier?.vosDistribution);
      if (vos) sense.amplifier.offsetDistribution = vos;
      const ib = boundDistributionSpec(c.amplifier?.biasDistribution);
      if (ib && sense.amplifier.biasCurrent) sense.amplifier.biasCurrent.distribution = ib;
    }
  }
  return out;
}
