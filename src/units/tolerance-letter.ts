// The tolerance code letter of IEC 60062:2016 (the letter printed after a value code, e.g. 4K7F for ±1 %) for a
// symmetric tolerance given as a fraction. Letters and tolerances from IEC 60062:2016, table of tolerance codes
// (from memory): L ±0.01 %, P ±0.02 %, W ±0.05 %, B ±0.1 %, C ±0.25 %, D ±0.5 %, F ±1 %, G ±2 %, J ±5 %, K ±10 %, M ±20 %.
const TOLERANCE_LETTERS: ReadonlyArray<[number, string]> = [
  [0.0001, 'L'],
  [0.0002, 'P'],
  [0.0005, 'W'],
  [0.001, 'B'],
  [0.0025, 'C'],
  [0.005, 'D'],
  [0.01, 'F'],
  [0.02, 'G'],
  [0.05, 'J'],
  [0.1, 'K'],
  [0.2, 'M'],
];

/** The letter for a tolerance the table lists exactly (to 1e-9 relative), or undefined for any other tolerance. */
export function toleranceLetter(fraction: number): string | undefined {
  return TOLERANCE_LETTERS.find(([t]) => Math.abs(fraction - t) <= t * 1e-9)?.[1];
}
