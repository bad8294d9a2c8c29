/**
 * The application menu as a plain template (Electron's MenuItemConstructorOptions shape), so its
 * commands can be checked in tests. Each item sends a {@link MenuCommand} to the renderer.
 */
import type { MenuCommand, RecentEntry } from './ipc';

export interface MenuItemSpec {
  label?: string;
  role?: 'quit' | 'copy' | 'paste' | 'cut' | 'selectAll' | 'undo' | 'redo' | 'togglefullscreen' | 'resetZoom' | 'zoomIn' | 'zoomOut' | 'about' | 'reload' | 'toggleDevTools';
  accelerator?: string;
  type?: 'separator' | 'submenu';
  enabled?: boolean;
  submenu?: MenuItemSpec[];
  click?: () => void;
}

export interface MenuActions {
  send(command: MenuCommand): void;
  openRecent(entry: RecentEntry): void;
  clearRecent(): void;
}

export function buildMenuTemplate(recent: RecentEntry[], actions: MenuActions, isMac: boolean, devTools: boolean): MenuItemSpec[] {
  const item = (label: string, command: MenuCommand, accelerator?: string): MenuItemSpec => ({ label, accelerator, click: () => actions.send(command) });
  const recentItems: MenuItemSpec[] = recent.length
    ? [
        ...recent.map((e) => ({ label: `${e.kind === 'work' ? 'Work' : 'Log'}: ${e.path}`, click: () => actions.openRecent(e) })),
        { type: 'separator' as const },
        { label: 'Clear recent', click: () => actions.clearRecent() },
      ]
    : [{ label: 'No recent files', enabled: false }];
  return [
    ...(isMac ? [{ label: 'Lagbench', submenu: [{ role: 'about' as const }, { type: 'separator' as const }, { role: 'quit' as const }] }] : []),
    {
      label: 'File',
      submenu: [
        item('Open logs…', 'open-logs', 'CmdOrCtrl+O'),
        { label: 'Open recent', submenu: recentItems },
        { type: 'separator' },
        item('Open work…', 'open-work', 'CmdOrCtrl+Shift+O'),
        item('Save work…', 'save-work', 'CmdOrCtrl+S'),
        item('Export report…', 'export-report', 'CmdOrCtrl+E'),
        ...(isMac ? [] : [{ type: 'separator' as const }, { role: 'quit' as const }]),
      ],
    },
    { label: 'Edit', submenu: [{ role: 'undo' }, { role: 'redo' }, { type: 'separator' }, { role: 'cut' }, { role: 'copy' }, { role: 'paste' }, { role: 'selectAll' }] },
    {
      label: 'View',
      submenu: [
        item('Import', 'show-view-import', 'CmdOrCtrl+1'),
        item('Recording and steps', 'show-view-recording', 'CmdOrCtrl+2'),
        item('Step fits', 'show-view-steps', 'CmdOrCtrl+3'),
        item('Diagnosis', 'show-view-diagnosis', 'CmdOrCtrl+4'),
        item('Report', 'show-view-report', 'CmdOrCtrl+5'),
        { type: 'separator' },
        item('Toggle light/dark', 'toggle-theme', 'CmdOrCtrl+Shift+L'),
        { role: 'resetZoom' },
        { role: 'zoomIn' },
        { role: 'zoomOut' },
        { role: 'togglefullscreen' },
        ...(devTools ? [{ role: 'toggleDevTools' as const }] : []),
      ],
    },
  ];
}
