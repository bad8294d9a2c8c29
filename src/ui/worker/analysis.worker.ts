/**
 * The analysis worker: runs the pure core (src/core) off the window's thread. It keeps the imported
 * recording at full resolution and answers with what the views draw. Every result comes from the core;
 * pieces of the core that have not landed yet are reported as unavailable, never imitated.
 */
import { InputError } from '../../core/errors';
import { createLogParser } from '../../core/import';
import type { ImportReport } from '../../core/import/types';
import type { Recording } from '../../core/recording/types';
import { mergeRecordings } from '../../core/recording/merge';
import { chooseSetup, detectSteps, driveChannel, medianOfSlice, responseChannel } from '../../core/steps';
import type { Setup, Step } from '../../core/steps/types';
import { fitTransient, evaluateTransient } from '../../core/fit/transient';
import type { TransientData, TransientFit } from '../../core/fit/types';
import { analyzeRecording } from '../../core/analyze/analyze';
import { capabilitiesOfPhysics, runPhysics } from './physics-bridge';
import { decimateMinMax, lowerBound } from './decimate';
import { runWhatIf } from './whatif-bridge';
import { analysedChip, rememberAnalysis } from './qc-bridge';
import type { AnalysisView, Capabilities, RecordingSummary, SeriesSet, StepFitView, StepsResult, WorkerRequest, WorkerResponse } from './protocol';

const ctx = self as unknown as { postMessage(msg: WorkerResponse, transfer?: Transferable[]): void; onmessage: ((ev: MessageEvent<WorkerRequest>) => void) | null };

let recording: Recording | null = null;
let reports: ImportReport[] = [];

/** Bytes decoded and parsed per chunk (progress granularity; papaparse-style 4 MB chunks, GUIDE §4). */
const CHUNK_BYTES = 4 * 1024 * 1024;
/** Most points per step window sent to the window for drawing. */
const MAX_DRAW_POINTS = 1500;

const capabilities = (): Capabilities => ({
  importer: true,
  stepDetection: true,
  fitting: true,
  ...capabilitiesOfPhysics(),
});

function decoderFor(bytes: Uint8Array): TextDecoder {
  // UTF-8 when valid; otherwise Windows-1252 (older loggers write µ as 0xB5).
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(bytes.subarray(0, Math.min(bytes.length, 1 << 20)));
    return new TextDecoder('utf-8');
  } catch {
    return new TextDecoder('windows-1252');
  }
}

function importOne(name: string, bytes: Uint8Array, options: Parameters<typeof createLogParser>[0], progress: (done: number) => void): { recording: Recording; report: ImportReport } {
  const parser = createLogParser({ ...options, sourceName: name, sizeHintChars: bytes.length });
  const decoder = decoderFor(bytes);
  // UTF-8 goes to the importer as bytes (its byte tokenizer skips decoding, as readLogFile does);
  // other encodings are decoded here first.
  const asBytes = decoder.encoding === 'utf-8';
  for (let off = 0; off < bytes.length; off += CHUNK_BYTES) {
    const end = Math.min(bytes.length, off + CHUNK_BYTES);
    const chunk = bytes.subarray(off, end);
    parser.push(asBytes ? chunk : decoder.decode(chunk, { stream: end < bytes.length }));
    progress(end);
  }
  return parser.finish();
}

function summary(r: Recording, rep: ImportReport[]): Omit<RecordingSummary, 'suggestedSetup' | 'setupReason'> {
  return {
    channels: r.channels.map((c) => ({ name: c.name, quantity: c.quantity, originalHeader: c.originalHeader, originalUnit: c.originalUnit, sourceIndex: c.sourceIndex })),
    sampleCount: r.timeS.length,
    durationS: r.timeS.length ? (r.timeS[r.timeS.length - 1] as number) : 0,
    startEpochMs: r.startEpochMs,
    sources: r.sources,
    reports: rep,
    warnings: r.warnings,
  };
}

