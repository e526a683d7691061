// A pilot study as the terminal report: the run's line, then per measured output its figures (pilot-figures.ts),
// the parts that could explain a shift, the re-centring and the plain-words findings; then the files' SHA-256, the methods, notes and cautions.
import type { PilotOutput, PilotRun } from '../pilot/study.js';
import { formatEngineering } from '../units/index.js';
import { pilotFigures, pilotTitle, windowText, type PilotFigure, type PilotProvenance } from './pilot-figures.js';

/** Parts listed in the single-part diagnosis (the most plausible first). */
export const DIAGNOSIS_ROWS = 5;

function section(title: string, rows: PilotFigure[]): string {
  if (rows.length === 0) return '';
  const width = Math.max(...rows.map((r) => r.label.length));
  return `  ${title}\n${rows.map((r) => `    ${r.label.padEnd(width)}  ${r.text}`).join('\n')}\n`;
}

function signedValue(x: number, unit: string): string {
  return `${x >= 0 ? '+' : '−'}${formatEngineering(Math.abs(x), unit, 3)}`;
}

function signedBands(x: number): string {
  return `${x >= 0 ? '+' : '−'}${Math.abs(x).toFixed(2)}`;
}

export function diagnosisLines(out: PilotOutput): string[] {
  const d = out.diagnosis;
  if (!out.tests.meanShift.significant || d.singleParts.length === 0) return [];
  const lines = [`each part alone would need, in units of its own tolerance band (±1 = the band's edge):`];
  for (const s of d.singleParts.slice(0, DIAGNOSIS_ROWS)) lines.push(`  ${s.part.padEnd(12)} ${signedBands(s.bands).padStart(8)}${s.plausible ? '  plausible' : ''}`);
  if (d.singleParts.length > DIAGNOSIS_ROWS) lines.push(`  … ${d.singleParts.length - DIAGNOSIS_ROWS} more parts, each needing more`);
  const ls = d.leastSquares.filter((x) => Math.abs(x.bands) >= 0.005).slice(0, DIAGNOSIS_ROWS);
  if (ls.length > 0) lines.push(`least-squares combination (one explanation among many): ${ls.map((x) => `${x.part} ${signedBands(x.bands)}`).join(', ')}`);
  return lines;
}

function outputText(out: PilotOutput): string {
  const figures = pilotFigures(out);
  let text = `${pilotTitle(out)}: spec ${windowText(out)}\n`;
  text += section('measured and predicted', figures.filter((f) => f.section === 'measured'));
  text += section('tests, α = 0.05', figures.filter((f) => f.section === 'tests'));
  text += section('measured capability', figures.filter((f) => f.section === 'capability'));
  const diagnosis = diagnosisLines(out);
  if (diagnosis.length > 0) text += `  what could explain the shift of ${signedValue(out.diagnosis.shift, out.unit)}\n${diagnosis.map((l) => `    ${l}`).join('\n')}\n`;
  text += section('re-centring', figures.filter((f) => f.section === 're-centring'));
  text += `    ${out.recentreNote}\n`;
  text += `  findings\n${out.findings.map((f) => `    - ${f}`).join('\n')}\n`;
  return text;
}

export function renderPilotText(run: PilotRun, provenance: PilotProvenance): string {
  const r = run.prediction.result;
  const head = `${provenance.designFile.path} against ${provenance.measurementsFile.path}: ${run.measurements.unitIds.length} units; prediction at ${run.prediction.ambientC.toFixed(1)} °C, Monte Carlo ${r.trials.toLocaleString('en-US')} trials, seed ${JSON.stringify(r.seed)}; trimfree ${provenance.version}`;
  let text = `${head}\n\n${run.outputs.map(outputText).join('\n')}`;
  text += `\nfiles (SHA-256):\n  ${provenance.designFile.sha256}  ${provenance.designFile.path}\n  ${provenance.measurementsFile.sha256}  ${provenance.measurementsFile.path}\n`;
  text += `\nhow it was obtained:\n${METHOD_NOTES.map((m) => `  - ${m}`).join('\n')}\n`;
  if (run.notes.length > 0) text += `\nnotes:\n${run.notes.map((n) => `  - ${n}`).join('\n')}\n`;
  if (run.cautions.length > 0) text += `\ncaution:\n${run.cautions.map((c) => `  ! ${c}`).join('\n')}\n`;
  return text;
}

/** The tests and their sources, for every pilot report. */
export const METHOD_NOTES = [
  'Mean: 95 % interval by Student t; shift by the one-sample t test against the predicted mean (NIST/SEMATECH e-Handbook 1.3.5.2, 7.2.2).',
  'σ: 95 % interval by chi-square (e-Handbook 1.3.5.8); spread test: chi-square scaled to the predicted distribution\'s kurtosis (Satterthwaite 1946 / Box 1953 moment matching), since a supply\'s output is seldom normal.',
  'Shape: Anderson–Darling against the Monte Carlo distribution, p-value from its limiting distribution (Marsaglia & Marsaglia 2004; Stephens 1974 finds it good from 5 units). With few units a pass is weak evidence.',
  "Outliers: Grubbs' test for the most extreme unit, two-sided, α = 0.05 (e-Handbook 1.3.5.17); it assumes the rest are normal.",
  'Cpk interval: Bissell 1990, as in e-Handbook 6.1.6. Tolerance interval and supported yield: two-sided normal tolerance interval, Howe\'s k (e-Handbook 7.2.6.3); both assume a normal spread of units.',
  'Diagnosis: the shift divided by each part\'s sensitivity (central differences, JCGM 100:2008 5.1.3), in units of that part\'s band; the least-squares combination weights each part by its standard uncertainty.',
  'Re-centring: each divider or gain resistor moved to the standard values of its series that bracket the ideal (the model\'s nominal output, assuming the measured offset stays); projected yields move the model\'s trials to the measured mean and widen them to the measured σ where larger.',
];
