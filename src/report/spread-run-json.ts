// A spread study as one JSON document: the analysis (src/report/json.ts), the design notes, the limits no resistor
// grade can fix and, for an adjustable output, the pot's bottom end.
import type { LotStudyResult } from '../analysis/lot-study.js';
import type { SpreadRun } from '../design/spread-study.js';
import { LIFE_CONDITION_LABEL, lifeConditionOr, type LifeCondition } from '../tolerance/life-allowances.js';
import { spreadJson, type SpreadJson } from './json.js';

export interface SpreadReportJson extends SpreadJson {
  /** What the figures describe: as-built (no drift) or end-of-life (with the drift allowances). */
  condition: LifeCondition;
  conditionLabel: string;
  notes: string[];
  /** Limits no resistor grade can fix (also among the notes). */
  limits: string[];
  /** Adjustable output: the pot at the bottom of its travel. */
  lowEnd?: SpreadJson;
  /** The lot study (reel-lot model), when asked for. */
  lots?: LotStudyResult;
}

export function spreadReportJson(run: SpreadRun, version: string): SpreadReportJson {
  const condition = lifeConditionOr(run.choice.condition);
  const json: SpreadReportJson = {
    ...spreadJson(run.result, { version, cautions: run.resolved.cautions }),
    condition,
    conditionLabel: LIFE_CONDITION_LABEL[condition],
    notes: run.resolved.notes.slice(),
    limits: (run.resolved.limits ?? []).slice(),
  };
  if (run.lowEnd) json.lowEnd = spreadJson(run.lowEnd.result, { version });
  if (run.lots) json.lots = run.lots;
  return json;
}
