/**
 * The exported report: one self-contained HTML file (inline styles, plots as PNG data URLs, no scripts,
 * no external references). Every string that came from the user or their files is escaped.
 */
import { Chart, type ChartConfiguration, type Plugin } from 'chart.js';
import { PRESSURE_SAFETY_CAUTION } from '../../core/safety';
import type { AppState } from '../app-state';
import { breakdownConfig, fingerprintConfig, fitConfig, recordingConfig, residualConfig } from '../charts/configs';
import { LIGHT_COLORS } from '../charts/theme';
import { escapeHtml as h } from '../helpers/escape';
import { COMPLIANCE_UNIT, displayUnitOf, fmt, fmtCi, fmtSeconds, QUANTITY_LABEL, RESISTANCE_UNIT, volumeUnitFor } from '../helpers/format';

/** Most steps drawn individually in a report (all appear in the table). */
export const MAX_STEP_PLOTS = 12;

const whiteBackground: Plugin = {
  id: 'reportBackground',
  beforeDraw(chart) {
    const { ctx, width, height } = chart;
    ctx.save();
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, width, height);
    ctx.restore();
  },
};

/** Draws a chart off screen and returns it as a PNG data URL. */
function png(config: ChartConfiguration, width: number, height: number): string {
  const host = document.createElement('div');
  host.style.position = 'absolute';
  host.style.left = '-20000px';
  host.style.width = `${width}px`;
  host.style.height = `${height}px`;
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  host.append(canvas);
  document.body.append(host);
  const chart = new Chart(canvas, { ...config, options: { ...config.options, responsive: false, animation: false, devicePixelRatio: 2 }, plugins: [...(config.plugins ?? []), whiteBackground] } as ChartConfiguration);
  const url = chart.toBase64Image('image/png');
  chart.destroy();
  host.remove();
  return url;
}

const STYLE = `
body{font:14px/1.5 system-ui,-apple-system,'Segoe UI','DejaVu Sans',sans-serif;color:#18201d;background:#fff;max-width:1100px;margin:24px auto;padding:0 24px}
h1{font-size:24px;margin:0 0 4px}h2{font-size:18px;margin:28px 0 8px;border-bottom:2px solid #0d7466;padding-bottom:3px}h3{font-size:15px;margin:18px 0 6px}
table{border-collapse:collapse;width:100%;font-size:13px;margin:6px 0}th,td{border-bottom:1px solid #d5dcd9;padding:4px 7px;text-align:left;vertical-align:top}
th{font-size:12px;color:#4a5752}td.n{text-align:right;font-family:ui-monospace,'DejaVu Sans Mono',monospace}
.caution{background:#fff4de;border:1px solid #9a5b00;border-radius:6px;padding:8px 12px;margin:10px 0}
.muted{color:#6d7a75}.mono{font-family:ui-monospace,'DejaVu Sans Mono',monospace;font-size:12px;word-break:break-all}
img{max-width:100%;height:auto;border:1px solid #e2e7e5;border-radius:4px;margin:4px 0}
.concl{border-left:4px solid #0d7466;background:#f3f7f5;padding:8px 12px}.na{border:1px dashed #999;padding:8px 12px;color:#4a5752}
.flag{display:inline-block;border:1px solid #9a5b00;color:#9a5b00;border-radius:9px;padding:0 6px;font-size:11px;margin:1px}
`;

