/**
 * Internal engine of the transient fitter: fits one model shape (number of terms, dead time,
 * drift) to one or more scaled windows with shared time constants, with robust reweighting,
 * and returns the scaled estimates with their covariance. Conversion to SI and the report live
 * in transient.ts / shared-taus.ts.
 */
import { covarianceFromJacobian, type CovarianceResult } from './covariance';
import { exponentialProblem, linearPerWindow, nonlinearCount, type ModelShape, type ScaledWindow } from './exponential-model';
import { robustWeights } from './robust-weights';
import { solveSeparable, type SeparableResult } from './separable';
import { bestDeadTime, bestGridCombinations, decimate, logTauGrid } from './start-grid';
import type { RobustLoss } from './types';

/** Ratio of adjacent τ below which two terms are considered the same (degenerate). */
export const DEGENERATE_TAU_RATIO = 1.5;
/** Largest scaled dead time allowed (fraction of the window). */
export const MAX_DEAD_TIME = 0.5;

export interface ShapeFit {
  shape: ModelShape;
  /** x = [ln τ₁…ln τₙ (ascending), t_d?, then per window y∞, a₁…aₙ, b?], scaled units. */
  x: Float64Array;
  cov: CovarianceResult;
  /** Weighted SSR (row weights × robust weights), scaled units. */
  ssr: number;
  /** Unweighted model − data residuals, scaled units, all rows. */
  rawResiduals: Float64Array;
  /** Final robust weights (1 without a robust loss). */
  robustWeights: Float64Array;
  /** Points with non-zero weight. */
  nEffective: number;
  converged: boolean;
  stopReason: string;
  iterations: number;
  atBound: boolean[];
  /** Adjacent τ's too close (ratio < 1.5 or overlapping 95 % CIs) or a rank-deficient Jacobian. */
  degenerate: boolean;
  degenerateReason: string;
}

export interface EngineOptions {
  robust: RobustLoss;
  maxIterations: number;
  /** Sample interval (scaled), for the τ grid and bounds. */
  dtScaled: number;
  /** Start values for ln τ (and t_d), e.g. from single-window fits; default: grid search. */
  startAlpha?: number[][];
}

/** Candidate starts for the nonlinear parameters of a single window, from the grid search. */
export function gridStarts(win: ScaledWindow, shape: ModelShape, dtScaled: number, keep: number): number[][] {
  const dec = decimate(win.t, win.y, shape.terms === 1 ? 128 : 256);
  const grid = logTauGrid(Math.max(2 * dtScaled, 1e-6), 3);
  const td = shape.deadTime ? bestDeadTime(dec.t, dec.y, grid, shape.drift, 0.4) : 0;
  const combos = bestGridCombinations(dec.t, dec.y, grid, shape.terms, shape.drift, td, keep);
  return combos.map((c) => (shape.deadTime ? [...c.logTaus, td] : [...c.logTaus]));
}

