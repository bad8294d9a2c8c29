/**
 * The exponential NIST StRD models (model formulas from the files' own "Model:" lines) as
 * separable problems (linear amplitudes c, nonlinear rates α) and as plain problems in the
 * NIST parameters b, for the engine in src/core/fit.
 */
import type { LeastSquaresProblem } from '../../../src/core/fit/least-squares';
import type { SeparableProblem } from '../../../src/core/fit/separable';
import type { NistProblem } from './nist-strd';

export interface NistModel {
  separable(p: NistProblem): SeparableProblem;
  /** Indices of b (0-based) for [α..., c...] in the separable parameter vector. */
  order: number[];
  direct(p: NistProblem): LeastSquaresProblem;
}

/** y = b1·(1 − exp(−b2·x)) (Misra1a, BoxBOD). */
export const saturatingExponential: NistModel = {
  order: [1, 0],
  separable: ({ x, y }) => ({
    n: x.length,
    nLinear: 1,
    nNonlinear: 1,
    y,
    basis: (a, phi) => {
      for (let i = 0; i < x.length; i++) phi[i] = -Math.expm1(-a[0]! * x[i]!);
    },
    basisDerivativeTimes: (a, _k, c, out) => {
      for (let i = 0; i < x.length; i++) out[i] = c[0]! * x[i]! * Math.exp(-a[0]! * x[i]!);
    },
  }),
  direct: ({ x, y }) => ({
    n: x.length,
    p: 2,
    residuals: (b, out) => {
      for (let i = 0; i < x.length; i++) out[i] = -b[0]! * Math.expm1(-b[1]! * x[i]!) - y[i]!;
    },
    jacobian: (b, out) => {
      const n = x.length;
      for (let i = 0; i < n; i++) {
        out[i] = -Math.expm1(-b[1]! * x[i]!);
        out[n + i] = b[0]! * x[i]! * Math.exp(-b[1]! * x[i]!);
      }
    },
  }),
};

/** y = b1 + b2·exp(−b4·x) + b3·exp(−b5·x) (MGH17). */
export const offsetTwoExponentials: NistModel = {
  order: [3, 4, 0, 1, 2],
  separable: ({ x, y }) => ({
    n: x.length,
    nLinear: 3,
    nNonlinear: 2,
    y,
    basis: (a, phi) => {
      const n = x.length;
      for (let i = 0; i < n; i++) {
        phi[i] = 1;
        phi[n + i] = Math.exp(-a[0]! * x[i]!);
        phi[2 * n + i] = Math.exp(-a[1]! * x[i]!);
      }
    },
    basisDerivativeTimes: (a, k, c, out) => {
      for (let i = 0; i < x.length; i++) out[i] = -c[1 + k]! * x[i]! * Math.exp(-a[k]! * x[i]!);
    },
  }),
  direct: ({ x, y }) => ({
    n: x.length,
    p: 5,
    residuals: (b, out) => {
      for (let i = 0; i < x.length; i++) out[i] = b[0]! + b[1]! * Math.exp(-b[3]! * x[i]!) + b[2]! * Math.exp(-b[4]! * x[i]!) - y[i]!;
    },
    jacobian: (b, out) => {
      const n = x.length;
      for (let i = 0; i < n; i++) {
        const e4 = Math.exp(-b[3]! * x[i]!);
        const e5 = Math.exp(-b[4]! * x[i]!);
        out[i] = 1;
        out[n + i] = e4;
        out[2 * n + i] = e5;
        out[3 * n + i] = -b[1]! * x[i]! * e4;
        out[4 * n + i] = -b[2]! * x[i]! * e5;
      }
    },
  }),
};

/** y = b1·exp(−b2·x) + b3·exp(−b4·x) + b5·exp(−b6·x) (Lanczos1, 2, 3). */
export const threeExponentials: NistModel = {
  order: [1, 3, 5, 0, 2, 4],
  separable: ({ x, y }) => ({
    n: x.length,
    nLinear: 3,
    nNonlinear: 3,
    y,
    basis: (a, phi) => {
      const n = x.length;
      for (let j = 0; j < 3; j++) for (let i = 0; i < n; i++) phi[j * n + i] = Math.exp(-a[j]! * x[i]!);
    },
    basisDerivativeTimes: (a, k, c, out) => {
      for (let i = 0; i < x.length; i++) out[i] = -c[k]! * x[i]! * Math.exp(-a[k]! * x[i]!);
    },
  }),
  direct: ({ x, y }) => ({
    n: x.length,
    p: 6,
    residuals: (b, out) => {
      for (let i = 0; i < x.length; i++) {
        out[i] = b[0]! * Math.exp(-b[1]! * x[i]!) + b[2]! * Math.exp(-b[3]! * x[i]!) + b[4]! * Math.exp(-b[5]! * x[i]!) - y[i]!;
      }
    },
    jacobian: (b, out) => {
      const n = x.length;
      for (let j = 0; j < 3; j++) {
        for (let i = 0; i < n; i++) {
          const e = Math.exp(-b[2 * j + 1]! * x[i]!);
          out[2 * j * n + i] = e;
          out[(2 * j + 1) * n + i] = -b[2 * j]! * x[i]! * e;
        }
      }
    },
  }),
};
