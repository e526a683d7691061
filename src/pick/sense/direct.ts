// Picker side of the `direct` topology: the shunt voltage goes straight to the comparing stage, no gain resistors.
// Each shunt gives one design; with a fixed threshold the shunt that is nearest Vth/I lands nearest the target,
// with a threshold divider the divider is picked per shunt (threshold.ts) to make Rs·I the threshold.
import { directLimit, directSignal } from '../../circuits/sense/direct.js';
import type { SenseTopology } from './topology.js';
import type { UncertainVariable } from './types.js';
import { indexOfVariable, offsetVariable, toleranceVariable } from './variables.js';

export const directTopology: SenseTopology = {
  name: 'direct',
  usesAmplifier: false,
  gainDesignators: [],
  gainRange: () => ({ lo: 1, hi: 1 }),
  designs(shunt, threshold, request) {
    const variables: UncertainVariable[] = [
      toleranceVariable('RS', shunt, request.shuntTolerance),
      ...threshold.variables,
      offsetVariable('Vos_cmp', request.compareOffset),
    ];
    const iRs = indexOfVariable(variables, 'RS');
    const iCmp = indexOfVariable(variables, 'Vos_cmp');
    const thresholdOf = threshold.bind(variables);
    return [
      {
        parts: { RS: shunt, ...threshold.parts },
        gain: 1,
        threshold: threshold.volts,
        model: {
          variables,
          limit: (x) => directLimit({ shunt: x[iRs]!, threshold: thresholdOf(x), compareOffset: x[iCmp]! }),
          output: (x, current) => directSignal({ shunt: x[iRs]!, threshold: thresholdOf(x), compareOffset: x[iCmp]! }, current),
        },
      },
    ];
  },
};
