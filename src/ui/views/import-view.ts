/**
 * Import view: how each file and column was read (delimiter, decimal sign, time format, quantity,
 * unit, how each was recognised), with overrides that re-import the file.
 */
import type { App } from '../app';
import type { ColumnOverride, Delimiter, ImportOptions, ImportReport, TimeFormat } from '../../core/import/types';
import type { Quantity } from '../../core/recording/types';
import { clear, el } from '../helpers/dom';
import { fmt, fmtBytes, QUANTITY_LABEL } from '../helpers/format';
import { button, emptyState, notice, viewHead, warningsList } from './common';

const DELIMITERS: Array<[Delimiter | '', string]> = [['', 'detect'], [',', 'comma ,'], [';', 'semicolon ;'], ['\t', 'tab'], ['whitespace', 'spaces'], ['none', 'none (one column)']];
const DECIMALS: Array<['' | '.' | ',', string]> = [['', 'detect'], ['.', 'point 1.5'], [',', 'comma 1,5']];
const TIME_FORMATS: Array<[TimeFormat | '', string]> = [['', 'detect'], ['seconds', 'seconds'], ['milliseconds', 'milliseconds'], ['minutes', 'minutes'], ['hours', 'hours'], ['elapsed', 'elapsed hh:mm:ss'], ['clock', 'clock time of day'], ['iso', 'ISO 8601 timestamp']];
const QUANTITIES: Array<Quantity | 'ignore'> = ['pressure', 'flow', 'pressure_setpoint', 'flow_setpoint', 'hydrostatic_head', 'other', 'ignore'];
const DELIM_NAME: Record<Delimiter, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', whitespace: 'spaces', none: 'none' };
const RECOGNITION: Record<string, string> = { 'header-name': 'header name', 'header-unit': 'unit in header', 'units-row': 'units row', option: 'your override', position: 'column position', none: '—' };

function select<T extends string>(label: string, options: Array<[T, string]>, value: string, testid: string): HTMLSelectElement {
  const s = el('select', { 'aria-label': label, 'data-testid': testid });
  for (const [v, text] of options) s.append(el('option', { value: v, text, selected: v === value }));
  return s;
}

