// Resistor networks in the supply model: the members of one network share a draw and each has its own, as
// src/tolerance/network-bands.ts splits the datasheet's figures. Each draw is its own Part, so worst case (corners of
// the shared term × corners of the members' own terms), RSS and the contributions name them:
//   "RN1 absolute"       s, the members' shared relative deviation        kind 'network absolute'
//   "RN1 ratio R3"       m_3, R3's own relative deviation                  kind 'network ratio'
//   "RN1 TCR"            a, the shared temperature coefficient (1/K)       kind 'temperature coefficient'
//   "RN1 tracking R3"    t_3, R3's own temperature coefficient (1/K)       kind 'temperature coefficient'
// A member at temperature is R_nom·(1 + s)·(1 + m_i)·(1 + drift)·(1 + (a + t_i)·ΔT); its own tolerance and TCR fields
// in the SupplySpec are not used (the network's figures replace them).
import { InputError } from '../../errors.js';
import { networkBands } from '../../tolerance/network-bands.js';
import { partFromBound, type DistributionSpec, type Part } from '../../tolerance/part.js';

/** One resistor network of a SupplySpec: plain JSON in SI units. */
export interface NetworkSpec {
  /** Designator of the network, e.g. 'RN1'. */
  name: string;
  /** Designators of the member resistors (at least two), as named in the SupplySpec. */
  members: string[];
  /** Absolute tolerance of every member, a fraction. */
  tolerance: number;
  /** Ratio (matching) tolerance between any two members, a fraction (≤ tolerance). */
  ratio: number;
  /** Absolute TCR bound of every member, 1/K (default 0). */
  tcrPerK?: number;
  /** TCR tracking between any two members, 1/K (default 2·tcrPerK: the members' TCRs as independent). */
  trackingPerK?: number;
  /** Spread of the shared and of each member's own draw inside its band (default uniform). */
  distribution?: DistributionSpec;
}

const NONE = -1;

/** Parameter indices of one member: its nominal and the four draws it reads. */
export interface MemberSlot {
  nominal: number;
  shared: number;
  mismatch: number;
  sharedTcr: number;
  tracking: number;
}

interface NetworkState {
  spec: NetworkSpec;
  where: string;
  shared: number;
  sharedTcr: number;
  found: Set<string>;
}

/** The networks of one model: checks the specs, adds each network's parts when its first member is placed. */
export class NetworkRegistry {
  private readonly byMember = new Map<string, NetworkState>();
  private readonly states: NetworkState[] = [];

  constructor(specs: NetworkSpec[] | undefined, private readonly add: (part: Part) => number) {
    (specs ?? []).forEach((spec, i) => {
      const where = `supply.networks[${i}]`;
      if (!Array.isArray(spec.members) || spec.members.length < 2) {
        throw new InputError(`${where}.members`, 'a network needs at least two members', 'two or more resistor designators');
      }
      try {
        networkBands(figures(spec));
      } catch (e) {
        throw new InputError(where, (e as Error).message, 'tolerance ≥ ratio ≥ 0 (fractions below 1), tcrPerK ≥ 0, 0 ≤ trackingPerK ≤ 2·tcrPerK');
      }
      const state: NetworkState = { spec, where, shared: NONE, sharedTcr: NONE, found: new Set() };
      for (const member of spec.members) {
        const other = this.byMember.get(member);
        if (other) throw new InputError(`${where}.members`, `${member} is already a member of ${other.spec.name}`, 'each resistor in at most one network');
        this.byMember.set(member, state);
      }
      this.states.push(state);
    });
  }

  /** True when the designator belongs to a network. */
  has(name: string): boolean {
    return this.byMember.has(name);
  }

