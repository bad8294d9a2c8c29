/**
 * QC sign-off screen: judge the current analysis against an acceptance spec (core evaluateChip on
 * measurementFromAnalysis, computed in the worker), sign the chip off into the record store the CLI
 * uses (through window.lagbench.qc: IPC in the desktop app, the local bridge in the browser tests),
 * browse the history with the control charts of R and C across lots, and export the chip and lot
 * reports (src/report).
 */
import { Chart, type ChartConfiguration } from 'chart.js';
import type { QcInfo, SignOffReply } from '../../../electron/ipc';
import { chipIdFor, fileStem } from '../../core/qc/chip-id';
import type { ControlCharts } from '../../core/qc/lot-summary';
import { parseQcSpec } from '../../core/qc/spec';
import type { ChipEvaluation, QcRecord, QcSpec } from '../../core/qc/types';
import { evaluateChip, VERDICT_RULE } from '../../core/qc/verdict';
import type { AnalysedChip } from '../../report/chip-input';
import { renderChipReportHtml } from '../../report/chip-report';
import { chipChecksCsv, historyCsv } from '../../report/exports';
import { renderLotReportHtml } from '../../report/lot-report';
import { displayFor } from '../../report/sections';
import { showCi, showValue } from '../../report/display';
import type { LotReportInput } from '../../report/types';
import type { App } from '../app';
import { errorText } from '../app';
import { pageColors, type ChartColors } from '../charts/theme';
import { clear, el } from '../helpers/dom';
import { COMPLIANCE_UNIT, fmt, RESISTANCE_UNIT } from '../helpers/format';
import { EXAMPLE_SPECS, type BundledFile } from '../whatif/examples';
import { button, canvasBox, caution, emptyState, notice, viewHead } from './common';

interface SignOffState {
  spec: (BundledFile & { parsed: QcSpec | null; error: string | null }) | null;
  chipId: string;
  lot: string;
  operator: string;
  /** The analysed chip and its evaluation, for the analysis run they were made from. */
  chip: (AnalysedChip & { setup: string }) | null;
  evaluation: ChipEvaluation | null;
  evaluatedRun: number;
  evaluatedChipId: string;
  info: QcInfo | null;
  signed: SignOffReply | null;
  filters: { lot: string; chip: string; since: string };
  history: QcRecord[] | null;
  lotReport: LotReportInput | null;
  busy: boolean;
  error: string | null;
}

export const signOff: SignOffState = {
  spec: null, chipId: '', lot: '', operator: '', chip: null, evaluation: null, evaluatedRun: -1, evaluatedChipId: '', info: null, signed: null,
  filters: { lot: '', chip: '', since: '' }, history: null, lotReport: null, busy: false, error: null,
};

function chooseSpec(app: App, file: BundledFile): void {
  let parsed: QcSpec | null = null;
  let error: string | null = null;
  try {
    parsed = parseQcSpec(file.text, file.name);
  } catch (err) {
    error = errorText(err);
  }
  signOff.spec = { ...file, parsed, error };
  signOff.evaluation = null;
  signOff.evaluatedRun = -1;
  signOff.signed = null;
  if (parsed && signOff.chipId === '') signOff.chipId = defaultChipId(app, parsed);
  app.render();
}

/** A spec (.json) dropped while this view is shown becomes the acceptance spec, not a log to import. */
export function dropOnSignOff(app: App, list: FileList): boolean {
  const file = list[0];
  if (app.state.view !== 'signoff' || list.length !== 1 || !file || !/\.json$/i.test(file.name)) return false;
  void file.text().then((text) => chooseSpec(app, { name: file.name, text }));
  return true;
}

function defaultChipId(app: App, spec: QcSpec | null): string {
  const first = app.state.files[0];
  if (!first) return '';
  try {
    return chipIdFor(spec?.chipIdFrom ?? null, first.name, {});
  } catch {
    return fileStem(first.name);
  }
}

/** Fetches the analysed chip from the worker and judges it (pure core evaluateChip). */
async function evaluate(app: App): Promise<void> {
  const spec = signOff.spec?.parsed;
  if (!spec || !app.state.analysis || signOff.chipId.trim() === '') return;
  signOff.busy = true;
  try {
    const chip = await app.worker.request('qc-chip', { chipId: signOff.chipId.trim() });
    signOff.chip = chip;
    signOff.evaluation = evaluateChip(spec, chip.measurement);
    signOff.evaluatedRun = app.state.analysisRuns;
    signOff.evaluatedChipId = signOff.chipId.trim();
    signOff.error = null;
  } catch (err) {
    signOff.error = errorText(err);
  } finally {
    signOff.busy = false;
    app.render();
  }
}

