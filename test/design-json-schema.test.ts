// The JSON Schema `trimfree schema` prints: a tiny checker of our own (type, properties, required,
// additionalProperties, anyOf, enum, const, items/prefixItems, minimum) validates every example and every init
// starter against it, and rejects what the loader rejects for the same structural reason.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { designJsonSchema } from '../src/design/json-schema.js';
import { starterText, STARTER_KINDS } from '../src/design/templates.js';
import { PROJECT_ROOT } from '../src/project-root.js';

type Schema = Record<string, any>;

function typeOf(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'array';
  if (typeof value === 'number') return Number.isInteger(value) ? 'integer' : 'number';
  return typeof value;
}

/** Problems found, as "path: what" lines (empty when valid). */
function check(schema: Schema, value: unknown, path = '$'): string[] {
  const problems: string[] = [];
  if (schema.anyOf) {
    const ok = (schema.anyOf as Schema[]).some((s) => check(s, value, path).length === 0);
    if (!ok) problems.push(`${path}: matches no anyOf branch`);
  }
  if (schema.type !== undefined) {
    const types: string[] = Array.isArray(schema.type) ? schema.type : [schema.type];
    const actual = typeOf(value);
    if (!types.includes(actual) && !(actual === 'integer' && types.includes('number'))) problems.push(`${path}: type ${actual}, expected ${types.join('|')}`);
  }
  if (schema.enum && !(schema.enum as unknown[]).includes(value)) problems.push(`${path}: not in enum`);
  if (schema.const !== undefined && schema.const !== value) problems.push(`${path}: not the constant`);
  if (typeof value === 'number' && schema.minimum !== undefined && value < schema.minimum) problems.push(`${path}: below minimum`);
  if (typeOf(value) === 'object') {
    const object = value as Record<string, unknown>;
    for (const key of schema.required ?? []) if (!(key in object)) problems.push(`${path}.${key}: required`);
    for (const [key, v] of Object.entries(object)) {
      const sub = schema.properties?.[key];
      if (sub) problems.push(...check(sub, v, `${path}.${key}`));
      else if (schema.additionalProperties === false) problems.push(`${path}.${key}: not allowed`);
      else if (typeof schema.additionalProperties === 'object') problems.push(...check(schema.additionalProperties, v, `${path}.${key}`));
    }
  }
  if (Array.isArray(value)) {
    value.forEach((item, i) => {
      const sub = schema.prefixItems?.[i] ?? (schema.items === false ? undefined : schema.items);
      if (schema.prefixItems && i >= schema.prefixItems.length && schema.items === false) problems.push(`${path}[${i}]: extra item`);
      else if (sub) problems.push(...check(sub, item, `${path}[${i}]`));
    });
  }
  return problems;
}

const schema = designJsonSchema();
const examplesDir = join(PROJECT_ROOT, 'examples');
const examples = readdirSync(examplesDir).filter((f) => f.endsWith('.json'));

describe('the design JSON Schema', () => {
  it('is draft 2020-12, strict at the top level, requiring resistors and a voltage loop (with reference), a current loop or both', () => {
    expect(schema['$schema']).toBe('https://json-schema.org/draft/2020-12/schema');
    expect(schema['additionalProperties']).toBe(false);
    expect(schema['required']).toEqual(['resistors']);
    expect(schema['anyOf']).toEqual([{ required: ['reference', 'voltage'] }, { required: ['current'] }]);
  });

  it('describes the input side: value fields take text or numbers', () => {
    const voltage = (schema['properties'] as Schema)['reference'].properties.voltage;
    expect(voltage.type).toEqual(['string', 'number']);
    expect(voltage.description).toMatch(/a voltage/);
  });

  it.each(examples)('accepts examples/%s', (file) => {
    const data = JSON.parse(readFileSync(join(examplesDir, file), 'utf8'));
    expect(check(schema, data)).toEqual([]);
  });

  it.each([...STARTER_KINDS])('accepts the init starter for %s', (kind) => {
    expect(check(schema, JSON.parse(starterText(kind)))).toEqual([]);
  });

  it('rejects an unknown field, a missing section and a wrong type', () => {
    const data = JSON.parse(starterText('charger'));
    expect(check(schema, { ...data, refrence: {} })).toContain('$.refrence: not allowed');
    const { current: _dropped, ...noCurrent } = data;
    expect(check(schema, noCurrent)).toEqual([]); // a voltage-only design
    const { voltage: _v, ...neither } = noCurrent;
    expect(check(schema, neither)).toContain('$: matches no anyOf branch');
    const { reference: _r, ...voltageNoReference } = noCurrent;
    expect(check(schema, voltageNoReference)).toContain('$: matches no anyOf branch');
    expect(check(schema, { ...data, reference: { ...data.reference, voltage: true } }).join()).toMatch(/reference\.voltage: type boolean/);
    expect(check(schema, { ...data, current: { ...data.current, topology: 'bridge' } }).join()).toMatch(/topology: not in enum/);
  });
});
