// Loads the standard-value data in series/ (IEC 60063:2015 decades, the common shunt list).
// No series is typed into src/: the JSON files are the single source.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { InputError } from '../errors.js';
import { PROJECT_ROOT } from '../project-root.js';

export const SERIES_NAMES = ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192'] as const;
export type SeriesName = (typeof SERIES_NAMES)[number];

export interface SeriesDecade {
  name: SeriesName;
  source: string;
  commonTolerances: string[];
  /** Where the tolerance list comes from (common practice: the standard does not tie a series to a tolerance). */
  commonTolerancesNote?: string;
  /** One decade of significands, 1.0 ≤ v < 10, as tabulated. */
  values: number[];
}

export interface ShuntList {
  source: string;
  /** Shunt resistances in ohms. */
  values: number[];
  commonPowerRatingsW: number[];
  commonTcrPpmPerK: number[];
}

const cache = new Map<string, unknown>();

function readData<T>(file: string): T {
  const hit = cache.get(file);
  if (hit !== undefined) return hit as T;
  const data = JSON.parse(readFileSync(join(PROJECT_ROOT, 'series', file), 'utf8')) as T;
  cache.set(file, data);
  return data;
}

/** Canonical series name for user text such as "e96" or "E96"; an InputError listing the valid names otherwise. */
export function parseSeriesName(text: string, where = 'series'): SeriesName {
  const upper = text.trim().toUpperCase();
  const found = SERIES_NAMES.find((name) => name === upper);
  if (!found) throw new InputError(where, `unknown series '${text}'`, SERIES_NAMES.join(', '));
  return found;
}

export function loadSeries(name: SeriesName): SeriesDecade {
  return readData<SeriesDecade>(`${name}.json`);
}

export function loadShunts(): ShuntList {
  return readData<ShuntList>('shunts-milliohm.json');
}
