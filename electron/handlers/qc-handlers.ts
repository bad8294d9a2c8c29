/**
 * What each QC channel does: sign a chip off into the record store the CLI uses
 * (`lagbench-records.sqlite`, src/io/qc-store.ts), read the history, assemble the lot report and save
 * CSV exports. Pure of Electron (the save dialog and the clock are injected), so the same functions
 * run in main (electron/main.ts), in unit tests (tests/electron/qc-handlers.test.ts) and behind the
 * browser tests' HTTP bridge (tests/e2e/bridge-server.ts). Arguments are validated before these run
 * (electron/qc-ipc.ts validateQcArgs).
 */
import { basename, join } from 'node:path';
import { latestPerChip } from '../../src/core/qc/lot-summary';
import { parseQcSpec } from '../../src/core/qc/spec';
import { lotStatistics, openQcStore, queryHistory, type QcStore } from '../../src/io/qc-store';
import { signOffChip } from '../../src/io/qc-signoff';
import { sha256Hex } from '../../src/io/sha256';
import type { QcChannel, QcChannelArgs, QcChannelResults, QcHistoryQuery, SignOffRequest } from '../qc-ipc';
import { QC_CHANNELS } from '../qc-ipc';
import type { DialogPort } from './file-handlers';

export interface QcHandlerDeps {
  /** Absolute path of the record store (the CLI's default is lagbench-records.sqlite in the working folder). */
  storePath: string;
  softwareVersion: string;
  /** UTC ISO time of a sign-off or report. */
  nowIso(): string;
  via: 'desktop' | 'bridge';
  /** Save dialog and atomic write for CSV exports (desktop); absent behind the bridge, where the browser downloads. */
  save?: { dialog: DialogPort; writeAtomic(path: string, text: string): void; defaultSaveDir: string };
}

export type QcHandlers = { [C in QcChannel]: (...args: QcChannelArgs[C]) => Promise<QcChannelResults[C]> };

function withStore<T>(path: string, work: (store: QcStore) => T): T {
  const store = openQcStore(path);
  try {
    return work(store);
  } finally {
    store.close();
  }
}

export function createQcHandlers(deps: QcHandlerDeps): QcHandlers {
  return {
    async [QC_CHANNELS.info]() {
      return { available: true, storePath: deps.storePath, softwareVersion: deps.softwareVersion, via: deps.via };
    },
    async [QC_CHANNELS.signOff](r: SignOffRequest) {
      // The spec is parsed here, from its text, exactly as `lagbench qc` does (located InputError on a bad spec).
      const spec = parseQcSpec(r.specText, r.specName);
      const specSha256 = sha256Hex(r.specText);
      return withStore(deps.storePath, (store) => {
        const out = signOffChip(store, {
          spec, specText: r.specText, specSha256, chipId: r.chipId, chip: r.chip, inputs: r.inputs, lot: r.lot, operator: r.operator,
          softwareVersion: deps.softwareVersion, settings: { ...r.settings, spec_file: r.specName, signed_off_with: deps.via === 'desktop' ? 'desktop app' : 'desktop renderer (browser bridge)' },
          recordedAt: deps.nowIso(),
        });
        return { evaluation: out.evaluation, record: { status: out.record.status, id: out.record.id }, report: out.report };
      });
    },
    async [QC_CHANNELS.history](q: QcHistoryQuery) {
      return withStore(deps.storePath, (store) => queryHistory(store, q));
    },
    async [QC_CHANNELS.lotReport](lot: string) {
      return withStore(deps.storePath, (store) => {
        const { statistics, charts } = lotStatistics(store, lot);
        return { lot, records: latestPerChip(queryHistory(store, { lot })), statistics, charts, generatedAt: deps.nowIso(), softwareVersion: deps.softwareVersion, storePath: deps.storePath };
      });
    },
    async [QC_CHANNELS.saveCsv](suggestedName: string, csv: string) {
      if (!deps.save) throw new Error('Saving files needs the desktop app; the browser downloads exports itself.');
      const name = suggestedName.toLowerCase().endsWith('.csv') ? suggestedName : `${suggestedName}.csv`;
      const r = await deps.save.dialog.showSaveDialog({ title: 'Save CSV export', defaultPath: join(deps.save.defaultSaveDir, basename(name)), filters: [{ name: 'CSV', extensions: ['csv'] }] });
      if (r.canceled || !r.filePath) return null;
      deps.save.writeAtomic(r.filePath, csv);
      return { path: r.filePath };
    },
  };
}
