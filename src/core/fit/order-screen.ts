/**
 * Screening before the 2-term fit of the automatic order choice: when the 1-term residuals are
 * random and no extra exponential term could lower the SSR by what BIC needs, the (costly,
 * usually ill-posed) 2-term fit is skipped.
 *
 * The gain of adding a term e^{−(t − t_d)₊/τ₂} to the 1-term optimum is estimated to first order
 * (Gauss–Newton linearisation at the optimum; Seber & Wild, Nonlinear Regression, 1989, §2.1):
 * with B the 1-term Jacobian columns (level, e^{−s/τ₁}, its ∂/∂ln τ₁, and ∂/∂t_d and t when fitted)
 * and r the residuals (r ⟂ B at the optimum), the best SSR reduction along g is
 * ΔSSR(τ₂) = (g⊥·r)²/‖g⊥‖², g⊥ = g − P_B g. Its maximum over a fine ln τ₂ grid is compared with
 * the reduction a 2-term BIC win requires: n·ln(SSR₁/SSR₂) > 2·ln n (two more parameters, Schwarz
 * 1978), i.e. ΔSSR > SSR₁·(1 − n^{−2/n}).
 */
import type { ModelShape, ScaledWindow } from './exponential-model';

/** Fraction of the required BIC gain below which the linearised gain counts as "cannot win" (safety margin). */
export const SCREEN_GAIN_FRACTION = 0.5;

export interface SecondTermScreen {
  /** Largest linearised SSR reduction of one more term over the τ₂ grid (scaled units). */
  maxGain: number;
  /** SSR reduction a 2-term model needs to beat 1 term by BIC (scaled units). */
  requiredGain: number;
}

/**
 * Linearised best gain of a second exponential term at the 1-term optimum `x` (layout of
 * engine.ts: [ln τ₁, t_d?, y∞, a₁, b?], scaled) with residuals `residuals` (model − data).
 * `tauMin`/`tauMax` bound the τ₂ grid (scaled).
 */