function fileCard(app: App, index: number, report: ImportReport): HTMLElement {
  const s = app.state;
  const file = s.files[index];
  const opts: ImportOptions = { ...(s.importOptions[index] ?? {}) };
  const d = report.dialect;
  const delim = select('Delimiter', DELIMITERS, opts.delimiter ?? '', `delimiter-${index}`);
  const dec = select('Decimal sign', DECIMALS, opts.decimal ?? '', `decimal-${index}`);
  const tf = select('Time format', TIME_FORMATS, opts.timeFormat ?? '', `timeformat-${index}`);
  const skip = el('input', { type: 'checkbox', checked: !!opts.skipBadRows, id: `skip-${index}` });
  const timeCol = select('Time column', [['', 'detect'], ...report.columns.map((c): [string, string] => [String(c.column), `${c.column}: ${c.header || '(no header)'}`])], opts.timeColumn === undefined ? '' : String(opts.timeColumn), `timecolumn-${index}`);
  const rate = el('input', { type: 'number', step: 'any', min: '0', value: opts.sampleRateHz === undefined ? '' : String(opts.sampleRateHz), placeholder: 'only without time', 'aria-label': 'Sample rate (Hz) for a file without a time column', 'data-testid': `rate-${index}` });

  const colControls: Array<{ column: number; q: HTMLSelectElement; unit: HTMLInputElement }> = [];
  const rows = report.columns.map((c) => {
    const override = opts.columns?.find((o) => o.column === c.column);
    const current = c.role === 'time' ? 'time' : c.role === 'ignored' ? 'ignore' : (c.quantity ?? 'other');
    const qSel = el('select', { 'aria-label': `Quantity of column ${c.column}` });
    if (c.role === 'time') qSel.append(el('option', { value: 'time', text: 'time', selected: true }));
    else for (const q of QUANTITIES) qSel.append(el('option', { value: q, text: q === 'ignore' ? 'ignore' : QUANTITY_LABEL[q], selected: (override?.quantity ?? current) === q }));
    qSel.disabled = c.role === 'time';
    const unit = el('input', { type: 'text', value: override?.unit ?? c.unit, 'aria-label': `Unit of column ${c.column}`, size: 8 });
    unit.disabled = c.role === 'time';
    if (c.role !== 'time') colControls.push({ column: c.column, q: qSel, unit });
    return el('tr', {},
      el('td', { class: 'num', text: String(c.column) }),
      el('td', { class: 'mono', text: c.header || '(none)' }),
      el('td', {}, qSel),
      el('td', {}, unit),
      el('td', { class: 'num', text: c.role === 'time' ? d.timeFormat : Number.isFinite(c.factorToSi) ? String(Number(c.factorToSi.toPrecision(6))) : '—' }),
      el('td', { class: 'mono', text: c.channelName ?? (c.role === 'time' ? 'time_s' : '—') }),
      el('td', { class: 'small muted', text: `${RECOGNITION[c.quantityFrom] ?? c.quantityFrom} / ${RECOGNITION[c.unitFrom] ?? c.unitFrom}` }),
    );
  });

  const apply = button('Apply and re-read', () => {
    const next: ImportOptions = {};
    if (delim.value) next.delimiter = delim.value as Delimiter;
    if (dec.value) next.decimal = dec.value as '.' | ',';
    if (tf.value) next.timeFormat = tf.value as TimeFormat;
    if (skip.checked) next.skipBadRows = true;
    if (timeCol.value) next.timeColumn = Number(timeCol.value);
    if (rate.value !== '' && Number(rate.value) > 0) next.sampleRateHz = Number(rate.value);
    const cols: ColumnOverride[] = [];
    for (const cc of colControls) {
      const orig = report.columns.find((c) => c.column === cc.column);
      const origQ = orig?.role === 'ignored' ? 'ignore' : (orig?.quantity ?? 'other');
      if (cc.q.value !== origQ || cc.unit.value !== (orig?.unit ?? '')) cols.push({ column: cc.column, quantity: cc.q.value as Quantity | 'ignore', ...(cc.unit.value ? { unit: cc.unit.value } : {}) });
    }
    if (cols.length) next.columns = cols;
    s.importOptions[index] = next;
    void app.importFiles();
  }, 'btn primary small', { 'data-testid': `apply-import-${index}` });
  const reset = button('Reset to detected', () => {
    s.importOptions[index] = {};
    void app.importFiles();
  }, 'btn small');

  return el('section', { class: 'panel file-card', 'aria-label': `Import of ${report.source}` },
    el('h3', {}, el('span', { text: file?.name ?? report.source }), el('span', { class: 'muted small', text: `${fmtBytes(report.bytes)} · ${report.rows.toLocaleString('en')} rows${report.skippedRows ? ` · ${report.skippedRows} skipped` : ''}` })),
    el('div', { class: 'hash', text: `SHA-256 ${file?.sha256 ?? ''}` }),
    el('div', { class: 'file-top' },
    el('dl', { class: 'kv', 'data-testid': `dialect-${index}` },
      el('dt', { text: 'Delimiter' }), el('dd', { text: DELIM_NAME[d.delimiter] }),
      el('dt', { text: 'Decimal sign' }), el('dd', { text: d.decimal === '.' ? 'point (.)' : 'comma (,)' }),
      el('dt', { text: 'Time format' }), el('dd', { text: d.timeFormat }),
      el('dt', { text: 'Header' }), el('dd', { text: d.headerLine === null ? 'none' : `line ${d.headerLine}${d.headerRows === 2 ? ' + units row' : ''}` }),
      el('dt', { text: 'Text' }), el('dd', { text: `${d.lineEnding}${d.hadBom ? ', BOM' : ''}${d.preambleLines ? `, ${d.preambleLines} preamble line(s)` : ''}` }),
      ...(d.forced.length ? [el('dt', { text: 'Overridden' }), el('dd', { text: d.forced.join(', ') })] : []),
    ),
    el('div', { class: 'dialect' },
      el('label', { class: 'field' }, el('span', { text: 'Delimiter' }), delim),
      el('label', { class: 'field' }, el('span', { text: 'Decimal sign' }), dec),
      el('label', { class: 'field' }, el('span', { text: 'Time format' }), tf),
      el('label', { class: 'field' }, el('span', { text: 'Time column' }), timeCol),
      el('label', { class: 'field' }, el('span', { text: 'Sample rate (Hz)' }), rate),
      el('label', { class: 'inline small', for: `skip-${index}` }, skip, 'Skip bad rows (counted)'),
    )),
    el('table', { 'data-testid': `columns-${index}` },
      el('thead', {}, el('tr', {}, ...['#', 'Header', 'Quantity', 'Unit', 'Factor to SI', 'Channel', 'Recognised by'].map((h) => el('th', { text: h })))),
      el('tbody', {}, ...rows),
    ),
    el('div', { class: 'inline' }, apply, reset),
    Object.keys(report.metadata).length ? el('details', {}, el('summary', { text: `Metadata (${Object.keys(report.metadata).length})` }), el('dl', { class: 'kv' }, ...Object.entries(report.metadata).flatMap(([k, v]) => [el('dt', { text: k }), el('dd', { text: v })]))) : null,
    report.warnings.length ? notice('warn', `${report.warnings.length} warning(s) while reading:`) : null,
    warningsList(report.warnings),
  );
}

