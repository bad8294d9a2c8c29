/**
 * The renderer's controller: opens files through the API (desktop preload or browser shim), drives
 * the analysis worker, keeps the state and re-renders the views. Views never touch the worker or the
 * API directly.
 */
import type { Chart } from 'chart.js';
import type { LagbenchApi, LoadedFile, MenuEvent } from '../../electron/ipc';
import type { ImportOptions } from '../core/import/types';
import type { Setup } from '../core/steps/types';
import { initialState, VIEWS, type AppState, type OpenFile, type ViewName } from './app-state';
import { addStep, deleteStep, moveStep, normalizeSteps } from './steps-edit';
import { AnalysisClient, Superseded, WorkerError } from './worker/client';
import { sha256Hex } from './helpers/hash';
import { byId } from './helpers/dom';
import { parseWork, serializeWork, WORK_FORMAT, WORK_VERSION, type WorkFile, type WorkInput } from './work/work-file';
import { renderImportView } from './views/import-view';
import { renderRecordingView } from './views/recording-view';
import { renderStepsView } from './views/steps-view';
import { renderDiagnosisView } from './views/diagnosis-view';
import { renderReportView } from './views/report-view';
import { dropOnWhatIf, renderWhatIfView } from './views/whatif-view';
import { dropOnSignOff, renderSignOffView } from './views/signoff-view';
import { buildReportHtml } from './report/report-html';
import { loadedFromDrop } from './api/browser-api';

const THEME_KEY = 'lagbench-theme';
const OVERVIEW_POINTS = 4000;

export class App {
  readonly state: AppState = initialState();
  private readonly charts = new Map<ViewName, Chart[]>();
  private analyzeTimer: ReturnType<typeof setTimeout> | null = null;
  /** Bumped on every (re-)import: results computed for an older recording are dropped. */
  private generation = 0;

  constructor(readonly api: LagbenchApi, readonly worker: AnalysisClient) {}

  async start(): Promise<void> {
    this.applyStoredTheme();
    this.wireChrome();
    this.api.onMenu((e) => void this.onMenu(e));
    try {
      this.state.capabilities = await this.worker.request('capabilities', {});
    } catch (err) {
      this.status(`The analysis engine could not start: ${errorText(err)}`, true);
    }
    this.show('import');
    document.documentElement.dataset.ready = 'true';
  }

  // ---- chrome --------------------------------------------------------------------------------

  private wireChrome(): void {
    byId('btn-open-logs').addEventListener('click', () => void this.openLogsDialog());
    byId('btn-open-work').addEventListener('click', () => void this.openWorkDialog());
    byId('btn-save-work').addEventListener('click', () => void this.saveWork());
    byId('btn-export-report').addEventListener('click', () => void this.exportReport());
    byId('btn-theme').addEventListener('click', () => this.toggleTheme());
    byId('btn-chip').addEventListener('click', () => void this.openChipDialog());
    byId('btn-chip-clear').addEventListener('click', () => this.setChip(null));
    const setup = byId<HTMLSelectElement>('setup-select');
    setup.addEventListener('change', () => void this.setSetup(setup.value as Setup));
    for (const v of VIEWS) byId(`nav-${v}`).addEventListener('click', () => this.show(v));
    // Drag and drop anywhere on the window.
    const overlay = byId('drop-overlay');
    let depth = 0;
    window.addEventListener('dragenter', (e) => {
      if (!e.dataTransfer?.types.includes('Files')) return;
      depth++;
      overlay.hidden = false;
    });
    window.addEventListener('dragleave', () => {
      depth = Math.max(0, depth - 1);
      if (depth === 0) overlay.hidden = true;
    });
    window.addEventListener('dragover', (e) => e.preventDefault());
    window.addEventListener('drop', (e) => {
      e.preventDefault();
      depth = 0;
      overlay.hidden = true;
      const list = e.dataTransfer?.files;
      if (list && list.length && !dropOnWhatIf(this, list) && !dropOnSignOff(this, list)) void this.openDropped(list);
    });
    window.addEventListener('keydown', (e) => {
      const mod = e.ctrlKey || e.metaKey;
      if (mod && e.key.toLowerCase() === 'o' && !e.shiftKey) {
        e.preventDefault();
        void this.openLogsDialog();
      } else if (mod && e.key.toLowerCase() === 's') {
        e.preventDefault();
        void this.saveWork();
      } else if (mod && e.key.toLowerCase() === 'e') {
        e.preventDefault();
        void this.exportReport();
      } else if (e.altKey && /^[1-7]$/.test(e.key)) {
        e.preventDefault();
        this.show(VIEWS[Number(e.key) - 1] as ViewName);
      }
    });
  }

