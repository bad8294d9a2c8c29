/**
 * The preload API implemented for a plain browser (used when `window.lagbench` is absent, e.g. the
 * renderer served locally for the browser tests): file inputs and drag-drop instead of dialogs,
 * downloads instead of save dialogs. Paths are file names here; recent files are not kept (a browser
 * cannot re-read a file without the user choosing it again).
 */
import type { LagbenchApi, LoadedFile, MenuEvent, RecentEntry } from '../../../electron/ipc';
import { MAX_LOGS } from '../../../electron/ipc';
import { createBridgeQcApi } from './bridge-qc-api';
import { downloadText } from './download';

async function toLoaded(file: File): Promise<LoadedFile> {
  return { path: file.name, name: file.name, bytes: new Uint8Array(await file.arrayBuffer()) };
}

/** A hidden, persistent file input (tests may also set files on it directly; see `onMenu`). */
function fileInput(id: string, accept: string, multiple: boolean): HTMLInputElement {
  const existing = document.getElementById(id);
  if (existing instanceof HTMLInputElement) return existing;
  const input = document.createElement('input');
  input.type = 'file';
  input.id = id;
  input.accept = accept;
  input.multiple = multiple;
  input.hidden = true;
  input.setAttribute('aria-hidden', 'true');
  document.body.append(input);
  return input;
}

export function createBrowserApi(): LagbenchApi {
  const listeners = new Set<(e: MenuEvent) => void>();
  const inputs = {
    logs: fileInput('file-input-logs', '.csv,.tsv,.txt,.dat,.log,text/*', true),
    work: fileInput('file-input-work', '.json,application/json', false),
    chip: fileInput('file-input-chip', '.json,application/json', false),
  };
  // A pick either answers a pending open…() call or, when none is pending (files set on the input by a
  // test or an assistive tool), arrives as an 'open-recent'-style event.
  const pending: Partial<Record<keyof typeof inputs, (files: LoadedFile[] | null) => void>> = {};
  for (const [key, input] of Object.entries(inputs) as Array<[keyof typeof inputs, HTMLInputElement]>) {
    input.addEventListener('change', () => {
      const files = [...(input.files ?? [])];
      input.value = '';
      void Promise.all(files.map(toLoaded)).then((loaded) => {
        const waiting = pending[key];
        delete pending[key];
        if (waiting) waiting(loaded.length ? loaded : null);
        else if (loaded.length && key !== 'chip') for (const l of listeners) l({ command: 'open-recent', files: loaded, kind: key === 'logs' ? 'log' : 'work' });
      });
    });
    input.addEventListener('cancel', () => {
      pending[key]?.(null);
      delete pending[key];
    });
  }
  const pick = (key: keyof typeof inputs): Promise<LoadedFile[] | null> =>
    new Promise((resolve) => {
      pending[key]?.(null);
      pending[key] = resolve;
      inputs[key].click();
    });

  return {
    platform: 'browser',
    async openLogs() {
      const files = await pick('logs');
      if (files && files.length > MAX_LOGS) throw new Error(`Choose at most ${MAX_LOGS} logs (one run: e.g. a pressure log and a flow log); you chose ${files.length}.`);
      return files;
    },
    async readLogs(paths: string[]) {
      throw new Error(`In the browser, files cannot be re-read by name (${paths.join(', ')}). Choose them again with Open logs….`);
    },
    async openWork() {
      return (await pick('work'))?.[0] ?? null;
    },
    async openChip() {
      return (await pick('chip'))?.[0] ?? null;
    },
    async saveWork(name: string, json: string) {
      return downloadText(name.endsWith('.json') ? name : `${name}.json`, json, 'application/json');
    },
    async saveReport(name: string, html: string) {
      return downloadText(name.endsWith('.html') ? name : `${name}.html`, html, 'text/html');
    },
    async listRecent(): Promise<RecentEntry[]> {
      return [];
    },
    async clearRecent() {
      /* nothing kept in the browser */
    },
    qc: createBridgeQcApi(),
    onMenu(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}

/** Emits dropped files through the same path as picked ones. */
export async function loadedFromDrop(list: FileList): Promise<LoadedFile[]> {
  return Promise.all([...list].map(toLoaded));
}