  /** Adds the member's own draws (and the network's shared ones, the first time) and returns its slot. */
  member(name: string, nominal: number, where: string): MemberSlot {
    const state = this.byMember.get(name);
    if (!state) throw new Error(`${name} is not a network member`);
    if (state.found.has(name)) throw new InputError(where, `${name} appears twice in the supply`, 'a unique designator for each part');
    state.found.add(name);
    const { spec } = state;
    const bands = networkBands(figures(spec));
    const bound = (partName: string, kind: Part['kind'], plusMinus: number): number => {
      const input: Parameters<typeof partFromBound>[0] = { name: partName, kind, nominal: 0, plusMinus };
      if (spec.distribution && kind !== 'temperature coefficient') input.distribution = spec.distribution;
      return this.add(partFromBound(input));
    };
    if (state.shared === NONE) {
      state.shared = bound(`${spec.name} absolute`, 'network absolute', bands.shared);
      if (bands.sharedTcrPerK > 0) state.sharedTcr = bound(`${spec.name} TCR`, 'temperature coefficient', bands.sharedTcrPerK);
    }
    const mismatch = bound(`${spec.name} ratio ${name}`, 'network ratio', bands.mismatch);
    const tracking = bands.memberTcrPerK > 0 ? bound(`${spec.name} tracking ${name}`, 'temperature coefficient', bands.memberTcrPerK) : NONE;
    return { nominal, shared: state.shared, mismatch, sharedTcr: state.sharedTcr, tracking };
  }

  /** Every member named by a network must have been placed. */
  finish(): void {
    for (const state of this.states) {
      const missing = state.spec.members.filter((m) => !state.found.has(m));
      if (missing.length > 0) {
        throw new InputError(`${state.where}.members`, `no resistor ${missing.join(', ')} in this supply`, 'designators of fixed resistors of the divider, gain stage or threshold divider');
      }
    }
  }

  /** Notes for the report: how each network was drawn. */
  notes(): string[] {
    return this.states.map(({ spec }) => {
      const b = networkBands(figures(spec));
      const pct = (x: number): string => `${Number((x * 100).toPrecision(3))} %`;
      const ppm = (x: number): string => `${Number((x * 1e6).toPrecision(3))} ppm/K`;
      return (
        `Network ${spec.name} (${spec.members.join(', ')}): each member R·(1 + s)·(1 + m), s shared within ±${pct(b.shared)} ("${spec.name} absolute"), ` +
        `m its own within ±${pct(b.mismatch)} ("${spec.name} ratio …"), so every unit holds both ±${pct(spec.tolerance)} absolute and ±${pct(spec.ratio)} ratio; ` +
        `TCR shared within ±${ppm(b.sharedTcrPerK)} plus its own within ±${ppm(b.memberTcrPerK)} (absolute ±${ppm(spec.tcrPerK ?? 0)}, tracking ${ppm(spec.trackingPerK ?? 2 * (spec.tcrPerK ?? 0))}).`
      );
    });
  }
}

function figures(spec: NetworkSpec): { tolerance: number; ratio: number; tcrPerK: number; trackingPerK: number } {
  const tcrPerK = spec.tcrPerK ?? 0;
  return { tolerance: spec.tolerance, ratio: spec.ratio, tcrPerK, trackingPerK: spec.trackingPerK ?? 2 * tcrPerK };
}

/** The member at temperature for trials 0..n−1: R_nom·(1 + s)·(1 + m)·(1 + drift)·(1 + (a + t)·ΔT); d is the relative drift column (null without drift). */
export function memberColumn(p: Float64Array[], m: MemberSlot, d: Float64Array | null, dT: Float64Array, n: number, out: Float64Array): Float64Array {
  const nominal = m.nominal;
  const s = p[m.shared]!;
  const own = p[m.mismatch]!;
  const a = m.sharedTcr === NONE ? null : p[m.sharedTcr]!;
  const t = m.tracking === NONE ? null : p[m.tracking]!;
  for (let j = 0; j < n; j++) {
    const alpha = (a === null ? 0 : a[j]!) + (t === null ? 0 : t[j]!);
    out[j] = nominal * (1 + s[j]!) * (1 + own[j]!) * (d === null ? 1 : 1 + d[j]!) * (1 + alpha * dT[j]!);
  }
  return out;
}
