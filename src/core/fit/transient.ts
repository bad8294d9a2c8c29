/**
 * fitTransient: fits y(t) = y∞ + Σᵢ aᵢ·exp(−(t − t_d)/τᵢ) (+ b·t) to one step-response window
 * (contract in ./types.ts). Guess-free start by a grid search with closed-form linear parameters,
 * refinement by variable projection + joint Levenberg–Marquardt (./separable.ts), covariance from
 * the SVD of the scaled Jacobian, model order by BIC with AICc and the F-test shown, and flags for
 * everything the data cannot support. Works in scaled units (t / window length, y / step size) and
 * converts back to SI with the standard errors transformed accordingly.
 */
import { InputError } from '../errors';
import { fSurvival } from '../stats/f-dist';
import { median, medianInPlace, noiseSigmaFromDifferences } from '../stats/robust';
import { studentTQuantile } from '../stats/student-t';
import { lag1Autocorrelation, runsTestZ, settlingTime } from './diagnostics';
import { fitShape, MAX_DEAD_TIME, type ShapeFit } from './engine';
import type { ModelShape, ScaledWindow } from './exponential-model';
import { SCREEN_GAIN_FRACTION, screenSecondTerm } from './order-screen';
import type { Estimate, FitFlag, OrderCandidate, TransientData, TransientFit, TransientFitOptions } from './types';

/** z beyond which the runs test or lag-1 autocorrelation counts as significant (two-sided p < 0.001). */
export const RESIDUAL_STRUCTURE_Z = 3.29;
/** τ shorter than this many sample intervals is below the time resolution (common practice, no source). */
export const RESOLUTION_SAMPLES = 3;
/** A window shorter than this many slowest τ has not settled (physics.md §4.1: 99.3 % at 5τ). */
export const SETTLED_TAUS = 5;
/** A τ whose 95 % interval spans more than this factor is inconclusive (common practice, no source). */
export const INCONCLUSIVE_CI_RATIO = 10;
/** Fewer degrees of freedom than this are flagged as too few points (common practice, no source). */
export const MIN_DOF = 10;

/** Cleaned window in SI plus its scales. */
export interface PreparedWindow {
  tS: Float64Array;
  y: Float64Array;
  /** Time scale (window length from the onset), s. */
  timeScaleS: number;
  /** Offset and scale of y: y_scaled = (y − offset)/scale. */
  yOffset: number;
  yScale: number;
  /** Median sample interval, s. */
  dtS: number;
  noiseSigma: number;
  scaled: ScaledWindow;
}

/** Drops non-finite samples, checks time order, and computes the scales. */
export function prepareWindow(data: TransientData, noiseSigma?: number): PreparedWindow {
  if (data.tS.length !== data.y.length) {
    throw new InputError('length-mismatch', `time and response have different lengths (${data.tS.length} and ${data.y.length})`, 'pass one response value per time stamp');
  }
  let n = 0;
  for (let i = 0; i < data.tS.length; i++) if (Number.isFinite(data.tS[i]!) && Number.isFinite(data.y[i]!)) n++;
  const tS = new Float64Array(n);
  const y = new Float64Array(n);
  let k = 0;
  for (let i = 0; i < data.tS.length; i++) {
    if (Number.isFinite(data.tS[i]!) && Number.isFinite(data.y[i]!)) {
      tS[k] = data.tS[i]!;
      y[k] = data.y[i]!;
      k++;
    }
  }
  for (let i = 1; i < n; i++) {
    if (!(tS[i]! > tS[i - 1]!)) {
      throw new InputError('time-not-increasing', `time stamps must increase (sample ${i + 1} at ${tS[i]} s follows ${tS[i - 1]} s)`, 'sort the window by time and remove duplicate time stamps');
    }
  }
  if (n > 1 && tS[0]! > 100 * (tS[n - 1]! - tS[0]!)) {
    throw new InputError(
      'time-not-relative',
      `the window's time stamps start at ${tS[0]} s, far beyond its ${tS[n - 1]! - tS[0]!} s length: they look absolute, not relative to the step onset`,
      'pass seconds since the step onset (t − t₀)',
    );
  }
  const diffs = new Float64Array(Math.max(0, n - 1));
  for (let i = 1; i < n; i++) diffs[i - 1] = tS[i]! - tS[i - 1]!;
  // The differences are finite (time stamps finite and increasing): select in place, no filtered copy.
  const dtS = n > 1 ? medianInPlace(diffs, n - 1) : NaN;
  const last = n > 0 ? tS[n - 1]! : 0;
  const timeScaleS = last > 0 ? last : n > 1 ? last - tS[0]! : 1;
  const sigma = noiseSigma ?? (n > 2 ? noiseSigmaFromDifferences(y) : NaN);
  // y scale: spread of 64 block means (robust to spikes), else σ, else 1.
  let yOffset = 0;
  let yScale = 1;
  if (n > 0) {
    const blocks = Math.min(64, n);
    const scratch = new Float64Array(Math.ceil(n / blocks) + 1);
    let lo = Infinity;
    let hi = -Infinity;
    for (let b = 0; b < blocks; b++) {
      const i0 = Math.floor((b * n) / blocks);
      const i1 = Math.floor(((b + 1) * n) / blocks);
      for (let i = i0; i < i1; i++) scratch[i - i0] = y[i]!;
      const m = medianInPlace(scratch, i1 - i0);
      lo = Math.min(lo, m);
      hi = Math.max(hi, m);
    }
    yOffset = median(y.subarray(0, Math.min(n, 5)));
    yScale = hi - lo > 0 ? hi - lo : sigma > 0 ? sigma : Math.abs(yOffset) > 0 ? Math.abs(yOffset) : 1;
  }
  const ts = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    ts[i] = tS[i]! / timeScaleS;
    ys[i] = (y[i]! - yOffset) / yScale;
  }
  return { tS, y, timeScaleS, yOffset, yScale, dtS, noiseSigma: sigma, scaled: { t: ts, y: ys, weight: 1 } };
}

