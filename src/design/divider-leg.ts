// One leg of the output divider as the design file writes it: a single resistance, or two resistors in series or in
// parallel. The text form is the notation `trimfree divider --parts 3` prints ("6R8 + 2K2", "10k ∥ 47k"; also
// "10k || 47k" and no spaces), the structured form { "series": [a, b] } or { "parallel": [a, b] }. Each resistor is its
// own part in the model and the BOM; the leg's resistance is a + b or a·b/(a + b) (src/circuits/combine.ts).
import { z } from 'zod';
import { InputError } from '../errors.js';
import { parallelResistance, seriesResistance } from '../circuits/combine.js';
import { parseResistance } from '../units/index.js';
import { fieldIssue } from './fields.js';

export type LegArrangement = 'series' | 'parallel';

export interface DividerLegValue {
  /** The physical resistors, ohms: one, or two combined by `arrangement`. */
  parts: [number] | [number, number];
  arrangement?: LegArrangement;
  /** The leg's resistance, ohms. */
  ohms: number;
}

export const DIVIDER_LEG_ACCEPTED =
  'a resistance (4K7, 4.7k, 4.7 kΩ, or a number of ohms); or two resistors as `trimfree divider --parts 3` prints them, "6R8 + 2K2" in series or "10k ∥ 47k" (or "10k || 47k") in parallel; or { "series": ["6R8", "2K2"] } / { "parallel": ["10k", "47k"] }';

const SMALLEST_OHMS = 1e-6;
const LARGEST_OHMS = 1e12;

/** " + " (series) or " ∥ " / " || " (parallel) between two values; a "+" after an exponent's e (1e+3) is a sign. */
const JOINT = /\s*(\+|∥|\|\|)\s*/;
const JOINTS = /\s*(?:(?<![eE])\+|∥|\|\|)\s*/g;

type Ctx = z.core.$RefinementCtx<unknown>;

function ohmsOf(input: string | number, ctx: Ctx, whole: unknown): number | undefined {
  let value: number;
  try {
    value = parseResistance(typeof input === 'number' ? String(input) : input, '');
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    fieldIssue(ctx, whole, error.message, DIVIDER_LEG_ACCEPTED);
    return undefined;
  }
  if (!(value >= SMALLEST_OHMS && value <= LARGEST_OHMS)) {
    fieldIssue(ctx, whole, `${JSON.stringify(input)} is out of range`, `${DIVIDER_LEG_ACCEPTED}, each 1 µΩ to 1 TΩ`);
    return undefined;
  }
  return value;
}

function combine(parts: number[], arrangement: LegArrangement | undefined): DividerLegValue {
  if (parts.length === 1 || arrangement === undefined) return { parts: [parts[0]!], ohms: parts[0]! };
  const [a, b] = parts as [number, number];
  return { parts: [a, b], arrangement, ohms: arrangement === 'series' ? seriesResistance(a, b) : parallelResistance(a, b) };
}

function fromText(text: string, ctx: Ctx): DividerLegValue | undefined {
  const pieces = text.trim().replace(/^\+/, '').split(JOINTS);
  if (pieces.length === 1) {
    const ohms = ohmsOf(text, ctx, text);
    return ohms === undefined ? undefined : { parts: [ohms], ohms };
  }
  if (pieces.length > 2) {
    fieldIssue(ctx, text, `'${text}' joins ${pieces.length} resistors: a leg takes one resistor or two`, DIVIDER_LEG_ACCEPTED);
    return undefined;
  }
  if (pieces.some((p) => p.trim() === '')) {
    fieldIssue(ctx, text, `'${text}' needs a resistance on each side of the joint`, DIVIDER_LEG_ACCEPTED);
    return undefined;
  }
  const joint = text.trim().replace(/^\+/, '').replace(/[eE]\+/g, 'e').match(JOINT)![1];
  const a = ohmsOf(pieces[0]!, ctx, text);
  const b = a === undefined ? undefined : ohmsOf(pieces[1]!, ctx, text);
  if (a === undefined || b === undefined) return undefined;
  return combine([a, b], joint === '+' ? 'series' : 'parallel');
}

function fromObject(input: { series?: Array<string | number> | undefined; parallel?: Array<string | number> | undefined }, ctx: Ctx): DividerLegValue | undefined {
  const keys = (['series', 'parallel'] as const).filter((k) => input[k] !== undefined);
  if (keys.length !== 1) {
    fieldIssue(ctx, input, keys.length === 0 ? 'an empty leg' : 'a leg is either series or parallel, not both', DIVIDER_LEG_ACCEPTED);
    return undefined;
  }
  const arrangement = keys[0]!;
  const values = input[arrangement]!;
  if (values.length !== 2) {
    fieldIssue(ctx, input, `"${arrangement}" lists ${values.length} value${values.length === 1 ? '' : 's'}: it takes exactly two resistors`, DIVIDER_LEG_ACCEPTED);
    return undefined;
  }
  const a = ohmsOf(values[0]!, ctx, input);
  const b = a === undefined ? undefined : ohmsOf(values[1]!, ctx, input);
  if (a === undefined || b === undefined) return undefined;
  return combine([a, b], arrangement);
}

const valueList = z.array(z.union([z.string(), z.number()]));
const structuredLeg = z.strictObject({
  series: valueList.optional().meta({ description: 'two resistors in series: ["6R8", "2K2"]' }),
  parallel: valueList.optional().meta({ description: 'two resistors in parallel: ["10k", "47k"]' }),
});

/** A divider leg field: notation, a number of ohms, or the structured form; out comes a DividerLegValue. */
export function dividerLeg(meaning: string) {
  return z
    .union([z.string(), z.number(), structuredLeg])
    .transform((input, ctx): DividerLegValue => {
      const leg = typeof input === 'string' ? fromText(input, ctx) : typeof input === 'number' ? fromNumber(input, ctx) : fromObject(input, ctx);
      return leg ?? z.NEVER;
    })
    .meta({ description: `${meaning}; ${DIVIDER_LEG_ACCEPTED}` });
}

function fromNumber(input: number, ctx: Ctx): DividerLegValue | undefined {
  const ohms = ohmsOf(input, ctx, input);
  return ohms === undefined ? undefined : { parts: [ohms], ohms };
}

/** The leg in the notation `trimfree divider` prints, e.g. "6R8 + 2K2"; `format` writes one value. */
export function legNotation(leg: DividerLegValue, format: (ohms: number) => string): string {
  if (leg.parts.length === 1) return format(leg.parts[0]);
  return leg.parts.map(format).join(leg.arrangement === 'series' ? ' + ' : ' ∥ ');
}
