/**
 * What-if view: "how slow will this be, and what should I change?" Pick a chip description, a setup
 * and one design variable to sweep; the worker runs the core's whatIf / whatIfStepResponses and the
 * view shows the table (R, C, τ, t₉₅ with ranges, steady state) and the predicted step responses
 * overlaid, with the values (and the interpolated range) that meet a target t₉₅ highlighted.
 */
import { Chart, type ChartConfiguration, type ChartDataset } from 'chart.js';
import type { App } from '../app';
import type { Setup } from '../../core/nominal/types';
import { SWEEPABLE } from '../../core/whatif/vary';
import { pageColors, withAlpha, type ChartColors } from '../charts/theme';
import { clear, el } from '../helpers/dom';
import { COMPLIANCE_UNIT, fmt, M3S_PER_UL_MIN, PA_PER_MBAR, RESISTANCE_UNIT } from '../helpers/format';
import { EXAMPLE_CHIPS, type BundledFile } from '../whatif/examples';
import type { WhatIfView } from '../worker/whatif-protocol';
import { errorText } from '../app';
import { button, canvasBox, caution, notice, viewHead } from './common';

interface WhatIfForm {
  chip: BundledFile | null;
  setup: Setup;
  target: string;
  property: string;
  from: string;
  to: string;
  steps: string;
  list: string;
  drive: string;
  targetT95: string;
  result: WhatIfView | null;
  error: string | null;
  busy: boolean;
  runs: number;
}

/** The view's own state (one window, one form); kept outside AppState so the analysis workflow is untouched. */
export const whatIfForm: WhatIfForm = {
  chip: null, setup: 'flow-driven', target: '', property: 'length', from: '10 cm', to: '2 m', steps: '8', list: '',
  drive: '', targetT95: '', result: null, error: null, busy: false, runs: 0,
};

/** Element labels of a chip description (for the element list), in file order. */
export function elementLabels(chipText: string): string[] {
  const out: string[] = [];
  const walk = (v: unknown): void => {
    if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === 'object') {
      const o = v as Record<string, unknown>;
      if (typeof o.label === 'string' && typeof o.type === 'string') out.push(o.label);
      Object.values(o).forEach(walk);
    }
  };
  try {
    walk((JSON.parse(chipText) as Record<string, unknown>).path);
  } catch {
    /* the worker reports the located parse error */
  }
  return [...new Set(out)];
}

/** The sweep value as shown (SI → display units, as the CLI table). */
export function valueText(v: number | string, dimension: string): string {
  if (typeof v === 'string') return v;
  switch (dimension) {
    case 'length': return `${fmt(v * 1e3, 4)} mm`;
    case 'volume': return `${fmt(v * 1e9, 4)} µL`;
    case 'temperature': return `${fmt(v - 273.15, 4)} °C`;
    case 'pressure': return `${fmt(v / 1e6, 4)} MPa`;
    default: return fmt(v, 4);
  }
}

function varyText(f: WhatIfForm): string {
  const lhs = `${f.target}.${f.property}`;
  if (SWEEPABLE[f.property] === 'category') return `${lhs}=${f.list}`;
  return `${lhs}=${f.from}:${f.to}:${f.steps}`;
}

function chooseChip(app: App, file: BundledFile): void {
  whatIfForm.chip = file;
  whatIfForm.result = null;
  whatIfForm.error = null;
  const labels = elementLabels(file.text);
  // A sensible first sweep: the first tubing's length (the usual lever), else the trapped-air volume.
  let chip: Record<string, unknown> = {};
  try {
    chip = JSON.parse(file.text) as Record<string, unknown>;
  } catch {
    /* shown by the worker on Compute */
  }
  const tubing = JSON.stringify(chip.path ?? {}).match(/"type":"tubing","label":"([^"]+)"/)?.[1];
  if (tubing) Object.assign(whatIfForm, { target: tubing, property: 'length', from: '10 cm', to: '2 m', steps: '8' });
  else Object.assign(whatIfForm, { target: labels.includes(whatIfForm.target) ? whatIfForm.target : 'bubble', property: 'volume', from: '0 uL', to: '5 uL', steps: '6' });
  app.status(`Chip description ${file.name} loaded for what-if.`);
  app.render();
}

/** A chip description (.json) dropped while this view is shown goes to the sweep, not to the log importer. */
export function dropOnWhatIf(app: App, list: FileList): boolean {
  const file = list[0];
  if (app.state.view !== 'whatif' || list.length !== 1 || !file || !/\.json$/i.test(file.name)) return false;
  void file.text().then((text) => chooseChip(app, { name: file.name, text }));
  return true;
}

