/**
 * General nonlinear least squares: a scaled Levenberg–Marquardt method with Nielsen's damping
 * update, steps from a QR + SVD of the column-scaled Jacobian (never the normal equations), an
 * explicit convergence test on the gradient and the step, and a Gauss–Newton polish.
 *
 * References: Moré, "The Levenberg–Marquardt algorithm: implementation and theory" (1978) for the
 * diagonal scaling D = max‖J_j‖ and the gradient test; Nielsen, "Damping parameter in Marquardt's
 * method" (IMM-REP-1999-05) and Madsen, Nielsen & Tingleff, "Methods for non-linear least squares
 * problems" (2004), §3.2, for the gain-ratio damping update.
 */
import { ScaledSvd } from './linalg';

/** Relative size of the undamped Gauss–Newton step below which x counts as the optimum. */
const GN_STEP_TOLERANCE = 1e-8;

/** A least-squares problem: minimise Σ r_i(x)². */
export interface LeastSquaresProblem {
  /** Number of residuals. */
  n: number;
  /** Number of parameters (n ≥ p). */
  p: number;
  /** Fill `out` (length n) with the residuals at x (model − data, weighted). */
  residuals(x: Float64Array, out: Float64Array): void;
  /** Fill `out` (n×p column-major: ∂r_i/∂x_j at out[j·n + i]) with the exact Jacobian at x. */
  jacobian(x: Float64Array, out: Float64Array): void;
  /** Optional box bounds (trial points are projected onto them). */
  lower?: Float64Array;
  upper?: Float64Array;
}

export interface LeastSquaresOptions {
  /** Maximum Jacobian evaluations (iterations). Default 500. */
  maxIterations?: number;
  /** Gradient test: max_j |J_jᵀ r| / (‖J_j‖·‖r‖) ≤ gradientTolerance. Default 1e-12. */
  gradientTolerance?: number;
  /** Step test: ‖D·δ‖ ≤ stepTolerance·(‖D·x‖ + stepTolerance). Default 1e-12. */
  stepTolerance?: number;
  /** Gauss–Newton polish steps after convergence. Default 8. */
  polishSteps?: number;
}

export interface LeastSquaresResult {
  x: Float64Array;
  /** Σ r_i² at x. */
  ssr: number;
  residuals: Float64Array;
  /** Jacobian at x (n×p column-major). */
  jacobian: Float64Array;
  converged: boolean;
  /** Why the optimiser stopped, in words. */
  stopReason: string;
  /** Jacobian evaluations (accepted points). */
  iterations: number;
  /** Residual evaluations. */
  evaluations: number;
  /** Per parameter: whether it ended on one of its bounds. */
  atBound: boolean[];
}

function sumSquares(r: Float64Array): number {
  let s = 0;
  for (let i = 0; i < r.length; i++) s += r[i]! * r[i]!;
  return s;
}

function allFinite(r: Float64Array): boolean {
  for (let i = 0; i < r.length; i++) if (!Number.isFinite(r[i]!)) return false;
  return true;
}

/**
 * Cosine test of Moré (1978): largest |cos| between the residual vector and a Jacobian column.
 * Zero at an exact stationary point; scale-free.
 */
function gradientCosine(jac: Float64Array, r: Float64Array, n: number, p: number, rNorm: number): number {
  if (rNorm === 0) return 0;
  let worst = 0;
  for (let j = 0; j < p; j++) {
    let dot = 0;
    let nn = 0;
    const cj = j * n;
    for (let i = 0; i < n; i++) {
      dot += jac[cj + i]! * r[i]!;
      nn += jac[cj + i]! * jac[cj + i]!;
    }
    if (nn === 0) continue;
    worst = Math.max(worst, Math.abs(dot) / (Math.sqrt(nn) * rNorm));
  }
  return worst;
}

function project(x: Float64Array, lower?: Float64Array, upper?: Float64Array): boolean {
  let changed = false;
  for (let i = 0; i < x.length; i++) {
    if (lower && x[i]! < lower[i]!) {
      x[i] = lower[i]!;
      changed = true;
    }
    if (upper && x[i]! > upper[i]!) {
      x[i] = upper[i]!;
      changed = true;
    }
  }
  return changed;
}

