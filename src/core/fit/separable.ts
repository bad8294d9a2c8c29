/**
 * Separable nonlinear least squares by variable projection (Golub & Pereyra 1973) with
 * Kaufman's Jacobian approximation (Kaufman 1975; O'Leary & Rust, "Variable projection for
 * nonlinear least squares problems", Comput. Optim. Appl. 54, 2013):
 *
 *   model = Φ(α)·c,  r(α) = W(Φ(α)·c(α) − y),  c(α) = argmin_c ‖W(Φc − y)‖,
 *   J_k ≈ P⊥_{WΦ} · W·(∂Φ/∂α_k)·c.
 *
 * The linear parameters never need a start value, which widens the region from which the
 * nonlinear ones converge (exponential sums: the amplitudes and offset are linear). After the
 * reduced problem converges, all parameters are refined jointly with the exact full Jacobian,
 * which also gives the covariance.
 */
import { applyQ, applyQt, householderQr } from './linalg';
import { solveLeastSquares, type LeastSquaresOptions, type LeastSquaresProblem, type LeastSquaresResult } from './least-squares';

export interface SeparableProblem {
  /** Number of observations. */
  n: number;
  /** Number of linear parameters c (columns of Φ). */
  nLinear: number;
  /** Number of nonlinear parameters α. */
  nNonlinear: number;
  /** Observations. */
  y: Float64Array;
  /** Optional row weights w_i (residual i is multiplied by w_i, i.e. w = 1/σ_i). */
  rowWeights?: Float64Array;
  /** Fill Φ(α) (n×nLinear, column-major). */
  basis(alpha: Float64Array, phi: Float64Array): void;
  /** Fill out (length n) with Σ_j ∂Φ_ij/∂α_k · c_j. */
  basisDerivativeTimes(alpha: Float64Array, k: number, c: Float64Array, out: Float64Array): void;
  /** Optional bounds on α. */
  lower?: Float64Array;
  upper?: Float64Array;
}

export interface SeparableResult extends LeastSquaresResult {
  /** Nonlinear parameters α (first nNonlinear entries of x). */
  alpha: Float64Array;
  /** Linear parameters c (last nLinear entries of x). */
  linear: Float64Array;
  /** Result of the reduced (projected) stage. */
  projectedStage: { converged: boolean; stopReason: string; iterations: number };
}

/**
 * The row weights, or undefined when there are none or all are exactly 1 (w·x = x then, so skipping the
 * multiplication changes no bit and saves a load and a multiply per row in every pass).
 */
function effectiveWeights(w: Float64Array | undefined): Float64Array | undefined {
  if (!w) return undefined;
  for (let i = 0; i < w.length; i++) if (w[i] !== 1) return w;
  return undefined;
}

/** Projection machinery: caches the QR of WΦ(α) for the last α seen. */
class Projector {
  private readonly prob: SeparableProblem;
  private readonly w: Float64Array | undefined;
  private readonly phi: Float64Array;
  private readonly qr: Float64Array;
  private readonly rDiag: Float64Array;
  private readonly vNorm2: Float64Array;
  private readonly qty: Float64Array;
  private readonly tmp: Float64Array;
  readonly c: Float64Array;
  private lastAlpha: Float64Array | null = null;
  rankOk = true;

  constructor(prob: SeparableProblem) {
    this.prob = prob;
    this.w = effectiveWeights(prob.rowWeights);
    const { n, nLinear: q } = prob;
    this.phi = new Float64Array(n * q);
    this.qr = new Float64Array(n * q);
    this.rDiag = new Float64Array(q);
    this.vNorm2 = new Float64Array(q);
    this.qty = new Float64Array(n);
    this.tmp = new Float64Array(n);
    this.c = new Float64Array(q);
  }

