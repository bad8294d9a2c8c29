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

function stageTimes(recordingRun: (onProgress: AnalyzeOptions['onProgress']) => void): Record<string, number> {
  const marks: [string, number][] = [];
  recordingRun((_f, stage) => {
    if (marks.length === 0 || marks[marks.length - 1]![0] !== stage) marks.push([stage, performance.now()]);
  });
  const out: Record<string, number> = {};
  for (let i = 0; i + 1 < marks.length; i++) out[marks[i]![0]] = marks[i + 1]![1] - marks[i]![1];
  return out;
}

export default async function analyzeBench(): Promise<void> {
  const log = await generateBenchLog();
  const t0 = performance.now();
  const { recording } = await readLogFile(log.path);
  const importMs = performance.now() - t0;
  console.log(`analyze: 1 h × 1 kHz log, ${(log.bytes / 1e6).toFixed(1)} MB, ${recording.timeS.length.toLocaleString('en')} rows, ${recording.channels.length} channels`);
  console.log(`  import (read + parse)            ${importMs.toFixed(0).padStart(6)} ms`);

  const d0 = performance.now();
  const detection = detectSteps(recording);
  console.log(
    `  step detection alone             ${(performance.now() - d0).toFixed(0).padStart(6)} ms  (${detection.steps.length} steps on ${detection.channel}, ${detection.ramps.length} ramps)`,
  );

  for (const [label, fit] of [
    ['1 term', { terms: 1 as const }],
    ['auto order (1–3, BIC)', { terms: 'auto' as const }],
  ] as const) {
    let result: ReturnType<typeof analyzeRecording> | null = null;
    const a0 = performance.now();
    const stages = stageTimes((onProgress) => {
      result = analyzeRecording(recording, { fit, onProgress }, defaultFitter);
    });
    const analyzeMs = performance.now() - a0;
    const r = result as unknown as ReturnType<typeof analyzeRecording>;
    const taus = r.steps.map((s) => s.terms[0]?.tau_s ?? Number.NaN).filter(Number.isFinite);
    const converged = r.steps.filter((s) => s.fit?.converged).length;
    console.log(`  analyze, ${label}:`);
    console.log(`    detection                      ${(stages.steps ?? 0).toFixed(0).padStart(6)} ms`);
    console.log(`    fits (${r.steps.length} windows)               ${(stages.fits ?? 0).toFixed(0).padStart(6)} ms  (${((stages.fits ?? 0) / Math.max(1, r.steps.length)).toFixed(1)} ms per window, ${converged} converged)`);
    console.log(`    shared fits                    ${(stages['shared fits'] ?? 0).toFixed(0).padStart(6)} ms`);
    console.log(`    import + analyze               ${(importMs + analyzeMs).toFixed(0).padStart(6)} ms  (target < 3000 ms)`);
    if (taus.length > 0) console.log(`    fastest τ per step: median ${taus.sort((a, b) => a - b)[Math.floor(taus.length / 2)]!.toFixed(4)} s`);
  }
}