function estimate(value: number, se: number, tQuantile: number): Estimate {
  return { value, standardError: se, ci95: [value - tQuantile * se, value + tQuantile * se] };
}

function parameterCount(shape: ModelShape): number {
  return 2 * shape.terms + 1 + (shape.deadTime ? 1 : 0) + (shape.drift ? 1 : 0);
}

/** BIC = n·ln(SSR/n) + k·ln n (Schwarz 1978), AICc = n·ln(SSR/n) + 2k + 2k(k+1)/(n − k − 1) (Hurvich & Tsai 1989). */
export function informationCriteria(ssr: number, n: number, k: number): { bic: number; aicc: number } {
  const base = n * Math.log(ssr / n);
  return { bic: base + k * Math.log(n), aicc: base + 2 * k + (n - k - 1 > 0 ? (2 * k * (k + 1)) / (n - k - 1) : Infinity) };
}

/**
 * Fit a transient. Throws InputError on malformed input (mismatched lengths, unsorted time);
 * everything else (too few points, no convergence, unsupported estimates) is reported in the
 * result's flags.
 */
export function fitTransient(data: TransientData, options: TransientFitOptions = {}): TransientFit {
  const prepared = prepareWindow(data, options.noiseSigma);
  const terms = options.terms ?? 'auto';
  const base = { deadTime: options.deadTime ?? false, drift: options.drift ?? false };
  const robust = options.robust ?? 'none';
  const engineOpts = { robust, maxIterations: options.maxIterations ?? 200, dtScaled: prepared.dtS / prepared.timeScaleS };
  const n = prepared.tS.length;

  const orders = terms === 'auto' ? [1, 2, 3] : [terms];
  const fits: ShapeFit[] = [];
  const candidates: OrderCandidate[] = [];
  const dropped: { terms: number; bic: number; message: string }[] = [];
  let screenedOut: string | undefined;
  for (const order of orders) {
    const shape: ModelShape = { terms: order, ...base };
    if (n < parameterCount(shape) + 1 || !(n > 2)) break;
    if (terms === 'auto' && order === 3) {
      // Try three terms only when two were usable and better than one by BIC.
      const [c1, c2] = candidates;
      if (!c1 || !c2 || !c2.acceptable || !(c2.bic < c1.bic)) break;
    }
    const fit = fitShape([prepared.scaled], shape, engineOpts);
    if (!fit) break;
    fits.push(fit);
    const k = parameterCount(shape);
    const { bic, aicc } = informationCriteria(fit.ssr, fit.nEffective, k);
    const lower = fits.length > 1 ? fits[fits.length - 2]! : null;
    let fTestP: number | null = null;
    if (lower) {
      const kLower = parameterCount(lower.shape);
      const dofHi = fit.nEffective - k;
      const f = (lower.ssr - fit.ssr) / (k - kLower) / (fit.ssr / dofHi);
      fTestP = Number.isFinite(f) ? (f > 0 ? fSurvival(f, k - kLower, dofHi) : 1) : null;
    }
    const acceptable = fit.converged && (order === 1 || !fit.degenerate);
    if (order > 1 && fit.degenerate && fit.converged) dropped.push({ terms: order, bic, message: `The ${order}-term fit was rejected: its time constants are not distinguishable (${fit.degenerateReason}).` });
    candidates.push({ terms: order, ssr: fit.ssr * prepared.yScale ** 2, dof: fit.nEffective - k, bic, aicc, fTestP, acceptable });
    if (terms === 'auto' && order === 1 && options.orderScreen !== false) {
      screenedOut = screenHigherOrders(prepared, fit, robust, engineOpts.dtScaled);
      if (screenedOut) {
        candidates.push({ terms: 2, ssr: NaN, dof: fit.nEffective - parameterCount({ terms: 2, ...base }), bic: NaN, aicc: NaN, fTestP: null, acceptable: false });
        break;
      }
    }
  }

  if (fits.length === 0) {
    const order = terms === 'auto' ? 1 : terms;
    const k = parameterCount({ terms: order, ...base });
    const reason = n < k + 1 ? `${n} points for ${k} parameters` : 'no usable starting values (the window may hold no exponential change)';
    return unfitted(prepared, order, base, robust, reason);
  }
  let chosenIndex = 0;
  if (terms === 'auto') {
    let bestBic = Infinity;
    candidates.forEach((c, i) => {
      if (c.acceptable && c.bic < bestBic) {
        bestBic = c.bic;
        chosenIndex = i;
      }
    });
  }
  const chosen = fits[chosenIndex]!;
  const result = buildResult(prepared, chosen, robust);
  if (terms === 'auto') {
    result.orderSelection = { criterion: 'BIC', candidates, chosenTerms: chosen.shape.terms, ...(screenedOut ? { screenedOut } : {}) };
    // Flag a rejected order only when BIC would have preferred it: the data ask for more terms than they can resolve.
    const chosenBic = candidates[chosenIndex]!.bic;
    for (const d of dropped) if (d.bic < chosenBic) result.flags.push({ code: 'degenerate-taus', message: d.message });
  } else if (chosen.degenerate && chosen.shape.terms > 1) {
    result.flags.push({ code: 'degenerate-taus', message: `The ${chosen.shape.terms} time constants are not distinguishable (${chosen.degenerateReason}); fit fewer terms.` });
  }
  return result;
}

