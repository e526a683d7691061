// Reads a design file: the file, the JSON, then the schema. Every failure is one InputError naming the field path
// (e.g. current.amplifier.vos), what was given and what is accepted; an unknown field gets the closest valid name.
import { z } from 'zod';
import { InputError } from '../errors.js';
import { readInputText } from '../input-file.js';
import { printableText } from '../user-text.js';
import { DesignSchema, type Design } from './schema.js';
import { suggestField } from './suggest-field.js';

type Issue = z.core.$ZodIssue;
type Path = readonly PropertyKey[];

/** Largest design file read: a design is a few kilobytes (the examples 2–4 kB), so 1 MB leaves room for any notes,
 * while a device or an endless file (/dev/zero) is refused instead of filling memory. Reading, checking and reporting
 * happen on the calling thread: a 16 MB file of notes took 2–4 s (Ctrl-C waits for it); 1 MB takes a small part. */
export const MAX_DESIGN_FILE_BYTES = 2 ** 20;

/** Reads, parses and validates a design file. */
export function loadDesignFile(path: string): Design {
  if (path.trim() === '') throw new InputError('file', 'empty file name', 'the path of a design file (JSON); `trimfree init` writes a starter');
  const text = readInputText(path, { maxBytes: MAX_DESIGN_FILE_BYTES, accepted: `the path of a design file (JSON, a regular file of at most ${MAX_DESIGN_FILE_BYTES / 2 ** 20} MB); \`trimfree init\` writes a starter` });
  return parseDesignText(text, printableText(path));
}

/** Parses design-file text; `source` names it in messages. */
export function parseDesignText(text: string, source: string): Design {
  let data: unknown;
  try {
    data = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    throw new InputError(`${source}${jsonErrorPlace(text, message)}`, `not valid JSON (${jsonProblem(message)})`, 'a JSON object: { "reference": …, "voltage": …, "current": …, "resistors": … }');
  }
  return validateDesign(data, source);
}

/** Validates parsed JSON against the design schema. */
export function validateDesign(data: unknown, source = 'design'): Design {
  refuseProtoKeys(data, []);
  const result = DesignSchema.safeParse(data, { reportInput: true });
  if (result.success) return result.data;
  throw issueToError(pickIssue(result.error.issues), data, source);
}

/** Deepest nesting looked at: a design file is a few levels deep; a hostile one nested thousands deep would
 * otherwise exhaust the stack of any recursive check. */
const MAX_NESTING = 64;

/** JSON.parse keeps a "__proto__" key as an own property, but copying it into a plain object (as the schema does
 * for a record such as resistors.overrides) sets the prototype instead: the entry would vanish unchecked. Refused
 * wherever it appears, with its path. */
function refuseProtoKeys(data: unknown, path: PropertyKey[]): void {
  if (data === null || typeof data !== 'object') return;
  if (path.length > MAX_NESTING) {
    throw new InputError(joinPath(path.slice(0, 4)), `nested more than ${MAX_NESTING} levels deep`, 'a design file as `trimfree schema` describes it (a few levels deep)');
  }
  if (Array.isArray(data)) {
    data.forEach((item, i) => refuseProtoKeys(item, [...path, i]));
    return;
  }
  for (const key of Object.keys(data)) {
    if (key === '__proto__') {
      throw new InputError(joinPath([...path, key]), "'__proto__' is not accepted as a field name or designator", 'the fields listed by `trimfree schema` and the designators of this design');
    }
    refuseProtoKeys((data as Record<string, unknown>)[key], [...path, key]);
  }
}

// ---- JSON syntax errors ---------------------------------------------------------------------------------------

/** ":LINE:COLUMN" (1-based) from V8's "at position N" or "(line L column C)", or "" when neither is given. */
export function jsonErrorPlace(text: string, message: string): string {
  const lineColumn = /line (\d+) column (\d+)/.exec(message);
  if (lineColumn) return `:${lineColumn[1]}:${lineColumn[2]}`;
  const position = /position (\d+)/.exec(message);
  if (position) {
    const offset = Number(position[1]);
    const before = text.slice(0, offset).replace(/^\uFEFF/, '');
    const line = before.split('\n').length;
    const column = offset - before.lastIndexOf('\n');
    return `:${line}:${column}`;
  }
  if (/end of (JSON )?input/i.test(message)) {
    const lines = text.split('\n');
    return `:${lines.length}:${(lines[lines.length - 1]?.length ?? 0) + 1}`;
  }
  return '';
}

