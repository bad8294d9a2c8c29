/**
 * The per-chip QC report as one self-contained HTML page: verdict with a reason per limit and the
 * stated rule, step plots with the fit overlay and residuals, the nominal-vs-fitted compliance
 * breakdown, the trapped-air estimate, fit quality, the test spec and the traceability block.
 */
import { formatNumber } from '../core/qc/format';
import { QC_QUANTITIES, type CheckResult, type QcSpec } from '../core/qc/types';
import { QC_QUANTITY_LABEL } from '../core/qc/units';
import { escapeHtml } from './escape';
import { badge, htmlPage } from './html-shell';
import { renderBarChart, renderXyChart, type Series } from './svg';
import { displayFor, traceabilityTable } from './sections';
import { displayUnit, showCi, showMeasured, showValue } from './display';
import type { ChipReportInput, StepPlot } from './types';

function checkRow(r: CheckResult, spec: QcSpec): string {
  const d = displayFor(r.check, spec);
  const limit = r.lower === null && r.upper === null ? '—' : `${r.lower === null ? '−∞' : showValue(r.lower, d)} … ${r.upper === null ? '∞' : showValue(r.upper, d)}`;
  return `<tr><td>${escapeHtml(r.label)}</td><td class="num">${escapeHtml(showValue(r.value, d))}</td><td class="num">${escapeHtml(showCi(r.ci95, d))}</td><td class="num">${escapeHtml(limit)}</td><td>${escapeHtml(d.symbol)}</td><td>${badge(r.verdict)}</td><td>${escapeHtml(r.reason)}</td></tr>`;
}

function stepSection(s: StepPlot, k: number): string {
  const x = [...s.tS];
  const y = s.y.map((v) => v / s.displayScale);
  const series: Series[] = [{ name: 'measured', x, y, kind: 'points', colour: '#3b6ea8' }];
  const parts: string[] = [];
  if (s.fitY) series.push({ name: 'fit', x, y: s.fitY.map((v) => v / s.displayScale), kind: 'line' as const, colour: '#d9480f' } as never);
  parts.push(renderXyChart({ title: s.title, xLabel: 'time since step onset (s)', yLabel: s.displayUnit, series }));
  if (s.fitY) {
    const fit = s.fitY;
    const res = s.y.map((v, i) => (v - (fit[i] ?? Number.NaN)) / s.displayScale);
    parts.push(renderXyChart({ title: `Residuals (measured − fit), step ${k + 1}`, xLabel: 'time since step onset (s)', yLabel: s.displayUnit, series: [{ name: 'residual', x, y: res, kind: 'points', colour: '#555' }], refLines: [{ y: 0, label: '0', colour: '#888' }], height: 200 }));
  }
  const tau = s.tauS ? ` τ = ${formatNumber(s.tauS.value)} s${s.tauS.ci95 ? `, 95 % CI [${formatNumber(s.tauS.ci95[0])}, ${formatNumber(s.tauS.ci95[1])}] s` : ''}.` : '';
  return `<section><p class="sub">${escapeHtml(`${s.title}.${tau}`)}</p>${parts.join('')}</section>`;
}

