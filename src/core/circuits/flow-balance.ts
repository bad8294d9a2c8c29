/**
 * Compliance from the dynamic volume balance of the compliant node, a cross-check that needs
 * no exponential fit: Q_in − Q_out = C·dp/dt (physics.md §3.1, C = dV/dp; §4.2). Integrated
 * over the step window (trapezoidal rule) it becomes linear in p:
 *
 *   V(t) = ∫₀ᵗ (Q_in − Q_out) dt' = C·(p(t) − p₀)
 *
 * so C is the slope of an ordinary least-squares line of V on p (the intercept absorbs p₀).
 *
 * Uncertainty, derived here for white sensor noise (σ_p on p, σ_Q on the net flow): the slope is
 * Σ wₖVₖ with wₖ = (pₖ − p̄)/S_pp. Pressure noise enters as −C·ε_p,k (white): variance C²σ_p²Σwₖ².
 * Flow noise enters V as a random walk Vₖ = Σ_{j≤k} Δtⱼ·ε_Q,j, so Σ wₖVₖ = Σⱼ Δtⱼ ε_Q,j Wⱼ with the
 * tail sums Wⱼ = Σ_{k≥j} wₖ: variance σ_Q²ΣΔtⱼ²Wⱼ². Both σ's are estimated from first differences
 * (or given). As a guard against noise that is not white, the SE is never below the residual-based
 * one inflated by the AR(1) effective sample size n_eff = n(1 − ρ₁)/(1 + ρ₁) (variance inflation for
 * serially correlated data, e.g. Wilks, "Statistical Methods in the Atmospheric Sciences").
 * White noise σ_p in the regressor p biases the slope low by the reliability ratio
 * λ = 1 − (n − 1)σ_p²/S_pp (errors in variables; Fuller, "Measurement Error Models", 1987, §1.1);
 * slope and SE are divided by λ. A cross-check shown beside the fit, not a replacement.
 */
import { InputError } from '../errors';
import type { Warning } from '../errors';
import { noiseSigmaFromDifferences } from '../stats';
import { estimateFrom, isInconclusivePositive } from './propagate';
import { inconclusiveWarning } from './setup-common';
import type { PhysicalEstimate } from './types';

export interface FlowBalanceInput {
  /** Time since the step onset, s, increasing. */
  tS: Float64Array;
  /** Pressure at the compliant node, Pa (gauge or absolute: only differences matter). */
  pressurePa: Float64Array;
  /** Flow into the node, m³/s: a measured series or the constant pump setpoint. */
  flowInM3PerS: Float64Array | number;
  /** Flow out of the node, m³/s: a measured series (or a constant). */
  flowOutM3PerS: Float64Array | number;
  /** White noise σ of the pressure sensor, Pa; default: estimated from the first differences of p. */
  pressureNoisePa?: number;
}

export interface FlowBalanceEstimate {
  complianceM3PerPa: PhysicalEstimate;
  /** Points used in the regression. */
  n: number;
  /** Effective number of independent points after the autocorrelation correction. */
  effectiveN: number;
  /** Lag-1 autocorrelation of the regression residuals. */
  residualLag1: number;
  r2: number;
  /** Reliability ratio λ used to undo the attenuation by pressure noise (1 = none). */
  reliability: number;
  warnings: Warning[];
}

const at = (v: Float64Array | number, i: number): number => (typeof v === 'number' ? v : (v[i] as number));

