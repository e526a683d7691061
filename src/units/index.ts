// Value notation at the edges: parse user text into SI numbers and format numbers back for people.
export { parseCurrent, parsePower, parseResistance, parseVoltage } from './quantities.js';
export { parseQuantity, type QuantityKind, type SignRule } from './parse-quantity.js';
export { formatPercent, formatSignedPercent, parsePercent, type SignOption } from './percent.js';
export { formatPpmPerK, parsePpmPerK } from './ppm-per-kelvin.js';
export { parseRange, type Range } from './range.js';
export { formatEngineering, formatEngineeringShortest } from './format-engineering.js';
export { formatRkm, formatRkmDigits } from './format-rkm.js';
export { parseLetterCode, RESISTANCE_CODE_LETTERS } from './rkm-code.js';
export { SI_PREFIX_EXPONENTS, SI_PREFIX_LIST, SI_PREFIX_SYMBOLS } from './si-prefix.js';
export { toleranceLetter } from './tolerance-letter.js';
export { CURRENT_BAND_ACCEPTED, currentBandHalfWidth, describeCurrentBand, parseCurrentBand, type CurrentBand, type CurrentBandForm } from './current-band.js';
