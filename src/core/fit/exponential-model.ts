/**
 * The transient model as a separable least-squares problem, in scaled units, for one or several
 * windows that share their time constants:
 *
 *   y_w(t) = y∞_w + Σᵢ a_wi·exp(−(t − t_d)₊/τᵢ) + b_w·t,   (s)₊ = max(s, 0)
 *
 * which holds the pre-step level y∞ + Σa (+ b·t) for t < t_d. Nonlinear parameters
 * α = [ln τ₁ … ln τₙ, t_d?] (log τ keeps τ > 0 and evens out the scales), linear parameters per
 * window c_w = [y∞, a₁ … aₙ, b?]. ∂/∂t_d uses the derivative for increasing t_d, which is 0 at
 * samples with t ≤ t_d (the model is continuous but not smooth in t_d at sample times).
 */
import type { SeparableProblem } from './separable';

export interface ScaledWindow {
  /** Scaled time (t / time scale). */
  t: Float64Array;
  /** Scaled response. */
  y: Float64Array;
  /** Row weight (1/σ relative), applied to every row of this window. */
  weight: number;
}

export interface ModelShape {
  terms: number;
  deadTime: boolean;
  drift: boolean;
}

/** Samples per block of the exp recurrence on uniformly sampled windows. */
const EXP_BLOCK = 32;

/**
 * The sample interval of `t` when every t_i equals t_0 + i·h to within 2 ulp of the largest |t|, else NaN
 * (then each exp is evaluated directly). Uniform sampling lets the model reuse exp(−h/τ)^j within a block.
 */
export function uniformSampleStep(t: Float64Array): number {
  const n = t.length;
  if (n < 2 * EXP_BLOCK) return NaN;
  const t0 = t[0]!;
  const h = (t[n - 1]! - t0) / (n - 1);
  if (!(h > 0)) return NaN;
  const tolerance = 2 * Number.EPSILON * Math.max(Math.abs(t0), Math.abs(t[n - 1]!));
  for (let i = 1; i < n; i++) if (!(Math.abs(t[i]! - (t0 + i * h)) <= tolerance)) return NaN;
  return h;
}

/** Number of linear parameters per window. */
export function linearPerWindow(shape: ModelShape): number {
  return 1 + shape.terms + (shape.drift ? 1 : 0);
}

/** Number of nonlinear parameters. */
export function nonlinearCount(shape: ModelShape): number {
  return shape.terms + (shape.deadTime ? 1 : 0);
}

/**
 * Builds the separable problem. `extraRowWeights` (optional, length = total rows) multiplies the
 * window weights, for iteratively reweighted robust fits.
 */