export function screenSecondTerm(win: ScaledWindow, shape: ModelShape, x: Float64Array, residuals: Float64Array, ssr: number, tauMin: number, tauMax: number): SecondTermScreen {
  const n = win.t.length;
  const tau1 = Math.exp(x[0]!);
  const td = shape.deadTime ? x[1]! : 0;
  const a1 = x[shape.deadTime ? 3 : 2]!;
  const cols: Float64Array[] = [];
  const one = new Float64Array(n).fill(1);
  const e1 = new Float64Array(n);
  const dLogTau = new Float64Array(n);
  const dTd = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = Math.max(win.t[i]! - td, 0);
    const e = Math.exp(-s / tau1);
    e1[i] = e;
    dLogTau[i] = (a1 * e * s) / tau1;
    dTd[i] = win.t[i]! > td ? (a1 * e) / tau1 : 0;
  }
  cols.push(one, e1, dLogTau);
  if (shape.deadTime) cols.push(dTd);
  if (shape.drift) cols.push(Float64Array.from(win.t));
  const basis = orthonormalBasis(cols, n);
  const requiredGain = ssr * (1 - Math.exp((-2 * Math.log(n)) / n));
  let maxGain = 0;
  const sArr = new Float64Array(n);
  for (let i = 0; i < n; i++) sArr[i] = Math.max(win.t[i]! - td, 0);
  const uniformStep = evenStep(sArr);
  // q·r (≈ 0 at the optimum, but taken exactly) so that g⊥·r = g·r − Σ (q·g)(q·r).
  const qr = basis.map((q) => dot(q, residuals, n));
  const qg = new Float64Array(basis.length);
  const g = new Float64Array(n);
  const lo = Math.log(tauMin);
  const hi = Math.log(tauMax);
  // ln τ₂ step 0.2 (τ ratio 1.22): neighbouring columns e^{−s/τ} then correlate ≥ 0.99 (derivation:
  // ∫e^{−s/τ}e^{−s/τ'}ds / √(∫e^{−2s/τ}·∫e^{−2s/τ'}) = 2√(ττ')/(τ + τ') = 0.995 at τ'/τ = 1.22), so the
  // grid misses at most ~1 % of the peak gain, well inside the factor {@link SCREEN_GAIN_FRACTION}.
  const count = Math.max(2, Math.ceil((hi - lo) / 0.2) + 1);
  for (let k = 0; k < count; k++) {
    const invTau2 = Math.exp(-(lo + ((hi - lo) * k) / (count - 1)));
    // g = e^{−s/τ₂} up to where it falls below 1e-18 (time sorted, so the rest is 0 to double precision).
    let m = 0;
    while (m < n && sArr[m] === 0) g[m++] = 1;
    if (uniformStep > 0 && m < n) {
      // Evenly spaced samples: e^{−s_{i+1}/τ} = e^{−s_i/τ}·e^{−Δs/τ} (relative error ≤ n·1e-16).
      const q = Math.exp(-uniformStep * invTau2);
      let v = Math.exp(-sArr[m]! * invTau2);
      while (m < n && v >= 1e-18) {
        g[m++] = v;
        v *= q;
      }
    } else {
      while (m < n) {
        const v = Math.exp(-sArr[m]! * invTau2);
        if (v < 1e-18) break;
        g[m++] = v;
      }
    }
    let gg0: number;
    let gr: number;
    if (basis.length === 3) {
      // The common case (no dead time, no drift) in one pass over g: each sum accumulates in the same order
      // as the separate dot products below, so the values are identical, with a fifth of the loads of g.
      const b0 = basis[0]!;
      const b1 = basis[1]!;
      const b2 = basis[2]!;
      let sgg = 0;
      let sgr = 0;
      let s0 = 0;
      let s1 = 0;
      let s2 = 0;
      for (let i = 0; i < m; i++) {
        const gi = g[i]!;
        sgg += gi * gi;
        sgr += gi * residuals[i]!;
        s0 += b0[i]! * gi;
        s1 += b1[i]! * gi;
        s2 += b2[i]! * gi;
      }
      gg0 = sgg;
      gr = sgr;
      qg[0] = s0;
      qg[1] = s1;
      qg[2] = s2;
    } else {
      gg0 = dot(g, g, m);
      gr = dot(g, residuals, m);
      for (let j = 0; j < basis.length; j++) qg[j] = dot(basis[j]!, g, m);
    }
    let gg = gg0;
    for (let j = 0; j < basis.length; j++) {
      gr -= qg[j]! * qr[j]!;
      gg -= qg[j]! * qg[j]!;
    }
    // A direction (nearly) inside the 1-term model's span adds nothing resolvable.
    if (!(gg > 1e-10 * gg0)) continue;
    maxGain = Math.max(maxGain, (gr * gr) / gg);
  }
  return { maxGain, requiredGain };
}

/** The common spacing of the positive entries of `s` (sorted), or 0 when they are not evenly spaced (1e-9 relative). */
function evenStep(s: Float64Array): number {
  let first = 0;
  while (first < s.length && s[first] === 0) first++;
  const count = s.length - 1 - first;
  if (count < 1) return 0;
  const step = (s[s.length - 1]! - s[first]!) / count;
  if (!(step > 0)) return 0;
  for (let i = first + 1; i < s.length; i++) if (Math.abs(s[i]! - s[i - 1]! - step) > 1e-9 * step) return 0;
  return step;
}

/** Σ a_i·b_i over the first m entries. */
function dot(a: Float64Array, b: Float64Array, m: number): number {
  let d = 0;
  for (let i = 0; i < m; i++) d += a[i]! * b[i]!;
  return d;
}

/** Orthonormal basis of the columns' span by modified Gram–Schmidt, twice (reorthogonalisation; Björck 1996, §2.4). */
function orthonormalBasis(cols: Float64Array[], n: number): Float64Array[] {
  const out: Float64Array[] = [];
  for (const c of cols) {
    const v = Float64Array.from(c);
    let norm0 = 0;
    for (let i = 0; i < n; i++) norm0 += v[i]! * v[i]!;
    for (let pass = 0; pass < 2; pass++) {
      for (const q of out) {
        let d = 0;
        for (let i = 0; i < n; i++) d += q[i]! * v[i]!;
        for (let i = 0; i < n; i++) v[i] = v[i]! - d * q[i]!;
      }
    }
    let norm = 0;
    for (let i = 0; i < n; i++) norm += v[i]! * v[i]!;
    if (!(norm > 1e-12 * norm0)) continue;
    const s = 1 / Math.sqrt(norm);
    for (let i = 0; i < n; i++) v[i] = v[i]! * s;
    out.push(v);
  }
  return out;
}
