// The IPC handlers of main (electron/handlers/) with dialogs and disk faked in memory.
// Expected behaviour is our own contract (common practice for Electron apps, no source).
import { describe, expect, it } from 'vitest';
import { createHandlers, FileAccessError, readRecent, type HandlerDeps } from '../../electron/handlers/file-handlers';
import { PathAllowlist } from '../../electron/handlers/path-allowlist';
import { RecentFiles, parseRecent, MAX_RECENT } from '../../electron/handlers/recent-files';
import { CHANNELS } from '../../electron/ipc';

function fakeDeps(disk: Record<string, string>, picks: { open?: string[]; save?: string } = {}) {
  const written: Record<string, string> = {};
  let stored: string | null = null;
  const deps: HandlerDeps = {
    dialog: {
      showOpenDialog: async () => ({ canceled: picks.open === undefined, filePaths: picks.open ?? [] }),
      showSaveDialog: async (o) => ({ canceled: picks.save === undefined, filePath: picks.save ?? o.defaultPath }),
    },
    files: {
      sizeOf: async (p) => {
        const t = disk[p];
        if (t === undefined) throw new Error('ENOENT');
        return t.length;
      },
      readBytes: async (p) => new TextEncoder().encode(disk[p] ?? ''),
      writeAtomic: (p, text) => {
        written[p] = text;
      },
    },
    recent: new RecentFiles({ read: () => stored, write: (t) => { stored = t; } }),
    allowlist: new PathAllowlist(),
    nowMs: () => 1_700_000_000_000,
    defaultSaveDir: '/home/u/Documents',
  };
  return { deps, written, stored: () => stored };
}