/** C from ∫(Q_in − Q_out)dt = C·(p − p₀) by least squares, with an autocorrelation-aware CI. */
export function complianceFromFlowBalance(input: FlowBalanceInput): FlowBalanceEstimate {
  const n0 = input.tS.length;
  for (const [name, v] of [['pressurePa', input.pressurePa], ['flowInM3PerS', input.flowInM3PerS], ['flowOutM3PerS', input.flowOutM3PerS]] as const) {
    if (typeof v !== 'number' && v.length !== n0) {
      throw new InputError('length-mismatch', `${name} has ${v.length} samples but tS has ${n0}`, 'Pass series on the same time base');
    }
  }
  const xs: number[] = [];
  const ys: number[] = [];
  const nets: number[] = [];
  /** Interval lengths: dts[k] is the time between point k−1 and k of xs (0 for the first). */
  const dts: number[] = [];
  let lastUsedT = Number.NaN;
  let volume = 0;
  let prevNet = Number.NaN;
  let prevT = Number.NaN;
  for (let i = 0; i < n0; i++) {
    const t = input.tS[i] as number;
    const net = at(input.flowInM3PerS, i) - at(input.flowOutM3PerS, i);
    if (!Number.isFinite(net) || !Number.isFinite(t)) continue;
    if (Number.isFinite(prevNet)) volume += 0.5 * (net + prevNet) * (t - prevT);
    prevNet = net;
    prevT = t;
    nets.push(net);
    const p = input.pressurePa[i] as number;
    if (Number.isFinite(p)) {
      xs.push(p);
      ys.push(volume);
      dts.push(Number.isFinite(lastUsedT) ? t - lastUsedT : 0);
      lastUsedT = t;
    }
  }
  const n = xs.length;
  if (n < 5) {
    throw new InputError('too-few-points', `The flow balance needs at least 5 samples with pressure and flows, got ${n}`, 'Use a longer window');
  }
  const mx = xs.reduce((a, b) => a + b, 0) / n;
  const my = ys.reduce((a, b) => a + b, 0) / n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = (xs[i] as number) - mx;
    const dy = (ys[i] as number) - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  const sigmaP = input.pressureNoisePa ?? noiseSigmaFromDifferences(xs);
  const reliability = Number.isFinite(sigmaP) ? Math.max(0.5, 1 - ((n - 1) * sigmaP * sigmaP) / sxx) : 1;
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  const residuals = xs.map((x, i) => (ys[i] as number) - intercept - slope * x);
  const ssr = residuals.reduce((a, r) => a + r * r, 0);
  let num = 0;
  for (let i = 1; i < n; i++) num += (residuals[i] as number) * (residuals[i - 1] as number);
  const rho = ssr > 0 ? Math.max(-0.99, Math.min(0.99, num / ssr)) : 0;
  const effectiveN = Math.max(3, Math.min(n, (n * (1 - rho)) / (1 + rho)));
  const seNaive = Math.sqrt(ssr / (n - 2) / sxx);
  const seResidual = seNaive * Math.sqrt(n / effectiveN);
  const sigmaQ = noiseSigmaFromDifferences(nets);
  let sumW2 = 0;
  let sumDtW2 = 0;
  let tail = 0;
  for (let k = n - 1; k >= 0; k--) {
    const w = ((xs[k] as number) - mx) / sxx;
    sumW2 += w * w;
    // the noise of the interval ending at point k affects V at k and all later points
    if (k > 0) {
      tail += w;
      sumDtW2 += ((dts[k] as number) * tail) ** 2;
    }
  }
  const slope0 = sxy / sxx;
  const seModel = Math.sqrt(
    (Number.isFinite(sigmaP) ? slope0 * slope0 * sigmaP * sigmaP * sumW2 : 0) + (Number.isFinite(sigmaQ) ? sigmaQ * sigmaQ * sumDtW2 : 0),
  );
  const se = Math.max(seResidual, seModel);
  const compliance = estimateFrom(slope / reliability, se / reliability, effectiveN - 2);
  compliance.inconclusive = isInconclusivePositive(compliance.ci95);
  const warnings: Warning[] = [...inconclusiveWarning('The compliance from the flow balance', compliance)];
  if (reliability <= 0.5) {
    warnings.push({ code: 'pressure-noise-dominates', message: 'The pressure noise is comparable to the pressure change, so the flow-balance C is unreliable.' });
  }
  if (!(sxx > 0)) warnings.push({ code: 'no-pressure-change', message: 'The node pressure did not change, so the flow balance cannot give C.' });
  return { complianceM3PerPa: compliance, n, effectiveN, residualLag1: rho, r2: syy > 0 ? 1 - ssr / syy : 0, reliability, warnings };
}