export async function computeWhatIf(app: App): Promise<void> {
  const f = whatIfForm;
  if (!f.chip) return;
  const t = f.targetT95.trim();
  const target = t === '' ? null : Number(t);
  if (target !== null && !(Number.isFinite(target) && target > 0)) {
    f.error = `Target t95 '${t}' must be a positive number of seconds (or empty).`;
    app.render();
    return;
  }
  f.busy = true;
  f.error = null;
  app.status(`What-if: sweeping ${varyText(f)}…`);
  app.render();
  try {
    f.result = await app.worker.request('whatif', { chipText: f.chip.text, chipName: f.chip.name, setup: f.setup, vary: varyText(f), driveText: f.drive, targetT95S: target });
    f.runs++;
    document.documentElement.dataset.whatifRuns = String(f.runs);
    app.status(`What-if done: ${f.result.rows.length} designs.`);
  } catch (err) {
    f.result = null;
    f.error = errorText(err);
    app.status(f.error, true);
  } finally {
    f.busy = false;
    app.render();
  }
}

function field(label: string, control: HTMLElement, hint?: string): HTMLElement {
  return el('label', { class: 'field' }, el('span', { text: label }), control, hint ? el('span', { class: 'small muted', text: hint }) : null);
}

function textInput(id: string, value: string, onInput: (v: string) => void, attrs: Record<string, string> = {}): HTMLInputElement {
  const input = el('input', { type: 'text', id, value, ...attrs });
  input.addEventListener('input', () => onInput(input.value));
  return input;
}

function selectOf(id: string, options: Array<[string, string]>, value: string, onChange: (v: string) => void): HTMLSelectElement {
  const s = el('select', { id }, ...options.map(([v, label]) => el('option', { value: v, text: label })));
  s.value = value;
  s.addEventListener('change', () => onChange(s.value));
  return s;
}

function formPanel(app: App): HTMLElement {
  const f = whatIfForm;
  const fileInput = el('input', { type: 'file', id: 'whatif-chip-file', accept: '.json,application/json', 'aria-label': 'Chip description file' });
  fileInput.addEventListener('change', () => {
    const file = fileInput.files?.[0];
    if (file) void file.text().then((text) => chooseChip(app, { name: file.name, text }));
  });
  const example = selectOf('whatif-example', [['', 'Bundled example…'], ...EXAMPLE_CHIPS.map((c): [string, string] => [c.name, c.name])], EXAMPLE_CHIPS.some((c) => c.name === f.chip?.name) ? (f.chip?.name ?? '') : '', (v) => {
    const c = EXAMPLE_CHIPS.find((x) => x.name === v);
    if (c) chooseChip(app, c);
  });
  const panel = el('section', { class: 'panel whatif-form', 'aria-label': 'What-if settings' }, el('h3', { text: 'Design and sweep' }),
    el('div', { class: 'inline' }, field('Chip description', example), field('…or a file', fileInput)),
    el('p', { class: 'small muted', 'data-testid': 'whatif-chip-name', text: f.chip ? `Using ${f.chip.name}` : 'No chip description chosen yet (drop one here or pick a file).' }));
  if (!f.chip) return panel;
  const labels = elementLabels(f.chip.text);
  const targets: Array<[string, string]> = [...labels.map((l): [string, string] => [l, l]), ['bubble', 'bubble (trapped air at the node)'], ['fluid', 'fluid'], ['chipBody', 'chip body']];
  if (!targets.some(([v]) => v === f.target)) targets.unshift([f.target, f.target]);
  const props = f.target === 'bubble' ? ['volume'] : Object.keys(SWEEPABLE);
  const categorical = SWEEPABLE[f.property] === 'category';
  const go = button(f.busy ? 'Computing…' : 'Compute sweep', () => void computeWhatIf(app), 'btn primary', { id: 'whatif-run' });
  go.disabled = f.busy;
  const form = el('form', { class: 'whatif-grid', 'aria-label': 'Sweep' },
    field('Setup', selectOf('whatif-setup', [['flow-driven', 'Flow-driven (pump)'], ['pressure-driven', 'Pressure-driven']], f.setup, (v) => { f.setup = v as Setup; })),
    field('Element', selectOf('whatif-target', targets, f.target, (v) => { f.target = v; if (v === 'bubble') f.property = 'volume'; app.render(); })),
    field('Property', selectOf('whatif-property', props.map((p): [string, string] => [p, p]), f.property, (v) => { f.property = v; app.render(); })),
    ...(categorical
      ? [field('Values', textInput('whatif-list', f.list, (v) => { f.list = v; }, { placeholder: 'ptfe,peek' }), 'comma list')]
      : [field('From', textInput('whatif-from', f.from, (v) => { f.from = v; }), 'with unit, e.g. 10 cm'), field('To', textInput('whatif-to', f.to, (v) => { f.to = v; })), field('Steps', textInput('whatif-steps', f.steps, (v) => { f.steps = v; }), '2–200')]),
    field(f.setup === 'flow-driven' ? 'Pump flow' : 'Regulator pressure', textInput('whatif-drive', f.drive, (v) => { f.drive = v; }, { placeholder: f.setup === 'flow-driven' ? '10 uL/min' : 'operating pressure' })),
    field('Target t₉₅ [s]', textInput('whatif-target-t95', f.targetT95, (v) => { f.targetT95 = v; }, { inputmode: 'decimal', placeholder: 'optional' })),
    el('div', { class: 'field' }, el('span', { text: '\u00a0' }), go),
  );
  form.addEventListener('submit', (e) => {
    e.preventDefault();
    void computeWhatIf(app);
  });
  // Enter in any text field computes.
  form.append(el('button', { type: 'submit', hidden: true, tabindex: '-1', 'aria-hidden': 'true' }));
  panel.append(form, el('p', { class: 'small muted mono', text: `Sweep: ${varyText(f)}` }));
  return panel;
}

