// The files a spread study writes on request (`spread --samples/--report`, `design --report`): the samples CSV and
// the HTML review report. Checked before the (possibly long) run, so nothing is computed for nothing; written
// through src/cli/output-file.ts (atomic, never over an existing file without --force).
import { existsSync, statSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { Option } from 'commander';
import { spreadSamples } from '../design/spread-samples.js';
import type { SpreadRun } from '../design/spread-study.js';
import { InputError } from '../errors.js';
import type { ReportTable } from '../report/html-report.js';
import { renderSamplesCsv } from '../report/samples-csv.js';
import { renderSpreadRunHtml, type SpreadRunHtmlOptions } from '../report/spread-run-html.js';
import { writeOutputFile } from './output-file.js';
import { VERSION } from './version.js';

/** Rows written to the samples CSV unless --sample-rows says otherwise (about 40 MB for a typical design). */
export const DEFAULT_SAMPLE_ROWS = 100_000;
/** Most rows the samples CSV takes. The CSV is built as one string: 400–700 bytes a row for the examples (up to
 * about 1 kB for the widest design), and a JavaScript string holds at most about 536 million characters; 250 000 rows
 * stay well inside that (about 175 MB of text and 1.5 GB of memory for the widest example). More rows were a crash
 * ("Invalid string length") after minutes of work. */
export const MAX_SAMPLE_ROWS = 250_000;

/** `--report <file.html>`. */
export function reportFileFlag(): Option {
  return new Option('--report <file.html>', 'write the HTML review report (one self-contained file)');
}

export interface SpreadFiles {
  samples?: string;
  sampleRows?: number;
  report?: string;
  force: boolean;
  subject: string;
  command?: string;
  /** Further tables for the HTML report (e.g. `design` adds the grade comparison: src/report/grades-tables.ts). */
  tables?: ReportTable[];
}

/** Refuses an existing output file before the run (writeOutputFile checks again when it writes). */
function refuseExisting(path: string | undefined, where: string, force: boolean): void {
  if (path === undefined) return;
  const folder = dirname(resolve(path));
  if (!existsSync(folder) || !statSync(folder).isDirectory()) {
    throw new InputError(where, `the folder ${folder} does not exist`, 'a file path in an existing folder');
  }
  if (existsSync(path) && statSync(path).isDirectory()) throw new InputError(where, `${path} is a folder, not a file`, 'a file path');
  if (force) return;
  if (existsSync(path)) throw new InputError(where, `${path} already exists and would be overwritten`, 'a new file name, or --force to replace it');
}

/** Refuses, before any analysis runs, files that could not be written: an existing file without force, a missing
 * folder, a folder named as a file, or the samples and the report in one file. */
export function checkSpreadFiles(files: SpreadFiles): void {
  refuseExisting(files.samples, '--samples', files.force);
  refuseExisting(files.report, '--report', files.force);
  if (files.samples !== undefined && files.report !== undefined && files.samples === files.report) {
    throw new InputError('--report', 'the same file as --samples', 'two different file names');
  }
}

/** Writes the CSV and HTML files asked for; returns their paths. */
export function writeSpreadFiles(run: SpreadRun, files: SpreadFiles): string[] {
  const written: string[] = [];
  if (files.samples !== undefined) {
    writeOutputFile(files.samples, renderSamplesCsv(spreadSamples(run, files.sampleRows ?? DEFAULT_SAMPLE_ROWS)), { force: files.force, where: '--samples' });
    written.push(files.samples);
  }
  if (files.report !== undefined) {
    const html: SpreadRunHtmlOptions = { subject: files.subject, version: VERSION };
    if (files.command !== undefined) html.command = files.command;
    if (files.tables !== undefined) html.tables = files.tables;
    writeOutputFile(files.report, renderSpreadRunHtml(run, html), { force: files.force, where: '--report' });
    written.push(files.report);
  }
  return written;
}
