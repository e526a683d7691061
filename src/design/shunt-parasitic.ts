// The shunt's parasitic series resistance (pads, traces) as the engine sees it, and the note that says what it does.
// Common practice concern: beside a 10 mΩ shunt a few milliohms of copper shift the current limit by tens of
// percent, and copper's TCR is some forty times a shunt's. Kelvin (four-terminal) sensing removes most of it.
import type { ResistorSpec } from '../analysis/models/supply.js';
import { formatEngineering, formatPercent } from '../units/index.js';

/** Annealed copper's temperature coefficient at 20 °C, 1/K (IEC 60028, from memory): the default for pads and traces. */
export const COPPER_TCR_PER_K = 3.93e-3;

/** The parasitic as an engine resistor, named 'RS pads' in worst case, RSS and the contributions. */
export function shuntParasiticSpec(p: { value: number; tolerance: number; tcr?: number | undefined }): ResistorSpec {
  return { name: 'RS pads', nominal: p.value, tolerance: p.tolerance, tcrPerK: p.tcr ?? COPPER_TCR_PER_K, distribution: { kind: 'uniform' } };
}

/** The note for the design: how far the parasitic moves the nominal limit, and that Kelvin sensing removes it. */
export function shuntParasiticNote(shuntOhms: number, parasitic: ResistorSpec): string {
  const shift = -parasitic.nominal / (shuntOhms + parasitic.nominal);
  return `Shunt parasitic series resistance ${formatEngineering(parasitic.nominal, 'Ω')} ±${formatPercent(parasitic.tolerance, 1)}, ${Math.round((parasitic.tcrPerK ?? 0) * 1e6)} ppm/K (current.shunt.parasitic): it adds to the ${formatEngineering(shuntOhms, 'Ω')} the amplifier senses, moving the limit by ${formatPercent(shift, 1)} nominal (common practice concern). Kelvin (four-terminal) sensing of the shunt removes most of it.`;
}