function rangeText(r: { low: number; nominal: number; high: number }, scale = 1, digits = 3): string {
  return `${fmt(r.nominal * scale, digits)} (${fmt(r.low * scale, digits)}–${fmt(r.high * scale, digits)})`;
}

function meetingText(res: WhatIfView): string | null {
  if (res.targetT95S === null) return null;
  const target = fmt(res.targetT95S, 4);
  if (res.meetingRanges.length > 0) {
    return `t₉₅ ≤ ${target} s for ${res.vary.target}.${res.vary.property} in ${res.meetingRanges.map(([a, b]) => `${valueText(a, res.vary.dimension)} … ${valueText(b, res.vary.dimension)}`).join(' and ')} (nominal; ends interpolated between sweep points).`;
  }
  const ok = res.rows.filter((r) => r.meetsTarget).map((r) => valueText(r.value, res.vary.dimension));
  return ok.length ? `t₉₅ ≤ ${target} s with: ${ok.join(', ')}.` : `No value in the sweep reaches t₉₅ ≤ ${target} s.`;
}

function resultTable(res: WhatIfView): HTMLElement {
  const flow = res.setup === 'flow-driven';
  const head = ['value', `R total [${RESISTANCE_UNIT.label}]`, `C [${COMPLIANCE_UNIT.label}] (range)`, 'τ [s] (range)', 't₉₅ [s] (range)', flow ? 'p source [mbar]' : 'Q steady [µL/min]', ...(res.targetT95S === null ? [] : ['meets target'])];
  return el('table', { 'data-testid': 'whatif-table' },
    el('thead', {}, el('tr', {}, ...head.map((h, i) => el('th', { class: i === 0 ? '' : 'num', scope: 'col', text: h })))),
    el('tbody', {}, ...res.rows.map((r, i) => el('tr', { class: r.meetsTarget ? 'meets' : '', 'data-testid': `whatif-row-${i}` },
      el('th', { scope: 'row', text: valueText(r.value, res.vary.dimension) }),
      el('td', { class: 'num', 'data-testid': `whatif-r-${i}`, 'data-si': String(r.resistanceTotalPaSPerM3), text: fmt(r.resistanceTotalPaSPerM3 * RESISTANCE_UNIT.fromSi, 4) }),
      el('td', { class: 'num', text: rangeText(r.complianceM3PerPa, COMPLIANCE_UNIT.fromSi) }),
      el('td', { class: 'num', 'data-testid': `whatif-tau-${i}`, 'data-si': String(r.tauS.nominal), text: rangeText(r.tauS) }),
      el('td', { class: 'num', 'data-testid': `whatif-t95-${i}`, 'data-si': String(r.t95S.nominal), text: rangeText(r.t95S) }),
      el('td', { class: 'num', text: flow ? fmt(r.steadySourcePressurePa / PA_PER_MBAR, 4) : fmt(r.steadyFlowM3PerS / M3S_PER_UL_MIN, 4) }),
      ...(r.meetsTarget === null ? [] : [el('td', {}, el('span', { class: `badge ${r.meetsTarget ? 'ok' : 'bad'}`, text: r.meetsTarget ? 'yes' : 'no' }))]),
    ))));
}