  /** Linear solve at α; fills residuals r = W(Φc − y). */
  update(alpha: Float64Array, r: Float64Array | null): void {
    const { n, nLinear: q, y } = this.prob;
    const w = this.w;
    const same = this.lastAlpha !== null && this.lastAlpha.every((v, i) => v === alpha[i]);
    if (!same) {
      this.prob.basis(alpha, this.phi);
      const qr = this.qr;
      for (let j = 0; j < q; j++) for (let i = 0; i < n; i++) qr[j * n + i] = this.phi[j * n + i]! * (w ? w[i]! : 1);
      householderQr(qr, n, q, this.rDiag, this.vNorm2);
      for (let i = 0; i < n; i++) this.qty[i] = y[i]! * (w ? w[i]! : 1);
      applyQt(qr, n, q, this.vNorm2, this.qty);
      // Back substitution R c = (Qᵀ W y)[0:q]; a zero pivot means Φ lost rank.
      this.rankOk = true;
      let rmax = 0;
      for (let j = 0; j < q; j++) rmax = Math.max(rmax, Math.abs(this.rDiag[j]!));
      for (let j = q - 1; j >= 0; j--) {
        let s = this.qty[j]!;
        for (let k = j + 1; k < q; k++) s -= qr[k * n + j]! * this.c[k]!;
        const rjj = this.rDiag[j]!;
        if (Math.abs(rjj) <= 1e-14 * rmax || rjj === 0) {
          this.rankOk = false;
          this.c[j] = 0;
        } else this.c[j] = s / rjj;
      }
      this.lastAlpha = Float64Array.from(alpha);
    }
    if (r) {
      for (let i = 0; i < n; i++) {
        let m = 0;
        for (let j = 0; j < q; j++) m += this.phi[j * n + i]! * this.c[j]!;
        r[i] = (m - y[i]!) * (w ? w[i]! : 1);
      }
      if (!this.rankOk) r[0] = NaN; // reject rank-deficient bases as failed trial points
    }
  }

  /**
   * Residuals W(Φc − y) of the full problem at [α, c(α)] (no rank marker), and its exact Jacobian
   * [W(∂Φ/∂α_k)c …, WΦ] (n×(nNonlinear + nLinear), column-major): the same arithmetic as {@link fullProblem}
   * at x = [α, c(α)], reusing the cached basis instead of allocating and recomputing it.
   */
  fullResidualsAndJacobian(alpha: Float64Array, r: Float64Array, jac: Float64Array): void {
    const { n, nLinear: q, nNonlinear: m, y } = this.prob;
    const w = this.w;
    this.update(alpha, null);
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < q; j++) s += this.phi[j * n + i]! * this.c[j]!;
      r[i] = (s - y[i]!) * (w ? w[i]! : 1);
    }
    for (let k = 0; k < m; k++) {
      this.prob.basisDerivativeTimes(alpha, k, this.c, this.tmp);
      for (let i = 0; i < n; i++) jac[k * n + i] = this.tmp[i]! * (w ? w[i]! : 1);
    }
    for (let j = 0; j < q; j++) for (let i = 0; i < n; i++) jac[(m + j) * n + i] = this.phi[j * n + i]! * (w ? w[i]! : 1);
  }

  /** Kaufman Jacobian column k: P⊥ W (∂Φ/∂α_k) c. */
  jacobianColumn(alpha: Float64Array, k: number, out: Float64Array): void {
    const { n, nLinear: q } = this.prob;
    const w = this.w;
    this.update(alpha, null);
    this.prob.basisDerivativeTimes(alpha, k, this.c, this.tmp);
    for (let i = 0; i < n; i++) out[i] = this.tmp[i]! * (w ? w[i]! : 1);
    applyQt(this.qr, n, q, this.vNorm2, out);
    for (let i = 0; i < q; i++) out[i] = 0;
    applyQ(this.qr, n, q, this.vNorm2, out);
  }
}

