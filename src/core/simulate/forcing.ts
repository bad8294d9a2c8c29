/** The linear system of one program segment: A = M⁻¹K, f0 = M⁻¹(h + B·u0), f1 = M⁻¹·B·u1. */
import type { Assembled } from './assemble';
import { zeros, type Mat } from './matrix';

export interface SegmentForcing {
  A: Mat;
  f0: Float64Array;
  f1: Float64Array;
}

/** Forcing of a segment with drive values u0 at its start and slopes u1 (per s), for mass diagonal `mass`. */
export function assembleAt(sys: Assembled, mass: Float64Array, u0: Float64Array, u1: Float64Array): SegmentForcing {
  const n = sys.nState;
  const nd = sys.nDrive;
  const A = zeros(n);
  const f0 = new Float64Array(n);
  const f1 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const m = mass[i] as number;
    for (let j = 0; j < n; j++) A.a[i * n + j] = (sys.K.a[i * n + j] as number) / m;
    let b0 = sys.h[i] as number;
    let b1 = 0;
    for (let d = 0; d < nd; d++) {
      const bij = sys.B[i * nd + d] as number;
      b0 += bij * (u0[d] as number);
      b1 += bij * (u1[d] as number);
    }
    f0[i] = b0 / m;
    f1[i] = b1 / m;
  }
  return { A, f0, f1 };
}
