/**
 * Diagnosis view: fitted vs nominal compliance broken down by source, the C vs 1/p_abs² pressure
 * fingerprint, and the trapped-air estimate with its CI and a plain-language conclusion.
 */
import { Chart } from 'chart.js';
import type { App } from '../app';
import { breakdownConfig, fingerprintConfig } from '../charts/configs';
import { pageColors } from '../charts/theme';
import { clear, el } from '../helpers/dom';
import { COMPLIANCE_UNIT, fmt, fmtCi, fmtSeconds, RESISTANCE_UNIT, volumeUnitFor } from '../helpers/format';
import { button, canvasBox, caution, emptyState, notice, viewHead } from './common';
import { setupSchematic } from './schematic';

export function renderDiagnosisView(app: App, root: HTMLElement): void {
  clear(root);
  const s = app.state;
  root.append(viewHead('h-diagnosis', 'Diagnosis', 'Why is the device slow? The fitted compliance against what the design should give, and whether trapped air explains the difference.'));
  const a = s.analysis;
  if (!a) {
    root.append(emptyState('No analysis yet', 'Open a log and let the fits finish.', button('Open logs…', () => void app.openLogsDialog(), 'btn primary')));
    return;
  }
  const makers: Array<() => Chart> = [];
  const colors = pageColors();

  // Setup and compliance summary.
  const fitted = a.fittedComplianceM3PerPa;
  const summary = el('section', { class: 'panel', 'aria-label': 'Setup and compliance' },
    el('h3', { text: `Setup: ${a.setup}` }),
    setupSchematic(a.setup),
    el('dl', { class: 'kv', 'data-testid': 'compliance-summary' },
      el('dt', { text: 'Fitted C (all steps)' }), el('dd', { text: fitted ? fmtCi(fitted.value, fitted.ci95, COMPLIANCE_UNIT) : 'not determined (no conclusive step)' }),
      ...(a.nominal ? [
        el('dt', { text: 'Nominal C' }), el('dd', { text: `${fmt(a.nominal.complianceM3PerPa * COMPLIANCE_UNIT.fromSi)} ${COMPLIANCE_UNIT.label}${a.nominal.complianceRangeM3PerPa ? ` (range ${fmt(a.nominal.complianceRangeM3PerPa[0] * COMPLIANCE_UNIT.fromSi)}–${fmt(a.nominal.complianceRangeM3PerPa[1] * COMPLIANCE_UNIT.fromSi)})` : ''}` }),
        el('dt', { text: 'Nominal R (total)' }), el('dd', { text: `${fmt(a.nominal.resistancePaSPerM3 * RESISTANCE_UNIT.fromSi)} ${RESISTANCE_UNIT.label}` }),
        ...(a.nominal.tauS !== null ? [el('dt', { text: 'Nominal τ' }), el('dd', { text: fmtSeconds(a.nominal.tauS) })] : []),
      ] : []),
    ),
  );
  const bd = breakdownConfig(a, colors, true);
  const breakdownPanel = el('section', { class: 'panel', 'aria-label': 'Compliance breakdown' }, el('h3', { text: 'Compliance by source: nominal vs fitted' }));
  if (bd) {
    const c = canvasBox('mid', 'Compliance breakdown by source, nominal against fitted', 'breakdown-chart');
    breakdownPanel.append(c.box);
    makers.push(() => new Chart(c.canvas, bd));
    if (a.nominal?.notes.length) breakdownPanel.append(el('details', {}, el('summary', { text: `Notes on the prediction (${a.nominal.notes.length})` }), el('ul', { class: 'warn-list' }, ...a.nominal.notes.map((n) => el('li', { text: n })))));
  } else breakdownPanel.append(notice('unavailable', a.nominalNote ?? 'No nominal prediction.'), button('Load chip JSON…', () => void app.openChipDialog(), 'btn small'));
  root.append(el('div', { class: 'grid-2' }, summary, breakdownPanel));

  // Fingerprint.
  const fpPanel = el('section', { class: 'panel', 'aria-label': 'Pressure fingerprint' }, el('h3', { text: 'Pressure fingerprint: C against 1/p_abs²' }),
    el('p', { class: 'small muted', text: 'Gas compliance falls as 1/p_abs² while walls and liquid stay flat: with steps at several pressures, the slope is the trapped gas.' }));
  if (a.fingerprint) {
    const c = canvasBox('mid', 'Compliance against inverse squared absolute pressure', 'fingerprint-chart');
    fpPanel.append(c.box, el('dl', { class: 'kv' },
      el('dt', { text: 'C_rigid' }), el('dd', { text: fmtCi(a.fingerprint.cRigidM3PerPa.value, a.fingerprint.cRigidM3PerPa.ci95, COMPLIANCE_UNIT) }),
      el('dt', { text: 'V_atm' }), el('dd', { text: fmtCi(a.fingerprint.vAtmM3.value, a.fingerprint.vAtmM3.ci95, volumeUnitFor(a.fingerprint.vAtmM3.value)) })));
    const fp = a.fingerprint;
    makers.push(() => new Chart(c.canvas, fingerprintConfig(fp, colors, true)));
  } else fpPanel.append(notice('unavailable', a.fingerprintNote ?? 'Not available.'));

  // Trapped air.
  const airPanel = el('section', { class: 'panel', 'aria-label': 'Trapped air', 'data-testid': 'trapped-air' }, el('h3', { text: 'Trapped air' }));
  const air = a.trappedAir;
  if (air) {
    const u = volumeUnitFor(air.volumeM3AtAtm.value);
    airPanel.append(
      el('div', { class: 'big-number', 'data-testid': 'trapped-air-volume', 'data-si': String(air.volumeM3AtAtm.value), 'data-lo': String(air.volumeM3AtAtm.ci95[0]), 'data-hi': String(air.volumeM3AtAtm.ci95[1]), text: fmtCi(air.volumeM3AtAtm.value, air.volumeM3AtAtm.ci95, u) }),
      el('p', { class: 'small muted', text: `at atmospheric pressure (95 % CI) · method: ${air.method}` }),
      ...(air.volumeM3AtWorking ? [el('p', { class: 'small', text: `At the working pressure: ${fmtCi(air.volumeM3AtWorking.value, air.volumeM3AtWorking.ci95, volumeUnitFor(air.volumeM3AtWorking.value))}` })] : []),
      el('p', { class: 'conclusion', 'data-testid': 'trapped-air-conclusion', text: air.conclusion }),
    );
  } else airPanel.append(notice('unavailable', a.trappedAirNote ?? 'Not available.'));
  root.append(el('div', { class: 'grid-2' }, fpPanel, airPanel));
  root.append(caution());
  // Charts are made once their canvases are in the document.
  app.keepCharts('diagnosis', makers.map((make) => make()));
}
