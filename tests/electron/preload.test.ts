// The preload exposes exactly the typed API through contextBridge, with electron mocked
// (the Electron runtime cannot be downloaded here; GUIDE §4).
import { beforeEach, describe, expect, it, vi } from 'vitest';

const exposed: Record<string, unknown> = {};
const invoke = vi.fn(async (..._args: unknown[]) => 'ok');
const on = vi.fn();
const removeListener = vi.fn();

vi.mock('electron', () => ({
  contextBridge: { exposeInMainWorld: (key: string, api: unknown) => { exposed[key] = api; } },
  ipcRenderer: { invoke: (...a: unknown[]) => invoke(...a), on: (...a: unknown[]) => on(...a), removeListener: (...a: unknown[]) => removeListener(...a) },
}));

describe('preload', () => {
  beforeEach(async () => {
    await import('../../electron/preload');
  });

  it('preload exposes window.lagbench with the desktop platform and the API methods only', () => {
    const api = exposed.lagbench as Record<string, unknown>;
    expect(api.platform).toBe('desktop');
    expect(Object.keys(api).sort()).toEqual(['clearRecent', 'listRecent', 'onMenu', 'openChip', 'openLogs', 'openWork', 'platform', 'qc', 'readLogs', 'saveReport', 'saveWork']);
  });

  it('preload saveReport invokes its channel with the name and text', async () => {
    const api = exposed.lagbench as { saveReport(n: string, h: string): Promise<unknown> };
    await api.saveReport('r.html', '<p>x</p>');
    expect(invoke).toHaveBeenCalledWith('lagbench:save-report', 'r.html', '<p>x</p>');
  });

  it('preload onMenu forwards only well-formed menu events and unsubscribes', () => {
    const api = exposed.lagbench as { onMenu(l: (e: unknown) => void): () => void };
    const seen: unknown[] = [];
    const off = api.onMenu((e) => seen.push(e));
    const wrapped = on.mock.calls.at(-1)?.[1] as (e: unknown, p: unknown) => void;
    wrapped(null, { command: 'save-work' });
    wrapped(null, { command: 'shell-exec' });
    expect(seen).toEqual([{ command: 'save-work' }]);
    off();
    expect(removeListener).toHaveBeenCalledWith('lagbench:menu', wrapped);
  });
});
