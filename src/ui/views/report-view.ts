/** Report view: what the exported report will hold, and the export and save buttons. */
import type { App } from '../app';
import { clear, el } from '../helpers/dom';
import { button, caution, emptyState, viewHead } from './common';

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
  root.append(caution());
}
