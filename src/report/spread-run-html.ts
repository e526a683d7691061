// A spread study as the HTML review report (src/report/html-report.ts): the analysis, the parts, the BOM, the
// cautions and design notes, the pot's bottom end for an adjustable output, and any further tables (`design` adds
// the grade comparison: src/report/grades-tables.ts).
import type { SpreadRun } from '../design/spread-study.js';
import { LIFE_CONDITION_SHORT, lifeConditionOr } from '../tolerance/life-allowances.js';
import { bomRows } from './bom-table.js';
import { lotReportTable } from './lot-table.js';
import { renderHtmlReport, type ReportProvenance, type ReportTable } from './html-report.js';

export interface SpreadRunHtmlOptions {
  /** What was analysed, e.g. the design file's path. */
  subject: string;
  version: string;
  /** The command line that produced the report (for reproduction). */
  command?: string;
  tables?: ReportTable[];
  /** When the report was made and the design file's digest (the CLI supplies them: a report reads no clock). */
  provenance?: ReportProvenance;
  /** The yield each output must reach to read "meets" in the verdict block, %. */
  targetYieldPct?: number;
}

export function renderSpreadRunHtml(run: SpreadRun, options: SpreadRunHtmlOptions): string {
  const { subject, command, tables } = options;
  const input: Parameters<typeof renderHtmlReport>[0] = {
    title: `trimfree spread report: ${subject}, ${LIFE_CONDITION_SHORT[lifeConditionOr(run.choice.condition)]}`,
    subject,
    version: options.version,
    result: run.result,
    parts: run.model.parts,
    bom: bomRows(run.resolved.bom),
    cautions: run.resolved.cautions,
    designNotes: run.resolved.notes,
  };
  if (command) input.command = command;
  if (tables || run.lots) input.tables = [...(run.lots ? [lotReportTable(run.lots)] : []), ...(tables ?? [])];
  if (options.provenance) input.provenance = options.provenance;
  if (options.targetYieldPct !== undefined) input.targetYieldPct = options.targetYieldPct;
  if (run.lowEnd) input.lowEnd = { title: 'pot at the bottom of its travel', result: run.lowEnd.result };
  return renderHtmlReport(input);
}