async function ensureInfo(app: App): Promise<void> {
  if (signOff.info) return;
  signOff.info = app.api.qc ? await app.api.qc.info().catch((err: unknown) => ({ available: false as const, reason: errorText(err) })) : { available: false, reason: 'This build has no record store access. Use `lagbench qc`.' };
  app.render();
}

async function doSignOff(app: App): Promise<void> {
  const s = app.state;
  const spec = signOff.spec;
  const qc = app.api.qc;
  if (!spec?.parsed || !signOff.chip || !qc) return;
  if (signOff.operator.trim() === '') {
    signOff.error = 'Enter the operator before signing off.';
    app.render();
    return;
  }
  signOff.busy = true;
  app.render();
  try {
    const inputs = [...s.files.map((f) => ({ path: f.path, sha256: f.sha256 })), ...(s.chip ? [{ path: s.chip.path, sha256: s.chip.sha256 }] : [])];
    signOff.signed = await qc.signOff({
      specText: spec.text, specName: spec.name, chipId: signOff.evaluatedChipId, lot: signOff.lot.trim() || null, operator: signOff.operator.trim(),
      chip: { measurement: signOff.chip.measurement, steps: signOff.chip.steps, nominal: signOff.chip.nominal, trappedAirNote: signOff.chip.trappedAirNote },
      inputs,
      settings: { drive: s.setup, fit: { ...s.fit }, chip_description_sha256: s.chip?.sha256 ?? null, steps: s.steps.length, step_edits: s.stepEdits.length },
    });
    signOff.error = null;
    const r = signOff.signed.record;
    app.status(r.status === 'recorded' ? `Signed off ${signOff.evaluatedChipId}: record #${r.id}.` : `${signOff.evaluatedChipId} was already recorded (record #${r.id}); nothing added.`);
    await loadHistory(app);
  } catch (err) {
    signOff.error = `Not recorded: ${errorText(err)}`;
    app.status(signOff.error, true);
  } finally {
    signOff.busy = false;
    app.render();
  }
}

async function loadHistory(app: App): Promise<void> {
  const qc = app.api.qc;
  if (!qc) return;
  const f = signOff.filters;
  try {
    signOff.history = await qc.history({ ...(f.lot.trim() ? { lot: f.lot.trim() } : {}), ...(f.chip.trim() ? { chip: f.chip.trim() } : {}), ...(f.since.trim() ? { since: f.since.trim() } : {}) });
    const lot = f.lot.trim() || signOff.history.at(-1)?.lot || null;
    signOff.lotReport = lot ? await qc.lotReport(lot) : null;
    signOff.error = null;
    // Tests and assistive tools can tell a fresh history from the previous one.
    document.documentElement.dataset.historyLoads = String(Number(document.documentElement.dataset.historyLoads ?? '0') + 1);
  } catch (err) {
    signOff.error = errorText(err);
  }
  app.render();
}

async function exportChip(app: App, kind: 'html' | 'csv'): Promise<void> {
  const reply = signOff.signed;
  if (!reply) return;
  const stem = signOff.evaluatedChipId.replace(/[^A-Za-z0-9._-]+/g, '_');
  try {
    const r = kind === 'html' ? await app.api.saveReport(`${stem}.html`, renderChipReportHtml(reply.report)) : await app.api.qc?.saveCsv(`${stem}.csv`, chipChecksCsv(reply.report));
    if (r) app.status(`Saved ${r.path}.`);
  } catch (err) {
    app.status(errorText(err), true);
  }
}

function input(id: string, value: string, onInput: (v: string) => void, attrs: Record<string, string> = {}): HTMLInputElement {
  const i = el('input', { type: 'text', id, value, ...attrs });
  i.addEventListener('input', () => onInput(i.value));
  return i;
}

function field(label: string, control: HTMLElement): HTMLElement {
  return el('label', { class: 'field' }, el('span', { text: label }), control);
}

function badgeOf(v: string): HTMLElement {
  return el('span', { class: `badge ${v === 'pass' ? 'ok' : v === 'fail' ? 'bad' : 'warn'}`, text: v });
}

