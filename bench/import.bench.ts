/**
 * Import throughput on the generated 1-hour, 1-kHz, 3-channel log (bench/generate-log.ts, ≈ 84 MB,
 * 3.6 M rows): the whole readLogFile, and where the time goes (reading bytes, parsing them in the pure core;
 * the text path, fed decoded strings, for comparison), with numpy.loadtxt (when python3 with numpy is
 * installed) on the same file. Wall and CPU time are both printed, each line the run with the least CPU time
 * of several: on a shared, loaded machine CPU time is the steadier figure. Target (issue 2): no slower than
 * numpy.loadtxt (≈ 0.7 s on an idle build machine).
 */
import { spawnSync } from 'node:child_process';
import { openSync, readSync, closeSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
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

const RUNS = 5;

/** Best of `n` runs by CPU time (the least disturbed by other processes). */
async function best(n: number, fn: () => Promise<unknown> | unknown): Promise<Timing> {
  let b: Timing | null = null;
  for (let i = 0; i < n; i++) {
    const t = await timed(fn);
    if (!b || t.cpuMs < b.cpuMs) b = t;
  }
  return b as Timing;
}

/** The file in 4 MB chunks, as readLogFile reads it (each chunk its own copy here). */
function readChunks(path: string): Uint8Array[] {
  const fd = openSync(path, 'r');
  const chunks: Uint8Array[] = [];
  for (;;) {
    const buf = new Uint8Array(CHUNK_BYTES);
    const n = readSync(fd, buf, 0, CHUNK_BYTES, null);
    if (n === 0) break;
    chunks.push(buf.subarray(0, n));
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
  const whole = await best(RUNS, async () => {
    rows = (await readLogFile(log.path)).report.rows;
  });
  console.log(`  ${rows.toLocaleString('en')} rows, time + 3 channels; least CPU time of ${RUNS} runs`);
  console.log(line('readLogFile (read, detect, parse bytes)', whole, log.bytes, rows));
  // as the CLI runs it: one import in a fresh process (cold JIT, output memory fresh from the system)
  const here = dirname(fileURLToPath(import.meta.url));
  let fresh: Timing | null = null;
  for (let i = 0; i < 3; i++) {
    const run = spawnSync(process.execPath, ['--import', 'tsx', join(here, 'import-once.ts'), log.path], { encoding: 'utf8', cwd: join(here, '..') });
    if (run.status !== 0) break;
    const [wallMs, cpuMs] = run.stdout.trim().split(/\s+/).map(Number);
    const t = { wallMs: wallMs as number, cpuMs: cpuMs as number };
    if (!fresh || t.cpuMs < fresh.cpuMs) fresh = t;
  }
  if (fresh) console.log(line('readLogFile, fresh process (best of 3)', fresh, log.bytes, rows));

  let chunks: Uint8Array[] = [];
  const read = await best(RUNS, () => {
    chunks = readChunks(log.path);
  });
  console.log(line('  of which: read 4 MB chunks', read, log.bytes, rows));
  const parse = await best(RUNS, () => {
    const p = createLogParser({ sizeHintChars: log.bytes });
    for (const c of chunks) p.push(c);
    p.finish();
  });
  console.log(line('  of which: parse the bytes (pure core)', parse, log.bytes, rows));
  const texts = chunks.map((c) => Buffer.from(c.buffer, c.byteOffset, c.length).toString('latin1'));
  chunks = [];
  const parseText = await best(RUNS, () => {
    const p = createLogParser({ sizeHintChars: log.bytes });
    for (const c of texts) p.push(c);
    p.finish();
  });
  console.log(line('text path: parse decoded strings (pure core)', parseText, log.bytes, rows));

  // numpy in a fresh process per run; its own clocks exclude Python's start-up
  let numpy: Timing | null = null;
  for (let i = 0; i < 3; i++) {
    const py = spawnSync('python3', ['-c', `import time, numpy as np\nt=time.perf_counter(); t0=time.process_time(); a=np.loadtxt(${JSON.stringify(log.path)}, delimiter=',', skiprows=2)\nprint(time.perf_counter()-t, time.process_time()-t0, a.shape[0])`], { encoding: 'utf8' });
    if (py.status !== 0) break;
    const [wallS, cpuS] = py.stdout.trim().split(/\s+/).map(Number);
    const t = { wallMs: (wallS as number) * 1000, cpuMs: (cpuS as number) * 1000 };
    if (!numpy || t.cpuMs < numpy.cpuMs) numpy = t;
  }
  if (numpy) {
    console.log(line('numpy.loadtxt, same file (best of 3)', numpy, log.bytes, rows));
    console.log(`  readLogFile / numpy.loadtxt, CPU time: ${(whole.cpuMs / numpy.cpuMs).toFixed(2)} (warm), ${fresh ? (fresh.cpuMs / numpy.cpuMs).toFixed(2) : '–'} (fresh process; numpy runs in one too)`);
  } else {
    console.log('  numpy.loadtxt: not measured (python3 with numpy not installed)');
  }
}