/** Colour for sweep value k of n: from the data colour to the fit colour. */
function ramp(c: ChartColors, k: number, n: number): string {
  const parse = (h: string): number[] => (/^#[0-9a-f]{6}$/i.test(h) ? [1, 3, 5].map((i) => parseInt(h.slice(i, i + 2), 16)) : [44, 95, 158]);
  const a = parse(c.data);
  const b = parse(c.fit);
  const t = n <= 1 ? 0 : k / (n - 1);
  return `#${a.map((x, i) => Math.round(x + ((b[i] as number) - x) * t).toString(16).padStart(2, '0')).join('')}`;
}

export function responsesConfig(res: WhatIfView, c: ChartColors): ChartConfiguration<'line', Array<{ x: number; y: number }>> {
  const target = res.targetT95S;
  const datasets: Array<ChartDataset<'line', Array<{ x: number; y: number }>>> = res.curves.map((cv, k) => {
    const meets = res.rows[k]?.meetsTarget;
    const colour = ramp(c, k, res.curves.length);
    return {
      label: valueText(cv.value, res.vary.dimension),
      data: cv.tS.map((x, i) => ({ x, y: 100 * (cv.fraction[i] ?? Number.NaN) })),
      borderColor: meets === false ? withAlpha(colour, 0.45) : colour,
      borderWidth: meets === true ? 3 : 1.8,
      borderDash: meets === false ? [5, 4] : [],
      pointRadius: 0,
      tension: 0,
    };
  });
  const tMax = Math.max(...res.curves.map((cv) => cv.tS[cv.tS.length - 1] ?? 0));
  datasets.push({ label: '95 % of final', data: [{ x: 0, y: 95 }, { x: tMax, y: 95 }], borderColor: c.muted, borderWidth: 1, borderDash: [2, 3], pointRadius: 0 });
  if (target !== null) datasets.push({ label: `target t₉₅ = ${fmt(target, 3)} s`, data: [{ x: target, y: 0 }, { x: target, y: 105 }], borderColor: c.accent, borderWidth: 2, borderDash: [8, 4], pointRadius: 0 });
  const sensed = res.setup === 'flow-driven' ? 'node pressure' : 'outlet flow';
  const axis = (text: string, extra: Record<string, unknown> = {}) => ({ type: 'linear' as const, title: { display: true, text, color: c.ink, font: { weight: 'bold' as const } }, ticks: { color: c.muted }, grid: { color: c.grid }, ...extra });
  return {
    type: 'line',
    data: { datasets },
    options: {
      responsive: true,
      maintainAspectRatio: false,
      parsing: false,
      normalized: true,
      scales: { x: axis('time after the step [s]', { min: 0, max: tMax }), y: axis(`${sensed} [% of final value]`, { min: 0, max: 105 }) },
      plugins: { legend: { display: true, position: 'right', labels: { color: c.ink, boxWidth: 16, boxHeight: 2 } }, tooltip: { enabled: true } },
    },
  };
}

export function renderWhatIfView(app: App, root: HTMLElement): void {
  clear(root);
  const f = whatIfForm;
  root.append(viewHead('h-whatif', 'What-if', 'How slow will this set-up be, and what should change? Sweep one design variable of a chip description and compare the predicted settling.'));
  root.append(formPanel(app));
  if (f.error) root.append(notice('bad', f.error));
  const res = f.result;
  if (res) {
    const meeting = meetingText(res);
    const tablePanel = el('section', { class: 'panel', 'aria-label': 'Predicted settling per value' },
      el('h3', { text: `Predicted settling: ${res.vary.text}` }),
      el('p', { class: 'small muted', text: `${res.setup}; drive ${res.setup === 'flow-driven' ? `${fmt(res.driveSI / M3S_PER_UL_MIN, 4)} µL/min` : `${fmt(res.driveSI / PA_PER_MBAR, 4)} mbar`}. Ranges come from the property uncertainties of the description.` }),
      resultTable(res),
      meeting ? el('p', { class: 'conclusion', 'data-testid': 'whatif-meeting', text: meeting }) : null);
    const chart = canvasBox('mid', 'Predicted step responses, one line per sweep value', 'whatif-chart');
    chart.canvas.dataset.curves = String(res.curves.length);
    const chartPanel = el('section', { class: 'panel', 'aria-label': 'Predicted step responses' }, el('h3', { text: 'Predicted step responses (overlaid)' }),
      el('p', { class: 'small muted', text: res.targetT95S === null ? 'Each line is one design, from rest to a step of the drive at t = 0.' : 'Thick lines meet the target t₉₅; dashed, faint lines do not.' }), chart.box);
    root.append(chartPanel, tablePanel);
    if (res.notes.length) root.append(el('details', { class: 'panel' }, el('summary', { text: `Notes on the prediction (${res.notes.length})` }), el('ul', { class: 'warn-list' }, ...res.notes.map((n) => el('li', { text: n })))));
    app.keepCharts('whatif', [new Chart(chart.canvas, responsesConfig(res, pageColors()))]);
  }
  root.append(caution());
}
