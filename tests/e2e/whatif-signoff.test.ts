// The what-if view and the QC sign-off screen in a real browser (Debian's Chromium via playwright-core).
// The renderer is served with the QC bridge (bridge-server.ts), which runs the desktop app's own IPC
// handlers against a record store in a temporary folder, named as the CLI names it
// (lagbench-records.sqlite). Screenshots: test-artifacts/screenshots/{whatif,signoff,history}.png.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { CHROMIUM, launchChromium } from './browser';
import { PRESSURE_SAFETY_CAUTION } from '../../src/core/safety';
import { parseVary, whatIf } from '../../src/core/whatif';
import { DEFAULT_QC_STORE, openQcStore, queryHistory } from '../../src/io/qc-store';
import { runCli } from '../../src/cli/main';
import { captureIo } from '../helpers/cli-io';
import { serveWithBridge, type BridgeServer } from './bridge-server';
import { rendererDir, serveStatic, type StaticServer } from './static-server';

const SHOTS = join(process.cwd(), 'test-artifacts', 'screenshots');
const ARTIFACTS = join(process.cwd(), 'test-artifacts');
const haveBrowser = existsSync(CHROMIUM);
const repo = (...p: string[]): string => join(process.cwd(), ...p);

describe.skipIf(!haveBrowser)('what-if view and QC sign-off in Chromium', () => {
  let bridge: BridgeServer;
  let plain: StaticServer;
  let context: BrowserContext;
  let page: Page;
  let work: string;
  let dbPath: string;
  const errors: string[] = [];

  const shot = async (name: string): Promise<void> => {
    await page.screenshot({ path: join(SHOTS, `${name}.png`), fullPage: false });
  };
  const analysisRuns = async (): Promise<number> => Number((await page.getAttribute('html', 'data-analysis-runs')) ?? '0');
  const waitForRunsAbove = async (n: number): Promise<void> => {
    await page.waitForFunction((k) => Number(document.documentElement.dataset.analysisRuns ?? '0') > k, n, { timeout: 120_000 });
  };

  beforeAll(async () => {
    if (!existsSync(join(rendererDir, 'index.html'))) throw new Error('dist/renderer is missing: run `npm run test:e2e` (it builds the app first).');
    mkdirSync(SHOTS, { recursive: true });
    work = mkdtempSync(join(tmpdir(), 'lagbench-e2e-qc-'));
    dbPath = join(work, DEFAULT_QC_STORE);
    bridge = await serveWithBridge(rendererDir, { storePath: dbPath, softwareVersion: '0.1.0', nowIso: () => new Date().toISOString() });
    plain = await serveStatic(rendererDir);
    ({ context, page } = await launchChromium(join(work, 'profile'), errors));
    await page.goto(bridge.url);
    await page.waitForSelector('html[data-ready="true"]');
  });

  afterAll(async () => {
    await context?.close();
    await bridge?.close();
    await plain?.close();
    if (work) rmSync(work, { recursive: true, force: true });
  });

  it('what-if: sweeping the feed-line length of a bundled chip shows the table and the overlaid responses', async () => {
    await page.keyboard.press('Alt+6');
    await page.waitForSelector('#whatif-example');
    await page.selectOption('#whatif-example', 'chips/pdms-mixer.json');
    await page.waitForSelector('#whatif-target');
    expect(await page.inputValue('#whatif-target')).toBe('PTFE feed line');
    expect(await page.inputValue('#whatif-property')).toBe('length');
    await page.fill('#whatif-from', '10 cm');
    await page.fill('#whatif-to', '2 m');
    await page.fill('#whatif-steps', '8');
    await page.fill('#whatif-target-t95', '9.5');
    await page.press('#whatif-target-t95', 'Enter');
    await page.waitForSelector('[data-testid="whatif-table"]', { timeout: 60_000 });
    const rows = await page.$$('[data-testid^="whatif-row-"]');
    expect(rows).toHaveLength(8);
    expect(await page.getAttribute('[data-testid="whatif-chart"]', 'data-curves')).toBe('8');

    // The same sweep through the core, in the test: the page must show the core's τ.
    const text = readFileSync(repo('sample-logs', 'chips', 'pdms-mixer.json'), 'utf8');
    const core = whatIf(text, 'chips/pdms-mixer.json', parseVary('PTFE feed line.length=10 cm:2 m:8'), { setup: 'flow-driven', driveSI: 10e-9 / 60, targetT95S: 9.5 });
    const shownTau = Number(await page.getAttribute('[data-testid="whatif-tau-3"]', 'data-si'));
    expect(shownTau).toBeCloseTo(core.rows[3]?.tauS.nominal as number, 12);

    // Outside check: the added resistance of 1.9 m more PTFE line (0.8 mm bore) is Hagen–Poiseuille
    // R = 8µL/(πr⁴) (physics.md §2.1; White, Fluid Mechanics, laminar pipe flow) with water at 22 °C,
    // µ = 0.9544 mPa·s (IAPWS 2008 viscosity formulation, value from memory). Within 1 %.
    const r0 = Number(await page.getAttribute('[data-testid="whatif-r-0"]', 'data-si'));
    const r7 = Number(await page.getAttribute('[data-testid="whatif-r-7"]', 'data-si'));
    const expected = (8 * 0.9544e-3 * 1.9) / (Math.PI * 0.4e-3 ** 4);
    expect(Math.abs(r7 - r0 - expected) / expected).toBeLessThan(0.01);
    // Longer tubing: more compliance and resistance, so τ grows along the sweep.
    const taus = await page.$$eval('[data-testid^="whatif-tau-"]', (els) => els.map((e) => Number(e.getAttribute('data-si'))));
    for (let k = 1; k < taus.length; k++) expect(taus[k] as number).toBeGreaterThan(taus[k - 1] as number);
    // Target highlighted: rows that meet it say so, and the range sentence is there when any does.
    const meets = core.rows.map((r) => r.meetsTarget);
    const badges = await page.$$eval('[data-testid^="whatif-row-"] .badge', (els) => els.map((e) => e.textContent));
    expect(badges).toEqual(meets.map((m) => (m ? 'yes' : 'no')));
    expect(meets.some((m) => m) && meets.some((m) => !m)).toBe(true);
    await expect(page.textContent('[data-testid="whatif-meeting"]')).resolves.toMatch(/t₉₅ ≤ 9\.50* s for PTFE feed line\.length in 100(\.0)? mm …/);
    await expect(page.textContent('#view-whatif [data-testid="pressure-caution"]')).resolves.toContain(PRESSURE_SAFETY_CAUTION.slice(0, 40));
    await page.evaluate(() => document.querySelector('[aria-label="Predicted step responses"]')?.scrollIntoView());
    await shot('whatif');
  });

  it('what-if: a dropped chip description goes to the sweep (not the log importer), and the view follows the dark theme', async () => {
    const text = readFileSync(repo('sample-logs', 'chips', 'pdms-mixer-soft-tubing.json'), 'utf8');
    await page.evaluate((t) => {
      const dt = new DataTransfer();
      dt.items.add(new File([t], 'pdms-mixer-soft-tubing.json', { type: 'application/json' }));
      window.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));
    }, text);
    await page.waitForFunction(() => document.querySelector('[data-testid="whatif-chip-name"]')?.textContent?.includes('pdms-mixer-soft-tubing.json'));
    await expect(page.textContent('#file-summary')).resolves.toBe('No logs open');
    await page.click('#btn-theme');
    expect(await page.getAttribute('html', 'data-theme')).toBe('dark');
    const runs = Number((await page.getAttribute('html', 'data-whatif-runs')) ?? '0');
    // Keyboard only: focus the target field, type, Enter computes.
    await page.fill('#whatif-target-t95', '');
    await page.focus('#whatif-target-t95');
    await page.keyboard.type('9.5');
    await page.keyboard.press('Enter');
    await page.waitForFunction((k) => Number(document.documentElement.dataset.whatifRuns ?? '0') > k, runs);
    expect(await page.$$('[data-testid^="whatif-row-"]')).toHaveLength(8);
    await page.evaluate(() => document.querySelector('[aria-label="Predicted step responses"]')?.scrollIntoView());
    await shot('whatif-dark');
    await page.click('#btn-theme');
    expect(await page.getAttribute('html', 'data-theme')).toBe('light');
  });

  it('sign-off: a chip with trapped air fails the spec, is recorded in the CLI store and exported', async () => {
    // M2-002 of the simulated lot A carries 1.5 µL of trapped air (sample-logs/lot-A/README.md).
    const log = repo('sample-logs', 'lot-A', 'M2-002.csv');
    const before = await analysisRuns();
    await page.setInputFiles('#file-input-logs', log);
    await waitForRunsAbove(before);
    const afterLog = await analysisRuns();
    const chooser = page.waitForEvent('filechooser');
    await page.click('#btn-chip');
    await (await chooser).setFiles(repo('sample-logs', 'lot-A', 'M2-002.chip.json'));
    await waitForRunsAbove(afterLog);

    await page.keyboard.press('Alt+7');
    await page.waitForSelector('#signoff-spec-example');
    await page.selectOption('#signoff-spec-example', 'qc-specs/pdms-mixer-m2.json');
    await page.waitForSelector('#signoff-chip-id');
    // Chip ID from the spec's chip_id_from pattern on the file name.
    expect(await page.inputValue('#signoff-chip-id')).toBe('M2-002');
    await page.fill('#signoff-lot', 'A');
    await page.fill('#signoff-operator', 'E2E Operator');
    await page.click('#signoff-check');
    await page.waitForSelector('[data-testid="signoff-verdict"]', { timeout: 60_000 });
    // The spec's compliance limit (110 nL/kPa) rejects more than ≈ 0.7 µL of air at 1.15 bar
    // (C = V/p for a gas pocket, physics.md §3.3); 1.5 µL must fail it.
    expect(await page.getAttribute('[data-testid="check-compliance"]', 'data-verdict')).toBe('fail');
    expect(await page.getAttribute('[data-testid="signoff-verdict"]', 'data-verdict')).toBe('fail');
    await expect(page.textContent('[data-testid="verdict-rule"]')).resolves.toContain('whole 95 % confidence interval');
    await page.waitForSelector('#signoff-submit');
    await page.evaluate(() => document.querySelector('[data-testid="signoff-verdict"]')?.scrollIntoView());
    await shot('signoff');

    // The rest of lot A is signed off by the CLI into the same store first (M2-005 has 3 µL of air: exit 3).
    const cli = captureIo(work);
    const others = ['M2-001', 'M2-003', 'M2-004', 'M2-005', 'M2-006'].map((c) => repo('sample-logs', 'lot-A', `${c}.csv`));
    expect(await runCli(['qc', ...others, '--spec', repo('qc-specs', 'pdms-mixer-m2.json'), '--lot', 'A', '--operator', 'CLI Operator', '--db', dbPath, '--report-dir', join(work, 'reports')], cli)).toBe(3);

    await page.click('#signoff-submit');
    await page.waitForSelector('[data-testid="history-table"] tbody tr', { timeout: 30_000 });

    // The record is in the SQLite file, read with the store's own reader…
    const store = openQcStore(dbPath);
    const recs = queryHistory(store, { chip: 'M2-002' });
    store.close();
    expect(recs).toHaveLength(1);
    const rec = recs[0]!;
    expect(rec.operator).toBe('E2E Operator');
    expect(rec.lot).toBe('A');
    expect(rec.verdict).toBe('fail');
    // …with the log's SHA-256 (computed here by Node's crypto, FIPS 180-4).
    expect(rec.inputs[0]?.sha256).toBe(createHash('sha256').update(readFileSync(log)).digest('hex'));
    // …and `lagbench history` (the CLI) finds it in the same file.
    const io = captureIo(work);
    expect(await runCli(['history', '--db', dbPath, '--chip', 'M2-002', '--json'], io)).toBe(0);
    expect(io.stdoutText()).toContain('E2E Operator');

    await expect(page.textContent('[data-testid="history-table"]')).resolves.toContain('M2-002');
    expect(await page.$$('[data-testid="history-table"] tbody tr')).toHaveLength(6);
    await page.waitForSelector('[data-testid="control-chart-compliance"]');

    // Export the chip report (a download in the browser).
    const download = page.waitForEvent('download');
    await page.click('#signoff-export-html');
    const d = await download;
    expect(d.suggestedFilename()).toBe('M2-002.html');
    const out = join(ARTIFACTS, 'chip-M2-002.html');
    await d.saveAs(out);
    const html = readFileSync(out, 'utf8');
    expect(html).toContain('M2-002');
    expect(html).toContain('E2E Operator');
    expect(html).not.toMatch(/<script/i);

    // Signing off the same thing again adds nothing (idempotent, as `lagbench qc`).
    await page.click('#signoff-submit');
    await page.waitForFunction(() => document.querySelector('#view-signoff')?.textContent?.includes('Already recorded'));
    const again = openQcStore(dbPath);
    expect(queryHistory(again)).toHaveLength(6);
    expect(queryHistory(again, { chip: 'M2-002' })).toHaveLength(1);
    again.close();

    await page.fill('#history-lot', 'A');
    const loads = Number((await page.getAttribute('html', 'data-history-loads')) ?? '0');
    await page.click('#history-show');
    await page.waitForFunction((k) => Number(document.documentElement.dataset.historyLoads ?? '0') > k, loads);
    await page.waitForSelector('[data-testid="control-chart-resistance"]');
    await page.evaluate(() => document.querySelector('[data-testid="history-table"]')?.scrollIntoView());
    await shot('history');
  });

  it('without the bridge the sign-off screen says records need the desktop app or lagbench qc', async () => {
    const other = await context.newPage();
    await other.goto(plain.url);
    await other.waitForSelector('html[data-ready="true"]');
    await other.click('#nav-signoff');
    await other.waitForFunction(() => document.querySelector('#view-signoff')?.textContent?.includes('Use the desktop app'));
    await expect(other.textContent('#view-signoff')).resolves.toContain('`lagbench qc` on the command line');
    expect(await other.$('#signoff-submit')).toBeNull();
    await other.close();
  });

  it('no page errors and no request left 127.0.0.1', () => {
    expect(errors).toEqual([]);
  });
});
