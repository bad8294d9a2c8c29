/**
 * Parameter covariance at a least-squares optimum: Cov = s²·(JᵀJ)⁻¹ with s² = SSR/(n − p),
 * computed as s²·D⁻¹VΣ⁻²VᵀD⁻¹ from the SVD of the column-scaled Jacobian J·D⁻¹ (D = column norms),
 * never by inverting JᵀJ (NIST StRD nonlinear regression notes; Björck, Numerical Methods for
 * Least Squares Problems, 1996, §2.7 on scaling).
 */
import { studentTQuantile } from '../stats/student-t';
import { ScaledSvd } from './linalg';

export interface CovarianceResult {
  /** p×p covariance, row-major. */
  covariance: Float64Array;
  standardErrors: Float64Array;
  /** Correlation matrix, row-major (NaN where a variance is infinite or zero). */
  correlation: Float64Array;
  /** Numerical rank of the scaled Jacobian. */
  rank: number;
  /** s² = SSR/dof. */
  residualVariance: number;
  dof: number;
  /** Condition number σ_max/σ_min of the column-scaled Jacobian. */
  condition: number;
}

/**
 * Covariance from the Jacobian (n×p column-major) at the optimum and the SSR there.
 * `variance` overrides s² (e.g. a known noise variance); by default s² = SSR/(n − p).
 */
export function covarianceFromJacobian(jac: Float64Array, n: number, p: number, ssr: number, variance?: number): CovarianceResult {
  const d = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let nn = 0;
    for (let i = 0; i < n; i++) nn += jac[j * n + i]! ** 2;
    d[j] = nn > 0 ? Math.sqrt(nn) : 1;
  }
  const svd = new ScaledSvd(n, p);
  svd.factor(jac, d, null);
  const inv = new Float64Array(p * p);
  const rank = svd.inverseNormal(inv);
  const dof = n - p;
  const s2 = variance ?? (dof > 0 ? ssr / dof : NaN);
  const covariance = new Float64Array(p * p);
  for (let k = 0; k < p * p; k++) covariance[k] = inv[k]! * s2;
  const standardErrors = new Float64Array(p);
  for (let j = 0; j < p; j++) standardErrors[j] = Math.sqrt(covariance[j * p + j]!);
  const correlation = new Float64Array(p * p);
  for (let a = 0; a < p; a++) {
    for (let b = 0; b < p; b++) {
      const den = standardErrors[a]! * standardErrors[b]!;
      correlation[a * p + b] = a === b ? (Number.isFinite(den) && den > 0 ? 1 : NaN) : Number.isFinite(den) && den > 0 ? covariance[a * p + b]! / den : NaN;
    }
  }
  let smin = Infinity;
  let smax = 0;
  for (let j = 0; j < p; j++) {
    smin = Math.min(smin, svd.sigma[j]!);
    smax = Math.max(smax, svd.sigma[j]!);
  }
  return { covariance, standardErrors, correlation, rank, residualVariance: s2, dof, condition: smin > 0 ? smax / smin : Infinity };
}

/** Two-sided 95 % confidence interval value ± t₀.₉₇₅(dof)·se. */
export function ci95(value: number, se: number, dof: number): [number, number] {
  const t = dof > 0 ? studentTQuantile(0.975, dof) : NaN;
  return [value - t * se, value + t * se];
}
