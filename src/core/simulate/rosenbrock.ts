/**
 * Adaptive, L-stable second-order Rosenbrock integrator with an embedded third-order error
 * estimate, for the nonlinear (gas-compliance) network:
 *
 *     dx/dt = f(t, x) = M(x)⁻¹·(K·x + B·u(t) + h)
 *
 * Method: the modified Rosenbrock formula of L. F. Shampine, M. W. Reichelt, "The MATLAB ODE
 * Suite", SIAM J. Sci. Comput. 18(1), 1–22 (1997), section 3 (the formula behind ode23s),
 * with d = 1/(2 + √2), e32 = 6 + √2:
 *
 *     W  = I − h·d·J
 *     k1 = W⁻¹(F0 + h·d·T)                       F0 = f(t, y), T = ∂f/∂t
 *     F1 = f(t + h/2, y + h/2·k1)
 *     k2 = W⁻¹(F1 − k1) + k1
 *     y+ = y + h·k2
 *     F2 = f(t + h, y+)
 *     k3 = W⁻¹(F2 − e32·(k2 − F1) − 2·(k1 − F0) + h·d·T)
 *     err ≈ h/6·(k1 − 2·k2 + k3)
 *
 * The Jacobian is analytic: ∂fᵢ/∂xⱼ = Kᵢⱼ/Mᵢ − δᵢⱼ·fᵢ·Mᵢ′/Mᵢ with Mᵢ′ = −2·V·p_atm/p_abs³ for a
 * gas node (isothermal, physics.md §3.3). Step-size control: the usual elementary controller
 * h_new = h·min(5, max(0.2, 0.8·err^(−1/3))) on a mixed absolute/relative max-norm
 * (E. Hairer, G. Wanner, Solving ODEs II, 2nd ed., 1996, section IV.8).
 */
import { massAt, type Assembled } from './assemble';
import { luFactor, luSolve, zeros } from './matrix';

const D = 1 / (2 + Math.SQRT2);
const E32 = 6 + Math.SQRT2;

export interface RosenbrockStats {
  acceptedSteps: number;
  rejectedSteps: number;
}

/** The right-hand side of one program segment (drives affine in s = t − segment start). */
export class SegmentRhs {
  private readonly mass: Float64Array;
  constructor(
    private readonly sys: Assembled,
    private readonly u0: Float64Array,
    private readonly u1: Float64Array,
  ) {
    this.mass = new Float64Array(sys.nState);
  }

  /** Whether every gas node stays at a positive absolute pressure. */
  physical(x: Float64Array): boolean {
    for (let i = 0; i < this.sys.nState; i++) {
      if ((this.sys.gasVolumeAtAtmM3[i] as number) > 0 && this.sys.ambientPressurePa + (x[i] as number) <= 0) return false;
    }
    return true;
  }

  /** f(s, x) into out; also leaves M(x) in this.mass. */
  f(sS: number, x: Float64Array, out: Float64Array): void {
    const { sys } = this;
    const n = sys.nState;
    const nd = sys.nDrive;
    massAt(sys, x, this.mass);
    for (let i = 0; i < n; i++) {
      let r = sys.h[i] as number;
      for (let j = 0; j < n; j++) r += (sys.K.a[i * n + j] as number) * (x[j] as number);
      for (let d = 0; d < nd; d++) r += (sys.B[i * nd + d] as number) * ((this.u0[d] as number) + (this.u1[d] as number) * sS);
      out[i] = r / (this.mass[i] as number);
    }
  }

  /** ∂f/∂t (constant within the segment for a given x through M). */
  dfdt(x: Float64Array, out: Float64Array): void {
    const { sys } = this;
    const nd = sys.nDrive;
    massAt(sys, x, this.mass);
    for (let i = 0; i < sys.nState; i++) {
      let r = 0;
      for (let d = 0; d < nd; d++) r += (sys.B[i * nd + d] as number) * (this.u1[d] as number);
      out[i] = r / (this.mass[i] as number);
    }
  }

  /** Analytic Jacobian ∂f/∂x at (x, f(x)), row-major. */
  jacobian(x: Float64Array, fx: Float64Array): Float64Array {
    const { sys } = this;
    const n = sys.nState;
    massAt(sys, x, this.mass);
    const j = new Float64Array(n * n);
    const pAtm = sys.ambientPressurePa;
    for (let i = 0; i < n; i++) {
      const m = this.mass[i] as number;
      for (let k = 0; k < n; k++) j[i * n + k] = (sys.K.a[i * n + k] as number) / m;
      const v = sys.gasVolumeAtAtmM3[i] as number;
      if (v > 0) {
        const pAbs = pAtm + (x[i] as number);
        const dm = (-2 * v * pAtm) / (pAbs * pAbs * pAbs);
        j[i * n + i] = (j[i * n + i] as number) - ((fx[i] as number) * dm) / m;
      }
    }
    return j;
  }
}

export interface IntegrateOptions {
  relTol: number;
  /** Absolute tolerance per state, in the state's unit. */
  absTol: Float64Array;
}

