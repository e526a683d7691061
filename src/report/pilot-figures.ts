// The figures of one measured output as rows of text, shared by the terminal and HTML pilot reports (so both show
// the same rows): each row a label, the text, the field it comes from and the exact numbers it shows. Formats only;
// every number comes from the pilot study (src/pilot/).
import type { PilotOutput } from '../pilot/study.js';
import { formatP } from '../pilot/study.js';
import { formatEngineering, formatSignedPercent } from '../units/index.js';
import { MISSING, formatIndex, formatSpread, formatYieldPct, outputTitle } from './format-value.js';

export interface PilotProvenance {
  version: string;
  /** ISO 8601 time the report was made (the CLI reads the clock; omitted where output must not change run to run). */
  date?: string;
  designFile: { path: string; sha256: string };
  measurementsFile: { path: string; sha256: string };
  command?: string;
}

export interface PilotFigure {
  section: 'measured' | 'tests' | 'capability' | 're-centring';
  label: string;
  text: string;
  field: string;
  values: number[];
}

/** Significant digits resolving a tenth of the measured or predicted σ (3 to 7), as the spread report does. */
export function pilotDigits(out: PilotOutput): number {
  const scale = Math.max(Math.abs(out.tests.measured.mean), Math.abs(out.predicted.mean));
  const spread = Math.min(...[out.tests.measured.sigma, out.predicted.sigma].filter((s) => s > 0));
  if (!(scale > 0) || !Number.isFinite(spread)) return 4;
  return Math.min(7, Math.max(3, Math.floor(Math.log10(scale)) - Math.floor(Math.log10(spread / 10)) + 1));
}

/** A stated proportion (0.99 → '99 %', 0.999 → '99.9 %'). */
function percent(fraction: number): string {
  return `${Number((100 * fraction).toPrecision(6))} %`;
}

function signed(value: number, unit: string): string {
  return `${value >= 0 ? '+' : '−'}${formatEngineering(Math.abs(value), unit, 3)}`;
}

export function pilotTitle(out: PilotOutput): string {
  return outputTitle(out.name);
}

