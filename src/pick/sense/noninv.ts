// Picker side of the `noninv` topology: low-side shunt into a non-inverting amplifier, G = 1 + RF/RG.
// Needed gain G = Vth/(Rs·I) (offsets nominally zero), so RF/RG = G − 1 from the series (ratio-pairs.ts). The limit
// goes as 1/G, so a pair is scored by the limit error it causes, |G/G' − 1|.
import { noninvGain, noninvLimit, noninvOutput, type NoninvSense } from '../../circuits/sense/noninv.js';
import { nearestRatioPairs } from './ratio-pairs.js';
import type { SenseDesign, SenseTopology } from './topology.js';
import type { UncertainVariable } from './types.js';
import { bandVariable, indexOfVariable, offsetVariable, toleranceVariable } from './variables.js';

export const noninvTopology: SenseTopology = {
  name: 'noninv',
  usesAmplifier: true,
  gainDesignators: ['RF', 'RG'],
  gainRange(values) {
    const ratio = values[values.length - 1]! / values[0]!;
    return { lo: 1 + 1 / ratio, hi: 1 + ratio };
  },
  designs(shunt, threshold, request) {
    const gain = threshold.volts / (shunt * request.limit);
    const { lo, hi } = this.gainRange(request.resistorValues);
    if (!(gain >= lo * (1 - 1e-3) && gain <= hi * (1 + 1e-3))) return [];
    const pairs = nearestRatioPairs(request.resistorValues, gain - 1, (rf, rg) => Math.abs(gain / noninvGain(rf, rg) - 1));
    return pairs.map((pair): SenseDesign => {
      const variables: UncertainVariable[] = [
        toleranceVariable('RS', shunt, request.shuntTolerance),
        toleranceVariable('RF', pair.numerator, request.resistorTolerance),
        toleranceVariable('RG', pair.denominator, request.resistorTolerance),
        ...threshold.variables,
        offsetVariable('Vos', request.amplifierOffset),
        bandVariable('Ib', request.biasCurrent),
        offsetVariable('Vos_cmp', request.compareOffset),
      ];
      const at = (name: string): number => indexOfVariable(variables, name);
      const [iRs, iRf, iRg, iVos, iIb, iCmp] = ['RS', 'RF', 'RG', 'Vos', 'Ib', 'Vos_cmp'].map(at) as [number, number, number, number, number, number];
      const thresholdOf = threshold.bind(variables);
      const circuit = (x: Float64Array): NoninvSense => ({
        shunt: x[iRs]!,
        feedback: x[iRf]!,
        ground: x[iRg]!,
        threshold: thresholdOf(x),
        amplifierOffset: x[iVos]!,
        biasCurrent: x[iIb]!,
        compareOffset: x[iCmp]!,
      });
      return {
        parts: { RS: shunt, RF: pair.numerator, RG: pair.denominator, ...threshold.parts },
        gain: noninvGain(pair.numerator, pair.denominator),
        threshold: threshold.volts,
        model: {
          variables,
          limit: (x) => noninvLimit(circuit(x)),
          output: (x, current) => noninvOutput(circuit(x), current),
        },
      };
    });
  },
};
