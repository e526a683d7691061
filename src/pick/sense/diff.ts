// Picker side of the `diff` topology: four-resistor difference amplifier, R1 = R3 and R2 = R4 from the series,
// gain R2/R1 = Vth/(Rs·I), each pair scored by the limit error it causes, |G/G' − 1|. The model keeps all four
// resistors as separate uncertain parts and uses the exact transfer (src/circuits/sense/diff.ts), so tolerance
// mismatch turns the common-mode voltage into limit error.
import { diffLimit, diffNominalGain, diffOutput, type DiffSense } from '../../circuits/sense/diff.js';
import { nearestRatioPairs } from './ratio-pairs.js';
import type { SenseDesign, SenseTopology } from './topology.js';
import type { UncertainVariable } from './types.js';
import { bandVariable, indexOfVariable, offsetVariable, toleranceVariable } from './variables.js';

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
      const variables: UncertainVariable[] = [
        toleranceVariable('RS', shunt, request.shuntTolerance),
        toleranceVariable('R1', r1, request.resistorTolerance),
        toleranceVariable('R2', r2, request.resistorTolerance),
        toleranceVariable('R3', r1, request.resistorTolerance),
        toleranceVariable('R4', r2, request.resistorTolerance),
        ...threshold.variables,
        offsetVariable('Vos', request.amplifierOffset),
        bandVariable('Ib', request.biasCurrent),
        offsetVariable('Vos_cmp', request.compareOffset),
      ];
      const names = ['RS', 'R1', 'R2', 'R3', 'R4', 'Vos', 'Ib', 'Vos_cmp'] as const;
      const [iRs, i1, i2, i3, i4, iVos, iIb, iCmp] = names.map((n) => indexOfVariable(variables, n)) as [number, number, number, number, number, number, number, number];
      const thresholdOf = threshold.bind(variables);
      const circuit = (x: Float64Array): DiffSense => ({
        shunt: x[iRs]!,
        r1: x[i1]!,
        r2: x[i2]!,
        r3: x[i3]!,
        r4: x[i4]!,
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
          amplifierInput: (x, current) => ((request.commonMode + current * x[iRs]!) * x[i4]!) / (x[i3]! + x[i4]!),
        },
      };
    });
  },
};
