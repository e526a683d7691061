// A pilot study as one JSON document: provenance, the prediction's settings, and per measured output the measured
// summary, the prediction, every test with its statistic and p-value, the capability, the diagnosis, the re-centring
// and the findings, plus each unit's id and value. SI units throughout. A figure that does not exist is null.
import type { PilotRun } from '../pilot/study.js';
import type { PilotProvenance } from './pilot-figures.js';
import { METHOD_NOTES } from './pilot-text.js';

export function pilotJson(run: PilotRun, provenance: PilotProvenance): unknown {
  const r = run.prediction.result;
  const outputs: Record<string, unknown> = {};
  for (const o of run.outputs) {
    const { histogram: _histogram, ...predicted } = o.predicted;
    outputs[o.name] = {
      unit: o.unit,
      spec: o.spec ?? null,
      measured: o.tests.measured,
      predicted,
      tests: {
        meanShift: { ...o.tests.meanShift, test: 'one-sample t test (NIST/SEMATECH e-Handbook 7.2.2)' },
        spread: { ...o.tests.spread, sigmaRatio: Math.sqrt(o.tests.spread.ratio), test: 'chi-square with kurtosis allowance (Satterthwaite 1946 / Box 1953)' },
        shape: { ...o.tests.shape, test: 'Anderson–Darling against the Monte Carlo distribution (Marsaglia & Marsaglia 2004 limiting p-value)' },
        outlier: { ...o.tests.outlier, unit: o.outlierUnit, test: "Grubbs' test, two-sided (NIST/SEMATECH e-Handbook 1.3.5.17)" },
      },
      capability: o.tests.capability,
      offCentre: o.tests.offCentre,
      diagnosis: o.diagnosis,
      sigmaScale: o.sigmaScale,
      recentre: o.recentre,
      recentreNote: o.recentreNote,
      findings: o.findings,
      units: o.unitIds.map((id, i) => ({ id, value: o.values[i]! })),
    };
  }
  return {
    version: provenance.version,
    date: provenance.date ?? null,
    files: { design: provenance.designFile, measurements: provenance.measurementsFile },
    seed: r.seed,
    trials: r.trials,
    ambientC: run.prediction.ambientC,
    ambientSource: run.prediction.ambientSource,
    alpha: 0.05,
    targetYieldPct: run.targetYieldPct,
    outputs,
    methods: METHOD_NOTES,
    notes: run.notes,
    cautions: run.cautions,
  };
}
