// Every resistor of an engine SupplySpec with its kind and field path, potentiometers included: the walk the passes
// over a resolved spec share (drift allowances, production distributions in src/design/, the lot study).
import type { LegSpec, ResistorSpec, SupplySpec } from './models/supply.js';

export interface SpecResistor {
  r: ResistorSpec;
  kind: 'resistor' | 'shunt' | 'potentiometer';
  /** Field path in the SupplySpec, for messages. */
  path: string;
}

/** Divider legs (with their pots), shunt, gain resistors, threshold divider, in that order. */
export function specResistors(spec: SupplySpec): SpecResistor[] {
  const out: SpecResistor[] = [];
  const leg = (l: LegSpec, path: string): void => {
    l.resistors.forEach((r, i) => out.push({ r, kind: 'resistor', path: `${path}.resistors[${i}]` }));
    if (l.potentiometer) out.push({ r: l.potentiometer, kind: 'potentiometer', path: `${path}.potentiometer` });
  };
  if (spec.divider) {
    leg(spec.divider.top, 'supply.divider.top');
    leg(spec.divider.bottom, 'supply.divider.bottom');
  }
  const sense = spec.sense;
  if (sense) {
    out.push({ r: sense.shunt, kind: 'shunt', path: 'supply.sense.shunt' });
    if (sense.topology === 'noninv') out.push({ r: sense.rf, kind: 'resistor', path: 'supply.sense.rf' }, { r: sense.rg, kind: 'resistor', path: 'supply.sense.rg' });
    else if (sense.topology === 'diff') for (const key of ['r1', 'r2', 'r3', 'r4'] as const) out.push({ r: sense[key], kind: 'resistor', path: `supply.sense.${key}` });
    if (sense.threshold.kind === 'divided') {
      out.push({ r: sense.threshold.top, kind: 'resistor', path: 'supply.sense.threshold.top' }, { r: sense.threshold.bottom, kind: 'resistor', path: 'supply.sense.threshold.bottom' });
    }
  }
  return out;
}

/** The divider leg a two-part leg's resistor belongs to (RTOP for RTOP_A), whose override applies to it too. */
export function legOf(designator: string): string | undefined {
  const m = /^(.+)_[AB]$/.exec(designator);
  return m ? m[1] : undefined;
}