/** Solve min Σ r_i(x)² from the start x0 (not modified). */
export function solveLeastSquares(problem: LeastSquaresProblem, x0: ArrayLike<number>, options: LeastSquaresOptions = {}): LeastSquaresResult {
  const { n, p, lower, upper } = problem;
  if (n < p) throw new RangeError(`solveLeastSquares needs at least as many residuals (${n}) as parameters (${p}).`);
  const maxIterations = options.maxIterations ?? 500;
  const gtol = options.gradientTolerance ?? 1e-12;
  const xtol = options.stepTolerance ?? 1e-12;
  const polishSteps = options.polishSteps ?? 8;

  const x = Float64Array.from(x0 as ArrayLike<number>);
  project(x, lower, upper);
  const xTrial = new Float64Array(p);
  const delta = new Float64Array(p);
  const r = new Float64Array(n);
  const rTrial = new Float64Array(n);
  const jac = new Float64Array(n * p);
  const d = new Float64Array(p);
  let jd: Float64Array | null = null;
  const svd = new ScaledSvd(n, p);

  problem.residuals(x, r);
  let evaluations = 1;
  if (!allFinite(r)) {
    problem.jacobian(x, jac);
    return finish(false, 'the residuals are not finite at the starting point', 0);
  }
  let ssr = sumSquares(r);
  let iterations = 0;
  let lambda = -1;
  let nu = 2;
  let converged = false;
  let stopReason = '';
  let stationaryEnd = false;

  function finish(ok: boolean, reason: string, iters: number): LeastSquaresResult {
    const atBound: boolean[] = [];
    for (let j = 0; j < p; j++) atBound.push((lower !== undefined && x[j] === lower[j]) || (upper !== undefined && x[j] === upper[j]));
    return { x, ssr: sumSquares(r), residuals: r, jacobian: jac, converged: ok, stopReason: reason, iterations: iters, evaluations, atBound };
  }

  /** Recompute J at x and the scaled factorisation; returns false on non-finite J. */
  function refactor(): boolean {
    problem.jacobian(x, jac);
    iterations++;
    for (let j = 0; j < p; j++) {
      let nn = 0;
      const cj = j * n;
      for (let i = 0; i < n; i++) nn += jac[cj + i]! * jac[cj + i]!;
      if (!Number.isFinite(nn)) return false;
      const norm = Math.sqrt(nn);
      d[j] = Math.max(d[j]!, norm > 0 ? norm : 1);
    }
    svd.factor(jac, d, r);
    return true;
  }

  if (!refactor()) return finish(false, 'the Jacobian is not finite at the starting point', iterations);

  while (true) {
    const rNorm = Math.sqrt(ssr);
    if (ssr === 0) {
      converged = true;
      stopReason = 'zero residual';
      break;
    }
    const cosine = gradientCosine(jac, r, n, p, rNorm);
    if (cosine <= gtol) {
      converged = true;
      stationaryEnd = true;
      stopReason = `gradient cosine ${cosine.toExponential(1)} ≤ ${gtol}`;
      break;
    }
    if (iterations >= maxIterations) {
      stopReason = `iteration limit (${maxIterations}) reached`;
      break;
    }
    const smax = svd.sigmaMax();
    if (lambda < 0) lambda = 1e-3 * smax * smax;

    // Inner loop: find an acceptable damped step.
    let accepted = false;
    let smallStep = false;
    while (true) {
      const predicted0 = svd.step(lambda, delta);
      for (let j = 0; j < p; j++) xTrial[j] = x[j]! + delta[j]!;
      let predicted = predicted0;
      if (project(xTrial, lower, upper)) {
        // Predicted reduction of the projected step from the linear model: ‖r‖² − ‖r + J·δ‖².
        jd ??= new Float64Array(n);
        jd.fill(0);
        for (let j = 0; j < p; j++) {
          const dj = xTrial[j]! - x[j]!;
          if (dj === 0) continue;
          const cj = j * n;
          for (let i = 0; i < n; i++) jd[i] = jd[i]! + jac[cj + i]! * dj;
        }
        let s = 0;
        for (let i = 0; i < n; i++) s += (r[i]! + jd[i]!) ** 2;
        predicted = ssr - s;
      }
      let stepNorm = 0;
      let xNorm = 0;
      for (let j = 0; j < p; j++) {
        stepNorm += (d[j]! * (xTrial[j]! - x[j]!)) ** 2;
        xNorm += (d[j]! * x[j]!) ** 2;
      }
      stepNorm = Math.sqrt(stepNorm);
      xNorm = Math.sqrt(xNorm);
      problem.residuals(xTrial, rTrial);
      evaluations++;
      const finite = allFinite(rTrial);
      const ssrTrial = finite ? sumSquares(rTrial) : Infinity;
      const rho = predicted > 0 ? (ssr - ssrTrial) / predicted : -1;
      if (finite && rho > 0 && ssrTrial <= ssr) {
        x.set(xTrial);
        r.set(rTrial);
        const previous = ssr;
        ssr = ssrTrial;
        lambda *= Math.max(1 / 3, 1 - (2 * rho - 1) ** 3);
        nu = 2;
        accepted = true;
        if (stepNorm <= xtol * (xNorm + xtol)) smallStep = true;
        if (previous - ssr <= 1e-15 * previous && predicted <= 1e-15 * previous) smallStep = true;
        break;
      }
      if (stepNorm <= xtol * (xNorm + xtol) || predicted <= 1e-30 * ssr) {
        smallStep = true;
        break;
      }
      lambda *= nu;
      nu *= 2;
      if (!Number.isFinite(lambda) || lambda > 1e300) break;
    }
    if (accepted && !refactor()) {
      stopReason = 'the Jacobian became non-finite';
      break;
    }
    if (smallStep) {
      stopReason = 'the damped step became negligible';
      stationaryEnd = true;
      break;
    }
    if (!accepted) {
      stopReason = 'no step reduces the sum of squares (damping overflow)';
      stationaryEnd = true;
      break;
    }
  }

  if (stationaryEnd && !converged) {
    // The damped steps stalled. Judge by the undamped Gauss–Newton step: if even that predicts only a
    // negligible change, the SSR is flat at rounding level and x is the optimum (e.g. near-exact data).
    const relGn = relativeGaussNewtonStep();
    const c = gradientCosine(jac, r, n, p, Math.sqrt(ssr));
    converged = c <= gtol || (relGn <= GN_STEP_TOLERANCE && svd.fullRank());
    stopReason = `${stopReason}; gradient cosine ${c.toExponential(1)}, Gauss–Newton step ${relGn.toExponential(1)} relative`;
  }
  if ((converged || stationaryEnd) && polishSteps > 0) {
    const polished = gaussNewtonPolish();
    const relGn = relativeGaussNewtonStep();
    const c = gradientCosine(jac, r, n, p, Math.sqrt(ssr));
    const ok = c <= gtol || (relGn <= GN_STEP_TOLERANCE && svd.fullRank());
    if (polished > 0) {
      stopReason = `${stopReason}; ${polished} Gauss–Newton polish step${polished > 1 ? 's' : ''} (gradient cosine ${c.toExponential(1)})`;
    }
    converged = ok;
  }
  return finish(converged, stopReason, iterations);

  /** ‖D·δ_GN‖/‖D·x‖ for the undamped step at the current point. */
  function relativeGaussNewtonStep(): number {
    svd.step(0, delta, 1e-14);
    let a = 0;
    let b = 0;
    for (let j = 0; j < p; j++) {
      a += (d[j]! * delta[j]!) ** 2;
      b += (d[j]! * x[j]!) ** 2;
    }
    return b > 0 ? Math.sqrt(a / b) : Math.sqrt(a);
  }

  /**
   * Undamped Gauss–Newton steps from the LM optimum (quadratic convergence recovers the digits the
   * damped steps leave). A step is kept unless it raises the SSR beyond rounding (1e-10 relative);
   * stops when the step stops shrinking or is below 1e-15 relative. Returns the steps kept.
   */
  function gaussNewtonPolish(): number {
    let kept = 0;
    let previousStep = Infinity;
    for (let k = 0; k < polishSteps; k++) {
      const rel = relativeGaussNewtonStep();
      if (!(rel > 1e-15) || rel > 0.5 * previousStep) return kept;
      previousStep = rel;
      for (let j = 0; j < p; j++) xTrial[j] = x[j]! + delta[j]!;
      project(xTrial, lower, upper);
      problem.residuals(xTrial, rTrial);
      evaluations++;
      if (!allFinite(rTrial)) return kept;
      const s = sumSquares(rTrial);
      if (!(s <= ssr * (1 + 1e-10))) return kept;
      x.set(xTrial);
      r.set(rTrial);
      ssr = s;
      kept++;
      if (!refactor()) return kept;
    }
    return kept;
  }
}
