// Formats a resistance in the letter-and-digit code of IEC 60062:2016: the multiplier letter (R, K, M, G, T)
// stands in place of the decimal point. 4700 → "4K7", 0.047 → "R047", 28700 → "28K7", 1e6 → "1M0", 100 → "100R".
// At least two digits are written (1M0, 1K0, R10) as is usual on parts and drawings (common practice);
// formatRkmDigits(ohms, 3) writes three for the three-digit series E48…E192 (28K0, 10K0, 383R).
// Up to 6 significant digits are kept so a standard value round-trips exactly.

const LETTERS: ReadonlyArray<[number, string]> = [
  [12, 'T'],
  [9, 'G'],
  [6, 'M'],
  [3, 'K'],
  [0, 'R'],
];

export function formatRkm(ohms: number): string {
  return formatRkmDigits(ohms, 2);
}

/** As formatRkm, padding the significant digits with zeros to at least `minDigits`. */
export function formatRkmDigits(ohms: number, minDigits: number): string {
  if (!Number.isFinite(ohms) || !(ohms > 0)) throw new RangeError(`formatRkm: not a positive finite resistance (${ohms})`);
  // "4.70000e+3" → significant digits "47", decimal exponent of the first digit 3.
  const [mantissa = '', exponentText = '0'] = ohms.toExponential(5).split('e');
  let digits = mantissa.replace('.', '').replace(/0+$/, '');
  const leadExponent = Number(exponentText);
  const [letterExponent, letter] = LETTERS.find(([e]) => leadExponent >= e) ?? [0, 'R'];
  digits = digits.padEnd(minDigits, '0');
  const wholeCount = leadExponent - letterExponent + 1; // digits before the letter (≤ 0 below 1 Ω)
  if (wholeCount <= 0) return `${letter}${'0'.repeat(-wholeCount)}${digits}`;
  const padded = digits.padEnd(wholeCount, '0');
  return `${padded.slice(0, wholeCount)}${letter}${padded.slice(wholeCount)}`;
}