  private async onMenu(e: MenuEvent): Promise<void> {
    switch (e.command) {
      case 'open-logs': return this.openLogsDialog();
      case 'open-work': return this.openWorkDialog();
      case 'save-work': return this.saveWork();
      case 'export-report': return this.exportReport();
      case 'toggle-theme': return this.toggleTheme();
      case 'open-recent':
        if (e.kind === 'work' && e.files?.[0]) return this.openWorkFile(e.files[0]);
        if (e.files?.length) return this.openLogFiles(e.files);
        return;
      default:
        if (e.command.startsWith('show-view-')) this.show(e.command.slice('show-view-'.length) as ViewName);
    }
  }

  status(text: string, error = false): void {
    const el = byId('status-text');
    el.textContent = text;
    el.classList.toggle('error', error);
  }

  progress(fraction: number | null, label = ''): void {
    const box = byId('progress');
    if (fraction === null) {
      box.hidden = true;
      return;
    }
    box.hidden = false;
    const pct = Math.round(Math.min(1, Math.max(0, fraction)) * 100);
    byId('progress-fill').style.width = `${pct}%`;
    byId('progress-bar').setAttribute('aria-valuenow', String(pct));
    byId('progress-label').textContent = `${label} ${pct} %`;
  }

  // ---- theme ---------------------------------------------------------------------------------

  private applyStoredTheme(): void {
    const stored = localStorage.getItem(THEME_KEY);
    if (stored === 'light' || stored === 'dark') document.documentElement.dataset.theme = stored;
    this.updateThemeButton();
  }

