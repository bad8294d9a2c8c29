/**
 * Builds TransientFit objects with exactly known parameters, standard errors and correlations,
 * so the circuit formulas can be checked on exact inputs (no fitter involved).
 */
import { studentTQuantile } from '../../../src/core/stats';
import type { Estimate, TransientFit } from '../../../src/core/fit/types';

export interface FixtureTerm {
  tauS: number;
  amplitude: number;
  tauSe?: number;
  amplitudeSe?: number;
}

export interface FixtureSpec {
  yInf: number;
  yInfSe?: number;
  terms: FixtureTerm[];
  /** Correlations by parameter-name pair, e.g. { 'yInf|a1': -0.5 }. */
  correlations?: Record<string, number>;
  dof?: number;
}

function estimate(value: number, se: number, dof: number): Estimate {
  const t = studentTQuantile(0.975, dof);
  return { value, standardError: se, ci95: [value - t * se, value + t * se] };
}

export function makeFit(spec: FixtureSpec): TransientFit {
  const dof = spec.dof ?? 200;
  const names = ['yInf', ...spec.terms.flatMap((_, i) => [`a${i + 1}`, `tau${i + 1}_s`])];
  const correlation = names.map((a, i) =>
    names.map((b, j) => (i === j ? 1 : (spec.correlations?.[`${a}|${b}`] ?? spec.correlations?.[`${b}|${a}`] ?? 0))),
  );
  const slowest = Math.max(...spec.terms.map((t) => t.tauS));
  return {
    model: { terms: spec.terms.length, deadTime: false, drift: false, robust: 'none' },
    yInf: estimate(spec.yInf, spec.yInfSe ?? 0, dof),
    terms: spec.terms.map((t) => ({
      tauS: estimate(t.tauS, t.tauSe ?? 0, dof),
      amplitude: estimate(t.amplitude, t.amplitudeSe ?? 0, dof),
    })),
    deadTimeS: null,
    driftPerS: null,
    parameterNames: names,
    correlation,
    converged: true,
    stopReason: 'fixture',
    iterations: 0,
    n: dof + names.length,
    dof,
    rmse: 0,
    r2: 1,
    noiseSigma: 0,
    residualLag1: 0,
    runsZ: 0,
    windowInTaus: 10,
    settled: true,
    // Rounded multiples of τ, physics.md §4.1 [N]: t63 = τ, t95 = 2.9957 τ, t99 = 4.6052 τ (fixture only, not asserted).
    t63S: slowest,
    t95S: 3 * slowest,
    t99S: 4.6 * slowest,
    flags: [],
    orderSelection: null,
  };
}
