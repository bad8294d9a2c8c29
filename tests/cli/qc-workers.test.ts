import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { runCli } from '../../src/cli/main';
import { captureIo } from '../helpers/cli-io';

// Simulated logs (invented data): the PDMS mixer chip, one of them with 3 µL of trapped air.
const REPO = process.cwd();
const BUNDLE = join(REPO, 'dist/cli/lagbench.mjs');
const WORKER = join(REPO, 'dist/cli/qc-worker.mjs');
let dir = '';

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'lagbench-qcw-'));
  mkdirSync(join(dir, 'lot'));
  writeFileSync(join(dir, 'steps.program.csv'), '# invented demo program\ntime_s,flow[uL/min]\n0,2\n15,5\n45,10\n75,5\n105,2\n');
  for (const [k, bubble] of [[1, null], [2, '3uL'], [3, null]] as const) {
    const args = ['simulate', join(REPO, 'sample-logs/chips/pdms-mixer.json'), '--program', join(dir, 'steps.program.csv'), '--out', join(dir, 'lot', `W-00${k}.csv`), '--seed', String(40 + k)];
    if (bubble) args.push('--bubble', bubble);
    expect(await runCli(args, captureIo(dir))).toBe(0);
  }
  // A program file in the lot folder is not a log and must be skipped.
  writeFileSync(join(dir, 'lot', 'steps.program.csv'), 'time_s,flow[uL/min]\n0,2\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('qc progress and worker threads', () => {
  it('qc on a terminal redraws one progress line (carriage return + erase) and ends it with a newline', async () => {
    const io = { ...captureIo(dir), isTty: true };
    await runCli(['qc', 'lot', '--spec', join(REPO, 'qc-specs/pdms-mixer-m2-settling.json'), '--db', 'tty.sqlite', '--report-dir', 'tty'], io);
    const err = io.err.join('');
    // One redraw per log (3 logs); \r + ESC[2K = carriage return + "erase line" (ECMA-48 EL, from memory).
    expect(err.split('\r\x1b[2K').length - 1).toBe(3);
    expect(err.endsWith('\n')).toBe(true);
    expect(err).not.toMatch(/^qc \d/m);
  });

  // Needs the bundle built by `npm install` / `npm run build` (dist/ is not in git).
  it.skipIf(!existsSync(BUNDLE) || !existsSync(WORKER))('bundled lagbench qc runs min(cores, n) worker threads and gives the in-process verdicts', async () => {
    const spec = join(REPO, 'qc-specs/pdms-mixer-m2-settling.json');
    const viaWorkers = spawnSync(process.execPath, [BUNDLE, 'qc', 'lot', '--spec', spec, '--db', 'w.sqlite', '--report-dir', 'w', '--json'], { cwd: dir, encoding: 'utf8' });
    expect(viaWorkers.status, viaWorkers.stderr).toBe(3); // exit 3 = a chip failed (README exit-code table)
    const w = JSON.parse(viaWorkers.stdout) as { workers: number; chips: { chip_id: string; verdict: string }[] };
    expect(w.workers).toBe(Math.min(availableParallelism(), 3) > 1 ? Math.min(availableParallelism(), 3) : 0);
    const io = captureIo(dir);
    await runCli(['qc', 'lot', '--spec', spec, '--db', 'p.sqlite', '--report-dir', 'p', '--json'], io);
    const p = JSON.parse(io.stdoutText()) as { workers: number; chips: { chip_id: string; verdict: string }[] };
    expect(p.workers).toBe(0);
    const verdicts = (s: typeof p) => s.chips.map((c) => `${c.chip_id}:${c.verdict}`).sort();
    expect(verdicts(w)).toEqual(verdicts(p));
    expect(verdicts(w)).toEqual(['W-001:pass', 'W-002:fail', 'W-003:pass']); // W-002 is the chip simulated with air
  });
});
