// Lot-to-lot risk: the reel-lot model. A supply is built from reels; every resistor of one value, tolerance and
// kind on the board comes off the same reel, and a reel's parts share a lot offset. Model (our own; its default
// share is common practice, not a standard):
//   lot k, reel g:  δ_gk drawn uniformly in ±share·t_g (t_g the reel's relative tolerance)
//   unit in lot k:  R = R_nom·(1 + δ_gk) + e, e spread as the part's own distribution over ±(1 − share)·t_g·R_nom
// so every unit stays inside the part's band [R_nom·(1 − t), R_nom·(1 + t)], and pooled over many lots a part's value
// is the sum of the lot offset and the unit's draw. Potentiometers, references, offsets and bias currents are drawn
// per unit as before (their lot structure is not modelled). TCRs and drift allowances are per unit.
//
// The study draws K lots' offsets from one xor128 stream of its own (seeded `${seed}:lots`, chunk 0), then runs the
// Monte Carlo engine on each lot's supply (seeded `${seed}:lot ${k}`) with the same trial count. The engine's numbers
// do not depend on the worker count, and neither do the offsets, so the study is reproducible for any worker count.
// Reported: each lot's per-unit yield (src/analysis/unit-check.ts decides), the worst lot's, and the overall yield
// over every unit of every lot, with its 95 % Wilson interval (over units: it does not allow for the lot-to-lot
// spread, which the worst lot shows).
import { chunkRandom } from './chunk-random.js';
import { buildSupplyModel, type ResistorSpec, type SupplySpec } from './models/supply.js';
import { monteCarlo } from './monte-carlo.js';
import type { YieldResult } from './result.js';
import { specResistors } from './spec-resistors.js';
import { wilsonInterval } from './statistics/wilson.js';

/** Share of a part's tolerance band the lot offset takes, when not given: common practice (from memory). */
export const DEFAULT_LOT_SHARE = 0.5;
/** Units simulated per lot when not given. */
export const DEFAULT_TRIALS_PER_LOT = 20_000;

export interface LotStudyOptions {
  /** Lots K (≥ 2). */
  count: number;
  /** Share of the band the lot offset takes, 0 ≤ share < 1. */
  share: number;
  trialsPerLot: number;
  seed: string | number;
  workers?: number;
  /** Called after each lot (done lots, K). */
  onLot?: (done: number, count: number) => void;
}

/** One reel: the resistors that share a lot offset. */
export interface Reel {
  /** Designators joined by '+', e.g. 'R1+R3'. */
  name: string;
  members: string[];
  /** Relative tolerance of its parts. */
  tolerance: number;
}

export interface LotRow {
  /** 0-based. */
  index: number;
  /** Each reel's lot offset, relative (δ), in `reels` order. */
  offsets: number[];
  /** Per-unit yield of each output with a window, %. */
  yieldPct: Record<string, number>;
  /** Units meeting every window, %; null without windows. */
  allSpecsPct: number | null;
}

export interface LotStudyResult {
  model: 'reel-lot';
  count: number;
  share: number;
  trialsPerLot: number;
  seed: string;
  reels: Reel[];
  lots: LotRow[];
  /** Over every unit of every lot, per output with a window. */
  overall: Record<string, YieldResult>;
  overallAllSpecs: YieldResult | null;
  /** The lot with the lowest yield, per output. */
  worst: Record<string, { lot: number; pct: number }>;
  worstAllSpecs: { lot: number; pct: number } | null;
  notes: string[];
}

/**
 * Groups the supply's fixed resistors into reels: same kind, nominal value and tolerance. A resistor network's
 * members are left out: their values come from the network's own shared and per-member draws, which a reel offset
 * on the member's nominal would widen rather than narrow.
 */
export function reelsOf(spec: SupplySpec): Reel[] {
  const byKey = new Map<string, Reel>();
  const inNetwork = new Set((spec.networks ?? []).flatMap((n) => n.members));
  for (const { r, kind } of specResistors(spec)) {
    if (kind === 'potentiometer' || !(r.tolerance > 0) || inNetwork.has(r.name)) continue;
    const key = `${kind}\u0000${r.nominal}\u0000${r.tolerance}`;
    const reel = byKey.get(key);
    if (reel) {
      reel.members.push(r.name);
      reel.name = reel.members.join('+');
    } else byKey.set(key, { name: r.name, members: [r.name], tolerance: r.tolerance });
  }
  return [...byKey.values()];
}

/**
 * The supply of one lot: each reel member's nominal moved by the reel's offset δ, its band narrowed to
 * ±(1 − share)·t about that (as a tolerance relative to the new nominal). Everything else as given.
 */
export function lotSpec(spec: SupplySpec, reels: readonly Reel[], offsets: readonly number[], share: number): SupplySpec {
  const copy = structuredClone(spec);
  const offsetOf = new Map<string, number>();
  reels.forEach((reel, g) => reel.members.forEach((name) => offsetOf.set(name, offsets[g]!)));
  for (const { r } of specResistors(copy)) {
    const delta = offsetOf.get(r.name);
    if (delta === undefined) continue;
    moveIntoLot(r, delta, share);
  }
  return copy;
}

