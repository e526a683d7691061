// The gain resistors of a sense candidate as uncertain variables for the quick worst case: each loose at
// ±resistorTolerance, or, when the request says they are one network, the network's shared term and each member's own
// term (src/tolerance/network-bands.ts), so the corners are those of shared × own rather than every member at
// either end of its full band. With request.gainTcr their TCRs count too, R·(1 + α·ΔT) with ΔT at ±deltaT: each
// loose resistor's α within ±TCR, a network's as its shared TCR plus each member's own (tracking/2).
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

const bound = (name: string, half: number): UncertainVariable => ({ name, nominal: 0, lo: -half, hi: half, offset: false });

export function gainResistors(names: readonly string[], nominals: readonly number[], request: SenseRequest): GainResistors {
  const network = request.gainNetwork;
  const temperature = request.gainTcr && request.gainTcr.deltaT > 0 ? request.gainTcr : undefined;
  // ΔT = T − 25 °C at the ambient's ends: the resistor at temperature is R·(1 + α·ΔT).
  const dTName = 'ΔT gain resistors';
  const dTVariables = temperature ? [bound(dTName, temperature.deltaT)] : [];
  let dT = -1;
  const at = (x: Float64Array, alpha: number): number => (dT < 0 ? 1 : 1 + alpha * x[dT]!);
  if (!network) {
    const tcrNames = temperature ? names.map((name) => `${name} TCR`) : [];
    const variables = [
      ...names.map((name, k) => toleranceVariable(name, nominals[k]!, request.resistorTolerance)),
      ...tcrNames.map((name) => bound(name, temperature!.tcrPerK)),
      ...dTVariables,
    ];
    let value: number[] = [];
    let tcr: number[] = [];
    return {
      variables,
      value: (x, k) => x[value[k]!]! * at(x, tcr.length === 0 ? 0 : x[tcr[k]!]!),
      bind(all) {
        value = names.map((name) => indexOfVariable(all, name));
        tcr = tcrNames.map((name) => indexOfVariable(all, name));
        dT = temperature ? indexOfVariable(all, dTName) : -1;
      },
    };
  }
  const tcrPerK = temperature?.tcrPerK ?? 0;
  const bands = networkBands({ tolerance: network.tolerance, ratio: network.ratio, tcrPerK, trackingPerK: network.trackingPerK ?? 2 * tcrPerK });
  const sharedName = `${network.name} absolute`;
  const ownNames = names.map((name) => `${network.name} ratio ${name}`);
  const sharedTcrName = `${network.name} TCR`;
  const trackNames = temperature ? names.map((name) => `${network.name} tracking ${name}`) : [];
  const variables: UncertainVariable[] = [
    bound(sharedName, bands.shared),
    ...ownNames.map((name) => bound(name, bands.mismatch)),
    ...(temperature ? [bound(sharedTcrName, bands.sharedTcrPerK), ...trackNames.map((name) => bound(name, bands.memberTcrPerK))] : []),
    ...dTVariables,
  ];
  let shared = -1;
  let own: number[] = [];
  let sharedTcr = -1;
  let track: number[] = [];
  return {
    variables,
    value: (x, k) => nominals[k]! * (1 + x[shared]!) * (1 + x[own[k]!]!) * at(x, sharedTcr < 0 ? 0 : x[sharedTcr]! + x[track[k]!]!),
    bind(all) {
      shared = indexOfVariable(all, sharedName);
      own = ownNames.map((name) => indexOfVariable(all, name));
      sharedTcr = temperature ? indexOfVariable(all, sharedTcrName) : -1;
      track = trackNames.map((name) => indexOfVariable(all, name));
      dT = temperature ? indexOfVariable(all, dTName) : -1;
    },
  };
}