function series(fromS: number | null, toS: number | null, maxPoints: number): { result: SeriesSet; transfer: Transferable[] } {
  if (!recording) throw new Error('No recording is loaded.');
  const t = recording.timeS;
  const from = fromS === null ? 0 : Math.max(0, lowerBound(t, fromS) - 1);
  const to = toS === null ? t.length : Math.min(t.length, lowerBound(t, toS) + 1);
  const values = recording.channels.map((c) => c.values);
  const { idx } = decimateMinMax(t, values, from, to, Math.max(50, Math.floor(maxPoints / 2)));
  const tS = Float64Array.from(idx, (i) => t[i] as number);
  const channels = recording.channels.map((c) => ({ name: c.name, y: Float64Array.from(idx, (i) => c.values[i] as number) }));
  return { result: { tS, channels }, transfer: [tS.buffer, ...channels.map((c) => c.y.buffer)] };
}

function thin(n: number, max: number): number[] {
  if (n <= max) return Array.from({ length: n }, (_, i) => i);
  const step = n / max;
  return Array.from({ length: max }, (_, i) => Math.floor(i * step));
}

/**
 * Steps the user added or moved get their drive levels from the drive channel (median of the samples
 * between the neighbouring onsets), so R and C stay computable after manual edits.
 */
function withDriveLevels(rec: Recording, setup: Setup, steps: Step[]): Step[] {
  const drive = driveChannel(rec, setup, responseChannel(rec, setup));
  const t = rec.timeS;
  const endS = t.length ? (t[t.length - 1] as number) : 0;
  return steps.map((s, i) => {
    if (s.origin !== 'user' || !drive) return { ...s };
    const prevS = steps[i - 1]?.onsetS ?? 0;
    const nextS = steps[i + 1]?.onsetS ?? endS;
    const a = lowerBound(t, prevS);
    const b = lowerBound(t, s.onsetS);
    const c = lowerBound(t, nextS);
    const before = b > a ? medianOfSlice(drive.values, a, b) : Number.NaN;
    const after = c > b + 1 ? medianOfSlice(drive.values, b + 1, c) : Number.NaN;
    return { ...s, drive: { channel: drive.name, quantity: drive.quantity, before, after }, direction: after >= before ? 'up' : 'down' };
  });
}

function analyze(req: Extract<WorkerRequest, { type: 'analyze' }>, progress: (f: number, label: string) => void): AnalysisView {
  if (!recording) throw new Error('No recording is loaded.');
  // Capture each window the pipeline fits, in call order, to draw the data, the curve and residuals.
  const calls: Array<{ data: TransientData; fit: TransientFit | null }> = [];
  const fitter = {
    fitTransient(data: TransientData, options: Parameters<typeof fitTransient>[1]) {
      try {
        const fit = fitTransient(data, options);
        calls.push({ data, fit });
        return fit;
      } catch (err) {
        calls.push({ data, fit: null });
        throw err;
      }
    },
  };
  const steps: Step[] = withDriveLevels(recording, req.setup, req.steps);
  const json = analyzeRecording(
    recording,
    {
      setup: req.setup,
      steps,
      fit: { terms: req.fit.terms, deadTime: req.fit.deadTime, drift: req.fit.drift, robust: req.fit.robust },
      sharedFits: false,
      onProgress: (f, stage) => progress(0.85 * f, `Fitting: ${stage}`),
      software: { name: 'lagbench', version: 'app' },
    },
    fitter,
  );
  progress(0.85, 'Physics');
  const physics = runPhysics(json, recording, req.setup, req.chipText, req.chipName);
  rememberAnalysis(physics.json, recording);
  const fits: StepFitView[] = [];
  let call = 0;
  physics.json.steps.forEach((sj, i) => {
    const notFitted = sj.warnings.some((w) => w.code === 'window-too-short');
    const captured = notFitted ? undefined : calls[call++];
    const fit = captured?.fit ?? null;
    const data = captured?.data;
    const keep = data ? thin(data.tS.length, MAX_DRAW_POINTS) : [];
    const tS = Float64Array.from(keep, (k) => data?.tS[k] as number);
    const y = Float64Array.from(keep, (k) => data?.y[k] as number);
    const fitY = fit ? evaluateTransient(fit, tS) : new Float64Array(0);
    const residual = fit ? Float64Array.from(y, (v, k) => v - (fitY[k] as number)) : new Float64Array(0);
    const ph = physics.steps[i];
    fits.push({
      stepIndex: i,
      onsetS: sj.start_s,
      windowEndS: sj.end_s,
      responseChannel: sj.response.channel,
      responseQuantity: sj.response.quantity,
      tS,
      y,
      fitY,
      residual,
      fit,
      error: fit ? null : sj.warnings.map((w) => w.message).join(' ') || 'No fit was made for this step.',
      resistancePaSPerM3: ph?.resistance ?? null,
      complianceM3PerPa: ph?.compliance ?? null,
      pressureAbsPa: ph?.pressureAbsPa ?? null,
      notes: ph?.notes ?? [],
      warnings: sj.warnings.map((w) => ({ code: w.code, message: w.message })),
    });
  });
  return {
    setup: json.setup,
    fits,
    fittedComplianceM3PerPa: physics.fittedComplianceM3PerPa,
    nominal: physics.nominal,
    nominalNote: physics.nominalNote,
    fingerprint: physics.fingerprint,
    fingerprintNote: physics.fingerprintNote,
    trappedAir: physics.trappedAir,
    trappedAirNote: physics.trappedAirNote,
    warnings: physics.warnings,
  };
}

