// The design file's `networks` as the engine's NetworkSpec list, once the parts are placed: each member must be a
// fixed resistor of the resolved supply (an "auto" divider with search.parts 3 may have made a leg two resistors,
// which only now is known). The member's own ResistorSpec takes the network's tolerance, TCR and distribution, so
// the BOM and every report show the figures the part is bought at; the model itself draws members from the network's
// shared and own terms (src/analysis/models/network-parts.ts).
import { supplyResistors } from '../analysis/graded-spec.js';
import type { NetworkSpec, SupplySpec } from '../analysis/models/supply.js';
import { InputError } from '../errors.js';
import { distributionSpec, partGrade } from './part-grade.js';
import type { Design } from './schema.js';

const pct = (x: number): string => `${Number((x * 100).toPrecision(6))} %`;

export interface ResolvedNetworks {
  networks: NetworkSpec[];
  /** Member designator → its network's designator. */
  memberOf: Record<string, string>;
  notes: string[];
}

export function resolveNetworks(design: Design, spec: SupplySpec): ResolvedNetworks {
  const networks: NetworkSpec[] = [];
  const memberOf: Record<string, string> = {};
  const notes: string[] = [];
  const placed = new Map(supplyResistors(spec).filter((x) => x.kind === 'resistor').map((x) => [x.r.name, x.r] as const));
  for (const [name, n] of Object.entries(design.networks ?? {})) {
    n.members.forEach((member, i) => {
      if (!placed.has(member)) {
        throw new InputError(`networks.${name}.members[${i}]`, `no single resistor ${member} in the resolved design (an "auto" leg may have become two resistors)`, `the resistors placed: ${[...placed.keys()].join(', ')}`);
      }
      memberOf[member] = name;
    });
    let tcr = n.tcr;
    if (tcr === undefined) {
      tcr = partGrade(design, n.members[0]!).tcrPerK;
      notes.push(`${name}: no TCR given, ±${Math.round(tcr * 1e6 * 100) / 100} ppm/K taken from the resistor grade (replace with the network's datasheet figure).`);
    }
    const tracking = n.tracking ?? 2 * tcr;
    if (tracking > 2 * tcr * (1 + 1e-12)) {
      throw new InputError(`networks.${name}.tracking`, `${Math.round(tracking * 1e6 * 100) / 100} ppm/K is more than twice the ${Math.round(tcr * 1e6 * 100) / 100} ppm/K TCR`, 'a tracking figure at most twice tcr');
    }
    if (n.tracking === undefined && tcr > 0) notes.push(`${name}: no TCR tracking given, so the members' TCRs are taken as independent within ±${Math.round(tcr * 1e6 * 100) / 100} ppm/K (tracking = 2 × tcr, the conservative choice).`);
    const network: NetworkSpec = { name, members: [...n.members], tolerance: n.tolerance, ratio: n.ratio, tcrPerK: tcr, trackingPerK: tracking };
    if (n.distribution) network.distribution = distributionSpec(n.distribution as Parameters<typeof distributionSpec>[0]);
    for (const member of n.members) {
      const r = placed.get(member)!;
      r.tolerance = n.tolerance;
      r.tcrPerK = tcr;
      if (network.distribution) r.distribution = network.distribution;
      else delete r.distribution;
    }
    notes.push(`${name} (${n.members.join(', ')}): bought as one network, ±${pct(n.tolerance)} absolute and ±${pct(n.ratio)} ratio between any two members; \`grades\` leaves its members at these figures.`);
    networks.push(network);
  }
  return { networks, memberOf, notes };
}
