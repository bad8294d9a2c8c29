/**
 * Monte Carlo cross-check of the delta method (JCGM 101:2008, "GUM Supplement 1",
 * propagation of distributions): draw θ ~ N(θ̂, Σ) with a seeded generator, evaluate f,
 * and read the 2.5 % and 97.5 % percentiles. Used by tests to confirm that the linearised
 * intervals are adequate; slower than the delta method, so not used by default.
 */
import type { DerivedFunction } from './propagate';
import type { ParameterSet } from './parameter-set';
import { readerFor } from './parameter-set';
import { createRng } from '../stats';

export interface MonteCarloResult {
  mean: number;
  median: number;
  standardDeviation: number;
  /** Percentile interval [2.5 %, 97.5 %]. */
  ci95: [number, number];
  /** Draws for which f was finite. */
  samples: number;
}

export interface MonteCarloOptions {
  samples?: number;
  seed?: number;
}

/**
 * Lower-triangular L with L·Lᵀ = Σ (Cholesky). Rows of zero variance (exact inputs) stay
 * zero; tiny negative pivots from rounding are clamped to zero.
 */
export function choleskyLower(covariance: number[][]): number[][] {
  const n = covariance.length;
  const L = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) {
    let diag = covariance[j]?.[j] ?? 0;
    for (let k = 0; k < j; k++) diag -= (L[j]?.[k] ?? 0) ** 2;
    const ljj = diag > 0 ? Math.sqrt(diag) : 0;
    (L[j] as number[])[j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = covariance[i]?.[j] ?? 0;
      for (let k = 0; k < j; k++) s -= (L[i]?.[k] ?? 0) * (L[j]?.[k] ?? 0);
      (L[i] as number[])[j] = ljj > 0 ? s / ljj : 0;
    }
  }
  return L;
}

function percentile(sorted: number[], q: number): number {
  if (sorted.length === 0) return Number.NaN;
  const pos = q * (sorted.length - 1);
  const i = Math.floor(pos);
  const frac = pos - i;
  const a = sorted[i] as number;
  const b = sorted[Math.min(i + 1, sorted.length - 1)] as number;
  return a + frac * (b - a);
}

/** Propagates N(θ̂, Σ) through f by sampling (default 20 000 draws, seed 1). */
export function monteCarloPropagate(set: ParameterSet, f: DerivedFunction, options: MonteCarloOptions = {}): MonteCarloResult {
  const samples = options.samples ?? 20000;
  const rng = createRng(options.seed ?? 1);
  const L = choleskyLower(set.covariance);
  const n = set.values.length;
  const out: number[] = [];
  const z = new Array<number>(n).fill(0);
  const theta = new Array<number>(n).fill(0);
  for (let s = 0; s < samples; s++) {
    for (let i = 0; i < n; i++) z[i] = rng.normal();
    for (let i = 0; i < n; i++) {
      let v = set.values[i] as number;
      const row = L[i] as number[];
      for (let k = 0; k <= i; k++) v += (row[k] as number) * (z[k] as number);
      theta[i] = v;
    }
    const y = f(readerFor(set, theta));
    if (Number.isFinite(y)) out.push(y);
  }
  out.sort((a, b) => a - b);
  const mean = out.reduce((acc, v) => acc + v, 0) / out.length;
  const variance = out.reduce((acc, v) => acc + (v - mean) ** 2, 0) / Math.max(1, out.length - 1);
  return {
    mean,
    median: percentile(out, 0.5),
    standardDeviation: Math.sqrt(variance),
    ci95: [percentile(out, 0.025), percentile(out, 0.975)],
    samples: out.length,
  };
}
