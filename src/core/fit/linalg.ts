/**
 * Small dense linear algebra for least squares: Householder QR of a tall column-major matrix and a
 * one-sided Jacobi SVD of a small square matrix. Column-major storage: element (i, j) of an n×p
 * matrix is at a[j·n + i]. No allocation inside the loops.
 */

/**
 * In-place Householder QR of the n×p column-major matrix `a` (n ≥ p) (Golub & Van Loan,
 * Matrix Computations 4th ed., Alg. 5.2.1). On return the strict upper triangle of `a` holds R
 * above the diagonal, `rDiag` holds R's diagonal, and the columns below the diagonal hold the
 * Householder vectors v_k (with `vNorm2[k]` = v_kᵀv_k, 0 for a skipped column).
 */
export function householderQr(a: Float64Array, n: number, p: number, rDiag: Float64Array, vNorm2: Float64Array): void {
  for (let k = 0; k < p; k++) {
    const ck = k * n;
    let norm2 = 0;
    for (let i = k; i < n; i++) norm2 += a[ck + i]! * a[ck + i]!;
    if (norm2 === 0) {
      rDiag[k] = 0;
      vNorm2[k] = 0;
      continue;
    }
    const norm = Math.sqrt(norm2);
    const akk = a[ck + k]!;
    const alpha = akk > 0 ? -norm : norm;
    a[ck + k] = akk - alpha;
    const vv = 2 * norm * (norm + Math.abs(akk));
    rDiag[k] = alpha;
    vNorm2[k] = vv;
    for (let j = k + 1; j < p; j++) {
      const cj = j * n;
      let s = 0;
      for (let i = k; i < n; i++) s += a[ck + i]! * a[cj + i]!;
      const f = (2 * s) / vv;
      for (let i = k; i < n; i++) a[cj + i] = a[cj + i]! - f * a[ck + i]!;
    }
  }
}

/** b ← Qᵀ b using the reflectors stored by {@link householderQr}. */
export function applyQt(a: Float64Array, n: number, p: number, vNorm2: Float64Array, b: Float64Array): void {
  for (let k = 0; k < p; k++) {
    const vv = vNorm2[k]!;
    if (vv === 0) continue;
    const ck = k * n;
    let s = 0;
    for (let i = k; i < n; i++) s += a[ck + i]! * b[i]!;
    const f = (2 * s) / vv;
    for (let i = k; i < n; i++) b[i] = b[i]! - f * a[ck + i]!;
  }
}

/** b ← Q b (reflectors applied in reverse order). */
export function applyQ(a: Float64Array, n: number, p: number, vNorm2: Float64Array, b: Float64Array): void {
  for (let k = p - 1; k >= 0; k--) {
    const vv = vNorm2[k]!;
    if (vv === 0) continue;
    const ck = k * n;
    let s = 0;
    for (let i = k; i < n; i++) s += a[ck + i]! * b[i]!;
    const f = (2 * s) / vv;
    for (let i = k; i < n; i++) b[i] = b[i]! - f * a[ck + i]!;
  }
}

/** Copies R (p×p, column-major) out of a QR factorisation made by {@link householderQr}. */
export function extractR(a: Float64Array, n: number, p: number, rDiag: Float64Array, r: Float64Array): void {
  for (let j = 0; j < p; j++) {
    for (let i = 0; i < p; i++) {
      r[j * p + i] = i < j ? a[j * n + i]! : i === j ? rDiag[j]! : 0;
    }
  }
}

/**
 * One-sided Jacobi SVD (Hestenes 1958; Demmel & Veselić 1992, high relative accuracy) of the
 * p×p column-major matrix `w`, in place: on return the columns of `w` are σ_j·u_j, `v` holds V
 * (p×p column-major) and `sigma` the singular values (unsorted). Returns the sweeps used.
 */
export function jacobiSvd(w: Float64Array, p: number, v: Float64Array, sigma: Float64Array): number {
  v.fill(0);
  for (let i = 0; i < p; i++) v[i * p + i] = 1;
  let sweep = 0;
  for (; sweep < 80; sweep++) {
    let rotated = false;
    for (let i = 0; i < p - 1; i++) {
      for (let j = i + 1; j < p; j++) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let k = 0; k < p; k++) {
          const wi = w[i * p + k]!;
          const wj = w[j * p + k]!;
          alpha += wi * wi;
          beta += wj * wj;
          gamma += wi * wj;
        }
        if (gamma === 0 || Math.abs(gamma) <= 1e-17 * Math.sqrt(alpha * beta)) continue;
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        for (let k = 0; k < p; k++) {
          const wi = w[i * p + k]!;
          const wj = w[j * p + k]!;
          w[i * p + k] = c * wi - s * wj;
          w[j * p + k] = s * wi + c * wj;
          const vi = v[i * p + k]!;
          const vj = v[j * p + k]!;
          v[i * p + k] = c * vi - s * vj;
          v[j * p + k] = s * vi + c * vj;
        }
      }
    }
    if (!rotated) break;
  }
  for (let j = 0; j < p; j++) {
    let s = 0;
    for (let k = 0; k < p; k++) s += w[j * p + k]! * w[j * p + k]!;
    sigma[j] = Math.sqrt(s);
  }
  return sweep;
}

/**
 * Factorises a column-scaled Jacobian for least squares: J·D⁻¹ = Q·U·Σ·Vᵀ (QR, then Jacobi SVD of R),
 * and returns c = (QU)ᵀ r, so that min‖r + J·δ‖ can be solved for any damping λ without
 * forming JᵀJ. Workspace arrays are owned by the caller and reused.
 */
