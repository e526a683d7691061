// A design-file field holding a ratio in decibels (an amplifier's CMRR): "90 dB" or a plain number of dB.
import { parseDecibel } from '../units/decibel.js';
import { quantity } from './fields.js';

/** A rejection ratio in dB, above 0 dB and at most 200 dB (beyond any amplifier's datasheet). */
export const decibels = () => quantity(parseDecibel, 'a ratio in decibels: 90 dB, 80dB, or a number of dB', { min: Number.MIN_VALUE, max: 200, text: 'above 0 dB, at most 200 dB' });
