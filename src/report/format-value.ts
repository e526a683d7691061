// Formatting of an output's figures for people: every figure of one output is shown with the same number of
// significant digits, enough to resolve a tenth of its spread (so 8.4000 V ± 12.3 mV, not 8.40 V ± 12.3 mV).
// Figures that do not exist (no spec window, zero spread) are shown as an em dash, never as NaN or Infinity.
import { formatEngineering, formatPercent } from '../units/index.js';
import type { OutputResult } from '../analysis/result.js';

export const MISSING = '—';

/** Significant digits that resolve about a tenth of the output's spread, between 3 and 7. */
export function outputDigits(output: Pick<OutputResult, 'nominal' | 'mean' | 'worstCase' | 'sigma' | 'rss'>): number {
  const scale = Math.max(Math.abs(output.nominal), Math.abs(output.mean), Math.abs(output.worstCase.min), Math.abs(output.worstCase.max));
  const spreads = [output.sigma, output.rss.sigma, (output.worstCase.max - output.worstCase.min) / 6].filter((s) => Number.isFinite(s) && s > 0);
  if (!(scale > 0) || spreads.length === 0) return 3;
  const resolution = Math.min(...spreads) / 10;
  const digits = Math.floor(Math.log10(scale)) - Math.floor(Math.log10(resolution)) + 1;
  return Math.min(7, Math.max(3, digits));
}

/** A value in engineering notation, or MISSING when it is absent or not finite. */
export function formatValue(value: number | null | undefined, unit: string, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return MISSING;
  return formatEngineering(value, unit, digits);
}

/** A spread (σ, half-width): three significant digits are plenty. */
export function formatSpread(value: number | null | undefined, unit: string): string {
  return formatValue(value, unit, 3);
}

/** A percentage given in % (yield): enough decimals to show how close to 100 % it is. */
export function formatYieldPct(pct: number | null | undefined): string {
  if (pct === null || pct === undefined || !Number.isFinite(pct)) return MISSING;
  // Enough decimals that a yield short of 100 % never rounds to 100 % (99.99996 % → "99.999960 %").
  // A shortfall below 1e-9 % is floating-point rounding of 100 % (a Wilson bound computed as 0.9999999999999999).
  const out = 100 - pct;
  const decimals = out <= 1e-9 ? 2 : Math.min(6, Math.max(2, Math.ceil(-Math.log10(out)) + 1));
  return formatPercent(pct / 100, decimals);
}

/** A variance share (fraction) as a percentage. */
export function formatShare(fraction: number): string {
  return Number.isFinite(fraction) ? formatPercent(fraction, 1) : MISSING;
}

/** A dimensionless index (Cp, Cpk) with two decimals. */
export function formatIndex(value: number | null | undefined): string {
  return value === null || value === undefined || !Number.isFinite(value) ? MISSING : value.toFixed(2);
}

/** Parts per million out of spec, as a whole number with thousands separators. */
export function formatPpm(value: number | null | undefined): string {
  return value === null || value === undefined || !Number.isFinite(value) ? MISSING : Math.round(value).toLocaleString('en-US');
}

/** Long names of the supply model's outputs, for headings. */
export const OUTPUT_TITLES: Record<string, string> = {
  vout: 'output voltage',
  ilimit: 'current limit',
  shuntLoss: 'shunt loss at the limit',
  ampOutput: 'amplifier output at the limit',
  dividerCurrent: 'divider current',
};

export function outputTitle(name: string): string {
  const title = OUTPUT_TITLES[name];
  return title ? `${name} (${title})` : name;
}
