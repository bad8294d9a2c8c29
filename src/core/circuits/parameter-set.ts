/**
 * A vector of named parameters with their covariance matrix: the common input of the
 * delta method and the Monte Carlo cross-check. Built from a TransientFit's standard
 * errors and correlation matrix: Σᵢⱼ = ρᵢⱼ·σᵢ·σⱼ (definition of the correlation coefficient).
 */
import type { Warning } from '../errors';
import type { Estimate, TransientFit } from '../fit/types';

export interface ParameterSet {
  names: string[];
  values: number[];
  /** Symmetric covariance, names order, SI units squared. */
  covariance: number[][];
}

/** Canonical name of a fit parameter (matches TransientFit.parameterNames): yInf, a1, tau1_s, … */
export const amplitudeName = (termIndex1: number): string => `a${termIndex1}`;
export const tauName = (termIndex1: number): string => `tau${termIndex1}_s`;

/**
 * The fit's y∞, amplitudes and time constants with their covariance. Terms are numbered
 * 1… in the fit's order (τ ascending). Parameters missing from `parameterNames`, or a
 * correlation matrix of the wrong size, are treated as uncorrelated (with a warning).
 */
export function parameterSetFromFit(fit: TransientFit): { set: ParameterSet; warnings: Warning[] } {
  const entries: [string, Estimate][] = [['yInf', fit.yInf]];
  fit.terms.forEach((term, i) => {
    entries.push([amplitudeName(i + 1), term.amplitude]);
    entries.push([tauName(i + 1), term.tauS]);
  });
  const names = entries.map(([n]) => n);
  const values = entries.map(([, e]) => e.value);
  const se = entries.map(([, e]) => (Number.isFinite(e.standardError) ? Math.abs(e.standardError) : 0));
  const index = names.map((n) => fit.parameterNames.indexOf(n));
  const warnings: Warning[] = [];
  const corrOk =
    fit.correlation.length === fit.parameterNames.length &&
    fit.correlation.every((row) => row.length === fit.parameterNames.length);
  const missing = names.filter((_, i) => index[i] === -1);
  if (!corrOk || missing.length > 0) {
    warnings.push({
      code: 'covariance-incomplete',
      message:
        `The fit's correlation matrix does not cover ${corrOk ? missing.join(', ') : 'its parameters'}; ` +
        'those parameters were treated as uncorrelated, so the propagated uncertainties are approximate.',
    });
  }
  const covariance = names.map((_, i) =>
    names.map((__, j) => {
      if (i === j) return (se[i] ?? 0) ** 2;
      const a = index[i] ?? -1;
      const b = index[j] ?? -1;
      const rho = corrOk && a >= 0 && b >= 0 ? (fit.correlation[a]?.[b] ?? 0) : 0;
      return (Number.isFinite(rho) ? rho : 0) * (se[i] ?? 0) * (se[j] ?? 0);
    }),
  );
  return { set: { names, values, covariance }, warnings };
}

/** Appends a parameter independent of all others (e.g. a measured baseline or R_up). */
export function withIndependent(set: ParameterSet, name: string, value: number, standardError = 0): ParameterSet {
  const n = set.names.length;
  const covariance = set.covariance.map((row) => [...row, 0]);
  covariance.push([...new Array<number>(n).fill(0), standardError ** 2]);
  return { names: [...set.names, name], values: [...set.values, value], covariance };
}

/** Reads parameters by name from a value vector in the set's order. */
export type ParameterReader = (name: string) => number;

export function readerFor(set: ParameterSet, values: ArrayLike<number>): ParameterReader {
  return (name: string): number => {
    const i = set.names.indexOf(name);
    if (i < 0) throw new Error(`parameter ${name} is not in the set (${set.names.join(', ')})`);
    return values[i] as number;
  };
}