/** When a file could not be read: the settings that can fix it (delimiter, decimal sign, time, sample rate). */
function fixPanel(app: App, index: number): HTMLElement {
  const s = app.state;
  const file = s.files[index];
  const opts: ImportOptions = { ...(s.importOptions[index] ?? {}) };
  const delim = select('Delimiter', DELIMITERS, opts.delimiter ?? '', `delimiter-${index}`);
  const dec = select('Decimal sign', DECIMALS, opts.decimal ?? '', `decimal-${index}`);
  const tf = select('Time format', TIME_FORMATS, opts.timeFormat ?? '', `timeformat-${index}`);
  const timeCol = el('input', { type: 'number', min: '1', step: '1', value: opts.timeColumn === undefined ? '' : String(opts.timeColumn), placeholder: 'detect', 'aria-label': 'Time column number', 'data-testid': `timecolumn-${index}` });
  const rate = el('input', { type: 'number', step: 'any', min: '0', value: opts.sampleRateHz === undefined ? '' : String(opts.sampleRateHz), placeholder: 'only without time', 'aria-label': 'Sample rate (Hz) for a file without a time column', 'data-testid': `rate-${index}` });
  const skip = el('input', { type: 'checkbox', checked: !!opts.skipBadRows, id: `skip-${index}` });
  const apply = button('Apply and re-read', () => {
    const next: ImportOptions = {};
    if (delim.value) next.delimiter = delim.value as Delimiter;
    if (dec.value) next.decimal = dec.value as '.' | ',';
    if (tf.value) next.timeFormat = tf.value as TimeFormat;
    if (timeCol.value !== '') next.timeColumn = Number(timeCol.value);
    if (rate.value !== '' && Number(rate.value) > 0) next.sampleRateHz = Number(rate.value);
    if (skip.checked) next.skipBadRows = true;
    s.importOptions[index] = next;
    void app.importFiles();
  }, 'btn primary small', { 'data-testid': `apply-import-${index}` });
  return el('section', { class: 'panel file-card', 'aria-label': `Reading options for ${file?.name ?? ''}` },
    el('h3', { text: `${file?.name ?? ''}: reading options` }),
    el('div', { class: 'dialect' },
      el('label', { class: 'field' }, el('span', { text: 'Delimiter' }), delim),
      el('label', { class: 'field' }, el('span', { text: 'Decimal sign' }), dec),
      el('label', { class: 'field' }, el('span', { text: 'Time format' }), tf),
      el('label', { class: 'field' }, el('span', { text: 'Time column (number)' }), timeCol),
      el('label', { class: 'field' }, el('span', { text: 'Sample rate (Hz)' }), rate),
      el('label', { class: 'inline small', for: `skip-${index}` }, skip, 'Skip bad rows (counted)')),
    el('div', { class: 'inline' }, apply));
}

