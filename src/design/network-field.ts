// The design file's `networks` section: resistors bought as one network (one package, one substrate), keyed by the
// network's designator, e.g. { "RN1": { "members": ["R1", "R2", "R3", "R4"], "tolerance": "0.1%", "ratio": "0.05%",
// "tcr": "25ppm", "tracking": "5ppm" } }. What each figure means, and how the model draws the members so that every
// unit holds both the absolute and the ratio band, is in src/tolerance/network-bands.ts.
import { z } from 'zod';
import { percent, ppmPerK } from './fields.js';
import { printableText } from '../user-text.js';

/** Adds what a field means in front of what it accepts (the value field's own description). */
function describe<T extends z.ZodType>(schema: T, meaning: string): T {
  const accepted = z.globalRegistry.get(schema)?.description;
  return schema.meta({ description: accepted ? `${meaning}; ${accepted}` : meaning }) as T;
}

/** A fraction as a percentage for a message, without binary noise (0.1 %, not 0.30000000000000004 %). */
const pct = (x: number): string => `${Number((x * 100).toPrecision(6))} %`;

const DESIGNATOR = /^[A-Za-z][A-Za-z0-9_]{0,15}$/;

/** One network. `distribution` is the design file's distribution field (passed in: it lives in schema.ts). */
function networkObject(distribution: z.ZodType<string>) {
  return z
    .strictObject({
      members: z
        .array(z.string())
        .min(2)
        .meta({ description: 'designators of the resistors in the network, two or more (e.g. ["R1", "R2", "R3", "R4"] of the difference amplifier, or ["RTOP", "RBOT"]); each resistor in at most one network, the shunt and the pot in none' }),
      tolerance: describe(percent({ max: 0.5, text: '0 % to 50 %' }), 'absolute tolerance of every member, |R/Rnom − 1|'),
      ratio: describe(percent({ max: 0.5, text: '0 % to 50 %, at most the tolerance' }), 'ratio (matching) tolerance between any two members, |(Ri/Rj)/(Ri,nom/Rj,nom) − 1|, at most the tolerance'),
      tcr: describe(ppmPerK(), 'absolute TCR of every member (default: the resistor grade\'s)').optional(),
      tracking: describe(ppmPerK(), 'TCR tracking, the largest difference between two members\' TCRs, at most twice tcr (default twice tcr: the members\' TCRs as independent)').optional(),
      distribution: distribution.optional(),
      notes: z.union([z.string(), z.array(z.string())]).meta({ description: 'free text for people: the part number, where the figures came from' }).optional(),
    })
    .superRefine((n, ctx) => {
      if (n.ratio > n.tolerance) {
        ctx.issues.push({ code: 'custom', path: ['ratio'], input: undefined, message: `the ratio tolerance ${pct(n.ratio)} is wider than the absolute tolerance ${pct(n.tolerance)}`, params: { accepted: 'a ratio tolerance at most the absolute tolerance (networks are sold with ratio ≤ absolute)' } });
      }
      if (n.tracking !== undefined && n.tcr !== undefined && n.tracking > 2 * n.tcr * (1 + 1e-12)) {
        ctx.issues.push({ code: 'custom', path: ['tracking'], input: undefined, message: `tracking ${Math.round(n.tracking * 1e6 * 100) / 100} ppm/K is more than twice the ${Math.round(n.tcr * 1e6 * 100) / 100} ppm/K TCR`, params: { accepted: 'a tracking figure at most twice tcr (two members inside ±tcr differ by at most 2·tcr)' } });
      }
      const seen = new Set<string>();
      n.members.forEach((m, i) => {
        if (seen.has(m)) ctx.issues.push({ code: 'custom', path: ['members', i], input: m, message: `'${printableText(m)}' is listed twice`, params: { accepted: 'each member once' } });
        seen.add(m);
      });
    })
    .meta({ description: 'one resistor network: members, absolute tolerance, ratio tolerance, TCR, TCR tracking' });
}

export function networksField(distribution: z.ZodType<string>) {
  return z
    .record(z.string(), networkObject(distribution))
    .superRefine((record, ctx) => {
      for (const name of Object.keys(record)) {
        if (!DESIGNATOR.test(name)) {
          ctx.issues.push({ code: 'custom', path: [name], input: name, message: `'${printableText(name)}' is not a designator`, params: { accepted: 'a designator such as RN1: a letter, then up to 15 letters, digits or _' } });
        }
      }
    })
    .meta({ description: 'resistors bought as one network, by the network\'s designator: { "RN1": { "members": ["R1", "R2", "R3", "R4"], "tolerance": "0.1%", "ratio": "0.05%", "tcr": "25ppm", "tracking": "5ppm" } }; the members share one draw and each has its own, so both bands hold on every unit' });
}

export interface NetworkIssue {
  path: (string | number)[];
  message: string;
  accepted: string;
  unknownKey?: string;
  validKeys?: string[];
}

/**
 * Checks the networks against the parts the design places: members exist (not the shunt, not a two-resistor leg's
 * own name), no resistor in two networks, no network named like a part, no override of a member's grade (the
 * network's figures are the member's).
 */
export function networkIssues(
  networks: Record<string, { members: string[] }>,
  placed: string[],
  twoPartLegs: string[],
  overrides: string[],
  shunt: string,
): NetworkIssue[] {
  const issues: NetworkIssue[] = [];
  const usable = placed.filter((p) => p !== shunt && !twoPartLegs.includes(p));
  const owner = new Map<string, string>();
  for (const [name, network] of Object.entries(networks)) {
    if (placed.includes(name)) {
      issues.push({ path: ['networks', name], message: `the network '${printableText(name)}' has the name of a part of this design`, accepted: 'a designator of its own, such as RN1' });
    }
    network.members.forEach((member, i) => {
      const path = ['networks', name, 'members', i];
      if (member === shunt) {
        issues.push({ path, message: `the shunt ${shunt} cannot be a network member`, accepted: 'fixed resistors of the divider, the gain stage or the threshold divider' });
      } else if (twoPartLegs.includes(member)) {
        issues.push({ path, message: `${member} is a two-resistor leg here`, accepted: `its parts ${member}_A and ${member}_B` });
      } else if (!placed.includes(member)) {
        issues.push({ path, message: `no part '${printableText(member)}' in this design`, accepted: `a resistor of this design: ${usable.join(', ')}`, unknownKey: member, validKeys: usable });
      } else if (owner.has(member) && owner.get(member) !== name) {
        issues.push({ path, message: `${member} is already a member of ${owner.get(member)}`, accepted: 'each resistor in at most one network' });
      }
      if (!owner.has(member)) owner.set(member, name);
    });
  }
  for (const designator of overrides) {
    const network = owner.get(designator);
    if (network) {
      issues.push({ path: ['resistors', 'overrides', designator], message: `${designator} is a member of the network ${network}, whose tolerance and TCR it takes`, accepted: `no override for a network member; set networks.${network}.tolerance, ratio, tcr, tracking` });
    }
  }
  return issues;
}