function specPanel(app: App): HTMLElement {
  const fileInput = el('input', { type: 'file', id: 'signoff-spec-file', accept: '.json,application/json', 'aria-label': 'Acceptance spec file' });
  fileInput.addEventListener('change', () => {
    const file = fileInput.files?.[0];
    if (file) void file.text().then((text) => chooseSpec(app, { name: file.name, text }));
  });
  const ex = el('select', { id: 'signoff-spec-example' }, el('option', { value: '', text: 'Bundled example…' }), ...EXAMPLE_SPECS.map((x) => el('option', { value: x.name, text: x.name })));
  ex.value = EXAMPLE_SPECS.some((x) => x.name === signOff.spec?.name) ? (signOff.spec?.name ?? '') : '';
  ex.addEventListener('change', () => {
    const f = EXAMPLE_SPECS.find((x) => x.name === ex.value);
    if (f) chooseSpec(app, f);
  });
  const spec = signOff.spec;
  const panel = el('section', { class: 'panel', 'aria-label': 'Acceptance spec' }, el('h3', { text: 'Acceptance spec' }), el('div', { class: 'inline' }, field('Spec', ex), field('…or a file', fileInput)));
  if (spec?.error) panel.append(notice('bad', spec.error));
  if (spec?.parsed) {
    const p = spec.parsed;
    panel.append(el('p', { 'data-testid': 'signoff-spec-name', text: `${spec.name}: ${p.design.name}${p.design.revision ? ` rev. ${p.design.revision}` : ''} · ${p.limits.length} limit(s) · inconclusive counts as ${p.inconclusiveCountsAs}` }));
    if (p.test.drive && p.test.drive !== app.state.setup) panel.append(notice('warn', `The spec's test is ${p.test.drive}; the analysis uses ${app.state.setup}. Change the setup in the side bar if the log was run as the spec says.`));
    if (p.test.chipDescription && !app.state.chip) panel.append(notice('warn', `The spec names a chip description (${p.test.chipDescription}); load it with "Load chip JSON…" so nominal compliance and trapped air can be judged.`));
  }
  return panel;
}

function checksTable(ev: ChipEvaluation, spec: QcSpec): HTMLElement {
  return el('table', { 'data-testid': 'signoff-checks' },
    el('thead', {}, el('tr', {}, ...['check', 'value', '95 % CI', 'limits', 'unit', 'verdict', 'reason'].map((h) => el('th', { scope: 'col', text: h })))),
    el('tbody', {}, ...ev.results.map((r) => {
      const d = displayFor(r.check, spec);
      const lim = r.lower === null && r.upper === null ? '—' : `${r.lower === null ? '' : `≥ ${showValue(r.lower, d)}`}${r.lower !== null && r.upper !== null ? ', ' : ''}${r.upper === null ? '' : `≤ ${showValue(r.upper, d)}`}`;
      return el('tr', { 'data-testid': `check-${r.check}`, 'data-verdict': r.verdict },
        el('th', { scope: 'row', text: r.label }), el('td', { class: 'num', text: showValue(r.value, d) }), el('td', { class: 'num', text: showCi(r.ci95, d) }),
        el('td', { class: 'num', text: lim }), el('td', { text: d.symbol }), el('td', {}, badgeOf(r.verdict)), el('td', { class: 'small', text: r.reason }));
    })));
}

