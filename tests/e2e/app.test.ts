// The renderer in a real browser (Debian's Chromium via playwright-core; GUIDE §4): open a log, see the
// steps and fits, move a step, read the diagnosis, export a self-contained report. Screenshots of each
// main view go to test-artifacts/screenshots/ (git-ignored).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { CHROMIUM, launchChromium } from './browser';
import { PRESSURE_SAFETY_CAUTION } from '../../src/core/safety';
import { rendererDir, serveStatic, type StaticServer } from './static-server';
import { flowDrivenRun } from './synthetic-log';

const SHOTS = join(process.cwd(), 'test-artifacts', 'screenshots');
const haveBrowser = existsSync(CHROMIUM);
if (!haveBrowser) console.warn(`Browser tests skipped: ${CHROMIUM} is missing (apt-get install -y chromium).`);

describe.skipIf(!haveBrowser)('desktop renderer in Chromium', () => {
  let server: StaticServer;
  let context: BrowserContext;
  let page: Page;
  let work: string;
  const run = flowDrivenRun();
  const errors: string[] = [];

  const shot = async (name: string): Promise<void> => {
    await page.screenshot({ path: join(SHOTS, `${name}.png`), fullPage: false });
  };
  const analysisRuns = async (): Promise<number> => Number((await page.getAttribute('html', 'data-analysis-runs')) ?? '0');
  const waitForRunsAbove = async (n: number): Promise<void> => {
    await page.waitForFunction((k) => Number(document.documentElement.dataset.analysisRuns ?? '0') > k, n, { timeout: 60_000 });
  };

  beforeAll(async () => {
    if (!existsSync(join(rendererDir, 'index.html'))) throw new Error('dist/renderer is missing: run `npm run test:e2e` (it builds the app first).');
    mkdirSync(SHOTS, { recursive: true });
    work = mkdtempSync(join(tmpdir(), 'lagbench-e2e-'));
    writeFileSync(join(work, 'flow-run.csv'), run.text);
    server = await serveStatic(rendererDir);
    ({ context, page } = await launchChromium(join(work, 'profile'), errors));
    await page.goto(server.url);
    await page.waitForSelector('html[data-ready="true"]');
  });

  afterAll(async () => {
    await context?.close();
    await server?.close();
    if (work) rmSync(work, { recursive: true, force: true });
  });

  it('loads with a strict CSP and an empty import view', async () => {
    const csp = await page.getAttribute('meta[http-equiv="Content-Security-Policy"]', 'content');
    expect(csp).toContain("default-src 'self'");
    expect(csp).not.toContain('unsafe');
    await expect(page.textContent('#view-import')).resolves.toContain('No log open yet');
    await shot('00-start');
  });

  it('opening a log shows how each column was read', async () => {
    await page.setInputFiles('#file-input-logs', join(work, 'flow-run.csv'));
    await page.waitForSelector('[data-testid="columns-0"]');
    const dialect = await page.textContent('[data-testid="dialect-0"]');
    expect(dialect).toContain('semicolon');
    expect(dialect).toContain('seconds');
    const columns = await page.textContent('[data-testid="columns-0"]');
    expect(columns).toContain('pressure [mbar]');
    expect(columns).toContain('mbar');
    expect(await page.inputValue('[data-testid="columns-0"] tbody tr:nth-child(3) input')).toBe('mbar');
    await waitForRunsAbove(0);
    await shot('01-import');
  });

  it('the recording view marks every step of the synthetic run', async () => {
    await page.click('#nav-recording');
    await page.waitForSelector('[data-testid="recording-chart"]');
    const items = await page.$$('[data-testid^="step-item-"]');
    expect(items).toHaveLength(run.onsetsS.length);
    const onsets = await page.$$eval('[data-testid^="step-item-"] .mono', (els) => els.map((e) => parseFloat(e.textContent ?? '')));
    // Detected onsets within one sample (0.1 s) of the programmed ones (our own synthetic data).
    onsets.forEach((t, i) => expect(Math.abs(t - (run.onsetsS[i] as number))).toBeLessThanOrEqual(0.11));
    await expect(page.isVisible('#view-recording [data-testid="pressure-caution"]')).resolves.toBe(true);
    await shot('02-recording');
  });

  it('each step fit reports a τ whose 95 % CI contains the true τ', async () => {
    await page.click('#nav-steps');
    for (let i = 0; i < run.onsetsS.length; i++) {
      await page.click(`[data-testid="step-tab-${i}"]`);
      await page.waitForSelector('[data-testid="tau-ci-0"]');
      const lo = Number(await page.getAttribute('[data-testid="tau-ci-0"]', 'data-lo'));
      const hi = Number(await page.getAttribute('[data-testid="tau-ci-0"]', 'data-hi'));
      // True τ of each step = R·C(p) by construction (synthetic-log.ts).
      const tau = run.tauS[i] as number;
      expect(lo, `step ${i + 1}`).toBeLessThan(tau);
      expect(hi, `step ${i + 1}`).toBeGreaterThan(tau);
      expect(await page.textContent('[data-testid="settled"]')).toBe('settled');
    }
    await page.click('[data-testid="step-tab-1"]');
    await page.waitForSelector('[data-testid="residual-chart"]');
    await shot('03-step-fit');
  });

  it('the fit model settings refit every step (dead time on, then off)', async () => {
    let runs = await analysisRuns();
    await page.check('#fit-dead');
    await waitForRunsAbove(runs);
    await expect(page.textContent('[data-testid="fit-results"]')).resolves.toContain('Dead time');
    runs = await analysisRuns();
    await page.uncheck('#fit-dead');
    await waitForRunsAbove(runs);
    await expect(page.textContent('[data-testid="fit-results"]')).resolves.not.toContain('Dead time');
  });

  it('the wheel zooms the recording chart and Reset zoom restores it', async () => {
    await page.click('#nav-recording');
    const canvas = page.locator('#view-recording [data-testid="recording-chart"]');
    const box = await canvas.boundingBox();
    if (!box) throw new Error('no chart');
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.6);
    for (let k = 0; k < 4; k++) await page.mouse.wheel(0, -200);
    await page.waitForFunction(() => {
      const c = document.querySelector<HTMLCanvasElement>('[data-testid="recording-chart"]');
      return c !== null && Number(c.dataset.xMax) - Number(c.dataset.xMin) < 300;
    });
    await page.click('[data-testid="reset-zoom"]');
    const span = await page.$eval('[data-testid="recording-chart"]', (c) => Number((c as HTMLCanvasElement).dataset.xMax) - Number((c as HTMLCanvasElement).dataset.xMin));
    expect(span).toBeCloseTo(390, 6);
    // Late zoom callbacks of the replaced chart must not bring the zoom back.
    await page.waitForTimeout(600);
    await page.click('#nav-steps');
    await page.click('#nav-recording');
    const after = await page.$eval('#view-recording [data-testid="recording-chart"]', (c) => Number((c as HTMLCanvasElement).dataset.xMax) - Number((c as HTMLCanvasElement).dataset.xMin));
    expect(after).toBeCloseTo(390, 6);
  });

  it('moving a step with the keyboard refits it', async () => {
    await page.click('#nav-steps');
    await page.click('[data-testid="step-tab-1"]');
    const tauBefore = Number(await page.getAttribute('[data-testid="tau-value-0"]', 'data-si'));
    await page.click('#nav-recording');
    await page.click('[data-testid="step-item-1"]');
    const runs = await analysisRuns();
    // Four nudges of duration/500 (0.78 s each here): the window now starts ≈ 0.8 τ into the transient.
    for (let k = 0; k < 4; k++) await page.keyboard.press('ArrowRight');
    await waitForRunsAbove(runs);
    const moved = parseFloat((await page.textContent('[data-testid="step-item-1"] .mono')) ?? '');
    expect(moved).toBeGreaterThan((run.onsetsS[1] as number) + 3);
    await expect(page.textContent('[data-testid="step-item-1"]')).resolves.toContain('edited');
    await page.click('#nav-steps');
    await page.click('[data-testid="step-tab-1"]');
    const tauAfter = Number(await page.getAttribute('[data-testid="tau-value-0"]', 'data-si'));
    expect(tauAfter).not.toBe(tauBefore);
    // A first-order response has the same τ from any start inside the window: the refit still finds it.
    expect(Number(await page.getAttribute('[data-testid="tau-ci-0"]', 'data-lo'))).toBeLessThan(run.tauS[1] as number);
    expect(Number(await page.getAttribute('[data-testid="tau-ci-0"]', 'data-hi'))).toBeGreaterThan(run.tauS[1] as number);
    await page.click('#nav-recording');
    await shot('04-step-moved');
  });

  it('dragging a step marker with the mouse moves the step and refits', async () => {
    await page.click('#nav-recording');
    const canvas = page.locator('#view-recording [data-testid="recording-chart"]');
    const box = await canvas.boundingBox();
    if (!box) throw new Error('no chart');
    const markers = JSON.parse((await canvas.getAttribute('data-markers-px')) ?? '[]') as number[];
    const y = box.y + Number(await canvas.getAttribute('data-plot-mid-px'));
    const x = box.x + (markers[2] as number);
    const runs = await analysisRuns();
    await page.mouse.move(x, y);
    await page.mouse.down();
    await page.mouse.move(x + 6, y, { steps: 3 });
    await page.mouse.move(x + 12, y, { steps: 3 });
    await page.mouse.up();
    await waitForRunsAbove(runs);
    const moved = parseFloat((await page.textContent('[data-testid="step-item-2"] .mono')) ?? '');
    expect(moved).toBeGreaterThan((run.onsetsS[2] as number) + 2);
    expect(moved).toBeLessThan(run.onsetsS[3] as number);
    await expect(page.textContent('[data-testid="step-item-2"]')).resolves.toContain('edited');
  });

  it('adding and deleting a step by time works from the keyboard', async () => {
    const runs = await analysisRuns();
    await page.fill('[data-testid="add-step-input"]', '100');
    await page.press('[data-testid="add-step-input"]', 'Enter');
    await waitForRunsAbove(runs);
    expect(await page.$$('[data-testid^="step-item-"]')).toHaveLength(run.onsetsS.length + 1);
    const runs2 = await analysisRuns();
    await page.focus('[data-testid="step-list"]');
    await page.keyboard.press('Delete');
    await waitForRunsAbove(runs2);
    expect(await page.$$('[data-testid^="step-item-"]')).toHaveLength(run.onsetsS.length);
  });

  it('re-detecting drops the manual edits and restores the detected steps', async () => {
    const runs = await analysisRuns();
    await page.click('[data-testid="redetect"]');
    await waitForRunsAbove(runs);
    expect(await page.$$('[data-testid^="step-item-"]')).toHaveLength(run.onsetsS.length);
    await expect(page.textContent('[data-testid="step-list"]')).resolves.not.toContain('edited');
  });

  it('with a chip description the diagnosis shows the nominal breakdown and the trapped air', async () => {
    const runs = await analysisRuns();
    const chooser = page.waitForEvent('filechooser');
    await page.click('#btn-chip');
    await (await chooser).setFiles(join(process.cwd(), 'sample-logs', 'chips', 'pdms-mixer.json'));
    await waitForRunsAbove(runs);
    await page.click('#nav-diagnosis');
    await page.waitForSelector('[data-testid="breakdown-chart"]');
    expect(await page.textContent('[data-testid="compliance-summary"]')).toContain('Nominal C');
    await page.waitForSelector('[data-testid="fingerprint-chart"]');
    // The log was made with V_atm = 5 µL of air (synthetic-log.ts): the 95 % CI must contain it.
    const lo = Number(await page.getAttribute('[data-testid="trapped-air-volume"]', 'data-lo'));
    const hi = Number(await page.getAttribute('[data-testid="trapped-air-volume"]', 'data-hi'));
    expect(lo).toBeGreaterThan(0);
    expect(lo).toBeLessThan(run.vAtmM3);
    expect(hi).toBeGreaterThan(run.vAtmM3);
    expect((await page.textContent('[data-testid="trapped-air-conclusion"]'))?.length ?? 0).toBeGreaterThan(10);
    expect(await page.isVisible('#view-diagnosis [data-testid="pressure-caution"]')).toBe(true);
    await shot('05-diagnosis');
  });

  it('exports a self-contained report with the caution', async () => {
    await page.click('#nav-report');
    const download = page.waitForEvent('download');
    await page.click('[data-testid="export-report"]');
    const d = await download;
    const html = readFileSync((await d.path()) as string, 'utf8');
    expect(d.suggestedFilename()).toBe('flow-run-report.html');
    expect(html).not.toMatch(/https?:\/\//);
    expect(html).not.toMatch(/<script/i);
    expect(html).toContain(PRESSURE_SAFETY_CAUTION.replace(/'/g, '&#39;'));
    expect(html).toMatch(/<img alt="Recording with step markers" src="data:image\/png;base64,/);
    writeFileSync(join(SHOTS, '..', 'report.html'), html);
    await shot('06-report');
  });

  it('saves the work with input hashes, the chip reference and no step edits after re-detection', async () => {
    const download = page.waitForEvent('download');
    await page.click('[data-testid="save-work"]');
    const d = await download;
    const work = JSON.parse(readFileSync((await d.path()) as string, 'utf8'));
    expect(work.format).toBe('lagbench-work');
    expect(work.inputs[0].sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(work.stepEdits).toEqual([]);
    expect(work.steps).toBeNull();
    expect(work.chip.name).toBe('pdms-mixer.json');
  });

  it('the dark theme toggle restyles the views', async () => {
    await page.click('#btn-theme');
    expect(await page.getAttribute('html', 'data-theme')).toBe('dark');
    await page.click('#nav-steps');
    await page.waitForSelector('[data-testid="fit-chart"]');
    await shot('07-step-fit-dark');
    await page.click('#nav-recording');
    await shot('08-recording-dark');
    await page.click('#btn-theme');
  });

  it('reopening the saved work asks for the log, checks its hash and restores the step edits', async () => {
    // Make an edit, save the work, then reopen it after loading something else.
    await page.click('#nav-recording');
    await page.click('[data-testid="step-item-2"]');
    let runs = await analysisRuns();
    await page.keyboard.press('ArrowLeft');
    await waitForRunsAbove(runs);
    const editedOnset = await page.textContent('[data-testid="step-item-2"] .mono');
    const download = page.waitForEvent('download');
    await page.click('#btn-save-work');
    const saved = join(work, 'saved.lagbench.json');
    await (await download).saveAs(saved);
    runs = await analysisRuns();
    await page.click('[data-testid="redetect"]');
    await waitForRunsAbove(runs);
    expect(await page.textContent('[data-testid="step-item-2"] .mono')).not.toBe(editedOnset);
    // Reopen: the work file names the log; the browser asks for it again.
    runs = await analysisRuns();
    const chooser = page.waitForEvent('filechooser');
    await page.setInputFiles('#file-input-work', saved);
    await (await chooser).setFiles(join(work, 'flow-run.csv'));
    await waitForRunsAbove(runs);
    await page.click('#nav-recording');
    expect(await page.textContent('[data-testid="step-item-2"] .mono')).toBe(editedOnset);
    await expect(page.textContent('[data-testid="step-item-2"]')).resolves.toContain('edited');
  });

  it('reopening refuses a log whose bytes differ from the saved hash', async () => {
    writeFileSync(join(work, 'other.csv'), run.text.replace('# Lab', '# Changed lab'));
    const chooser = page.waitForEvent('filechooser');
    await page.setInputFiles('#file-input-work', join(work, 'saved.lagbench.json'));
    await (await chooser).setFiles(join(work, 'other.csv'));
    await page.waitForFunction(() => /SHA-256 differs/.test(document.getElementById('status-text')?.textContent ?? ''));
  });

  it('two logs of one run are merged onto one time base', async () => {
    await page.setInputFiles('#file-input-logs', [join(process.cwd(), 'sample-logs', 'pressure-logger-iso.csv'), join(process.cwd(), 'sample-logs', 'flow-logger-iso.tsv')]);
    await page.click('#nav-import');
    await page.waitForSelector('[data-testid="columns-1"]');
    const summary = await page.textContent('#view-import');
    // The faster log (20 Hz, sample-logs/README.md) sets the time base.
    expect(summary).toMatch(/Mean rate\s*20(\.0+)? Hz/);
    expect(summary).toContain('Two logs of one run');
    expect(summary).toContain('Pressure [kPa]');
    expect(summary).toContain('Flow [nL/s]');
    await shot('09-two-logs-import');
  });

  it('the pressure-controller sample log is read, its steps found and fitted', async () => {
    const runs = await analysisRuns();
    await page.setInputFiles('#file-input-logs', join(process.cwd(), 'sample-logs', 'pressure-controller.csv'));
    await waitForRunsAbove(runs);
    expect(await page.inputValue('#setup-select')).toBe('pressure-driven');
    await page.click('#nav-steps');
    await page.waitForSelector('[data-testid="tau-value-0"]');
    expect(Number(await page.getAttribute('[data-testid="tau-value-0"]', 'data-si'))).toBeGreaterThan(0);
    await shot('12-pressure-driven-fit');
  });

  it('overriding a column unit re-reads the file with the new factor', async () => {
    await page.click('#nav-import');
    // Column 3 is "Pressure [mbar]": 1 mbar = 100 Pa, 1 kPa = 1000 Pa (BIPM SI brochure, Table 8).
    const unit = page.locator('[data-testid="columns-0"] tbody tr:nth-child(3) input');
    expect(await page.textContent('[data-testid="columns-0"] tbody tr:nth-child(3) td:nth-child(5)')).toBe('100');
    await unit.fill('kPa');
    const runs = await analysisRuns();
    await page.click('[data-testid="apply-import-0"]');
    await waitForRunsAbove(runs);
    expect(await page.textContent('[data-testid="columns-0"] tbody tr:nth-child(3) td:nth-child(5)')).toBe('1000');
    expect(await page.textContent('[data-testid="columns-0"] tbody tr:nth-child(3) td:nth-child(7)')).toContain('your override');
  });

  it('user strings (file names, headers) are escaped in the report', async () => {
    const evil = 'run<img src=x onerror=alert(1)>.csv';
    writeFileSync(join(work, evil), run.text.replace('pressure [mbar]', 'pressure<b> [mbar]'));
    const runs = await analysisRuns();
    await page.setInputFiles('#file-input-logs', join(work, evil));
    await waitForRunsAbove(runs);
    const download = page.waitForEvent('download');
    await page.click('#btn-export-report');
    const html = readFileSync((await (await download).path()) as string, 'utf8');
    expect(html).not.toContain('<img src=x');
    expect(html).not.toContain('<b> [mbar]');
    expect(html).toContain('run&lt;img src=x onerror=alert(1)&gt;.csv');
    expect(html).toContain('pressure&lt;b&gt; [mbar]');
  });

  it('a header-less log is refused with the reason, and reads once a sample rate is given', async () => {
    await page.setInputFiles('#file-input-logs', join(process.cwd(), 'sample-logs', 'headerless-100Hz.txt'));
    await page.click('#nav-import');
    await page.waitForSelector('#view-import .notice.bad');
    expect(await page.textContent('#view-import .notice.bad')).toContain('sample rate');
    await page.fill('[data-testid="rate-0"]', '100');
    await page.click('[data-testid="apply-import-0"]');
    await page.waitForSelector('[data-testid="columns-0"]');
    // 100 Hz (sample-logs/README.md): the mean rate shown is the rate given.
    expect(await page.textContent('[data-testid="import-summary"]')).toMatch(/Mean rate\s*100(\.0+)? Hz/);
    await shot('13-headerless-fixed');
  });

  it('a large log shows the progress bar while it is read', async () => {
    // 600 000 rows (≈ 20 MB) of the same run repeated: several 4 MB chunks, so progress is reported.
    const body = run.text.split('\n').slice(3).filter(Boolean);
    const rows: string[] = [];
    for (let rep = 0; rows.length < 600_000; rep++) for (const line of body) rows.push(line.replace(/^[^;]+/, (t) => (Number(t) + rep * 390.1).toFixed(2)));
    writeFileSync(join(work, 'long-run.csv'), `time [s];flow setpoint [uL/min];pressure [mbar]\n${rows.join('\n')}\n`);
    await page.evaluate(() => {
      const w = window as unknown as { sawProgress: string[] };
      w.sawProgress = [];
      new MutationObserver(() => {
        const p = document.getElementById('progress');
        if (p && !p.hidden) w.sawProgress.push(document.getElementById('progress-label')?.textContent ?? '');
      }).observe(document.getElementById('progress') as HTMLElement, { attributes: true, subtree: true, childList: true, characterData: true });
    });
    await page.setInputFiles('#file-input-logs', join(work, 'long-run.csv'));
    await page.waitForFunction((n) => (document.getElementById('file-summary')?.textContent ?? '').includes(`${n} samples`), rows.length.toLocaleString('en'), { timeout: 120_000 });
    const seen = await page.evaluate(() => (window as unknown as { sawProgress: string[] }).sawProgress);
    expect(seen.some((l) => l.startsWith('Reading long-run.csv'))).toBe(true);
    await page.click('#nav-recording');
    await page.waitForSelector('[data-testid="recording-chart"]');
    await shot('10-large-log');
  });

  it('the exported report renders on its own', async () => {
    const viewer = await context.newPage();
    await viewer.setContent(readFileSync(join(SHOTS, '..', 'report.html'), 'utf8'));
    await viewer.screenshot({ path: join(SHOTS, '11-report-file.png'), fullPage: false });
    expect(await viewer.$$eval('img', (imgs) => imgs.every((i) => (i as HTMLImageElement).naturalWidth > 0))).toBe(true);
    await viewer.close();
  });

  it('produced no page errors and no remote requests', () => {
    expect(errors).toEqual([]);
  });
});