/**
 * Integrates one segment from s = 0 to its end (the last of `targetsS`), calling `record(k, x)` at
 * every target. Steps are not forced onto the output times: outputs inside a step come from the
 * method's continuous extension (Shampine & Reichelt 1997, section 3),
 *
 *     y(s + θh) = y + h·[θ(1 − θ)/(1 − 2d)·k1 + θ(θ − 2d)/(1 − 2d)·k2],   0 ≤ θ ≤ 1,
 *
 * which is exact at both ends (θ = 1 gives y + h·k2). Returns the state at the end and the step
 * size to start the next segment with.
 */
export function integrateSegment(
  rhs: SegmentRhs,
  x0: Float64Array,
  targetsS: number[],
  hStart: number,
  opts: IntegrateOptions,
  stats: RosenbrockStats,
  record: (k: number, x: Float64Array) => void,
): { x: Float64Array; h: number } {
  const n = x0.length;
  let x = new Float64Array(x0);
  let s = 0;
  let h = hStart;
  const end = targetsS[targetsS.length - 1] ?? 0;
  const f0 = new Float64Array(n);
  const f1 = new Float64Array(n);
  const f2 = new Float64Array(n);
  const tv = new Float64Array(n);
  const y1 = new Float64Array(n);
  const rhs1 = new Float64Array(n);
  const dense = new Float64Array(n);
  const c1 = 1 / (1 - 2 * D);
  let kOut = 0;
  while (kOut < targetsS.length && (targetsS[kOut] as number) <= 0) record(kOut++, x);
  while (s < end) {
    const remaining = end - s;
    const clamped = h >= remaining * (1 - 1e-12);
    const hTry = clamped ? remaining : h;
    rhs.f(s, x, f0);
    rhs.dfdt(x, tv);
    const jac = rhs.jacobian(x, f0);
    const w = zeros(n);
    for (let i = 0; i < n * n; i++) w.a[i] = -hTry * D * (jac[i] as number);
    for (let i = 0; i < n; i++) w.a[i * n + i] = (w.a[i * n + i] as number) + 1;
    const lu = luFactor(w);
    for (let i = 0; i < n; i++) rhs1[i] = (f0[i] as number) + hTry * D * (tv[i] as number);
    const k1 = luSolve(lu, rhs1);
    for (let i = 0; i < n; i++) y1[i] = (x[i] as number) + 0.5 * hTry * (k1[i] as number);
    let ok = rhs.physical(y1);
    let err = Infinity;
    let xNew = x;
    let k2: Float64Array = k1;
    if (ok) {
      rhs.f(s + 0.5 * hTry, y1, f1);
      for (let i = 0; i < n; i++) rhs1[i] = (f1[i] as number) - (k1[i] as number);
      k2 = luSolve(lu, rhs1);
      for (let i = 0; i < n; i++) k2[i] = (k2[i] as number) + (k1[i] as number);
      xNew = new Float64Array(n);
      for (let i = 0; i < n; i++) xNew[i] = (x[i] as number) + hTry * (k2[i] as number);
      ok = rhs.physical(xNew);
      if (ok) {
        rhs.f(s + hTry, xNew, f2);
        for (let i = 0; i < n; i++) {
          rhs1[i] =
            (f2[i] as number) -
            E32 * ((k2[i] as number) - (f1[i] as number)) -
            2 * ((k1[i] as number) - (f0[i] as number)) +
            hTry * D * (tv[i] as number);
        }
        const k3 = luSolve(lu, rhs1);
        err = 0;
        for (let i = 0; i < n; i++) {
          const e = (hTry / 6) * ((k1[i] as number) - 2 * (k2[i] as number) + (k3[i] as number));
          const sc = (opts.absTol[i] as number) + opts.relTol * Math.max(Math.abs(x[i] as number), Math.abs(xNew[i] as number));
          err = Math.max(err, Math.abs(e) / sc);
        }
      }
    }
    if (ok && err <= 1) {
      stats.acceptedSteps++;
      const sNew = clamped ? end : s + hTry;
      while (kOut < targetsS.length && (targetsS[kOut] as number) <= sNew) {
        const tk = targetsS[kOut] as number;
        if (tk >= sNew) record(kOut++, xNew);
        else {
          const th = (tk - s) / hTry;
          const a1 = th * (1 - th) * c1;
          const a2 = th * (th - 2 * D) * c1;
          for (let i = 0; i < n; i++) dense[i] = (x[i] as number) + hTry * (a1 * (k1[i] as number) + a2 * (k2[i] as number));
          record(kOut++, dense);
        }
      }
      x = xNew;
      s = sNew;
      const grow = err === 0 ? 5 : Math.min(5, 0.8 * err ** (-1 / 3));
      // A clamped step says nothing about how large the next one may be: keep the natural size.
      h = clamped ? Math.max(h, hTry * grow) : hTry * grow;
    } else {
      stats.rejectedSteps++;
      h = ok && Number.isFinite(err) ? hTry * Math.max(0.2, 0.8 * err ** (-1 / 3)) : hTry / 4;
      if (!(h > end * 1e-15 + 1e-300)) throw new Error('step size underflow in the Rosenbrock integrator');
    }
  }
  while (kOut < targetsS.length) record(kOut++, x);
  return { x, h };
}
