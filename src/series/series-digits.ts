// Significant digits of a series' values: two for E3…E24, three for E48…E192 (IEC 60063:2015 Tables 1 and 2).
import type { SeriesName } from './load.js';

export function seriesDigits(name: SeriesName): 2 | 3 {
  return name === 'E48' || name === 'E96' || name === 'E192' ? 3 : 2;
}
