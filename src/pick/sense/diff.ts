// Picker side of the `diff` topology: four-resistor difference amplifier, R1 = R3 and R2 = R4 from the series,
// gain R2/R1 = Vth/(Rs·I), each pair scored by the limit error it causes, |G/G' − 1|. The model keeps all four
// resistors as separate uncertain parts and uses the exact transfer (src/circuits/sense/diff.ts), so tolerance
// mismatch turns the common-mode voltage into limit error. With request.gainNetwork, R1–R4 are one network
// (gain-resistors.ts): the quick worst case takes the corners of its shared × own terms.
import { diffLimit, diffNominalGain, diffOutput, type DiffSense } from '../../circuits/sense/diff.js';
import { nearestRatioPairs } from './ratio-pairs.js';
import type { SenseDesign, SenseTopology } from './topology.js';
import type { UncertainVariable } from './types.js';
import { bandVariable, indexOfVariable, offsetVariable, toleranceVariable } from './variables.js';
import { gainResistors } from './gain-resistors.js';

export const diffTopology: SenseTopology = {
  name: 'diff',
  usesAmplifier: true,
  gainDesignators: ['R1', 'R2', 'R3', 'R4'],
  gainRange(values) {
    const ratio = values[values.length - 1]! / values[0]!;
    return { lo: 1 / ratio, hi: ratio };
  },
  designs(shunt, threshold, request) {
    const gain = threshold.volts / (shunt * request.limit);
    const { lo, hi } = this.gainRange(request.resistorValues);
    if (!(gain >= lo * (1 - 1e-3) && gain <= hi * (1 + 1e-3))) return [];
    const pairs = nearestRatioPairs(request.resistorValues, gain, (r2, r1) => Math.abs(gain / diffNominalGain(r1, r2) - 1));
    return pairs.map((pair): SenseDesign => {
      const r2 = pair.numerator;
      const r1 = pair.denominator;
      const gainSet = gainResistors(['R1', 'R2', 'R3', 'R4'], [r1, r2, r1, r2], request);
      const variables: UncertainVariable[] = [
        toleranceVariable('RS', shunt, request.shuntTolerance),
        ...gainSet.variables,
        ...threshold.variables,
        offsetVariable('Vos', request.amplifierOffset),
        bandVariable('Ib', request.biasCurrent),
        offsetVariable('Vos_cmp', request.compareOffset),
      ];
      const names = ['RS', 'Vos', 'Ib', 'Vos_cmp'] as const;
      const [iRs, iVos, iIb, iCmp] = names.map((n) => indexOfVariable(variables, n)) as [number, number, number, number];
      gainSet.bind(variables);
      const thresholdOf = threshold.bind(variables);
      const circuit = (x: Float64Array): DiffSense => ({
        shunt: x[iRs]!,
        r1: gainSet.value(x, 0),
        r2: gainSet.value(x, 1),
        r3: gainSet.value(x, 2),
        r4: gainSet.value(x, 3),
        commonMode: request.commonMode,
        threshold: thresholdOf(x),
        amplifierOffset: x[iVos]!,
        biasCurrent: x[iIb]!,
        compareOffset: x[iCmp]!,
      });
      return {
        parts: { RS: shunt, R1: r1, R2: r2, R3: r1, R4: r2, ...threshold.parts },
        gain: diffNominalGain(r1, r2),
        threshold: threshold.volts,
        model: {
          variables,
          limit: (x) => diffLimit(circuit(x)),
          output: (x, current) => diffOutput(circuit(x), current),
          // The non-inverting input sits at the shunt's supply-side node through R3/R4; the inverting one follows it.
          amplifierInput: (x, current) => ((request.commonMode + current * x[iRs]!) * gainSet.value(x, 3)) / (gainSet.value(x, 2) + gainSet.value(x, 3)),
        },
      };
    });
  },
};
