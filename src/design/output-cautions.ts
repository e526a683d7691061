// Cautions that quote the analysed figures: the charge voltage of a battery charger and an output above what the
// design says it must never exceed. They go in the caution box beside the fixed cautions of cautions.ts, and, like
// those, defer to the cell's and the load's datasheets: trimfree computes spreads, it certifies nothing.
import type { AnalysisResult } from '../analysis/result.js';
import { formatEngineering } from '../units/index.js';
import type { Application } from './schema.js';

export interface OutputCautionLimits {
  application: Application | undefined;
  /** The output voltage window the design file gave (null when it gave none, e.g. an adjustable output). */
  voutWindow: [number, number] | null;
  /** An output voltage the supply must never exceed, V (design file: voltage.absoluteMax). */
  voutAbsoluteMax?: number;
}

const v = (x: number): string => formatEngineering(x, 'V', 4);

/** The highest 99.865 % percentile of vout over the ambients checked: 0.135 % of units at that ambient lie above it. */
function upperBand(vout: AnalysisResult['outputs'][string]): { value: number; ambientC: number | null } {
  const sweep = vout.ambientSweep;
  if (!sweep || sweep.length === 0) return { value: vout.interval9973.high, ambientC: null };
  let best = sweep[0]!;
  for (const p of sweep) if (p.band9973.high > best.band9973.high) best = p;
  return { value: best.band9973.high, ambientC: best.ambientC };
}

/** The cautions the analysed output voltage calls for (none when the result has no vout). */
export function outputCautions(limits: OutputCautionLimits, result: AnalysisResult): string[] {
  const vout = result.outputs.vout;
  if (!vout) return [];
  const out: string[] = [];
  const worstHigh = vout.worstCase.max;
  const band = upperBand(vout);
  const bandText = `${v(band.value)} (99.865 % of units${band.ambientC === null ? '' : ` at ${band.ambientC} °C, the highest ambient for it`} stay below)`;
  if (limits.application === 'charger') {
    const window = limits.voutWindow;
    const against = window ? ` against the window ${v(window[0])} … ${v(window[1])}` : '';
    const over = window && worstHigh > window[1] ? `; the worst case is ${v(worstHigh - window[1])} ABOVE the window's top` : '';
    out.push(
      `Charge voltage: worst case up to ${v(worstHigh)}, Monte Carlo up to ${bandText}${against}${over}. Compare with the cell datasheet's maximum charge voltage times the cell count, and keep independent pack protection.`,
    );
  } else if (limits.voutWindow && worstHigh > limits.voutWindow[1]) {
    out.push(`Over-voltage: the worst-case output ${v(worstHigh)} is above the window's top ${v(limits.voutWindow[1])}; Monte Carlo up to ${bandText}. Check what the load tolerates.`);
  }
  if (limits.voutAbsoluteMax !== undefined && worstHigh > limits.voutAbsoluteMax) {
    out.push(
      `Over-voltage: the worst-case output ${v(worstHigh)} exceeds the absolute maximum ${v(limits.voutAbsoluteMax)} the design gives (voltage.absoluteMax); Monte Carlo up to ${bandText}. Tighten the divider and reference, or add a clamp.`,
    );
  }
  return out;
}
