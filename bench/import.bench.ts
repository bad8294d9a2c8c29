/**
 * Import throughput on the generated 1-hour, 1-kHz, 3-channel log (bench/generate-log.ts, ≈ 84 MB,
 * 3.6 M rows): the whole readLogFile, and where the time goes (reading + decoding bytes, parsing text),
 * with numpy.loadtxt (when python3 with numpy is installed) on the same
 * file for comparison. Wall and CPU time are both printed: on a shared, loaded machine CPU time is the
 * steadier figure. Target (issue 2): no slower than numpy.loadtxt (≈ 0.7 s on an idle build machine).
 */
import { spawnSync } from 'node:child_process';
import { openSync, readSync, closeSync } from 'node:fs';
import { createLogParser } from '../src/core/import/index';
import { readLogFile, CHUNK_BYTES } from '../src/io/read-log';
import { generateBenchLog } from './generate-log';

interface Timing {
  wallMs: number;
  cpuMs: number;
}

async function timed(fn: () => Promise<unknown> | unknown): Promise<Timing> {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  await fn();
  const c = process.cpuUsage(c0);
  return { wallMs: performance.now() - t0, cpuMs: (c.user + c.system) / 1000 };
}

/** Best of `n` runs (the least disturbed by other processes). */
async function best(n: number, fn: () => Promise<unknown> | unknown): Promise<Timing> {
  let b: Timing | null = null;
  for (let i = 0; i < n; i++) {
    const t = await timed(fn);
    if (!b || t.wallMs < b.wallMs) b = t;
  }
  return b as Timing;
}

function readChunks(path: string): string[] {
  const fd = openSync(path, 'r');
  const buf = Buffer.allocUnsafe(CHUNK_BYTES);
  const chunks: string[] = [];
  for (;;) {
    const n = readSync(fd, buf, 0, CHUNK_BYTES, null);
    if (n === 0) break;
    chunks.push(buf.toString('latin1', 0, n));
  }
  closeSync(fd);
  return chunks;
}

function line(label: string, t: Timing, bytes: number, rows: number): string {
  const mbS = bytes / 1e6 / (t.wallMs / 1000);
  const rowsS = rows / (t.wallMs / 1000);
  return `  ${label.padEnd(44)} ${(t.wallMs / 1000).toFixed(3).padStart(7)} s wall  ${(t.cpuMs / 1000).toFixed(3).padStart(7)} s CPU  ${mbS.toFixed(0).padStart(5)} MB/s  ${(rowsS / 1e6).toFixed(2).padStart(5)} M rows/s`;
}

export default async function importBench(): Promise<void> {
  const log = await generateBenchLog();
  let rows = 0;
  console.log(`import: ${log.path}, ${(log.bytes / 1e6).toFixed(1)} MB`);
  const whole = await best(3, async () => {
    rows = (await readLogFile(log.path)).report.rows;
  });
  console.log(`  ${rows.toLocaleString('en')} rows, time + 3 channels; best of 3 runs`);
  console.log(line('readLogFile (read, decode, detect, parse)', whole, log.bytes, rows));

  let chunks: string[] = [];
  const read = await best(3, () => {
    chunks = readChunks(log.path);
  });
  console.log(line('  of which: read 4 MB chunks + decode', read, log.bytes, rows));
  const parse = await best(3, () => {
    const p = createLogParser();
    for (const c of chunks) p.push(c);
    p.finish();
  });
  console.log(line('  of which: parse the text (pure core)', parse, log.bytes, rows));

  const py = spawnSync('python3', ['-c', `import time, numpy as np\nt=time.perf_counter(); t0=time.process_time(); a=np.loadtxt(${JSON.stringify(log.path)}, delimiter=',', skiprows=2)\nprint(time.perf_counter()-t, time.process_time()-t0, a.shape[0])`], { encoding: 'utf8' });
  if (py.status === 0) {
    const [wallS, cpuS] = py.stdout.trim().split(/\s+/).map(Number);
    console.log(line('numpy.loadtxt, same file (reference)', { wallMs: (wallS as number) * 1000, cpuMs: (cpuS as number) * 1000 }, log.bytes, rows));
  } else {
    console.log('  numpy.loadtxt: not measured (python3 with numpy not installed)');
  }
}
