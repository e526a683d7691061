// A spread study as the terminal report: each analysis (and the pot's bottom end for an adjustable output), then
// the limits no resistor grade can fix, the design notes and the cautions from the design's resolution.
import type { SpreadRun } from '../design/spread-study.js';
import { LIFE_CONDITION_SHORT, lifeConditionOr } from '../tolerance/life-allowances.js';
import { renderLotText } from './lot-table.js';
import { POT_OUTPUTS } from './pot-ends.js';
import { renderSpreadText } from './spread-text.js';

export interface SpreadRunTextOptions {
  /** What was analysed, e.g. the design file's path. */
  subject: string;
  version: string;
  /** Yield an output must reach for "pass" in the summary, %. */
  targetYieldPct?: number;
  /** Colour the pass/fail words (a terminal that takes colour only). */
  colour?: boolean;
}

export function renderSpreadRunText(run: SpreadRun, options: SpreadRunTextOptions): string {
  const { version } = options;
  // The heading says which condition the figures describe: as built, or end of life with the drift allowances.
  const subject = `${options.subject}, ${LIFE_CONDITION_SHORT[lifeConditionOr(run.choice.condition)]}`;
  const partNames = run.model.parts.map((p) => p.name);
  const verdict = { ...(options.targetYieldPct !== undefined ? { targetYieldPct: options.targetYieldPct } : {}), colour: options.colour ?? false };
  if (!run.lowEnd) return withDesignNotes(renderSpreadText(run.result, { version, subject, partNames, ...verdict }), run);
  const top = 'pot at the top of its travel';
  const bottom = 'pot at the bottom of its travel';
  let text = renderSpreadText(run.result, { version, subject: `${subject}, ${top}`, partNames, where: top, ...verdict });
  // The bottom shows only what the pot moves (pot-ends.ts).
  const moved = POT_OUTPUTS.filter((name) => name in run.lowEnd!.result.outputs);
  text += `\n${renderSpreadText(run.lowEnd.result, { version, subject: `${subject}, ${bottom}`, partNames, where: bottom, outputs: moved, ...verdict })}`;
  const same = Object.keys(run.lowEnd.result.outputs).filter((name) => !moved.includes(name));
  if (same.length > 0) text += `(${same.join(', ')}: the same at both ends of the travel, shown once above)\n`;
  return withDesignNotes(text, run);
}

function withDesignNotes(body: string, run: SpreadRun): string {
  let text = body;
  if (run.lots) text += renderLotText(run.lots);
  const limits = run.resolved.limits ?? [];
  const notes = run.resolved.notes.filter((n) => !limits.includes(n));
  if (limits.length > 0) text += `\nbeyond any resistor grade:\n${limits.map((l) => `  ! ${l}`).join('\n')}\n`;
  if (notes.length > 0) text += `\ndesign notes:\n${notes.map((n) => `  - ${n}`).join('\n')}\n`;
  if (run.resolved.cautions.length > 0) text += `\ncaution:\n${run.resolved.cautions.map((c) => `  ! ${c}`).join('\n')}\n`;
  return text;
}