/**
 * Why the automatic order choice need not fit 2 (or 3) terms after `fit1`, or undefined when it must:
 * only for a plain least-squares fit that converged, whose residuals show no structure (runs test and
 * lag-1 autocorrelation within ±{@link RESIDUAL_STRUCTURE_Z}) and where no second term could gain even
 * half the SSR reduction a BIC win needs (linearised, order-screen.ts). Such windows chose 1 term anyway;
 * the screen only saves the 2-term fit, which on single-exponential data is ill-posed and slow.
 */
function screenHigherOrders(w: PreparedWindow, fit1: ShapeFit, robust: TransientFit['model']['robust'], dtScaled: number): string | undefined {
  if (robust !== 'none' || !fit1.converged) return undefined;
  const n = fit1.rawResiduals.length;
  const runsZ = runsTestZ(fit1.rawResiduals);
  const lagZ = lag1Autocorrelation(fit1.rawResiduals) * Math.sqrt(n);
  if (!(Math.abs(runsZ) <= RESIDUAL_STRUCTURE_Z) || !(Math.abs(lagZ) <= RESIDUAL_STRUCTURE_Z)) return undefined;
  // τ₂ over the engine's search bounds (Δt/10 … 100 windows, engine.ts).
  const screen = screenSecondTerm(w.scaled, fit1.shape, fit1.x, fit1.rawResiduals, fit1.ssr, Math.max(dtScaled / 10, 1e-9), 100);
  if (!(screen.maxGain < SCREEN_GAIN_FRACTION * screen.requiredGain)) return undefined;
  return `2 terms not fitted: the 1-term residuals are random (runs z = ${runsZ.toFixed(1)}, lag-1 z = ${lagZ.toFixed(1)}) and a second term could lower the SSR by at most ${((100 * screen.maxGain) / fit1.ssr).toFixed(2)} % (linearised), below the ${((100 * screen.requiredGain) / fit1.ssr).toFixed(2)} % a BIC win needs`;
}