/** The full (unreduced) problem in x = [α, c], with the exact Jacobian. */
export function fullProblem(prob: SeparableProblem): LeastSquaresProblem {
  const { n, nLinear: q, nNonlinear: m, y } = prob;
  const w = effectiveWeights(prob.rowWeights);
  const phi = new Float64Array(n * q);
  const col = new Float64Array(n);
  const alpha = new Float64Array(m);
  const c = new Float64Array(q);
  const split = (x: Float64Array): void => {
    for (let k = 0; k < m; k++) alpha[k] = x[k]!;
    for (let j = 0; j < q; j++) c[j] = x[m + j]!;
  };
  let lower: Float64Array | undefined;
  let upper: Float64Array | undefined;
  if (prob.lower) {
    lower = new Float64Array(m + q).fill(-Infinity);
    lower.set(prob.lower);
  }
  if (prob.upper) {
    upper = new Float64Array(m + q).fill(Infinity);
    upper.set(prob.upper);
  }
  return {
    n,
    p: m + q,
    lower,
    upper,
    residuals(x, out) {
      split(x);
      prob.basis(alpha, phi);
      for (let i = 0; i < n; i++) {
        let s = 0;
        for (let j = 0; j < q; j++) s += phi[j * n + i]! * c[j]!;
        out[i] = (s - y[i]!) * (w ? w[i]! : 1);
      }
    },
    jacobian(x, out) {
      split(x);
      for (let k = 0; k < m; k++) {
        prob.basisDerivativeTimes(alpha, k, c, col);
        for (let i = 0; i < n; i++) out[k * n + i] = col[i]! * (w ? w[i]! : 1);
      }
      prob.basis(alpha, phi);
      for (let j = 0; j < q; j++) for (let i = 0; i < n; i++) out[(m + j) * n + i] = phi[j * n + i]! * (w ? w[i]! : 1);
    },
  };
}

/**
 * Solve a separable problem from a start for the nonlinear parameters only: variable projection
 * first, then a joint refinement of [α, c] (exact Jacobian, Gauss–Newton polish).
 */
export function solveSeparable(
  prob: SeparableProblem,
  alpha0: ArrayLike<number>,
  options: LeastSquaresOptions & {
    /**
     * Refine [α, c] jointly after the projected stage (default true). The projected optimum is a stationary point
     * of the full problem, so for noisy data the joint stage only adds cost; without it the full Jacobian is
     * evaluated once at the projected optimum (for the covariance) when that stage converged.
     */
    refineJointly?: boolean;
  } = {},
): SeparableResult {
  const { n, nNonlinear: m, nLinear: q } = prob;
  const projector = new Projector(prob);
  const col = new Float64Array(n);
  const reduced: LeastSquaresProblem = {
    n,
    p: m,
    lower: prob.lower,
    upper: prob.upper,
    residuals: (a, out) => projector.update(a, out),
    jacobian: (a, out) => {
      for (let k = 0; k < m; k++) {
        projector.jacobianColumn(a, k, col);
        out.set(col, k * n);
      }
    },
  };
  const stage1 = solveLeastSquares(reduced, alpha0, { ...options, polishSteps: 0 });
  projector.update(stage1.x, null);
  const x0 = new Float64Array(m + q);
  x0.set(stage1.x);
  x0.set(projector.c, m);
  if (options.refineJointly === false && stage1.converged) {
    const residuals = new Float64Array(n);
    const jacobian = new Float64Array(n * (m + q));
    projector.fullResidualsAndJacobian(stage1.x, residuals, jacobian);
    let ssr = 0;
    for (let i = 0; i < n; i++) ssr += residuals[i]! * residuals[i]!;
    return {
      x: x0,
      ssr,
      residuals,
      jacobian,
      converged: true,
      stopReason: stage1.stopReason,
      iterations: 0,
      evaluations: stage1.evaluations + 1,
      atBound: [...stage1.atBound, ...new Array<boolean>(q).fill(false)],
      alpha: x0.slice(0, m),
      linear: x0.slice(m),
      projectedStage: { converged: stage1.converged, stopReason: stage1.stopReason, iterations: stage1.iterations },
    };
  }
  const stage2 = solveLeastSquares(fullProblem(prob), x0, options);
  // If the joint stage failed but the projected one converged, report the projected optimum honestly.
  const result = stage2;
  return {
    ...result,
    alpha: result.x.slice(0, m),
    linear: result.x.slice(m),
    projectedStage: { converged: stage1.converged, stopReason: stage1.stopReason, iterations: stage1.iterations },
  };
}
