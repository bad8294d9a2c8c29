/**
 * Writes the benchmark log: 1 hour at 1 kHz (3.6 M rows), time + 3 channels (pressure setpoint, pressure,
 * flow), comma-separated, ≈ 86 MB. Invented data (a setpoint staircase with first-order responses and
 * seeded noise), deterministic for a given seed. Usage: `tsx bench/generate-log.ts [out.csv]`.
 */
import { createWriteStream, existsSync, mkdirSync, statSync } from 'node:fs';
import { dirname } from 'node:path';
import { pathToFileURL } from 'node:url';

export const BENCH_LOG_PATH = '.bench-data/bench-1h-1kHz-3ch.csv';
export const BENCH_ROWS = 3_600_000;
export const BENCH_RATE_HZ = 1000;

/** Mulberry32: a small seeded generator (public-domain algorithm by Tommy Ettinger); uniform in [0, 1). */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Writes the log (if not already there with the right size marker) and returns its path and size. */
export async function generateBenchLog(path = BENCH_LOG_PATH, seed = 20260314, rows = BENCH_ROWS): Promise<{ path: string; bytes: number }> {
  if (existsSync(path)) return { path, bytes: statSync(path).size };
  mkdirSync(dirname(path), { recursive: true });
  const rand = mulberry32(seed);
  const out = createWriteStream(path);
  const write = (s: string): Promise<void> => new Promise((resolve) => (out.write(s) ? resolve() : out.once('drain', resolve)));
  await write('# Invented benchmark log: priming a PDMS mixer chip (Lagbench demo scenario)\n');
  await write('Time [s],Pressure setpoint [mbar],Pressure [mbar],Flow [uL/min]\n');
  const tauS = 0.8;
  const alpha = 1 - Math.exp(-1 / BENCH_RATE_HZ / tauS);
  let pressure = 0;
  let lines: string[] = [];
  for (let i = 0; i < rows; i++) {
    const setpoint = 50 * (1 + (Math.floor(i / 60000) % 6));
    pressure += alpha * (setpoint - pressure);
    const p = pressure + (rand() - 0.5) * 0.4;
    const q = pressure * 0.021 + (rand() - 0.5) * 0.05;
    lines.push(`${(i / BENCH_RATE_HZ).toFixed(3)},${setpoint},${p.toFixed(1)},${q.toFixed(2)}`);
    if (lines.length === 50000) {
      await write(lines.join('\n') + '\n');
      lines = [];
    }
  }
  if (lines.length > 0) await write(lines.join('\n') + '\n');
  await new Promise<void>((resolve, reject) => out.end((err?: Error | null) => (err ? reject(err) : resolve())));
  return { path, bytes: statSync(path).size };
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const r = await generateBenchLog(process.argv[2] ?? BENCH_LOG_PATH);
  console.log(`${r.path}: ${(r.bytes / 1e6).toFixed(1)} MB`);
}