/** Renders the chip report. Pure: same input → same text. */
export function renderChipReportHtml(input: ChipReportInput): string {
  const { spec, measurement: m, evaluation: e, trace } = input;
  const body: string[] = [];
  body.push(`<h1>QC report — chip ${escapeHtml(trace.chipId)}</h1>`);
  body.push(`<p class="sub">${escapeHtml(spec.design.name)}${spec.design.revision ? ` rev. ${escapeHtml(spec.design.revision)}` : ''} · lot ${escapeHtml(trace.lot ?? '—')} · operator ${escapeHtml(trace.operator ?? '—')} · ${escapeHtml(trace.recordedAt)}</p>`);
  body.push(`<section><p>Verdict ${badge(e.verdict, true)} &nbsp; Disposition ${badge(e.disposition, true)}${e.verdict === 'inconclusive' ? ` <span class="sub">(inconclusive counts as “${escapeHtml(spec.inconclusiveCountsAs)}” under this spec)</span>` : ''}</p></section>`);
  body.push('<h2>Checks</h2>');
  body.push(`<table><thead><tr><th>Check</th><th>Value</th><th>95 % CI</th><th>Limit</th><th>Unit</th><th>Verdict</th><th>Reason</th></tr></thead><tbody>${e.results.map((r) => checkRow(r, spec)).join('')}</tbody></table>`);
  body.push(`<p class="rule"><strong>Decision rule.</strong> ${escapeHtml(e.rule)}</p>`);

  const rows = QC_QUANTITIES.filter((q) => m.quantities[q]).map((q) => {
    const mv = m.quantities[q];
    const d = displayUnit(q, spec);
    return `<tr><td>${escapeHtml(QC_QUANTITY_LABEL[q])}</td><td class="num">${escapeHtml(showValue(mv?.value, d))}</td><td class="num">${escapeHtml(showValue(mv?.standardError, d))}</td><td class="num">${escapeHtml(showCi(mv?.ci95, d))}</td><td>${escapeHtml(d.symbol)}</td></tr>`;
  });
  body.push('<h2>Measured quantities</h2>');
  body.push(rows.length ? `<table><thead><tr><th>Quantity</th><th>Value</th><th>Std. error</th><th>95 % CI</th><th>Unit</th></tr></thead><tbody>${rows.join('')}</tbody></table>` : '<p>No quantity could be measured.</p>');

  if (input.steps.length) {
    body.push('<h2 class="page-break">Steps, fits and residuals</h2>');
    input.steps.forEach((s, k) => body.push(stepSection(s, k)));
  }

  body.push('<h2>Compliance: nominal parts versus fitted total</h2>');
  if (input.breakdown) {
    const b = input.breakdown;
    const d = displayUnit('compliance', spec);
    const bars = b.parts.map((p) => ({ label: p.label, value: p.complianceM3PerPa, colour: '#7a9cc6' }));
    bars.push({ label: 'nominal total', value: b.nominalTotalM3PerPa, colour: '#3b6ea8' });
    if (b.fitted) bars.push({ label: 'fitted (measured)', value: b.fitted.value, colour: '#d9480f' });
    if (b.fitted) bars.push({ label: 'excess = fitted − nominal', value: b.fitted.value - b.nominalTotalM3PerPa, colour: '#b00020' });
    body.push(renderBarChart('Compliance breakdown', bars, d.symbol, d.scale));
    body.push(`<p class="sub">Fitted ${escapeHtml(showMeasured(b.fitted, d))}${b.fitted?.ci95 ? `, 95 % CI ${escapeHtml(showCi(b.fitted.ci95, d))} ${escapeHtml(d.symbol)}` : ''}; nominal ${escapeHtml(showValue(b.nominalTotalM3PerPa, d))} ${escapeHtml(d.symbol)}.</p>`);
  } else body.push('<p>No nominal prediction was available for this chip.</p>');

  body.push('<h2>Trapped air</h2>');
  if (input.trappedAir) {
    const t = input.trappedAir;
    const d = displayUnit('trapped_air', spec);
    body.push(`<p>Estimated trapped-air volume ${escapeHtml(showMeasured(t.volumeM3, d))}${t.volumeM3.ci95 ? `, 95 % CI ${escapeHtml(showCi(t.volumeM3.ci95, d))} ${escapeHtml(d.symbol)}` : ''}${t.absolutePressurePa !== null ? ` at ${escapeHtml(formatNumber(t.absolutePressurePa / 1000))} kPa absolute` : ''}. V ≈ C_excess·(p_abs − p_v), isothermal gas (physics reference §3.4).</p>`);
    if (t.note) body.push(`<p class="sub">${escapeHtml(t.note)}</p>`);
  } else body.push('<p>No trapped-air estimate was available.</p>');

  body.push('<h2>Fit quality and warnings</h2>');
  body.push(m.fit ? `<p>Converged: ${m.fit.converged ? 'yes' : 'no'}; r² = ${escapeHtml(formatNumber(m.fit.r2, 6))}; flags: ${escapeHtml(m.fit.flags.join(', ') || 'none')}.</p>` : '<p>No fit.</p>');
  if (m.inconclusive.length) body.push(`<ul>${m.inconclusive.map((x) => `<li>${escapeHtml(`${x.quantity ? `${x.quantity}: ` : ''}${x.reason}`)}</li>`).join('')}</ul>`);
  if (m.warnings.length) body.push(`<ul>${m.warnings.map((w) => `<li>${escapeHtml(w)}</li>`).join('')}</ul>`);

  body.push('<h2>Test specification</h2>');
  body.push(`<table><tbody><tr><th>Design</th><td>${escapeHtml(spec.design.name)}${spec.design.revision ? ` rev. ${escapeHtml(spec.design.revision)}` : ''}</td></tr><tr><th>Set-up</th><td>${escapeHtml(spec.test.setup)}</td></tr><tr><th>Program</th><td>${escapeHtml(spec.test.program)}</td></tr>${spec.test.notes ? `<tr><th>Notes</th><td>${escapeHtml(spec.test.notes)}</td></tr>` : ''}</tbody></table>`);

  body.push('<h2>Traceability</h2>');
  body.push(traceabilityTable(trace));
  return htmlPage(`QC ${trace.chipId} — ${e.verdict}`, body.join('\n'));
}
