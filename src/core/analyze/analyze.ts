/**
 * `analyzeRecording`: the pipeline recording → steps → windows → transient fits (→ shared-τ fits),
 * returning the JSON-shaped {@link AnalysisJson}. Pure: no I/O, no clock.
 */
import { InputError, type Warning } from '../errors';
import type { TransientFit } from '../fit/types';
import { SI_UNIT_OF, type Channel, type Recording } from '../recording/types';
import { chooseSetup, responseChannel, SETUP_QUANTITIES } from '../steps/choose-channel';
import { detectSteps } from '../steps/detect';
import { noiseSigmaFromDifferences } from '../steps/robust';
import type { Ramp, Setup, Step, StepDetection } from '../steps/types';
import { defaultFitter } from './default-fitter';
import { sameLevelGroups } from './shared';
import { ci, fitJson, num, termJson, warningJson } from './to-json';
import type { AnalysisJson, AnalyzeOptions, Fitter, SharedFitJson, StepJson, WarningJson } from './types';
import { cutWindow } from './windows';

/** Default cap on the points of one fit (longer windows are block-averaged; see windows.ts). */
export const DEFAULT_MAX_FIT_POINTS = 5000;
/** Fewest points a window must hold to be fitted (a 1-term model has 3 parameters). */
export const MIN_WINDOW_POINTS = 8;

/**
 * Analyses one recording with `fitter` (default: src/core/fit; the app's worker passes a wrapper that
 * keeps each window for its plots). Throws InputError when the setup's response channel is missing or a
 * named channel does not exist; everything recoverable becomes a warning in the result.
 */
export function analyzeRecording(recording: Recording, options: AnalyzeOptions = {}, fitter: Fitter = defaultFitter): AnalysisJson {
  const progress = options.onProgress ?? (() => undefined);
  progress(0, 'steps');
  const setupChoice = chooseSetup(recording, options.setup);
  const setup = setupChoice.setup;
  const response = responseChannel(recording, setup, options.responseChannel);
  if (!response) {
    const wanted = options.responseChannel ? `channel '${options.responseChannel}'` : `${SETUP_QUANTITIES[setup].response} channel`;
    throw new InputError(
      'no-response-channel',
      `The log has no ${wanted} to analyse as the response of a ${setup} setup`,
      `Channels found: ${recording.channels.map((c) => `${c.name} (${c.quantity})`).join(', ') || 'none'}; give the other --setup or say which column is the response`,
      { file: recording.sources[0] },
    );
  }
  const warnings: Warning[] = [...recording.warnings];
  if (setupChoice.assumed) {
    warnings.push({ code: 'setup-assumed', message: `Setup ${setup} assumed: ${setupChoice.reason}. Give --setup if that is wrong.` });
  }
  const endS = recording.timeS.length > 0 ? (recording.timeS[recording.timeS.length - 1] as number) : 0;
  const detection = options.steps ? userDetection(options.steps, options.ramps ?? [], endS, setup, warnings) : detectSteps(recording, { ...options.detection, setup, responseChannel: response.name });
  warnings.push(...detection.warnings);
  progress(0.1, 'fits');

  const maxPoints = options.maxFitPoints ?? DEFAULT_MAX_FIT_POINTS;
  // A channel interpolated from a slower logger is fitted on its own samples: interpolated points are not
  // independent, and treating them so would make the confidence intervals too narrow.
  const fitTimeS = response.native?.timeS ?? recording.timeS;
  const fitValues = response.native?.values ?? response.values;
  const windows = detection.steps.map((step) => cutWindow(fitTimeS, fitValues, step, endS, maxPoints));
  const stepsJson: StepJson[] = [];
  const fits: (TransientFit | null)[] = [];
  for (const [i, step] of detection.steps.entries()) {
    progress(0.1 + (0.8 * i) / Math.max(1, detection.steps.length), 'fits');
    const w = windows[i] as (typeof windows)[number];
    const stepWarnings: WarningJson[] = [];
    let fit: TransientFit | null = null;
    const finitePoints = w.data.y.reduce((m, v) => m + (Number.isFinite(v) ? 1 : 0), 0);
    if (finitePoints < MIN_WINDOW_POINTS) {
      stepWarnings.push({
        code: 'window-too-short',
        message: `Step ${step.index}: only ${finitePoints} usable samples in its window; not fitted.`,
      });
    } else {
      try {
        fit = fitter.fitTransient(w.data, options.fit ?? {});
      } catch (err) {
        if (!(err instanceof InputError)) throw err;
        stepWarnings.push({ code: 'fit-refused', message: `Step ${step.index}: ${err.problem}` });
      }
    }
    fits.push(fit);
    stepsJson.push(stepJson(step, response, w.samples, w.samplesPerPoint, fit, stepWarnings));
  }

  progress(0.9, 'shared fits');
  const shared =
    options.sharedFits === false || !fitter.fitSharedTaus
      ? []
      : sharedFits(detection, (step) => cutWindow(fitTimeS, fitValues, step, endS, sharedPoints(maxPoints)), fits, options, fitter);
  const inconclusive = stepsJson.filter((s) => s.inconclusive).length;
  const all: WarningJson[] = warnings.map(warningJson);
  if (inconclusive > 0) {
    all.push({
      code: 'inconclusive-steps',
      message: `${inconclusive} of ${stepsJson.length} step(s) are inconclusive (see their warnings).`,
      count: inconclusive,
    });
  }
  if (stepsJson.length === 0) {
    all.push({ code: 'no-steps', message: 'No steps were found. Give a smaller --min-step or --min-dwell, or a step list with --steps.' });
  }
  progress(1, 'done');
  return {
    software: options.software ?? { name: 'lagbench', version: 'unknown' },
    files: [...recording.sources],
    setup,
    setup_reason: setupChoice.reason,
    detection: {
      origin: detection.origin,
      channel: detection.channel,
      quantity: detection.quantity,
      unit: SI_UNIT_OF[detection.quantity],
      min_step_size: num(detection.minStepSize),
      min_dwell_s: num(detection.minDwellS),
    },
    noise_sigma: {
      response: num(noiseSigmaFromDifferences(response.values)),
      response_unit: SI_UNIT_OF[response.quantity],
      detection: num(detection.noiseSigma),
      detection_unit: SI_UNIT_OF[detection.quantity],
    },
    steps: stepsJson,
    ramps: detection.ramps.map((r) => ({ start_s: r.startS, end_s: r.endS, before: num(r.before), after: num(r.after) })),
    shared_fits: shared,
    warnings: all,
  };
}