describe('createHandlers', () => {
  it('openLogs returns the chosen files with bytes and remembers them as recent', async () => {
    const { deps } = fakeDeps({ '/d/p.csv': 't,p\n0,1\n' }, { open: ['/d/p.csv'] });
    const h = createHandlers(deps);
    const files = await h[CHANNELS.openLogs]();
    expect(files).toHaveLength(1);
    expect(files?.[0]?.name).toBe('p.csv');
    expect(new TextDecoder().decode(files?.[0]?.bytes)).toBe('t,p\n0,1\n');
    expect(deps.recent.list()).toEqual([{ path: '/d/p.csv', kind: 'log', openedAtMs: 1_700_000_000_000 }]);
  });

  it('openLogs returns null when the dialog is cancelled', async () => {
    const { deps } = fakeDeps({});
    expect(await createHandlers(deps)[CHANNELS.openLogs]()).toBeNull();
  });

  it('openLogs refuses three files', async () => {
    const { deps } = fakeDeps({ '/a': '', '/b': '', '/c': '' }, { open: ['/a', '/b', '/c'] });
    await expect(createHandlers(deps)[CHANNELS.openLogs]()).rejects.toThrow(/at most 2 logs/);
  });

  it('readLogs refuses paths the user never chose', async () => {
    const { deps } = fakeDeps({ '/etc/passwd': 'root:x:0:0' });
    await expect(createHandlers(deps)[CHANNELS.readLogs](['/etc/passwd'])).rejects.toThrow(FileAccessError);
  });

  it('readLogs reads a path after it was opened through the dialog', async () => {
    const { deps } = fakeDeps({ '/d/p.csv': 'x' }, { open: ['/d/p.csv'] });
    const h = createHandlers(deps);
    await h[CHANNELS.openLogs]();
    const again = await h[CHANNELS.readLogs](['/d/p.csv']);
    expect(again[0]?.path).toBe('/d/p.csv');
  });

  it('readLogs says plainly when an allowed file has gone', async () => {
    const { deps } = fakeDeps({});
    deps.allowlist.allow('/gone.csv');
    await expect(createHandlers(deps)[CHANNELS.readLogs](['/gone.csv'])).rejects.toThrow(/cannot be read/);
  });

  it('openWork allows the logs the work file references', async () => {
    const work = JSON.stringify({ format: 'lagbench-work', inputs: [{ path: '/d/flow.csv', sha256: 'ab' }] });
    const { deps } = fakeDeps({ '/w/run.lagbench.json': work, '/d/flow.csv': 'x' }, { open: ['/w/run.lagbench.json'] });
    const h = createHandlers(deps);
    expect((await h[CHANNELS.openWork]())?.name).toBe('run.lagbench.json');
    expect((await h[CHANNELS.readLogs](['/d/flow.csv']))[0]?.name).toBe('flow.csv');
  });

  it('openChip returns the chosen chip description and allows it to be re-read', async () => {
    const { deps } = fakeDeps({ '/c/chip.json': '{}' }, { open: ['/c/chip.json'] });
    const h = createHandlers(deps);
    expect((await h[CHANNELS.openChip]())?.name).toBe('chip.json');
    expect(deps.allowlist.allows('/c/chip.json')).toBe(true);
  });

  it('openWork also allows the chip description the work file references', async () => {
    const work = JSON.stringify({ inputs: [], chip: { path: '/c/mixer.json' } });
    const { deps } = fakeDeps({ '/w.json': work }, { open: ['/w.json'] });
    await createHandlers(deps)[CHANNELS.openWork]();
    expect(deps.allowlist.allows('/c/mixer.json')).toBe(true);
  });

  it('saveReport writes atomically to the chosen path and adds .html to the suggestion', async () => {
    const { deps, written } = fakeDeps({});
    let proposed = '';
    deps.dialog.showSaveDialog = async (o) => {
      proposed = o.defaultPath;
      return { canceled: false, filePath: '/out/r.html' };
    };
    const r = await createHandlers(deps)[CHANNELS.saveReport]('run-report', '<html>ok</html>');
    expect(r).toEqual({ path: '/out/r.html' });
    expect(written['/out/r.html']).toBe('<html>ok</html>');
    expect(proposed).toBe('/home/u/Documents/run-report.html');
  });

  it('saveWork returns null and writes nothing when cancelled', async () => {
    const { deps, written } = fakeDeps({});
    deps.dialog.showSaveDialog = async () => ({ canceled: true });
    expect(await createHandlers(deps)[CHANNELS.saveWork]('w.json', '{}')).toBeNull();
    expect(Object.keys(written)).toHaveLength(0);
  });

  it('readRecent allows and reads a recent work file and its inputs', async () => {
    const work = JSON.stringify({ inputs: [{ path: '/d/a.csv' }] });
    const { deps } = fakeDeps({ '/w.json': work, '/d/a.csv': 'y' });
    const files = await readRecent(deps, '/w.json', 'work');
    expect(files[0]?.name).toBe('w.json');
    expect(deps.allowlist.allows('/d/a.csv')).toBe(true);
  });
});

describe('RecentFiles', () => {
  it('RecentFiles.add moves a reopened path to the top without duplicates and persists', () => {
    let stored: string | null = null;
    const r = new RecentFiles({ read: () => stored, write: (t) => { stored = t; } });
    r.add('/a', 'log', 1);
    r.add('/b', 'log', 2);
    r.add('/a', 'log', 3);
    expect(r.list().map((e) => e.path)).toEqual(['/a', '/b']);
    expect(parseRecent(stored).map((e) => e.openedAtMs)).toEqual([3, 2]);
  });

  it('RecentFiles keeps at most MAX_RECENT entries', () => {
    const r = new RecentFiles({ read: () => null, write: () => undefined });
    for (let i = 0; i < MAX_RECENT + 5; i++) r.add(`/f${i}`, 'log', i);
    expect(r.list()).toHaveLength(MAX_RECENT);
  });

  it('parseRecent ignores a damaged or malformed list', () => {
    expect(parseRecent('{not json')).toEqual([]);
    expect(parseRecent(JSON.stringify({ entries: [{ path: 1 }, { path: '/ok', kind: 'log', openedAtMs: 5 }] }))).toEqual([{ path: '/ok', kind: 'log', openedAtMs: 5 }]);
  });
});
