/**
 * Guess-free starting values for the exponential model: an exhaustive search over log-spaced
 * time constants, with the linear parameters (level, amplitudes, drift) solved in closed form for
 * every candidate (variable projection on a grid; the amplitudes may take either sign, so
 * overshooting responses are found too). Works on block-averaged data of at most a few hundred
 * points, so its cost does not grow with the window size. All quantities in scaled units.
 */

export interface GridCandidate {
  /** ln τ of the terms, ascending. */
  logTaus: number[];
  /** Dead time (scaled), 0 when not fitted. */
  deadTime: number;
  /** Sum of squares of the closed-form fit on the reduced data. */
  ssr: number;
}

/** Block means of (t, y) down to at most `maxPoints` points (no copy when already small). */
export function decimate(t: Float64Array, y: Float64Array, maxPoints: number): { t: Float64Array; y: Float64Array } {
  const n = t.length;
  if (n <= maxPoints) return { t, y };
  const blocks = maxPoints;
  const tOut = new Float64Array(blocks);
  const yOut = new Float64Array(blocks);
  for (let b = 0; b < blocks; b++) {
    const i0 = Math.floor((b * n) / blocks);
    const i1 = Math.floor(((b + 1) * n) / blocks);
    let st = 0;
    let sy = 0;
    for (let i = i0; i < i1; i++) {
      st += t[i]!;
      sy += y[i]!;
    }
    tOut[b] = st / (i1 - i0);
    yOut[b] = sy / (i1 - i0);
  }
  return { t: tOut, y: yOut };
}

/** ln τ grid from `tauMin` to `tauMax` (scaled), ratio ≈ 1.6 between neighbours, at most 24 values. */
export function logTauGrid(tauMin: number, tauMax: number): Float64Array {
  const lo = Math.log(tauMin);
  const hi = Math.log(tauMax);
  const count = Math.max(6, Math.min(24, Math.ceil((hi - lo) / Math.log(1.6)) + 1));
  const g = new Float64Array(count);
  for (let k = 0; k < count; k++) g[k] = lo + ((hi - lo) * k) / (count - 1);
  return g;
}

/** Cholesky solve of the small SPD system M c = r (row-major, size q); false if not positive definite. */
function choleskySolve(m: Float64Array, r: Float64Array, q: number, c: Float64Array): boolean {
  const l = m; // in place
  for (let j = 0; j < q; j++) {
    let s = l[j * q + j]!;
    for (let k = 0; k < j; k++) s -= l[j * q + k]! ** 2;
    if (!(s > 1e-13 * Math.abs(m[j * q + j]!)) || !(s > 0)) return false;
    const d = Math.sqrt(s);
    l[j * q + j] = d;
    for (let i = j + 1; i < q; i++) {
      let v = l[i * q + j]!;
      for (let k = 0; k < j; k++) v -= l[i * q + k]! * l[j * q + k]!;
      l[i * q + j] = v / d;
    }
  }
  for (let i = 0; i < q; i++) {
    let v = r[i]!;
    for (let k = 0; k < i; k++) v -= l[i * q + k]! * c[k]!;
    c[i] = v / l[i * q + i]!;
  }
  for (let i = q - 1; i >= 0; i--) {
    let v = c[i]!;
    for (let k = i + 1; k < q; k++) v -= l[k * q + i]! * c[k]!;
    c[i] = v / l[i * q + i]!;
  }
  return true;
}

/**
 * The `keep` best combinations of `terms` grid time constants (distinct grid points) at a fixed
 * dead time, ranked by the closed-form sum of squares.
 */