/** SI result from a scaled shape fit (single window). */
function buildResult(w: PreparedWindow, fit: ShapeFit, robust: TransientFit['model']['robust']): TransientFit {
  const { shape, x, cov } = fit;
  const T = w.timeScaleS;
  const sy = w.yScale;
  const m = shape.terms + (shape.deadTime ? 1 : 0);
  const dof = fit.nEffective - x.length;
  // Named parameters: internal index, SI value, SI factor for the standard error.
  const names: string[] = [];
  const idx: number[] = [];
  const factor: number[] = [];
  const values: number[] = [];
  const add = (name: string, i: number, value: number, f: number): void => {
    names.push(name);
    idx.push(i);
    values.push(value);
    factor.push(f);
  };
  add('yInf', m, w.yOffset + x[m]! * sy, sy);
  for (let k = 0; k < shape.terms; k++) {
    const tau = Math.exp(x[k]!) * T;
    add(`a${k + 1}`, m + 1 + k, x[m + 1 + k]! * sy, sy);
    add(`tau${k + 1}_s`, k, tau, tau); // d τ / d ln τ_scaled = τ (SI)
  }
  if (shape.deadTime) add('t_d_s', shape.terms, x[shape.terms]! * T, T);
  if (shape.drift) add('drift_per_s', m + 1 + shape.terms, (x[m + 1 + shape.terms]! * sy) / T, sy / T);
  const p = x.length;
  const se = idx.map((i, j) => cov.standardErrors[i]! * factor[j]!);
  const tq = dof > 0 ? studentTQuantile(0.975, dof) : NaN;
  const est = (j: number): Estimate => estimate(values[j]!, se[j]!, tq);
  const correlation = idx.map((i) => idx.map((j) => cov.correlation[i * p + j]!));

  const termsOut = [];
  for (let k = 0; k < shape.terms; k++) termsOut.push({ amplitude: est(1 + 2 * k), tauS: est(2 + 2 * k) });
  const deadTimeS = shape.deadTime ? est(names.indexOf('t_d_s')) : null;
  const driftPerS = shape.drift ? est(names.indexOf('drift_per_s')) : null;

  // Unweighted residual statistics in SI.
  const n = w.tS.length;
  const r = new Float64Array(n);
  let ssr = 0;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += w.y[i]!;
  mean /= n;
  let sst = 0;
  for (let i = 0; i < n; i++) {
    r[i] = fit.rawResiduals[i]! * sy;
    ssr += r[i]! * r[i]!;
    sst += (w.y[i]! - mean) ** 2;
  }
  const used = robust === 'none' ? r : r.filter((_, i) => fit.robustWeights[i]! > 0.5);
  const residualLag1 = lag1Autocorrelation(used);
  const runsZ = runsTestZ(used);
  const taus = termsOut.map((t) => t.tauS.value);
  const amps = termsOut.map((t) => t.amplitude.value);
  const tauMax = Math.max(...taus);
  const windowInTaus = T / tauMax;
  const td = deadTimeS ? deadTimeS.value : 0;

  const result: TransientFit = {
    model: { terms: shape.terms, deadTime: shape.deadTime, drift: shape.drift, robust },
    yInf: est(0),
    terms: termsOut,
    deadTimeS,
    driftPerS,
    parameterNames: names,
    correlation,
    converged: fit.converged,
    stopReason: fit.stopReason,
    iterations: fit.iterations,
    n,
    dof,
    rmse: Math.sqrt(ssr / n),
    r2: sst > 0 ? 1 - ssr / sst : NaN,
    noiseSigma: w.noiseSigma,
    residualLag1,
    runsZ,
    windowInTaus,
    settled: windowInTaus >= SETTLED_TAUS,
    t63S: settlingTime(amps, taus, td, 1 - Math.exp(-1)),
    t95S: settlingTime(amps, taus, td, 0.95),
    t99S: settlingTime(amps, taus, td, 0.99),
    flags: [],
    orderSelection: null,
  };
  result.flags = flagsFor(result, fit, w);
  return result;
}

