/**
 * Benchmark of a whole `lagbench analyze` of the 1-hour, 1-kHz, 3-channel log (bench/generate-log.ts):
 * import, step detection, fits (per stage), and the same with 1 term and with auto order.
 * Target (project issue 3): the whole log in under 3 s. Figures only; nothing asserted.
 */
import { analyzeRecording } from '../src/core/analyze/analyze';
import { defaultFitter } from '../src/core/analyze/default-fitter';
import type { AnalyzeOptions } from '../src/core/analyze/types';
import { detectSteps } from '../src/core/steps/detect';
import { readLogFile } from '../src/io/read-log';
import { generateBenchLog } from './generate-log';
import { availableParallelism, loadavg } from 'node:os';

/** CPU time of this process, ms (user + system): on a shared, loaded machine closer to the idle wall time. */
function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

/** Wall and CPU ms per stage, from the pipeline's progress callback. */
function stageTimes(recordingRun: (onProgress: AnalyzeOptions['onProgress']) => void): Record<string, { wall: number; cpu: number }> {
  const marks: [string, number, number][] = [];
  recordingRun((_f, stage) => {
    if (marks.length === 0 || marks[marks.length - 1]![0] !== stage) marks.push([stage, performance.now(), cpuMs()]);
  });
  const out: Record<string, { wall: number; cpu: number }> = {};
  for (let i = 0; i + 1 < marks.length; i++) out[marks[i]![0]] = { wall: marks[i + 1]![1] - marks[i]![1], cpu: marks[i + 1]![2] - marks[i]![2] };
  return out;
}

const fmt = (wall: number, cpu: number): string => `${wall.toFixed(0).padStart(6)} ms wall, ${cpu.toFixed(0).padStart(6)} ms CPU`;

export default async function analyzeBench(): Promise<void> {
  const log = await generateBenchLog();
  const t0 = performance.now();
  const c0 = cpuMs();
  const { recording } = await readLogFile(log.path);
  const importMs = performance.now() - t0;
  const importCpu = cpuMs() - c0;
  console.log(`analyze: 1 h × 1 kHz log, ${(log.bytes / 1e6).toFixed(1)} MB, ${recording.timeS.length.toLocaleString('en')} rows, ${recording.channels.length} channels`);
  console.log(`  (load average ${loadavg().map((l) => l.toFixed(1)).join(', ')} on ${availableParallelism()} cores: wall times include waiting for the CPU)`);
  console.log(`  import (read + parse)            ${fmt(importMs, importCpu)}`);

  const d0 = performance.now();
  const dc0 = cpuMs();
  const detection = detectSteps(recording);
  console.log(
    `  step detection alone             ${fmt(performance.now() - d0, cpuMs() - dc0)}  (${detection.steps.length} steps on ${detection.channel}, ${detection.ramps.length} ramps)`,
  );

  for (const [label, fit] of [
    ['1 term', { terms: 1 as const }],
    ['auto order (1–3, BIC)', { terms: 'auto' as const }],
  ] as const) {
    let result: ReturnType<typeof analyzeRecording> | null = null;
    const a0 = performance.now();
    const ac0 = cpuMs();
    const stages = stageTimes((onProgress) => {
      result = analyzeRecording(recording, { fit, onProgress }, defaultFitter);
    });
    const analyzeMs = performance.now() - a0;
    const analyzeCpu = cpuMs() - ac0;
    const r = result as unknown as ReturnType<typeof analyzeRecording>;
    const taus = r.steps.map((s) => s.terms[0]?.tau_s ?? Number.NaN).filter(Number.isFinite);
    const converged = r.steps.filter((s) => s.fit?.converged).length;
    console.log(`  analyze, ${label}:`);
    const st = (k: string): { wall: number; cpu: number } => stages[k] ?? { wall: 0, cpu: 0 };
    console.log(`    detection                      ${fmt(st('steps').wall, st('steps').cpu)}`);
    console.log(
      `    fits (${r.steps.length} windows)               ${fmt(st('fits').wall, st('fits').cpu)}  (${(st('fits').cpu / Math.max(1, r.steps.length)).toFixed(1)} ms CPU per window, ${converged} converged)`,
    );
    console.log(`    shared fits (${r.shared_fits.length} groups)          ${fmt(st('shared fits').wall, st('shared fits').cpu)}`);
    console.log(`    import + analyze               ${fmt(importMs + analyzeMs, importCpu + analyzeCpu)}  (target < 3000 ms)`);
    if (taus.length > 0) console.log(`    fastest τ per step: median ${taus.sort((a, b) => a - b)[Math.floor(taus.length / 2)]!.toFixed(4)} s`);
  }
}
