// The `design` report: the BOM, the spread study and (unless skipped) the grade study, as terminal text or as one
// JSON document { bom, spread, grades }.
import type { GradesRun } from '../design/grade-study.js';
import type { PurchaseBomLine } from '../design/purchase-bom.js';
import type { SpreadRun } from '../design/spread-study.js';
import { renderBomText } from './bom-table.js';
import { gradesJson } from './grades-json.js';
import { renderGradesText } from './grades-text.js';
import { spreadReportJson } from './spread-run-json.js';
import { renderSpreadRunText } from './spread-run-text.js';

export interface DesignTextOptions {
  /** What was analysed, e.g. the design file's path. */
  subject: string;
  version: string;
  /** Yield an output must reach for "pass" in the spread summary, %. */
  targetYieldPct?: number;
  /** Colour the pass/fail words (a terminal that takes colour only). */
  colour?: boolean;
}

export function renderDesignText(spread: SpreadRun, grades: GradesRun | undefined, options: DesignTextOptions): string {
  // The spread already printed the cautions; the grade table follows without repeating them.
  const gradesText = grades ? `\n${renderGradesText({ ...grades, resolved: { ...grades.resolved, cautions: [] } }, options)}` : '';
  return `${renderBomText(spread.resolved.bom)}\n${renderSpreadRunText(spread, options)}${gradesText}`;
}

/** `bom` is the purchase BOM when given (`design` passes it: src/design/purchase-bom.ts), else the design's BOM. */
export function designReportJson(spread: SpreadRun, grades: GradesRun | undefined, version: string, bom?: PurchaseBomLine[]): unknown {
  return { bom: bom ?? spread.resolved.bom, spread: spreadReportJson(spread, version), grades: grades ? gradesJson(grades, version) : null };
}
