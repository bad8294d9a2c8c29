/**
 * Small dense matrices for the network solver (a handful of states): row-major Float64Array,
 * n×n unless stated. Written out by hand because the networks are tiny and the solver needs
 * only products, an LU solve and a norm.
 */

/** A square matrix of order n, row-major. */
export interface Mat {
  n: number;
  a: Float64Array;
}

export function zeros(n: number): Mat {
  return { n, a: new Float64Array(n * n) };
}

export function identity(n: number): Mat {
  const m = zeros(n);
  for (let i = 0; i < n; i++) m.a[i * n + i] = 1;
  return m;
}

export function get(m: Mat, i: number, j: number): number {
  return m.a[i * m.n + j] as number;
}

export function set(m: Mat, i: number, j: number, v: number): void {
  m.a[i * m.n + j] = v;
}

export function add(m: Mat, i: number, j: number, v: number): void {
  m.a[i * m.n + j] = (m.a[i * m.n + j] as number) + v;
}

export function copy(m: Mat): Mat {
  return { n: m.n, a: new Float64Array(m.a) };
}

/** C = A·B. */
export function multiply(x: Mat, y: Mat): Mat {
  const n = x.n;
  const out = zeros(n);
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < n; k++) {
      const xik = x.a[i * n + k] as number;
      if (xik === 0) continue;
      for (let j = 0; j < n; j++) out.a[i * n + j] = (out.a[i * n + j] as number) + xik * (y.a[k * n + j] as number);
    }
  }
  return out;
}

/** y = A·x. */
export function multiplyVector(m: Mat, x: Float64Array): Float64Array {
  const n = m.n;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += (m.a[i * n + j] as number) * (x[j] as number);
    out[i] = s;
  }
  return out;
}

/** Infinity norm (largest absolute row sum). */
export function normInf(m: Mat): number {
  let best = 0;
  for (let i = 0; i < m.n; i++) {
    let s = 0;
    for (let j = 0; j < m.n; j++) s += Math.abs(m.a[i * m.n + j] as number);
    if (s > best) best = s;
  }
  return best;
}

/** LU factors with partial pivoting (Golub & Van Loan, Matrix Computations, 4th ed., Alg. 3.4.1). */
export interface Lu {
  n: number;
  lu: Float64Array;
  pivot: Int32Array;
  singular: boolean;
}

export function luFactor(m: Mat): Lu {
  const n = m.n;
  const lu = new Float64Array(m.a);
  const pivot = new Int32Array(n);
  let singular = false;
  let scale = 0;
  for (let i = 0; i < n * n; i++) scale = Math.max(scale, Math.abs(lu[i] as number));
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.abs(lu[k * n + k] as number);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(lu[i * n + k] as number);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    pivot[k] = p;
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const t = lu[k * n + j] as number;
        lu[k * n + j] = lu[p * n + j] as number;
        lu[p * n + j] = t;
      }
    }
    const d = lu[k * n + k] as number;
    if (best <= scale * 1e-14 || d === 0) {
      singular = true;
      continue;
    }
    for (let i = k + 1; i < n; i++) {
      const f = (lu[i * n + k] as number) / d;
      lu[i * n + k] = f;
      if (f === 0) continue;
      for (let j = k + 1; j < n; j++) lu[i * n + j] = (lu[i * n + j] as number) - f * (lu[k * n + j] as number);
    }
  }
  return { n, lu, pivot, singular };
}

/** Solves A·x = b with the factors of A. */
export function luSolve(f: Lu, b: Float64Array): Float64Array {
  const n = f.n;
  const x = new Float64Array(b);
  for (let k = 0; k < n; k++) {
    const p = f.pivot[k] as number;
    if (p !== k) {
      const t = x[k] as number;
      x[k] = x[p] as number;
      x[p] = t;
    }
  }
  for (let i = 0; i < n; i++) {
    let s = x[i] as number;
    for (let j = 0; j < i; j++) s -= (f.lu[i * n + j] as number) * (x[j] as number);
    x[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i] as number;
    for (let j = i + 1; j < n; j++) s -= (f.lu[i * n + j] as number) * (x[j] as number);
    x[i] = s / (f.lu[i * n + i] as number);
  }
  return x;
}

/** X = A⁻¹·B for a square B (column by column). */
export function luSolveMatrix(f: Lu, b: Mat): Mat {
  const n = b.n;
  const out = zeros(n);
  const col = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) col[i] = b.a[i * n + j] as number;
    const x = luSolve(f, col);
    for (let i = 0; i < n; i++) out.a[i * n + j] = x[i] as number;
  }
  return out;
}
