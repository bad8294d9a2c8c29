/** Fisher–Snedecor F and chi-square distributions. */
import { incompleteBeta, incompleteGamma } from './special';

/**
 * P(F ≤ x) for the F distribution with (d1, d2) degrees of freedom:
 * I_{d1x/(d1x+d2)}(d1/2, d2/2) (Abramowitz & Stegun 26.6.2).
 */
export function fCdf(x: number, d1: number, d2: number): number {
  if (Number.isNaN(x) || !(d1 > 0) || !(d2 > 0)) return NaN;
  if (x <= 0) return 0;
  if (x === Infinity) return 1;
  return incompleteBeta((d1 * x) / (d1 * x + d2), d1 / 2, d2 / 2)[0];
}

/** Upper tail P(F > x), accurate for small p-values: I_{d2/(d2+d1x)}(d2/2, d1/2). */
export function fSurvival(x: number, d1: number, d2: number): number {
  if (Number.isNaN(x) || !(d1 > 0) || !(d2 > 0)) return NaN;
  if (x <= 0) return 1;
  if (x === Infinity) return 0;
  return incompleteBeta(d2 / (d2 + d1 * x), d2 / 2, d1 / 2)[0];
}

/** P(χ² ≤ x) with k degrees of freedom: P(k/2, x/2) (Abramowitz & Stegun 26.4.19). */
export function chiSquareCdf(x: number, k: number): number {
  if (Number.isNaN(x) || !(k > 0)) return NaN;
  if (x <= 0) return 0;
  return incompleteGamma(k / 2, x / 2)[0];
}
