/**
 * fitSharedTaus: several step-response windows (e.g. every up-step at one level) fitted together
 * with common time constants τᵢ and a common dead time, but their own level, amplitudes and drift.
 * Pooling the windows tightens the τ estimates. Each window is weighted by 1/σ of its own noise,
 * so windows of different quality count accordingly.
 */
import { studentTQuantile } from '../stats/student-t';
import { fSurvival } from '../stats/f-dist';
import { fitShape, type ShapeFit } from './engine';
import { linearPerWindow, nonlinearCount, type ModelShape, type ScaledWindow } from './exponential-model';
import { informationCriteria, INCONCLUSIVE_CI_RATIO, MIN_DOF, prepareWindow, RESOLUTION_SAMPLES, SETTLED_TAUS, type PreparedWindow } from './transient';
import type { Estimate, FitFlag, OrderCandidate, SharedTauFit, SharedTauFitOptions, TransientData } from './types';

/** Fit windows with shared τ's. Throws InputError for malformed windows (as fitTransient). */
export function fitSharedTaus(windows: TransientData[], options: SharedTauFitOptions = {}): SharedTauFit {
  const prepared = windows.map((w) => prepareWindow(w, options.noiseSigma));
  const timeScale = Math.max(...prepared.map((w) => w.timeScaleS));
  const reference = prepared[0] ? prepared[0].yScale / prepared[0].noiseSigma : 1;
  const scaled: ScaledWindow[] = prepared.map((w) => {
    const rel = w.yScale / w.noiseSigma / reference;
    return {
      t: w.tS.map((t) => t / timeScale),
      y: w.scaled.y,
      weight: Number.isFinite(rel) && rel > 0 ? rel : 1,
    };
  });
  const dtScaled = Math.min(...prepared.map((w) => w.dtS)) / timeScale;
  const robust = options.robust ?? 'none';
  const base = { deadTime: options.deadTime ?? false, drift: options.drift ?? false };
  const terms = options.terms ?? 'auto';
  const maxIterations = options.maxIterations ?? 200;
  const nTotal = scaled.reduce((s, w) => s + w.t.length, 0);

  const orders = terms === 'auto' ? [1, 2, 3] : [terms];
  const fits: ShapeFit[] = [];
  const candidates: OrderCandidate[] = [];
  for (const order of orders) {
    const shape: ModelShape = { terms: order, ...base };
    const k = nonlinearCount(shape) + linearPerWindow(shape) * scaled.length;
    if (nTotal < k + 1 || scaled.length === 0) break;
    if (terms === 'auto' && order === 3) {
      const [c1, c2] = candidates;
      if (!c1 || !c2 || !c2.acceptable || !(c2.bic < c1.bic)) break;
    }
    // Start: the mean ln τ (and t_d) of the windows fitted one by one.
    const singles = scaled
      .filter((w) => w.t.length > 2 * (nonlinearCount(shape) + linearPerWindow(shape)))
      .map((w) => fitShape([{ ...w, weight: 1 }], shape, { robust: 'none', maxIterations, dtScaled }))
      .filter((f): f is ShapeFit => f !== null && f.converged);
    const m = nonlinearCount(shape);
    const start = singles.length
      ? Array.from({ length: m }, (_, j) => singles.reduce((s, f) => s + f.x[j]!, 0) / singles.length)
      : undefined;
    const fit = fitShape(scaled, shape, { robust, maxIterations, dtScaled, startAlpha: start ? [start] : undefined });
    if (!fit) break;
    fits.push(fit);
    const { bic, aicc } = informationCriteria(fit.ssr, fit.nEffective, k);
    const lower = fits.length > 1 ? fits[fits.length - 2]! : null;
    let fTestP: number | null = null;
    if (lower) {
      const kLower = nonlinearCount(lower.shape) + linearPerWindow(lower.shape) * scaled.length;
      const dofHi = fit.nEffective - k;
      const f = (lower.ssr - fit.ssr) / (k - kLower) / (fit.ssr / dofHi);
      fTestP = Number.isFinite(f) ? (f > 0 ? fSurvival(f, k - kLower, dofHi) : 1) : null;
    }
    candidates.push({ terms: order, ssr: fit.ssr, dof: fit.nEffective - k, bic, aicc, fTestP, acceptable: fit.converged && (order === 1 || !fit.degenerate) });
  }
  if (fits.length === 0) {
    return {
      model: { terms: terms === 'auto' ? 1 : terms, ...base, robust },
      tausS: [],
      deadTimeS: null,
      windows: [],
      converged: false,
      stopReason: `not fitted: ${nTotal} points in ${scaled.length} windows are too few`,
      iterations: 0,
      n: nTotal,
      dof: 0,
      flags: [{ code: 'too-few-points', message: 'Too few points to fit the windows together.' }],
      orderSelection: null,
    };
  }
  let chosen = 0;
  if (terms === 'auto') {
    let best = Infinity;
    candidates.forEach((c, i) => {
      if (c.acceptable && c.bic < best) {
        best = c.bic;
        chosen = i;
      }
    });
  }
  const result = toSi(fits[chosen]!, prepared, timeScale, robust);
  if (terms === 'auto') result.orderSelection = { criterion: 'BIC', candidates, chosenTerms: fits[chosen]!.shape.terms };
  return result;
}