export async function buildReportHtml(s: AppState): Promise<string> {
  const a = s.analysis;
  if (!a || !s.recording || !s.overview) throw new Error('Nothing to report yet.');
  const rec = s.recording;
  const parts: string[] = [];
  const caution = `<p class="caution"><strong>Safety.</strong> ${h(PRESSURE_SAFETY_CAUTION)}</p>`;
  parts.push(`<h1>Lagbench analysis report</h1><p class="muted">Generated ${h(new Date().toISOString())} by the Lagbench desktop app. SI inside; shown in mbar, µL/min, nL/mbar.</p>`, caution);

  parts.push('<h2>Inputs</h2><table><tr><th>Log</th><th>Bytes</th><th>SHA-256</th></tr>');
  for (const f of s.files) parts.push(`<tr><td>${h(f.path)}</td><td class="n">${f.bytes.length}</td><td class="mono">${h(f.sha256)}</td></tr>`);
  parts.push('</table>');
  parts.push(`<p>Setup: <strong>${h(a.setup)}</strong>. Chip description: ${s.chip ? `${h(s.chip.path)} <span class="mono">(SHA-256 ${h(s.chip.sha256)})</span>` : 'none'}. Fit model: ${h(String(s.fit.terms))} term(s)${s.fit.deadTime ? ', dead time' : ''}${s.fit.drift ? ', drift' : ''}.</p>`);
  parts.push('<h3>Channels</h3><table><tr><th>Channel</th><th>Quantity</th><th>Header in the file</th><th>Unit in the file</th></tr>');
  for (const c of rec.channels) parts.push(`<tr><td class="mono">${h(c.name)}</td><td>${h(QUANTITY_LABEL[c.quantity])}</td><td>${h(c.originalHeader)}</td><td>${h(c.originalUnit)}</td></tr>`);
  parts.push(`</table><p class="muted">${rec.sampleCount} samples over ${h(fmt(rec.durationS, 5))} s.</p>`);

  parts.push('<h2>Recording and steps</h2>');
  parts.push(`<img alt="Recording with step markers" src="${png(recordingConfig(s.overview, rec.channels, s.steps.map((x) => x.onsetS), null, LIGHT_COLORS, false) as ChartConfiguration, 1000, 380)}">`);
  if (s.stepEdits.length) {
    parts.push(`<p>Steps were edited by hand (${s.stepEdits.length} edit(s)):</p><ul>`);
    for (const e of s.stepEdits) parts.push(`<li>${e.action === 'move' ? `moved ${h(fmt(e.fromS, 6))} s → ${h(fmt(e.toS, 6))} s` : `${e.action === 'add' ? 'added' : 'deleted'} at ${h(fmt(e.atS, 6))} s`}</li>`);
    parts.push('</ul>');
  }
  parts.push('<table><tr><th>Step</th><th>Onset (s)</th><th>Drive</th><th>τ (95 % CI)</th><th>Settled</th><th>Fit</th><th>R</th><th>C</th></tr>');
  for (const f of a.fits) {
    const st = s.steps[f.stepIndex];
    const du = st ? displayUnitOf(st.drive.quantity) : null;
    const drive = st && du && Number.isFinite(st.drive.before) ? `${fmt(st.drive.before * du.fromSi)} → ${fmt(st.drive.after * du.fromSi)} ${du.label}` : '—';
    const taus = f.fit ? f.fit.terms.map((t) => `${fmtSeconds(t.tauS.value, 4)} [${fmtSeconds(t.tauS.ci95[0])}, ${fmtSeconds(t.tauS.ci95[1])}]`).join('<br>') : h(f.error ?? 'no fit');
    const flags = f.fit?.flags.map((x) => `<span class="flag">${h(x.code)}</span>`).join(' ') ?? '';
    parts.push(`<tr><td>S${f.stepIndex + 1}${st?.origin === 'user' ? ' (edited)' : ''}</td><td class="n">${h(fmt(f.onsetS, 6))}</td><td>${h(drive)}</td><td class="n">${taus}</td><td>${f.fit ? (f.fit.settled ? 'yes' : 'no') : '—'}</td><td>${f.fit ? (f.fit.converged ? 'converged' : 'not converged') : '—'} ${flags}</td><td class="n">${f.resistancePaSPerM3 ? h(fmtCi(f.resistancePaSPerM3.value, f.resistancePaSPerM3.ci95, RESISTANCE_UNIT)) : '—'}</td><td class="n">${f.complianceM3PerPa ? h(fmtCi(f.complianceM3PerPa.value, f.complianceM3PerPa.ci95, COMPLIANCE_UNIT)) + (f.complianceM3PerPa.inconclusive ? ' (inconclusive)' : '') : '—'}</td></tr>`);
  }
  parts.push('</table>');

  parts.push('<h2>Step fits</h2>');
  for (const f of a.fits.slice(0, MAX_STEP_PLOTS)) {
    parts.push(`<h3>Step S${f.stepIndex + 1} at ${h(fmt(f.onsetS, 6))} s</h3>`);
    if (!f.fit) {
      parts.push(`<p class="na">${h(f.error ?? 'No fit.')}</p>`);
      continue;
    }
    parts.push(`<img alt="Step S${f.stepIndex + 1} data and fit" src="${png(fitConfig(f, LIGHT_COLORS, false) as ChartConfiguration, 1000, 300)}">`);
    parts.push(`<img alt="Step S${f.stepIndex + 1} residuals" src="${png(residualConfig(f, LIGHT_COLORS, false) as ChartConfiguration, 1000, 150)}">`);
    const fl = f.fit.flags;
    parts.push(`<p>${f.fit.iterations} iterations, ${h(f.fit.stopReason)}; RMSE ${h(fmt(f.fit.rmse * displayUnitOf(f.responseQuantity).fromSi))} ${h(displayUnitOf(f.responseQuantity).label)}, R² ${h(fmt(f.fit.r2, 5))}; window ${h(fmt(f.fit.windowInTaus, 3))} τ.</p>`);
    if (fl.length) parts.push(`<ul>${fl.map((x) => `<li><span class="flag">${h(x.code)}</span> ${h(x.message)}</li>`).join('')}</ul>`);
  }
  if (a.fits.length > MAX_STEP_PLOTS) parts.push(`<p class="muted">${a.fits.length - MAX_STEP_PLOTS} more step(s) are in the table above.</p>`);

  parts.push('<h2>Diagnosis</h2>');
  const fitted = a.fittedComplianceM3PerPa;
  parts.push(`<p>Fitted compliance (all conclusive steps): <strong>${fitted ? h(fmtCi(fitted.value, fitted.ci95, COMPLIANCE_UNIT)) : 'not determined'}</strong>.</p>`);
  if (a.nominal) {
    parts.push(`<p>Nominal compliance from the chip description: ${h(fmt(a.nominal.complianceM3PerPa * COMPLIANCE_UNIT.fromSi))} ${h(COMPLIANCE_UNIT.label)}; nominal resistance ${h(fmt(a.nominal.resistancePaSPerM3 * RESISTANCE_UNIT.fromSi))} ${h(RESISTANCE_UNIT.label)}.</p>`);
    const bd = breakdownConfig(a, LIGHT_COLORS, false);
    if (bd) parts.push(`<img alt="Compliance breakdown" src="${png(bd as ChartConfiguration, 1000, 320)}">`);
    parts.push('<table><tr><th>Source</th><th>Nominal C</th><th>Range</th></tr>');
    for (const b of a.nominal.breakdown) parts.push(`<tr><td>${h(b.source)}</td><td class="n">${h(fmt(b.valueM3PerPa * COMPLIANCE_UNIT.fromSi))} ${h(COMPLIANCE_UNIT.label)}</td><td class="n">${b.rangeM3PerPa ? `${h(fmt(b.rangeM3PerPa[0] * COMPLIANCE_UNIT.fromSi))}–${h(fmt(b.rangeM3PerPa[1] * COMPLIANCE_UNIT.fromSi))}` : '—'}</td></tr>`);
    parts.push('</table>');
  } else parts.push(`<p class="na">${h(a.nominalNote ?? 'No nominal prediction.')}</p>`);
  if (a.fingerprint) parts.push('<h3>Pressure fingerprint</h3>', `<img alt="C against 1/p_abs squared" src="${png(fingerprintConfig(a.fingerprint, LIGHT_COLORS, false) as ChartConfiguration, 800, 320)}">`);
  else parts.push(`<p class="na">${h(a.fingerprintNote ?? 'Pressure fingerprint not available.')}</p>`);
  parts.push('<h3>Trapped air</h3>');
  if (a.trappedAir) {
    const v = a.trappedAir.volumeM3AtAtm;
    parts.push(`<p>Volume at atmospheric pressure: <strong>${h(fmtCi(v.value, v.ci95, volumeUnitFor(v.value)))}</strong> (95 % CI; ${h(a.trappedAir.method)}).</p><p class="concl">${h(a.trappedAir.conclusion)}</p>`);
  } else parts.push(`<p class="na">${h(a.trappedAirNote ?? 'Trapped-air estimate not available.')}</p>`);

  if (a.warnings.length) {
    parts.push('<h2>Warnings</h2><ul>');
    for (const w of a.warnings) parts.push(`<li>${h(w.message)}</li>`);
    parts.push('</ul>');
  }
  parts.push(caution);
  const title = `Lagbench report — ${s.files.map((f) => f.name).join(' + ')}`;
  return `<!doctype html>\n<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><meta http-equiv="Content-Security-Policy" content="default-src 'none'; img-src data:; style-src 'unsafe-inline'"><title>${h(title)}</title><style>${STYLE}</style></head><body>\n${parts.join('\n')}\n</body></html>\n`;
}