/** Two logs: aligned by their absolute timestamps, or by an offset the user gives. */
function mergePanel(app: App): HTMLElement {
  const s = app.state;
  const offset = el('input', { type: 'number', step: 'any', value: s.mergeOffsetS === null ? '' : String(s.mergeOffsetS), placeholder: 'from timestamps', 'aria-label': 'Start of the second log on the first log time axis (s)', 'data-testid': 'merge-offset' });
  const apply = button('Apply and re-read', () => {
    s.mergeOffsetS = offset.value === '' ? null : Number(offset.value);
    void app.importFiles();
  }, 'btn small');
  return el('section', { class: 'panel', 'aria-label': 'Merging two logs' },
    el('h3', { text: `Two logs of one run: ${s.files.map((f) => f.name).join(' + ')}` }),
    el('p', { class: 'small muted', text: 'They are put on the time base of the faster log (the other is interpolated, never extrapolated). Alignment uses their absolute timestamps; without them, give where the second log starts.' }),
    el('label', { class: 'field' }, el('span', { text: "Start of the second log on the first log's time axis (s); empty = from timestamps" }), el('div', { class: 'inline' }, offset, apply)));
}

export function renderImportView(app: App, root: HTMLElement): void {
  clear(root);
  const s = app.state;
  root.append(viewHead('h-import', 'Import', 'Open or drop one or two logs of one run. Check how every column was read; override anything that is wrong.'));
  if (s.capabilities && !s.capabilities.importer) root.append(notice('unavailable', 'The log importer is not available yet in this build.'));
  if (!s.files.length) {
    root.append(emptyState('No log open yet', 'Drop a CSV/TSV/TXT log anywhere on this window, or open one. Two logs of one run (e.g. a pressure logger and a flow logger) can be opened together.',
      button('Open logs…', () => void app.openLogsDialog(), 'btn primary')));
    root.append(el('p', { class: 'small muted' }, 'Keys: ', el('kbd', { text: 'Ctrl+O' }), ' open logs · ', el('kbd', { text: 'Ctrl+S' }), ' save work · ', el('kbd', { text: 'Ctrl+E' }), ' export report · ', el('kbd', { text: 'Alt+1' }), '…', el('kbd', { text: 'Alt+5' }), ' switch views · ', el('kbd', { text: 'Tab' }), ' moves through every control.'));
    return;
  }
  if (s.files.length > 1) root.append(mergePanel(app));
  if (!s.recording) {
    if (s.importError) {
      root.append(notice('bad', s.importError));
      s.files.forEach((_, i) => root.append(fixPanel(app, i)));
    } else root.append(notice('info', `Reading ${s.files.map((f) => f.name).join(', ')}…`));
    return;
  }
  const r = s.recording;
  const rate = r.sampleCount > 1 && r.durationS > 0 ? (r.sampleCount - 1) / r.durationS : Number.NaN;
  const pair = (k: string, v: string): HTMLElement => el('span', {}, el('span', { class: 'muted small', text: `${k} ` }), el('strong', { class: 'mono', text: v }));
  root.append(el('div', { class: 'panel' },
    el('div', { class: 'summary-row', 'data-testid': 'import-summary' },
      pair('Samples', r.sampleCount.toLocaleString('en')),
      pair('Duration', `${fmt(r.durationS, 5)} s`),
      pair('Mean rate', `${fmt(rate, 4)} Hz`),
      pair('Start', r.startEpochMs === null ? 'not in the log' : new Date(r.startEpochMs).toISOString()),
      pair('Setup suggested', r.suggestedSetup),
      button('Continue to the recording →', () => app.show('recording'), 'btn primary small')),
    el('p', { class: 'small muted', text: `Channels: ${r.channels.map((c) => `${c.name} (${QUANTITY_LABEL[c.quantity]}, from "${c.originalHeader}")`).join('; ')}. Setup: ${r.setupReason}.` }),
    r.warnings.length ? warningsList(r.warnings) : null,
  ));
  r.reports.forEach((rep, i) => root.append(fileCard(app, i, rep)));
}
