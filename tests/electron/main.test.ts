// main.ts wiring with electron mocked: the window is created with the hardening flags the task
// requires (contextIsolation, sandbox, no nodeIntegration), every channel is registered and
// validated, and calls from foreign frames are refused. Common Electron security practice, no source.
import { describe, expect, it, vi } from 'vitest';

const windows: Array<{ options: Record<string, unknown>; url?: string }> = [];
const handlers = new Map<string, (event: unknown, ...args: unknown[]) => Promise<unknown>>();
const schemes: unknown[] = [];
let readyResolve: () => void = () => undefined;
const ready = new Promise<void>((r) => { readyResolve = r; });

vi.mock('electron', () => {
  class BrowserWindow {
    webContents = { send: vi.fn() };
    constructor(options: Record<string, unknown>) {
      windows.push({ options });
    }
    once() { return this; }
    on() { return this; }
    loadURL(url: string) {
      const w = windows.at(-1);
      if (w) w.url = url;
      return Promise.resolve();
    }
    static getAllWindows() { return windows; }
  }
  return {
    app: {
      whenReady: () => ready,
      on: vi.fn(),
      getPath: () => '/tmp/lagbench-main-test-nonexistent',
      getVersion: () => '0.0.0-test',
      exit: vi.fn(),
      quit: vi.fn(),
    },
    BrowserWindow,
    dialog: { showOpenDialog: vi.fn(), showSaveDialog: vi.fn(), showMessageBox: vi.fn() },
    ipcMain: { handle: (ch: string, fn: (event: unknown, ...args: unknown[]) => Promise<unknown>) => handlers.set(ch, fn) },
    Menu: { buildFromTemplate: (t: unknown) => t, setApplicationMenu: vi.fn() },
    protocol: { registerSchemesAsPrivileged: (s: unknown[]) => schemes.push(...s), handle: vi.fn() },
    session: { defaultSession: { setPermissionRequestHandler: vi.fn(), setPermissionCheckHandler: vi.fn(), webRequest: { onBeforeRequest: vi.fn() } } },
  };
});

describe('main', () => {
  it('main creates a sandboxed, isolated window on the app scheme and registers every channel', async () => {
    await import('../../electron/main');
    readyResolve();
    await new Promise((r) => setTimeout(r, 10));
    expect(windows).toHaveLength(1);
    const prefs = windows[0]?.options.webPreferences as Record<string, unknown>;
    expect(prefs.contextIsolation).toBe(true);
    expect(prefs.sandbox).toBe(true);
    expect(prefs.nodeIntegration).toBe(false);
    expect(prefs.webviewTag).toBe(false);
    expect(windows[0]?.url).toBe('lagbench-app://ui/index.html');
    expect(schemes).toEqual([{ scheme: 'lagbench-app', privileges: { standard: true, secure: true, supportFetchAPI: true, corsEnabled: true } }]);
    // Every channel of the contract (electron/ipc.ts, including the QC sign-off channels of electron/qc-ipc.ts) and no other.
    const { CHANNELS, QC_CHANNELS } = await import('../../electron/ipc');
    expect([...handlers.keys()].sort()).toEqual([...Object.values(CHANNELS), ...Object.values(QC_CHANNELS)].sort());
    expect(handlers.has('lagbench:read-logs')).toBe(true);
  });

  it('main refuses IPC from a foreign frame and wrong argument shapes', async () => {
    const read = handlers.get('lagbench:read-logs');
    await expect(read?.({ senderFrame: { url: 'https://evil.example/' } }, ['/etc/passwd'])).rejects.toThrow(/refused/);
    await expect(read?.({ senderFrame: { url: 'lagbench-app://ui/index.html' } }, '/etc/passwd')).rejects.toThrow(/array/);
    await expect(read?.({ senderFrame: { url: 'lagbench-app://ui/index.html' } }, ['/etc/passwd'])).rejects.toThrow(/not opened in this session/);
    const list = handlers.get('lagbench:list-recent');
    await expect(list?.({ senderFrame: { url: 'lagbench-app://ui/index.html' } })).resolves.toEqual([]);
  });
});
