/** Seeded synthetic step responses for the fitter tests (the generating model is the test's derivation). */
import { createRng, type Rng } from '../../../src/core/stats';

export interface SyntheticSpec {
  n: number;
  windowS: number;
  yInf: number;
  terms: { amplitude: number; tauS: number }[];
  deadTimeS?: number;
  driftPerS?: number;
  sigma: number;
}

/** y(t) = y∞ + Σ aᵢ exp(−(t − t_d)₊/τᵢ) + b·t + σ·N(0,1), t uniform on [0, window]. */
export function synthesize(spec: SyntheticSpec, rng: Rng | number): { tS: Float64Array; y: Float64Array } {
  const r = typeof rng === 'number' ? createRng(rng) : rng;
  const tS = new Float64Array(spec.n);
  const y = new Float64Array(spec.n);
  for (let i = 0; i < spec.n; i++) {
    const t = (i * spec.windowS) / (spec.n - 1);
    const s = Math.max(t - (spec.deadTimeS ?? 0), 0);
    let v = spec.yInf + (spec.driftPerS ?? 0) * t;
    for (const term of spec.terms) v += term.amplitude * Math.exp(-s / term.tauS);
    tS[i] = t;
    y[i] = v + spec.sigma * r.normal();
  }
  return { tS, y };
}

/** Whether x lies in [lo, hi]. */
export function inside(x: number, [lo, hi]: [number, number]): boolean {
  return lo <= x && x <= hi;
}