function chipPanel(app: App): HTMLElement {
  const s = app.state;
  const panel = el('section', { class: 'panel', 'aria-label': 'Chip verdict and sign-off' }, el('h3', { text: 'Chip verdict and sign-off' }));
  const spec = signOff.spec?.parsed;
  if (!s.analysis) {
    panel.append(emptyState('No analysis yet', 'Open the chip\'s log (and its chip description) and let the fits finish; then judge it here.', button('Open logs…', () => void app.openLogsDialog(), 'btn primary')));
    return panel;
  }
  panel.append(el('div', { class: 'inline signoff-fields' },
    field('Chip ID', input('signoff-chip-id', signOff.chipId, (v) => { signOff.chipId = v; })),
    field('Lot', input('signoff-lot', signOff.lot, (v) => { signOff.lot = v; }, { placeholder: 'optional' })),
    field('Operator', input('signoff-operator', signOff.operator, (v) => { signOff.operator = v; })),
    el('div', { class: 'field' }, el('span', { text: '\u00a0' }), button(signOff.evaluation ? 'Re-check' : 'Check against spec', () => void evaluate(app), 'btn', { id: 'signoff-check' }))));
  if (!spec) {
    panel.append(notice('info', 'Choose an acceptance spec to see the limits and verdicts.'));
    return panel;
  }
  const ev = signOff.evaluation;
  if (!ev) {
    panel.append(notice('info', signOff.busy ? 'Judging…' : 'Press "Check against spec" to judge the current analysis.'));
    return panel;
  }
  const stale = signOff.evaluatedRun !== s.analysisRuns || signOff.evaluatedChipId !== signOff.chipId.trim();
  panel.append(
    el('div', { class: 'inline' }, el('span', { class: 'big-number', 'data-testid': 'signoff-verdict', 'data-verdict': ev.verdict, text: `${ev.chipId}: ${ev.verdict}` }), el('span', { class: 'muted', 'data-testid': 'signoff-disposition', text: `disposition: ${ev.disposition}` })),
    ...(stale ? [notice('warn', 'The analysis or chip ID changed since this check: press Re-check before signing off.')] : []),
    checksTable(ev, spec),
    el('p', { class: 'small muted', 'data-testid': 'verdict-rule', text: `Rule: ${VERDICT_RULE}` }),
  );
  const info = signOff.info;
  if (info && !info.available) panel.append(notice('unavailable', info.reason));
  else if (info?.available) {
    const go = button(signOff.busy ? 'Signing off…' : 'Sign off and record', () => void doSignOff(app), 'btn primary', { id: 'signoff-submit' });
    go.disabled = signOff.busy || stale;
    panel.append(el('div', { class: 'inline' }, go, el('span', { class: 'small muted', 'data-testid': 'signoff-store', text: `Record store: ${info.storePath}` })));
  }
  const signed = signOff.signed;
  if (signed) {
    panel.append(
      notice('info', signed.record.status === 'recorded' ? `Recorded as #${signed.record.id} (${signed.evaluation.verdict}, disposition ${signed.evaluation.disposition}). Records are never changed; a re-test is a new record.` : `Already recorded as #${signed.record.id}: the same files, spec, chip ID, lot and settings. Nothing added.`),
      el('div', { class: 'inline' },
        button('Export chip report (HTML)', () => void exportChip(app, 'html'), 'btn', { id: 'signoff-export-html' }),
        button('Export checks (CSV)', () => void exportChip(app, 'csv'), 'btn', { id: 'signoff-export-csv' })));
  }
  return panel;
}

function controlChartConfig(cc: ControlCharts, c: ChartColors): ChartConfiguration<'line', number[], string> | null {
  const ch = cc.individuals;
  if (!ch.points.length) return null;
  const unit = cc.quantity === 'resistance' ? RESISTANCE_UNIT : COMPLIANCE_UNIT;
  const f = unit.fromSi;
  const n = ch.points.length;
  const flat = (v: number | null): number[] => Array.from({ length: n }, () => (v === null ? Number.NaN : v * f));
  return {
    type: 'line',
    data: {
      labels: ch.points.map((p) => `${p.group} · ${p.label}`),
      datasets: [
        { label: cc.quantity === 'resistance' ? 'R per chip' : 'C per chip', data: ch.points.map((p) => p.value * f), borderColor: c.data, backgroundColor: ch.points.map((p) => (p.outOfControl ? c.bad : c.data)), pointRadius: 4, borderWidth: 1.5 },
        { label: 'centre', data: flat(ch.centre), borderColor: c.accent, borderWidth: 1.5, pointRadius: 0 },
        { label: 'UCL / LCL (3σ)', data: flat(ch.ucl), borderColor: c.bad, borderDash: [6, 4], borderWidth: 1.2, pointRadius: 0 },
        { label: '', data: flat(ch.lcl), borderColor: c.bad, borderDash: [6, 4], borderWidth: 1.2, pointRadius: 0 },
      ],
    },
    options: {
      responsive: true,
      maintainAspectRatio: false,
      scales: {
        x: { type: 'category', ticks: { color: c.muted, maxRotation: 40, autoSkip: true }, grid: { color: c.grid } },
        y: { type: 'linear', title: { display: true, text: `${cc.quantity === 'resistance' ? 'R' : 'C'} [${unit.label}]`, color: c.ink }, ticks: { color: c.muted }, grid: { color: c.grid } },
      },
      plugins: { legend: { display: true, position: 'top', align: 'end', labels: { color: c.ink, boxWidth: 14, boxHeight: 2, filter: (item) => item.text !== '' } } },
    },
  };
}

