// A pilot study as one self-contained HTML file (inline CSS and SVG, no script): provenance (date, version, SHA-256
// of both input files), then per measured output the strip of units over the predicted histogram (pilot-svg.ts), the
// figures (pilot-figures.ts, the rows the terminal shows), the diagnosis, the re-centring and the findings.
// Figure cells carry `td[data-field][data-value]` with the exact numbers.
import type { PilotOutput, PilotRun } from '../pilot/study.js';
import { escapeHtml, exact, htmlDocumentHead } from './html-escape.js';
import { pilotFigures, pilotTitle, windowText, type PilotProvenance } from './pilot-figures.js';
import { renderPilotSvg } from './pilot-svg.js';
import { DIAGNOSIS_ROWS, METHOD_NOTES } from './pilot-text.js';

const STYLE = `
body{font:14px/1.45 system-ui,-apple-system,"Segoe UI",sans-serif;margin:24px auto;max-width:1100px;color:#1b1f24;padding:0 16px}
h1{font-size:22px;margin:0 0 4px}h2{font-size:18px;margin:28px 0 8px;border-bottom:1px solid #d0d7de;padding-bottom:4px}
h3{font-size:15px;margin:14px 0 6px}
table{border-collapse:collapse;margin:6px 0 12px}th,td{border:1px solid #d0d7de;padding:3px 8px;text-align:left;vertical-align:top}
th{background:#f3f5f7;font-weight:normal}td.num{font-variant-numeric:tabular-nums}
.caution{border:2px solid #b35900;background:#fff4e5;padding:8px 12px;margin:12px 0}
.meta{color:#57606a}code{font-size:12px}
svg{background:#fff;border:1px solid #e1e4e8}
svg text{font:11px system-ui,sans-serif;fill:#1b1f24}
svg .bin{fill:#9db7d5}svg .unit{fill:#1b1f24}svg .unit.out-of-spec{fill:#c0392b}svg .unit.outlier{stroke:#b35900;stroke-width:2}
svg .interval-band{fill:#f2c94c;fill-opacity:.3}svg .axis{stroke:#57606a}
svg .marker.spec line{stroke:#c0392b;stroke-width:2;stroke-dasharray:6 3}
svg .marker.nominal line{stroke:#4878a8;stroke-width:1.5;stroke-dasharray:2 2}
svg .marker.measured line{stroke:#1b1f24;stroke-width:1.5}
svg .marker.recentred line{stroke:#2e8b57;stroke-width:2;stroke-dasharray:4 2}
`;

const signedBands = (x: number): string => `${x >= 0 ? '+' : '−'}${Math.abs(x).toFixed(2)}`;

/** The parts that could explain a significant shift: each alone (in units of its band), then the least-squares mix. */
function diagnosisHtml(out: PilotOutput): string {
  const d = out.diagnosis;
  if (!out.tests.meanShift.significant || d.singleParts.length === 0) return '';
  const rows = d.singleParts.slice(0, DIAGNOSIS_ROWS).map(
    (p) => `<tr data-part="${escapeHtml(p.part)}"><td>${escapeHtml(p.part)}</td><td class="num" data-value="${exact(p.bands)}">${signedBands(p.bands)}</td><td>${p.plausible ? 'yes: inside its band' : 'no'}</td></tr>`,
  );
  const mix = d.leastSquares.filter((x) => Math.abs(x.bands) >= 0.005).slice(0, DIAGNOSIS_ROWS);
  return `<h3>What could explain the shift</h3>
<table class="diagnosis"><thead><tr><th>part</th><th>deviation that alone explains it, in bands (±1 = the band's edge)</th><th>plausible</th></tr></thead><tbody>
${rows.join('\n')}
</tbody></table>
${d.singleParts.length > DIAGNOSIS_ROWS ? `<p class="meta">${d.singleParts.length - DIAGNOSIS_ROWS} more parts, each needing more.</p>` : ''}
${mix.length > 0 ? `<p>Least-squares combination, one explanation among many: ${escapeHtml(mix.map((x) => `${x.part} ${signedBands(x.bands)}`).join(', '))}.</p>` : ''}`;
}

function outputSection(out: PilotOutput): string {
  const rows = pilotFigures(out).map(
    (f) => `<tr><th scope="row">${escapeHtml(f.label)}</th><td class="num" data-field="${f.field}" data-value="${f.values.map(exact).join(' ')}">${escapeHtml(f.text)}</td></tr>`,
  );
  return `<section class="output" id="output-${escapeHtml(out.name)}" data-output="${escapeHtml(out.name)}">
<h2>${escapeHtml(pilotTitle(out))}</h2>
<p class="meta">Spec window ${escapeHtml(windowText(out))}.</p>
${renderPilotSvg(out)}
<table class="figures"><tbody>
${rows.join('\n')}
</tbody></table>
${diagnosisHtml(out)}
<h3>Re-centring</h3><p class="recentre">${escapeHtml(out.recentreNote)}</p>
<h3>Findings</h3><ul class="findings">${out.findings.map((f) => `<li>${escapeHtml(f)}</li>`).join('')}</ul>
</section>`;
}

export function renderPilotHtml(run: PilotRun, provenance: PilotProvenance): string {
  const r = run.prediction.result;
  const title = `trimfree pilot report: ${provenance.designFile.path} against ${provenance.measurementsFile.path}`;
  return `${htmlDocumentHead(title, provenance.version, STYLE)}
<body data-seed="${escapeHtml(r.seed)}" data-trials="${r.trials}" data-version="${escapeHtml(provenance.version)}">
<h1>${escapeHtml(title)}</h1>
<table id="provenance"><tbody>
<tr><th>made</th><td>${escapeHtml(provenance.date ?? '—')} by trimfree ${escapeHtml(provenance.version)}</td></tr>
<tr><th>design file</th><td><code>${escapeHtml(provenance.designFile.path)}</code> SHA-256 <code data-sha256="${provenance.designFile.sha256}">${provenance.designFile.sha256}</code></td></tr>
<tr><th>measurements</th><td><code>${escapeHtml(provenance.measurementsFile.path)}</code> SHA-256 <code data-sha256="${provenance.measurementsFile.sha256}">${provenance.measurementsFile.sha256}</code></td></tr>
<tr><th>prediction</th><td>${run.measurements.unitIds.length} units against Monte Carlo ${r.trials.toLocaleString('en-US')} trials, seed ${escapeHtml(JSON.stringify(r.seed))}, ambient ${run.prediction.ambientC.toFixed(1)} °C</td></tr>
</tbody></table>
${run.cautions.length > 0 ? `<div class="caution" id="caution"><strong>Caution</strong><ul>${run.cautions.map((c) => `<li>${escapeHtml(c)}</li>`).join('')}</ul></div>` : ''}
${run.outputs.map(outputSection).join('\n')}
<h2>How it was obtained</h2>
<ul id="method">${[...METHOD_NOTES, ...run.notes].map((m) => `<li>${escapeHtml(m)}</li>`).join('')}</ul>
${provenance.command ? `<p class="meta">Command: <code>${escapeHtml(provenance.command)}</code></p>` : ''}
<p class="meta">Results describe the model and its stated tolerances only; check every part against its datasheet.</p>
</body>
</html>
`;
}