function jsonProblem(message: string): string {
  return message
    .replace(/, "[\s\S]*" is not valid JSON$/, '')
    .replace(/ in JSON at position \d+( \(line \d+ column \d+\))?/, '')
    .replace(/^Unexpected end of JSON input$/, 'the file ends too early');
}

// ---- schema errors ----------------------------------------------------------------------------------------------

/** Most useful issue first: an unknown field explains a "missing" one beside it, so it wins; then the first. */
function pickIssue(issues: readonly Issue[]): Issue {
  const unknown = issues.find((i) => i.code === 'unrecognized_keys');
  return unknown ?? issues[0]!;
}

function joinPath(path: Path): string {
  let out = '';
  for (const key of path) {
    if (typeof key === 'number') out += `[${key}]`;
    else out += out === '' ? printableText(String(key)) : `.${printableText(String(key))}`;
  }
  return out;
}

function valueAt(data: unknown, path: Path): { found: boolean; value: unknown } {
  let here: unknown = data;
  for (const key of path) {
    if (here === null || typeof here !== 'object' || !Object.prototype.hasOwnProperty.call(here, key)) return { found: false, value: undefined };
    here = (here as Record<PropertyKey, unknown>)[key];
  }
  return { found: true, value: here };
}

/** Short rendering of a given value for the message. */
function shown(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (value === null) return 'null';
  if (Array.isArray(value)) return `a list of ${value.length}`;
  if (typeof value === 'object') return 'an object';
  const text = JSON.stringify(value);
  return text.length > 40 ? `${text.slice(0, 37)}…` : text;
}

function typeName(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'an object';
  if (typeof value === 'string') return `text ${shown(value)}`;
  if (typeof value === 'number') return `the number ${shown(value)}`;
  return `${typeof value} ${shown(value)}`;
}

/** The schema at a path, unwrapping optional / pipe / union so its description (from .meta) can be read. */
function schemaAt(schema: z.core.$ZodType, path: Path): z.core.$ZodType | undefined {
  let here: z.core.$ZodType | undefined = schema;
  for (const key of path) {
    here = here && unwrapToContainer(here);
    if (!here) return undefined;
    const def = here._zod.def as unknown as Record<string, unknown>;
    if (def.type === 'object') here = (def.shape as Record<string, z.core.$ZodType>)[String(key)];
    else if (def.type === 'record') here = def.valueType as z.core.$ZodType;
    else if (def.type === 'array') here = def.element as z.core.$ZodType;
    else if (def.type === 'tuple') here = (def.items as z.core.$ZodType[])[Number(key)];
    else return undefined;
  }
  return here;
}

/** Unwraps optional/default/pipe and picks a union's container option, down to an object/record/array/tuple. */
function unwrapToContainer(schema: z.core.$ZodType): z.core.$ZodType | undefined {
  let here = schema;
  for (let depth = 0; depth < 10; depth++) {
    const def = here._zod.def as unknown as Record<string, unknown>;
    if (def.type === 'optional' || def.type === 'default' || def.type === 'nullable') here = def.innerType as z.core.$ZodType;
    else if (def.type === 'pipe') here = def.in as z.core.$ZodType;
    else if (def.type === 'union') {
      const options = def.options as z.core.$ZodType[];
      const container = options.find((o) => ['object', 'record', 'array', 'tuple'].includes(String((o._zod.def as unknown as Record<string, unknown>).type)));
      if (!container) return undefined;
      here = container;
    } else return here;
  }
  return undefined;
}

function descriptionAt(path: Path): string | undefined {
  let schema = schemaAt(DesignSchema, path);
  for (let depth = 0; schema && depth < 10; depth++) {
    const meta = z.globalRegistry.get(schema);
    if (meta?.description) return meta.description;
    const def = schema._zod.def as unknown as Record<string, unknown>;
    schema = (def.innerType ?? def.in) as z.core.$ZodType | undefined;
  }
  return undefined;
}