/** A detection record for steps the user gave (they are checked against the recording's span). */
function userDetection(steps: Step[], ramps: Ramp[], endS: number, setup: Setup, warnings: Warning[]): StepDetection {
  const inside = steps.filter((s) => s.onsetS < endS);
  if (inside.length < steps.length) {
    warnings.push({
      code: 'steps-after-end',
      message: `${steps.length - inside.length} listed step(s) start after the end of the log and were left out.`,
      count: steps.length - inside.length,
    });
  }
  const quantity = inside[0]?.drive.quantity ?? SETUP_QUANTITIES[setup].setpoint;
  return {
    steps: inside.map((s, index) => ({ ...s, index, windowEndS: Math.min(s.windowEndS, endS) })),
    ramps: ramps.filter((r) => r.startS < endS),
    channel: null,
    quantity,
    origin: 'user',
    noiseSigma: Number.NaN,
    minStepSize: Number.NaN,
    minDwellS: Number.NaN,
    warnings: [],
  };
}

function stepJson(step: Step, response: Channel, samples: number, samplesPerPoint: number, fit: TransientFit | null, warnings: WarningJson[]): StepJson {
  if (fit) {
    for (const f of fit.flags) warnings.push({ code: f.code, message: `Step ${step.index}: ${f.message}` });
  }
  const inconclusive = !fit || !fit.converged || fit.flags.some((f) => f.code === 'inconclusive' || f.code === 'not-converged');
  return {
    index: step.index,
    start_s: step.onsetS,
    end_s: step.windowEndS,
    origin: step.origin,
    shape: step.shape ?? null,
    direction: step.direction,
    drive: {
      quantity: step.drive.quantity,
      channel: step.drive.channel,
      unit: SI_UNIT_OF[step.drive.quantity],
      before: num(step.drive.before),
      after: num(step.drive.after),
    },
    response: { quantity: response.quantity, channel: response.name, unit: SI_UNIT_OF[response.quantity] },
    n_samples: samples,
    terms: fit ? fit.terms.map(termJson) : [],
    y_inf: num(fit?.yInf.value),
    y_inf_se: num(fit?.yInf.standardError),
    y_inf_ci95: ci(fit?.yInf.ci95),
    dead_time_s: num(fit?.deadTimeS?.value),
    dead_time_se_s: num(fit?.deadTimeS?.standardError),
    dead_time_ci95_s: fit?.deadTimeS ? ci(fit.deadTimeS.ci95) : null,
    drift_per_s: num(fit?.driftPerS?.value),
    drift_ci95_per_s: fit?.driftPerS ? ci(fit.driftPerS.ci95) : null,
    settled: fit ? fit.settled : null,
    window_in_taus: num(fit?.windowInTaus),
    t63_s: num(fit?.t63S),
    t95_s: num(fit?.t95S),
    t99_s: num(fit?.t99S),
    fit: fit ? fitJson(fit, samplesPerPoint) : null,
    inconclusive,
    warnings,
  };
}

