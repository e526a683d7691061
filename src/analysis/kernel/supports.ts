// Which supply designs the WebAssembly kernel implements. A pure function of the spec, so the choice of kernel never
// depends on the machine (the numbers would not either: both kernels give the same bits, test/wasm-kernel.test.ts).
// Every object is checked against an explicit list of the keys the kernel knows, at every level: a field added to
// SupplySpec later (by any other change) is unknown here, so the kernel declines such a design and the JavaScript
// reference runs it, until the kernel learns the field and this list names it.
import type { SupplySpec } from '../models/supply.js';

type Check = (value: unknown) => boolean;

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** An object whose keys are all listed (a key holding undefined counts as absent) and whose listed keys pass. */
function shape(fields: Record<string, Check>, required: string[] = []): Check {
  return (value) => {
    if (!isObject(value)) return false;
    for (const [key, v] of Object.entries(value)) {
      if (v === undefined) continue;
      const check = fields[key];
      if (!check || !check(v)) return false;
    }
    return required.every((key) => value[key] !== undefined);
  };
}

const num: Check = (v) => typeof v === 'number';
const str: Check = (v) => typeof v === 'string';
const oneOf =
  (...values: unknown[]): Check =>
  (v) =>
    values.includes(v);
const either =
  (...checks: Check[]): Check =>
  (v) =>
    checks.some((c) => c(v));
const pair: Check = (v) => Array.isArray(v) && v.length === 2 && v.every(num);

/** The distributions of src/tolerance/part.ts, each with exactly its own fields. */
const distribution: Check = either(
  shape({ kind: oneOf('uniform') }, ['kind']),
  shape({ kind: oneOf('triangular') }, ['kind']),
  shape({ kind: oneOf('normal', 'truncated-normal'), k: num }, ['kind']),
  shape({ kind: oneOf('binned'), k: num, innerFraction: num }, ['kind', 'innerFraction']),
  shape({ kind: oneOf('fixed'), value: num }, ['kind', 'value']),
);

const resistorFields = { name: str, nominal: num, tolerance: num, tcrPerK: num, drift: num, distribution };
const resistor = shape(resistorFields, ['name', 'nominal', 'tolerance']);
const potentiometer = shape({ ...resistorFields, wiper: num }, ['name', 'nominal', 'tolerance', 'wiper']);
const leg = shape(
  {
    resistors: (v) => Array.isArray(v) && (v.length === 1 || v.length === 2) && v.every(resistor),
    arrangement: oneOf('series', 'parallel'),
    potentiometer,
  },
  ['resistors'],
);
const bound = shape({ nominal: num, plusMinus: num, distribution }, ['nominal', 'plusMinus']);
const reference = shape({ name: str, nominal: num, tolerance: num, tempcoPerK: num, drift: num, distribution }, ['nominal', 'tolerance']);
const temperature = shape(
  { minC: num, maxC: num, monteCarlo: either(oneOf('uniform'), shape({ fixedC: num }, ['fixedC'])), unitPoints: num },
  ['minC', 'maxC', 'monteCarlo'],
);
const shunt = shape(
  { ...resistorFields, powerRatingW: num, lossLimitW: num, lossLimitFrom: str, thermalResistanceKPerW: num },
  ['name', 'nominal', 'tolerance'],
);
const threshold = either(
  shape({ kind: oneOf('fixed'), nominal: num, tolerance: num, tempcoPerK: num, distribution }, ['kind', 'nominal', 'tolerance']),
  shape({ kind: oneOf('divided'), source: either(oneOf('regulator-reference'), reference), top: resistor, bottom: resistor }, ['kind', 'source', 'top', 'bottom']),
);
const amplifier = shape(
  { offsetMax: num, offsetDistribution: distribution, offsetDriftPerK: num, biasCurrent: bound, railV: num, headroomV: num },
  ['offsetMax'],
);
const senseCommon = { shunt, threshold, compareOffset: bound, limitTarget: num };
const senseRequired = ['topology', 'shunt', 'threshold', 'limitTarget'];
const sense = either(
  shape({ ...senseCommon, topology: oneOf('direct') }, senseRequired),
  shape({ ...senseCommon, topology: oneOf('noninv'), rf: resistor, rg: resistor, amplifier }, [...senseRequired, 'rf', 'rg', 'amplifier']),
  shape(
    { ...senseCommon, topology: oneOf('diff'), r1: resistor, r2: resistor, r3: resistor, r4: resistor, commonModeV: num, amplifier },
    [...senseRequired, 'r1', 'r2', 'r3', 'r4', 'commonModeV', 'amplifier'],
  ),
);
const supply = shape(
  {
    reference,
    divider: shape({ top: leg, bottom: leg, feedbackBias: bound }, ['top', 'bottom']),
    temperature,
    sense,
    windows: shape({ vout: pair, ilimit: pair, voutSides: oneOf('both', 'low', 'high') }),
    voutTarget: num,
  },
  ['reference', 'divider', 'temperature'],
);

/** True when the WebAssembly kernel implements every field of this supply spec (and nothing unknown is present). */
export function kernelSupports(spec: SupplySpec): boolean {
  return supply(spec);
}
