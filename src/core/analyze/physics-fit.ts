/**
 * Rebuilds the TransientFit the physics stage needs (values, SEs, correlation, dof, flags)
 * from a step of the analysis JSON, so the physics stage can run on the JSON alone — after
 * `analyzeRecording`, in the CLI, the app or on a saved result — without reaching into the
 * pipeline's internals. Fields the physics does not read are filled neutrally.
 */
import type { Estimate, FitFlagCode, TransientFit } from '../fit/types';
import type { Ci95, StepJson } from './types';

const NAN_CI: [number, number] = [Number.NaN, Number.NaN];
const val = (x: number | null | undefined): number => (typeof x === 'number' ? x : Number.NaN);
const interval = (c: Ci95 | null | undefined): [number, number] => (c ? [val(c[0]), val(c[1])] : NAN_CI);

function estimate(value: number | null, se: number | null, ci95: Ci95 | null): Estimate {
  return { value: val(value), standardError: val(se), ci95: interval(ci95) };
}

/** The step's fit as a TransientFit, or null when the step was not fitted. */
export function stepFitFromJson(step: StepJson): TransientFit | null {
  const f = step.fit;
  if (!f) return null;
  return {
    model: { terms: f.model.terms, deadTime: f.model.dead_time, drift: f.model.drift, robust: f.model.robust },
    yInf: estimate(step.y_inf, step.y_inf_se, step.y_inf_ci95),
    terms: step.terms.map((t) => ({
      tauS: estimate(t.tau_s, t.tau_se_s, t.tau_ci95_s),
      amplitude: estimate(t.amplitude, t.amplitude_se, t.amplitude_ci95),
    })),
    deadTimeS: step.dead_time_s === null ? null : estimate(step.dead_time_s, step.dead_time_se_s, step.dead_time_ci95_s),
    driftPerS: step.drift_per_s === null ? null : { value: step.drift_per_s, standardError: Number.NaN, ci95: interval(step.drift_ci95_per_s) },
    parameterNames: [...f.parameter_names],
    correlation: f.correlation.map((row) => row.map((v) => (v === null ? 0 : v))),
    converged: f.converged,
    stopReason: f.stop_reason,
    iterations: f.iterations,
    n: f.n,
    dof: f.dof,
    rmse: val(f.rmse),
    r2: val(f.r2),
    noiseSigma: val(f.noise_sigma),
    residualLag1: val(f.residual_lag1),
    runsZ: val(f.runs_z),
    windowInTaus: val(step.window_in_taus),
    settled: step.settled ?? false,
    t63S: val(step.t63_s),
    t95S: val(step.t95_s),
    t99S: val(step.t99_s),
    flags: f.flags.map((x) => ({ code: x.code as FitFlagCode, message: x.message })),
    orderSelection: null,
  };
}
