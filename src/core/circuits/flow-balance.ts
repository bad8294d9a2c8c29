/**
 * Compliance from the dynamic volume balance of the compliant node, a cross-check that needs
 * no exponential fit: Q_in − Q_out = C·dp/dt (physics.md §3.1, C = dV/dp; §4.2). Integrated
 * over the step window (trapezoidal rule) it becomes linear in p:
 *
 *   V(t) = ∫₀ᵗ (Q_in − Q_out) dt' = C·(p(t) − p₀)
 *
 * so C is the slope of an ordinary least-squares line of V on p (the intercept absorbs p₀).
 * The integrated flow noise is a random walk, so the residuals are autocorrelated; the slope's
 * standard error is inflated by √(n/n_eff), n_eff = n·(1 − ρ₁)/(1 + ρ₁) with ρ₁ the lag-1
 * autocorrelation of the residuals (the AR(1) effective sample size; e.g. Wilks, "Statistical
 * Methods in the Atmospheric Sciences", variance inflation for serially correlated data), and the
 * t-quantile uses n_eff − 2 degrees of freedom. Noise in p biases the slope slightly low
 * (errors in the regressor), so this is a cross-check shown beside the fit, not a replacement.
 */
import { InputError } from '../errors';
import type { Warning } from '../errors';
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
    const p = input.pressurePa[i] as number;
    if (Number.isFinite(p)) {
      xs.push(p);
      ys.push(volume);
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
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  const residuals = xs.map((x, i) => (ys[i] as number) - intercept - slope * x);
  const ssr = residuals.reduce((a, r) => a + r * r, 0);
  let num = 0;
  for (let i = 1; i < n; i++) num += (residuals[i] as number) * (residuals[i - 1] as number);
  const rho = ssr > 0 ? Math.max(-0.99, Math.min(0.99, num / ssr)) : 0;
  const effectiveN = Math.max(3, Math.min(n, (n * (1 - rho)) / (1 + rho)));
  const seNaive = Math.sqrt(ssr / (n - 2) / sxx);
  const se = seNaive * Math.sqrt(n / effectiveN);
  const compliance = estimateFrom(slope, se, effectiveN - 2);
  compliance.inconclusive = isInconclusivePositive(compliance.ci95);
  const warnings: Warning[] = [...inconclusiveWarning('The compliance from the flow balance', compliance)];
  if (!(sxx > 0)) warnings.push({ code: 'no-pressure-change', message: 'The node pressure did not change, so the flow balance cannot give C.' });
  return { complianceM3PerPa: compliance, n, effectiveN, residualLag1: rho, r2: syy > 0 ? 1 - ssr / syy : 0, warnings };
}
