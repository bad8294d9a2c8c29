/** Mapping of core results (camelCase, may hold NaN) to the analysis JSON (snake_case, null for non-finite). */
import type { Warning } from '../errors';
import type { Estimate, TransientFit } from '../fit/types';
import type { Ci95, FitJson, TermJson, WarningJson } from './types';

/** The number, or null when it is NaN or infinite (JSON has no NaN). */
export function num(x: number | null | undefined): number | null {
  return typeof x === 'number' && Number.isFinite(x) ? x : null;
}

export function ci(interval: readonly [number, number] | null | undefined): Ci95 {
  return interval ? [num(interval[0]), num(interval[1])] : [null, null];
}

export function warningJson(w: Warning): WarningJson {
  return { code: w.code, message: w.message, ...(w.count !== undefined ? { count: w.count } : {}) };
}

export function termJson(term: { tauS: Estimate; amplitude: Estimate }): TermJson {
  return {
    tau_s: num(term.tauS.value),
    tau_se_s: num(term.tauS.standardError),
    tau_ci95_s: ci(term.tauS.ci95),
    amplitude: num(term.amplitude.value),
    amplitude_se: num(term.amplitude.standardError),
    amplitude_ci95: ci(term.amplitude.ci95),
  };
}

export function fitJson(fit: TransientFit, samplesPerPoint: number): FitJson {
  return {
    model: { terms: fit.model.terms, dead_time: fit.model.deadTime, drift: fit.model.drift, robust: fit.model.robust },
    rmse: num(fit.rmse),
    r2: num(fit.r2),
    converged: fit.converged,
    stop_reason: fit.stopReason,
    iterations: fit.iterations,
    n: fit.n,
    dof: fit.dof,
    noise_sigma: num(fit.noiseSigma),
    residual_lag1: num(fit.residualLag1),
    runs_z: num(fit.runsZ),
    flags: fit.flags.map((f) => ({ code: f.code, message: f.message })),
    order_selection: fit.orderSelection
      ? {
          criterion: fit.orderSelection.criterion,
          chosen_terms: fit.orderSelection.chosenTerms,
          screened_out: fit.orderSelection.screenedOut ?? null,
          candidates: fit.orderSelection.candidates.map((c) => ({
            terms: c.terms,
            ssr: num(c.ssr),
            dof: c.dof,
            bic: num(c.bic),
            aicc: num(c.aicc),
            f_test_p: num(c.fTestP),
            acceptable: c.acceptable,
          })),
        }
      : null,
    parameter_names: [...fit.parameterNames],
    correlation: fit.correlation.map((row) => row.map((v) => num(v))),
    samples_per_point: samplesPerPoint,
  };
}
