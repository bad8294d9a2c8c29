/** Report view: what the exported report will hold, and the export and save buttons. */
import type { App } from '../app';
import { clear, el } from '../helpers/dom';
import { button, caution, emptyState, viewHead } from './common';
import { COMPLIANCE_UNIT, fmt, fmtCi, fmtSeconds, volumeUnitFor } from '../helpers/format';

export function renderReportView(app: App, root: HTMLElement): void {
  clear(root);
  const s = app.state;
  const desktop = app.api.platform === 'desktop';
  root.append(viewHead('h-report', 'Report', 'A self-contained HTML file: inputs with their SHA-256, every plot as an image, the fits, the diagnosis and the cautions. It opens in any browser, offline.'));
  if (!s.analysis) {
    root.append(emptyState('Nothing to report yet', 'Open a log and let the analysis finish.', button('Open logs…', () => void app.openLogsDialog(), 'btn primary')));
    return;
  }
  const a = s.analysis;
  const ok = a.fits.filter((f) => f.fit?.converged).length;
  root.append(el('section', { class: 'panel' },
    el('h3', { text: 'Contents' }),
    el('ul', {},
      el('li', { text: `Inputs: ${s.files.map((f) => f.name).join(', ')}${s.chip ? `; chip description ${s.chip.name}` : ''}` }),
      el('li', { text: `Recording plot with ${s.steps.length} step(s)${s.stepEdits.length ? ` (${s.stepEdits.length} manual edit(s), listed)` : ''}` }),
      el('li', { text: `${a.fits.length} step fit(s), ${ok} converged, with residual plots and flags` }),
      el('li', { text: `Diagnosis: ${a.nominal ? 'nominal breakdown' : 'no nominal prediction'}; ${a.trappedAir ? 'trapped-air estimate' : 'trapped air not available'}` }),
      el('li', { text: 'The pressure-safety caution' }),
    ),
    el('div', { class: 'inline' },
      button(desktop ? 'Export report…' : 'Download report (HTML)', () => void app.exportReport(), 'btn primary', { 'data-testid': 'export-report' }),
      button(desktop ? 'Save work…' : 'Download work file', () => void app.saveWork(), 'btn', { 'data-testid': 'save-work' })),
  ));
  root.append(el('section', { class: 'panel', 'aria-label': 'Key results' },
    el('h3', { text: 'Key results' }),
    el('table', {},
      el('thead', {}, el('tr', {}, ...['Step', 'Onset (s)', 'τ (95 % CI)', 'Settled', `C (${COMPLIANCE_UNIT.label})`, 'Flags'].map((h) => el('th', { text: h })))),
      el('tbody', {}, ...a.fits.slice(0, 50).map((f) => {
        const slow = f.fit?.terms.at(-1);
        return el('tr', {},
          el('td', { text: `S${f.stepIndex + 1}` }),
          el('td', { class: 'num', text: fmt(f.onsetS, 6) }),
          el('td', { class: 'num', text: slow ? `${fmtSeconds(slow.tauS.value, 4)} [${fmtSeconds(slow.tauS.ci95[0])}, ${fmtSeconds(slow.tauS.ci95[1])}]` : 'no fit' }),
          el('td', { text: f.fit ? (f.fit.settled ? 'yes' : 'no') : '—' }),
          el('td', { class: 'num', text: f.complianceM3PerPa ? fmtCi(f.complianceM3PerPa.value, f.complianceM3PerPa.ci95, { label: '', fromSi: COMPLIANCE_UNIT.fromSi }) : '—' }),
          el('td', { text: f.fit?.flags.map((x) => x.code).join(', ') || '—' }));
      }))),
    a.fits.length > 50 ? el('p', { class: 'small muted', text: `… and ${a.fits.length - 50} more in the report.` }) : null,
    el('p', { class: 'conclusion', text: a.trappedAir ? `Trapped air: ${fmtCi(a.trappedAir.volumeM3AtAtm.value, a.trappedAir.volumeM3AtAtm.ci95, volumeUnitFor(a.trappedAir.volumeM3AtAtm.value))} at atmospheric pressure. ${a.trappedAir.conclusion}` : (a.trappedAirNote ?? 'Trapped air not assessed.') }),
  ));
  root.append(caution());
}
