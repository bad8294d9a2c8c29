/**
 * Binds the handlers to ipcMain: every call is checked for its sender (only our own app pages)
 * and its argument shapes ({@link validateArgs}) before a handler runs.
 */
import { CHANNELS, validateArgs, type InvokeChannel } from '../ipc';
import type { Handlers } from './file-handlers';
import { isAppUrl } from './app-protocol';
import { QC_CHANNELS, validateQcArgs, type QcChannel } from '../qc-ipc';
import type { QcHandlers } from './qc-handlers';

/** The part of ipcMain used here. */
export interface IpcMainPort {
  handle(channel: string, listener: (event: { senderFrame: { url: string } | null }, ...args: unknown[]) => Promise<unknown>): void;
}

export function registerIpcHandlers(ipcMain: IpcMainPort, handlers: Handlers): void {
  for (const channel of Object.values(CHANNELS) as InvokeChannel[]) {
    ipcMain.handle(channel, async (event, ...args) => {
      const url = event.senderFrame?.url ?? '';
      if (!isAppUrl(url)) throw new Error(`${channel}: refused a call from ${url || 'an unknown frame'}`);
      const checked = validateArgs(channel, args);
      const handler = handlers[channel] as (...a: unknown[]) => Promise<unknown>;
      return handler(...(checked as unknown[]));
    });
  }
}

/** The QC sign-off channels (electron/qc-ipc.ts), checked the same way: our own pages only, validated arguments. */
export function registerQcHandlers(ipcMain: IpcMainPort, handlers: QcHandlers): void {
  for (const channel of Object.values(QC_CHANNELS) as QcChannel[]) {
    ipcMain.handle(channel, async (event, ...args) => {
      const url = event.senderFrame?.url ?? '';
      if (!isAppUrl(url)) throw new Error(`${channel}: refused a call from ${url || 'an unknown frame'}`);
      const checked = validateQcArgs(channel, args);
      const handler = handlers[channel] as (...a: unknown[]) => Promise<unknown>;
      return handler(...(checked as unknown[]));
    });
  }
}