export class ScaledSvd {
  readonly n: number;
  readonly p: number;
  private readonly a: Float64Array;
  private readonly rDiag: Float64Array;
  private readonly vNorm2: Float64Array;
  private readonly qtr: Float64Array;
  /** Columns σ_j·u_j of the SVD of R (p×p, column-major). */
  readonly w: Float64Array;
  /** V of the SVD (p×p, column-major). */
  readonly v: Float64Array;
  readonly sigma: Float64Array;
  /** c_j = u_jᵀ Qᵀ r (0 where σ_j = 0). */
  readonly c: Float64Array;
  /** Column scales D used (‖J_j‖ or larger). */
  readonly d: Float64Array;

  constructor(n: number, p: number) {
    this.n = n;
    this.p = p;
    this.a = new Float64Array(n * p);
    this.rDiag = new Float64Array(p);
    this.vNorm2 = new Float64Array(p);
    this.qtr = new Float64Array(n);
    this.w = new Float64Array(p * p);
    this.v = new Float64Array(p * p);
    this.sigma = new Float64Array(p);
    this.c = new Float64Array(p);
    this.d = new Float64Array(p);
  }

  /** Factorise J (n×p column-major) scaled by the column scales `d` (must be > 0), with residual r (may be null). */
  factor(jac: Float64Array, d: Float64Array, r: Float64Array | null): void {
    const { n, p, a } = this;
    this.d.set(d);
    for (let j = 0; j < p; j++) {
      const inv = 1 / d[j]!;
      const cj = j * n;
      for (let i = 0; i < n; i++) a[cj + i] = jac[cj + i]! * inv;
    }
    householderQr(a, n, p, this.rDiag, this.vNorm2);
    extractR(a, n, p, this.rDiag, this.w);
    jacobiSvd(this.w, p, this.v, this.sigma);
    this.c.fill(0);
    if (r) {
      this.qtr.set(r);
      applyQt(a, n, p, this.vNorm2, this.qtr);
      for (let j = 0; j < p; j++) {
        const s = this.sigma[j]!;
        if (s === 0) continue;
        let dot = 0;
        for (let k = 0; k < p; k++) dot += this.w[j * p + k]! * this.qtr[k]!;
        this.c[j] = dot / s;
      }
    }
  }

  /**
   * Damped step δ minimising ‖r + Jδ‖² + λ‖Dδ‖² (Levenberg 1944, Marquardt 1963, with Moré's
   * diagonal scaling): δ = −D⁻¹ V diag(σ/(σ²+λ)) c. Singular values below `cutoff`·σ_max are dropped.
   * Returns the predicted reduction ‖r‖² − ‖r + Jδ‖² = Σ c_j² f_j (2 − f_j), f_j = σ_j²/(σ_j²+λ).
   */
  step(lambda: number, delta: Float64Array, cutoff = 1e-15): number {
    const { p, v, sigma, c, d } = this;
    let smax = 0;
    for (let j = 0; j < p; j++) smax = Math.max(smax, sigma[j]!);
    delta.fill(0);
    let predicted = 0;
    for (let j = 0; j < p; j++) {
      const s = sigma[j]!;
      if (s <= cutoff * smax || s === 0) continue;
      const f = (s * s) / (s * s + lambda);
      predicted += c[j]! * c[j]! * f * (2 - f);
      const coef = (-s * c[j]!) / (s * s + lambda);
      for (let i = 0; i < p; i++) delta[i] = delta[i]! + v[j * p + i]! * coef;
    }
    for (let i = 0; i < p; i++) delta[i] = delta[i]! / d[i]!;
    return predicted;
  }

  /** Whether every singular value is above `cutoff`·σ_max (no direction is numerically flat). */
  fullRank(cutoff = 1e-14): boolean {
    const smax = this.sigmaMax();
    for (let j = 0; j < this.p; j++) if (!(this.sigma[j]! > cutoff * smax)) return false;
    return true;
  }

  /** Largest singular value of the scaled Jacobian. */
  sigmaMax(): number {
    let m = 0;
    for (let j = 0; j < this.p; j++) m = Math.max(m, this.sigma[j]!);
    return m;
  }

  /**
   * (JᵀJ)⁻¹ = D⁻¹ V Σ⁻² Vᵀ D⁻¹ (p×p, row-major = column-major, symmetric), singular values below
   * `cutoff`·σ_max treated as zero (their directions get infinite variance). Returns the numerical rank.
   */
  inverseNormal(out: Float64Array, cutoff = 1e-13): number {
    const { p, v, sigma, d } = this;
    const smax = this.sigmaMax();
    out.fill(0);
    let rank = 0;
    for (let j = 0; j < p; j++) {
      const s = sigma[j]!;
      if (s <= cutoff * smax || s === 0) {
        for (let a = 0; a < p; a++) if (v[j * p + a] !== 0) out[a * p + a] = Infinity;
        continue;
      }
      rank++;
      const inv2 = 1 / (s * s);
      for (let a = 0; a < p; a++) {
        const va = v[j * p + a]! * inv2;
        if (va === 0) continue;
        for (let b = 0; b < p; b++) out[a * p + b] = out[a * p + b]! + va * v[j * p + b]!;
      }
    }
    for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) out[a * p + b] = out[a * p + b]! / (d[a]! * d[b]!);
    return rank;
  }
}