export function exponentialProblem(
  windows: ScaledWindow[],
  shape: ModelShape,
  bounds: { lower: Float64Array; upper: Float64Array },
  extraRowWeights?: Float64Array,
): SeparableProblem {
  const { terms, deadTime, drift } = shape;
  const qw = linearPerWindow(shape);
  const offsets: number[] = [];
  let n = 0;
  for (const w of windows) {
    offsets.push(n);
    n += w.t.length;
  }
  // One window: its arrays are used as they are (never modified here), saving two copies.
  const single = windows.length === 1;
  const y = single ? windows[0]!.y : new Float64Array(n);
  const rowWeights = new Float64Array(n);
  const t = single ? windows[0]!.t : new Float64Array(n);
  const windowOf = new Int32Array(n);
  windows.forEach((w, k) => {
    const o = offsets[k]!;
    if (!single) {
      y.set(w.y, o);
      t.set(w.t, o);
    }
    for (let i = 0; i < w.t.length; i++) {
      rowWeights[o + i] = w.weight * (extraRowWeights ? extraRowWeights[o + i]! : 1);
      windowOf[o + i] = k;
    }
  });
  const nW = windows.length;
  const q = qw * nW;
  // Per window: its sample interval when the sampling is uniform to rounding (else NaN), for the exp recurrence.
  const uniformStep = windows.map((w) => uniformSampleStep(w.t));
  const powers = new Float64Array(EXP_BLOCK);
  // Cache of the exponential columns E (n × terms) for the last α.
  const e = new Float64Array(n * terms);
  const lastAlpha = new Float64Array(nonlinearCount(shape)).fill(NaN);
  const taus = new Float64Array(terms);
  let td = 0;
  const refresh = (alpha: Float64Array): void => {
    let same = true;
    for (let k = 0; k < alpha.length; k++) if (alpha[k] !== lastAlpha[k]) same = false;
    if (same) return;
    lastAlpha.set(alpha);
    td = deadTime ? alpha[terms]! : 0;
    for (let k = 0; k < terms; k++) {
      const tau = Math.exp(alpha[k]!);
      taus[k] = tau;
      const inv = 1 / tau;
      const ck = k * n;
      for (let w = 0; w < nW; w++) {
        const i0 = offsets[w]!;
        const i1 = i0 + windows[w]!.t.length;
        const h = uniformStep[w]!;
        if (Number.isNaN(h)) {
          for (let i = i0; i < i1; i++) {
            const s = t[i]! - td;
            e[ck + i] = s > 0 ? Math.exp(-s * inv) : 1;
          }
          continue;
        }
        // Uniform sampling: exp(−s_{b+j}/τ) = exp(−s_b/τ)·exp(−j·h/τ), one exp per block of EXP_BLOCK samples plus
        // EXP_BLOCK powers per τ instead of one exp per sample. Each value is a product of two correctly rounded
        // exps (no error accumulates across blocks); the sample times deviate from t_b + j·h by ≤ 2 ulp.
        let i = i0;
        while (i < i1 && !(t[i]! - td > 0)) e[ck + i++] = 1;
        for (let j = 0; j < EXP_BLOCK; j++) powers[j] = Math.exp(-(j * h) * inv);
        for (let b = i; b < i1; b += EXP_BLOCK) {
          const e0 = Math.exp(-(t[b]! - td) * inv);
          const end = Math.min(b + EXP_BLOCK, i1);
          for (let j = b; j < end; j++) e[ck + j] = e0 * powers[j - b]!;
        }
      }
    }
  };
  return {
    n,
    nLinear: q,
    nNonlinear: nonlinearCount(shape),
    y,
    rowWeights,
    lower: bounds.lower,
    upper: bounds.upper,
    basis(alpha, phi) {
      refresh(alpha);
      phi.fill(0);
      for (let i = 0; i < n; i++) {
        const base = windowOf[i]! * qw;
        phi[base * n + i] = 1;
        for (let k = 0; k < terms; k++) phi[(base + 1 + k) * n + i] = e[k * n + i]!;
        if (drift) phi[(base + 1 + terms) * n + i] = t[i]!;
      }
    },
    basisDerivativeTimes(alpha, k, c, out) {
      refresh(alpha);
      if (k < terms) {
        const inv = 1 / taus[k]!;
        for (let i = 0; i < n; i++) {
          const s = t[i]! - td;
          const a = c[windowOf[i]! * qw + 1 + k]!;
          out[i] = s > 0 ? a * e[k * n + i]! * s * inv : 0; // ∂/∂ln τ of a·exp(−s/τ) = a·e·s/τ
        }
        return;
      }
      // ∂/∂t_d of Σ a_j exp(−(t − t_d)/τ_j) = Σ a_j e_j / τ_j for t > t_d.
      for (let i = 0; i < n; i++) {
        if (t[i]! - td <= 0) {
          out[i] = 0;
          continue;
        }
        const base = windowOf[i]! * qw + 1;
        let s = 0;
        for (let j = 0; j < terms; j++) s += (c[base + j]! * e[j * n + i]!) / taus[j]!;
        out[i] = s;
      }
    },
  };
}
