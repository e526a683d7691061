// The JSON Schema of the design file, for editors (completion and checking as one types). Generated from the zod
// schema on its INPUT side (what a person writes: notation strings or numbers), so it never drifts from the loader.
// Cross-field rules (a window containing its target, fields that depend on the topology) are checked by the loader
// only; the JSON Schema covers fields, types and choices.
import { z } from 'zod';
import { DesignSchema } from './schema.js';

export const DESIGN_SCHEMA_ID = 'https://trimfree.invalid/design.schema.json';

/** JSON Schema (draft 2020-12) of the design file as written. */
export function designJsonSchema(): Record<string, unknown> {
  const schema = z.toJSONSchema(DesignSchema, { io: 'input', target: 'draft-2020-12', unrepresentable: 'any' }) as Record<string, unknown>;
  // The loader's one cross-section rule editors can check too: a voltage loop (with its reference), a current loop, or both.
  return { ...schema, $id: DESIGN_SCHEMA_ID, anyOf: [{ required: ['reference', 'voltage'] }, { required: ['current'] }] };
}
