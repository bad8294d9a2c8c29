/**
 * Recently opened logs and work files, kept as JSON in the app's userData folder and written
 * atomically (a crash never leaves a half-written list). A damaged list is ignored, not fatal.
 */
import type { RecentEntry } from '../ipc';

/** How many entries are kept. */
export const MAX_RECENT = 12;

/** File access the store needs (injected so tests run without disk or Electron). */
export interface RecentStorage {
  read(): string | null;
  write(text: string): void;
}

function isEntry(v: unknown): v is RecentEntry {
  if (typeof v !== 'object' || v === null) return false;
  const e = v as Record<string, unknown>;
  return typeof e.path === 'string' && e.path.length > 0 && (e.kind === 'log' || e.kind === 'work') && typeof e.openedAtMs === 'number' && Number.isFinite(e.openedAtMs);
}

/** Parses a stored list, dropping anything malformed. */
export function parseRecent(text: string | null): RecentEntry[] {
  if (text === null) return [];
  try {
    const data: unknown = JSON.parse(text);
    const list = typeof data === 'object' && data !== null ? (data as { entries?: unknown }).entries : undefined;
    return Array.isArray(list) ? list.filter(isEntry).slice(0, MAX_RECENT) : [];
  } catch {
    return [];
  }
}

export class RecentFiles {
  private entries: RecentEntry[];

  constructor(private readonly storage: RecentStorage) {
    this.entries = parseRecent(storage.read());
  }

  list(): RecentEntry[] {
    return this.entries.map((e) => ({ ...e }));
  }

  /** Moves (or adds) `path` to the top and persists the list. */
  add(path: string, kind: RecentEntry['kind'], nowMs: number): void {
    this.entries = [{ path, kind, openedAtMs: nowMs }, ...this.entries.filter((e) => !(e.path === path && e.kind === kind))].slice(0, MAX_RECENT);
    this.persist();
  }

  clear(): void {
    this.entries = [];
    this.persist();
  }

  private persist(): void {
    this.storage.write(`${JSON.stringify({ format: 'lagbench-recent', version: 1, entries: this.entries }, null, 2)}\n`);
  }
}
