/**
 * Benchmark of the transient fitter: fits per second for 1, 2 and 3 exponential terms at
 * 1 k / 10 k / 100 k points (fixed order, seeded synthetic data), plus 'auto' order, dead time
 * and the robust option at 1 k points. Target (project issue 3): a single-exponential fit of a
 * 1 000-point window well under a millisecond. Figures only; nothing asserted.
 * Runs under `npm run bench` (bench/run.ts) or alone: `npx tsx bench/fit.bench.ts`.
 */
import { fitTransient } from '../src/core/fit';
import type { TransientData, TransientFitOptions } from '../src/core/fit';
import { createRng } from '../src/core/stats';

const SHAPES: Record<number, { amplitude: number; tauS: number }[]> = {
  1: [{ amplitude: -3, tauS: 1.5 }],
  2: [{ amplitude: -2, tauS: 0.3 }, { amplitude: -1, tauS: 3 }],
  3: [{ amplitude: -1.5, tauS: 0.1 }, { amplitude: -1, tauS: 1 }, { amplitude: -0.8, tauS: 6 }],
};

function window(n: number, terms: { amplitude: number; tauS: number }[], seed: number): TransientData {
  const rng = createRng(seed);
  const windowS = 6 * Math.max(...terms.map((t) => t.tauS));
  const tS = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = (i * windowS) / (n - 1);
    let v = 5;
    for (const term of terms) v += term.amplitude * Math.exp(-t / term.tauS);
    tS[i] = t;
    y[i] = v + 0.005 * rng.normal();
  }
  return { tS, y };
}

/** CPU milliseconds (user + system) of this process since `since` (robust to a loaded machine). */
function cpuMs(since?: NodeJS.CpuUsage): number {
  const u = process.cpuUsage(since);
  return (u.user + u.system) / 1000;
}

/**
 * Mean time per fit over at least `minMs` of CPU time after a warm-up: CPU time (this process) and wall
 * time. On a shared, loaded machine the wall time is inflated by waiting; the CPU time is the fitter's cost.
 */
function timeFit(data: TransientData, options: TransientFitOptions, minMs = 400): { cpuMs: number; wallMs: number; converged: boolean } {
  let converged = true;
  // Warm-up long enough for the JIT to optimise the inner loops (≈ 300 fits of a small window).
  const warm = process.cpuUsage();
  let warmFits = 0;
  while (warmFits < 300 && cpuMs(warm) < minMs) {
    converged = fitTransient(data, options).converged && converged;
    warmFits++;
  }
  let count = 0;
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  do {
    converged = fitTransient(data, options).converged && converged;
    count++;
  } while (cpuMs(c0) < minMs);
  return { cpuMs: cpuMs(c0) / count, wallMs: (performance.now() - t0) / count, converged };
}

/** CPU µs for 1 000 Math.exp calls: a yardstick of this machine's current speed (≈ 5–10 µs on an idle desktop core). */
function expYardstick(): number {
  const a = new Float64Array(1000);
  let sink = 0;
  for (let k = 0; k < 2000; k++) for (let i = 0; i < 1000; i++) a[i] = Math.exp(-i * 1e-3 * (k % 7));
  const c0 = process.cpuUsage();
  for (let k = 0; k < 20_000; k++) {
    for (let i = 0; i < 1000; i++) a[i] = Math.exp(-i * 1e-3 * (k % 7));
    sink += a[999]!;
  }
  return sink > 0 ? (cpuMs(c0) * 1000) / 20_000 : NaN;
}

export default async function fitBench(): Promise<void> {
  console.log(`fit: machine yardstick: 1 000 Math.exp calls take ${expYardstick().toFixed(1)} CPU µs`);
  // Global warm-up: the optimising compiler runs on background threads whose CPU time counts for the process, so
  // let it finish on every code path (1–3 terms, dead time, robust, auto) before anything is measured.
  const warmStart = process.cpuUsage();
  while (cpuMs(warmStart) < 3000) {
    for (const terms of [1, 2, 3] as const) fitTransient(window(1_000, SHAPES[terms]!, terms), { terms });
    fitTransient(window(1_000, SHAPES[1]!, 4), { terms: 'auto', deadTime: true, robust: 'huber' });
  }
  console.log('fit: fitTransient on seeded synthetic windows (noise 0.005, window 6 × slowest τ)');
  console.log('  terms      points  CPU ms/fit  fits/CPU-s  wall ms/fit  converged');
  for (const terms of [1, 2, 3] as const) {
    for (const n of [1_000, 10_000, 100_000]) {
      const data = window(n, SHAPES[terms]!, 1000 * terms + n);
      const { cpuMs: ms, wallMs, converged } = timeFit(data, { terms }, n >= 100_000 ? 1500 : 600);
      console.log(
        `  ${String(terms).padStart(5)} ${n.toLocaleString('en').padStart(10)} ${ms.toFixed(3).padStart(11)} ${(1000 / ms).toFixed(0).padStart(11)} ${wallMs.toFixed(3).padStart(12)}  ${converged}`,
      );
    }
  }
  const one = window(1_000, SHAPES[1]!, 7);
  const two = window(1_000, SHAPES[2]!, 8);
  for (const [label, data, options] of [
    ['auto order, 1-term data', one, { terms: 'auto' }],
    ['auto order, 2-term data', two, { terms: 'auto' }],
    ['1 term + dead time', one, { terms: 1, deadTime: true }],
    ['1 term, robust huber', one, { terms: 1, robust: 'huber' }],
  ] as [string, TransientData, TransientFitOptions][]) {
    const { cpuMs: ms, wallMs } = timeFit(data, options);
    console.log(`  ${label.padEnd(26)} 1,000 points ${ms.toFixed(3).padStart(8)} CPU ms/fit (${wallMs.toFixed(3)} wall)`);
  }
}

// Standalone: `npx tsx bench/fit.bench.ts`.
if (process.argv[1] && import.meta.url.endsWith(process.argv[1].replace(/^.*\//, '/'))) {
  void fitBench();
}
