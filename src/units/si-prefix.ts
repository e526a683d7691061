// SI prefixes accepted in value notation and used by engineering formatting.
// Power-of-ten exponents from the SI Brochure (BIPM, 9th edition 2019, Table 7).
// Case matters: `m` is milli (10^-3) and `M` is mega (10^6). `u`, `µ` (U+00B5) and `μ` (U+03BC) all mean micro.
// `K` is also read as kilo: IEC 60062:2016 uses the capital letter for 10^3 in its letter-and-digit code,
// and "4.7K" is unambiguous for a resistance (common practice).

/** Prefix character → power of ten, for parsing. */
export const SI_PREFIX_EXPONENTS: ReadonlyMap<string, number> = new Map([
  ['p', -12],
  ['n', -9],
  ['u', -6],
  ['\u00b5', -6],
  ['\u03bc', -6],
  ['m', -3],
  ['k', 3],
  ['K', 3],
  ['M', 6],
  ['G', 9],
]);

/** Power of ten (a multiple of 3) → the prefix printed by the formatters. */
export const SI_PREFIX_SYMBOLS: ReadonlyMap<number, string> = new Map([
  [-12, 'p'],
  [-9, 'n'],
  [-6, '\u00b5'],
  [-3, 'm'],
  [0, ''],
  [3, 'k'],
  [6, 'M'],
  [9, 'G'],
]);

/** The prefixes in the order shown to a user. */
export const SI_PREFIX_LIST = 'p n u µ m k M G';
