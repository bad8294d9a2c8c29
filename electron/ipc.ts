/**
 * The one contract between the renderer and the main process: every IPC channel, its argument and
 * result types, and the runtime validators main applies before acting (a compromised or buggy renderer
 * must not be able to make main read or write arbitrary paths).
 *
 * The renderer sees these channels as `window.lagbench` ({@link LagbenchApi}); in a plain browser the
 * same interface is implemented with file inputs and downloads (src/ui/api/browser-api.ts).
 */

import type { QcApi } from './qc-ipc';
export * from './qc-ipc';

/** A log or work file read for the renderer. `path` is absolute in the desktop app; in a browser it is the file name. */
export interface LoadedFile {
  path: string;
  /** Base name shown to the user. */
  name: string;
  /** The file's bytes, untouched (the renderer decodes and hashes them). */
  bytes: Uint8Array;
}

export interface RecentEntry {
  path: string;
  /** What the entry is: a log to import or a saved piece of work. */
  kind: 'log' | 'work';
  /** When it was last opened, Unix epoch ms. */
  openedAtMs: number;
}

/** Result of a save: where it went, or null when the user cancelled. */
export type SaveResult = { path: string } | null;

/** Commands the application menu sends to the renderer. */
export type MenuCommand =
  | 'open-logs'
  | 'open-work'
  | 'save-work'
  | 'export-report'
  | 'toggle-theme'
  | 'show-view-import'
  | 'show-view-recording'
  | 'show-view-steps'
  | 'show-view-diagnosis'
  | 'show-view-report';

export const MENU_COMMANDS: readonly MenuCommand[] = [
  'open-logs',
  'open-work',
  'save-work',
  'export-report',
  'toggle-theme',
  'show-view-import',
  'show-view-recording',
  'show-view-steps',
  'show-view-diagnosis',
  'show-view-report',
];

/** A menu event: a command, or "open these recent paths" (already allowed by main). */
export interface MenuEvent {
  command: MenuCommand | 'open-recent';
  /** For 'open-recent': the files main has read for the renderer. */
  files?: LoadedFile[];
  /** For 'open-recent' of a work file. */
  kind?: 'log' | 'work';
}

/** The API the preload exposes as `window.lagbench` (and the browser shim imitates). */
export interface LagbenchApi {
  /** Which implementation this is (the renderer adapts a few labels, e.g. "Save…" vs "Download"). */
  readonly platform: 'desktop' | 'browser';
  /** Lets the user pick one or two logs; null when cancelled. */
  openLogs(): Promise<LoadedFile[] | null>;
  /** Reads logs by path. Main only reads paths the user chose before (dialogs, recent files, an opened work file). */
  readLogs(paths: string[]): Promise<LoadedFile[]>;
  /** Lets the user pick a chip description (JSON); null when cancelled. */
  openChip(): Promise<LoadedFile | null>;
  /** Lets the user pick a saved work file; null when cancelled. */
  openWork(): Promise<LoadedFile | null>;
  /** Saves a work file (JSON text) atomically where the user chooses. */
  saveWork(suggestedName: string, json: string): Promise<SaveResult>;
  /** Saves a self-contained HTML report atomically where the user chooses. */
  saveReport(suggestedName: string, html: string): Promise<SaveResult>;
  /** Recently opened logs and work files, newest first. */
  listRecent(): Promise<RecentEntry[]>;
  clearRecent(): Promise<void>;
  /** Subscribes to menu commands; returns an unsubscribe function. */
  onMenu(listener: (event: MenuEvent) => void): () => void;
  /** QC sign-off record store (electron/qc-ipc.ts); absent where records cannot be kept. */
  readonly qc?: QcApi;
}

/** Invoke channels (renderer → main, with a reply). Names are the wire names. */
export const CHANNELS = {
  openLogs: 'lagbench:open-logs',
  readLogs: 'lagbench:read-logs',
  openWork: 'lagbench:open-work',
  openChip: 'lagbench:open-chip',
  saveWork: 'lagbench:save-work',
  saveReport: 'lagbench:save-report',
  listRecent: 'lagbench:list-recent',
  clearRecent: 'lagbench:clear-recent',
} as const;

/** Event channel (main → renderer). */
export const MENU_EVENT_CHANNEL = 'lagbench:menu';

