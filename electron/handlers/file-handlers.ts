/**
 * What each invoke channel does in main. Pure of Electron: dialogs, disk and clock are injected,
 * so the handlers are unit-tested with fakes (tests/electron/) and wired to Electron in main.ts.
 */
import { basename, extname, join } from 'node:path';
import type { ChannelArgs, ChannelResults, InvokeChannel, LoadedFile, SaveResult } from '../ipc';
import { CHANNELS, MAX_LOGS } from '../ipc';
import type { PathAllowlist } from './path-allowlist';
import type { RecentFiles } from './recent-files';
import { referencedInputPaths } from './work-references';

/** Largest log main reads into memory for the renderer: 1 GiB. */
export const MAX_LOG_BYTES = 1024 ** 3;
/** Largest work file: 10 MB (it holds settings and step edits, not data). */
export const MAX_WORK_BYTES = 10_000_000;

export interface FileFilter {
  name: string;
  extensions: string[];
}

/** The parts of Electron's `dialog` the handlers use (bound to the window in main.ts). */
export interface DialogPort {
  showOpenDialog(options: { title: string; filters: FileFilter[]; properties: Array<'openFile' | 'multiSelections'> }): Promise<{ canceled: boolean; filePaths: string[] }>;
  showSaveDialog(options: { title: string; defaultPath: string; filters: FileFilter[] }): Promise<{ canceled: boolean; filePath?: string }>;
}

/** Disk access (src/io in main.ts; in-memory fakes in tests). */
export interface FilePort {
  sizeOf(path: string): Promise<number>;
  readBytes(path: string): Promise<Uint8Array>;
  /** Writes atomically: the target holds the old or the new content, never half. */
  writeAtomic(path: string, text: string): void;
}

export interface HandlerDeps {
  dialog: DialogPort;
  files: FilePort;
  recent: RecentFiles;
  allowlist: PathAllowlist;
  nowMs(): number;
  /** Folder proposed in save dialogs. */
  defaultSaveDir: string;
}

export type Handlers = { [C in InvokeChannel]: (...args: ChannelArgs[C]) => Promise<ChannelResults[C]> };

const LOG_FILTERS: FileFilter[] = [
  { name: 'Logs (CSV, TSV, TXT)', extensions: ['csv', 'tsv', 'txt', 'dat', 'log'] },
  { name: 'All files', extensions: ['*'] },
];
const WORK_FILTERS: FileFilter[] = [{ name: 'Lagbench work', extensions: ['lagbench.json', 'json'] }];
const CHIP_FILTERS: FileFilter[] = [{ name: 'Chip description (JSON)', extensions: ['json'] }];
const REPORT_FILTERS: FileFilter[] = [{ name: 'HTML report', extensions: ['html'] }];

/** A readable refusal, shown by the renderer as is. */
export class FileAccessError extends Error {
  override readonly name = 'FileAccessError';
}

async function readChecked(deps: HandlerDeps, path: string, maxBytes: number): Promise<LoadedFile> {
  const size = await deps.files.sizeOf(path).catch(() => {
    throw new FileAccessError(`${path}: cannot be read (missing or no permission). Check that the file still exists.`);
  });
  if (size > maxBytes) throw new FileAccessError(`${path}: ${size} bytes is more than the ${maxBytes} this window reads. Use the command line (lagbench) for files this large.`);
  const bytes = await deps.files.readBytes(path);
  return { path, name: basename(path), bytes };
}

function withExtension(name: string, ext: string): string {
  return extname(name).toLowerCase() === ext ? name : `${name}${ext}`;
}

export function createHandlers(deps: HandlerDeps): Handlers {
  const save = async (title: string, suggestedName: string, text: string, filters: FileFilter[], ext: string): Promise<SaveResult> => {
    const r = await deps.dialog.showSaveDialog({ title, defaultPath: join(deps.defaultSaveDir, withExtension(suggestedName, ext)), filters });
    if (r.canceled || !r.filePath) return null;
    deps.files.writeAtomic(r.filePath, text);
    return { path: r.filePath };
  };

  return {
    async [CHANNELS.openLogs]() {
      const r = await deps.dialog.showOpenDialog({ title: 'Open one or two logs of one run', filters: LOG_FILTERS, properties: ['openFile', 'multiSelections'] });
      if (r.canceled || r.filePaths.length === 0) return null;
      if (r.filePaths.length > MAX_LOGS) throw new FileAccessError(`Choose at most ${MAX_LOGS} logs (one run: e.g. a pressure log and a flow log); you chose ${r.filePaths.length}.`);
      const out: LoadedFile[] = [];
      for (const p of r.filePaths) {
        deps.allowlist.allow(p);
        out.push(await readChecked(deps, p, MAX_LOG_BYTES));
        deps.recent.add(p, 'log', deps.nowMs());
      }
      return out;
    },

    async [CHANNELS.readLogs](paths: string[]) {
      const out: LoadedFile[] = [];
      for (const p of paths) {
        if (!deps.allowlist.allows(p)) throw new FileAccessError(`${p}: not opened in this session. Open it with File ▸ Open logs… first.`);
        out.push(await readChecked(deps, p, MAX_LOG_BYTES));
        deps.recent.add(p, 'log', deps.nowMs());
      }
      return out;
    },

    async [CHANNELS.openWork]() {
      const r = await deps.dialog.showOpenDialog({ title: 'Open saved work', filters: WORK_FILTERS, properties: ['openFile'] });
      const p = r.filePaths[0];
      if (r.canceled || p === undefined) return null;
      const file = await readChecked(deps, p, MAX_WORK_BYTES);
      // The logs a work file names become readable: the user chose this file.
      for (const ref of referencedInputPaths(new TextDecoder().decode(file.bytes))) deps.allowlist.allow(ref);
      deps.recent.add(p, 'work', deps.nowMs());
      return file;
    },

    async [CHANNELS.openChip]() {
      const r = await deps.dialog.showOpenDialog({ title: 'Open a chip description', filters: CHIP_FILTERS, properties: ['openFile'] });
      const p = r.filePaths[0];
      if (r.canceled || p === undefined) return null;
      deps.allowlist.allow(p);
      return readChecked(deps, p, MAX_WORK_BYTES);
    },

    async [CHANNELS.saveWork](suggestedName: string, json: string) {
      const r = await save('Save work', suggestedName, json, WORK_FILTERS, '.json');
      if (r) deps.recent.add(r.path, 'work', deps.nowMs());
      return r;
    },

    async [CHANNELS.saveReport](suggestedName: string, html: string) {
      return save('Export report', suggestedName, html, REPORT_FILTERS, '.html');
    },

    async [CHANNELS.listRecent]() {
      return deps.recent.list();
    },

    async [CHANNELS.clearRecent]() {
      deps.recent.clear();
    },
  };
}

/** Reads recent entries chosen from the menu, allowing them first (the user picked them). */
export async function readRecent(deps: HandlerDeps, path: string, kind: 'log' | 'work'): Promise<LoadedFile[]> {
  deps.allowlist.allow(path);
  const file = await readChecked(deps, path, kind === 'log' ? MAX_LOG_BYTES : MAX_WORK_BYTES);
  if (kind === 'work') for (const ref of referencedInputPaths(new TextDecoder().decode(file.bytes))) deps.allowlist.allow(ref);
  deps.recent.add(path, kind, deps.nowMs());
  return [file];
}
