/**
 * Recording view: the whole log (decimated, zoom with the wheel or Ctrl+drag, pan with Shift+drag) with
 * the steps marked; steps can be dragged on the chart, or selected in the list and moved with the
 * arrow keys, deleted with Delete, or added at a typed time.
 */
import { Chart } from 'chart.js';
import type { App } from '../app';
import { recordingConfig } from '../charts/configs';
import { markerNear } from '../charts/step-markers';
import { pageColors } from '../charts/theme';
import { clear, el } from '../helpers/dom';
import { displayUnitOf, fmt, isPressureQuantity } from '../helpers/format';
import type { SeriesSet } from '../worker/protocol';
import { button, canvasBox, caution, emptyState, notice, viewHead, warningsList } from './common';

/** The x range the user zoomed to, kept across re-renders (null = whole recording). */
let zoom: { min: number; max: number } | null = null;
let zoomedSeries: SeriesSet | null = null;
let focusList = false;
/** The chart on screen; late zoom callbacks from a replaced chart are ignored. */
let currentChart: Chart | null = null;

export function renderRecordingView(app: App, root: HTMLElement): void {
  clear(root);
  const s = app.state;
  root.append(viewHead('h-recording', 'Recording & steps', 'The detected steps are marked S1, S2 … Drag a marker, or select a step in the list and use the keys, to correct them; every change refits.'));
  if (!s.recording || !s.overview) {
    currentChart = null;
    zoom = null;
    zoomedSeries = null;
    root.append(emptyState('Nothing to show yet', 'Open a log first.', button('Open logs…', () => void app.openLogsDialog(), 'btn primary')));
    return;
  }
  const rec = s.recording;
  const dur = rec.durationS;
  const { box, canvas } = canvasBox('tall', 'Recording with step markers', 'recording-chart');
  const onsets = s.steps.map((x) => x.onsetS);
  const resetBtn = button('Reset zoom', () => {
    zoom = null;
    zoomedSeries = null;
    app.render();
  }, 'btn small', { 'data-testid': 'reset-zoom' });
  const chartPanel = el('section', { class: 'panel', 'aria-label': 'Recording chart' },
    el('div', { class: 'chart-tools' },
      el('span', { class: 'legend-note', text: 'Wheel or Ctrl+drag: zoom · Shift+drag: pan · drag a marker: move the step · double-click: add a step' }),
      resetBtn),
    box);

  // ---- step list and editing
  const nudge = (big: boolean): number => (dur / 500) * (big ? 10 : 1);
  const list = el('ul', { class: 'step-list', role: 'listbox', 'aria-label': 'Steps (arrows: move, Up/Down: select, Delete: remove)', tabindex: '0', 'data-testid': 'step-list' });
  s.steps.forEach((st, i) => {
    const drive = displayUnitOf(st.drive.quantity);
    const levels = Number.isFinite(st.drive.before) && Number.isFinite(st.drive.after) ? `${fmt(st.drive.before * drive.fromSi)} → ${fmt(st.drive.after * drive.fromSi)} ${drive.label}` : 'levels from the drive channel';
    const item = el('li', { class: 'step-item', role: 'option', id: `step-opt-${i}`, 'aria-selected': String(s.selectedStep === i), 'data-testid': `step-item-${i}` },
      el('span', { class: 'step-idx', text: `S${i + 1}` }),
      el('span', {}, el('span', { class: 'mono', text: `${fmt(st.onsetS, 6)} s` }), el('span', { class: 'muted small', text: ` · ${st.direction} · ${levels}` })),
      el('span', { class: `badge ${st.origin === 'user' ? 'warn' : ''}`, text: st.origin === 'user' ? 'edited' : st.origin }));
    item.addEventListener('click', () => {
      s.selectedStep = i;
      focusList = true;
      app.render();
    });
    list.append(item);
  });
  if (s.selectedStep !== null) list.setAttribute('aria-activedescendant', `step-opt-${s.selectedStep}`);
  list.addEventListener('keydown', (e) => {
    const i = s.selectedStep;
    focusList = true;
    if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
      e.preventDefault();
      if (!s.steps.length) return;
      s.selectedStep = i === null ? 0 : Math.max(0, Math.min(s.steps.length - 1, i + (e.key === 'ArrowDown' ? 1 : -1)));
      app.render();
    } else if ((e.key === 'ArrowLeft' || e.key === 'ArrowRight') && i !== null) {
      e.preventDefault();
      const st = s.steps[i];
      if (st) app.editSteps('move', i, st.onsetS + (e.key === 'ArrowRight' ? 1 : -1) * nudge(e.shiftKey));
    } else if ((e.key === 'Delete' || e.key === 'Backspace') && i !== null) {
      e.preventDefault();
      app.editSteps('delete', i);
    }
  });

  const sel = s.selectedStep !== null ? s.steps[s.selectedStep] : undefined;
  const onsetInput = el('input', { type: 'number', step: 'any', min: '0', max: String(dur), value: sel ? String(+sel.onsetS.toPrecision(8)) : '', 'aria-label': 'Onset of the selected step (s)', 'data-testid': 'onset-input', disabled: !sel });
  const addInput = el('input', { type: 'number', step: 'any', min: '0', max: String(dur), placeholder: 'time (s)', 'aria-label': 'Add a step at time (s)', 'data-testid': 'add-step-input' });
  const addBtn = button('Add step', () => {
    const t = Number(addInput.value);
    if (addInput.value === '' || !Number.isFinite(t)) {
      app.status('Type the time of the new step in seconds.', true);
      return;
    }
    addInput.value = '';
    app.editSteps('add', null, t);
  }, 'btn small', { 'data-testid': 'add-step' });
  addInput.addEventListener('keydown', (e) => {
    if (e.key === 'Enter') addBtn.click();
  });
  const setBtn = button('Move here', () => {
    if (s.selectedStep !== null && onsetInput.value !== '') app.editSteps('move', s.selectedStep, Number(onsetInput.value));
  }, 'btn small', { 'data-testid': 'set-onset' });
  setBtn.disabled = !sel;
  onsetInput.addEventListener('keydown', (e) => {
    if (e.key === 'Enter') setBtn.click();
  });
  const delBtn = button('Delete step', () => {
    if (s.selectedStep !== null) app.editSteps('delete', s.selectedStep);
  }, 'btn small danger', { 'data-testid': 'delete-step' });
  delBtn.disabled = !sel;

  const det = s.detected;
  const side = el('section', { class: 'panel', 'aria-label': 'Steps' },
    el('h3', { text: `Steps (${s.steps.length})` }),
    det ? el('p', { class: 'small muted', text: `Detected on ${det.channel ?? 'the response'}${Number.isFinite(det.noiseSigma) && det.noiseSigma > 0 ? ` (noise σ ${fmt(det.noiseSigma * displayUnitOf(det.quantity).fromSi)} ${displayUnitOf(det.quantity).label})` : ''}.${s.stepEdits.length ? ` ${s.stepEdits.length} manual edit(s).` : ''}` }) : null,
    s.steps.length ? list : notice('warn', 'No steps found. Add one at a time below, or check the channels in Import.'),
    el('div', { class: 'step-edit' },
      el('p', { class: 'small muted' }, 'Keys in the list: ', el('kbd', { text: '↑' }), ' ', el('kbd', { text: '↓' }), ' select, ', el('kbd', { text: '←' }), ' ', el('kbd', { text: '→' }), ' move (', el('kbd', { text: 'Shift' }), ' ×10), ', el('kbd', { text: 'Delete' }), ' remove.'),
      el('label', { class: 'field' }, el('span', { text: sel ? `Onset of S${(s.selectedStep ?? 0) + 1} (s)` : 'Select a step to edit it' }), el('div', { class: 'inline' }, onsetInput, setBtn, delBtn)),
      el('label', { class: 'field' }, el('span', { text: 'Add a step at time (s)' }), el('div', { class: 'inline' }, addInput, addBtn)),
      el('div', { class: 'inline' },
        button('Re-detect (drop edits)', () => void app.detect(), 'btn small ghost', { 'data-testid': 'redetect' }),
        button('See the fits →', () => app.show('steps'), 'btn small primary')),
    ),
    s.detected ? warningsList(s.detected.warnings) : null,
  );

  root.append(el('div', { class: 'grid-side' }, chartPanel, side));
  if (rec.channels.some((c) => isPressureQuantity(c.quantity))) root.append(caution());

  // ---- chart
  const series = zoom && zoomedSeries ? zoomedSeries : s.overview;
  const cfg = recordingConfig(series, rec.channels, onsets, s.selectedStep, pageColors(), true);
  const xScale = cfg.options!.scales!.x as { min?: number; max?: number };
  xScale.min = zoom?.min ?? 0;
  xScale.max = zoom?.max ?? dur;
  const refine = (c: Chart): void => {
    const x = c.scales.x;
    if (!x || c !== currentChart) return;
    zoom = { min: x.min, max: x.max };
    canvas.dataset.xMin = String(x.min);
    canvas.dataset.xMax = String(x.max);
    void app.worker.request('series', { fromS: x.min, toS: x.max, maxPoints: 4000 }).then((fresh) => {
      if (c !== currentChart) return;
      zoomedSeries = fresh;
      const next = recordingConfig(fresh, rec.channels, onsets, s.selectedStep, pageColors(), true);
      c.data.datasets.forEach((ds, k) => {
        const src = next.data.datasets[k];
        if (src) ds.data = src.data;
      });
      c.update('none');
    }).catch(() => undefined);
  };
  const zoomOpts = cfg.options!.plugins!.zoom!;
  zoomOpts.zoom = { ...zoomOpts.zoom, onZoomComplete: ({ chart }) => refine(chart as Chart) };
  zoomOpts.pan = { ...zoomOpts.pan, onPanComplete: ({ chart }) => refine(chart as Chart) };
  const chart = new Chart(canvas, cfg);
  currentChart = chart;
  app.keepCharts('recording', [chart]);
  // Marker positions (CSS px in the canvas) for tests and assistive tooling.
  canvas.dataset.markersPx = JSON.stringify(onsets.map((t) => Math.round(chart.scales.x?.getPixelForValue(t) ?? 0)));
  canvas.dataset.plotMidPx = String(Math.round((chart.chartArea.top + chart.chartArea.bottom) / 2));
  canvas.dataset.xMin = String(chart.scales.x?.min ?? 0);
  canvas.dataset.xMax = String(chart.scales.x?.max ?? dur);

  // Dragging a marker moves its step; a double-click adds one.
  let dragging: number | null = null;
  const timeAt = (ev: PointerEvent | MouseEvent): number => {
    const rect = canvas.getBoundingClientRect();
    return chart.scales.x?.getValueForPixel(ev.clientX - rect.left) ?? 0;
  };
  canvas.addEventListener('pointerdown', (ev) => {
    if (ev.shiftKey || ev.ctrlKey) return;
    const rect = canvas.getBoundingClientRect();
    const near = markerNear(chart, onsets, ev.clientX - rect.left);
    if (near === null) return;
    dragging = near;
    canvas.setPointerCapture(ev.pointerId);
    ev.preventDefault();
    ev.stopPropagation();
  }, { capture: true });
  canvas.addEventListener('pointermove', (ev) => {
    const rect = canvas.getBoundingClientRect();
    if (dragging === null) {
      canvas.style.cursor = markerNear(chart, onsets, ev.clientX - rect.left) === null ? 'default' : 'ew-resize';
      return;
    }
    const live = [...onsets];
    live[dragging] = timeAt(ev);
    const markers = chart.options.plugins?.lagbenchSteps;
    if (markers) {
      markers.onsetsS = live;
      markers.selected = dragging;
    }
    chart.update('none');
  });
  canvas.addEventListener('pointerup', (ev) => {
    if (dragging === null) return;
    const i = dragging;
    dragging = null;
    canvas.releasePointerCapture(ev.pointerId);
    app.editSteps('move', i, timeAt(ev));
  });
  canvas.addEventListener('dblclick', (ev) => app.editSteps('add', null, timeAt(ev)));

  if (focusList) {
    list.focus();
    focusList = false;
  }
}
