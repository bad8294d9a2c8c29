/**
 * Matrix exponential by scaling and squaring with a diagonal Padé [6/6] approximant,
 * after a diagonal balancing step.
 *
 * Method: C. Moler, C. Van Loan, "Nineteen dubious ways to compute the exponential of a matrix,
 * twenty-five years later", SIAM Review 45(1), 3–49 (2003), method 3 (scaling and squaring with
 * Padé); the algorithm as written in G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed.
 * (2013), Alg. 9.3.1. With ‖A/2^j‖∞ ≤ 1/2 and q = 6 the relative backward error bound is
 * 2^(3−2q)·(q!)²/((2q)!·(2q+1)!) ≈ 3.4e−16 (same source).
 *
 * Balancing: B. N. Parlett, C. Reinsch, "Balancing a matrix for calculation of eigenvalues and
 * eigenvectors", Numer. Math. 13, 293–304 (1969), with powers of 2 so it is exact:
 * exp(A) = D·exp(D⁻¹AD)·D⁻¹. The network matrices mix Pa and m³/s states whose couplings
 * differ by 1e13; balancing keeps the norm, and so the number of squarings, honest.
 */
import { identity, luFactor, luSolveMatrix, multiply, normInf, type Mat } from './matrix';

const PADE_ORDER = 6;

/** exp(A) for a small dense matrix. */
export function expm(input: Mat): Mat {
  const n = input.n;
  const { scaled, d } = balance(input);
  const norm = normInf(scaled);
  const j = norm > 0.5 ? Math.ceil(Math.log2(norm / 0.5)) : 0;
  const a = scaled;
  const factor = 2 ** -j;
  for (let i = 0; i < a.a.length; i++) a.a[i] = (a.a[i] as number) * factor;

  let x = identity(n);
  const num = identity(n);
  const den = identity(n);
  let c = 1;
  for (let k = 1; k <= PADE_ORDER; k++) {
    c = (c * (PADE_ORDER - k + 1)) / ((2 * PADE_ORDER - k + 1) * k);
    x = multiply(a, x);
    const sign = k % 2 === 0 ? 1 : -1;
    for (let i = 0; i < x.a.length; i++) {
      const cx = c * (x.a[i] as number);
      num.a[i] = (num.a[i] as number) + cx;
      den.a[i] = (den.a[i] as number) + sign * cx;
    }
  }
  let f = luSolveMatrix(luFactor(den), num);
  for (let k = 0; k < j; k++) f = multiply(f, f);

  // Undo the balancing: exp(A)_ij = d_i · exp(A')_ij / d_j.
  for (let r = 0; r < n; r++) {
    for (let s = 0; s < n; s++) f.a[r * n + s] = ((f.a[r * n + s] as number) * (d[r] as number)) / (d[s] as number);
  }
  return f;
}

/** Parlett–Reinsch balancing with radix 2: returns A' = D⁻¹AD and the diagonal of D. */
export function balance(input: Mat): { scaled: Mat; d: Float64Array } {
  const n = input.n;
  const a = new Float64Array(input.a);
  const d = new Float64Array(n).fill(1);
  let diagScale = 0;
  for (let i = 0; i < n; i++) diagScale = Math.max(diagScale, Math.abs(a[i * n + i] as number));
  let changed = true;
  let sweeps = 0;
  while (changed && sweeps < 100) {
    changed = false;
    sweeps++;
    for (let i = 0; i < n; i++) {
      let c = 0;
      let r = 0;
      for (let k = 0; k < n; k++) {
        if (k === i) continue;
        c += Math.abs(a[k * n + i] as number);
        r += Math.abs(a[i * n + k] as number);
      }
      if (c === 0 && r === 0) continue;
      if (c === 0 || r === 0) {
        // One-sided coupling (a triangular block): the similarity is free on that side, so bring the
        // off-diagonal sum to the size of the largest diagonal entry (not in Parlett–Reinsch, who
        // permute such rows away first; any power-of-2 diagonal similarity stays exact).
        if (diagScale === 0) continue;
        const side = c === 0 ? r : c;
        const e = Math.round(Math.log2(side / diagScale));
        if (Math.abs(e) < 2) continue;
        const f = c === 0 ? 2 ** e : 2 ** -e;
        changed = true;
        d[i] = (d[i] as number) * f;
        for (let k = 0; k < n; k++) a[i * n + k] = (a[i * n + k] as number) / f;
        for (let k = 0; k < n; k++) a[k * n + i] = (a[k * n + i] as number) * f;
        continue;
      }
      const s = c + r;
      let f = 1;
      let g = r / 2;
      while (c < g) {
        f *= 2;
        c *= 4;
      }
      g = r * 2;
      while (c > g) {
        f /= 2;
        c /= 4;
      }
      if ((c + r) / f < 0.95 * s) {
        changed = true;
        d[i] = (d[i] as number) * f;
        for (let k = 0; k < n; k++) a[i * n + k] = (a[i * n + k] as number) / f;
        for (let k = 0; k < n; k++) a[k * n + i] = (a[k * n + i] as number) * f;
      }
    }
  }
  return { scaled: { n, a }, d };
}
