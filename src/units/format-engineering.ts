// Engineering notation: a mantissa in [1, 1000) with the SI prefix of a power of ten that is a multiple of 3,
// rounded to a number of significant digits: 4700 → "4.70 kΩ", 12 → "12.0 V", 0.15 → "150 mA", 9999 → "10.0 kΩ".
import { SI_PREFIX_SYMBOLS } from './si-prefix.js';

function integerDigits(magnitude: number): number {
  return magnitude >= 100 ? 3 : magnitude >= 10 ? 2 : 1;
}

/** The mantissa rounded to `significantDigits` (at least its integer digits), as text. */
function roundMantissa(mantissa: number, significantDigits: number): string {
  let digits = integerDigits(Math.abs(mantissa));
  let text = mantissa.toFixed(Math.max(0, significantDigits - digits));
  // Rounding may carry into a new integer digit (9.996 → "10.00"): round again with one decimal fewer.
  if (integerDigits(Math.abs(Number(text))) > digits) {
    digits = integerDigits(Math.abs(Number(text)));
    text = mantissa.toFixed(Math.max(0, significantDigits - digits));
  }
  return text;
}

export function formatEngineering(value: number, unitSymbol: string, significantDigits = 3): string {
  if (!Number.isFinite(value)) throw new RangeError(`formatEngineering: not a finite number (${value})`);
  if (value === 0) return `${(0).toFixed(Math.max(0, significantDigits - 1))} ${unitSymbol}`.trimEnd();
  let exponent = Math.floor(Math.log10(Math.abs(value)) / 3) * 3;
  for (let attempt = 0; attempt < 3; attempt++) {
    const mantissa = exponent >= 0 ? value / 10 ** exponent : value * 10 ** -exponent;
    const text = roundMantissa(mantissa, significantDigits);
    const size = Math.abs(Number(text));
    if (size >= 1000) exponent += 3;
    else if (size < 1 && attempt === 0) exponent -= 3;
    else {
      const prefix = SI_PREFIX_SYMBOLS.get(exponent);
      if (prefix === undefined) break;
      return `${text} ${prefix}${unitSymbol}`.trimEnd();
    }
  }
  // Outside p..G: plain exponent notation, still a number a parser reads back.
  return `${value.toPrecision(significantDigits)} ${unitSymbol}`.trimEnd();
}

/**
 * Engineering notation with the fewest significant digits (from minDigits up to maxDigits) that still show the
 * value exactly (to 1 part in 10^12): 28380 → "28.38 kΩ", 4700 → "4.70 kΩ", 28380.0475… → "28.3800 kΩ".
 */
export function formatEngineeringShortest(value: number, unitSymbol: string, minDigits = 3, maxDigits = 6): string {
  if (!Number.isFinite(value)) throw new RangeError(`formatEngineeringShortest: not a finite number (${value})`);
  for (let digits = minDigits; digits < maxDigits; digits++) {
    if (Math.abs(Number(value.toPrecision(digits)) - value) <= Math.abs(value) * 1e-12) {
      return formatEngineering(value, unitSymbol, digits);
    }
  }
  return formatEngineering(value, unitSymbol, maxDigits);
}