export function pilotFigures(out: PilotOutput): PilotFigure[] {
  const d = pilotDigits(out);
  const u = out.unit;
  const v = (x: number): string => formatEngineering(x, u, d);
  const t = out.tests;
  const m = t.measured;
  const rows: PilotFigure[] = [
    { section: 'measured', label: 'units', text: String(m.n), field: 'measured.n', values: [m.n] },
    { section: 'measured', label: 'mean, measured (95 % interval)', text: `${v(m.mean)}  (${v(m.meanInterval.low)} … ${v(m.meanInterval.high)})`, field: 'measured.mean', values: [m.mean, m.meanInterval.low, m.meanInterval.high] },
    { section: 'measured', label: 'mean, predicted', text: v(out.predicted.mean), field: 'predicted.mean', values: [out.predicted.mean] },
    { section: 'measured', label: 'σ, measured (95 % interval)', text: `${formatSpread(m.sigma, u)}  (${formatSpread(m.sigmaInterval.low, u)} … ${formatSpread(m.sigmaInterval.high, u)})`, field: 'measured.sigma', values: [m.sigma, m.sigmaInterval.low, m.sigmaInterval.high] },
    { section: 'measured', label: 'σ, predicted', text: formatSpread(out.predicted.sigma, u), field: 'predicted.sigma', values: [out.predicted.sigma] },
    { section: 'measured', label: 'min … max, measured', text: `${v(m.min)} … ${v(m.max)}`, field: 'measured.range', values: [m.min, m.max] },
    ...(out.outsideWindow === null ? [] : [{ section: 'measured' as const, label: 'units outside the window, measured', text: `${out.outsideWindow} of ${m.n}`, field: 'measured.outsideWindow', values: [out.outsideWindow] }]),
    {
      section: 'tests',
      label: 'mean shift (t test)',
      text: `${signed(t.meanShift.shift, u)}  t = ${t.meanShift.t.toFixed(2).replace('-', '−')}, p ${formatP(t.meanShift.p)}: ${t.meanShift.significant ? 'differs' : 'agrees'}`,
      field: 'tests.meanShift',
      values: [t.meanShift.shift, t.meanShift.t, t.meanShift.p],
    },
    {
      section: 'tests',
      label: 'σ measured / predicted (χ² test)',
      text: `${Math.sqrt(t.spread.ratio).toFixed(2)}  p ${formatP(t.spread.p)}: ${t.spread.direction}`,
      field: 'tests.spread',
      values: [Math.sqrt(t.spread.ratio), t.spread.p],
    },
    {
      section: 'tests',
      label: 'shape (Anderson–Darling)',
      text: `A² = ${t.shape.statistic.toFixed(2)}, p ${formatP(t.shape.p)}: ${t.shape.significant ? 'does not fit' : 'not contradicted'}`,
      field: 'tests.shape',
      values: [t.shape.statistic, t.shape.p],
    },
    {
      section: 'tests',
      label: "outlier (Grubbs' test)",
      text: out.outlierUnit !== null
        ? `unit ${out.outlierUnit}, ${v(out.values[t.outlier.index]!)}: G = ${t.outlier.statistic.toFixed(2)} > ${t.outlier.critical.toFixed(2)}`
        : `none (G = ${t.outlier.statistic.toFixed(2)} ≤ ${t.outlier.critical.toFixed(2)})`,
      field: 'tests.outlier',
      values: [t.outlier.statistic, t.outlier.critical],
    },
  ];
  const c = t.capability;
  if (c && out.spec) {
    rows.push(
      { section: 'capability', label: 'Cpk, measured (95 % interval)', text: `${formatIndex(c.cpk)}  (${formatIndex(c.cpkInterval.low)} … ${formatIndex(c.cpkInterval.high)})`, field: 'capability.cpk', values: [c.cpk, c.cpkInterval.low, c.cpkInterval.high] },
      {
        section: 'capability',
        label: `${percent(c.tolerance.coverage)} of units within (${percent(c.tolerance.confidence)} confidence)`,
        text: `${v(c.tolerance.low)} … ${v(c.tolerance.high)}  (k = ${c.tolerance.k.toFixed(3)}): ${c.tolerance.insideWindow ? 'inside' : 'not inside'} the window`,
        field: 'capability.tolerance',
        values: [c.tolerance.low, c.tolerance.high, c.tolerance.k],
      },
      {
        section: 'capability',
        label: `yield supported (${percent(c.tolerance.confidence)} confidence)`,
        text: `at least ${formatYieldPct(c.supportedYieldPct)}`,
        field: 'capability.supportedYieldPct',
        values: [c.supportedYieldPct],
      },
      {
        section: 'capability',
        label: `target yield ${percent(c.target.yieldPct / 100)}`,
        text: c.target.supported
          ? 'supported'
          : c.target.unitsNeeded === null
            ? 'not supported, and no number of units would support it with this mean and σ: re-centre or narrow the spread'
            : `not supported; about ${c.target.unitsNeeded} units with this mean and σ would`,
        field: 'capability.target',
        values: c.target.unitsNeeded === null ? [] : [c.target.unitsNeeded],
      },
    );
  }
  const r = out.recentre;
  if (r) {
    rows.push({
      section: 're-centring',
      label: r.improves ? 'single resistor swap' : 'nearest single swap (not advised)',
      text: `${r.designator} ${formatEngineering(r.from, 'Ω', 4)} → ${formatEngineering(r.to, 'Ω', 4)} (${r.series}, ${formatSignedPercent(r.to / r.from - 1, 2)}): mean expected ${v(r.expectedMean)}; projected yield now → after: ${formatYieldPct(r.yieldPctNow)} → ${formatYieldPct(r.yieldPctAfter)}`,
      field: 'recentre',
      values: [r.from, r.to, r.expectedMean, r.yieldPctNow, r.yieldPctAfter],
    });
  }
  return rows;
}

/** The window as text, or MISSING. */
export function windowText(out: PilotOutput): string {
  if (!out.spec) return MISSING;
  const d = pilotDigits(out);
  return `${formatEngineering(out.spec[0], out.unit, d)} … ${formatEngineering(out.spec[1], out.unit, d)}`;
}
