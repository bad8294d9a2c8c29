// The QC sign-off channels of main (electron/handlers/qc-handlers.ts, electron/qc-ipc.ts,
// registerQcHandlers) with `electron` mocked and a real SQLite store in a temporary folder.
// Verdicts follow the rule stated in src/core/qc/verdict.ts (whole 95 % CI inside/outside a limit);
// the IPC expectations are our own contract (common practice for Electron apps, no source).
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

vi.mock('electron', () => ({ app: {}, ipcMain: { handle: vi.fn() }, dialog: {}, BrowserWindow: vi.fn() }));

import { createQcHandlers, type QcHandlerDeps } from '../../electron/handlers/qc-handlers';
import { registerQcHandlers } from '../../electron/handlers/register';
import { QC_CHANNELS, QcArgumentError, validateQcArgs, type SignOffRequest } from '../../electron/qc-ipc';
import { DEFAULT_QC_STORE, openQcStore, queryHistory } from '../../src/io/qc-store';
import { runQcJob, type QcJobValue } from '../../src/io/qc-job';

const repo = (...p: string[]): string => join(process.cwd(), ...p);
const specPath = repo('qc-specs', 'pdms-mixer-m2.json');

let dir: string;
let chip: QcJobValue;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'lagbench-qc-ipc-'));
  // A real analysed chip: M2-002 of the simulated lot A (1.5 µL of trapped air, sample-logs/lot-A/README.md).
  const chipJson = repo('sample-logs', 'lot-A', 'M2-002.chip.json');
  const r = await runQcJob({ path: repo('sample-logs', 'lot-A', 'M2-002.csv'), displayPath: 'M2-002.csv', chipIdFrom: null, drive: 'flow-driven', chip: { text: readFileSync(chipJson, 'utf8'), displayPath: 'M2-002.chip.json' }, softwareVersion: '0.1.0' });
  if (!r.ok) throw new Error(r.message);
  chip = r.value;
}, 60_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

function deps(name: string, extra: Partial<QcHandlerDeps> = {}): QcHandlerDeps {
  return { storePath: join(dir, name, DEFAULT_QC_STORE), softwareVersion: '0.1.0', nowIso: () => '2026-12-01T10:00:00.000Z', via: 'desktop', ...extra };
}

function request(overrides: Partial<SignOffRequest> = {}): SignOffRequest {
  return {
    specText: readFileSync(specPath, 'utf8'),
    specName: 'pdms-mixer-m2.json',
    chipId: 'M2-002',
    lot: 'A',
    operator: 'J. Doe',
    chip: { measurement: { ...chip.measurement, chipId: 'M2-002' }, steps: chip.steps, nominal: chip.nominal, trappedAirNote: chip.trappedAirNote },
    inputs: [{ path: '/data/M2-002.csv', sha256: chip.sha256 }],
    settings: { drive: 'flow-driven' },
    ...overrides,
  };
}

describe('createQcHandlers', () => {
  it('signOff records the chip in the store with its verdict, and the same request again adds nothing', async () => {
    const { mkdirSync } = await import('node:fs');
    mkdirSync(join(dir, 'a'));
    const h = createQcHandlers(deps('a'));
    const first = await h[QC_CHANNELS.signOff](request());
    expect(first.record.status).toBe('recorded');
    // Compliance limit ≤ 110 nL/kPa; 1.5 µL of air at ≈ 1.15 bar adds ≈ 13 nL/kPa (C = V/p, physics.md §3.3)
    // to a ≈ 103 nL/kPa chip, so the whole CI must lie above the limit → fail.
    const c = first.evaluation.results.find((r) => r.check === 'compliance');
    expect(c?.verdict).toBe('fail');
    expect((c?.ci95?.[0] as number) > (c?.upper as number)).toBe(true);
    expect(first.evaluation.verdict).toBe('fail');
    expect(first.report.trace.specSha256).toBe(createHash('sha256').update(readFileSync(specPath, 'utf8')).digest('hex'));
    const again = await h[QC_CHANNELS.signOff](request());
    expect(again.record).toEqual({ status: 'already-recorded', id: first.record.id });
    const store = openQcStore(deps('a').storePath);
    const rows = queryHistory(store);
    store.close();
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ chipId: 'M2-002', lot: 'A', operator: 'J. Doe', verdict: 'fail', recordedAt: '2026-12-01T10:00:00.000Z' });
    expect(rows[0]?.settings).toMatchObject({ drive: 'flow-driven', spec_file: 'pdms-mixer-m2.json' });
  });

  it('history filters by lot and chip, and lotReport gives statistics and R/C/τ control charts', async () => {
    const { mkdirSync } = await import('node:fs');
    mkdirSync(join(dir, 'b'));
    const h = createQcHandlers(deps('b'));
    await h[QC_CHANNELS.signOff](request());
    await h[QC_CHANNELS.signOff](request({ chipId: 'M2-002b', chip: { ...request().chip, measurement: { ...chip.measurement, chipId: 'M2-002b' } }, lot: 'B' }));
    expect((await h[QC_CHANNELS.history]({ lot: 'A' })).map((r) => r.chipId)).toEqual(['M2-002']);
    expect((await h[QC_CHANNELS.history]({ chip: 'M2-002b' })).map((r) => r.lot)).toEqual(['B']);
    expect(await h[QC_CHANNELS.history]({ since: '2026-12-02' })).toEqual([]);
    const lot = await h[QC_CHANNELS.lotReport]('A');
    expect(lot.records.map((r) => r.chipId)).toEqual(['M2-002']);
    expect(lot.charts.map((c) => c.quantity)).toEqual(['resistance', 'compliance', 'tau']);
    // Charts run across all lots: one point per chip (newest record), A and B.
    expect(lot.charts[0]?.individuals.points.map((p) => p.group).sort()).toEqual(['A', 'B']);
  });

  it('signOff refuses a bad spec with a located input error and writes nothing', async () => {
    const { existsSync, mkdirSync } = await import('node:fs');
    mkdirSync(join(dir, 'c'));
    const h = createQcHandlers(deps('c'));
    await expect(h[QC_CHANNELS.signOff](request({ specText: '{ "lagbench_qc_spec": 1, ' }))).rejects.toThrow(/pdms-mixer-m2\.json/);
    expect(existsSync(deps('c').storePath)).toBe(false);
  });

  it('saveCsv writes atomically where the user chose, returns null on cancel, and refuses without a save port', async () => {
    const written: Record<string, string> = {};
    let pick: string | undefined = '/home/u/M2-002.csv';
    const h = createQcHandlers(deps('d', {
      save: {
        dialog: { showOpenDialog: async () => ({ canceled: true, filePaths: [] }), showSaveDialog: async () => ({ canceled: pick === undefined, filePath: pick }) },
        writeAtomic: (p, t) => { written[p] = t; },
        defaultSaveDir: '/home/u',
      },
    }));
    expect(await h[QC_CHANNELS.saveCsv]('M2-002', 'a,b\n1,2\n')).toEqual({ path: '/home/u/M2-002.csv' });
    expect(written['/home/u/M2-002.csv']).toBe('a,b\n1,2\n');
    pick = undefined;
    expect(await h[QC_CHANNELS.saveCsv]('x.csv', '')).toBeNull();
    await expect(createQcHandlers(deps('e', { via: 'bridge' }))[QC_CHANNELS.saveCsv]('x.csv', '')).rejects.toThrow(/desktop app/);
  });
});

