// The samples CSV is streamed: src/cli/spread-files.ts draws one engine chunk of trials at a time
// (src/design/spread-samples.ts), renders it in slices (src/report/samples-csv.ts) and writes each slice into the
// temporary file of src/cli/output-file.ts (writeOutputFileStreaming). Its bytes must be exactly those of the
// earlier renderer, which drew every trial into whole arrays (firstTrials) and joined the whole file in memory: that
// renderer is kept below, verbatim, as the reference. (Checked once more by hand when the change was made: the built
// CLI's files for 1000 rows of the charger, 140 000 of the bench supply and 250 000 of the charger had the same
// SHA-256 before and after.)
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { firstTrials } from '../src/analysis/trial-values.js';
import { writeSpreadFiles } from '../src/cli/spread-files.js';
import { analysisChoice } from '../src/design/analysis-choice.js';
import { loadDesignFile } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { runSpread, type SpreadRun } from '../src/design/spread-study.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { samplesCsvHeader, samplesCsvRows } from '../src/report/samples-csv.js';

// ---- the reference: the whole-file samples CSV as it was rendered before streaming (kept verbatim) ----
interface SampleTable {
  partNames: string[];
  partUnits: string[];
  outputNames: string[];
  outputUnits: string[];
  parts: ArrayLike<number>[];
  outputs: ArrayLike<number>[];
  count: number;
}
function field(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
function heading(name: string, unit: string): string {
  return field(unit ? `${name} (${unit})` : name);
}
function number(value: number): string {
  return Number.isFinite(value) ? String(value) : '';
}
function referenceCsv(table: SampleTable): string {
  const lines: string[] = [
    ['trial', ...table.partNames.map((n, i) => heading(n, table.partUnits[i] ?? '')), ...table.outputNames.map((n, i) => heading(n, table.outputUnits[i] ?? ''))].join(','),
  ];
  for (let j = 0; j < table.count; j++) {
    const row: string[] = [String(j)];
    for (const column of table.parts) row.push(number(column[j]));
    for (const column of table.outputs) row.push(number(column[j]));
    lines.push(row.join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}
/** The samples as the earlier spreadSamples drew them (all trials at once), through the reference renderer. */
function referenceSamplesCsv(run: SpreadRun, rows: number): string {
  const stream = { seed: run.result.seed, chunkSize: run.result.chunkSize, runTrials: run.choice.trials === 'auto' ? 0 : run.result.trials };
  const values = firstTrials(run.model, stream, Math.min(rows, run.result.trials));
  return referenceCsv({ ...values, partUnits: run.model.parts.map((p) => p.unit), outputUnits: run.model.outputs.map((o) => o.unit) });
}
// ---------------------------------------------------------------------------------------------------------

async function spreadOf(example: string, trials: number | 'auto', seed: number): Promise<SpreadRun> {
  const resolved = resolveDesign(loadDesignFile(join(PROJECT_ROOT, 'examples', example)));
  return runSpread(resolved, analysisChoice(resolved, { trials, seed, workers: 1 }, 'auto'));
}

async function streamedCsv(run: SpreadRun, rows: number): Promise<string> {
  const dir = mkdtempSync(join(tmpdir(), 'trimfree-samples-'));
  const path = join(dir, 'samples.csv');
  expect(await writeSpreadFiles(run, { samples: path, sampleRows: rows, force: false, subject: 'test' })).toEqual([path]);
  expect(readdirSync(dir), 'the file alone, no temporary beside it').toEqual(['samples.csv']);
  return readFileSync(path, 'utf8');
}

describe('streamed samples CSV: the same bytes as the whole-file renderer', { timeout: 120_000 }, () => {
  it('1000 rows of examples/charger-2s-liion.json, seed 7, 20 000 trials', async () => {
    const run = await spreadOf('charger-2s-liion.json', 20_000, 7);
    const streamed = await streamedCsv(run, 1000);
    expect(streamed.split('\r\n')).toHaveLength(1000 + 2); // header, 1000 rows, '' after the last CRLF
    expect(streamed).toBe(referenceSamplesCsv(run, 1000));
  });

  it("70 000 rows of examples/bench-adjustable.json: across the engine's 65536-trial chunk and many 8192-row writes", async () => {
    const run = await spreadOf('bench-adjustable.json', 80_000, 3);
    const streamed = await streamedCsv(run, 70_000);
    expect(streamed.split('\r\n')).toHaveLength(70_000 + 2);
    expect(streamed).toBe(referenceSamplesCsv(run, 70_000));
  });

  it("an 'auto' trial count (the trial streams drawn open-ended, as the adaptive run drew them)", async () => {
    const run = await spreadOf('led-driver-highside.json', 'auto', 11);
    expect(run.result.trials).toBeGreaterThan(2000);
    expect(await streamedCsv(run, 2000)).toBe(referenceSamplesCsv(run, 2000));
  });

  it("more rows asked for than the run has: the run's trials, last chunk cut where the run cut it", async () => {
    const run = await spreadOf('led-driver-highside.json', 3000, 11);
    const streamed = await streamedCsv(run, 10_000_000);
    expect(streamed.split('\r\n')).toHaveLength(3000 + 2);
    expect(streamed).toBe(referenceSamplesCsv(run, 10_000_000));
  });
});

describe('samples CSV renderer: pieces that concatenate to the whole file', () => {
  // Hand-made columns: a name that needs CSV quoting (RFC 4180 2.6–2.7), a missing unit, a trial that is not a number.
  const table: SampleTable = {
    partNames: ['R1, top', 'say "x"'],
    partUnits: ['Ω', ''],
    outputNames: ['vout'],
    outputUnits: ['V'],
    parts: [Float64Array.of(1000, 1001.5, 999.25, 1e-7, 1234567.125), Float64Array.of(0.1, -0.2, 0.3, 0, -0)],
    outputs: [Float64Array.of(5, Number.NaN, Infinity, 4.999999999999999, 5.000000000000001)],
    count: 5,
  };

  it('header + rows [0, a) + [a, b) + [b, 5) equal the reference for every split, empty slices included', () => {
    const whole = referenceCsv(table);
    for (let a = 0; a <= 5; a++) {
      for (let b = a; b <= 5; b++) {
        const rows = { ...table, offset: 0 };
        expect(samplesCsvHeader(table) + samplesCsvRows(rows, 0, a) + samplesCsvRows(rows, a, b) + samplesCsvRows(rows, b, 5)).toBe(whole);
      }
    }
    expect(whole).toBe('trial,"R1, top (Ω)","say ""x""",vout (V)\r\n0,1000,0.1,5\r\n1,1001.5,-0.2,\r\n2,999.25,0.3,\r\n3,1e-7,0,4.999999999999999\r\n4,1234567.125,0,5.000000000000001\r\n');
  });

  it('rows are numbered from the chunk offset', () => {
    expect(samplesCsvRows({ parts: [[7]], outputs: [[8]], offset: 65536 }, 0, 1)).toBe('65536,7,8\r\n');
  });
});