/** Fit one shape to scaled windows sharing τ (and t_d); returns null when there are too few points. */
export function fitShape(windows: ScaledWindow[], shape: ModelShape, opts: EngineOptions): ShapeFit | null {
  const m = nonlinearCount(shape);
  const qw = linearPerWindow(shape);
  const p = m + qw * windows.length;
  let n = 0;
  for (const w of windows) n += w.t.length;
  if (n < p + 1) return null;
  const lower = new Float64Array(m);
  const upper = new Float64Array(m);
  for (let k = 0; k < shape.terms; k++) {
    lower[k] = Math.log(Math.max(opts.dtScaled / 10, 1e-9));
    upper[k] = Math.log(100);
  }
  if (shape.deadTime) {
    lower[shape.terms] = 0;
    upper[shape.terms] = MAX_DEAD_TIME;
  }
  const starts = opts.startAlpha ?? gridStarts(windows[0]!, shape, opts.dtScaled, shape.terms === 1 ? 1 : 2);
  if (starts.length === 0) return null;
  // Noisy data: a gradient cosine of 1e-9 puts x within ~1e-7 standard errors of the optimum (n ≤ 1e6).
  const solverOpts = { maxIterations: opts.maxIterations, gradientTolerance: 1e-9, refineJointly: false };

  const plain = exponentialProblem(windows, shape, { lower, upper });
  let best: SeparableResult | null = null;
  for (const s0 of starts) {
    const clamped = s0.map((v, k) => Math.min(Math.max(v, lower[k]!), upper[k]!));
    const res = solveSeparable(plain, clamped, solverOpts);
    if (!Number.isFinite(res.ssr)) continue;
    if (!best || (res.converged && !best.converged) || (res.converged === best.converged && res.ssr < best.ssr)) best = res;
  }
  if (!best) return null;

  // Robust loss: iteratively reweighted least squares from the ordinary fit.
  const weights = new Float64Array(n).fill(1);
  const raw = new Float64Array(n);
  const rowW = plain.rowWeights!;
  let phi: Float64Array | null = null;
  /** Unweighted residuals model − data of a solution (scaled units). */
  const computeRaw = (res: SeparableResult): void => {
    phi ??= new Float64Array(n * plain.nLinear);
    plain.basis(res.alpha, phi);
    raw.fill(0);
    for (let j = 0; j < plain.nLinear; j++) {
      const c = res.linear[j]!;
      if (c === 0) continue;
      for (let i = 0; i < n; i++) raw[i] = raw[i]! + phi[j * n + i]! * c;
    }
    for (let i = 0; i < n; i++) raw[i] = raw[i]! - plain.y[i]!;
  };
  // With unit row weights the solver's residuals W(Φc − y) are these, computed in the same order.
  if (rowW.every((v) => v === 1)) raw.set(best.residuals);
  else computeRaw(best);
  let iterations = best.iterations + best.projectedStage.iterations;
  let stopReason = best.stopReason;
  if (opts.robust !== 'none') {
    let converged = false;
    for (let it = 0; it < 30; it++) {
      // Residuals in units of each window's σ, so one scale serves all windows.
      const scaled = new Float64Array(n);
      for (let i = 0; i < n; i++) scaled[i] = raw[i]! * rowW[i]!;
      robustWeights(opts.robust, scaled, weights);
      const sqrtW = weights.map(Math.sqrt);
      const res = solveSeparable(exponentialProblem(windows, shape, { lower, upper }, sqrtW), best.alpha, solverOpts);
      iterations += res.iterations + res.projectedStage.iterations;
      let change = 0;
      for (let k = 0; k < res.x.length; k++) change = Math.max(change, Math.abs(res.x[k]! - best.x[k]!) / (Math.abs(best.x[k]!) + 1e-3));
      best = res;
      computeRaw(best);
      if (change < 1e-6) {
        converged = true;
        break;
      }
    }
    stopReason = `${stopReason}; robust ${opts.robust} reweighting ${converged ? 'converged' : 'stopped after 30 passes without settling'}`;
    if (!converged) best = { ...best, converged: false };
  }
  let nEffective = 0;
  for (let i = 0; i < n; i++) if (weights[i]! > 0) nEffective++;
  const dof = nEffective - p;
  const cov = covarianceFromJacobian(best.jacobian, n, p, best.ssr, dof > 0 ? best.ssr / dof : NaN);
  cov.dof = dof;

  // Sort τ ascending (the permutation applies to ln τ, amplitudes and the covariance).
  const order = Array.from({ length: shape.terms }, (_, k) => k).sort((a, b) => best!.x[a]! - best!.x[b]!);
  const perm: number[] = [];
  for (let k = 0; k < shape.terms; k++) perm.push(order[k]!);
  for (let k = shape.terms; k < m; k++) perm.push(k);
  for (let w = 0; w < windows.length; w++) {
    const base = m + w * qw;
    perm.push(base);
    for (let k = 0; k < shape.terms; k++) perm.push(base + 1 + order[k]!);
    for (let k = 1 + shape.terms; k < qw; k++) perm.push(base + k);
  }
  const x = Float64Array.from(perm, (i) => best!.x[i]!);
  const permuteMatrix = (a: Float64Array): Float64Array => {
    const out = new Float64Array(p * p);
    for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) out[i * p + j] = a[perm[i]! * p + perm[j]!]!;
    return out;
  };
  const sortedCov: CovarianceResult = {
    ...cov,
    covariance: permuteMatrix(cov.covariance),
    correlation: permuteMatrix(cov.correlation),
    standardErrors: Float64Array.from(perm, (i) => cov.standardErrors[i]!),
  };
  const atBound = perm.map((i) => best!.atBound[i] ?? false);

  let degenerate = false;
  let degenerateReason = '';
  for (let k = 0; k + 1 < shape.terms; k++) {
    const ratio = Math.exp(x[k + 1]! - x[k]!);
    const hiK = x[k]! + 1.96 * sortedCov.standardErrors[k]!;
    const loK1 = x[k + 1]! - 1.96 * sortedCov.standardErrors[k + 1]!;
    if (ratio < DEGENERATE_TAU_RATIO) {
      degenerate = true;
      degenerateReason = `τ${k + 2}/τ${k + 1} = ${ratio.toFixed(2)} < ${DEGENERATE_TAU_RATIO}`;
    } else if (!(hiK < loK1)) {
      degenerate = true;
      degenerateReason = `the 95 % intervals of τ${k + 1} and τ${k + 2} overlap`;
    }
  }
  if (!degenerate && shape.terms > 1) {
    // A term the data do not support (τ or amplitude interval includes 0) is a spurious extra term.
    for (let w = 0; w < windows.length && !degenerate; w++) {
      for (let k = 0; k < shape.terms; k++) {
        const seLog = sortedCov.standardErrors[k]!;
        const ai = m + w * qw + 1 + k;
        const amp = x[ai]!;
        const seAmp = sortedCov.standardErrors[ai]!;
        if (!(seLog < 1 / 1.96) || !(Math.abs(amp) > 1.96 * seAmp)) {
          degenerate = true;
          degenerateReason = `term ${k + 1} is not supported by the data (its τ or amplitude interval includes 0)`;
          break;
        }
      }
    }
  }
  if (!degenerate && shape.terms > 1 && cov.rank < p) {
    degenerate = true;
    degenerateReason = `the Jacobian has rank ${cov.rank} < ${p} parameters`;
  }
  return {
    shape,
    x,
    cov: sortedCov,
    ssr: best.ssr,
    rawResiduals: raw,
    robustWeights: weights,
    nEffective,
    converged: best.converged,
    stopReason,
    iterations,
    atBound,
    degenerate,
    degenerateReason,
  };
}
