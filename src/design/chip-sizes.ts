// The chip-size table the BOM picks a package from: series/chip-sizes.json (common practice, with its source note) or
// the user's own file in the same format (`design --chip-sizes FILE.json`). Read and checked here; each problem is
// one InputError naming the file and the field path. `smallestChip` picks the smallest size whose derated power and
// maximum working voltage both cover what the part sees at worst case.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { z } from 'zod';
import { InputError } from '../errors.js';
import { PROJECT_ROOT } from '../project-root.js';

export interface ChipSize {
  /** Inch code, e.g. "0603". */
  size: string;
  /** Metric code, e.g. "1608M" (optional in a user's table). */
  metric?: string | undefined;
  ratedPowerW: number;
  maxVoltageV: number;
}

export interface ChipSizeTable {
  source: string;
  /** Share of the rated power a part may run at (0.5: half its rating). */
  powerDerating: number;
  /** Smallest first (by rated power), as the file lists them. */
  sizes: ChipSize[];
  /** Where the table came from (the file path). */
  file: string;
}

const positive = z.number().finite().positive();
const TableSchema = z.strictObject({
  name: z.string().optional(),
  source: z.string().min(1),
  powerDerating: z.number().gt(0).lte(1),
  powerDeratingSource: z.string().optional(),
  sizes: z
    .array(z.strictObject({ size: z.string().min(1), metric: z.string().min(1).optional(), ratedPowerW: positive, maxVoltageV: positive }))
    .min(1),
});

const ACCEPTED =
  'a JSON object { "source": "where the ratings come from", "powerDerating": 0.5, "sizes": [{ "size": "0603", "ratedPowerW": 0.1, "maxVoltageV": 75 }, …] } with sizes in order of rated power';

export const DEFAULT_CHIP_SIZES_FILE = join(PROJECT_ROOT, 'series', 'chip-sizes.json');

/** Reads and checks a chip-size table; `where` names it in errors (e.g. "--chip-sizes"). */
export function loadChipSizes(file: string = DEFAULT_CHIP_SIZES_FILE, where = file): ChipSizeTable {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code ?? 'unreadable';
    throw new InputError(where, code === 'ENOENT' ? `no such file: ${file}` : `cannot read ${file} (${code})`, ACCEPTED);
  }
  let data: unknown;
  try {
    data = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch {
    throw new InputError(where, `${file} is not valid JSON`, ACCEPTED);
  }
  const parsed = TableSchema.safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    const path = issue.path.map(String).join('.');
    throw new InputError(`${where}${path ? `: ${path}` : ''}`, issue.message, ACCEPTED);
  }
  const sizes = parsed.data.sizes;
  for (let i = 1; i < sizes.length; i += 1) {
    if (!(sizes[i]!.ratedPowerW >= sizes[i - 1]!.ratedPowerW)) {
      throw new InputError(`${where}: sizes.${i}.ratedPowerW`, `${sizes[i]!.size} is rated below ${sizes[i - 1]!.size}, the size before it`, ACCEPTED);
    }
  }
  return { source: parsed.data.source, powerDerating: parsed.data.powerDerating, sizes, file };
}

/** The first (smallest) size with derating · rated power ≥ powerW and maximum working voltage ≥ voltageV, or
 * undefined when no size in the table covers both. */
export function smallestChip(table: ChipSizeTable, powerW: number, voltageV: number): ChipSize | undefined {
  return table.sizes.find((s) => s.ratedPowerW * table.powerDerating >= powerW && s.maxVoltageV >= voltageV);
}