function flagsFor(fit: TransientFit, shapeFit: ShapeFit, w: PreparedWindow): FitFlag[] {
  const flags: FitFlag[] = [];
  const T = w.timeScaleS;
  if (!fit.converged) flags.push({ code: 'not-converged', message: `The fit did not converge: ${fit.stopReason}.` });
  for (let k = 0; k < shapeFit.shape.terms; k++) {
    if (shapeFit.atBound[k]) flags.push({ code: 'parameter-at-bound', message: `τ${k + 1} ended on its search bound (${fit.terms[k]!.tauS.value.toPrecision(3)} s); the data do not constrain it.` });
  }
  if (shapeFit.shape.deadTime && (fit.deadTimeS?.value ?? 0) >= MAX_DEAD_TIME * T * (1 - 1e-9)) {
    flags.push({ code: 'parameter-at-bound', message: `The dead time ended on its upper bound (${MAX_DEAD_TIME} × window).` });
  }
  fit.terms.forEach((term, k) => {
    const tau = term.tauS;
    if (tau.value < RESOLUTION_SAMPLES * w.dtS) {
      flags.push({ code: 'tau-below-resolution', message: `τ${k + 1} = ${tau.value.toPrecision(3)} s is shorter than ${RESOLUTION_SAMPLES} sample intervals (${(RESOLUTION_SAMPLES * w.dtS).toPrecision(3)} s).` });
    }
    if (tau.value > T) {
      flags.push({ code: 'tau-beyond-window', message: `τ${k + 1} = ${tau.value.toPrecision(3)} s is longer than the window (${T.toPrecision(3)} s).` });
    }
  });
  if (!fit.settled) {
    flags.push({ code: 'not-settled', message: `The window covers only ${fit.windowInTaus.toFixed(1)} slowest τ (< ${SETTLED_TAUS}): the final level is extrapolated.` });
  }
  const lagZ = fit.residualLag1 * Math.sqrt(fit.n);
  if (Math.abs(fit.runsZ) > RESIDUAL_STRUCTURE_Z || Math.abs(lagZ) > RESIDUAL_STRUCTURE_Z) {
    flags.push({
      code: 'residual-structure',
      message: `The residuals are not random (runs test z = ${fit.runsZ.toFixed(1)}, lag-1 autocorrelation ${fit.residualLag1.toFixed(2)}): unmodelled dynamics or correlated noise; uncertainties may be too small.`,
    });
  }
  if (fit.dof < MIN_DOF) flags.push({ code: 'too-few-points', message: `Only ${fit.n} points for ${fit.n - fit.dof} parameters (${fit.dof} degrees of freedom).` });
  const weak = fit.terms.some((t) => {
    const [lo, hi] = t.tauS.ci95;
    return !(lo > 0) || !(hi / lo <= INCONCLUSIVE_CI_RATIO);
  });
  if (weak || !fit.converged) {
    flags.push({ code: 'inconclusive', message: `The data cannot pin down the time constant${fit.terms.length > 1 ? 's' : ''}: a 95 % interval includes 0 or spans more than a factor ${INCONCLUSIVE_CI_RATIO}, or the fit did not converge.` });
  }
  return flags;
}

/** Result for a window that cannot be fitted at all (fewer points than parameters + 1). */
function unfitted(w: PreparedWindow, terms: number, base: { deadTime: boolean; drift: boolean }, robust: TransientFit['model']['robust'], reason: string): TransientFit {
  const none: Estimate = { value: NaN, standardError: NaN, ci95: [NaN, NaN] };
  const shape = { terms, ...base };
  return {
    model: { terms, deadTime: base.deadTime, drift: base.drift, robust },
    yInf: none,
    terms: Array.from({ length: terms }, () => ({ tauS: none, amplitude: none })),
    deadTimeS: base.deadTime ? none : null,
    driftPerS: base.drift ? none : null,
    parameterNames: [],
    correlation: [],
    converged: false,
    stopReason: `not fitted: ${reason}`,
    iterations: 0,
    n: w.tS.length,
    dof: w.tS.length - parameterCount(shape),
    rmse: NaN,
    r2: NaN,
    noiseSigma: w.noiseSigma,
    residualLag1: NaN,
    runsZ: NaN,
    windowInTaus: NaN,
    settled: false,
    t63S: NaN,
    t95S: NaN,
    t99S: NaN,
    flags: [
      ...(w.tS.length < parameterCount(shape) + 1
        ? [{ code: 'too-few-points' as const, message: `Only ${w.tS.length} usable points; at least ${parameterCount(shape) + 1} are needed for a ${terms}-term fit.` }]
        : []),
      { code: 'not-converged', message: `No fit: ${reason}.` },
      { code: 'inconclusive', message: 'No estimate can be made from this window.' },
    ],
    orderSelection: null,
  };
}

/**
 * The fitted curve at the given times (s since the step onset), in the response's SI unit:
 * y∞ + Σ aᵢ·exp(−(t − t_d)₊/τᵢ) + b·t. Use it to plot the fit.
 */
export function evaluateTransient(fit: TransientFit, tS: Float64Array): Float64Array {
  const out = new Float64Array(tS.length);
  const td = fit.deadTimeS?.value ?? 0;
  const b = fit.driftPerS?.value ?? 0;
  for (let i = 0; i < tS.length; i++) {
    const t = tS[i]!;
    const s = Math.max(t - td, 0);
    let v = fit.yInf.value + b * t;
    for (const term of fit.terms) v += term.amplitude.value * Math.exp(-s / term.tauS.value);
    out[i] = v;
  }
  return out;
}
