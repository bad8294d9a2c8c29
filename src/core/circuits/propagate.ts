/**
 * Uncertainty propagation for derived quantities f(θ) of fitted parameters θ.
 *
 * Delta method (first-order Taylor expansion; e.g. JCGM 100:2008 "GUM", §5.1.2, law of
 * propagation of uncertainty with correlated inputs): Var f ≈ ∇fᵀ Σ ∇f. The gradient is
 * taken by central differences with steps of 1e-4 standard errors, small against the
 * curvature of the ratios and products used here, so the truncation error is negligible.
 * The 95 % interval is f ± t(0.975, dof)·SE, with the fit's degrees of freedom.
 */
import type { ParameterReader, ParameterSet } from './parameter-set';
import { readerFor } from './parameter-set';
import type { PhysicalEstimate } from './types';
import { studentTQuantile } from '../stats';

export type DerivedFunction = (p: ParameterReader) => number;

/** Relative step of the central difference, in units of each parameter's standard error. */
const STEP_IN_SE = 1e-4;

/** Gradient of f at the set's values (zero for parameters without uncertainty). */
export function gradient(set: ParameterSet, f: DerivedFunction): number[] {
  return set.names.map((_, i) => {
    const se = Math.sqrt(Math.max(0, set.covariance[i]?.[i] ?? 0));
    if (!(se > 0)) return 0;
    const base = set.values[i] as number;
    const h = STEP_IN_SE * se;
    const up = [...set.values];
    const down = [...set.values];
    up[i] = base + h;
    down[i] = base - h;
    return (f(readerFor(set, up)) - f(readerFor(set, down))) / (2 * h);
  });
}

/** Standard error of f by the delta method. */
export function deltaMethodStandardError(set: ParameterSet, f: DerivedFunction): number {
  const g = gradient(set, f);
  let variance = 0;
  for (let i = 0; i < g.length; i++) {
    for (let j = 0; j < g.length; j++) variance += (g[i] as number) * (g[j] as number) * (set.covariance[i]?.[j] ?? 0);
  }
  return Math.sqrt(Math.max(0, variance));
}

/**
 * f(θ̂) with its delta-method SE and 95 % CI, and the inconclusive flag for a quantity that
 * must be positive (R, C, τ): CI reaching 0 or below, or hi/lo > 10.
 */
export function propagate(set: ParameterSet, f: DerivedFunction, dof: number): PhysicalEstimate {
  const value = f(readerFor(set, set.values));
  const standardError = deltaMethodStandardError(set, f);
  return estimateFrom(value, standardError, dof);
}

/** Builds an estimate from a value and its SE with the t-quantile for `dof` degrees of freedom. */
export function estimateFrom(value: number, standardError: number, dof: number): PhysicalEstimate {
  const t = studentTQuantile(0.975, Math.max(1, dof));
  const ci95: [number, number] = [value - t * standardError, value + t * standardError];
  return { value, standardError, ci95, inconclusive: isInconclusivePositive(ci95) };
}

/**
 * The "not significantly determined" rule for positive quantities: the CI includes 0
 * (lo ≤ 0), spans more than a factor of 10 (hi/lo > 10), or is not finite.
 */
export function isInconclusivePositive(ci95: [number, number]): boolean {
  const [lo, hi] = ci95;
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return true;
  if (lo <= 0) return true;
  return hi / lo > 10;
}
