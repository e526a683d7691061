// The files a spread study writes on request (`spread --samples/--report`, `design --report`): the samples CSV and
// the HTML review report. Checked before the (possibly long) run, so nothing is computed for nothing; written
// through src/cli/output-file.ts (atomic, never over an existing file without --force). The CSV is streamed: each
// chunk of trials is drawn, rendered and written in turn, with a pause for the event loop between chunks (so Ctrl-C
// is answered and the half-written temporary file removed), and memory stays flat whatever --sample-rows is.
import { Option } from 'commander';
import { spreadSamples, type SpreadSamples } from '../design/spread-samples.js';
import type { SpreadRun } from '../design/spread-study.js';
import { InputError } from '../errors.js';
import type { ReportTable } from '../report/html-report.js';
import { samplesCsvHeader, samplesCsvRows } from '../report/samples-csv.js';
import { renderSpreadRunHtml, type SpreadRunHtmlOptions } from '../report/spread-run-html.js';
import { fileSha256 } from './file-digest.js';
import { printableText } from '../user-text.js';
import { checkOutputTarget, sameOutputFile, writeOutputFile, writeOutputFileStreaming, type WriteText } from './output-file.js';
import { VERSION } from './version.js';

/** Rows written to the samples CSV unless --sample-rows says otherwise (about 50 MB for a typical design). */
export const DEFAULT_SAMPLE_ROWS = 100_000;
/** Most rows the samples CSV takes. The CSV is streamed, so memory does not grow with the rows (charger example,
 * measured with /usr/bin/time -v: 1 000 000 rows 240–280 MB peak, of which the run alone takes 175 MB; 3 000 000
 * rows 270 MB). The cap bounds the file and the time instead: 400–700 bytes a row for the examples (up to about 1 kB
 * for the widest design), so at most about 5–10 GB, and about 7 s of writing per million rows on top of a run of at
 * least as many trials. */
export const MAX_SAMPLE_ROWS = 10_000_000;
/** Rows rendered per write: a few megabytes of text, so the piece in memory stays small. */
const ROWS_PER_WRITE = 8192;

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
  /** The yield the report's verdict block holds each output to, %. */
  targetYieldPct?: number;
}

/** Refuses, before any analysis runs, files that could not be written (src/cli/output-file.ts checkOutputTarget:
 * an existing file without force, a missing or unwritable folder, a folder or device named as a file), or the samples
 * and the report in one file under any two spellings. */
export function checkSpreadFiles(files: SpreadFiles): void {
  if (files.samples !== undefined) checkOutputTarget(files.samples, { force: files.force, where: '--samples' });
  if (files.report !== undefined) checkOutputTarget(files.report, { force: files.force, where: '--report' });
  if (files.samples !== undefined && files.report !== undefined && sameOutputFile(files.samples, files.report)) {
    throw new InputError('--report', `the same file as --samples (${printableText(files.report)} and ${printableText(files.samples)})`, 'two different files');
  }
}

/** Says so on stderr when --sample-rows asks for more rows than the run has trials (the CSV holds every trial). */
export function noteSampleRows(run: SpreadRun, sampleRows: number): void {
  const trials = run.result.trials;
  if (sampleRows > trials) process.stderr.write(`note: --sample-rows ${sampleRows} is more than the run's ${trials} trials; the samples CSV holds all ${trials}\n`);
}

/** Writes the CSV and HTML files asked for; returns their paths. */
export async function writeSpreadFiles(run: SpreadRun, files: SpreadFiles): Promise<string[]> {
  const written: string[] = [];
  if (files.samples !== undefined) {
    const samples = spreadSamples(run, files.sampleRows ?? DEFAULT_SAMPLE_ROWS);
    await writeOutputFileStreaming(files.samples, (write) => writeSamplesCsv(samples, write), { force: files.force, where: '--samples' });
    written.push(files.samples);
  }
  if (files.report !== undefined) {
    const html: SpreadRunHtmlOptions = { subject: files.subject, version: VERSION, provenance: { generatedAt: new Date(), designSha256: fileSha256(files.subject) } };
    if (files.command !== undefined) html.command = files.command;
    if (files.tables !== undefined) html.tables = files.tables;
    if (files.targetYieldPct !== undefined) html.targetYieldPct = files.targetYieldPct;
    writeOutputFile(files.report, renderSpreadRunHtml(run, html), { force: files.force, where: '--report' });
    written.push(files.report);
  }
  return written;
}

const pause = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

/** The samples CSV, piece by piece: the header, then each chunk's rows in slices of ROWS_PER_WRITE, pausing for the
 * event loop after each slice (rendering a whole 65536-row chunk took about 0.7 s of CPU before Ctrl-C was answered;
 * a slice of 8192 rows takes about 0.09 s). */
async function writeSamplesCsv(samples: SpreadSamples, write: WriteText): Promise<void> {
  write(samplesCsvHeader(samples));
  for (const chunk of samples.chunks()) {
    for (let from = 0; from < chunk.n; from += ROWS_PER_WRITE) {
      write(samplesCsvRows(chunk, from, Math.min(chunk.n, from + ROWS_PER_WRITE)));
      await pause();
    }
  }
}
