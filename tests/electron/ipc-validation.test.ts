// Argument validation of every IPC channel (electron/ipc.ts): main must refuse wrong shapes.
// Expected behaviour is our own contract (common practice for Electron IPC, no source).
import { describe, expect, it } from 'vitest';
import { CHANNELS, IpcArgumentError, isMenuEvent, validateArgs } from '../../electron/ipc';

describe('validateArgs', () => {
  it('validateArgs(readLogs) accepts one or two paths', () => {
    expect(validateArgs(CHANNELS.readLogs, [['/data/a.csv']])).toEqual([['/data/a.csv']]);
    expect(validateArgs(CHANNELS.readLogs, [['/a.csv', '/b.csv']])).toEqual([['/a.csv', '/b.csv']]);
  });

  it('validateArgs(readLogs) rejects non-arrays, three paths, empty and NUL paths', () => {
    expect(() => validateArgs(CHANNELS.readLogs, ['/a.csv'])).toThrow(IpcArgumentError);
    expect(() => validateArgs(CHANNELS.readLogs, [['/a', '/b', '/c']])).toThrow(/1 to 2 paths/);
    expect(() => validateArgs(CHANNELS.readLogs, [['']])).toThrow(IpcArgumentError);
    expect(() => validateArgs(CHANNELS.readLogs, [['/a\u0000b']])).toThrow(IpcArgumentError);
    expect(() => validateArgs(CHANNELS.readLogs, [[42]])).toThrow(IpcArgumentError);
    expect(() => validateArgs(CHANNELS.readLogs, [])).toThrow(IpcArgumentError);
  });

  it('validateArgs(saveReport) accepts a plain name and text', () => {
    expect(validateArgs(CHANNELS.saveReport, ['report.html', '<html></html>'])).toEqual(['report.html', '<html></html>']);
  });

  it('validateArgs(saveReport/saveWork) rejects names with folders, control characters or wrong types', () => {
    expect(() => validateArgs(CHANNELS.saveReport, ['../evil.html', 'x'])).toThrow(/plain file name/);
    expect(() => validateArgs(CHANNELS.saveWork, ['C:\\x\\work.json', '{}'])).toThrow(/plain file name/);
    expect(() => validateArgs(CHANNELS.saveWork, ['a\nb.json', '{}'])).toThrow(/plain file name/);
    expect(() => validateArgs(CHANNELS.saveWork, ['work.json', { json: 1 }])).toThrow(/text must be a string/);
    expect(() => validateArgs(CHANNELS.saveWork, ['work.json'])).toThrow(/two arguments/);
  });

  it('validateArgs(no-argument channels) rejects extra arguments', () => {
    expect(validateArgs(CHANNELS.openLogs, [])).toEqual([]);
    expect(() => validateArgs(CHANNELS.openLogs, ['/etc/passwd'])).toThrow(/no arguments/);
    expect(() => validateArgs(CHANNELS.listRecent, [1])).toThrow(IpcArgumentError);
  });

  it('validateArgs(unknown channel) throws', () => {
    expect(() => validateArgs('lagbench:format-disk' as never, [])).toThrow(/unknown channel/);
  });
});

describe('isMenuEvent', () => {
  it('isMenuEvent accepts known commands and open-recent with files', () => {
    expect(isMenuEvent({ command: 'export-report' })).toBe(true);
    expect(isMenuEvent({ command: 'open-recent', files: [], kind: 'log' })).toBe(true);
  });
  it('isMenuEvent rejects unknown commands and malformed payloads', () => {
    expect(isMenuEvent({ command: 'rm-rf' })).toBe(false);
    expect(isMenuEvent({ command: 'open-recent', kind: 'log' })).toBe(false);
    expect(isMenuEvent(null)).toBe(false);
    expect(isMenuEvent('open-logs')).toBe(false);
  });
});
