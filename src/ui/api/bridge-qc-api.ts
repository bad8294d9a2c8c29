/**
 * The QC record-store API in a plain browser: a small HTTP bridge on 127.0.0.1 (tests/e2e/bridge-server.ts)
 * runs the same handlers as the desktop app's main process. Feature-detected with GET /bridge/info;
 * without a bridge, `info()` says plainly that records need the desktop app or `lagbench qc`.
 */
import type { QcApi, QcChannel, QcInfo } from '../../../electron/ipc';
import { QC_CHANNELS } from '../../../electron/ipc';
import { downloadText } from './download';

export const NO_BRIDGE_REASON =
  'Sign-off records are kept in the SQLite record store, which this browser page cannot reach. Use the desktop app (npm start) or `lagbench qc` on the command line; limits and verdicts below are still computed here.';

async function post<T>(channel: QcChannel, args: unknown[]): Promise<T> {
  const res = await fetch(`${location.origin}/bridge/${encodeURIComponent(channel)}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ args }) });
  const body = (await res.json()) as { result?: T; error?: string };
  if (!res.ok || body.error !== undefined) throw new Error(body.error ?? `bridge answered ${res.status}`);
  return body.result as T;
}

export function createBridgeQcApi(): QcApi {
  let probe: Promise<boolean> | null = null;
  const hasBridge = (): Promise<boolean> => {
    probe ??= fetch(`${location.origin}/bridge/info`, { method: 'GET' })
      .then(async (r) => r.ok && ((await r.json()) as { bridge?: string }).bridge === 'lagbench-qc')
      .catch(() => false);
    return probe;
  };
  return {
    async info(): Promise<QcInfo> {
      if (!(await hasBridge())) return { available: false, reason: NO_BRIDGE_REASON };
      return post<QcInfo>(QC_CHANNELS.info, []);
    },
    signOff: (request) => post(QC_CHANNELS.signOff, [request]),
    history: (query) => post(QC_CHANNELS.history, [query]),
    lotReport: (lot) => post(QC_CHANNELS.lotReport, [lot]),
    async saveCsv(name, csv) {
      return downloadText(name.toLowerCase().endsWith('.csv') ? name : `${name}.csv`, csv, 'text/csv');
    },
  };
}