/** Points per window in a shared fit: fewer than alone, since a group may hold many windows. */
export const SHARED_FIT_POINTS_PER_WINDOW = 1000;
function sharedPoints(maxPoints: number): number {
  return maxPoints > 0 ? Math.min(maxPoints, SHARED_FIT_POINTS_PER_WINDOW) : SHARED_FIT_POINTS_PER_WINDOW;
}

/** Median of the orders chosen for the group's single fits (rounded up); the given order when fixed. */
function groupOrder(group: Step[], fits: (TransientFit | null)[], given: AnalyzeOptions['fit']): 1 | 2 | 3 {
  if (given?.terms !== undefined && given.terms !== 'auto') return given.terms;
  const orders = group.map((s) => fits[s.index]?.model.terms ?? 1).sort((a, b) => a - b);
  return Math.min(3, Math.max(1, orders[Math.floor(orders.length / 2)] ?? 1)) as 1 | 2 | 3;
}

/**
 * Shared-τ fits of same-direction, same-level steps. Each window is block-averaged to at most
 * SHARED_FIT_POINTS_PER_WINDOW points (τ unchanged, windows.ts) and the order is the median of the
 * orders the single fits chose, so that a group of many long windows stays affordable.
 */
function sharedFits(
  detection: StepDetection,
  windowOf: (step: Step) => ReturnType<typeof cutWindow>,
  fits: (TransientFit | null)[],
  options: AnalyzeOptions,
  fitter: Fitter,
): SharedFitJson[] {
  const sigma = Number.isFinite(detection.noiseSigma) ? detection.noiseSigma : 0;
  // Same level: within 3 σ of the drive noise or 2 % of the step (common practice, no source).
  const usable = detection.steps.filter((s) => fits[s.index] !== null);
  const groups = sameLevelGroups(usable, (s) => Math.max(3 * sigma, 0.02 * Math.abs(s.drive.after - s.drive.before)));
  const out: SharedFitJson[] = [];
  for (const group of groups) {
    const first = group[0] as Step;
    const data = group.map((s) => windowOf(s).data);
    try {
      const shared = fitter.fitSharedTaus?.(data, { ...options.fit, terms: groupOrder(group, fits, options.fit) });
      if (!shared) continue;
      out.push({
        direction: first.direction,
        drive_before: num(first.drive.before),
        drive_after: num(first.drive.after),
        step_indices: group.map((s) => s.index),
        model: { terms: shared.model.terms, dead_time: shared.model.deadTime, drift: shared.model.drift, robust: shared.model.robust },
        terms: shared.tausS.map((t) => ({ tau_s: num(t.value), tau_se_s: num(t.standardError), tau_ci95_s: ci(t.ci95) })),
        dead_time_s: num(shared.deadTimeS?.value),
        dead_time_ci95_s: shared.deadTimeS ? ci(shared.deadTimeS.ci95) : null,
        windows: shared.windows.map((w, k) => ({
          step_index: (group[k] as Step).index,
          y_inf: num(w.yInf.value),
          y_inf_ci95: ci(w.yInf.ci95),
          amplitudes: w.amplitudes.map((a) => num(a.value)),
          rmse: num(w.rmse),
          n: w.n,
        })),
        converged: shared.converged,
        stop_reason: shared.stopReason,
        iterations: shared.iterations,
        n: shared.n,
        dof: shared.dof,
        flags: shared.flags.map((f) => ({ code: f.code, message: f.message })),
      });
    } catch (err) {
      if (!(err instanceof InputError)) throw err;
    }
  }
  return out;
}