export type InvokeChannel = (typeof CHANNELS)[keyof typeof CHANNELS];

/** Argument tuples of each invoke channel, as sent over IPC. */
export interface ChannelArgs {
  'lagbench:open-logs': [];
  'lagbench:read-logs': [paths: string[]];
  'lagbench:open-work': [];
  'lagbench:open-chip': [];
  'lagbench:save-work': [suggestedName: string, json: string];
  'lagbench:save-report': [suggestedName: string, html: string];
  'lagbench:list-recent': [];
  'lagbench:clear-recent': [];
}

export interface ChannelResults {
  'lagbench:open-logs': LoadedFile[] | null;
  'lagbench:read-logs': LoadedFile[];
  'lagbench:open-work': LoadedFile | null;
  'lagbench:open-chip': LoadedFile | null;
  'lagbench:save-work': SaveResult;
  'lagbench:save-report': SaveResult;
  'lagbench:list-recent': RecentEntry[];
  'lagbench:clear-recent': void;
}

/** Largest text main accepts to save (reports embed PNGs, so generous): 200 MB. */
export const MAX_SAVE_CHARS = 200_000_000;
/** Most logs read at once: one run is at most two logs (pressure logger + flow logger). */
export const MAX_LOGS = 2;

/** Thrown (and sent back as a rejected invoke) when the renderer sends arguments of the wrong shape. */
export class IpcArgumentError extends Error {
  override readonly name = 'IpcArgumentError';
}

function isPlainName(s: unknown): s is string {
  // A suggested file name: no folders, no control characters, sensible length.
  return typeof s === 'string' && s.length > 0 && s.length <= 200 && !/[/\\\u0000-\u001f]/.test(s) && s !== '.' && s !== '..';
}

function isText(s: unknown): s is string {
  return typeof s === 'string' && s.length <= MAX_SAVE_CHARS;
}

/**
 * Checks the arguments of an invoke channel and returns them typed; throws {@link IpcArgumentError}
 * naming the channel and what was wrong.
 */
export function validateArgs<C extends InvokeChannel>(channel: C, args: unknown[]): ChannelArgs[C] {
  const fail = (what: string): never => {
    throw new IpcArgumentError(`${channel}: ${what}`);
  };
  switch (channel) {
    case CHANNELS.openLogs:
    case CHANNELS.openWork:
    case CHANNELS.openChip:
    case CHANNELS.listRecent:
    case CHANNELS.clearRecent:
      if (args.length !== 0) fail(`expects no arguments, got ${args.length}`);
      return [] as unknown as ChannelArgs[C];
    case CHANNELS.readLogs: {
      if (args.length !== 1) fail(`expects one argument (a list of paths), got ${args.length}`);
      const paths = args[0];
      if (!Array.isArray(paths)) fail('paths must be an array of strings');
      const list = paths as unknown[];
      if (list.length < 1 || list.length > MAX_LOGS) fail(`expects 1 to ${MAX_LOGS} paths, got ${list.length}`);
      for (const p of list) {
        if (typeof p !== 'string' || p.length === 0 || p.length > 4096 || p.includes('\u0000')) fail('every path must be a non-empty string without NUL');
      }
      return [list as string[]] as unknown as ChannelArgs[C];
    }
    case CHANNELS.saveWork:
    case CHANNELS.saveReport: {
      if (args.length !== 2) fail(`expects two arguments (suggested name, text), got ${args.length}`);
      const [name, text] = args;
      if (!isPlainName(name)) fail('the suggested name must be a plain file name (no folders), 1–200 characters');
      if (!isText(text)) fail(`the text must be a string of at most ${MAX_SAVE_CHARS} characters`);
      return [name, text] as unknown as ChannelArgs[C];
    }
    default:
      return fail('unknown channel');
  }
}

/** Checks a menu event before the renderer acts on it. */
export function isMenuEvent(value: unknown): value is MenuEvent {
  if (typeof value !== 'object' || value === null) return false;
  const v = value as Record<string, unknown>;
  if (v.command === 'open-recent') return Array.isArray(v.files) && (v.kind === 'log' || v.kind === 'work');
  return typeof v.command === 'string' && (MENU_COMMANDS as readonly string[]).includes(v.command);
}