function fieldsAt(path: Path): string[] {
  const schema = schemaAt(DesignSchema, path);
  const container = schema && unwrapToContainer(schema);
  const def = container?._zod.def as unknown as Record<string, unknown> | undefined;
  return def?.type === 'object' ? Object.keys(def.shape as object) : [];
}

/** Within a union's failed options, the one that got furthest: its issues are not all about the value's type. */
function bestUnionBranch(errors: readonly (readonly Issue[])[]): readonly Issue[] | undefined {
  const deep = errors.filter((branch) => branch.some((i) => i.path.length > 0 || (i.code !== 'invalid_type' && i.code !== 'invalid_value' && i.code !== 'invalid_union')));
  return deep.length === 1 ? deep[0] : undefined;
}

function issueToError(issue: Issue, data: unknown, source: string): InputError {
  const path = issue.path;
  const where = joinPath(path) || source;
  const given = valueAt(data, path);
  const accepted = descriptionAt(path) ?? 'see `trimfree schema`';

  if (issue.code === 'invalid_union') {
    const branch = bestUnionBranch(issue.errors);
    if (branch) {
      const inner = pickIssue(branch);
      return issueToError({ ...inner, path: [...path, ...inner.path] } as Issue, data, source);
    }
  }
  if (!given.found && path.length > 0 && issue.code !== 'custom' && issue.code !== 'unrecognized_keys') {
    return new InputError(where, 'missing required field', accepted);
  }
  switch (issue.code) {
    case 'unrecognized_keys': {
      const valid = fieldsAt(path);
      const key = issue.keys[0]!;
      const suggestion = suggestField(key, valid);
      const hint = suggestion ? ` (did you mean '${suggestion}'?)` : '';
      return new InputError(joinPath([...path, key]), `unknown field '${printableText(key)}'${hint}`, valid.length ? `the fields of ${joinPath(path) || 'the file'}: ${valid.join(', ')}` : 'no other fields');
    }
    case 'custom': {
      const params = (issue.params ?? {}) as { accepted?: string; unknownKey?: string; validKeys?: string[] };
      let message = issue.message;
      if (params.unknownKey && params.validKeys) {
        const suggestion = suggestField(params.unknownKey, params.validKeys);
        if (suggestion) message += ` (did you mean '${suggestion}'?)`;
      }
      const givenText = given.found && !message.includes('got') && !/'.*'/.test(message) && (typeof given.value === 'string' || typeof given.value === 'number') ? `; got ${shown(given.value)}` : '';
      return new InputError(where, `${message}${givenText}`, params.accepted ?? accepted);
    }
    case 'invalid_value': {
      const values = issue.values.map((v) => JSON.stringify(v));
      const suggestion = typeof given.value === 'string' && !/\d/.test(given.value) ? suggestField(given.value, issue.values.map(String)) : undefined;
      const hint = suggestion ? ` (did you mean '${suggestion}'?)` : '';
      return new InputError(where, `${shown(given.value)} is not one of the choices${hint}`, values.join(', '));
    }
    case 'invalid_union':
    case 'invalid_type': {
      if (typeof given.value === 'string' && /^\s*auto\s*$/i.test(given.value) === false && /\bauto\b/i.test(accepted)) {
        const suggestion = suggestField(given.value, ['auto']);
        if (suggestion) return new InputError(where, `got ${shown(given.value)} (did you mean "auto"?)`, accepted);
      }
      const fields = fieldsAt(path);
      const shape = fields.length ? `an object with fields ${fields.join(', ')} (${accepted})` : accepted;
      return new InputError(where, `wrong type: got ${typeName(given.value)}`, shape);
    }
    case 'too_small':
    case 'too_big':
    case 'not_multiple_of':
    case 'invalid_format':
      return new InputError(where, `${shown(given.value)} is out of range (${issue.message.replace(/^Too (small|big): /, '').replace(/^Invalid input: /, '')})`, accepted);
    default:
      return new InputError(where, `${issue.message}; got ${shown(given.value)}`, accepted);
  }
}