export function bestGridCombinations(
  t: Float64Array,
  y: Float64Array,
  grid: Float64Array,
  terms: number,
  drift: boolean,
  deadTime: number,
  keep: number,
): GridCandidate[] {
  const m = t.length;
  const K = grid.length;
  const fixed = 1 + (drift ? 1 : 0);
  const cols = fixed + K;
  // Columns: 1, (t), exp(−(t − t_d)₊/τ_k).
  const phi = new Float64Array(cols * m);
  let ymean = 0;
  for (let i = 0; i < m; i++) ymean += y[i]!;
  ymean /= m;
  for (let i = 0; i < m; i++) {
    phi[i] = 1;
    if (drift) phi[m + i] = t[i]!;
  }
  for (let k = 0; k < K; k++) {
    const inv = Math.exp(-grid[k]!);
    for (let i = 0; i < m; i++) {
      const s = t[i]! - deadTime;
      phi[(fixed + k) * m + i] = s > 0 ? Math.exp(-s * inv) : 1;
    }
  }
  // Gram entries are computed on first use (one term needs only the diagonal and the fixed columns).
  const g = new Float64Array(cols * cols).fill(NaN);
  const h = new Float64Array(cols);
  let yy = 0;
  for (let i = 0; i < m; i++) yy += (y[i]! - ymean) ** 2;
  for (let a = 0; a < cols; a++) {
    let s = 0;
    for (let i = 0; i < m; i++) s += phi[a * m + i]! * (y[i]! - ymean);
    h[a] = s;
  }
  const gram = (a: number, b: number): number => {
    const cached = g[a * cols + b]!;
    if (!Number.isNaN(cached)) return cached;
    let v = 0;
    for (let i = 0; i < m; i++) v += phi[a * m + i]! * phi[b * m + i]!;
    g[a * cols + b] = v;
    g[b * cols + a] = v;
    return v;
  };
  const q = fixed + terms;
  const mat = new Float64Array(q * q);
  const rhs = new Float64Array(q);
  const c = new Float64Array(q);
  const idx = new Int32Array(q);
  for (let f = 0; f < fixed; f++) idx[f] = f;
  const best: GridCandidate[] = [];
  const pick = new Int32Array(terms);
  const visit = (depth: number, from: number): void => {
    if (depth === terms) {
      for (let k = 0; k < terms; k++) idx[fixed + k] = fixed + pick[k]!;
      for (let a = 0; a < q; a++) {
        rhs[a] = h[idx[a]!]!;
        for (let b = 0; b < q; b++) mat[a * q + b] = gram(idx[a]!, idx[b]!);
      }
      if (!choleskySolve(mat, rhs, q, c)) return;
      let explained = 0;
      for (let a = 0; a < q; a++) explained += c[a]! * rhs[a]!;
      const ssr = Math.max(0, yy - explained);
      if (best.length < keep || ssr < best[best.length - 1]!.ssr) {
        best.push({ logTaus: Array.from(pick, (p) => grid[p]!), deadTime, ssr });
        best.sort((u, v) => u.ssr - v.ssr);
        if (best.length > keep) best.pop();
      }
      return;
    }
    for (let k = from; k < K; k++) {
      pick[depth] = k;
      visit(depth + 1, k + 1);
    }
  };
  visit(0, 0);
  if (terms === 1 && best[0]) refineSingle(best[0]);
  return best;

  /**
   * One term: move the best grid τ to the vertex of the parabola through the closed-form SSR at it and
   * its two grid neighbours (saves the optimiser an iteration or two).
   */
  function refineSingle(cand: GridCandidate): void {
    const k = grid.indexOf(cand.logTaus[0]!);
    if (k <= 0 || k >= K - 1) return;
    const ssrAt = (j: number): number => {
      idx[fixed] = fixed + j;
      for (let a = 0; a < q; a++) {
        rhs[a] = h[idx[a]!]!;
        for (let b = 0; b < q; b++) mat[a * q + b] = gram(idx[a]!, idx[b]!);
      }
      if (!choleskySolve(mat, rhs, q, c)) return NaN;
      let explained = 0;
      for (let a = 0; a < q; a++) explained += c[a]! * rhs[a]!;
      return yy - explained;
    };
    const sm = ssrAt(k - 1);
    const s0 = ssrAt(k);
    const sp = ssrAt(k + 1);
    const curvature = sm - 2 * s0 + sp;
    if (!(curvature > 0)) return;
    const offset = Math.max(-0.5, Math.min(0.5, (0.5 * (sm - sp)) / curvature));
    cand.logTaus[0] = grid[k]! + offset * (grid[k + 1]! - grid[k]!);
  }
}

/** Dead-time profile: the dead time on a grid over [0, maxDeadTime] whose best 1-term grid fit has the least SSR. */
export function bestDeadTime(t: Float64Array, y: Float64Array, grid: Float64Array, drift: boolean, maxDeadTime: number, steps = 20): number {
  let bestTd = 0;
  let bestSsr = Infinity;
  for (let s = 0; s <= steps; s++) {
    const td = (maxDeadTime * s) / steps;
    const [cand] = bestGridCombinations(t, y, grid, 1, drift, td, 1);
    if (cand && cand.ssr < bestSsr) {
      bestSsr = cand.ssr;
      bestTd = td;
    }
  }
  return bestTd;
}
