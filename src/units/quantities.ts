// The four electrical quantities read from user text, each in its SI base unit.
import { parseQuantity, type QuantityKind } from './parse-quantity.js';
import { RESISTANCE_CODE_LETTERS } from './rkm-code.js';
import { SI_PREFIX_LIST } from './si-prefix.js';

const RESISTANCE: QuantityKind = {
  noun: 'resistance',
  units: ['\u03a9', '\u2126', 'ohm', 'ohms', 'R'],
  codeLetters: RESISTANCE_CODE_LETTERS,
  sign: 'positive',
  accepted: `a positive number with an optional SI prefix (${SI_PREFIX_LIST}) and unit (Ω, ohm, R), e.g. 4.7k, 4.7 kΩ, 220R, 10m; or an IEC 60062 code such as 4K7, 2R2, R047, 1M0`,
};

const VOLTAGE: QuantityKind = {
  noun: 'voltage',
  units: ['V', 'volt', 'volts'],
  codeLetters: new Map([['V', 0]]),
  sign: 'signed',
  accepted: `a number with an optional SI prefix (${SI_PREFIX_LIST}) and unit V, e.g. 12, 12V, 1.25 V, 800mV, 3V3`,
};

const CURRENT: QuantityKind = {
  noun: 'current',
  units: ['A', 'amp', 'amps'],
  codeLetters: new Map([['A', 0]]),
  sign: 'signed',
  accepted: `a number with an optional SI prefix (${SI_PREFIX_LIST}) and unit A, e.g. 2, 2A, 150mA, 50 nA, 1A5`,
};

const POWER: QuantityKind = {
  noun: 'power',
  units: ['W', 'watt', 'watts'],
  codeLetters: new Map(),
  sign: 'positive',
  accepted: `a positive number with an optional SI prefix (${SI_PREFIX_LIST}) and unit W, e.g. 0.25, 250mW, 1 W`,
};

/** Ohms, > 0. "4K7", "4.7k", "4.7 kΩ", "R047", "10 mΩ", "2.2e3". */
export function parseResistance(text: string, where: string): number {
  return parseQuantity(text, where, RESISTANCE);
}

/** Volts, signed (offsets may be negative). "12", "12V", "800 mV", "3V3". */
export function parseVoltage(text: string, where: string): number {
  return parseQuantity(text, where, VOLTAGE);
}

/** Amperes, signed (bias currents may be negative). "2A", "150mA", "1A5". */
export function parseCurrent(text: string, where: string): number {
  return parseQuantity(text, where, CURRENT);
}

/** Watts, > 0. "0.25", "250mW", "1 W". */
export function parsePower(text: string, where: string): number {
  return parseQuantity(text, where, POWER);
}