  currentTheme(): 'light' | 'dark' {
    const set = document.documentElement.dataset.theme;
    if (set === 'light' || set === 'dark') return set;
    return window.matchMedia('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
  }

  toggleTheme(): void {
    const next = this.currentTheme() === 'dark' ? 'light' : 'dark';
    document.documentElement.dataset.theme = next;
    localStorage.setItem(THEME_KEY, next);
    this.updateThemeButton();
    this.render();
  }

  private updateThemeButton(): void {
    const btn = byId('btn-theme');
    const dark = this.currentTheme() === 'dark';
    btn.setAttribute('aria-pressed', String(dark));
    btn.querySelector('.theme-label')!.textContent = dark ? 'Light theme' : 'Dark theme';
  }

  // ---- views ---------------------------------------------------------------------------------

  show(view: ViewName): void {
    this.state.view = view;
    for (const v of VIEWS) {
      byId(`view-${v}`).hidden = v !== view;
      const nav = byId(`nav-${v}`);
      if (v === view) nav.setAttribute('aria-current', 'page');
      else nav.removeAttribute('aria-current');
    }
    this.render();
  }

  /** Registers charts of a view so they are destroyed before it is drawn again. */
  keepCharts(view: ViewName, charts: Chart[]): void {
    this.charts.set(view, [...(this.charts.get(view) ?? []), ...charts]);
  }

  render(): void {
    const view = this.state.view;
    for (const c of this.charts.get(view) ?? []) c.destroy();
    this.charts.set(view, []);
    const root = byId(`view-${view}`);
    // Re-rendering replaces the view's elements: keep keyboard focus (and a half-typed value) where it was.
    const active = document.activeElement instanceof HTMLElement && root.contains(document.activeElement) ? document.activeElement : null;
    const key = active ? (active.id ? `#${active.id}` : active.dataset.testid ? `[data-testid="${active.dataset.testid}"]` : null) : null;
    const typed = active instanceof HTMLInputElement && active.type !== 'checkbox' ? active.value : null;
    const renderers: Record<ViewName, (app: App, root: HTMLElement) => void> = {
      import: renderImportView,
      recording: renderRecordingView,
      steps: renderStepsView,
      diagnosis: renderDiagnosisView,
      report: renderReportView,
      whatif: renderWhatIfView,
      signoff: renderSignOffView,
    };
    renderers[view](this, root);
    if (key && !(document.activeElement instanceof HTMLElement && root.contains(document.activeElement) && document.activeElement !== document.body)) {
      const again = root.querySelector<HTMLElement>(key);
      if (again) {
        again.focus();
        if (typed !== null && again instanceof HTMLInputElement && again.value === '') again.value = typed;
      }
    }
    this.renderChrome();
  }

  private renderChrome(): void {
    const s = this.state;
    byId('file-summary').textContent = s.files.length ? s.files.map((f) => f.name).join(' + ') + (s.recording ? ` · ${s.recording.sampleCount.toLocaleString('en')} samples · ${s.recording.durationS.toFixed(1)} s` : '') : 'No logs open';
    (byId('btn-save-work') as HTMLButtonElement).disabled = s.files.length === 0;
    (byId('btn-export-report') as HTMLButtonElement).disabled = !s.analysis;
    byId<HTMLSelectElement>('setup-select').value = s.setup;
    byId('setup-hint').textContent = s.setup === 'flow-driven' ? 'a pump sets the flow; pressure is the response' : 'a regulator or head sets the pressure; flow is the response';
    byId('chip-status').textContent = s.chip ? s.chip.name : 'none (optional)';
    byId('btn-chip-clear').hidden = !s.chip;
    byId('nav-import').classList.toggle('done', !!s.recording);
    byId('nav-recording').classList.toggle('done', s.steps.length > 0);
    byId('nav-steps').classList.toggle('done', !!s.analysis);
    byId('nav-diagnosis').classList.toggle('done', !!s.analysis?.nominal || !!s.analysis?.trappedAir);
  }

  // ---- opening -------------------------------------------------------------------------------

  async openLogsDialog(): Promise<void> {
    try {
      const files = await this.api.openLogs();
      if (files) await this.openLogFiles(files);
    } catch (err) {
      this.status(errorText(err), true);
    }
  }

  private async openDropped(list: FileList): Promise<void> {
    const files = await loadedFromDrop(list);
    if (files.length > 2) {
      this.status(`Drop at most 2 logs (one run); you dropped ${files.length}.`, true);
      return;
    }
    await this.openLogFiles(files);
  }

  async openLogFiles(files: LoadedFile[], options: ImportOptions[] = [], keepSteps: WorkFile['steps'] = null, mergeOffsetS: number | null = null): Promise<void> {
    const open: OpenFile[] = [];
    for (const f of files) open.push({ ...f, sha256: await sha256Hex(f.bytes) });
    this.state.files = open;
    this.state.importOptions = files.map((_, i) => options[i] ?? {});
    this.state.mergeOffsetS = mergeOffsetS;
    this.state.stepEdits = [];
    await this.importFiles(true, keepSteps);
  }

  /** (Re-)imports the open files with the current overrides, then detects steps and analyses. */
  async importFiles(adoptSetup = false, keepSteps: WorkFile['steps'] = null): Promise<void> {
    const s = this.state;
    if (!s.files.length) return;
    this.generation++;
    s.recording = null;
    s.importError = null;
    s.analysis = null;
    s.overview = null;
    s.steps = [];
    s.detected = null;
    this.render();
    try {
      this.status(`Reading ${s.files.map((f) => f.name).join(', ')}…`);
      const copies = s.files.map((f) => ({ name: f.name, bytes: f.bytes.slice() }));
      s.recording = await this.worker.request('import', { files: copies, options: s.importOptions, mergeOffsetS: s.files.length > 1 ? s.mergeOffsetS : null }, (f, label) => this.progress(f, label), copies.map((c) => c.bytes.buffer));
      if (adoptSetup) s.setup = s.recording.suggestedSetup;
      s.overview = await this.worker.request('series', { fromS: null, toS: null, maxPoints: OVERVIEW_POINTS });
      this.progress(null);
      this.status(`Imported ${s.recording.sampleCount.toLocaleString('en')} samples over ${s.recording.durationS.toFixed(1)} s. Setup: ${s.setup} (${adoptSetup ? s.recording.setupReason : 'chosen'}).`);
      this.render();
      if (keepSteps) {
        s.steps = normalizeSteps(keepSteps.map((k, i) => ({ ...k, index: i, windowEndS: 0 })), s.recording.durationS);
        await this.analyzeNow();
      } else await this.detect();
    } catch (err) {
      this.progress(null);
      if (!s.recording) s.importError = errorText(err);
      this.status(errorText(err), true);
      this.render();
    }
  }

  async detect(): Promise<void> {
    const s = this.state;
    if (!s.recording) return;
    try {
      const generation = this.generation;
      const detected = await this.worker.request('detect', { setup: s.setup });
      if (generation !== this.generation) return;
      s.detected = detected;
      s.steps = normalizeSteps(s.detected.steps, s.recording.durationS);
      s.stepEdits = [];
      s.selectedStep = s.steps.length ? 0 : null;
      s.fitStep = 0;
      this.status(`Found ${s.steps.length} step(s) on ${s.detected.channel ?? 'the response'}.`);
      this.render();
      await this.analyzeNow();
    } catch (err) {
      this.status(errorText(err), true);
    }
  }

  async setSetup(setup: Setup): Promise<void> {
    this.state.setup = setup;
    if (this.state.recording) await this.detect();
    else this.render();
  }

  // ---- steps ---------------------------------------------------------------------------------

  editSteps(kind: 'move' | 'add' | 'delete', index: number | null, atS?: number): void {
    const s = this.state;
    if (!s.recording) return;
    const dur = s.recording.durationS;
    if (kind === 'move' && index !== null && atS !== undefined) {
      const from = s.steps[index]?.onsetS ?? Number.NaN;
      s.steps = moveStep(s.steps, index, atS, dur);
      const to = s.steps[index]?.onsetS ?? Number.NaN;
      const last = s.stepEdits.at(-1);
      // Consecutive nudges of one step are one edit.
      if (last?.action === 'move' && last.toS === from) last.toS = to;
      else s.stepEdits.push({ action: 'move', fromS: from, toS: to });
      s.selectedStep = index;
    } else if (kind === 'add' && atS !== undefined) {
      const q = s.steps[0]?.drive.quantity ?? s.detected?.quantity ?? (s.setup === 'flow-driven' ? 'flow_setpoint' : 'pressure_setpoint');
      const before = s.steps.length;
      s.steps = addStep(s.steps, atS, dur, q);
      if (s.steps.length === before) {
        this.status(`No step added at ${atS} s: it must lie inside the recording (0–${dur.toFixed(2)} s) and not on an existing step.`, true);
        return;
      }
      s.stepEdits.push({ action: 'add', atS });
      s.selectedStep = s.steps.findIndex((x) => x.onsetS === atS);
    } else if (kind === 'delete' && index !== null) {
      const at = s.steps[index]?.onsetS ?? Number.NaN;
      s.steps = deleteStep(s.steps, index, dur);
      s.stepEdits.push({ action: 'delete', atS: at });
      s.selectedStep = s.steps.length ? Math.min(index, s.steps.length - 1) : null;
    }
    s.fitStep = Math.min(s.fitStep, Math.max(0, s.steps.length - 1));
    this.render();
    this.scheduleAnalyze();
  }

  scheduleAnalyze(delayMs = 300): void {
    if (this.analyzeTimer) clearTimeout(this.analyzeTimer);
    this.analyzeTimer = setTimeout(() => void this.analyzeNow(), delayMs);
  }

  async analyzeNow(): Promise<void> {
    const s = this.state;
    if (!s.recording) return;
    if (this.analyzeTimer) clearTimeout(this.analyzeTimer);
    this.analyzeTimer = null;
    if (s.steps.length === 0) {
      s.analysis = null;
      this.render();
      return;
    }
    s.analyzing = true;
    this.status(`Fitting ${s.steps.length} step(s)…`);
    const generation = this.generation;
    try {
      const chipText = s.chip ? new TextDecoder().decode(s.chip.bytes) : null;
      const analysis = await this.worker.request(
        'analyze',
        { setup: s.setup, steps: s.steps, chipText, chipName: s.chip?.name ?? null, fit: s.fit, stepIndices: null },
        (f, label) => this.progress(f, label),
      );
      if (generation !== this.generation) return;
      s.analysis = analysis;
      s.analysisRuns++;
      s.analyzing = false;
      this.progress(null);
      const ok = s.analysis.fits.filter((f) => f.fit?.converged).length;
      this.status(`Analysis done: ${ok} of ${s.analysis.fits.length} fit(s) converged.`);
      document.documentElement.dataset.analysisRuns = String(s.analysisRuns);
      this.render();
    } catch (err) {
      if (err instanceof Superseded) return;
      s.analyzing = false;
      this.progress(null);
      this.status(errorText(err), true);
      this.render();
    }
  }

  // ---- chip ----------------------------------------------------------------------------------

  async openChipDialog(): Promise<void> {
    try {
      const f = await this.api.openChip();
      if (f) await this.setChip(f);
    } catch (err) {
      this.status(errorText(err), true);
    }
  }

  async setChip(file: LoadedFile | null): Promise<void> {
    this.state.chip = file ? { ...file, sha256: await sha256Hex(file.bytes) } : null;
    this.status(file ? `Chip description ${file.name} loaded.` : 'Chip description removed.');
    this.render();
    if (this.state.recording) await this.analyzeNow();
  }

  // ---- work files ----------------------------------------------------------------------------

  private ref(f: OpenFile): WorkInput {
    return { path: f.path, name: f.name, sha256: f.sha256, bytes: f.bytes.length };
  }

  workFile(): WorkFile {
    const s = this.state;
    return {
      format: WORK_FORMAT,
      version: WORK_VERSION,
      savedAt: new Date().toISOString(),
      inputs: s.files.map((f) => this.ref(f)),
      importOptions: s.importOptions,
      mergeOffsetS: s.mergeOffsetS,
      setup: s.setup,
      chip: s.chip ? this.ref(s.chip) : null,
      fit: s.fit,
      steps: s.stepEdits.length ? s.steps.map((x) => ({ onsetS: x.onsetS, origin: x.origin, drive: x.drive, direction: x.direction })) : null,
      stepEdits: s.stepEdits,
    };
  }

  async saveWork(): Promise<void> {
    if (!this.state.files.length) return;
    try {
      const base = (this.state.files[0]?.name ?? 'work').replace(/\.[^.]+$/, '');
      const r = await this.api.saveWork(`${base}.lagbench.json`, serializeWork(this.workFile()));
      if (r) this.status(`Work saved to ${r.path}.`);
    } catch (err) {
      this.status(errorText(err), true);
    }
  }

  async openWorkDialog(): Promise<void> {
    try {
      const f = await this.api.openWork();
      if (f) await this.openWorkFile(f);
    } catch (err) {
      this.status(errorText(err), true);
    }
  }

  /** Reopens saved work: reads the logs again (desktop) or asks for them (browser), checking their hashes. */
  async openWorkFile(file: LoadedFile): Promise<void> {
    try {
      const work = parseWork(new TextDecoder().decode(file.bytes), file.name);
      let logs: LoadedFile[];
      if (this.api.platform === 'desktop') logs = await this.api.readLogs(work.inputs.map((i) => i.path));
      else {
        this.status(`Choose the log(s) of this work: ${work.inputs.map((i) => i.name).join(', ')}.`);
        const picked = await this.api.openLogs();
        if (!picked) return;
        logs = picked;
      }
      for (const [i, input] of work.inputs.entries()) {
        const got = logs[i];
        if (!got) throw new Error(`${file.name}: the log ${input.name} is missing.`);
        const hash = await sha256Hex(got.bytes);
        if (hash !== input.sha256) throw new Error(`${got.name} is not the file this work was saved with (SHA-256 differs). Choose the original log.`);
      }
      this.state.setup = work.setup;
      this.state.fit = work.fit;
      if (work.chip && this.api.platform === 'desktop') {
        const [chip] = await this.api.readLogs([work.chip.path]);
        if (chip && (await sha256Hex(chip.bytes)) === work.chip.sha256) this.state.chip = { ...chip, sha256: work.chip.sha256 };
        else this.status(`The chip description ${work.chip.name} changed or is missing; load it again.`, true);
      } else if (work.chip) this.status(`This work used the chip description ${work.chip.name}; load it with "Load chip JSON…".`);
      await this.openLogFiles(logs, work.importOptions, work.steps, work.mergeOffsetS);
      this.state.stepEdits = work.stepEdits;
      this.render();
    } catch (err) {
      this.status(errorText(err), true);
    }
  }

  // ---- report --------------------------------------------------------------------------------

  async exportReport(): Promise<void> {
    if (!this.state.analysis) {
      this.status('Nothing to report yet: open a log and let the analysis finish.', true);
      return;
    }
    try {
      this.status('Rendering the report…');
      const html = await buildReportHtml(this.state);
      const base = (this.state.files[0]?.name ?? 'run').replace(/\.[^.]+$/, '');
      const r = await this.api.saveReport(`${base}-report.html`, html);
      if (r) this.status(`Report saved: ${r.path}.`);
      else this.status('Report export cancelled.');
    } catch (err) {
      this.status(errorText(err), true);
    }
  }
}

export function errorText(err: unknown): string {
  if (err instanceof WorkerError) return err.inputError ? `Input problem: ${err.message}` : err.message;
  return err instanceof Error ? err.message : String(err);
}
