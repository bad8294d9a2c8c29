/**
 * Electron main process: one window showing the renderer bundle from the `lagbench-app://` scheme,
 * the application menu, file dialogs and recent files. All disk access goes through the handlers
 * (validated IPC), written atomically via src/io.
 */
import { app, BrowserWindow, dialog, ipcMain, Menu, protocol, session, type MenuItemConstructorOptions } from 'electron';
import { mkdirSync, readFileSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { writeFileAtomic } from '../src/io/atomic-write';
import { fileSizeBytes, readFileBytes } from '../src/io/read-bytes';
import { CONTENT_SECURITY_POLICY } from './csp';
import { MENU_EVENT_CHANNEL, type MenuCommand, type MenuEvent, type RecentEntry } from './ipc';
import { buildMenuTemplate } from './menu';
import { APP_ENTRY_URL, APP_SCHEME, mimeTypeOf, resolveAppPath } from './handlers/app-protocol';
import { createHandlers, readRecent, type HandlerDeps } from './handlers/file-handlers';
import { PathAllowlist } from './handlers/path-allowlist';
import { RecentFiles } from './handlers/recent-files';
import { registerIpcHandlers, registerQcHandlers } from './handlers/register';
import { createQcHandlers } from './handlers/qc-handlers';
import { DEFAULT_QC_STORE } from '../src/io/qc-store';
import { hardenContents, hardenSession } from './security';

const RENDERER_DIR = join(__dirname, '..', 'renderer');
const DEV_TOOLS = process.env.LAGBENCH_DEVTOOLS === '1';

protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true, corsEnabled: true } }]);

let mainWindow: BrowserWindow | null = null;

function sendMenu(event: MenuEvent): void {
  mainWindow?.webContents.send(MENU_EVENT_CHANNEL, event);
}

function createRecentStore(): RecentFiles {
  const dir = app.getPath('userData');
  const file = join(dir, 'recent-files.json');
  return new RecentFiles({
    read: () => {
      try {
        return readFileSync(file, 'utf8');
      } catch {
        return null;
      }
    },
    write: (text) => {
      mkdirSync(dir, { recursive: true });
      writeFileAtomic(file, text);
    },
  });
}

function installMenu(deps: HandlerDeps): void {
  const refresh = (): void => installMenu(deps);
  const template = buildMenuTemplate(
    deps.recent.list(),
    {
      send: (command: MenuCommand) => sendMenu({ command }),
      openRecent: (entry: RecentEntry) => {
        readRecent(deps, entry.path, entry.kind)
          .then((files) => {
            sendMenu({ command: 'open-recent', files, kind: entry.kind });
            refresh();
          })
          .catch((err: unknown) => {
            if (mainWindow) void dialog.showMessageBox(mainWindow, { type: 'warning', message: err instanceof Error ? err.message : String(err) });
          });
      },
      clearRecent: () => {
        deps.recent.clear();
        refresh();
      },
    },
    process.platform === 'darwin',
    DEV_TOOLS,
  );
  Menu.setApplicationMenu(Menu.buildFromTemplate(template as MenuItemConstructorOptions[]));
}

function createWindow(): BrowserWindow {
  const win = new BrowserWindow({
    width: 1440,
    height: 900,
    minWidth: 1024,
    minHeight: 700,
    title: 'Lagbench',
    show: false,
    webPreferences: {
      preload: join(__dirname, 'preload.cjs'),
      contextIsolation: true,
      sandbox: true,
      nodeIntegration: false,
      nodeIntegrationInWorker: false,
      webSecurity: true,
      allowRunningInsecureContent: false,
      webviewTag: false,
      spellcheck: false,
      devTools: DEV_TOOLS,
    },
  });
  win.once('ready-to-show', () => win.show());
  void win.loadURL(APP_ENTRY_URL);
  return win;
}

app.on('web-contents-created', (_event, contents) => {
  hardenContents(contents);
});

app.whenReady().then(() => {
  protocol.handle(APP_SCHEME, async (request) => {
    const path = resolveAppPath(request.url, RENDERER_DIR);
    if (!path) return new Response('Not found', { status: 404 });
    try {
      const body = await readFile(path);
      const headers: Record<string, string> = { 'content-type': mimeTypeOf(path), 'x-content-type-options': 'nosniff' };
      if (path.endsWith('.html')) headers['content-security-policy'] = CONTENT_SECURITY_POLICY;
      return new Response(body, { headers });
    } catch {
      return new Response('Not found', { status: 404 });
    }
  });
  hardenSession(session.defaultSession);

  const allowlist = new PathAllowlist();
  const deps: HandlerDeps = {
    dialog: {
      showOpenDialog: (o) => (mainWindow ? dialog.showOpenDialog(mainWindow, o) : dialog.showOpenDialog(o)),
      showSaveDialog: (o) => (mainWindow ? dialog.showSaveDialog(mainWindow, o) : dialog.showSaveDialog(o)),
    },
    files: {
      sizeOf: fileSizeBytes,
      readBytes: readFileBytes,
      writeAtomic: (p, text) => writeFileAtomic(p, text),
    },
    recent: createRecentStore(),
    allowlist,
    nowMs: () => Date.now(),
    defaultSaveDir: app.getPath('documents'),
  };
  const handlers = createHandlers(deps);
  registerIpcHandlers(ipcMain, {
    ...handlers,
    // Refresh the "Open recent" menu after anything that changes the list.
    'lagbench:open-logs': async () => {
      const r = await handlers['lagbench:open-logs']();
      installMenu(deps);
      return r;
    },
    'lagbench:open-work': async () => {
      const r = await handlers['lagbench:open-work']();
      installMenu(deps);
      return r;
    },
    'lagbench:save-work': async (name, json) => {
      const r = await handlers['lagbench:save-work'](name, json);
      installMenu(deps);
      return r;
    },
    'lagbench:clear-recent': async () => {
      await handlers['lagbench:clear-recent']();
      installMenu(deps);
    },
  });
  // QC sign-off: the same record store as `lagbench qc` (lagbench-records.sqlite in the working folder, or LAGBENCH_QC_DB).
  registerQcHandlers(ipcMain, createQcHandlers({
    storePath: resolve(process.env.LAGBENCH_QC_DB ?? join(process.cwd(), DEFAULT_QC_STORE)),
    softwareVersion: app.getVersion(),
    nowIso: () => new Date().toISOString(),
    via: 'desktop',
    save: { dialog: deps.dialog, writeAtomic: deps.files.writeAtomic, defaultSaveDir: deps.defaultSaveDir },
  }));
  installMenu(deps);
  mainWindow = createWindow();
  mainWindow.on('closed', () => {
    mainWindow = null;
  });
  app.on('activate', () => {
    if (BrowserWindow.getAllWindows().length === 0) mainWindow = createWindow();
  });
}).catch((err: unknown) => {
  console.error('Lagbench could not start:', err);
  app.exit(1);
});

app.on('window-all-closed', () => {
  if (process.platform !== 'darwin') app.quit();
});
