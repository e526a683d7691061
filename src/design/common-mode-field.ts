// The design file's common-mode voltage of a diff sense stage: one voltage ("19 V"), a range over which it spreads
// from unit to unit ("17..21 V", or [17, 21]) or a band about a centre ("19 V ±2 V"), e.g. an LED string whose
// forward voltage spreads. Read here at the edge into [lo, hi] in volts; lo = hi for one voltage.
import { z } from 'zod';
import { InputError } from '../errors.js';
import { parseVoltage } from '../units/index.js';
import { fieldIssue, splitRange } from './fields.js';

export const COMMON_MODE_ACCEPTED = 'a voltage (19 V), a range over which it spreads from unit to unit (17..21 V or [17, 21]), or a band (19 V ±2 V)';

const LIMIT = 1e5;

function volts(text: string | number): number {
  return parseVoltage(typeof text === 'number' ? String(text) : text, '');
}

function read(input: string | number | [string | number, string | number]): [number, number] {
  if (Array.isArray(input)) return [volts(input[0]), volts(input[1])];
  if (typeof input === 'string' && input.includes('±')) {
    const [centre = '', half = ''] = input.split('±');
    if (centre.trim() === '' || half.trim() === '' || input.split('±').length > 2) throw new InputError('', `cannot read the band '${input}'`, COMMON_MODE_ACCEPTED);
    const c = volts(centre);
    const h = volts(half);
    if (h < 0) throw new InputError('', `the band's half-width ${h} V is negative`, COMMON_MODE_ACCEPTED);
    return [c - h, c + h];
  }
  if (typeof input === 'string' && input.includes('..')) {
    const parts = splitRange(input);
    if (!parts) throw new InputError('', `cannot read the range '${input}'`, COMMON_MODE_ACCEPTED);
    return [volts(parts[0]), volts(parts[1])];
  }
  const v = volts(input);
  return [v, v];
}

export const commonModeField = () =>
  z
    .union([z.string(), z.number(), z.tuple([z.union([z.string(), z.number()]), z.union([z.string(), z.number()])])])
    .transform((input, ctx): [number, number] => {
      let pair: [number, number];
      try {
        pair = read(input);
      } catch (error) {
        if (!(error instanceof InputError)) throw error;
        fieldIssue(ctx, input, error.message, `${COMMON_MODE_ACCEPTED}; ${error.accepted}`);
        return z.NEVER;
      }
      if (pair[0] > pair[1]) {
        fieldIssue(ctx, input, `the range is inverted (${pair[0]} > ${pair[1]})`, COMMON_MODE_ACCEPTED);
        return z.NEVER;
      }
      if (Math.abs(pair[0]) > LIMIT || Math.abs(pair[1]) > LIMIT) {
        fieldIssue(ctx, input, `${JSON.stringify(input)} is out of range`, `${COMMON_MODE_ACCEPTED}, -100 kV to 100 kV`);
        return z.NEVER;
      }
      return pair;
    })
    .meta({ description: COMMON_MODE_ACCEPTED });