function moveIntoLot(r: ResistorSpec, delta: number, share: number): void {
  const halfWidth = (1 - share) * r.tolerance * r.nominal;
  r.nominal *= 1 + delta;
  r.tolerance = halfWidth / r.nominal;
}

/** Draws every lot's offsets: K rows of one uniform per reel, δ = share·t·(2u − 1). */
export function lotOffsets(reels: readonly Reel[], count: number, share: number, seed: string): number[][] {
  const random = chunkRandom(`${seed}:lots`, 0);
  const rows: number[][] = [];
  for (let k = 0; k < count; k++) rows.push(reels.map((reel) => share * reel.tolerance * (2 * random() - 1)));
  return rows;
}

export async function lotStudy(spec: SupplySpec, options: LotStudyOptions): Promise<LotStudyResult> {
  const { count, share, trialsPerLot } = options;
  if (!Number.isInteger(count) || count < 2) throw new Error(`lotStudy: count ${count} must be a whole number ≥ 2`);
  if (!(share >= 0 && share < 1)) throw new Error(`lotStudy: share ${share} must be in [0, 1)`);
  const seed = String(options.seed);
  const reels = reelsOf(spec);
  const offsets = lotOffsets(reels, count, share, seed);
  const model = buildSupplyModel(spec);
  const windowed = model.outputs.filter((o) => o.spec).map((o) => o.name);
  const passed: Record<string, number> = Object.fromEntries(windowed.map((name) => [name, 0]));
  let allPassed = 0;
  let anyAll = false;
  const lots: LotRow[] = [];
  for (let k = 0; k < count; k++) {
    const lot = lotSpec(spec, reels, offsets[k]!, share);
    const mc = await monteCarlo(buildSupplyModel(lot), {
      trials: trialsPerLot,
      seed: `${seed}:lot ${k}`,
      source: { kind: 'supply', spec: lot },
      ...(options.workers !== undefined ? { workers: options.workers } : {}),
    });
    const yieldPct: Record<string, number> = {};
    for (const o of mc.outputs) {
      if (!o.yield) continue;
      yieldPct[o.name] = o.yield.pct;
      passed[o.name]! += Math.round((o.yield.pct / 100) * mc.trials);
    }
    let allSpecsPct: number | null = null;
    if (mc.allSpecs) {
      anyAll = true;
      allSpecsPct = mc.allSpecs.pct;
      allPassed += Math.round((mc.allSpecs.pct / 100) * mc.trials);
    }
    lots.push({ index: k, offsets: offsets[k]!, yieldPct, allSpecsPct });
    options.onLot?.(k + 1, count);
  }
  const units = count * trialsPerLot;
  const pooled = (n: number): YieldResult => {
    const interval = wilsonInterval(n, units);
    return { pct: (100 * n) / units, low: 100 * interval.low, high: 100 * interval.high };
  };
  const overall: Record<string, YieldResult> = {};
  const worst: Record<string, { lot: number; pct: number }> = {};
  for (const name of windowed) {
    overall[name] = pooled(passed[name]!);
    worst[name] = lowest(lots.map((l) => l.yieldPct[name] ?? 100));
  }
  const notes = [
    `Reel-lot model: ${count} lots of ${trialsPerLot.toLocaleString('en-US')} units; parts of one value, tolerance and kind share a reel (${reels.map((r) => r.name).join(', ')}), whose lot offset is drawn uniformly within ±${Math.round(share * 100)} % of the band (common practice), and each unit draws within the remaining ±${Math.round((1 - share) * 100)} % about it.`,
    `Lot offsets from the stream seeded "${seed}:lots"; lot k's units from the engine seeded "${seed}:lot k" (the same for any worker count). Potentiometers, references, offsets and bias currents are drawn per unit${(spec.networks ?? []).length > 0 ? `, and so are the members of ${(spec.networks ?? []).map((n) => n.name).join(', ')} (a network's lot-to-lot spread is not modelled)` : ''}.`,
    'Overall yield: every unit of every lot, with a Wilson interval over units (it does not allow for the lot-to-lot spread; the worst lot shows that).',
    'Pooled over lots, each part spreads as its lot offset plus its unit draw (for a uniform part a trapezoid, narrower in σ than the whole band drawn uniformly), so the overall yield need not equal the main analysis\'s.',
  ];
  const shared = reels.filter((r) => r.members.length > 1).map((r) => r.name);
  if (shared.length > 0) {
    notes.push(`${shared.join(', ')}: one reel each, so their lot offsets are equal and their ratio varies less than with independent parts; if assembly may mix reels, the main analysis (independent parts) is the figure to plan with.`);
  }
  return {
    model: 'reel-lot',
    count,
    share,
    trialsPerLot,
    seed,
    reels,
    lots,
    overall,
    overallAllSpecs: anyAll ? pooled(allPassed) : null,
    worst,
    worstAllSpecs: anyAll ? lowest(lots.map((l) => l.allSpecsPct ?? 100)) : null,
    notes,
  };
}

function lowest(values: number[]): { lot: number; pct: number } {
  let lot = 0;
  for (let k = 1; k < values.length; k++) if (values[k]! < values[lot]!) lot = k;
  return { lot, pct: values[lot]! };
}
