/**
 * Preload (runs sandboxed, before the renderer): exposes the minimal {@link LagbenchApi} as
 * `window.lagbench` through contextBridge. No Node, no raw ipcRenderer reaches the page.
 */
import { contextBridge, ipcRenderer } from 'electron';
import { CHANNELS, MENU_EVENT_CHANNEL, QC_CHANNELS, isMenuEvent, type LagbenchApi, type MenuEvent } from './ipc';

const api: LagbenchApi = {
  platform: 'desktop',
  openLogs: () => ipcRenderer.invoke(CHANNELS.openLogs),
  readLogs: (paths) => ipcRenderer.invoke(CHANNELS.readLogs, paths),
  openWork: () => ipcRenderer.invoke(CHANNELS.openWork),
  openChip: () => ipcRenderer.invoke(CHANNELS.openChip),
  saveWork: (suggestedName, json) => ipcRenderer.invoke(CHANNELS.saveWork, suggestedName, json),
  saveReport: (suggestedName, html) => ipcRenderer.invoke(CHANNELS.saveReport, suggestedName, html),
  listRecent: () => ipcRenderer.invoke(CHANNELS.listRecent),
  clearRecent: () => ipcRenderer.invoke(CHANNELS.clearRecent),
  qc: {
    info: () => ipcRenderer.invoke(QC_CHANNELS.info),
    signOff: (request) => ipcRenderer.invoke(QC_CHANNELS.signOff, request),
    history: (query) => ipcRenderer.invoke(QC_CHANNELS.history, query),
    lotReport: (lot) => ipcRenderer.invoke(QC_CHANNELS.lotReport, lot),
    saveCsv: (name, csv) => ipcRenderer.invoke(QC_CHANNELS.saveCsv, name, csv),
  },
  onMenu(listener: (event: MenuEvent) => void) {
    const wrapped = (_e: unknown, payload: unknown): void => {
      if (isMenuEvent(payload)) listener(payload);
    };
    ipcRenderer.on(MENU_EVENT_CHANNEL, wrapped);
    return () => {
      ipcRenderer.removeListener(MENU_EVENT_CHANNEL, wrapped);
    };
  },
};

contextBridge.exposeInMainWorld('lagbench', api);
