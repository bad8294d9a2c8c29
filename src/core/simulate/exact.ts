/**
 * Exact solution of the linear network, segment by segment.
 *
 * Between breakpoints of the program every drive is affine in time, so with A = M⁻¹K,
 * f0 = M⁻¹(h + B·u0) and f1 = M⁻¹B·u1 the state obeys x' = A·x + f0 + f1·s (s = time since the
 * segment started). Augmenting the state with z = [x; c; c·s] makes this homogeneous,
 *
 *     z' = Z·z,   Z = [[A, f0/c, f1/c], [0, 0, 0], [0, 1, 0]],
 *
 * so z(s + Δt) = exp(Z·Δt)·z(s) holds exactly for steps and ramps alike (C. Van Loan, "Computing
 * integrals involving the matrix exponential", IEEE Trans. Autom. Control 23(3), 395–404 (1978),
 * the block-triangular augmentation). c only scales the constant state so that its column is of the
 * same size as A (the exponential is unchanged by it).
 */
import type { SegmentForcing } from './forcing';
import { expm } from './expm';
import { normInf, zeros, type Mat } from './matrix';
import type { Assembled } from './assemble';

/** Propagator of one segment, with a cache per step length. */
export class SegmentPropagator {
  private readonly z: Mat;
  private readonly scaleC: number;
  private readonly cache = new Map<number, Mat>();
  readonly n: number;

  constructor(sys: Assembled, forcing: SegmentForcing) {
    const n = sys.nState;
    this.n = n;
    const a = forcing.A;
    const normA = normInf(a);
    let fsum = 0;
    for (let i = 0; i < n; i++) fsum = Math.max(fsum, Math.abs(forcing.f0[i] as number) + Math.abs(forcing.f1[i] as number));
    const c = normA > 0 && fsum > 0 ? fsum / normA : 1;
    this.scaleC = c;
    const m = n + 2;
    const z = zeros(m);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) z.a[i * m + j] = a.a[i * n + j] as number;
      z.a[i * m + n] = (forcing.f0[i] as number) / c;
      z.a[i * m + n + 1] = (forcing.f1[i] as number) / c;
    }
    z.a[(n + 1) * m + n] = 1;
    this.z = z;
  }

  /**
   * exp(Z·Δt), cached per Δt rounded to 1e-12 s (a uniform grid has one Δt up to rounding; the
   * rounding shifts a sample by at most 5e-13 s, far below any time constant of interest).
   */
  private propagator(dtS: number): Mat {
    const key = Math.round(dtS * 1e12);
    let e = this.cache.get(key);
    if (!e) {
      const dt = key / 1e12;
      const zt = { n: this.z.n, a: this.z.a.map((v) => v * dt) };
      e = expm(zt);
      if (this.cache.size > 4096) this.cache.clear();
      this.cache.set(key, e);
    }
    return e;
  }

  /** Advances x from s to s + dtS within the segment (s = time since the segment start), into `out`. */
  step(x: Float64Array, sS: number, dtS: number, out: Float64Array = new Float64Array(this.n)): Float64Array {
    const n = this.n;
    if (dtS === 0) {
      out.set(x);
      return out;
    }
    const m = n + 2;
    const e = this.propagator(dtS);
    const c = this.scaleC;
    for (let i = 0; i < n; i++) {
      let v = (e.a[i * m + n] as number) * c + (e.a[i * m + n + 1] as number) * c * sS;
      for (let j = 0; j < n; j++) v += (e.a[i * m + j] as number) * (x[j] as number);
      out[i] = v;
    }
    return out;
  }
}