function handle(req: WorkerRequest): { result: unknown; transfer?: Transferable[] } {
  const progress = (fraction: number, label: string): void => ctx.postMessage({ id: req.id, type: 'progress', fraction, label });
  switch (req.type) {
    case 'capabilities':
      return { result: capabilities() };
    case 'import': {
      const total = req.files.reduce((s, f) => s + f.bytes.length, 0) || 1;
      let before = 0;
      const results = req.files.map((f, i) => {
        const r = importOne(f.name, f.bytes, req.options[i] ?? {}, (done) => progress((before + done) / total, `Reading ${f.name}`));
        before += f.bytes.length;
        return r;
      });
      if (!results.length) throw new Error('No file to import.');
      // Two logs of one run go onto one time base (core/recording/merge: by absolute start times, or the offset given).
      recording = results.length === 1 ? (results[0] as (typeof results)[number]).recording : mergeRecordings(results.map((r) => r.recording), req.mergeOffsetS !== null ? { offsetsS: [req.mergeOffsetS] } : {});
      reports = results.map((r) => r.report);
      const choice = chooseSetup(recording);
      return { result: { ...summary(recording, reports), suggestedSetup: choice.setup, setupReason: choice.reason } };
    }
    case 'series': {
      const s = series(req.fromS, req.toS, req.maxPoints);
      return { result: s.result, transfer: s.transfer };
    }
    case 'detect': {
      if (!recording) throw new Error('No recording is loaded.');
      const setup: Setup = chooseSetup(recording, req.setup).setup;
      const d = detectSteps(recording, { setup });
      const result: StepsResult = { steps: d.steps, channel: d.channel, quantity: d.quantity, noiseSigma: d.noiseSigma, warnings: d.warnings };
      return { result };
    }
    case 'analyze':
      return { result: analyze(req, progress) };
    case 'whatif':
      return { result: runWhatIf(req) };
    case 'qc-chip':
      return { result: analysedChip(req.chipId) };
    default:
      throw new Error('unknown request');
  }
}

ctx.onmessage = (ev: MessageEvent<WorkerRequest>) => {
  const req = ev.data;
  try {
    const { result, transfer } = handle(req);
    ctx.postMessage({ id: req.id, type: 'result', result }, transfer ?? []);
  } catch (err) {
    const inputError = err instanceof InputError;
    ctx.postMessage({ id: req.id, type: 'error', message: err instanceof Error ? err.message : String(err), inputError });
  }
};