function historyPanel(app: App, charts: Array<() => Chart>): HTMLElement {
  const f = signOff.filters;
  const panel = el('section', { class: 'panel', 'aria-label': 'Record history' }, el('h3', { text: 'History and control charts' }));
  if (!signOff.info?.available) {
    panel.append(notice('unavailable', signOff.info?.reason ?? 'Checking for the record store…'));
    return panel;
  }
  const form = el('form', { class: 'inline', 'aria-label': 'History filters' },
    field('Lot', input('history-lot', f.lot, (v) => { f.lot = v; })),
    field('Chip', input('history-chip', f.chip, (v) => { f.chip = v; })),
    field('Since (UTC date)', input('history-since', f.since, (v) => { f.since = v; }, { placeholder: 'YYYY-MM-DD' })),
    el('div', { class: 'field' }, el('span', { text: '\u00a0' }), el('button', { type: 'submit', class: 'btn', id: 'history-show', text: 'Show records' })));
  form.addEventListener('submit', (e) => {
    e.preventDefault();
    void loadHistory(app);
  });
  panel.append(form);
  const h = signOff.history;
  if (!h) return panel;
  panel.append(el('table', { 'data-testid': 'history-table' },
    el('thead', {}, el('tr', {}, ...['#', 'time (UTC)', 'chip', 'lot', 'operator', 'verdict', 'disposition', `R [${RESISTANCE_UNIT.label}]`, `C [${COMPLIANCE_UNIT.label}]`, 'τ [s]'].map((x) => el('th', { scope: 'col', text: x })))),
    el('tbody', {}, ...[...h].reverse().map((r) => el('tr', { 'data-testid': `history-row-${r.id}` },
      el('td', { class: 'num', text: String(r.id) }), el('td', { class: 'mono small', text: r.recordedAt.replace('T', ' ').replace(/\.\d+Z$/, 'Z') }), el('th', { scope: 'row', text: r.chipId }),
      el('td', { text: r.lot ?? '—' }), el('td', { text: r.operator ?? '—' }), el('td', {}, badgeOf(r.verdict)), el('td', { text: r.disposition }),
      el('td', { class: 'num', text: r.quantities.resistance ? fmt(r.quantities.resistance.value * RESISTANCE_UNIT.fromSi) : '—' }),
      el('td', { class: 'num', text: r.quantities.compliance ? fmt(r.quantities.compliance.value * COMPLIANCE_UNIT.fromSi) : '—' }),
      el('td', { class: 'num', text: r.quantities.tau ? fmt(r.quantities.tau.value) : '—' }))))));
  if (!h.length) panel.append(notice('info', 'No records match these filters.'));
  const lot = signOff.lotReport;
  panel.append(el('div', { class: 'inline' },
    button('Export history (CSV)', () => void app.api.qc?.saveCsv('history.csv', historyCsv(h)).then((r) => r && app.status(`Saved ${r.path}.`)), 'btn', { id: 'history-export-csv' }),
    lot ? button(`Export lot ${lot.lot} report (HTML)`, () => void app.api.saveReport(`lot-${lot.lot.replace(/[^A-Za-z0-9._-]+/g, '_')}.html`, renderLotReportHtml(lot)).then((r) => r && app.status(`Saved ${r.path}.`)), 'btn', { id: 'history-export-lot' }) : null));
  if (lot) {
    const colors = pageColors();
    const grid = el('div', { class: 'grid-2' });
    for (const cc of lot.charts.filter((x) => x.quantity === 'resistance' || x.quantity === 'compliance')) {
      const cfg = controlChartConfig(cc, colors);
      const box = canvasBox('mid', `Individuals control chart of ${cc.quantity} across lots`, `control-chart-${cc.quantity}`);
      grid.append(el('div', {}, el('h4', { text: `${cc.quantity === 'resistance' ? 'Resistance R' : 'Compliance C'}: individuals chart across lots (newest record per chip)` }), cfg ? box.box : notice('unavailable', `No ${cc.quantity} values recorded yet.`)));
      if (cfg) charts.push(() => new Chart(box.canvas, cfg));
    }
    panel.append(el('p', { class: 'small muted', text: `Lot ${lot.lot}: ${lot.records.length} chip(s). Limits are centre ± 3σ̂ with σ̂ = mean moving range / d₂ (d₂ = 1.128 for n = 2).` }), grid);
  }
  return panel;
}

export function renderSignOffView(app: App, root: HTMLElement): void {
  clear(root);
  root.append(viewHead('h-signoff', 'QC sign-off', 'Judge this chip against an acceptance spec, sign it off into the record store that `lagbench qc` uses, and follow the lots.'));
  if (!signOff.info) void ensureInfo(app);
  if (signOff.spec?.parsed && signOff.chipId === '') signOff.chipId = defaultChipId(app, signOff.spec.parsed);
  root.append(specPanel(app));
  if (signOff.error) root.append(notice('bad', signOff.error));
  root.append(chipPanel(app));
  const charts: Array<() => Chart> = [];
  root.append(historyPanel(app, charts));
  root.append(caution());
  app.keepCharts('signoff', charts.map((make) => make()));
}
