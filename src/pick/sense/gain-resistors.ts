// The gain resistors of a sense candidate as uncertain variables for the quick worst case: each loose at
// ±resistorTolerance, or, when the request says they are one network, the network's shared term and each member's own
// term (src/tolerance/network-bands.ts), so the corners are those of shared × own rather than every member at
// either end of its full band.
import { networkBands } from '../../tolerance/network-bands.js';
import type { SenseRequest, UncertainVariable } from './types.js';
import { indexOfVariable, toleranceVariable } from './variables.js';

export interface GainResistors {
  variables: UncertainVariable[];
  /** Member k's value at the point x (x indexed like the candidate's full variable list). */
  value(x: Float64Array, k: number): number;
  /** Call once the candidate's full variable list is known: finds this set's variables in it. */
  bind(all: readonly UncertainVariable[]): void;
}

export function gainResistors(names: readonly string[], nominals: readonly number[], request: SenseRequest): GainResistors {
  const network = request.gainNetwork;
  if (!network) {
    const variables = names.map((name, k) => toleranceVariable(name, nominals[k]!, request.resistorTolerance));
    let at: number[] = [];
    return {
      variables,
      value: (x, k) => x[at[k]!]!,
      bind(all) {
        at = names.map((name) => indexOfVariable(all, name));
      },
    };
  }
  const bands = networkBands({ tolerance: network.tolerance, ratio: network.ratio, tcrPerK: 0, trackingPerK: 0 });
  const sharedName = `${network.name} absolute`;
  const ownNames = names.map((name) => `${network.name} ratio ${name}`);
  const variables: UncertainVariable[] = [
    { name: sharedName, nominal: 0, lo: -bands.shared, hi: bands.shared, offset: false },
    ...ownNames.map((name) => ({ name, nominal: 0, lo: -bands.mismatch, hi: bands.mismatch, offset: false })),
  ];
  let shared = -1;
  let own: number[] = [];
  return {
    variables,
    value: (x, k) => nominals[k]! * (1 + x[shared]!) * (1 + x[own[k]!]!),
    bind(all) {
      shared = indexOfVariable(all, sharedName);
      own = ownNames.map((name) => indexOfVariable(all, name));
    },
  };
}