describe('validateQcArgs', () => {
  const bad = (channel: Parameters<typeof validateQcArgs>[0], args: unknown[]) => expect(() => validateQcArgs(channel, args)).toThrow(QcArgumentError);

  it('validateQcArgs accepts a well-formed sign-off request', () => {
    expect(validateQcArgs(QC_CHANNELS.signOff, [request()])[0].chipId).toBe('M2-002');
  });

  it('validateQcArgs rejects malformed sign-off requests', () => {
    bad(QC_CHANNELS.signOff, []);
    bad(QC_CHANNELS.signOff, [request({ chipId: 'M2\u0000' })]);
    bad(QC_CHANNELS.signOff, [request({ chipId: '' })]);
    bad(QC_CHANNELS.signOff, [request({ operator: 'x'.repeat(201) })]);
    bad(QC_CHANNELS.signOff, [request({ inputs: [{ path: '/a.csv', sha256: 'not-a-hash' }] })]);
    bad(QC_CHANNELS.signOff, [request({ inputs: [] })]);
    bad(QC_CHANNELS.signOff, [{ ...request(), extra: 1 }]);
    // The measurement must belong to the chip being signed off.
    bad(QC_CHANNELS.signOff, [request({ chipId: 'M2-009' })]);
    // Only plain data crosses: no class instances or functions.
    bad(QC_CHANNELS.signOff, [request({ settings: { when: new Date() } as unknown as Record<string, unknown> })]);
    bad(QC_CHANNELS.signOff, [request({ chip: { ...request().chip, trappedAirNote: (() => 'x') as unknown as string } })]);
  });

  it('validateQcArgs checks history filters, lot names and CSV saves', () => {
    expect(validateQcArgs(QC_CHANNELS.history, [{ lot: 'A', since: '2026-12-01' }])[0]).toEqual({ lot: 'A', since: '2026-12-01' });
    bad(QC_CHANNELS.history, [{ since: 'yesterday' }]);
    bad(QC_CHANNELS.history, [{ lot: 'A', where: '1=1' }]);
    bad(QC_CHANNELS.history, []);
    bad(QC_CHANNELS.lotReport, ['']);
    bad(QC_CHANNELS.saveCsv, ['../../etc/passwd', 'x']);
    bad(QC_CHANNELS.info, [1]);
  });
});

describe('registerQcHandlers', () => {
  it('registerQcHandlers binds every QC channel, refuses foreign frames and validates before the handler runs', async () => {
    const bound = new Map<string, (event: { senderFrame: { url: string } | null }, ...args: unknown[]) => Promise<unknown>>();
    const calls: string[] = [];
    const handlers = createQcHandlers(deps('f'));
    const spy = Object.fromEntries(Object.entries(handlers).map(([k, fn]) => [k, async (...a: unknown[]) => { calls.push(k); return (fn as (...x: unknown[]) => Promise<unknown>)(...a); }])) as typeof handlers;
    registerQcHandlers({ handle: (ch, l) => void bound.set(ch, l) }, spy);
    expect([...bound.keys()].sort()).toEqual(Object.values(QC_CHANNELS).sort());
    const info = bound.get(QC_CHANNELS.info)!;
    await expect(info({ senderFrame: { url: 'https://evil.example/' } })).rejects.toThrow(/refused/);
    await expect(info({ senderFrame: { url: 'lagbench-app://ui/index.html' } }, 'extra')).rejects.toThrow(QcArgumentError);
    expect(calls).toEqual([]);
    await expect(info({ senderFrame: { url: 'lagbench-app://ui/index.html' } })).resolves.toMatchObject({ available: true, via: 'desktop' });
    expect(calls).toEqual([QC_CHANNELS.info]);
  });
});