function toSi(fit: ShapeFit, prepared: PreparedWindow[], timeScale: number, robust: SharedTauFit['model']['robust']): SharedTauFit {
  const { shape, x, cov } = fit;
  const m = nonlinearCount(shape);
  const qw = linearPerWindow(shape);
  const dof = fit.nEffective - x.length;
  const tq = dof > 0 ? studentTQuantile(0.975, dof) : NaN;
  const est = (value: number, se: number): Estimate => ({ value, standardError: se, ci95: [value - tq * se, value + tq * se] });
  const tausS: Estimate[] = [];
  for (let k = 0; k < shape.terms; k++) {
    const tau = Math.exp(x[k]!) * timeScale;
    tausS.push(est(tau, tau * cov.standardErrors[k]!));
  }
  const deadTimeS = shape.deadTime ? est(x[shape.terms]! * timeScale, cov.standardErrors[shape.terms]! * timeScale) : null;
  let offset = 0;
  const windows = prepared.map((w, wi) => {
    const b = m + wi * qw;
    const sy = w.yScale;
    const n = w.tS.length;
    let ss = 0;
    for (let i = 0; i < n; i++) ss += (fit.rawResiduals[offset + i]! * sy) ** 2;
    offset += n;
    return {
      yInf: est(w.yOffset + x[b]! * sy, cov.standardErrors[b]! * sy),
      amplitudes: Array.from({ length: shape.terms }, (_, k) => est(x[b + 1 + k]! * sy, cov.standardErrors[b + 1 + k]! * sy)),
      driftPerS: shape.drift ? est((x[b + 1 + shape.terms]! * sy) / timeScale, (cov.standardErrors[b + 1 + shape.terms]! * sy) / timeScale) : null,
      n,
      rmse: Math.sqrt(ss / Math.max(1, n)),
      noiseSigma: w.noiseSigma,
    };
  });
  const flags: FitFlag[] = [];
  if (!fit.converged) flags.push({ code: 'not-converged', message: `The shared fit did not converge: ${fit.stopReason}.` });
  if (fit.atBound.slice(0, shape.terms).some(Boolean)) flags.push({ code: 'parameter-at-bound', message: 'A time constant ended on its search bound.' });
  if (fit.degenerate && shape.terms > 1) flags.push({ code: 'degenerate-taus', message: `The time constants are not distinguishable (${fit.degenerateReason}).` });
  const dtS = Math.min(...prepared.map((w) => w.dtS));
  const shortest = Math.min(...prepared.map((w) => w.timeScaleS));
  tausS.forEach((tau, k) => {
    if (tau.value < RESOLUTION_SAMPLES * dtS) flags.push({ code: 'tau-below-resolution', message: `τ${k + 1} = ${tau.value.toPrecision(3)} s is shorter than ${RESOLUTION_SAMPLES} sample intervals.` });
    if (tau.value > timeScale) flags.push({ code: 'tau-beyond-window', message: `τ${k + 1} = ${tau.value.toPrecision(3)} s is longer than the longest window.` });
  });
  const tauMax = Math.max(...tausS.map((t) => t.value));
  if (shortest < SETTLED_TAUS * tauMax) flags.push({ code: 'not-settled', message: `The shortest window covers only ${(shortest / tauMax).toFixed(1)} slowest τ (< ${SETTLED_TAUS}).` });
  if (dof < MIN_DOF) flags.push({ code: 'too-few-points', message: `Only ${dof} degrees of freedom.` });
  if (!fit.converged || tausS.some((t) => !(t.ci95[0] > 0) || !(t.ci95[1] / t.ci95[0] <= INCONCLUSIVE_CI_RATIO))) {
    flags.push({ code: 'inconclusive', message: 'The data cannot pin down the common time constants.' });
  }
  return {
    model: { terms: shape.terms, deadTime: shape.deadTime, drift: shape.drift, robust },
    tausS,
    deadTimeS,
    windows,
    converged: fit.converged,
    stopReason: fit.stopReason,
    iterations: fit.iterations,
    n: fit.rawResiduals.length,
    dof,
    flags,
    orderSelection: null,
  };
}
